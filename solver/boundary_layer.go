package solver

import (
	"errors"
	"fmt"
	"math"

	"sectionbench/model"
	"sectionbench/solver/ode"
)

// Constants of the integral boundary-layer estimate. Each says where it
// comes from.
const (
	// ThwaitesA is the constant of Thwaites' quadrature
	// θ² Ue⁶ = A ν ∫ Ue⁵ dx (Thwaites, Aeronautical Quarterly 1, 1949).
	ThwaitesA = 0.45
	// LaminarSeparationLambda is the value of Thwaites' parameter
	// λ = θ² (dUe/dx)/ν at which laminar separation is taken to occur
	// (Thwaites 1949; Cebeci & Bradshaw, Momentum Transfer in Boundary
	// Layers, 1977).
	LaminarSeparationLambda = -0.09
	// TransitionH is the shape factor a turbulent boundary layer starts
	// with at transition, θ carried over continuously (common practice:
	// a typical value for a young turbulent layer at low Re_θ).
	TransitionH = 1.4
	// DefaultTurbulentSeparationH is the shape factor at which Head's
	// method is taken to separate when BLOptions leaves it at zero. Texts
	// put turbulent separation anywhere in H ≈ 2.2–3.0 (2.2–2.4 in common
	// teaching use); the low end is chosen because it flags separation
	// early, which is the safe side for a user reading a drag estimate.
	// H rises steeply near separation in Head's method, so the location
	// moves by only a few percent of chord between 2.4 and 3.0 (about
	// 0.78c to 0.80c in TestBLTurbulentSeparation); a caller who wants the
	// permissive end sets 2.8 or 3.0.
	DefaultTurbulentSeparationH = 2.4
	// MinTurbulentSeparationH and MaxTurbulentSeparationH bound the
	// threshold a caller may choose (model.MinSeparationH and
	// model.MaxSeparationH, which a study is validated against).
	MinTurbulentSeparationH = model.MinSeparationH
	MaxTurbulentSeparationH = model.MaxSeparationH
)

// Head's entrainment method and the Ludwieg–Tillmann skin friction law,
// coefficients as widely reproduced (Head, ARC R&M 3152, 1958; Ludwieg &
// Tillmann, NACA TM 1285, 1950; from memory, see docs/validation.md §4).
const (
	headEntrainA = 0.0306  // (1/Ue) d(Ue θ H₁)/dx = a (H₁ − 3)^b
	headEntrainB = -0.6169 //
	headH1Split  = 1.6     // H at which the H₁(H) correlation changes branch
	ltA          = 0.246   // Cf = a 10^(b H) Re_θ^c
	ltB          = -0.678  //
	ltC          = -0.268  //
	// headMaxH clamps H inside the turbulent equations so that a trial
	// step past separation stays finite; results beyond the separation
	// threshold are never reported.
	headMaxH = 4.0
)

// Michel's transition criterion in the form of Cebeci & Smith (Analysis of
// Turbulent Boundary Layers, 1974): transition where
// Re_θ ≥ 1.174 (1 + 22400/Re_x) Re_x^0.46 (formula as published; the
// attribution is from memory, see docs/validation.md §4).
const (
	michelA = 1.174
	michelB = 22400
	michelC = 0.46
)

// Causes of transition reported in SurfaceBL.TransitionCause.
const (
	TransitionMichel            = "michel"
	TransitionTrip              = "trip"
	TransitionLaminarSeparation = "laminar-separation"
	TransitionNone              = "none"
)

// MinBLStations is the fewest stations SolveSurface accepts.
const MinBLStations = 3

// ErrBLInput is wrapped by every BLError.
var ErrBLInput = errors.New("boundary-layer input out of range")

// BLError reports unusable boundary-layer input: which element and surface
// (when known), which field and which station (−1 when none).
type BLError struct {
	Element string
	Surface string
	Field   string
	Index   int
	Err     error
}

func (e *BLError) Error() string {
	where := ""
	if e.Element != "" {
		where = "element " + e.Element + ", "
	}
	if e.Surface != "" {
		where += e.Surface + " surface, "
	}
	if e.Index >= 0 {
		return fmt.Sprintf("solver: boundary layer: %s%s at station %d: %v", where, e.Field, e.Index, e.Err)
	}
	return fmt.Sprintf("solver: boundary layer: %s%s: %v", where, e.Field, e.Err)
}

func (e *BLError) Unwrap() error { return e.Err }

func blErr(field string, index int, format string, args ...any) error {
	return &BLError{Field: field, Index: index, Err: fmt.Errorf("%w: "+format, append([]any{ErrBLInput}, args...)...)}
}

// BLOptions are the settings of one surface's boundary layer.
type BLOptions struct {
	Re                   float64 // U∞ c / ν on the chord the lengths are scaled by; > 0
	TripXC               float64 // forced transition at this x/c behind the leading edge; 0 = free transition
	TurbulentSeparationH float64 // 0 → DefaultTurbulentSeparationH; else in [MinTurbulentSeparationH, MaxTurbulentSeparationH]
}

// SurfaceBL is the boundary layer of one surface, from the stagnation point
// to the trailing edge. Lengths are on the chord, velocities on U∞.
// Past a turbulent separation the station arrays hold NaN.
type SurfaceBL struct {
	S, XC, Ue []float64 // stations: arc length from the stagnation point, x/c, edge velocity
	Theta     []float64 // momentum thickness θ/c
	DeltaStar []float64 // displacement thickness δ*/c = H θ
	H         []float64 // shape factor δ*/θ
	// Cf is the wall shear stress on the freestream dynamic pressure,
	// τw/(½ρU∞²), so that it stays finite (zero) at a stagnation point;
	// NaN at a sharp leading edge (s = 0 with Ue > 0), where it is
	// unbounded. On the local edge dynamic pressure it is Cf/Ue².
	Cf        []float64
	Turbulent []bool

	TransitionXC          float64 // NaN if the layer stays laminar
	LaminarSeparationXC   float64 // NaN unless laminar separation came before any other transition
	TurbulentSeparationXC float64 // NaN if none
	TransitionCause       string  // TransitionMichel, TransitionTrip, TransitionLaminarSeparation or TransitionNone
	// Bubble is set when laminar separation came first: the layer is
	// assumed to reattach turbulent at once, which is where a laminar
	// separation bubble may sit. Its own losses are not modelled.
	Bubble bool
	// Separated is set when the turbulent layer separated before the
	// trailing edge: results past TurbulentSeparationXC, the trailing-edge
	// values and Cd are outside the method's range and are NaN.
	Separated bool

	ThetaTE, HTE, UeTE float64 // at the last station; NaN if Separated
	// Cd is this surface's share of the section drag by Squire & Young
	// (ARC R&M 1838, 1938), Cd = 2 θ_TE (Ue,TE)^((H_TE + 5)/2) on the
	// chord; NaN if Separated, because a confident number there would
	// mislead.
	Cd float64
}

// SolveSurface computes the boundary layer on one surface from its inviscid
// edge velocity. It is a one-way estimate: the boundary layer does not
// displace the outer flow (no viscous–inviscid coupling), so lift and
// pressure are unchanged and results near separation are rough.
//
// s holds arc lengths from the stagnation point (on the chord), strictly
// increasing and ≥ 0; ue the edge velocity Ue/U∞ ≥ 0; xc the position
// along the chord of each station. If s[0] > 0, Ue is taken to rise linearly
// from 0 at s = 0 (a stagnation point) to ue[0]; if s[0] = 0, ue[0] may be 0
// (a stagnation point) or positive (a sharp leading edge, as on a flat
// plate). Only ue[0] may be zero.
//
// Laminar flow follows Thwaites' method (Thwaites 1949),
//
//	θ² Ue⁶ = 0.45 ν ∫₀^x Ue⁵ dx,  λ = θ² (dUe/dx)/ν,
//
// with ∫ Ue⁵ dx evaluated exactly for Ue linear between stations (which
// gives θ² = 0.075 ν/(dUe/dx) at a stagnation point, the classical start;
// Cebeci & Bradshaw 1977, Moran, An Introduction to Theoretical and
// Computational Aerodynamics, 1984), and the Cebeci & Bradshaw (1977)
// correlations l(λ), H(λ) (docs/validation.md §4); λ is clamped to [−0.1, 0.1],
// the range of the correlations. Laminar separation is at λ ≤ −0.09.
//
// Transition is placed at the first of: Michel's criterion (Cebeci–Smith
// form, Re_x and Re_θ on the local Ue and the arc length from the
// stagnation point), the trip at x/c = TripXC (counted on the stations at
// and after the smallest x/c, the leading edge; at the first station if the
// stagnation point already lies behind the trip), and laminar separation
// (then Bubble is set). Events are located by linear interpolation between
// stations.
//
// Turbulent flow follows Head's entrainment method (ARC R&M 3152, 1958),
//
//	dθ/dx = Cf/2 − (H + 2)(θ/Ue) dUe/dx,
//	(1/Ue) d(Ue θ H₁)/dx = 0.0306 (H₁ − 3)^(−0.6169),
//
// with H₁(H) as in docs/validation.md §4 (from memory) and the Ludwieg–Tillmann
// skin friction Cf = 0.246 · 10^(−0.678 H) Re_θ^(−0.268) (NACA TM 1285),
// starting from H = TransitionH with θ continuous. The two equations are
// integrated with an adaptive Dormand–Prince 5(4) scheme, Ue linear between
// stations. Turbulent separation is where H reaches the threshold; the
// integration stops there.
func SolveSurface(s, ue, xc []float64, opt BLOptions) (SurfaceBL, error) {
	n := len(s)
	if len(ue) != n || len(xc) != n {
		panic(fmt.Sprintf("solver: SolveSurface: lengths differ: s %d, ue %d, xc %d", n, len(ue), len(xc)))
	}
	hsep, err := checkBLInput(s, ue, xc, opt)
	if err != nil {
		return SurfaceBL{}, err
	}
	re := opt.Re
	nan := math.NaN()
	out := SurfaceBL{
		S: append([]float64(nil), s...), XC: append([]float64(nil), xc...), Ue: append([]float64(nil), ue...),
		Theta: make([]float64, n), DeltaStar: make([]float64, n), H: make([]float64, n), Cf: make([]float64, n),
		Turbulent:    make([]bool, n),
		TransitionXC: nan, LaminarSeparationXC: nan, TurbulentSeparationXC: nan,
		TransitionCause: TransitionNone,
		ThetaTE:         nan, HTE: nan, UeTE: nan, Cd: nan,
	}

	// Thwaites: θ² at every station and λ.
	th2 := make([]float64, n)
	lam := make([]float64, n)
	due := edgeVelocityGradient(s, ue)
	integral := 0.0
	if s[0] > 0 {
		integral = intPow5(0, ue[0], s[0])
	}
	for i := range n {
		if i > 0 {
			integral += intPow5(ue[i-1], ue[i], s[i]-s[i-1])
		}
		switch {
		case ue[i] > 0:
			th2[i] = ThwaitesA / re * integral / math.Pow(ue[i], 6)
		case due[i] > 0: // stagnation point at s = 0
			th2[i] = ThwaitesA / 6 / (re * due[i])
		default:
			return SurfaceBL{}, blErr("ue", i, "the flow does not leave the stagnation point (dUe/ds = %g)", due[i])
		}
		lam[i] = th2[i] * due[i] * re
	}

	// Laminar march until the first transition event.
	iLE := 0
	for i := range xc {
		if xc[i] < xc[iLE] {
			iLE = i
		}
	}
	tripped := func(i int) (frac float64, ok bool) {
		if opt.TripXC <= 0 || i < 1 || i < iLE || xc[i] < opt.TripXC {
			return 0, false
		}
		switch {
		case i-1 >= iLE && xc[i-1] < opt.TripXC:
			return (opt.TripXC - xc[i-1]) / (xc[i] - xc[i-1]), true
		case th2[i-1] > 0: // the trip lies ahead of the first station: trip there
			return 0, true
		}
		return 1, true
	}
	michel := func(i int) float64 { // ≥ 0 once the criterion is met
		rex := re * ue[i] * s[i]
		if rex <= 0 {
			return math.Inf(-1)
		}
		return re*ue[i]*math.Sqrt(th2[i]) - michelA*(1+michelB/rex)*math.Pow(rex, michelC)
	}
	first := n // first turbulent station
	var sTr, th2Tr, xcTr float64
	for i := range n {
		cause, frac := "", 2.0
		if i > 0 {
			if lam[i] <= LaminarSeparationLambda {
				cause, frac = TransitionLaminarSeparation, crossing(lam[i-1]-LaminarSeparationLambda, lam[i]-LaminarSeparationLambda)
			}
			if g1 := michel(i); g1 >= 0 {
				if f := crossing(michel(i-1), g1); f < frac {
					cause, frac = TransitionMichel, f
				}
			}
			if f, ok := tripped(i); ok && f < frac {
				cause, frac = TransitionTrip, f
			}
		}
		if cause == "" {
			l, h := thwaitesCorrelations(lam[i])
			th := math.Sqrt(th2[i])
			out.Theta[i], out.H[i], out.DeltaStar[i] = th, h, h*th
			switch {
			case th == 0: // sharp leading edge: the shear is unbounded
				out.Cf[i] = math.NaN()
			case ue[i] > 0:
				out.Cf[i] = 2 * l * ue[i] / (re * th)
			}
			continue
		}
		first = i
		sTr = s[i-1] + frac*(s[i]-s[i-1])
		th2Tr = th2[i-1] + frac*(th2[i]-th2[i-1])
		xcTr = xc[i-1] + frac*(xc[i]-xc[i-1])
		out.TransitionCause, out.TransitionXC = cause, xcTr
		if cause == TransitionLaminarSeparation {
			out.LaminarSeparationXC, out.Bubble = xcTr, true
		}
		break
	}

	if first < n {
		if err := marchTurbulent(&out, first, sTr, math.Sqrt(th2Tr), re, hsep); err != nil {
			return SurfaceBL{}, err
		}
	}
	if !out.Separated {
		last := n - 1
		out.ThetaTE, out.HTE, out.UeTE = out.Theta[last], out.H[last], ue[last]
		out.Cd = SquireYoung(out.ThetaTE, out.HTE, out.UeTE)
	}
	return out, nil
}

// SquireYoung returns the drag coefficient of one surface from its
// trailing-edge momentum thickness θ/c, shape factor and edge velocity
// Ue/U∞: Cd = 2 θ (Ue)^((H + 5)/2) (Squire & Young, ARC R&M 1838, 1938).
func SquireYoung(theta, h, ue float64) float64 {
	return 2 * theta * math.Pow(ue, (h+5)/2)
}

func checkBLInput(s, ue, xc []float64, opt BLOptions) (hsep float64, err error) {
	if !(opt.Re > 0) || math.IsInf(opt.Re, 0) {
		return 0, blErr("Re", -1, "%g is not a positive finite Reynolds number", opt.Re)
	}
	if !(opt.TripXC >= 0 && opt.TripXC <= 1) {
		return 0, blErr("TripXC", -1, "%g is outside [0, 1]", opt.TripXC)
	}
	hsep = opt.TurbulentSeparationH
	if hsep == 0 {
		hsep = DefaultTurbulentSeparationH
	}
	if !(hsep >= MinTurbulentSeparationH && hsep <= MaxTurbulentSeparationH) {
		return 0, blErr("TurbulentSeparationH", -1, "%g is outside [%g, %g]", hsep, float64(MinTurbulentSeparationH), float64(MaxTurbulentSeparationH))
	}
	if len(s) < MinBLStations {
		return 0, blErr("s", -1, "%d stations, need at least %d", len(s), MinBLStations)
	}
	for i := range s {
		switch {
		case !isFinite(s[i]) || !isFinite(ue[i]) || !isFinite(xc[i]):
			return 0, blErr("s, ue, xc", i, "not a finite number")
		case s[i] < 0 || (i > 0 && !(s[i] > s[i-1])):
			return 0, blErr("s", i, "arc length %g is negative or not increasing", s[i])
		case ue[i] < 0:
			return 0, blErr("ue", i, "edge velocity %g is negative", ue[i])
		case ue[i] == 0 && (i > 0 || s[0] > 0):
			return 0, blErr("ue", i, "edge velocity is zero away from the stagnation point s = 0")
		}
	}
	return hsep, nil
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// crossing returns where a linear function through g0 and g1 reaches zero,
// as a fraction in [0, 1] of the interval.
// A g0 of −∞ (a criterion undefined at the previous station) puts the
// crossing at the end; a g0 already ≥ 0 at the start.
func crossing(g0, g1 float64) float64 {
	switch {
	case math.IsInf(g0, -1):
		return 1
	case g0 >= 0:
		return 0
	}
	return math.Min(1, g0/(g0-g1))
}

// intPow5 returns ∫ Ue⁵ dx over an interval of length h on which Ue runs
// linearly from u0 to u1: h (u0⁵ + u0⁴u1 + … + u1⁵)/6, exact.
func intPow5(u0, u1, h float64) float64 {
	var p0, p1 [6]float64 // powers 0..5
	p0[0], p1[0] = 1, 1
	for k := 1; k < 6; k++ {
		p0[k], p1[k] = p0[k-1]*u0, p1[k-1]*u1
	}
	sum := 0.0
	for k := range 6 {
		sum += p0[k] * p1[5-k]
	}
	return h * sum / 6
}

// edgeVelocityGradient returns dUe/ds at each station: the three-point
// formula for unequal steps inside, through the stagnation point (0, 0) at
// the first station when s[0] > 0, one-sided at the ends.
func edgeVelocityGradient(s, ue []float64) []float64 {
	n := len(s)
	d := make([]float64, n)
	three := func(x0, x1, x2, u0, u1, u2 float64) float64 {
		h1, h2 := x1-x0, x2-x1
		return -h2/(h1*(h1+h2))*u0 + (h2-h1)/(h1*h2)*u1 + h1/(h2*(h1+h2))*u2
	}
	for i := 1; i < n-1; i++ {
		d[i] = three(s[i-1], s[i], s[i+1], ue[i-1], ue[i], ue[i+1])
	}
	if s[0] > 0 {
		d[0] = three(0, s[0], s[1], 0, ue[0], ue[1])
	} else {
		d[0] = (ue[1] - ue[0]) / (s[1] - s[0])
	}
	d[n-1] = (ue[n-1] - ue[n-2]) / (s[n-1] - s[n-2])
	return d
}

// thwaitesCorrelations returns l(λ) and H(λ) of Cebeci & Bradshaw (1977),
// docs/validation.md §4, with λ clamped to [−0.1, 0.1].
func thwaitesCorrelations(lam float64) (l, h float64) {
	lam = math.Max(-0.1, math.Min(0.1, lam))
	if lam >= 0 {
		return 0.22 + 1.57*lam - 1.8*lam*lam, 2.61 - 3.75*lam + 5.24*lam*lam
	}
	return 0.22 + 1.402*lam + 0.018*lam/(lam+0.107), 2.088 + 0.0731/(lam+0.14)
}

// headH1 returns Head's entrainment shape factor H₁(H) (docs/validation.md §4).
func headH1(h float64) float64 {
	if h <= headH1Split {
		return 0.8234*math.Pow(h-1.1, -1.287) + 3.3
	}
	return headH1Upper(h)
}

// headH returns the inverse of headH1, branch by branch; H₁ must exceed
// 3.3. The two branches of H₁(H) miss each other slightly at H = 1.6
// (5.309 against 5.287); H₁ values in that gap map to H = 1.6, which keeps
// H(H₁) continuous and monotone.
func headH(h1 float64) float64 {
	switch {
	case h1 >= headH1(headH1Split):
		return 1.1 + math.Pow((h1-3.3)/0.8234, -1/1.287)
	case h1 >= headH1Upper(headH1Split):
		return headH1Split
	}
	return 0.6778 + math.Pow((h1-3.3)/1.5501, -1/3.064)
}

// headH1Upper is the branch of H₁(H) for H > 1.6.
func headH1Upper(h float64) float64 { return 1.5501*math.Pow(h-0.6778, -3.064) + 3.3 }

// ludwiegTillmann returns the skin friction on the local edge dynamic
// pressure.
func ludwiegTillmann(h, reTheta float64) float64 {
	return ltA * math.Pow(10, ltB*h) * math.Pow(reTheta, ltC)
}

// headState is the state of Head's equations: θ and the entrainment flux
// ψ = Ue θ H₁.
type headState [2]float64

// marchTurbulent integrates Head's method from sTr (between stations
// first−1 and first) to the last station, filling out from station first.
// It fails only if the adaptive integration cannot finish an interval.
func marchTurbulent(out *SurfaceBL, first int, sTr, thTr, re, hsep float64) error {
	n := len(out.S)
	s, ue := out.S, out.Ue
	h1Start := headH1(TransitionH)
	h1Min := headH1(headMaxH)
	// Ue at the transition point, linear between the stations around it.
	uAt := func(i int, x float64) float64 { // on the interval [s[i-1], s[i]]
		return ue[i-1] + (ue[i]-ue[i-1])*(x-s[i-1])/(s[i]-s[i-1])
	}
	uTr := uAt(first, sTr)
	y := headState{thTr, uTr * thTr * h1Start}
	x := sTr
	hOf := func(y headState, u float64) float64 {
		h1 := y[1] / (u * y[0])
		return headH(math.Max(h1Min, h1))
	}
	for i := first; i < n; i++ {
		if x < s[i] {
			k := (ue[i] - ue[i-1]) / (s[i] - s[i-1])
			u0, x0 := ue[i-1], s[i-1]
			rhs := func(x float64, y headState) (headState, bool) {
				u := u0 + k*(x-x0)
				if !(y[0] > 0) || !(u > 0) {
					return headState{}, false
				}
				h1 := math.Max(h1Min, y[1]/(u*y[0]))
				h := headH(h1)
				cf := ludwiegTillmann(h, re*u*y[0])
				return headState{cf/2 - (h+2)*y[0]*k/u, u * headEntrainA * math.Pow(h1-3, headEntrainB)}, true
			}
			sep := func(x float64, y headState) bool { return hOf(y, u0+k*(x-x0)) >= hsep }
			var xs float64
			var hit bool
			y, xs, hit = dopri(rhs, sep, x, s[i], y, func(x float64, y headState) float64 { return hOf(y, u0+k*(x-x0)) - hsep })
			if !hit && xs < s[i] {
				return blErr("ue", i, "turbulent integration did not reach the station (%d sub-steps)", dopriMaxSub)
			}
			if hit {
				out.Separated = true
				f := (xs - s[i-1]) / (s[i] - s[i-1])
				out.TurbulentSeparationXC = out.XC[i-1] + f*(out.XC[i]-out.XC[i-1])
				for j := i; j < n; j++ {
					out.Theta[j], out.H[j], out.DeltaStar[j], out.Cf[j] = math.NaN(), math.NaN(), math.NaN(), math.NaN()
					out.Turbulent[j] = true
				}
				return nil
			}
			x = s[i]
		}
		h := hOf(y, ue[i])
		out.Theta[i], out.H[i], out.DeltaStar[i] = y[0], h, h*y[0]
		out.Cf[i] = ludwiegTillmann(h, re*ue[i]*y[0]) * ue[i] * ue[i]
		out.Turbulent[i] = true
	}
	return nil
}

// Tolerances of the turbulent integration: relative, and absolute on θ/c
// and ψ (both of order 1e-3 on a wing section).
const (
	dopriRelTol = 1e-7
	dopriAbsTol = 1e-12
	dopriMaxSub = 100000
)

// dopri integrates y' = f(x, y) from x0 to x1 with the Dormand–Prince 5(4)
// pair and its step-size control (package solver/ode), the error of each
// component measured against dopriAbsTol + dopriRelTol·|y|. The step
// adapts to the stiffness of Head's equations when θ is small. It stops at
// the first accepted step where stop reports true, locating the crossing
// of g = 0 by linear interpolation, and returns the state there.
func dopri(f func(float64, headState) (headState, bool), stop func(float64, headState) bool, x0, x1 float64, y headState, g func(float64, headState) float64) (headState, float64, bool) {
	fs := func(x float64, y, dy []float64) bool {
		d, ok := f(x, headState{y[0], y[1]})
		dy[0], dy[1] = d[0], d[1]
		return ok
	}
	dp := ode.NewDormandPrince(2)
	k1, k7, e, y1 := make([]float64, 2), make([]float64, 2), make([]float64, 2), make([]float64, 2)
	x := x0
	if !fs(x, y[:], k1) {
		return y, x, false
	}
	h := math.Max(x1-x0, 0)
	if y[0] > 0 {
		h = math.Min(h, y[0]) // a step of order θ to begin with
	}
	for sub := 0; x < x1 && sub < dopriMaxSub; sub++ {
		if x+h > x1 {
			h = x1 - x
		}
		if !dp.Advance(fs, x, y[:], k1, h, y1) || !fs(x+h, y1, k7) {
			h *= ode.StepScale(math.Inf(1))
			continue
		}
		dp.Error(h, k1, k7, e)
		yn := headState{y1[0], y1[1]}
		ratio := 0.0
		for c := range 2 {
			sc := dopriAbsTol + dopriRelTol*math.Max(math.Abs(y[c]), math.Abs(yn[c]))
			ratio = math.Max(ratio, math.Abs(e[c])/sc)
		}
		if !(ratio <= 1) {
			h *= ode.StepScale(ratio)
			continue
		}
		xn := x + h
		if stop(xn, yn) {
			g0, g1 := g(x, y), g(xn, yn)
			f := crossing(g0, g1)
			xs := x + f*h
			var ys headState
			for c := range 2 {
				ys[c] = y[c] + f*(yn[c]-y[c])
			}
			return ys, xs, true
		}
		x, y = xn, yn
		copy(k1, k7)
		h *= ode.StepScale(ratio)
	}
	return y, x, false
}
