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
				jac.Set(k, j, 4*b*s/chord[k]+math.Max(slope[k], minSlope)*order(j)*s/math.Sin(theta[k]))
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
	r.Delta = math.NaN()
	if a[0] != 0 {
		r.Delta = sum/(a[0]*a[0]) - 1
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
