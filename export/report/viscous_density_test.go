package report

import (
	"context"
	"math"
	"strings"
	"testing"
)

// The drag's density study extrapolates Cd = 0.01 + 40/N², second order
// (invented values of the method's formal order), to 0.01 by Richardson
// (Roache 1998, ch. 5), and the report prints it; with the boundary layer
// off there is no such study.
func TestViscousDensity(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	res := solve(t, st)
	if rows := ViscousDensity(context.Background(), st, nil); rows != nil {
		t.Errorf("boundary layer off: %d rows", len(rows))
	}
	var rows []ViscousDensityRow
	for _, n := range []int{80, 160, 320} {
		rows = append(rows, ViscousDensityRow{Panels: n, Cd: 0.01 + 40/float64(n*n), TransitionUpper: 0.3, TransitionLower: math.NaN()})
	}
	text := pdfText(t, Input{Study: st, Result: res, ViscousDensity: rows})
	for _, w := range []string{"Drag and transition against panel count", "Cd → 0.01000", "observed order 2.00", num(rows[0].Cd, 5)} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
}
