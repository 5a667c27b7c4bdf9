package report

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// pdfText writes in as a PDF and returns its text as poppler's pdftotext
// reads it, in reading order, with line breaks turned into spaces so that
// a wrapped sentence is found whole.
func pdfText(t *testing.T, in Input) string {
	t.Helper()
	var b bytes.Buffer
	if err := Write(&b, in); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "r.pdf")
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return strings.Join(strings.Fields(tool(t, "pdftotext", path, "-")), " ")
}

// The summary's numbers are the engine's: downforce over the span is the
// engine's downforce per metre times the span, the coefficient −Cl, and
// with the coupled solution's hook filled in the drag, L/D and the margin
// to maximum lift follow from it by hand: D = q c_ref Cd, margin =
// Cl max − (−Cl).
func TestSummaryNumbers(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	res := solve(t, st)
	h0 := (&writer{in: Input{Study: st, Result: res}}).headline()
	f := res.Forces
	if want := f.DownforcePerSpan * f.SpanM; math.Abs(h0.LoadN-want) > 1e-9*math.Abs(want) {
		t.Errorf("downforce %g N, want %g", h0.LoadN, want)
	}
	if h0.LoadName != "Downforce" || h0.LoadCoef != -res.Solution.Cl || !math.IsNaN(h0.DragN) || !math.IsNaN(h0.ClMaxMargin) {
		t.Errorf("inviscid headline %+v", h0)
	}
	coupled := &Coupled{Converged: true, Iterations: 12, Cl: res.Solution.Cl, Cd: 0.031, ClMaxIsPeak: true, ClMax: -res.Solution.Cl + 0.42, AlphaClMaxDeg: st.Flow.AlphaDeg + 3.5}
	in := Input{Study: st, Result: res, Coupled: coupled, Date: time.Date(2026, 3, 14, 0, 0, 0, 0, time.UTC)}
	h := (&writer{in: in}).headline()
	drag := f.DynamicPressurePa * res.Layout.RefChordM * coupled.Cd * f.SpanM
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"drag, N", h.DragN, drag},
		{"L/D", h.LiftToDrag, f.DownforcePerSpan * f.SpanM / drag},
		{"margin in Cl", h.ClMaxMargin, 0.42},
		{"margin in α", h.AlphaMargin, 3.5},
	} {
		if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
			t.Errorf("%s = %g, want %g", c.name, c.got, c.want)
		}
	}
	text := pdfText(t, in)
	for _, w := range []string{newtons(h.LoadN), newtons(h.DragN), num(h.LiftToDrag, 1), Coef(0.42), "converged in 12 iterations",
		"Chord rise, mm", "+ = leading edge down", model.FrameText, "Downforce to drag"} {
		if !strings.Contains(text, w) {
			t.Errorf("summary lacks %q", w)
		}
	}
	// Without the coupled solution the summary says what is not known.
	text = pdfText(t, Input{Study: st, Result: res})
	for _, w := range []string{"not estimated: the boundary layer is off", "maximum lift needs the coupled viscous solution"} {
		if !strings.Contains(text, w) {
			t.Errorf("inviscid summary lacks %q", w)
		}
	}
}

// kinkedFile writes a NACA 0012 coordinate file whose upper surface has a
// notch turning the contour by about 113° (invented defect), and returns
// its path.
func kinkedFile(t *testing.T) string {
	t.Helper()
	sec, err := model.NACA("0012", model.NACAOptions{PointsPerSurface: 60, ClosedTE: true})
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	b.WriteString("notched test section (invented)\n")
	pts := sec.Points()
	for i, p := range pts {
		if i == 20 { // a spike out of the upper surface
			p.Y += 0.02
		}
		fmt.Fprintf(&b, "%.6f %.6f\n", p.X, p.Y)
	}
	path := filepath.Join(t.TempDir(), "notched.dat")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// Every warning reaches the report: the cleaning report of a section
// loaded from a file (a kink), and a Reynolds number set directly that
// disagrees with speed and air.
func TestReportWarnings(t *testing.T) {
	path := kinkedFile(t)
	st := model.NewStudy()
	st.Name = "Notched section (invented)"
	st.Elements[0].Section = model.SectionSource{Spec: path}
	st.Flow.SpeedMPS = 20
	st.Flow.Reynolds = 1e6 // speed and air give about 3.4e5 on 250 mm
	secs, reps, err := export.LoadSections(st, "")
	if err != nil {
		t.Fatal(err)
	}
	if len(reps[0].Warnings) == 0 {
		t.Fatal("the notched file cleans without a warning: the test needs one")
	}
	res := solve(t, st)
	text := pdfText(t, Input{Study: st, Result: res, Sections: secs, CleanReports: reps})
	for _, w := range reps[0].Warnings {
		if !strings.Contains(text, strings.Join(strings.Fields(w.Message), " ")) {
			t.Errorf("report lacks the cleaning warning %q", w.Message)
		}
	}
	for _, w := range []string{"The Reynolds number was set directly to 1e+06", "Sections loaded from files: what cleaning did", "notched.dat"} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
}

// Three elements with 30-character names: every element's numbers, signs
// included, are in the tables, names shortened rather than run into the
// next cell.
func TestReportLongNames(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Elements[0].Name = "main plane, carbon, 2026 spec A"
	st.Elements[1].Name = "first flap, carbon, 2026 spec B"
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "second flap, carbon, 2026 spc C", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 80, XMM: 335, YMM: -40, AngleDeg: 40,
	})
	res := solve(t, st)
	secs, _, err := export.LoadSections(st, "")
	if err != nil {
		t.Fatal(err)
	}
	text := pdfText(t, Input{Study: st, Result: res, Sections: secs})
	for _, e := range res.Solution.Elements {
		for _, v := range []string{Coef(e.Cl), Coef(e.Cm)} {
			if !strings.Contains(text, v) {
				t.Errorf("%s: %s missing from the report", e.Name, v)
			}
		}
	}
	if !strings.Contains(text, "…") {
		t.Error("no name was shortened")
	}
}

// SectionGeometry measures a NACA 0012: 12 % thick at 0.30c, no camber,
// leading-edge radius 1.1019 t² = 0.01587 (Abbott & von Doenhoff, Theory
// of Wing Sections, 1959, eqs. 6.2 and 6.3); the fit over the first 0.5 %
// of the chord reads the radius within 5 %, the rest within the sampling.
// A NACA 4412 has 4 % camber at 0.4c (eq. 6.4).
func TestSectionGeometry(t *testing.T) {
	for _, c := range []struct {
		name               string
		t, xt, m, xm, rho  float64
		tolT, tolX, tolRho float64
	}{
		{"0012", 0.12, 0.30, 0, 0, 0.01587, 0.001, 0.02, 0.05},
		{"4412", 0.12, 0.30, 0.04, 0.40, 0.01587, 0.002, 0.03, 0.10},
	} {
		sec, err := model.NACA(c.name, model.NACAOptions{PointsPerSurface: 200, ClosedTE: true})
		if err != nil {
			t.Fatal(err)
		}
		g := SectionGeometry(sec)
		if math.Abs(g.Thickness-c.t) > c.tolT || math.Abs(g.ThicknessXC-c.xt) > c.tolX {
			t.Errorf("%s: thickness %.4f at %.3f, want %g at %g", c.name, g.Thickness, g.ThicknessXC, c.t, c.xt)
		}
		if math.Abs(g.Camber-c.m) > c.tolT || (c.m > 0 && math.Abs(g.CamberXC-c.xm) > c.tolX) {
			t.Errorf("%s: camber %.4f at %.3f, want %g at %g", c.name, g.Camber, g.CamberXC, c.m, c.xm)
		}
		if math.Abs(g.LERadius-c.rho) > c.tolRho*c.rho {
			t.Errorf("%s: leading-edge radius %.5f, want %.5f", c.name, g.LERadius, c.rho)
		}
		if g.TEThickness > 1e-9 {
			t.Errorf("%s: closed trailing edge %.2g thick", c.name, g.TEThickness)
		}
	}
}

// CentreOfPressureXC: a lift acting at the quarter chord leaves no moment
// about it; Cm = −Cl/4 puts it at mid-chord (x_cp = 1/4 − Cm/Cl).
func TestCentreOfPressure(t *testing.T) {
	for _, c := range []struct {
		cl, cm, want float64
	}{{1, 0, 0.25}, {1, -0.25, 0.5}, {-2, -0.5, 0}} {
		e := solverElement(c.cl, c.cm)
		if got := CentreOfPressureXC(e); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("Cl %g, Cm %g: x_cp %g, want %g", c.cl, c.cm, got, c.want)
		}
	}
}

func solverElement(cl, cm float64) solver.ElementSolution {
	return solver.ElementSolution{ClPressure: cl, Cl: cl, Cm: cm}
}

// The coupled solution's verdicts per sweep angle mark the sweep's rows:
// an angle past maximum lift or not converged is numbered in the Marks
// column and explained in the footnote.
func TestSweepMarksFromCoupled(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Ground.ClearanceMM = 150 // clear of the ground flag
	res := solve(t, st)
	n := len(res.Sweep)
	c := &Coupled{Converged: true, Iterations: 9, Cd: math.NaN(), ClMax: math.NaN(), AlphaClMaxDeg: math.NaN(),
		PastClMax: make([]bool, n), NotConverged: make([]bool, n), Separated: make([]bool, n)}
	c.PastClMax[n-1], c.NotConverged[n-2] = true, true
	w := &writer{in: Input{Study: st, Result: res, Coupled: c}}
	for i, want := range map[int]model.FlagKind{n - 1: model.FlagPastClMax, n - 2: model.FlagNotConverged} {
		fl := w.sweepFlags(i)
		if len(fl) == 0 || fl[0].Kind != want {
			t.Errorf("row %d: flags %v, want %s first", i, fl, want)
		}
	}
	text := pdfText(t, Input{Study: st, Result: res, Coupled: c})
	for _, s := range []string{"(2) past maximum lift", "(3) viscous solution not converged"} {
		if !strings.Contains(text, s) {
			t.Errorf("report lacks the footnote %q", s)
		}
	}
}

// With the engine's coupled viscous solution the summary takes its
// numbers: the lift and drag in N are the engine's viscous forces, the
// margin to maximum lift the engine's Cl max less the viscous Cl.
func TestSummaryFromCoupledEngine(t *testing.T) {
	st := model.NewStudy()
	st.Name = "NACA 4412, coupled (invented example)"
	st.Panelling.Panels = 120
	st.Flow.SpeedMPS, st.Flow.SpanM = 25, 1
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousCoupled
	st.Sweep = model.SweepRange{FromDeg: 0, ToDeg: 8, StepDeg: 4}
	res := solve(t, st)
	if res.Coupled == nil || !res.Coupled.Converged {
		t.Skip("the coupled solution did not converge here; the hook is tested with hand-made values in TestSummaryNumbers")
	}
	in := Input{Study: st, Result: res}
	in.Coupled = CoupledFrom(st, res)
	// A density study of the panel method (invented rows): its Cl is the
	// inviscid one, which the summary must say beside the viscous Cl.
	in.Density = &engine.DensityResult{RecommendedPanels: 80, Rows: []engine.DensityRow{{Panels: 80, Nose: 0.5, Cl: 0.9}},
		Cl: engine.Extrapolation{Value: 0.91, ErrorEstimate: 1e-4, ObservedOrder: 2, OK: true}}
	h := (&writer{in: in}).headline()
	f := res.Forces
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"lift, N", h.LoadN, f.LiftPerSpan * f.SpanM},
		{"drag, N", h.DragN, f.DragPerSpan * f.SpanM},
		{"coefficient", h.LoadCoef, res.Coupled.Cl},
	} {
		if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
			t.Errorf("%s = %g, want the engine's %g", c.name, c.got, c.want)
		}
	}
	if !math.IsNaN(res.ClMax) {
		if want := res.ClMax - res.Coupled.Cl; math.Abs(h.ClMaxMargin-want) > 1e-12 {
			t.Errorf("margin %g, want %g", h.ClMaxMargin, want)
		}
	}
	text := pdfText(t, in)
	// The boundary-layer page shows the coupled layers, and the load
	// against α is the viscous one (both were the one-way estimate's or
	// the inviscid only).
	// The inputs name the coupled solution as such (they said
	// "Boundary-layer estimate"), the density study's Cl is said to be
	// the inviscid one, and the sweep table's "Cd (viscous)" header is
	// not cut inside its word ("(viscou" / "s)").
	for _, w := range []string{"Viscous solution (coupled)", newtons(h.LoadN), "viscous solution (coupled)",
		"Boundary layers (coupled viscous solution)", "the sweep's viscous Cl (the inviscid load dashed for comparison)",
		"Viscous solution on (coupled viscous solution", "inviscid Cl → 0.9100",
		"(inviscid Cl " + Coef(res.Coupled.ClInviscid) + " beside it)"} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
	for _, w := range []string{"Boundary-layer estimate", "(viscou "} {
		if strings.Contains(text, w) {
			t.Errorf("report has %q", w)
		}
	}
}

// TestSkipReason: a skipped count's reason without the engine's own
// "density study at N panels, nose X: " before it.
func TestSkipReason(t *testing.T) {
	row := engine.DensityRow{Panels: 20, Nose: 0.5, Skipped: `density study at 20 panels, nose 0.5: elements "main" and "flap": gap too small for the panels`}
	if got, want := SkipReason(row), `elements "main" and "flap": gap too small for the panels`; got != want {
		t.Errorf("SkipReason = %q, want %q", got, want)
	}
	row.Skipped = "some other reason"
	if got := SkipReason(row); got != row.Skipped {
		t.Errorf("SkipReason = %q, want the reason unchanged", got)
	}
}

// TestMarginSaysSuction: the margin to maximum lift says it is the
// model's when the suction peak lies beyond real flows
// (model.CpMinPlausible) at an angle between the study's and Cl max's:
// the two-element example's report gave "at least 1.8160 … the real
// maximum lies beyond it" with every sweep row from 3° flagged so.
func TestMarginSaysSuction(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Flow.AlphaDeg = 2
	res := solve(t, st) // sweep −2° to 6° in 2°
	if len(res.Sweep) != 5 {
		t.Fatalf("%d sweep rows, want 5", len(res.Sweep))
	}
	for _, tc := range []struct {
		name     string
		cpMin    []float64
		clMaxDeg float64
		want     string // "" for no such words
	}{
		{"beyond from 4°", []float64{-2, -3, -4, -9, -10}, 6, "but from 4.0° the suction peak is beyond the Cp −8 real flows sustain"},
		{"beyond only below the study's angle", []float64{-9, -3, -4, -5, -6}, 6, ""},
		{"beyond only past Cl max", []float64{-2, -3, -4, -5, -9}, 4, ""},
		{"never beyond", []float64{-2, -3, -4, -5, -6}, 6, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := &Coupled{Converged: true, Iterations: 12, Cl: res.Solution.Cl, Cd: 0.031, ClMax: -res.Solution.Cl + 0.5, AlphaClMaxDeg: tc.clMaxDeg, PointCpMin: -4, CpMin: tc.cpMin}
			w := &writer{in: Input{Study: st, Result: res, Coupled: c}}
			got := w.marginWords(w.headline())
			if !strings.HasPrefix(got, "at least ") || !strings.Contains(got, "the model's lift falls") {
				t.Errorf("margin %q does not say it is a lower bound of the model's maximum", got)
			}
			if has := strings.Contains(got, "but from"); tc.want == "" && has || tc.want != "" && !strings.Contains(got, tc.want) {
				t.Errorf("margin %q, want %q", got, tc.want)
			}
		})
	}
}
