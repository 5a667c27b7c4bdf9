package report

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"sectionbench/export/exporttest"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

var update = flag.Bool("update", false, "rewrite the golden report text in testdata/golden/report")

// synthInput is a report of invented results (export/exporttest: closed
// forms, not a solve) for a study that describes the same two-element
// wing, so that the golden text below pins what the report writes and how,
// not the solver's digits (those are checked against their sources in
// solver).
func synthInput() Input {
	st := model.NewStudy()
	st.Name = "Golden report, invented results"
	st.Team = "Demo Racing Team (fictional)"
	st.Panelling.Panels = 120
	st.Elements[0].Name = "main"
	st.Elements[0].Section = model.SectionSource{Spec: "naca:0012"}
	st.Elements[0].ChordMM = 250
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "flap", Section: model.SectionSource{Spec: "naca:0010"}, ChordMM: 100, XMM: 240, YMM: -20, AngleDeg: 20,
	})
	st.Flow.AlphaDeg = 4
	st.Flow.SpeedMPS = 20
	st.Flow.SpanM = 1.2
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousEstimate
	st.Sweep = model.SweepRange{FromDeg: -4, ToDeg: 12, StepDeg: 2}

	l := exporttest.TwoElementLayout(120)
	sol := exporttest.Solution(l, 4)
	sw := exporttest.Sweep()
	air := model.ISASeaLevel()
	q := model.DynamicPressure(st.Flow.SpeedMPS, air)
	lift := q * l.RefChordM * sol.Cl
	res := &engine.Result{
		Layout: l, Solution: sol, Sweep: sw, SweepViscous: exporttest.Drag(sw), Viscous: exporttest.Viscous(),
		Reynolds: []float64{model.Reynolds(20, 0.25, air), model.Reynolds(20, 0.10, air)},
		Forces: &engine.Forces{DynamicPressurePa: q, Density: air.Density(), Viscosity: air.Viscosity(),
			LiftPerSpan: lift, DownforcePerSpan: -lift, DragPerSpan: q * l.RefChordM * 0.008, MomentPerSpan: q * l.RefChordM * l.RefChordM * sol.Cm,
			ElementLift: []float64{q * 0.25 * sol.Elements[0].Cl, q * 0.10 * sol.Elements[1].Cl}, SpanM: 1.2},
	}
	return Input{Study: st, Result: res, FileName: "golden.sbstudy", AppVersion: "0.9.0-golden",
		Date: time.Date(2026, 3, 14, 0, 0, 0, 0, time.UTC)}
}

// TestReportGolden writes the report of synthInput and compares its text,
// as poppler's pdftotext reads it back, with
// testdata/golden/report/report.txt. White space is folded (each line's
// runs of spaces to one, blank lines dropped), so that another poppler
// version's column spacing does not matter while every word, number and
// heading, and their order, does. After a deliberate change to the report,
//
//	go test ./export/report -run Golden -update
//
// rewrites it; read the diff before committing it.
func TestReportGolden(t *testing.T) {
	var b bytes.Buffer
	if err := Write(&b, synthInput()); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "golden.pdf")
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	got := foldSpace(tool(t, "pdftotext", "-layout", path, "-"))
	exporttest.GoldenText(t, filepath.Join("..", "..", "testdata", "golden", "report", "report.txt"), []byte(got), *update,
		"go test ./export/report -run Golden -update")
}

// foldSpace trims each line, folds its runs of white space to one space
// and drops empty lines; form feeds (page breaks) become a line "\f".
func foldSpace(s string) string {
	var out []string
	for _, page := range strings.Split(s, "\f") {
		if len(out) > 0 {
			out = append(out, "\f")
		}
		for _, line := range strings.Split(page, "\n") {
			if f := strings.Fields(line); len(f) > 0 {
				out = append(out, strings.Join(f, " "))
			}
		}
	}
	return strings.Join(out, "\n") + "\n"
}
