package boundarylayer

import "math"

// Residuals are the three equations of one station: momentum, shape
// (kinetic energy) and the third (amplification or shear-stress lag, or
// the similarity and trailing-edge conditions on the stations that start a
// layer or a wake). A station is solved when all three are zero.
type Residuals [3]float64

// Interval returns the residuals of the interval from station a to station
// b, both of kind k, at Reynolds number re per unit length.
//
// The equations of the package notes are integrated from ξa to ξb in
// logarithmic differences: with Δ = ξb − ξa (on a surface Δ = ln(ξb/ξa)
// and each source term multiplied by its ξ) and each source term f
// averaged as (1 − w) f_a + w f_b,
//
//	ln(θb/θa) + (2 + H̄) ln(Ueb/Uea) − Δ · avg(Cf/(2θ))                    (momentum, w = ½)
//	ln(H*b/H*a) + (1 − H_w) ln(Ueb/Uea) − Δ · avg_w((2CD/H* − Cf/2)/θ)     (shape)
//	ñb − ña − Δ · avg(dñ/dξ)                                               (laminar)
//	ln(Sb/Sa) + ln(Ueb/Uea) − Δ · avg_w(5.6 (S_EQ − S)/(2δ) + 4/(3δ*) (Cf/2 − ((Hk − 1)/(6.7 Hk))²))  (turbulent, wake; S = √Cτ)
//
// The weight w of the shape and lag equations leans downstream where Hk
// changes fast between the stations, w = 1 − ½ exp(−(ln((Hkb − 1)/(Hka − 1)))² · 5/Hkb²)
// (an upwinding that keeps the discrete shape equation from oscillating
// near separation and transition; the form is from memory), ½ where Hk is
// smooth.
//
// Preconditions: ξb > ξa and both stations positive (Eval).
func Interval(k Kind, a, b Station, re float64) Residuals {
	ca, cb := Eval(k, a, re), Eval(k, b, re)
	return interval(k, a, b, ca, cb, nil)
}

// IntervalOf is Interval with the two stations' closures given (each
// Eval(k, station, re)), for callers that vary one station at a time.
func IntervalOf(k Kind, a, b Station, ca, cb Closure) Residuals {
	return interval(k, a, b, ca, cb, nil)
}

// IntervalMemo evaluates the residuals of one interval and of small
// variations of its two stations, as a finite-difference Jacobian asks
// for them (IntervalOf with each variable of either station moved in
// turn). Most variations leave most of the interval's logarithms
// unchanged (moving θ leaves ln(Ueb/Uea) and ln ξ alone, moving √Cτ
// leaves H* and the upwind weight alone), and the logarithms are most of
// an interval's cost: it remembers each logarithm and the upwind weight
// for the arguments of its first call and of its latest, and takes them
// again where an argument is the same to the last bit, so its residuals
// are those of IntervalOf to the last bit. The zero value is ready; use
// one per interval.
type IntervalMemo struct {
	d, dlu, th, hs, c lnMemo
	w                 upwindMemo
}

// IntervalOf is IntervalOf through the memo.
func (m *IntervalMemo) IntervalOf(k Kind, a, b Station, ca, cb Closure) Residuals {
	return interval(k, a, b, ca, cb, m)
}

// lnMemo is math.Log of the first argument it was asked for (x0, once
// n > 0) and of the latest other one (x1, once n > 1).
type lnMemo struct {
	n              int
	x0, v0, x1, v1 float64
}

func (l *lnMemo) log(x float64) float64 {
	if l.n > 0 && l.x0 == x {
		return l.v0
	}
	if l.n > 1 && l.x1 == x {
		return l.v1
	}
	return l.miss(x)
}

func (l *lnMemo) miss(x float64) float64 {
	v := math.Log(x)
	if l.n == 0 {
		l.x0, l.v0, l.n = x, v, 1
	} else {
		l.x1, l.v1, l.n = x, v, 2
	}
	return v
}

// upwindMemo is upwind of the first pair of shape factors it was asked
// for and of the latest other one, as lnMemo.
type upwindMemo struct {
	n                  int
	a0, b0, v0, a1, b1 float64
	v1                 float64
}

func (u *upwindMemo) weight(hka, hkb float64) float64 {
	if u.n > 0 && u.a0 == hka && u.b0 == hkb {
		return u.v0
	}
	if u.n > 1 && u.a1 == hka && u.b1 == hkb {
		return u.v1
	}
	return u.miss(hka, hkb)
}

func (u *upwindMemo) miss(hka, hkb float64) float64 {
	v := upwind(hka, hkb)
	if u.n == 0 {
		u.a0, u.b0, u.v0, u.n = hka, hkb, v, 1
	} else {
		u.a1, u.b1, u.v1, u.n = hka, hkb, v, 2
	}
	return v
}

// interval returns the residuals of Interval, the logarithms and the
// upwind weight through m if it is not nil.
func interval(k Kind, a, b Station, ca, cb Closure, m *IntervalMemo) Residuals {
	var own IntervalMemo
	if m == nil {
		m = &own
	}
	// On a surface the source terms are integrated in ln ξ: each is
	// multiplied by ξ and the step is Δ ln ξ, which is exact for the
	// power-law (similar) layers near a stagnation point, where the edge
	// velocity grows tenfold between the first stations; a wake starts
	// at ξ = 0 and keeps the plain step.
	d := b.Xi - a.Xi
	xa, xb := 1.0, 1.0
	if k != Wake && a.Xi > 0 {
		d = m.d.log(b.Xi / a.Xi)
		xa, xb = a.Xi, b.Xi
	}
	dlu := m.dlu.log(b.Ue / a.Ue)
	w := m.w.weight(ca.Hk, cb.Hk)
	avg := func(fa, fb float64) float64 { return (1-w)*fa + w*fb }
	var r Residuals
	r[0] = m.th.log(b.Theta/a.Theta) + (2+0.5*(ca.H+cb.H))*dlu - d*0.5*(xa*ca.Cf/(2*a.Theta)+xb*cb.Cf/(2*b.Theta))
	shape := func(c Closure, st Station) float64 { return (2*c.CD/c.Hs - 0.5*c.Cf) / st.Theta }
	r[1] = m.hs.log(cb.Hs/ca.Hs) + (1-avg(ca.H, cb.H))*dlu - d*avg(xa*shape(ca, a), xb*shape(cb, b))
	if k == Laminar {
		r[2] = b.C - a.C - d*0.5*(xa*ca.AmpRate+xb*cb.AmpRate)
		return r
	}
	lag := func(c Closure, st Station) float64 {
		g := (c.Hk - 1) / (gbA * c.Hk)
		return lagConstant*(c.SEq-st.C)/(2*c.Delta) + 4/(3*st.DStar)*(0.5*c.Cf-g*g)
	}
	r[2] = m.c.log(b.C/a.C) + dlu - d*avg(xa*lag(ca, a), xb*lag(cb, b))
	return r
}

// upwind returns the weight of the downstream station in the shape and lag
// equations (see Interval).
func upwind(hka, hkb float64) float64 {
	l := math.Log(max(hkb-1, 1e-6) / max(hka-1, 1e-6))
	return 1 - 0.5*math.Exp(-l*l*5/(hkb*hkb))
}

// Transition constants (Drela & Giles 1987, as recalled): the critical
// amplification exponent's usual value, and the initial shear stress of
// the turbulent layer at transition, √Cτ = 1.8 exp(−3.3/(Hk − 1)) √Cτ_EQ.
const (
	DefaultNCrit   = 9
	transitionCoef = 1.8
	transitionExp  = 3.3
)

// TransitionInterval returns the residuals of an interval in which the
// layer turns turbulent: a laminar (ñ-carrying) and b turbulent
// (√Cτ-carrying). The transition point ξt is where the envelope exponent,
// growing linearly from ña at the mean of the two stations' laminar rates,
// reaches nCrit, or the trip position tripXi if that is earlier; both are
// clamped to [ξa, ξb] (a trip beyond ξb, +Inf, means none; tripXi = ξb
// forces transition at b, as at a trailing edge). The state at ξt is
// interpolated linearly between the stations; the laminar equations run
// from a to t, the turbulent ones from t to b with √Cτ(t) =
// 1.8 exp(−3.3/(Hk − 1)) √Cτ_EQ(t), and the momentum and shape residuals
// of the two parts are added (H* may jump at t, θ and δ* do not). It also
// returns ξt.
func TransitionInterval(a, b Station, re, nCrit, tripXi float64) (Residuals, float64) {
	ca := Eval(Laminar, a, re)
	bl := b
	bl.C = a.C
	cbl := Eval(Laminar, bl, re)
	d := b.Xi - a.Xi
	xt := b.Xi
	if grow := d * 0.5 * (ca.AmpRate + cbl.AmpRate); grow > 0 && a.C+grow > nCrit {
		xt = a.Xi + d*max(0, nCrit-a.C)/grow
	}
	xt = max(a.Xi, min(xt, tripXi))
	f := (xt - a.Xi) / d
	t := Station{
		Xi:    xt,
		Ue:    a.Ue + f*(b.Ue-a.Ue),
		Theta: a.Theta + f*(b.Theta-a.Theta),
		DStar: a.DStar + f*(b.DStar-a.DStar),
	}
	var lam Residuals
	if f > 0 {
		t.C = nCrit
		lam = interval(Laminar, a, t, ca, Eval(Laminar, t, re), nil)
	}
	ct := Eval(Turbulent, t, re)
	t.C = transitionCoef * math.Exp(-transitionExp/(ct.Hk-1)) * ct.SEq
	ct = Eval(Turbulent, t, re)
	var tur Residuals
	if f < 1 {
		tur = interval(Turbulent, t, b, ct, Eval(Turbulent, b, re), nil)
	} else {
		tur[2] = math.Log(b.C / t.C)
	}
	return Residuals{lam[0] + tur[0], lam[1] + tur[1], tur[2]}, xt
}

// Similarity returns the residuals of the first station of a surface, at
// ξ from the stagnation point where the edge velocity grows linearly,
// Ue ≈ (dUe/dξ) ξ: the plane stagnation-point (Hiemenz) flow, Falkner–Skan
// β = 1, with H = 2.216 (White, Viscous Fluid Flow, 3rd ed., 2006, Table
// 4-1), ñ = 0, and θ from the momentum equation in equilibrium, dθ/dξ = 0:
// Cf/2 = (2 + H) θ (dUe/dξ)/Ue, so θ² Re dUe/dξ = (Reθ Cf/2)(H)/(2 + H)
// with the laminar closure's skin friction (StagnationTheta; 0.0878,
// against 0.0854 for the exact Hiemenz profile and Thwaites' 0.075).
func Similarity(st Station, re float64) Residuals {
	return Residuals{
		math.Log(st.Theta / StagnationTheta(st.Xi, st.Ue, re)),
		math.Log(st.DStar/st.Theta) - math.Log(stagnationH),
		st.C,
	}
}

// StagnationTheta returns θ at ξ from a stagnation point with edge
// velocity ue there (see Similarity).
func StagnationTheta(xi, ue, re float64) float64 {
	c := Closure{H: stagnationH, Hk: stagnationH, RTheta: 1}
	laminar(&c)
	k := 0.5 * c.Cf / (2 + stagnationH) // Reθ Cf/2 over (2 + H), with Reθ = 1
	return math.Sqrt(k * xi / (re * ue))
}

// The stagnation-point (Hiemenz) layer's shape factor, Falkner–Skan β = 1
// (White, Viscous Fluid Flow, 3rd ed., 2006, Table 4-1).
const stagnationH = 2.216

// WakeStart returns the residuals of the first wake station w at a
// trailing edge of gap h between the last stations u and l of the two
// surfaces (both turbulent): the momentum and displacement thicknesses
// add (the gap's thickness adds to δ*), and √Cτ is the θ-weighted mean of
// the two (Drela & Giles 1987, as recalled). Each residual is relative to
// the sum it matches.
func WakeStart(u, l, w Station, h float64) Residuals {
	th := u.Theta + l.Theta
	ds := u.DStar + l.DStar + h
	return Residuals{
		w.Theta/th - 1,
		w.DStar/ds - 1,
		w.C - (u.C*u.Theta+l.C*l.Theta)/th,
	}
}

// SquireYoung returns the drag of a wake from its last station, in the
// station's length unit (divide by a chord for Cd): 2 θ Ue^((H + 5)/2)
// (Squire & Young, The calculation of the profile drag of aerofoils, ARC
// R&M 1838, 1937).
func SquireYoung(st Station) float64 {
	h := st.DStar / st.Theta
	return 2 * st.Theta * math.Pow(st.Ue, 0.5*(h+5))
}
