package ui

import (
	"context"
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"

	"sectionbench/assets"
	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// TestViscousModeChoice: the Flow tab chooses the coupled solution, the
// one-way estimate or neither, in words; N applies on Enter, says what
// turbulence it stands for, refuses a value out of range, and the choice
// is one undo step.
func TestViscousModeChoice(t *testing.T) {
	w := newDemoBench(t) // the demo: NACA 4412 inverted, 16.7 m/s, the coupled solution on
	vc := w.controls.vc
	if vc.mode.Selected != modeCoupled || vc.ncrit.Disabled() {
		t.Fatalf("demo opens with %q (N field disabled %v)", vc.mode.Selected, vc.ncrit.Disabled())
	}
	if c := current(t, w).Coupled; c == nil || !c.Converged {
		t.Fatalf("the demo opens without a converged coupled result: %+v", c)
	}
	vc.mode.SetSelected(modeOff)
	if res := current(t, w); res.Coupled != nil || w.ctl.Study().Viscous.Enabled || !vc.ncrit.Disabled() {
		t.Fatalf("off: coupled result %v, study %+v", res.Coupled != nil, w.ctl.Study().Viscous)
	}
	for _, o := range vc.mode.Options {
		if len(strings.Fields(o)) < 2 {
			t.Errorf("mode %q is not in full words", o)
		}
	}
	vc.mode.SetSelected(modeCoupled)
	res := current(t, w)
	if v := w.ctl.Study().Viscous; !v.Enabled || !v.IsCoupled() {
		t.Fatalf("study viscous %+v after choosing the coupled solution", v)
	}
	if res.Coupled == nil || res.Viscous != nil {
		t.Fatalf("coupled mode gave coupled %v, estimate %v", res.Coupled != nil, res.Viscous != nil)
	}
	if vc.ncrit.Disabled() || !strings.Contains(vc.note.Text, "validate by test") {
		t.Errorf("coupled mode: N disabled %v, note %q", vc.ncrit.Disabled(), vc.note.Text)
	}
	if !strings.Contains(vc.tu.Text, "N 9") || !strings.Contains(vc.tu.Text, "0.07 %") {
		t.Errorf("meaning of the default N: %q", vc.tu.Text)
	}

	// N: typing does not apply, Enter does.
	vc.ncrit.SetText("")
	test.Type(vc.ncrit, "5")
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 0 {
		t.Fatalf("N applied as %g while typing", n)
	}
	vc.ncrit.OnSubmitted(vc.ncrit.Text)
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 5 {
		t.Fatalf("N = %g after Enter, want 5", n)
	}
	if !strings.Contains(vc.tu.Text, "N 5") {
		t.Errorf("N 5 explained as %q", vc.tu.Text)
	}
	// Out of range: refused with a message naming the field; the study keeps 5.
	vc.ncrit.submit("40")
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 5 || vc.msg.Hidden || !strings.Contains(vc.msg.Text, "Critical amplification N") {
		t.Errorf("N 40: study N %g, message %q", n, vc.msg.Text)
	}
	vc.ncrit.FocusLost()
	if vc.ncrit.Text != "5" {
		t.Errorf("leaving the field kept %q, not the value in use", vc.ncrit.Text)
	}

	// The estimate: N is not used, the note says the lift stays inviscid.
	vc.mode.SetSelected(modeEstimate)
	res = current(t, w)
	if res.Coupled != nil || res.Viscous == nil || !vc.ncrit.Disabled() || !strings.Contains(vc.note.Text, "stay inviscid") {
		t.Errorf("estimate: coupled %v, estimate %v, N disabled %v", res.Coupled != nil, res.Viscous != nil, vc.ncrit.Disabled())
	}
	// Undo goes back through the history: the coupled mode with N 5.
	w.ctl.Undo()
	w.WaitIdle()
	if v := w.ctl.Study().Viscous; !v.IsCoupled() || v.TransitionN != 5 || vc.mode.Selected != modeCoupled {
		t.Errorf("undo: study %+v, choice %q", v, vc.mode.Selected)
	}
	vc.mode.SetSelected(modeOff)
	res = current(t, w)
	if res.Coupled != nil || res.Viscous != nil || w.ctl.Study().Viscous.Mode != model.ViscousCoupled {
		t.Error("off: a viscous result remains, or the mode to come back to was lost")
	}
}

// iterationLimit runs the engine with the coupled solution's Newton
// iterations bounded, so that a point does not converge.
type iterationLimit struct {
	eng session.Runner
	n   int
}

func (l iterationLimit) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
	req.CoupledMaxIterations = l.n
	return l.eng.Run(ctx, req)
}

// TestCoupledResultShown: a converged coupled point gives the viscous
// −Cl, Cd, L/D and Cm in the status line and the results, the inviscid
// −Cl beside, "viscous" said and the caution to validate by test; one
// that does not converge says so and shows no viscous number.
func TestCoupledResultShown(t *testing.T) {
	w := newTestBench(t) // the demo, inverted: −Cl is the downforce coefficient
	// The coupled solution does not converge at every angle (at the
	// demo's 4° it does not, at Re 2.8e5): take the first of a few that
	// does.
	w.controls.vc.mode.SetSelected(modeCoupled)
	res := current(t, w)
	for _, a := range []string{"5", "1", "2", "3"} {
		if res.Coupled != nil && res.Coupled.Converged {
			break
		}
		w.controls.alphaEntry.submit(a)
		res = current(t, w)
	}
	c := res.Coupled
	if c == nil || !c.Converged {
		t.Fatalf("the demo's coupled point converged at none of 1°–5°: %+v", c)
	}
	status := w.status.Full()
	for _, want := range []string{
		"viscous −Cl " + fixed(-c.Cl, 3), "inviscid " + fixed(-c.ClInviscid, 3),
		"Cd " + fixed(c.Cd, 4), "−Cl/Cd " + fixed(-c.Cl/c.Cd, 1), "viscous Cm " + fixed(c.Cm, 3),
		fmt.Sprintf("converged in %d iterations", c.Iterations),
	} {
		if !strings.Contains(status, want) {
			t.Errorf("status line %q lacks %q", status, want)
		}
	}
	table, note := w.results.table.Text, w.results.note.Text
	for _, want := range []string{"−Cl viscous", "−Cl inviscid", fixed(-c.Elements[0].Cl, 3), fixed(c.Elements[0].Cd, 4), "drag N/m", fixed(res.Forces.DragPerSpan, 2)} {
		if !strings.Contains(table, want) {
			t.Errorf("results table lacks %q:\n%s", want, table)
		}
	}
	if !strings.Contains(note, "Viscous: coupled") || !strings.Contains(note, "validate by test") {
		t.Errorf("results note %q", note)
	}

	// The boundary-layer view shows the coupled stations; the drag
	// figures are the estimate's and are not offered.
	pv, polar := w.views[viewPressure], w.views[viewPolar]
	if pv.blToggle.Hidden || !polar.polarMode.Hidden {
		t.Fatalf("coupled: boundary-layer switch hidden %v, drag figures hidden %v", pv.blToggle.Hidden, polar.polarMode.Hidden)
	}
	pv.blToggle.OnTapped()
	w.WaitIdle()
	if pv.canvas.figure() != figBoundaryLayer || pv.canvas.Figure() == nil || !pv.note.Hidden {
		t.Errorf("boundary-layer view of the coupled point not drawn (%v, note %q)", pv.canvas.err, pv.note.Text)
	}

	// Not converged: bound the iterations. No viscous number anywhere.
	w.ctl.SetRunner(iterationLimit{engine.NewEngine(), 1})
	w.controls.alphaEntry.submit("4.5")
	res = current(t, w)
	if res.Coupled == nil || res.Coupled.Converged {
		t.Fatal("one iteration converged")
	}
	status, table, note = w.status.Full(), w.results.table.Text, w.results.note.Text
	if !strings.Contains(status, "not converged after") || strings.Contains(status, "viscous −Cl") || strings.Contains(status, "NaN") {
		t.Errorf("status line %q", status)
	}
	if !strings.Contains(status, "Caution: "+string(model.FlagNotConverged)) {
		t.Errorf("status line %q does not raise the not-converged flag", status)
	}
	if !strings.Contains(status, "inviscid −Cl "+fixed(-res.Solution.Cl, 3)) {
		t.Errorf("status line %q lacks the inviscid −Cl", status)
	}
	if strings.Contains(table, "NaN") || !strings.Contains(note, "not converged after") {
		t.Errorf("results:\n%s\n%s", table, note)
	}
	if pv.canvas.Figure() != nil || !strings.Contains(pv.note.Text, "viscous solution did not converge at this angle") {
		t.Errorf("boundary layer of a point that did not converge: figure %v, note %q", pv.canvas.Figure() != nil, pv.note.Text)
	}
	// The viscous cells of the element's row are dashes.
	row := strings.Fields(strings.Split(table, "\n")[1]) // "1", "main", "element", chord, Re, …
	inv := fixed(-res.Coupled.Elements[0].ClInviscid, 3)
	if row[5] != dash || row[6] != inv || row[7] != dash {
		t.Errorf("row %q: want viscous −Cl —, inviscid %s, Cd —", row, inv)
	}
}

// TestCoupledSweep: with the coupled solution on, the sweep waits for Run
// (it is slow), shows its progress, can be cancelled (the polar keeps
// what it had), and when it ends the polar holds the coupled rows: each
// row's state, maximum lift among the converged rows.
func TestCoupledSweep(t *testing.T) {
	w := newStudyBench(t)
	st := w.ctl.Study()
	st.Elements[0].Section = model.SectionSource{Spec: "naca:0012"}
	st.Flow.Reynolds, st.Flow.AlphaDeg = 6e6, 2
	st.Sweep = model.SweepRange{FromDeg: 0, ToDeg: 6, StepDeg: 2}
	st.Viscous = model.Viscous{Enabled: true, Mode: model.ViscousCoupled, TripUpper: 0.05, TripLower: 0.05}
	if err := w.ctl.Load(st, ""); err != nil {
		t.Fatal(err)
	}
	current(t, w)
	if w.ctl.Sweep() != nil {
		t.Fatal("a coupled sweep ran without being asked")
	}
	c := w.controls
	// Cancelled at once: the polar keeps nothing, the message says so.
	c.runSweep()
	if c.progress.Hidden || c.cancel.Hidden {
		t.Error("no progress or Cancel while the sweep runs")
	}
	c.cancel.OnTapped()
	w.WaitIdle()
	if w.ctl.Sweep() != nil || !strings.Contains(c.sweepMsg.Text, "cancelled") {
		t.Errorf("after Cancel: sweep %v, message %q", w.ctl.Sweep() != nil, c.sweepMsg.Text)
	}
	c.runSweep()
	w.WaitIdle()
	rows, clMax, aMax := w.ctl.SweepCoupled()
	if len(rows) != 4 || len(w.ctl.Sweep()) != 4 {
		t.Fatalf("%d coupled rows for %d angles", len(rows), len(w.ctl.Sweep()))
	}
	converged := 0
	for _, r := range rows {
		if r.Converged {
			converged++
			if !(r.Cl <= clMax) {
				t.Errorf("row at %g° has Cl %g above the maximum %g", r.AlphaDeg, r.Cl, clMax)
			}
		} else if !math.IsNaN(r.Cl) {
			t.Errorf("row at %g° did not converge but has Cl %g", r.AlphaDeg, r.Cl)
		}
	}
	if converged == 0 || math.IsNaN(aMax) {
		t.Fatalf("no converged row on NACA 0012 at Re 6e6, 0–6°")
	}
	sc := w.lastScene()
	if sc == nil || len(sc.SweepCoupled) != 4 || sc.ClMax != clMax {
		t.Error("the polar's scene lacks the coupled sweep")
	}
	polar := w.views[viewPolar]
	if polar.canvas.Figure() == nil || !polar.note.Hidden {
		t.Errorf("polar not drawn after the coupled sweep (%v)", polar.canvas.err)
	}
	// The team report written from the window has the coupled sweep and
	// its maximum lift, as the polar shows them (it said "margin to
	// maximum lift not known" beside a polar marking it).
	job, err := w.newReportJob()
	if err != nil {
		t.Fatal(err)
	}
	if r := job.result; len(r.SweepCoupled) != 4 || r.ClMax != clMax || r.AlphaClMax != aMax {
		t.Errorf("report job: %d coupled rows, Cl max %g at %g°; the window's %g at %g°", len(r.SweepCoupled), r.ClMax, r.AlphaClMax, clMax, aMax)
	}
	if c := report.CoupledFrom(job.study, job.result); c == nil || math.IsNaN(c.ClMax) {
		t.Errorf("the report's coupled summary has no maximum lift: %+v", c)
	}
	// Changing only the angle keeps the sweep and its coupled rows.
	c.alphaEntry.submit("3")
	current(t, w)
	if r, _, _ := w.ctl.SweepCoupled(); len(r) != 4 {
		t.Error("an angle change dropped the coupled sweep")
	}
	// Another N makes it out of date; undo brings it back with its rows.
	w.controls.vc.ncrit.submit("5")
	current(t, w)
	if r, _, _ := w.ctl.SweepCoupled(); r != nil || w.ctl.Sweep() != nil {
		t.Error("the coupled sweep outlived a change of N")
	}
	w.ctl.Undo()
	current(t, w)
	if r, m, _ := w.ctl.SweepCoupled(); len(r) != 4 || m != clMax {
		t.Errorf("undo: %d coupled rows, Cl max %g (was %g)", len(r), m, clMax)
	}
}

// TestCoupledDragViewNote: an empty drag view over a coupled sweep says
// the viscous solution converged nowhere rather than asking for a sweep;
// without a coupled sweep the estimate's notes apply.
func TestCoupledDragViewNote(t *testing.T) {
	empty := fmt.Errorf("drag: %w", figures.ErrNoData)
	sc := &figures.Scene{SweepCoupled: []engine.CoupledPoint{{AlphaDeg: 2}, {AlphaDeg: 4}}}
	for _, f := range []figKind{figDragPolar, figLiftToDrag} {
		if note, ok := coupledViewNote(sc, f, empty); !ok || !strings.Contains(note, "converged at none") {
			t.Errorf("figure %d: note %q, %v", f, note, ok)
		}
		if _, ok := coupledViewNote(&figures.Scene{}, f, empty); ok {
			t.Errorf("figure %d: coupled note without a coupled sweep", f)
		}
	}
}

// The desktop app's options run the sweep of a viscous study when it is
// opened (the polar is not swept live with the viscous solution on): the
// demo opens with its coupled polar, and an example opened later runs its
// own; with the option off nothing runs until Run sweep.
func TestSweepOnOpen(t *testing.T) {
	test.NewTempApp(t)
	dir := t.TempDir()
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		t.Fatal(err)
	}
	st.Sweep = model.SweepRange{FromDeg: 2, ToDeg: 6, StepDeg: 2}
	path := filepath.Join(dir, "viscous.json")
	if err := export.SaveStudy(path, st); err != nil {
		t.Fatal(err)
	}
	w := openTestBenchWith(t, path, Options{SweepOnOpen: true})
	rows, _, _ := w.ctl.SweepCoupled()
	if len(rows) != 3 {
		t.Fatalf("%d coupled rows after opening a viscous study, want 3", len(rows))
	}
	st.Viscous.Enabled = false
	if err := export.SaveStudy(path, st); err != nil {
		t.Fatal(err)
	}
	w.loadStudyFile(path)
	w.WaitIdle()
	if w.ctl.Sweep() == nil {
		t.Error("no live sweep of the inviscid study")
	}
	off := openTestBenchWith(t, "", Options{})
	if r, _, _ := off.ctl.SweepCoupled(); r != nil {
		t.Error("a coupled sweep ran without the option")
	}
}
