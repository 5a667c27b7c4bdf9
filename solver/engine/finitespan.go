package engine

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"

	"sectionbench/model"
	"sectionbench/solver/liftingline"
)

// FiniteSpanMethod names the finite-span method for every output.
const FiniteSpanMethod = "Prandtl's lifting line solved by Glauert's Fourier series with the section's own polar, iterated past its straight part (Anderson, Fundamentals of Aerodynamics, ch. 5); in ground effect the trailing vortices mirrored in the ground at the main element's quarter-chord height; end plates by the effective aspect ratio AR(1 + 1.9 h/b) attributed to Hoerner (from memory)"

// FiniteSpanCaution is the warning every output of the estimate carries.
const FiniteSpanCaution = "An estimate from two-dimensional polars: a rectangular wing of the study's span and reference chord, no twist, a flat fixed ground (in ground effect) seen by the trailing vortices through their images, end plates only through an effective aspect ratio, and the tip load falling to zero as on a wing without plates. The wind tunnel or the track must confirm it. Structure and mounting follow the competition's rules and qualified review."

// FiniteSpan is the finite-span estimate of a study: a rectangular wing of
// the study's span and reference chord whose every station has the
// configuration's two-dimensional polar.
//
// Load coefficients and loads are in the sense that the study's angle adds
// to: downforce (positive towards the ground) on an inverted wing, lift
// otherwise (Inverted says which). Coefficients are on the planform area
// SpanM × ChordM; forces in N, NaN when the study has no speed (and the
// profile drag NaN without a viscous polar at the angles the stations
// reach).
type FiniteSpan struct {
	Inverted        bool
	AlphaDeg        float64
	SpanM, ChordM   float64
	EndPlateHeightM float64
	// GroundHeightM is the lifting line's height above the ground (the
	// main element's quarter chord at the study's angle), where the
	// trailing vortices' images are; 0 in free air.
	GroundHeightM        float64
	AreaM2               float64
	AspectRatio          float64 // b/c
	EffectiveAspectRatio float64 // with the end plates; the lifting line is solved at this one

	Load       float64 // load coefficient C_L (downforce when Inverted)
	CDi, CDp   float64 // induced and profile drag coefficients
	Efficiency float64 // span efficiency e at the effective aspect ratio

	DynamicPressurePa float64 // NaN without a speed
	LoadN             float64 // downforce (Inverted) or lift, N
	InducedDragN      float64
	ProfileDragN      float64
	// The two-dimensional figures beside it: the study's point per metre
	// of span (load in the same sense as LoadN; drag NaN without a viscous
	// solution) and over the span with no end effects.
	Load2DPerSpan, Drag2DPerSpan float64
	Load2DN, Drag2DN             float64

	// Stations is the spanwise load on the real span, from the centre to
	// the tip (the other half mirrors it).
	Stations []SpanStation
	// PastMaxLoad: some station works past the polar's largest load (at
	// or beyond stall); the estimate is then not unique.
	PastMaxLoad bool
	// LowAspectRatio: the effective aspect ratio is below
	// LowAspectRatioLimit, where a lifting line is a rough guide only and
	// a lifting-surface method (Weissinger's, a vortex lattice) is the
	// usual choice.
	LowAspectRatio bool
	// PolarFromDeg, PolarToDeg and PolarRows describe the polar used:
	// the angles solved and how many rows had a usable load.
	PolarFromDeg, PolarToDeg float64
	PolarRows, PolarRowsUsed int
	ViscousPolar             bool // the load and drag come from a viscous solution
	// PolarExtended is how many of the viscous polar's rows below its
	// lowest converged angle, PolarExtendedFromDeg, were filled from the
	// panel method (polarTable); 0 when none was.
	PolarExtended        int
	PolarExtendedFromDeg float64
}

// SpanStation is the finite-span load at one station.
type SpanStation struct {
	YM           float64 // distance from the centre of the span, m
	Load         float64 // section load coefficient
	LoadPerSpan  float64 // N/m, NaN without a speed
	EffectiveDeg float64 // the section's effective angle α − α_i
	InducedDeg   float64
	Cd           float64 // section profile drag, NaN when not known
}

// LowAspectRatioLimit is the aspect ratio below which the estimate says
// that a lifting line is a rough guide: about 4 (common practice; texts
// put the limit of lifting-line theory near there).
const LowAspectRatioLimit = 4

// ErrNoSpan is returned for a finite-span estimate of a study without a
// span.
var ErrNoSpan = &model.FieldError{Field: "flow.span_m", Err: errors.New("the finite-span estimate needs the wing's span")}

// FiniteSpanSweep returns the angles a finite-span estimate of st solves
// for its polar: from below the study's angle by the induced angle the
// stations may need (margin degrees) to 2° above it, in 1° steps, within
// the study's limits.
func FiniteSpanSweep(st *model.Study, margin float64) model.SweepRange {
	a := st.Flow.AlphaDeg
	from := math.Max(-model.MaxAlphaDeg, math.Floor(a-margin))
	to := math.Min(model.MaxAlphaDeg, math.Ceil(a+2))
	return model.SweepRange{FromDeg: from, ToDeg: to, StepDeg: 1}
}

// firstMargin is the induced angle, in degrees, FiniteSpan first allows
// for: about that of a load coefficient of 1.5 at aspect ratio 3.5
// (C_L/(π AR) in radians), doubled for the tips of a rectangular wing.
const firstMargin = 16

// FiniteSpan solves the study's configuration over the angles its
// finite-span estimate needs (FiniteSpanSweep, widened once if a station
// reaches beyond them) and returns the estimate with the run's result at
// the study's angle. req.Sweep is ignored (the polar is solved);
// req.Progress sees each sweep.
func (e *Engine) FiniteSpan(ctx context.Context, req Request) (*FiniteSpan, *Result, error) {
	if !(req.Study.Flow.SpanM > 0) {
		return nil, nil, ErrNoSpan
	}
	margin := float64(firstMargin)
	for try := 0; ; try++ {
		st := req.Study.Clone()
		st.Sweep = FiniteSpanSweep(st, margin)
		r := req
		r.Study, r.Sweep = st, true
		res, err := e.Run(ctx, r)
		if err != nil {
			return nil, nil, err
		}
		fs, err := FiniteSpanEstimate(st, res)
		var re *liftingline.RangeError
		if errors.As(err, &re) && viscousEdge(res, re) {
			// Solving more angles would not help: the coupled solution
			// already failed beyond the angles it converged at.
			return nil, res, fmt.Errorf("finite-span estimate: the wing's stations need the section's polar at %.3f°, beyond the angles where the coupled viscous solution converged (%g° to %g° of the %g° to %g° solved); with the viscous solution off the estimate takes the panel method's polar", re.AlphaDeg, re.FromDeg, re.ToDeg, st.Sweep.FromDeg, st.Sweep.ToDeg)
		}
		if errors.As(err, &re) && try == 0 && re.AlphaDeg < re.FromDeg && re.FromDeg > -model.MaxAlphaDeg {
			margin = st.Flow.AlphaDeg - re.AlphaDeg + 4
			continue
		}
		return fs, res, err
	}
}

// ExtensionNote says, in a sentence, that the polar was extended below
// its lowest converged viscous row (polarTable), or is empty.
func (fs *FiniteSpan) ExtensionNote() string {
	if fs.PolarExtended == 0 {
		return ""
	}
	from := model.Minus(strconv.FormatFloat(fs.PolarExtendedFromDeg, 'f', -1, 64))
	return fmt.Sprintf("The viscous solution converged at no angle below %s°: for the %d below it the section polar takes the panel method's lift less the viscous loss at %s°, and its drag.",
		from, fs.PolarExtended, from)
}

// polarTable returns the section polar of a result's sweep for the
// lifting line: the angles, the load (sense × Cl) and the profile drag,
// NaN where there is none, and how many rows have a load. The load is
// the coupled solution's where it ran (NaN where it did not converge),
// the panel method's otherwise, with the boundary-layer estimate's drag
// if that ran.
//
// Below the lowest converged row of a coupled sweep (a two-element wing's
// viscous polar ends at −12°, where its tips need it, and nothing below
// converges) the rows take the panel method's Cl less the viscous loss
// at that row, Cl_inviscid(α) + (Cl − Cl_inviscid)(α₀), and its drag:
// away from maximum lift, where the stations of a wing's tips work, the
// viscous loss of lift changes slowly with the angle (common practice).
// extended counts those rows and from is α₀ (NaN when none).
func polarTable(res *Result, sense float64) (al, load, cd []float64, used, extended int, from float64) {
	n := len(res.Sweep)
	al, load, cd = make([]float64, n), make([]float64, n), make([]float64, n)
	for i, c := range res.Sweep {
		al[i], load[i], cd[i] = c.AlphaDeg, sense*c.Cl, math.NaN()
		switch {
		case res.SweepCoupled != nil:
			p := res.SweepCoupled[i]
			load[i], cd[i] = sense*p.Cl, p.Cd // NaN unless converged
		case res.SweepViscous != nil:
			cd[i] = res.SweepViscous[i].Cd
		}
	}
	from = math.NaN()
	if res.SweepCoupled != nil {
		first := slices.IndexFunc(res.SweepCoupled, func(p CoupledPoint) bool { return p.Converged })
		if first > 0 {
			p := res.SweepCoupled[first]
			loss := p.Cl - p.ClInviscid
			for i := range first {
				if inv := res.SweepCoupled[i].ClInviscid; !math.IsNaN(inv) {
					load[i], cd[i] = sense*(inv+loss), p.Cd
					extended++
				}
			}
			if extended > 0 {
				from = p.AlphaDeg
			}
		}
	}
	for _, l := range load {
		if !math.IsNaN(l) {
			used++
		}
	}
	return al, load, cd, used, extended, from
}

// viscousEdge reports whether the effective angle of re lies beyond the
// converged rows of res's coupled sweep on a side where the sweep solved
// angles that did not converge (so widening the sweep cannot help: the
// two-element example's viscous polar ends at −12°, where its tips need
// it, and nothing below converges).
func viscousEdge(res *Result, re *liftingline.RangeError) bool {
	if res.SweepCoupled == nil || len(res.Sweep) == 0 {
		return false
	}
	first, last := res.Sweep[0].AlphaDeg, res.Sweep[len(res.Sweep)-1].AlphaDeg
	return re.AlphaDeg < re.FromDeg && re.FromDeg > first || re.AlphaDeg > re.ToDeg && re.ToDeg < last
}

// FiniteSpanEstimate returns the finite-span estimate of st from a result
// whose sweep covers the angles the stations reach (see FiniteSpanSweep).
// The polar is polarTable's: the coupled sweep's converged rows in
// coupled mode (extended below the lowest from the panel method), the
// inviscid lift with the boundary-layer estimate's drag with the estimate,
// and the inviscid lift alone (no profile drag) without a viscous
// solution.
func FiniteSpanEstimate(st *model.Study, res *Result) (*FiniteSpan, error) {
	if !(st.Flow.SpanM > 0) {
		return nil, ErrNoSpan
	}
	if len(res.Sweep) == 0 {
		panic("engine: FiniteSpanEstimate of a result without a sweep")
	}
	sense := loadSense(st.Inverted)
	n := len(res.Sweep)
	al, load, cd, used, extended, from := polarTable(res, sense)
	tbl, err := liftingline.NewTable(al, load, cd)
	if err != nil {
		return nil, fmt.Errorf("finite-span estimate: %w", err)
	}
	l := res.Layout
	c := l.RefChordM
	b := st.Flow.SpanM
	h := st.Flow.EndPlateHeightMM / 1000
	ar := b / c
	arEff := liftingline.EndPlateAspectRatio(ar, h, b)
	opt := liftingline.Options{GroundHeightM: groundHeight(l, st.Flow.AlphaDeg)}
	ll, err := liftingline.Solve(liftingline.Rectangular(arEff*c, c), tbl, st.Flow.AlphaDeg, opt)
	if err != nil {
		return nil, fmt.Errorf("finite-span estimate: %w", err)
	}
	fs := &FiniteSpan{
		Inverted: st.Inverted, AlphaDeg: st.Flow.AlphaDeg,
		SpanM: b, ChordM: c, EndPlateHeightM: h, AreaM2: b * c, GroundHeightM: opt.GroundHeightM,
		AspectRatio: ar, EffectiveAspectRatio: arEff,
		Load: ll.CL, CDi: ll.CDi, CDp: ll.CDp, Efficiency: ll.Efficiency,
		DynamicPressurePa: math.NaN(),
		LoadN:             math.NaN(), InducedDragN: math.NaN(), ProfileDragN: math.NaN(),
		Load2DPerSpan: math.NaN(), Drag2DPerSpan: math.NaN(), Load2DN: math.NaN(), Drag2DN: math.NaN(),
		PastMaxLoad: ll.PastMaxLoad, LowAspectRatio: arEff < LowAspectRatioLimit,
		PolarFromDeg: al[0], PolarToDeg: al[n-1], PolarRows: n, PolarRowsUsed: used,
		ViscousPolar:  res.SweepCoupled != nil || res.SweepViscous != nil,
		PolarExtended: extended, PolarExtendedFromDeg: from,
	}
	q := math.NaN()
	if f := res.Forces; f != nil {
		q = f.DynamicPressurePa
		fs.DynamicPressurePa = q
		fs.LoadN, fs.InducedDragN, fs.ProfileDragN = q*fs.AreaM2*ll.CL, q*fs.AreaM2*ll.CDi, q*fs.AreaM2*ll.CDp
		fs.Load2DPerSpan, fs.Drag2DPerSpan = sense*f.LiftPerSpan, f.DragPerSpan
		fs.Load2DN, fs.Drag2DN = fs.Load2DPerSpan*b, fs.Drag2DPerSpan*b
	}
	for _, s := range ll.Stations {
		fs.Stations = append(fs.Stations, SpanStation{
			YM: s.Eta * b / 2, Load: s.Load, LoadPerSpan: q * s.LoadPerQ,
			EffectiveDeg: s.EffectiveDeg, InducedDeg: s.InducedDeg, Cd: s.Cd,
		})
	}
	return fs, nil
}

// groundHeight is the height above the ground of the main element's
// quarter chord at alphaDeg, where the lifting line lies; 0 in free air.
func groundHeight(l *model.Layout, alphaDeg float64) float64 {
	if !l.Ground || len(l.Elements) == 0 {
		return 0
	}
	elems, groundY, _ := l.At(alphaDeg)
	e := elems[0]
	q := e.LeadingEdge.Add(e.TrailingEdge.Sub(e.LeadingEdge).Scale(0.25))
	return q.Y - groundY
}
