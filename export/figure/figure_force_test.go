package figure

import (
	"bytes"
	"errors"
	"math"
	"testing"

	"sectionbench/export/exporttest"
)

// The force curve's points are Sign × PerCl × Cl of each sweep row, with
// the marked rows ringed.
func TestForcePlot(t *testing.T) {
	sw := exporttest.Sweep()
	fc := ForceCurve{Sweep: sw, PerCl: 245 * 0.36 * 1.2, Sign: -1, Name: "Downforce", Unit: "N", AlphaDeg: 4, Marked: make([]bool, len(sw))}
	fc.Marked[len(sw)-1] = true
	line, rings := forceXYs(fc)
	if len(line) != len(sw) {
		t.Fatal("no force line of the sweep's length")
	}
	for i, c := range sw {
		if want := -fc.PerCl * c.Cl; math.Abs(line[i].Y-want) > 1e-9*math.Max(1, math.Abs(want)) || line[i].X != c.AlphaDeg {
			t.Errorf("row %d: (%g, %g), want (%g, %g)", i, line[i].X, line[i].Y, c.AlphaDeg, want)
		}
	}
	if len(rings) != 1 || rings[0] != line[len(sw)-1] {
		t.Errorf("ringed %v, want the last row", rings)
	}
	p, err := ForcePlot(fc)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WritePlot(&b, p, FormatPNG, 4, 3, 72); err != nil {
		t.Fatal(err)
	}
	// With the viscous solution its Cl is the curve, a row that did not
	// converge (NaN) left out, and the inviscid load drawn beside it.
	fc.ClViscous = make([]float64, len(sw))
	for i, c := range sw {
		fc.ClViscous[i] = 0.8 * c.Cl
	}
	fc.ClViscous[1] = math.NaN()
	line, _ = forceXYs(fc)
	if len(line) != len(sw)-1 {
		t.Fatalf("viscous curve of %d points, want %d (one row did not converge)", len(line), len(sw)-1)
	}
	if want := -fc.PerCl * 0.8 * sw[2].Cl; math.Abs(line[1].Y-want) > 1e-9*math.Max(1, math.Abs(want)) {
		t.Errorf("viscous point at %g°: %g, want %g", line[1].X, line[1].Y, want)
	}
	if inv := inviscidForceXYs(fc); len(inv) != len(sw) || inv[1].Y != -fc.PerCl*sw[1].Cl {
		t.Errorf("inviscid comparison curve %v", inv)
	}
	if _, err := ForcePlot(fc); err != nil {
		t.Fatal(err)
	}
	if _, err := ForcePlot(ForceCurve{PerCl: 1}); !errors.Is(err, ErrNoData) {
		t.Errorf("empty sweep: %v", err)
	}
}
