package ui

import (
	"bytes"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"sectionbench/assets"
	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session/sessiontest"
)

// uiQueue stands in for the UI goroutine in tests.
type uiQueue = sessiontest.Queue

// openTestBench opens a study (the demo if path is "") in a headless
// workbench without autosave and waits for its first result.
func openTestBench(t *testing.T, path string) *Workbench {
	t.Helper()
	return openTestBenchWith(t, path, Options{})
}

// openTestBenchWith is openTestBench with options.
func openTestBenchWith(t *testing.T, path string, opt Options) *Workbench {
	t.Helper()
	q := new(uiQueue)
	w, err := newWorkbench(fyne.CurrentApp(), path, opt, q.Post, q.Drain)
	if err != nil {
		t.Fatalf("New: %v", err)
	}
	w.Window().Resize(fyne.NewSize(windowWidth, windowHeight))
	w.WaitIdle()
	t.Cleanup(func() { w.ctl.CancelSweep(); w.WaitIdle() })
	return w
}

// newTestBench opens the demo study with its viscous solution off, as it
// was before the coupled solution became the default: the window's wiring
// under test does not depend on it, and each edit then solves in
// milliseconds instead of a coupled solution's tenths of a second (tests
// of the viscous solution turn it on, or open the demo as the app does
// with newDemoBench).
func newTestBench(t *testing.T) *Workbench {
	t.Helper()
	test.NewTempApp(t)
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		t.Fatal(err)
	}
	st.Viscous.Enabled = false
	return openTestBenchWith(t, "", Options{start: st})
}

// newDemoBench opens the demo study as the app does, with the coupled
// viscous solution on.
func newDemoBench(t *testing.T) *Workbench {
	t.Helper()
	test.NewTempApp(t)
	return openTestBench(t, "")
}

// current returns the newest result and fails if the newest request failed
// or its result is not the one shown.
func current(t *testing.T, w *Workbench) *engine.Result {
	t.Helper()
	w.WaitIdle()
	res, gen, err := w.ctl.Result()
	if err != nil {
		t.Fatalf("solve failed: %v", err)
	}
	if res == nil || gen != w.ctl.Latest() {
		t.Fatalf("no current result (gen %d, latest %d)", gen, w.ctl.Latest())
	}
	return res
}

func panelCount(res *engine.Result) int { return len(res.Solution.Elements[0].Panels) }

func encoded(t *testing.T, st *model.Study) string {
	t.Helper()
	b, err := st.Encode()
	if err != nil {
		t.Fatalf("encode: %v", err)
	}
	return string(b)
}

func TestDemoStartsSolved(t *testing.T) {
	w := newTestBench(t)
	res := current(t, w)
	st := w.ctl.Study()
	if got, want := panelCount(res), st.Panelling.Panels; got != want {
		t.Errorf("first result has %d panels, study asks for %d", got, want)
	}
	if len(w.ctl.Sweep()) == 0 {
		t.Error("the demo's sweep did not run with the first update")
	}
	if w.ctl.Dirty() {
		t.Error("a freshly opened demo is marked unsaved")
	}
	for k, v := range w.views {
		if v.canvas.Figure() == nil {
			t.Errorf("view %v shows no figure after the first update (%v)", viewKind(k), v.canvas.err)
		}
	}
}

func TestPanelCountResolves(t *testing.T) {
	w := newTestBench(t)
	for _, c := range []struct {
		name string
		set  func()
		want int
	}{
		{"entry", func() { w.controls.panelEntry.submit("80") }, 80},
		{"slider", func() { w.controls.panelSlider.SetValue(240) }, 240},
		{"entry beyond slider", func() { w.controls.panelEntry.submit("1100") }, 1100},
	} {
		c.set()
		res := current(t, w)
		if got := w.ctl.Study().Panelling.Panels; got != c.want {
			t.Errorf("%s: study has %d panels, want %d", c.name, got, c.want)
		}
		if got := panelCount(res); got != c.want {
			t.Errorf("%s: result has %d panels, want %d", c.name, got, c.want)
		}
	}
	// Out of range: the message shows and the study keeps its count.
	w.controls.panelEntry.submit("5000")
	w.WaitIdle()
	if w.controls.panelMsg.Hidden {
		t.Error("panel count 5000 shows no message")
	}
	if got := w.ctl.Study().Panelling.Panels; got != 1100 {
		t.Errorf("after a rejected count the study has %d panels, want 1100", got)
	}
}

func TestInvalidNACAKeepsSection(t *testing.T) {
	w := newTestBench(t)
	before := w.ctl.Study()
	sec := w.ctl.Sections()[0]
	res := current(t, w)

	w.controls.naca.submit("44x2")
	w.WaitIdle()
	if w.controls.sourceMsg.Hidden || w.controls.sourceMsg.Text == "" {
		t.Error("invalid NACA code shows no message")
	}
	if got, want := encoded(t, w.ctl.Study()), encoded(t, before); got != want {
		t.Error("an invalid NACA code changed the study")
	}
	if w.ctl.Sections()[0] != sec {
		t.Error("an invalid NACA code replaced the section")
	}
	if r, _, _ := w.ctl.Result(); r != res {
		t.Error("an invalid NACA code triggered a new solve")
	}

	w.controls.naca.submit("0012")
	current(t, w)
	if got := w.ctl.Study().Elements[0].Section.Spec; got != "naca:0012" {
		t.Errorf("after a valid code the section is %q, want naca:0012", got)
	}
	if !w.controls.sourceMsg.Hidden {
		t.Error("the message stays after a valid code")
	}
	// The new section reached the solver: a symmetric and a cambered
	// section give different lift at the same angle.
	if r := current(t, w); r.Solution.Cl == res.Solution.Cl {
		t.Error("the solution did not change with the section")
	}
}

func TestUndoRedo(t *testing.T) {
	w := newTestBench(t)
	s0 := encoded(t, w.ctl.Study())
	w.controls.panelEntry.submit("90")
	w.ctl.BreakMerge()
	s1 := encoded(t, w.ctl.Study())
	w.controls.alphaEntry.submit("7.5")
	s2 := encoded(t, w.ctl.Study())
	if s0 == s1 || s1 == s2 {
		t.Fatal("edits did not change the study")
	}
	steps := []struct {
		name string
		do   func() bool
		want string
	}{
		{"undo alpha", w.ctl.Undo, s1},
		{"undo panels", w.ctl.Undo, s0},
		{"redo panels", w.ctl.Redo, s1},
		{"redo alpha", w.ctl.Redo, s2},
	}
	for _, s := range steps {
		if !s.do() {
			t.Fatalf("%s: nothing to do", s.name)
		}
		if got := encoded(t, w.ctl.Study()); got != s.want {
			t.Errorf("%s: study is\n%s\nwant\n%s", s.name, got, s.want)
		}
	}
	if w.ctl.Redo() {
		t.Error("redo past the newest change succeeded")
	}
	res := current(t, w)
	if got := panelCount(res); got != 90 {
		t.Errorf("after redo the result has %d panels, want 90", got)
	}
	if got := w.controls.alphaEntry.Text; got != "7.5" {
		t.Errorf("after redo the angle entry says %q, want 7.5", got)
	}
}

func TestSliderDragIsOneUndoStep(t *testing.T) {
	w := newTestBench(t)
	s0 := encoded(t, w.ctl.Study())
	for _, n := range []float64{100, 120, 140, 160, 180} {
		w.controls.panelSlider.SetValue(n)
	}
	w.ctl.BreakMerge()
	if !w.ctl.Undo() {
		t.Fatal("nothing to undo after a drag")
	}
	if got := encoded(t, w.ctl.Study()); got != s0 {
		t.Error("one undo did not return to the study before the drag")
	}
}

func TestSaveAndReopen(t *testing.T) {
	w := newTestBench(t)
	w.controls.panelEntry.submit("120")
	w.controls.alphaEntry.submit("−2")
	if err := w.ctl.PinCurrent(); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle() // the pin waits for the solve of N = 120, α = −2°
	if !w.ctl.Dirty() || !strings.Contains(w.Window().Title(), "•") {
		t.Errorf("edited study not marked unsaved (title %q)", w.Window().Title())
	}
	path := filepath.Join(t.TempDir(), "wing.json")
	if err := w.ctl.Save(path); err != nil {
		t.Fatal(err)
	}
	if w.ctl.Dirty() || strings.Contains(w.Window().Title(), "•") {
		t.Errorf("saved study still marked unsaved (title %q)", w.Window().Title())
	}
	st, err := export.LoadStudy(path)
	if err != nil {
		t.Fatalf("reopen: %v", err)
	}
	if got, want := encoded(t, st), encoded(t, w.ctl.Study()); got != want {
		t.Errorf("reopened study differs:\n%s\nwant\n%s", got, want)
	}
	if st.Panelling.Panels != 120 || st.Flow.AlphaDeg != -2 || len(st.Pins) != 1 {
		t.Errorf("reopened study has N=%d, α=%g, %d pins; want 120, −2, 1", st.Panelling.Panels, st.Flow.AlphaDeg, len(st.Pins))
	}

	// Open it in a second workbench: same study, solved.
	w2 := openTestBench(t, path)
	if got := panelCount(current(t, w2)); got != 120 {
		t.Errorf("reopened study solved with %d panels, want 120", got)
	}
	if w2.ctl.Path() != path || w2.ctl.Dirty() {
		t.Errorf("reopened workbench: path %q dirty %v", w2.ctl.Path(), w2.ctl.Dirty())
	}
}

func TestPinsAppearAndClear(t *testing.T) {
	w := newTestBench(t)
	if err := w.ctl.PinCurrent(); err != nil {
		t.Fatal(err)
	}
	w.controls.panelEntry.submit("80")
	if err := w.ctl.PinCurrent(); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle() // the pin waits for the solve at 80 panels
	pins := w.ctl.Study().Pins
	if len(pins) != 2 {
		t.Fatalf("%d pins, want 2", len(pins))
	}
	if pins[1].Label != "N=80" {
		t.Errorf("second pin label %q, want N=80", pins[1].Label)
	}
	var n int
	for _, c := range pins[1].Cp {
		n += len(c.Points)
	}
	if n != 80 {
		t.Errorf("second pin holds %d Cp points, want one per panel (80)", n)
	}
	if len(pins[0].Polar) == 0 {
		t.Error("pin holds no polar")
	}
	current(t, w)
	if got := w.controls.pinFields[1].Text; got != "N=80" {
		t.Errorf("pin list shows %q for the second pin, want N=80", got)
	}
	// A pin can be renamed in its field; an empty or taken name is refused.
	w.controls.pinFields[1].submit("80 panels, cosine")
	if got := w.ctl.Study().Pins[1].Label; got != "80 panels, cosine" {
		t.Errorf("renamed pin is %q", got)
	}
	w.controls.pinFields[1].submit(pins[0].Label)
	if w.controls.pinMsg.Hidden || w.ctl.Study().Pins[1].Label != "80 panels, cosine" {
		t.Errorf("a taken name: message hidden %v, label %q", w.controls.pinMsg.Hidden, w.ctl.Study().Pins[1].Label)
	}
	if err := w.ctl.ClearPins(); err != nil {
		t.Fatal(err)
	}
	if got := len(w.ctl.Study().Pins); got != 0 {
		t.Errorf("%d pins after clearing", got)
	}
	if !w.ctl.Undo() || len(w.ctl.Study().Pins) != 2 {
		t.Error("undo did not bring the pins back")
	}
}

func TestRunSweep(t *testing.T) {
	w := newTestBench(t)
	w.controls.from.submit("-6")
	w.controls.to.submit("10")
	w.controls.step.submit("0.25") // 65 angles: more than a live update runs
	w.WaitIdle()
	if got := w.ctl.Study().Sweep; got != (model.SweepRange{FromDeg: -6, ToDeg: 10, StepDeg: 0.25}) {
		t.Fatalf("sweep is %+v", got)
	}
	if len(w.ctl.Sweep()) == 65 {
		t.Error("a long sweep ran with the live update")
	}
	w.controls.runSweep()
	w.WaitIdle()
	sw := w.ctl.Sweep()
	if len(sw) != 65 {
		t.Fatalf("sweep has %d angles, want 65", len(sw))
	}
	if sw[0].AlphaDeg != -6 || sw[len(sw)-1].AlphaDeg != 10 {
		t.Errorf("sweep runs %g..%g, want −6..10", sw[0].AlphaDeg, sw[len(sw)-1].AlphaDeg)
	}
	if !w.controls.progress.Hidden || w.controls.run.Disabled() {
		t.Error("sweep controls not restored after the run")
	}
	// Changing only the angle keeps the sweep; changing the panelling drops it.
	w.controls.alphaEntry.submit("6")
	w.WaitIdle()
	if len(w.ctl.Sweep()) != 65 {
		t.Error("an angle change dropped the sweep")
	}
	w.controls.panelEntry.submit("120")
	w.WaitIdle()
	if w.ctl.Sweep() != nil {
		t.Error("a panelling change kept a sweep of the old panelling")
	}
	// A bad range leaves the study's sweep alone.
	w.controls.step.submit("0")
	if w.controls.sweepMsg.Hidden {
		t.Error("step 0 shows no message")
	}
	if w.ctl.Study().Sweep.StepDeg != 0.25 {
		t.Error("a rejected step changed the study")
	}
}

func TestEnlargeRestores(t *testing.T) {
	w := newTestBench(t)
	w.toggleEnlarge(viewPressure)
	if len(w.viewArea.Objects) != 1 || w.viewArea.Objects[0] != w.views[viewPressure] {
		t.Fatal("pressure view not enlarged")
	}
	w.toggleEnlarge(viewPressure)
	if w.viewArea.Objects[0] != w.grid || len(w.grid.Objects) != int(numViews) {
		t.Fatal("grid not restored")
	}
}

func TestCloseUpAndZoom(t *testing.T) {
	w := newTestBench(t)
	p := w.views[viewPanels].canvas
	full, ok := p.window()
	if !ok {
		t.Fatal("panels view has no window")
	}
	p.CloseUpLE(0)
	w.WaitIdle()
	near, _ := p.window()
	if !(near.XMax-near.XMin < (full.XMax-full.XMin)/2) {
		t.Errorf("close-up %+v is not much narrower than %+v", near, full)
	}
	p.ResetZoom()
	w.WaitIdle()
	if back, _ := p.window(); back != full {
		t.Errorf("reset window %+v, want %+v", back, full)
	}
}

func TestExportFiguresAndTables(t *testing.T) {
	w := newTestBench(t)
	dir := t.TempDir()
	files, err := w.writeFigures("png")(dir)
	if err != nil {
		t.Fatal(err)
	}
	more, err := w.writeCpTable()(dir)
	if err != nil {
		t.Fatal(err)
	}
	sweep, err := w.writeSweepTable()(dir)
	if err != nil {
		t.Fatal(err)
	}
	rep, err := w.writeReport()(dir)
	if err != nil {
		t.Fatal(err)
	}
	files = append(append(append(files, more...), sweep...), rep...)
	if len(files) != int(numViews)+1+3 { // the views, the panel sizes of the one element, three tables and the report
		t.Fatalf("wrote %v", files)
	}
	for _, f := range files {
		b, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil {
			t.Fatal(err)
		}
		if strings.HasSuffix(f, ".png") {
			img, err := png.Decode(bytes.NewReader(b))
			if err != nil {
				t.Errorf("%s: %v", f, err)
				continue
			}
			// 6 × 4 in at 200 dpi.
			if got := img.Bounds().Size(); got.X != figureWidthIn*figureDPI || got.Y != figureHeightIn*figureDPI {
				t.Errorf("%s is %v px", f, got)
			}
		} else if strings.HasSuffix(f, ".pdf") {
			if !bytes.HasPrefix(b, []byte("%PDF-")) {
				t.Errorf("%s is not a PDF", f)
			}
		} else if n := bytes.Count(b, []byte("\n")); n < 10 {
			t.Errorf("%s has %d lines", f, n)
		}
	}
}

func TestKarmanTrefftzSource(t *testing.T) {
	w := newTestBench(t)
	w.controls.ktX.submit("-0.1")
	w.controls.ktY.submit("0.1")
	w.controls.ktTau.submit("10")
	w.controls.useKT()
	res := current(t, w)
	if got := w.ctl.Study().Elements[0].Section.Spec; got != "kt:-0.1,0.1,10" {
		t.Errorf("section is %q", got)
	}
	if w.controls.naca.Text != "" {
		t.Errorf("NACA entry still says %q for a Kármán–Trefftz section", w.controls.naca.Text)
	}
	// A centre right of the origin is not a section: message, no change.
	w.controls.ktX.submit("0.2")
	w.controls.useKT()
	if w.controls.ktMsg.Hidden {
		t.Error("invalid Kármán–Trefftz centre shows no message")
	}
	if got := w.ctl.Study().Elements[0].Section.Spec; got != "kt:-0.1,0.1,10" {
		t.Errorf("invalid parameters changed the section to %q", got)
	}
	if r := current(t, w); r != res {
		t.Error("invalid parameters triggered a solve")
	}
}

// flapCoordinates is an invented 17-point section with a blunt trailing
// edge, in the common "name line, then x y rows" layout.
const flapCoordinates = `Invented test flap
1.0000 0.0013
0.9000 0.0200
0.7000 0.0500
0.5000 0.0700
0.3000 0.0800
0.1500 0.0700
0.0500 0.0450
0.0100 0.0200
0.0000 0.0000
0.0100 -0.0150
0.0500 -0.0250
0.1500 -0.0300
0.3000 -0.0280
0.5000 -0.0200
0.7000 -0.0120
0.9000 -0.0040
1.0000 -0.0013
`

func TestOpenSectionFile(t *testing.T) {
	w := newTestBench(t)
	dir := t.TempDir()
	good := filepath.Join(dir, "flap.dat")
	bad := filepath.Join(dir, "junk.dat")
	if err := os.WriteFile(good, []byte(flapCoordinates), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(bad, []byte("no numbers here\nat all\n"), 0o644); err != nil {
		t.Fatal(err)
	}

	w.loadSectionFile(good)
	res := current(t, w)
	src := w.ctl.Study().Elements[0].Section
	if src.Embedded == nil {
		t.Fatalf("section source %v is not embedded", src)
	}
	if got, want := panelCount(res), w.ctl.Study().Panelling.Panels; got != want {
		t.Errorf("file section solved with %d panels, want %d", got, want)
	}
	if w.controls.naca.Text != "" {
		t.Errorf("NACA entry says %q for a file section", w.controls.naca.Text)
	}
	if r := w.ctl.Reports()[0]; r == nil || r.String() == "" {
		t.Error("no cleaning report for a file section")
	}

	before := encoded(t, w.ctl.Study())
	w.controls.sourceError(nil)
	w.loadSectionFile(bad)
	if w.controls.sourceMsg.Hidden {
		t.Error("an unreadable file shows no message")
	}
	if encoded(t, w.ctl.Study()) != before {
		t.Error("an unreadable file changed the study")
	}
}

func TestGroundAndInverted(t *testing.T) {
	w := newTestBench(t)
	free := current(t, w)
	w.controls.clearance.submit("60")
	w.controls.ground.SetChecked(true)
	res := current(t, w)
	if g := w.ctl.Study().Ground; !g.Enabled || g.ClearanceMM != 60 {
		t.Fatalf("ground is %+v", g)
	}
	if !res.Layout.Ground || !res.Config.Ground {
		t.Error("the result was not solved in ground effect")
	}
	// The free-air sweep no longer holds; in ground effect the polar runs
	// again by itself, as in free air.
	w.WaitIdle()
	if len(w.ctl.Sweep()) != 17 {
		t.Errorf("ground-effect sweep has %d angles, want 17 (%s)", len(w.ctl.Sweep()), w.controls.sweepMsg.Text)
	}
	if pv := w.views[viewPolar]; !pv.note.Hidden || pv.canvas.Figure() == nil {
		t.Error("the polar shows no figure after the sweep ran")
	}
	res = current(t, w)
	// Image-method trend (docs/validation.md §5, Zerihan & Zhang 2000): an
	// inverted wing near the ground makes more downforce in potential flow.
	if !(res.Solution.Cl < free.Solution.Cl) {
		t.Errorf("Cl %g in ground effect is not below %g in free air", res.Solution.Cl, free.Solution.Cl)
	}
	w.controls.inverted.SetChecked(false)
	up := current(t, w)
	if w.ctl.Study().Inverted || up.Layout.Inverted {
		t.Error("upright mounting not applied")
	}
	if !(up.Solution.Cl > 0) {
		t.Errorf("upright cambered section at 4° has Cl %g, want positive", up.Solution.Cl)
	}
	w.controls.clearance.submit("-5")
	if w.controls.flowMsg.Hidden {
		t.Error("a negative clearance shows no message")
	}
	if w.ctl.Study().Ground.ClearanceMM != 60 {
		t.Error("a rejected clearance changed the study")
	}
}

func TestSecondElementEdits(t *testing.T) {
	test.NewTempApp(t)
	st := model.NewStudy()
	st.Name = "Two elements (invented)"
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 100, XMM: 300, YMM: 40, AngleDeg: -10,
	})
	b, err := st.Encode()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "two.json")
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	w := openTestBench(t, path)
	if got := len(current(t, w).Solution.Elements); got != 2 {
		t.Fatalf("solution has %d elements, want 2", got)
	}
	if w.controls.element.Hidden || len(w.controls.element.Options) != 2 {
		t.Fatal("element choice not offered for two elements")
	}
	w.controls.element.SetSelectedIndex(1)
	w.controls.naca.submit("0012")
	current(t, w)
	els := w.ctl.Study().Elements
	if els[1].Section.Spec != "naca:0012" || els[0].Section.Spec != "naca:4412" {
		t.Errorf("sections are %q, %q; want naca:4412, naca:0012", els[0].Section.Spec, els[1].Section.Spec)
	}
}

// TestExportCarriesSweepAndDensity: with a boundary-layer sweep and a
// density study run for the current study, the report gets both, the
// sweep table gains Cd, and the figures gain the density study and one
// panel-size chart per element. A density study of another configuration
// is left out.
func TestExportCarriesSweepAndDensity(t *testing.T) {
	w, d := openDensityTest(t)
	w.controls.vc.mode.SetSelected(modeEstimate)
	if err := w.ctl.SetSweep(model.SweepRange{FromDeg: -2, ToDeg: 2, StepDeg: 2}); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	w.controls.runSweep()
	d.panels.SetText("40, 80, 160")
	d.start()
	w.WaitIdle()
	if !d.msg.Hidden {
		t.Fatalf("density run failed: %s", d.msg.Text)
	}
	job, err := w.newReportJob()
	if err != nil {
		t.Fatal(err)
	}
	if n := len(job.result.Sweep); n != 3 || len(job.result.SweepViscous) != n {
		t.Errorf("report sweep has %d angles, %d with the boundary layer; want 3 and 3", n, len(job.result.SweepViscous))
	}
	if job.density == nil || len(job.density.Rows) != 3 {
		t.Errorf("report density study: %+v", job.density)
	}
	dir := t.TempDir()
	tab, err := w.writeSweepTable()(dir)
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dir, tab[0]))
	if err != nil {
		t.Fatal(err)
	}
	body := string(b)
	for strings.HasPrefix(body, "# ") { // CSV metadata
		_, body, _ = strings.Cut(body, "\n")
	}
	if head, _, _ := strings.Cut(body, "\n"); !strings.Contains(head, "cd") && !strings.Contains(head, "Cd") {
		t.Errorf("sweep table header %q has no drag column", head)
	}
	files, err := w.writeFigures("svg")(dir)
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"-density.svg", "-panel-sizes-1.svg"}
	for _, suf := range want {
		found := false
		for _, f := range files {
			found = found || strings.HasSuffix(f, suf)
		}
		if !found {
			t.Errorf("figures %v lack *%s", files, suf)
		}
	}
	if _, err := w.writeReport()(dir); err != nil {
		t.Fatal(err)
	}

	// Another section: the density study no longer holds.
	if err := w.ctl.SetNACA("0012"); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	if job, err := w.newReportJob(); err != nil || job.density != nil {
		t.Errorf("after a section change the report carries a density study (%v)", err)
	}
}
