package report

import (
	"context"
	"math"
	"strings"
	"testing"

	"sectionbench/solver/engine"
)

// The drag's density study extrapolates Cd = 0.01 + 40/N², second order
// (invented values of the method's formal order), to 0.01 by Richardson
// (Roache 1998, ch. 5), and the report prints it; with the boundary layer
// off there is no such study.
func TestViscousDensity(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	res := solve(t, st)
	if rows := ViscousDensity(context.Background(), st, nil, nil); rows != nil {
		t.Errorf("boundary layer off: %d rows", len(rows))
	}
	var rows []ViscousDensityRow
	for _, n := range []int{80, 160, 320} {
		rows = append(rows, ViscousDensityRow{Panels: n, Cl: math.NaN(), Cd: 0.01 + 40/float64(n*n), TransitionUpper: 0.3, TransitionLower: math.NaN()})
	}
	text := pdfText(t, Input{Study: st, Result: res, ViscousDensity: rows})
	for _, w := range []string{"Drag and transition against panel count", "Cd → 0.01000", "observed order 2.00", num(rows[0].Cd, 5)} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
}

// With the coupled solution the density study has solved it at every
// count already: the report takes its rows of the first nose value (no
// solving), with the viscous Cl beside the drag, a row that did not
// converge shown so (with why: its iterations diverged), and extrapolates Cl = 0.45 − 20/N² and
// Cd = 0.01 + 40/N² (invented values of the method's formal order 2) to
// 0.45 and 0.01 by Richardson (Roache 1998, ch. 5).
func TestViscousDensityFromDensityStudy(t *testing.T) {
	st := demoStudy()
	res := solve(t, st)
	nan := math.NaN()
	d := &engine.DensityResult{Viscous: true, Series: []engine.DensitySeries{{Nose: 0.5}, {Nose: 0.8}}}
	for _, nose := range []float64{0.5, 0.8} {
		for _, n := range []int{40, 80, 160, 320} {
			f := float64(n * n)
			row := engine.DensityRow{Panels: n, Nose: nose, ViscousCl: 0.45 - 20/f, ViscousCd: 0.01 + 40/f, ViscousTransitionUpper: 0.3, ViscousTransitionLower: nan, ViscousIterations: 9}
			if n == 40 {
				row.ViscousCl, row.ViscousCd, row.ViscousIterations, row.ViscousResidual = nan, nan, 400, 2.5e5
			}
			d.Rows = append(d.Rows, row)
		}
	}
	rows := ViscousDensity(context.Background(), st, nil, d)
	if len(rows) != 4 || rows[0].Skipped == "" || rows[1].Skipped != "" || rows[3].Cl != 0.45-20.0/(320*320) {
		t.Fatalf("rows %+v: want the four counts of nose 0.5, the first not converged", rows)
	}
	text := pdfText(t, Input{Study: st, Result: res, ViscousDensity: rows})
	for _, w := range []string{"Viscous lift, drag and transition against panel count", "Cl → 0.4500", "Cd → 0.01000", "observed order 2.00", "did not converge at 40 panels", "400 Newton iterations", "diverged"} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
}

// A count whose coupled solution converged only with transition held
// upstream of its e^N position is marked held in the report's table and
// said in words: its Cl is a tripped wing's (a hand-typed NACA 2412 at 4°
// gave −0.6993 at 320 panels and a held −0.6740 at 640, unmarked, so the
// table read as a panel count that had not converged).
func TestViscousDensityHeld(t *testing.T) {
	st := demoStudy()
	res := solve(t, st)
	nan := math.NaN()
	d := &engine.DensityResult{Viscous: true, Series: []engine.DensitySeries{{Nose: 0.5}}}
	for _, n := range []int{160, 320, 640} {
		d.Rows = append(d.Rows, engine.DensityRow{Panels: n, Nose: 0.5, ViscousCl: -0.6998, ViscousCd: 0.0092, ViscousTransitionUpper: nan, ViscousTransitionLower: 0.45, ViscousHeld: n == 640})
	}
	d.Rows[2].ViscousCl = -0.6740
	rows := ViscousDensity(context.Background(), st, nil, d)
	if len(rows) != 3 || rows[1].Held || !rows[2].Held {
		t.Fatalf("rows %+v: want 640 panels held", rows)
	}
	text := pdfText(t, Input{Study: st, Result: res, ViscousDensity: rows})
	for _, w := range []string{"640 held", "At 640 panels the viscous solution holds transition upstream of its e^N position"} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
	if got := HeldWords([]int{320, 640}); !strings.HasPrefix(got, "At 320 and 640 panels") {
		t.Errorf("HeldWords of two counts: %q", got)
	}
	if HeldWords(nil) != "" {
		t.Error("HeldWords of none says something")
	}
}

// TestSummaryViscousDensity: page 1's confidence gives how the viscous
// Cl moved with the panel count beside the inviscid band (the headline
// is the viscous Cl; the recommendation judges the panel method only),
// with the counts whose transition was held.
func TestSummaryViscousDensity(t *testing.T) {
	st := demoStudy()
	res := solve(t, st)
	nan := math.NaN()
	d := &engine.DensityResult{Viscous: true, Series: []engine.DensitySeries{{Nose: 0.5, RecommendedPanels: 160}}, RecommendedPanels: 160}
	for _, n := range []int{160, 320, 640} {
		d.Rows = append(d.Rows, engine.DensityRow{Panels: n, Nose: 0.5, Cl: -0.74, ViscousCl: -0.6998, ViscousCd: 0.0092, ViscousTransitionUpper: nan, ViscousTransitionLower: 0.45, ViscousHeld: n == 640})
	}
	text := pdfText(t, Input{Study: st, Result: res, Density: d, ViscousDensity: ViscousDensity(context.Background(), st, nil, d)})
	for _, w := range []string{"viscous Cl: no steady convergence over the finest counts", "(transition held upstream at 640 panels)"} {
		if !strings.Contains(text, w) {
			t.Errorf("summary lacks %q", w)
		}
	}
}
