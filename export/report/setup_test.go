package report

import (
	"bytes"
	"context"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/export"
	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// TestReportSetupPage writes the demo report with a set-up page (an
// inviscid ride-height map, a search over the flap's deflection and the
// finite-span estimate, so that it runs in a test's time) and reads it
// back: the page's headings, the search's start and best, the finite-span
// totals as the page formats them, and its cautions, among them the map's
// points too near the ground.
func TestReportSetupPage(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Flow.EndPlateHeightMM = 200
	secs, _, err := export.LoadSections(st, "")
	if err != nil {
		t.Fatal(err)
	}
	ctx := context.Background()
	clear := model.SetupVariable{Kind: model.SetupClearance}
	pts, err := engine.Map(ctx, st, secs, []model.SetupRange{{Var: clear, From: 20, To: 120, Step: 20}},
		engine.MapOptions{PointOptions: engine.PointOptions{Inviscid: true}}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	flap := model.SetupVariable{Kind: model.SetupDeflection, Element: 1}
	opt := engine.SearchOptions{PointOptions: engine.PointOptions{Inviscid: true}, Objective: engine.ObjectiveDownforce, MaxEvaluations: 10}
	sr, err := engine.Search(ctx, st, secs, []model.SetupRange{{Var: flap, From: 15, To: 30}}, opt, nil)
	if err != nil {
		t.Fatal(err)
	}
	fs, res, err := engine.NewEngine().FiniteSpan(ctx, engine.Request{Study: st, Sections: secs})
	if err != nil {
		t.Fatal(err)
	}
	// An inviscid map's points are all a single solve's: one is marked as
	// on another root by hand, and the search's best as one a single
	// solve has no answer at, for the page's notes of them.
	pts[1].StartedFrom, pts[1].Single = []float64{pts[2].Values[0]}, engine.SingleAnotherRoot
	sr.Best.StartedFrom, sr.Best.Single = []float64{sr.Start.Values[0]}, engine.SingleNoAnswer
	curve := figure.MapCurve(st, clear, pts, engine.QuantityLoad, true, 0.9, st.Ground.ClearanceMM)
	in := Input{Study: st, Result: res, AppVersion: "test", Setup: &Setup{
		Curve: curve, CurveNote: "Panel method only (invented demo data).",
		Search: sr, SearchVars: []model.SetupVariable{flap}, SearchOptions: opt,
		FiniteSpan: fs,
	}}
	var b bytes.Buffer
	if err := Write(&b, in); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "setup.pdf")
	if *keep != "" {
		path = strings.TrimSuffix(*keep, ".pdf") + "-setup.pdf"
	}
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	text := strings.Join(strings.Fields(tool(t, "pdftotext", path, "-")), " ")
	for _, w := range []string{
		"Set-up", "Best setting found", "Finite span (an estimate the wind tunnel or the track must confirm)",
		"Downforce (N/m) against ground clearance (mm)", "No separation onset was found in this range",
		"flap deflection (°)", num(sr.Start.Values[0], 1), num(sr.Best.Values[0], 1), "a local optimum",
		num(fs.LoadN, 1) + " N", num(fs.Load2DN, 1) + " N", num(fs.InducedDragN, 1) + " N", num(fs.EffectiveAspectRatio, 2),
		"Glauert", "Hoerner", "validate by test", "qualified engineering review",
		"Boxed (1): not a single solve's answer",
		// 20 mm on the demo's 250 mm chord: below 0.1 chord, flagged as
		// the workbench flags the study.
		"Very close to the ground (1): points closer to the ground than 25 mm",
		"The best setting's solution converged only when started from the solution of a setting solved before it",
	} {
		if !strings.Contains(text, w) {
			t.Errorf("report lacks %q", w)
		}
	}
	if math.IsNaN(fs.LoadN) || !(fs.LoadN < fs.Load2DN) {
		t.Errorf("finite span %g N, 2-D %g N", fs.LoadN, fs.Load2DN)
	}
}

// TestCurveNoteCounts: the map's caption note agrees with its counts
// ("1 without an answer are crossed" stood on the two-element example's
// report, look10) and names how the map was made.
func TestCurveNoteCounts(t *testing.T) {
	for _, tc := range []struct {
		name           string
		points, failed int
		madeBy, want   string
	}{
		{"one failed", 7, 1, "report --map clearance_mm=30:150:20", "A map of 7 points with the coupled viscous solution (report --map clearance_mm=30:150:20); 1 without an answer is crossed on the axis"},
		{"none failed", 1, 0, "", "A map of 1 point with the coupled viscous solution; 0 without an answer are crossed on the axis"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := CurveNote(tc.points, "with the coupled viscous solution", tc.madeBy, tc.failed, 0.9)
			if !strings.HasPrefix(got, tc.want) || !strings.HasSuffix(got, "ahead of x/c 0.9 are ringed.") {
				t.Errorf("%q, want it to start %q", got, tc.want)
			}
		})
	}
}
