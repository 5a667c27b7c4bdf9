package engine

import (
	"context"
	"errors"
	"fmt"
	"math"

	"sectionbench/model"
	"sectionbench/solver"
)

// DefaultDensityPanels are the panel counts a density study runs when none
// are given: a constant refinement ratio of 2, so that the three finest give
// an observed order and a Richardson extrapolation.
var DefaultDensityPanels = []int{20, 40, 80, 160, 320, 640}

// Default tolerances of a density study's recommendation, in percent of the
// extrapolated value.
const (
	DefaultTolClPct    = 0.5
	DefaultTolCpMinPct = 2.0
)

// Floors of the denominators of the density study's relative tolerances,
// so that a value near zero (Cl of a symmetric section at 0°) is judged on
// an absolute scale: a tenth of a typical working Cl, and a tenth of a
// typical suction peak.
const (
	densityClFloor    = 0.1
	densityCpMinFloor = 0.1
)

// DensityOptions set up a density study.
type DensityOptions struct {
	Panels []int     // strictly increasing; empty means DefaultDensityPanels
	Nose   []float64 // nose clustering values in [0, 1]; empty means model.DefaultPanelling.Nose only
	// Tolerances of the recommendation in percent; 0 means
	// DefaultTolClPct and DefaultTolCpMinPct.
	TolClPct, TolCpMinPct float64
}

// DensityRow is the result at one panel count and nose clustering.
type DensityRow struct {
	Panels int
	Nose   float64
	Cl, Cm float64 // of the whole configuration
	// CpMin is the lowest Cp over all elements (solver.ElementSolution.CpMin): the
	// suction peak.
	CpMin            float64
	DCl, DCm, DCpMin float64 // change from the previous count at the same nose value; NaN for the first
	// ViscousCl and ViscousCd are the coupled viscous solution's Cl and
	// Cd when the study solves it (DensityResult.Viscous), NaN otherwise
	// and where it did not converge.
	ViscousCl, ViscousCd float64
	// ViscousTransitionUpper and ViscousTransitionLower are the coupled
	// solution's transition on the main element, x/c on its surfaces as
	// mounted; NaN as for ViscousCl and for a layer laminar to its
	// trailing edge.
	ViscousTransitionUpper, ViscousTransitionLower float64
	// ViscousIterations is how many iterations the coupled solution took
	// (0 without it), for a row that did not converge.
	ViscousIterations int
	// ViscousResidual is the coupled solution's last step
	// (CoupledPoint.Residual: the largest relative change of the last
	// iteration of the attempt the solver reports), NaN without it. Where the solution did
	// not converge, a value above DivergedStep says that its iterations
	// diverged and were given up early, not stopped by their bound.
	ViscousResidual float64
	// ViscousRejected says why iterations that met their tolerance were
	// not accepted (CoupledPoint.Rejected); empty otherwise.
	ViscousRejected string
	// ViscousHeld: the converged coupled solution holds transition
	// upstream of its e^N position on some surface
	// (CoupledElementPoint.HeldUpper, HeldLower): its answer is that of a
	// trip there, not the free-transition answer of the other counts.
	ViscousHeld bool
	// MinPanelLength and MaxPanelLength are the shortest and longest panel
	// over all elements, each as a fraction of its own element's chord
	// (0.0062 is 0.62% of chord, not a length: at 40 cosine-spaced panels
	// on a 250 mm chord the shortest panel is 0.0062 × 250 mm ≈ 1.5 mm).
	MinPanelLength, MaxPanelLength float64
	// ShortestPanel and LongestPanel are the same panels' lengths in the
	// configuration's length unit: metres for a placed study (Layout).
	ShortestPanel, LongestPanel float64
	// Skipped is why this count was not solved, empty when it was: the
	// geometry at this count failed a check (e.g. a gap between elements
	// shorter than the panels, model.ErrSmallGap). Err is that error, for
	// errors.Is and errors.As. A skipped row's values are NaN, and the
	// extrapolations and the recommendation leave it out.
	Skipped string
	Err     error
}

// Solved reports whether the row holds a solution (it was not skipped).
func (r DensityRow) Solved() bool { return r.Err == nil }

// Extrapolation is a Richardson extrapolation from the three finest counts.
type Extrapolation struct {
	Value         float64 // extrapolated to infinitely many panels; the finest value when !OK
	ErrorEstimate float64 // |Value − finest value|; NaN when !OK
	ObservedOrder float64 // NaN when !OK or when the values did not change
	OK            bool    // false when the three finest values are not monotonically converging, the ratio is not constant or the observed order is outside [MinObservedOrder, MaxObservedOrder]
	// Why says in words why OK is false (empty when it is true): fewer
	// than three values, counts not at one refinement ratio, changes
	// that do not shrink with one sign, or the observed order outside the
	// band.
	Why string
}

// The band of observed orders a density study accepts for a Richardson
// extrapolation. The method's formal order is about 2 (linear-strength
// vortex panels, docs/validation.md §7), and an observed order far from the formal
// one says that the three finest counts are not yet in the asymptotic range
// (or that the changes are rounding noise), so the extrapolation is not to
// be trusted (Roache, Verification and Validation in Computational Science
// and Engineering, 1998, ch. 5: the grid convergence index is meant for
// observed orders near the formal one). Outside the band the amplification
// 1/(r^p − 1) runs away: with r = 2 it is 2.4 at p = 0.5 and 0.016 at
// p = 6, but 1.4e4 at p = 1e-4 (values 1, 0.8, 0.60001 extrapolate to
// −3999 ± 3999). Project choice: [0.5, 6], a quarter of the formal order
// to three times it.
const (
	MinObservedOrder = 0.5
	MaxObservedOrder = 6.0
)

// DivergedStep is the last Newton step, as a multiple of the variables'
// values, above which a coupled solution that did not converge is said to
// have diverged: the solver gives up on iterations whose step grows past
// ten times the values four times in a row, or past 10⁴ times at once
// (solver.DivergedStep).
const DivergedStep = solver.DivergedStep

// ViscousFailure says in words why the coupled solution of row did not
// converge, or "" when it did or was not solved: the iterations spent over
// all its attempts and whether the first attempt's iterations diverged or
// ran out.
func ViscousFailure(row DensityRow) string {
	if !row.Solved() || !math.IsNaN(row.ViscousCl) || row.ViscousIterations == 0 {
		return ""
	}
	if row.ViscousRejected != "" {
		return fmt.Sprintf("the viscous solution at %d panels was not accepted: %s", row.Panels, row.ViscousRejected)
	}
	why := fmt.Sprintf("stopped at the iteration bound with a last step of %.2g times the values", row.ViscousResidual)
	if !(row.ViscousResidual <= DivergedStep) {
		why = fmt.Sprintf("diverged (a last step of %.2g times the values) and was given up before the iteration bound", row.ViscousResidual)
	}
	return fmt.Sprintf("the viscous solution did not converge at %d panels: %d Newton iterations over all its attempts; the first attempt %s", row.Panels, row.ViscousIterations, why)
}

// DensitySeries is the outcome for one nose clustering value.
type DensitySeries struct {
	Nose              float64
	Cl, Cm, CpMin     Extrapolation
	RecommendedPanels int // smallest count that, with every finer one, meets the tolerances; 0 if none
	// ViscousCl and ViscousCd extrapolate the coupled viscous solution's
	// coefficients from the three finest counts at which it converged
	// (not OK when it did not at three counts of a constant ratio, or
	// without it); they do not enter the recommendation, which judges
	// the panel method.
	ViscousCl, ViscousCd Extrapolation
}

// DensityResult is the outcome of a density study. Cl, Cm, CpMin and
// RecommendedPanels repeat Series[0], the first nose value, for callers
// that run one.
type DensityResult struct {
	Rows                 []DensityRow // nose-major: every count for the first nose, then the next
	Cl, Cm, CpMin        Extrapolation
	RecommendedPanels    int
	Series               []DensitySeries
	ViscousCl, ViscousCd Extrapolation // Series[0]'s
	// Viscous says that each count also solved the coupled viscous
	// solution (the study has it on).
	Viscous bool
}

// ObservedOrder returns the order of convergence observed in three values
// from coarse to fine, f1, f2, f3, at a constant refinement ratio r > 1:
//
//	p = ln((f1 − f2)/(f2 − f3)) / ln r
//
// (Roache, Verification and Validation in Computational Science and
// Engineering, 1998, ch. 5). ok is false unless the changes have the same
// sign and shrink, that is unless the sequence converges monotonically.
func ObservedOrder(f1, f2, f3, r float64) (p float64, ok bool) {
	if !(r > 1) {
		panic(fmt.Sprintf("solver: ObservedOrder: refinement ratio %g ≤ 1", r))
	}
	d12, d23 := f1-f2, f2-f3
	if !(d12*d23 > 0) || !(math.Abs(d23) < math.Abs(d12)) {
		return math.NaN(), false
	}
	return math.Log(d12/d23) / math.Log(r), true
}

// Richardson returns the extrapolation of the two finest values f2, f3 at
// refinement ratio r and order p (Richardson, Phil. Trans. R. Soc. A 210,
// 1911; Roache 1998):
//
//	value = f3 + (f3 − f2)/(r^p − 1),  errEstimate = |value − f3|.
func Richardson(f2, f3, r, p float64) (value, errEstimate float64) {
	d := (f3 - f2) / (math.Pow(r, p) - 1)
	return f3 + d, math.Abs(d)
}

// DensityStudy runs solve at every panel count for every nose value, in
// that order, and judges convergence: each quantity is extrapolated from
// the three finest counts, and the recommendation is the smallest count
// whose Cl and CpMin, and those of every finer count, lie within the
// tolerances of the extrapolated values (relative, with floors of 0.1 in
// the denominators). A count is recommended only where the Cl
// extrapolation is OK; CpMin is compared with its extrapolation if that
// is OK and with the finest value otherwise, because the suction peak
// often converges unevenly as it moves between panels.
//
// A count whose geometry fails a check (solve returns an error matching
// model.ErrSmallGap or model.ErrOverlap, or a *GeometryError: at coarse
// counts the panels can be longer than the gap between two elements) is
// recorded as a skipped row (DensityRow.Skipped, DensityRow.Err) and the
// study goes on; extrapolation and recommendation use the counts that
// solved, so with fewer than three of them no extrapolation is OK. If no
// count solves at all, DensityStudy returns the first such error.
//
// progress, if not nil, is called after each solve with the number done and
// the total. The context is checked before each solve; on cancellation
// DensityStudy returns ctx.Err(). Bad options return a *model.FieldError
// naming the density-plan field; any other error from solve is returned
// wrapped with the count and nose value.
func DensityStudy(ctx context.Context, opt DensityOptions, solve func(panels int, nose float64) (*solver.Solution, *CoupledPoint, error), progress func(done, total int)) (*DensityResult, error) {
	opt, err := opt.withDefaults()
	if err != nil {
		return nil, err
	}
	total := len(opt.Panels) * len(opt.Nose)
	res := &DensityResult{}
	done := 0
	var firstSkip error
	solved := 0
	for _, nose := range opt.Nose {
		first := len(res.Rows)
		prev := -1 // index in res.Rows of the last solved row of this nose value
		for _, n := range opt.Panels {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
			sol, cpl, err := solve(n, nose)
			var row DensityRow
			switch {
			case err == nil:
				row = densityRow(sol, n, nose)
				if cpl != nil {
					res.Viscous = true
					row.ViscousIterations, row.ViscousResidual, row.ViscousRejected = cpl.Iterations, cpl.Residual, cpl.Rejected
					if cpl.Converged {
						row.ViscousCl, row.ViscousCd = cpl.Cl, cpl.Cd
						if len(cpl.Elements) > 0 {
							row.ViscousTransitionUpper, row.ViscousTransitionLower = cpl.Elements[0].TransitionUpper, cpl.Elements[0].TransitionLower
							for _, e := range cpl.Elements {
								row.ViscousHeld = row.ViscousHeld || e.HeldUpper || e.HeldLower
							}
						}
					}
				}
				if prev >= 0 {
					p := res.Rows[prev]
					row.DCl, row.DCm, row.DCpMin = row.Cl-p.Cl, row.Cm-p.Cm, row.CpMin-p.CpMin
				}
				prev = len(res.Rows)
				solved++
			case skippableDensityError(err):
				err = fmt.Errorf("density study at %d panels, nose %g: %w", n, nose, err)
				if firstSkip == nil {
					firstSkip = err
				}
				row = skippedRow(n, nose, err)
			default:
				return nil, fmt.Errorf("density study at %d panels, nose %g: %w", n, nose, err)
			}
			res.Rows = append(res.Rows, row)
			done++
			if progress != nil {
				progress(done, total)
			}
		}
		res.Series = append(res.Series, densitySeries(res.Rows[first:], nose, opt))
	}
	if solved == 0 {
		return nil, firstSkip
	}
	s0 := res.Series[0]
	res.Cl, res.Cm, res.CpMin, res.RecommendedPanels = s0.Cl, s0.Cm, s0.CpMin, s0.RecommendedPanels
	res.ViscousCl, res.ViscousCd = s0.ViscousCl, s0.ViscousCd
	return res, nil
}

// skippableDensityError reports whether err is a geometry check that a
// density study records as a skipped count rather than an abort.
func skippableDensityError(err error) bool {
	var ge *solver.GeometryError
	return errors.Is(err, model.ErrSmallGap) || errors.Is(err, model.ErrOverlap) || errors.As(err, &ge)
}

// skippedRow is the row of a count that was not solved.
func skippedRow(n int, nose float64, err error) DensityRow {
	nan := math.NaN()
	return DensityRow{Panels: n, Nose: nose, Cl: nan, Cm: nan, CpMin: nan, DCl: nan, DCm: nan, DCpMin: nan, ViscousCl: nan, ViscousCd: nan, ViscousTransitionUpper: nan, ViscousTransitionLower: nan, ViscousResidual: nan,
		MinPanelLength: nan, MaxPanelLength: nan, ShortestPanel: nan, LongestPanel: nan,
		Skipped: err.Error(), Err: err}
}

// withDefaults fills in defaults and validates the options.
func (o DensityOptions) withDefaults() (DensityOptions, error) {
	if len(o.Panels) == 0 {
		o.Panels = DefaultDensityPanels
	}
	o.Panels = append([]int(nil), o.Panels...)
	for i, n := range o.Panels {
		if n < model.MinPanels || n > model.MaxPanels {
			return o, &model.FieldError{Field: fmt.Sprintf("density.panels[%d]", i), Err: fmt.Errorf("%d is outside %d..%d", n, model.MinPanels, model.MaxPanels)}
		}
		if i > 0 && n <= o.Panels[i-1] {
			return o, &model.FieldError{Field: fmt.Sprintf("density.panels[%d]", i), Err: fmt.Errorf("%d does not exceed the previous count %d", n, o.Panels[i-1])}
		}
	}
	if len(o.Nose) == 0 {
		o.Nose = []float64{model.DefaultPanelling.Nose}
	}
	o.Nose = append([]float64(nil), o.Nose...)
	for i, v := range o.Nose {
		if !(v >= 0 && v <= 1) {
			return o, &model.FieldError{Field: fmt.Sprintf("density.nose[%d]", i), Err: fmt.Errorf("%g is outside [0, 1]", v)}
		}
	}
	for _, t := range []struct {
		field string
		v     *float64
		def   float64
	}{{"density.tol_cl_pct", &o.TolClPct, DefaultTolClPct}, {"density.tol_cp_min_pct", &o.TolCpMinPct, DefaultTolCpMinPct}} {
		if *t.v == 0 {
			*t.v = t.def
		}
		if !(*t.v > 0 && *t.v <= 100) {
			return o, &model.FieldError{Field: t.field, Err: fmt.Errorf("%g is outside (0, 100] %%", *t.v)}
		}
	}
	return o, nil
}

// densityRow condenses one solution.
func densityRow(sol *solver.Solution, n int, nose float64) DensityRow {
	nan := math.NaN()
	row := DensityRow{Panels: n, Nose: nose, Cl: sol.Cl, Cm: sol.Cm, CpMin: math.Inf(1),
		DCl: nan, DCm: nan, DCpMin: nan, ViscousCl: nan, ViscousCd: nan, ViscousTransitionUpper: nan, ViscousTransitionLower: nan, ViscousResidual: nan, MinPanelLength: math.Inf(1), MaxPanelLength: 0}
	for _, e := range sol.Elements {
		row.CpMin = math.Min(row.CpMin, e.CpMin)
		// solver.Panel lengths from the midpoint arc lengths: S_0 = L_0/2 and
		// S_i − S_(i−1) = (L_(i−1) + L_i)/2.
		l := 0.0
		for i, p := range e.Panels {
			if i == 0 {
				l = 2 * p.S
			} else {
				l = 2*(p.S-e.Panels[i-1].S) - l
			}
			f := l / e.Chord
			if f < row.MinPanelLength {
				row.MinPanelLength, row.ShortestPanel = f, l
			}
			if f > row.MaxPanelLength {
				row.MaxPanelLength, row.LongestPanel = f, l
			}
		}
	}
	return row
}

// densitySeries extrapolates one nose value's rows and recommends a count.
// Skipped rows are left out of the extrapolation; the recommended count and
// every finer one must have solved.
func densitySeries(rows []DensityRow, nose float64, opt DensityOptions) DensitySeries {
	ser := DensitySeries{Nose: nose}
	var counts []int
	var cl, cm, cpm []float64
	for _, r := range rows {
		if r.Solved() {
			counts = append(counts, r.Panels)
			cl, cm, cpm = append(cl, r.Cl), append(cm, r.Cm), append(cpm, r.CpMin)
		}
	}
	ser.Cl = extrapolate(counts, cl)
	ser.Cm = extrapolate(counts, cm)
	ser.CpMin = extrapolate(counts, cpm)
	ser.ViscousCl = extrapolateFinite(rows, func(r DensityRow) float64 { return r.ViscousCl })
	ser.ViscousCd = extrapolateFinite(rows, func(r DensityRow) float64 { return r.ViscousCd })
	if !ser.Cl.OK {
		return ser
	}
	within := func(v, ref, floor, pct float64) bool {
		return math.Abs(v-ref) <= pct/100*math.Max(math.Abs(ref), floor)
	}
	for i := len(rows) - 1; i >= 0; i-- {
		r := rows[i]
		if !r.Solved() || !within(r.Cl, ser.Cl.Value, densityClFloor, opt.TolClPct) ||
			!within(r.CpMin, ser.CpMin.Value, densityCpMinFloor, opt.TolCpMinPct) {
			break
		}
		ser.RecommendedPanels = r.Panels
	}
	return ser
}

// extrapolate applies ObservedOrder and Richardson to the three finest
// values, which must be at a constant refinement ratio (to 1e-9), and
// accepts the result only for an observed order within [MinObservedOrder,
// MaxObservedOrder]; outside it OK is false.
// extrapolateFinite extrapolates value over the rows where it is finite
// (a coupled solution converged there), as extrapolate does.
func extrapolateFinite(rows []DensityRow, value func(DensityRow) float64) Extrapolation {
	var counts []int
	var f []float64
	for _, r := range rows {
		if v := value(r); r.Solved() && !math.IsNaN(v) {
			counts, f = append(counts, r.Panels), append(f, v)
		}
	}
	return extrapolate(counts, f)
}

// Extrapolate is the density study's extrapolation of values f at panel
// counts (ascending, one value each): Richardson's from the three finest,
// with Why saying in words why there is none; for callers that hold
// values of their own (a report's viscous counts).
func Extrapolate(counts []int, f []float64) Extrapolation { return extrapolate(counts, f) }

func extrapolate(counts []int, f []float64) Extrapolation {
	n := len(f)
	bad := Extrapolation{Value: math.NaN(), ErrorEstimate: math.NaN(), ObservedOrder: math.NaN()}
	if n > 0 {
		bad.Value = f[n-1]
	}
	if n < 3 {
		bad.Why = fmt.Sprintf("values at %d counts, and it takes three", n)
		return bad
	}
	n1, n2, n3 := float64(counts[n-3]), float64(counts[n-2]), float64(counts[n-1])
	r := n3 / n2
	if math.Abs(n2/n1-r) > 1e-9*r {
		bad.Why = fmt.Sprintf("the three finest counts with values, %d, %d and %d, are not at one refinement ratio", counts[n-3], counts[n-2], counts[n-1])
		return bad
	}
	f1, f2, f3 := f[n-3], f[n-2], f[n-1]
	if f1 == f2 && f2 == f3 { // converged to the last digit
		return Extrapolation{Value: f3, ErrorEstimate: 0, ObservedOrder: math.NaN(), OK: true}
	}
	p, ok := ObservedOrder(f1, f2, f3, r)
	if !ok {
		bad.Why = fmt.Sprintf("not converging monotonically over the counts %d, %d, %d (changes %+.2g, then %+.2g)", counts[n-3], counts[n-2], counts[n-1], f2-f1, f3-f2)
		return bad
	}
	if p < MinObservedOrder || p > MaxObservedOrder {
		bad.Why = fmt.Sprintf("observed order %.2f over the counts %d, %d, %d, outside [%g, %g]", p, counts[n-3], counts[n-2], counts[n-1], MinObservedOrder, MaxObservedOrder)
		return bad
	}
	v, e := Richardson(f2, f3, r, p)
	return Extrapolation{Value: v, ErrorEstimate: e, ObservedOrder: p, OK: true}
}
