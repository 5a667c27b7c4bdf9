package liftingline

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"
)

// Section is a wing section's two-dimensional curve: its load coefficient,
// the slope of that per radian and its profile drag coefficient at an
// effective angle of attack in degrees. Profile drag may be NaN (not
// known). An angle outside the data returns a *RangeError.
type Section interface {
	At(alphaDeg float64) (cl, slopePerRad, cd float64, err error)
}

// Linear is a section with a straight lift curve, c_l = a₀ (α − α_L0), and
// a constant profile drag (NaN for none).
type Linear struct {
	SlopePerRad float64 // a₀, per radian (2π for thin-aerofoil theory)
	ZeroLiftDeg float64 // α_L0
	Cd          float64
}

// At implements Section.
func (s Linear) At(alphaDeg float64) (float64, float64, float64, error) {
	return s.SlopePerRad * (alphaDeg - s.ZeroLiftDeg) * math.Pi / 180, s.SlopePerRad, s.Cd, nil
}

// Table is a section curve through tabulated points (a polar), joined by
// Akima's spline (gonum/interp), which keeps the slope continuous and does
// not overshoot near a kink such as maximum lift. It is defined from the
// first to the last angle only.
type Table struct {
	lo, hi   float64
	cl, cd   interp.AkimaSpline
	hasCd    bool
	cdLo     float64
	cdHi     float64
	maxAlpha float64 // angle of the largest tabulated load
	maxLoad  float64
}

// RangeError is an effective angle outside the tabulated polar.
type RangeError struct {
	AlphaDeg, FromDeg, ToDeg float64
}

func (e *RangeError) Error() string {
	return fmt.Sprintf("an effective angle of %.2f° lies outside the polar's %.2f° to %.2f°; widen the range of angles solved", e.AlphaDeg, e.FromDeg, e.ToDeg)
}

// DataError is a polar the table cannot be built from.
type DataError struct{ Reason string }

func (e *DataError) Error() string { return "section polar: " + e.Reason }

// NewTable builds a Table from angles in degrees (strictly increasing), load
// coefficients and profile drag coefficients (cd may be nil; NaN entries of
// cl or cd are left out, as a viscous point that did not converge is).
// It needs at least three usable load points.
func NewTable(alphaDeg, cl, cd []float64) (*Table, error) {
	if len(cl) != len(alphaDeg) || (cd != nil && len(cd) != len(alphaDeg)) {
		panic("liftingline: NewTable with slices of different lengths")
	}
	var xs, ys, xd, yd []float64
	for i, a := range alphaDeg {
		if i > 0 && !(a > alphaDeg[i-1]) {
			return nil, &DataError{fmt.Sprintf("angles are not increasing at %g°", a)}
		}
		if isFinite(a) && isFinite(cl[i]) {
			xs, ys = append(xs, a), append(ys, cl[i])
		}
		if cd != nil && isFinite(a) && isFinite(cd[i]) {
			xd, yd = append(xd, a), append(yd, cd[i])
		}
	}
	if len(xs) < 3 {
		return nil, &DataError{fmt.Sprintf("%d usable points; at least 3 are needed", len(xs))}
	}
	t := &Table{lo: xs[0], hi: xs[len(xs)-1], maxLoad: math.Inf(-1)}
	_ = t.cl.Fit(xs, ys) // Fit always returns nil
	for i, y := range ys {
		if y > t.maxLoad {
			t.maxLoad, t.maxAlpha = y, xs[i]
		}
	}
	if len(xd) >= 2 {
		_ = t.cd.Fit(xd, yd)
		t.hasCd, t.cdLo, t.cdHi = true, xd[0], xd[len(xd)-1]
	}
	return t, nil
}

// At implements Section. Profile drag is NaN outside the angles that have
// one.
func (t *Table) At(alphaDeg float64) (float64, float64, float64, error) {
	if !(alphaDeg >= t.lo && alphaDeg <= t.hi) {
		return math.NaN(), math.NaN(), math.NaN(), &RangeError{alphaDeg, t.lo, t.hi}
	}
	cd := math.NaN()
	if t.hasCd && alphaDeg >= t.cdLo && alphaDeg <= t.cdHi {
		cd = t.cd.Predict(alphaDeg)
	}
	return t.cl.Predict(alphaDeg), t.cl.PredictDerivative(alphaDeg) * 180 / math.Pi, cd, nil
}

// MaxLoad returns the largest tabulated load coefficient and its angle, and
// whether it is a peak inside the table (the load falls after it).
func (t *Table) MaxLoad() (load, alphaDeg float64, peak bool) {
	return t.maxLoad, t.maxAlpha, t.maxAlpha < t.hi
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
