package report

import (
	"bytes"
	"context"
	"errors"
	"flag"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

var keep = flag.String("keep", "", "also write the test report to this file")

// demoStudy is the invented demo team's inverted two-element wing (fictional
// team, demo data): NACA 4412 main plane of 250 mm, NACA 4412 flap of
// 110 mm at 22°, 60 mm above the ground, 20 m/s, boundary layer on.
func demoStudy() *model.Study {
	st := model.NewStudy()
	st.Name = "Demo rear wing, low-drag setting"
	st.Team = "Demo Racing Team (fictional)"
	st.Inverted = true
	st.Panelling.Panels = 120
	st.Elements[0].Name = "main plane"
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 110, XMM: 232, YMM: -18, AngleDeg: 22,
	})
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 60}
	st.Flow.SpeedMPS = 20
	st.Flow.SpanM = 1.2
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousEstimate // the one-way estimate these checks draw
	st.Sweep = model.SweepRange{FromDeg: -2, ToDeg: 6, StepDeg: 2}
	return st
}

func solve(t *testing.T, st *model.Study) *engine.Result {
	t.Helper()
	secs, _, err := export.LoadSections(st, "")
	if err != nil {
		t.Fatal(err)
	}
	r, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true, Streamlines: true})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// density runs a small density study of st: 40 to 320 panels, two nose
// clusterings, each a full engine solve.
func density(t *testing.T, st *model.Study) *engine.DensityResult {
	t.Helper()
	secs, _, err := export.LoadSections(st, "")
	if err != nil {
		t.Fatal(err)
	}
	c := st.Clone()
	c.Density = model.DensityPlan{Panels: []int{40, 80, 160, 320}, Nose: []float64{0.3, 0.7}}
	d, err := engine.NewEngine().Density(context.Background(), c, secs, nil)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func tool(t *testing.T, name string, args ...string) string {
	t.Helper()
	path, err := exec.LookPath(name)
	if err != nil {
		// Not a skip: a report nobody read back is not tested. CI installs
		// poppler-utils with scripts/setup.sh; so can a developer.
		t.Fatalf("%s not on PATH: install poppler-utils (scripts/setup.sh)", name)
	}
	out, err := exec.Command(path, args...).CombinedOutput()
	if err != nil {
		t.Fatalf("%s %v: %v\n%s", name, args, err, out)
	}
	return string(out)
}

// TestReport writes the demo report and reads it back with poppler's
// pdfinfo and pdftotext: it parses, has the expected pages and headings,
// and its text holds the solver's own numbers as the tables format them.
func TestReport(t *testing.T) {
	st := demoStudy()
	res := solve(t, st)
	var b bytes.Buffer
	in := Input{Study: st, Result: res, Density: density(t, st), FileName: "demo-rear-wing.sbstudy", AppVersion: "0.9.0-test",
		Date: time.Date(2026, 3, 14, 0, 0, 0, 0, time.UTC)}
	if err := Write(&b, in); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "report.pdf")
	if *keep != "" {
		path = *keep
	}
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	info := tool(t, "pdfinfo", path)
	m := regexp.MustCompile(`Pages:\s+(\d+)`).FindStringSubmatch(info)
	if m == nil {
		t.Fatalf("pdfinfo: no page count in\n%s", info)
	}
	pages, _ := strconv.Atoi(m[1])
	text := tool(t, "pdftotext", "-layout", path, "-")
	// Every page has its footer, numbered out of the real page count.
	for i := 1; i <= pages; i++ {
		if want := "Page " + strconv.Itoa(i) + " of " + m[1]; !strings.Contains(text, want) {
			t.Errorf("footer %q missing", want)
		}
	}
	if n := strings.Count(text, "demo-rear-wing.sbstudy"); n < pages {
		t.Errorf("file name in %d places, want every footer (%d pages)", n, pages)
	}
	sol := res.Solution
	wants := []string{
		st.Name, "summary", "Setting as mounted", "Confidence", "Open issues", "Warnings", "Frame and signs", "Appendix: reproducing this report", "Inputs", "Results", "Section and panels", "Pressure and flow", "Sweep", "Boundary layer", "Panel density study", "Methods", "References", "Limitations and cautions",
		"Katz", "Thwaites", "Squire", "Sutherland", "U.S. Standard Atmosphere, 1976",
		"validate by test", "qualified engineering review",
		Coef(sol.Cl), Coef(sol.ClPressure), Coef(sol.Cm), Coef(-sol.Cl), "0.9.0-test", "14 March 2026",
	}
	for _, e := range sol.Elements {
		wants = append(wants, Coef(e.Cl), Coef(e.Cm), Cp(e.CpMin))
	}
	for _, c := range res.Sweep {
		wants = append(wants, Coef(c.Cl), Coef(c.Cm))
	}
	for _, row := range in.Density.Rows {
		wants = append(wants, Coef(row.Cl))
	}
	for _, w := range wants {
		if !strings.Contains(text, w) {
			t.Errorf("report text lacks %q", w)
		}
	}
}

// TestReportLetter checks the US Letter page size, 612 × 792 pt.
func TestReportLetter(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	var b bytes.Buffer
	if err := Write(&b, Input{Study: st, Result: solve(t, st), PageSize: "letter"}); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "letter.pdf")
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	if info := tool(t, "pdfinfo", path); !strings.Contains(info, "612 x 792 pts") {
		t.Errorf("not Letter:\n%s", info)
	}
}

func TestReportInputErrors(t *testing.T) {
	for _, c := range []struct {
		name string
		in   Input
	}{
		{"no study", Input{}},
		{"no result", Input{Study: model.NewStudy()}},
		{"bad page size", Input{Study: model.NewStudy(), Result: &engine.Result{Solution: &solver.Solution{}, Layout: &model.Layout{}}, PageSize: "A3"}},
	} {
		if err := Write(&bytes.Buffer{}, c.in); !errors.Is(err, ErrInput) {
			t.Errorf("%s: error %v does not wrap ErrInput", c.name, err)
		}
	}
}

func TestNum(t *testing.T) {
	for _, c := range []struct {
		v    float64
		want string
	}{{-0.00001, "0.0000"}, {1.23456, "1.2346"}, {-2.5, "-2.5000"}} {
		if got := Coef(c.v); got != c.want {
			t.Errorf("Coef(%g) = %q, want %q", c.v, got, c.want)
		}
	}
}
