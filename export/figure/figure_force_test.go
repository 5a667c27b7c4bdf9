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
	if _, err := ForcePlot(ForceCurve{PerCl: 1}); !errors.Is(err, ErrNoData) {
		t.Errorf("empty sweep: %v", err)
	}
}
