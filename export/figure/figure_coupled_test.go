package figure

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// coupledStudy is NACA 0012 at 4°, Re 6e6, tripped at 5 % chord on both
// surfaces: a case the coupled solution converges on (solver's
// validation against Ladson, NASA TM-4074, 1988).
func coupledStudy() *model.Study {
	st := model.NewStudy()
	st.Elements[0].Section = model.SectionSource{Spec: "naca:0012"}
	st.Flow.AlphaDeg = 4
	st.Flow.Reynolds = 6e6
	st.Viscous = model.Viscous{Enabled: true, Mode: model.ViscousCoupled, TripUpper: 0.05, TripLower: 0.05}
	return st
}

// coupledScene solves coupledStudy and returns its scene with the
// converged coupled point.
func coupledScene(t *testing.T) (*Scene, *engine.Result) {
	t.Helper()
	st := coupledStudy()
	r := solveDemo(t, st, false, false)
	if r.Coupled == nil || !r.Coupled.Converged {
		t.Fatalf("NACA 0012 at 4°, Re 6e6, tripped did not converge: %+v", r.Coupled)
	}
	sc := NewScene(r, st)
	if sc.Coupled != r.Coupled {
		t.Fatal("NewScene left out the coupled point")
	}
	return sc, r
}

// svgText renders view v of sc as SVG, whose text is searchable.
func svgText(t *testing.T, v View, sc *Scene) string {
	t.Helper()
	var b bytes.Buffer
	if err := WriteFigure(&b, v, sc, "svg", 8, 5, 96); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// TestPressureViscousCp: with a converged coupled point the pressure view
// draws the viscous Cp beside the inviscid one, each named in the key,
// and gives the viscous Cl in its title; a point that did not converge
// draws no viscous curve and says so.
func TestPressureViscousCp(t *testing.T) {
	sc, r := coupledScene(t)
	s := svgText(t, ViewPressure, sc)
	for _, want := range []string{"inviscid upper", "inviscid lower", "viscous upper (coupled)", "viscous lower (coupled)", "viscous " + formatTick(r.Coupled.Cl, 4)} {
		if !strings.Contains(s, want) {
			t.Errorf("pressure view lacks %q", want)
		}
	}
	sc.Coupled = &engine.CoupledPoint{Converged: false, Iterations: 60}
	s = svgText(t, ViewPressure, sc)
	if strings.Contains(s, "viscous upper") || !strings.Contains(s, "viscous solution not converged") {
		t.Error("a point that did not converge is drawn as viscous, or not said")
	}
}

// TestPolarCoupledSweep: the converged rows of a coupled sweep make the
// viscous curve, maximum lift is marked and labelled, rows past it have a
// marker of their own and rows that did not converge are counted and
// marked on the α axis, never drawn as values (invented rows).
func TestPolarCoupledSweep(t *testing.T) {
	sc := synthScene()
	sc.Pins = nil
	sc.Inverted = false
	nan := math.NaN()
	for i, c := range sc.Sweep {
		r := engine.CoupledPoint{AlphaDeg: c.AlphaDeg, Cl: 0.8 * c.Cl, Cd: 0.01, Cm: c.Cm, Converged: true}
		switch {
		case i == 1:
			r = engine.CoupledPoint{AlphaDeg: c.AlphaDeg, Cl: nan, Cd: nan, Cm: nan, Iterations: 60}
		case i == len(sc.Sweep)-1:
			r.PastClMax = true
			r.Cl = 0.5 * c.Cl
		}
		sc.SweepCoupled = append(sc.SweepCoupled, r)
	}
	peak := sc.SweepCoupled[len(sc.Sweep)-2]
	sc.ClMax, sc.AlphaClMax, sc.ClMaxIsPeak = peak.Cl, peak.AlphaDeg, true
	s := svgText(t, ViewPolar, sc)
	for _, want := range []string{
		"Cl inviscid", "Cl viscous", "viscous, past maximum lift",
		"Cl max " + formatTick(peak.Cl, 3) + " at " + formatTick(peak.AlphaDeg, 2) + "°",
		fmt.Sprintf("viscous not converged (1 of %d angles)", len(sc.Sweep)),
	} {
		if !strings.Contains(s, want) {
			t.Errorf("polar lacks %q", want)
		}
	}
	if strings.Contains(s, "NaN") {
		t.Error("a row that did not converge is drawn as a number")
	}
	sc.SweepCoupled = nil
	if s := svgText(t, ViewPolar, sc); strings.Contains(s, "viscous") {
		t.Error("viscous curve without a coupled sweep")
	}
}

// TestCoupledBoundaryLayerView: the boundary-layer view of a converged
// coupled point draws θ, δ*, H, Cf and ñ against the arc length from the
// stagnation point and says where transition was forced; without a
// converged point it has nothing to draw.
func TestCoupledBoundaryLayerView(t *testing.T) {
	sc, _ := coupledScene(t)
	s := svgText(t, ViewBoundaryLayer, sc)
	for _, want := range []string{"θ/c × 1000", "δ*/c × 1000", "H = δ*/θ", "Cf × 1000", "ñ, amplification", "s/c from stagnation", "tripped at x/c 0.05", "viscous solution"} {
		if !strings.Contains(s, want) {
			t.Errorf("boundary-layer view lacks %q", want)
		}
	}
	sc.Coupled = &engine.CoupledPoint{Converged: false}
	if _, err := PlotView(ViewBoundaryLayer, sc); !errors.Is(err, ErrNoData) {
		t.Errorf("without a converged point: %v", err)
	}
}

// TestStreamlinesDisplacement: with a converged coupled point the
// streamline view draws each element's displacement surface and wake,
// named in the key; at mid-chord the line lies δ* outside
// the surface (the definition of the displacement surface), and without
// a converged point nothing is drawn.
func TestStreamlinesDisplacement(t *testing.T) {
	sc, r := coupledScene(t)
	if s := svgText(t, ViewStreamlines, sc); !strings.Contains(s, "displacement surface and wake (coupled)") {
		t.Error("streamline view lacks the displacement surface")
	}
	d := r.Coupled.Detail
	paths := displacementPaths(d)
	if len(paths) != 1 {
		t.Fatalf("%d displacement paths for one element", len(paths))
	}
	e := d.Elements[0]
	var te solver.CoupledStation // the upper station nearest mid-chord
	for _, q := range e.Upper.Stations {
		if math.Abs(q.XC-0.5) < math.Abs(te.XC-0.5) {
			te = q
		}
	}
	want := te.DStar * e.Chord * mmPerM
	best := math.Inf(1)
	for _, q := range paths[0] {
		best = math.Min(best, math.Hypot(q.X-te.X*mmPerM, q.Y-te.Y*mmPerM))
	}
	// The nearest point of the path to the station is the station moved
	// by δ* (within a tenth: the normal is the chord between neighbours).
	if math.Abs(best-want) > 0.1*want {
		t.Errorf("displacement line %.4f mm from the station at x/c %.3f, δ* is %.4f mm", best, te.XC, want)
	}
	sc.Coupled = &engine.CoupledPoint{Converged: false}
	if s := svgText(t, ViewStreamlines, sc); strings.Contains(s, "displacement surface") {
		t.Error("a point that did not converge draws a displacement surface")
	}
}

// TestCoupledBoundaryLayerCellSize: in the workbench's view cell (about
// 450 × 240 px) the boundary-layer view draws H and Cf side by side and
// says what it left out; enlarged (900 × 520 px) it draws all five
// panels. The surfaces' key is a row above the panels at both sizes.
func TestCoupledBoundaryLayerCellSize(t *testing.T) {
	sc := synthCoupledScene()
	for _, tc := range []struct {
		name         string
		wPx, hPx     int
		want, absent []string
	}{
		{"cell", 450, 240, []string{"H = δ*/θ", "Cf × 1000, on local Ue", coupledBLSmallNote, "upper surface", "lower surface"},
			[]string{"θ/c × 1000", "δ*/c × 1000", "ñ, amplification (e^N)"}},
		{"enlarged", 900, 520, []string{"θ/c × 1000", "δ*/c × 1000", "H = δ*/θ", "Cf × 1000, on local Ue", "ñ, amplification (e^N)", "upper surface"},
			[]string{coupledBLSmallNote}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var b bytes.Buffer
			if err := WriteFigure(&b, ViewBoundaryLayer, sc, "svg", float64(tc.wPx)/96, float64(tc.hPx)/96, 96); err != nil {
				t.Fatal(err)
			}
			texts, err := svgTexts(b.Bytes())
			if err != nil {
				t.Fatal(err)
			}
			all := strings.Join(texts, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("lacks %q", w)
				}
			}
			for _, a := range tc.absent {
				for _, s := range texts {
					if s == a {
						t.Errorf("draws %q", a)
					}
				}
			}
			if *figureDir != "" {
				var png bytes.Buffer
				if err := WriteFigure(&png, ViewBoundaryLayer, sc, FormatPNG, float64(tc.wPx)/96, float64(tc.hPx)/96, 96); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(filepath.Join(*figureDir, "boundary-layer-coupled-"+tc.name+".png"), png.Bytes(), 0o644); err != nil {
					t.Fatal(err)
				}
			}
		})
	}
}
