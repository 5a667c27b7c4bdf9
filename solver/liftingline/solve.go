package liftingline

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Options tune Solve; the zero value uses the defaults.
type Options struct {
	// Stations is the number N of collocation stations on the half span
	// and of odd Fourier terms; 0 means DefaultStations.
	Stations int
	// MaxIterations bounds Newton's method; 0 means 200.
	MaxIterations int
	// GroundHeightM, when positive, is the lifting line's height above a
	// flat ground: the trailing vortices get their mirror images
	// (imageInfluence), which lessen the induced angle. 0 is free air.
	GroundHeightM float64
}

// DefaultStations is the collocation count Solve uses unless told: the
// rectangular wing's span efficiency changes by less than 1e-4 from 24 to
// 48 stations (TestRectangularConverges).
const DefaultStations = 24

// minSlope, per radian, floors the section slope in Newton's Jacobian: past
// maximum lift the slope turns negative and the exact Jacobian can be
// near singular; with the floor the iteration still converges to the same
// solution there, linearly rather than quadratically. On the rising part
// of a curve (a slope well above the floor) it is Newton's method.
const minSlope = 1.0

// tolerance is the largest residual, in load coefficient, Newton's method
// accepts: far below any difference a polar can resolve.
const tolerance = 1e-10

// Station is the solution at one collocation station.
type Station struct {
	Eta          float64 // 2y/b, 0 at the centre, 1 at the tip (one half; the other mirrors it)
	ChordM       float64
	Load         float64 // section load coefficient c_l
	Cd           float64 // section profile drag coefficient, NaN when not known
	InducedDeg   float64 // induced angle α_i
	EffectiveDeg float64 // α − α_i
	// LoadPerQ is c·c_l in metres: the load per metre of span is q c c_l.
	LoadPerQ float64
}

// Result is a lifting-line solution.
type Result struct {
	AlphaDeg    float64
	AspectRatio float64
	CL          float64   // wing load coefficient on the planform area
	CDi         float64   // induced drag coefficient
	CDp         float64   // profile drag coefficient (strip integral), NaN when a station's drag is not known
	Delta       float64   // δ of C_Di = C_L²/(π AR) (1 + δ); NaN when C_L is 0
	Efficiency  float64   // span efficiency e = 1/(1 + δ)
	Stations    []Station // from the centre (η near 0) to the tip
	Iterations  int
	// PastMaxLoad is true when a station's effective angle lies past the
	// section's largest tabulated load (Table only): there the answer is
	// not unique and the wing is at or beyond stall.
	PastMaxLoad  bool
	Coefficients []float64 // A₁, A₃, …
}

// ErrNotConverged is returned when Newton's method does not reach the
// tolerance.
var ErrNotConverged = errors.New("the lifting-line iteration did not converge (the section is probably past its maximum lift)")

// Solve returns the lifting-line solution of a wing of planform p whose
// every station has the section sec, at the geometric angle alphaDeg (no
// twist).
func Solve(p Planform, sec Section, alphaDeg float64, opt Options) (*Result, error) {
	n := opt.Stations
	if n == 0 {
		n = DefaultStations
	}
	if n < 1 {
		panic(fmt.Sprintf("liftingline: %d stations", n))
	}
	maxIt := opt.MaxIterations
	if maxIt == 0 {
		maxIt = 200
	}
	b := p.SpanM
	theta := make([]float64, n)
	chord := make([]float64, n)
	sinT := mat.NewDense(n, n, nil) // sin(n_j θ_k)
	for k := range theta {
		theta[k] = float64(2*k+1) * math.Pi / float64(4*n)
		chord[k] = p.Chord(math.Cos(theta[k])) // η = |cos θ|
		for j := 0; j < n; j++ {
			sinT.Set(k, j, math.Sin(float64(2*j+1)*theta[k]))
		}
	}
	order := func(j int) float64 { return float64(2*j + 1) }
	var img *mat.Dense // image upwash per coefficient, radians; nil in free air
	if opt.GroundHeightM > 0 {
		img = imageInfluence(b, 2*opt.GroundHeightM, theta)
	}

	a := make([]float64, n)
	alphaI := make([]float64, n) // radians
	load := make([]float64, n)
	slope := make([]float64, n)
	cd := make([]float64, n)
	// eval fills the station values for coefficients x and returns the
	// residual's largest magnitude.
	eval := func(x []float64, res []float64) (float64, error) {
		worst := 0.0
		for k := range theta {
			g, ai := 0.0, 0.0
			for j := range x {
				s := sinT.At(k, j)
				g += x[j] * s
				ai += order(j) * x[j] * s
			}
			ai /= math.Sin(theta[k])
			if img != nil {
				for j := range x {
					ai -= img.At(k, j) * x[j]
				}
			}
			cl, sl, d, err := sec.At(alphaDeg - ai*180/math.Pi)
			if err != nil {
				return math.Inf(1), err
			}
			alphaI[k], load[k], slope[k], cd[k] = ai, cl, sl, d
			res[k] = 4*b*g/chord[k] - cl
			worst = math.Max(worst, math.Abs(res[k]))
		}
		return worst, nil
	}
	res := make([]float64, n)
	worst, err := eval(a, res)
	if err != nil {
		return nil, err
	}
	jac := mat.NewDense(n, n, nil)
	step := mat.NewVecDense(n, nil)
	trial := make([]float64, n)
	trialRes := make([]float64, n)
	it := 0
	for ; worst > tolerance; it++ {
		if it == maxIt {
			return nil, ErrNotConverged
		}
		for k := range theta {
			for j := 0; j < n; j++ {
				s := sinT.At(k, j)
				dai := order(j) * s / math.Sin(theta[k])
				if img != nil {
					dai -= img.At(k, j)
				}
				jac.Set(k, j, 4*b*s/chord[k]+math.Max(slope[k], minSlope)*dai)
			}
		}
		if err := step.SolveVec(jac, mat.NewVecDense(n, append([]float64(nil), res...))); err != nil {
			return nil, ErrNotConverged
		}
		// Halve the step until the residual falls (or the angles stay
		// inside the polar).
		h := 1.0
		for {
			for j := range a {
				trial[j] = a[j] - h*step.AtVec(j)
			}
			w, err := eval(trial, trialRes)
			if err == nil && w < worst {
				copy(a, trial)
				copy(res, trialRes)
				worst = w
				break
			}
			h /= 2
			if h < 1.0/1024 {
				if err != nil {
					return nil, err
				}
				return nil, ErrNotConverged
			}
		}
	}
	// eval last ran on the accepted coefficients except when the first
	// evaluation already met the tolerance; run it once more so the
	// station values belong to a.
	if _, err := eval(a, res); err != nil {
		return nil, err
	}

	ar := p.AspectRatio()
	r := &Result{AlphaDeg: alphaDeg, AspectRatio: ar, Iterations: it, Coefficients: a}
	r.CL = math.Pi * ar * a[0]
	sum := 0.0
	for j := range a {
		sum += order(j) * a[j] * a[j]
	}
	r.CDi = math.Pi * ar * sum
	if img != nil {
		// In ground effect the Trefftz-plane sum does not hold: C_Di =
		// (2/(V S)) ∫ Γ α_i dy = 2 AR ∫₀^π (Σ A_n sin nθ) α_i sin θ dθ, by
		// the midpoint rule on the stations (both halves).
		r.CDi = 0
		for k := range theta {
			g := 0.0
			for j := range a {
				g += a[j] * sinT.At(k, j)
			}
			r.CDi += g * alphaI[k] * math.Sin(theta[k])
		}
		r.CDi *= 2 * ar * 2 * math.Pi / float64(2*n)
	}
	r.Delta = math.NaN()
	if a[0] != 0 {
		r.Delta = r.CDi*math.Pi*ar/(r.CL*r.CL) - 1
	}
	r.Efficiency = 1 / (1 + r.Delta)
	// C_Dp = (1/S) ∫ c c_d dy = (b/S) ∫₀^{π/2} c c_d sin θ dθ over both
	// halves, by the midpoint rule on the stations.
	dp := 0.0
	for k := range theta {
		dp += chord[k] * cd[k] * math.Sin(theta[k])
	}
	r.CDp = p.SpanM / p.Area() * dp * math.Pi / float64(2*n)
	var tbl *Table
	if t, ok := sec.(*Table); ok {
		tbl = t
	}
	for k := range theta {
		eff := alphaDeg - alphaI[k]*180/math.Pi
		r.Stations = append(r.Stations, Station{
			Eta: math.Cos(theta[k]), ChordM: chord[k], Load: load[k], Cd: cd[k],
			InducedDeg: alphaI[k] * 180 / math.Pi, EffectiveDeg: eff, LoadPerQ: chord[k] * load[k],
		})
		if tbl != nil {
			if _, am, peak := tbl.MaxLoad(); peak && eff > am {
				r.PastMaxLoad = true
			}
		}
	}
	// θ_k runs from the tip (θ near 0) to the centre; list from the centre.
	for i, j := 0, len(r.Stations)-1; i < j; i, j = i+1, j-1 {
		r.Stations[i], r.Stations[j] = r.Stations[j], r.Stations[i]
	}
	return r, nil
}

// imageInfluence returns, for a ground at distance d/2 below the lifting
// line of span b, the upwash angle the mirror images of the trailing
// vortices induce at each station θ_k per Fourier coefficient A_j:
//
//	α_img(θ_k) = Σ_j G_kj A_j,   G_kj = (b n_j / 2π) ∫₀^π cos(n_j θ) s/(s² + d²) dθ,
//	s = (b/2)(cos θ − cos θ_k),
//
// from the image of each trailing vortex, of opposite strength and d
// below it, whose vertical velocity at the line is (1/4π) Γ′ s/(s² + d²)
// against the real vortex's (1/4π) Γ′/s. As d → 0 the kernel becomes the
// free-air one and the images cancel the downwash (Glauert's integral);
// as d → ∞ they vanish. The integral is by the midpoint rule with points
// close enough to resolve the kernel's width d.
func imageInfluence(b, d float64, theta []float64) *mat.Dense {
	n := len(theta)
	m := int(math.Max(2000, math.Ceil(40*math.Pi*b/(2*d))))
	g := mat.NewDense(n, n, nil)
	h := math.Pi / float64(m)
	for k, t0 := range theta {
		c0 := math.Cos(t0)
		for i := range m {
			t := (float64(i) + 0.5) * h
			s := b / 2 * (math.Cos(t) - c0)
			ker := s / (s*s + d*d) * h
			for j := range n {
				nj := float64(2*j + 1)
				g.Set(k, j, g.At(k, j)+b*nj/(2*math.Pi)*math.Cos(nj*t)*ker)
			}
		}
	}
	return g
}
