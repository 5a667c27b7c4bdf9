package ui

import (
	"context"
	"math"
	"reflect"
	"strings"
	"testing"

	"fyne.io/fyne/v2/widget"

	"sectionbench/solver/engine"
)

func TestParseList(t *testing.T) {
	for _, c := range []struct {
		in   string
		want []float64
		bad  bool
	}{
		{"20, 40, 80", []float64{20, 40, 80}, false},
		{"20 40\t80", []float64{20, 40, 80}, false},
		{"0,2; 0,5", []float64{0.2, 0.5}, false},
		{"", nil, false},
		{"20, forty", nil, true},
		{"NaN", nil, true},
		{"1e400", nil, true},
	} {
		got, err := parseList(c.in)
		if (err != nil) != c.bad {
			t.Errorf("%q: error %v, want error %v", c.in, err, c.bad)
			continue
		}
		if !c.bad && !reflect.DeepEqual(got, c.want) {
			t.Errorf("%q: %v, want %v", c.in, got, c.want)
		}
	}
}

// TestRunDensityMatchesEngine: the window's density study, which keeps the
// solutions for the overlay, gives the rows and judgement of
// solver.(*Engine).Density exactly.
func TestRunDensityMatchesEngine(t *testing.T) {
	w := newTestBench(t)
	st := w.ctl.Study()
	st.Density.Panels = []int{40, 80, 160}
	secs := w.ctl.Sections()
	want, err := engine.NewEngine().Density(context.Background(), st, secs, nil)
	if err != nil {
		t.Fatal(err)
	}
	got, err := runDensity(context.Background(), st, secs, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(rowsNoNaN(got.res.Rows), rowsNoNaN(want.Rows)) || got.res.RecommendedPanels != want.RecommendedPanels {
		t.Errorf("rows differ from Engine.Density:\n%+v\nwant\n%+v", got.res.Rows, want.Rows)
	}
	if len(got.curves) != 3 || got.curves[2].Panels != 160 || len(got.curves[2].Solution.Elements[0].Panels) != 160 {
		t.Errorf("kept %d solutions, want one per count", len(got.curves))
	}
}

// rowsNoNaN replaces every NaN float field of the rows (the changes of
// first rows, the viscous fields of an inviscid study, …) by −1 so that
// rows compare equal; by reflection, so a new field needs no entry here.
func rowsNoNaN(rows []engine.DensityRow) []engine.DensityRow {
	out := append([]engine.DensityRow(nil), rows...)
	for i := range out {
		v := reflect.ValueOf(&out[i]).Elem()
		for j := 0; j < v.NumField(); j++ {
			if f := v.Field(j); f.Kind() == reflect.Float64 && math.IsNaN(f.Float()) {
				f.SetFloat(-1)
			}
		}
	}
	return out
}

func openDensityTest(t *testing.T) (*Workbench, *densityWindow) {
	t.Helper()
	w := newTestBench(t)
	w.openDensity(densityTabConvergence)
	w.WaitIdle()
	return w, w.density
}

func TestDensityWindowRun(t *testing.T) {
	w, d := openDensityTest(t)
	if got := d.panels.Text; got != "20, 40, 80, 160, 320, 640" {
		t.Errorf("panel counts start as %q, want the solver's defaults", got)
	}
	before := encoded(t, w.ctl.Study())
	d.panels.SetText("40, 80, 160, 320")
	d.start()
	w.WaitIdle()
	if !d.msg.Hidden {
		t.Fatalf("run failed: %s", d.msg.Text)
	}
	if got := w.ctl.Study().Density.Panels; !reflect.DeepEqual(got, []int{40, 80, 160, 320}) {
		t.Errorf("study's plan has counts %v", got)
	}
	if !w.ctl.Dirty() {
		t.Error("storing the plan did not mark the study unsaved")
	}
	if rows, _ := d.tableSize(); rows != 4 {
		t.Errorf("table has %d rows, want 4", rows)
	}
	d.tabs.SelectIndex(densityTabLE)
	w.WaitIdle()
	if d.conv.Figure() == nil || d.le.Figure() == nil {
		t.Errorf("figures missing: convergence %v (%v), leading edge %v (%v)", d.conv.Figure() != nil, d.conv.err, d.le.Figure() != nil, d.le.err)
	}
	if d.extrap[0][1].Text == "—" && d.extrap[0][3].Text != "not monotone" {
		t.Errorf("Cl engine.Extrapolation shows %q, order %q", d.extrap[0][1].Text, d.extrap[0][3].Text)
	}
	ser := d.out.res.Series[0]
	if ser.RecommendedPanels == 0 {
		t.Fatalf("no recommendation for the demo at 40–320 panels: %s", d.recommendWhy.Text)
	}
	if d.use.Disabled() && ser.RecommendedPanels != w.ctl.Study().Panelling.Panels {
		t.Fatal("Use button disabled with a recommendation that differs from the study")
	}
	if !strings.Contains(d.use.Text, "Use ") {
		t.Errorf("button says %q", d.use.Text)
	}
	if ser.RecommendedPanels != w.ctl.Study().Panelling.Panels {
		d.useRecommended()
		res := current(t, w)
		if got := w.ctl.Study().Panelling.Panels; got != ser.RecommendedPanels {
			t.Errorf("study has %d panels after Use, want %d", got, ser.RecommendedPanels)
		}
		if got := panelCount(res); got != ser.RecommendedPanels {
			t.Errorf("result has %d panels after Use, want %d", got, ser.RecommendedPanels)
		}
		if !d.use.Disabled() {
			t.Error("Use stays enabled once the study uses the count")
		}
		if !w.ctl.Undo() {
			t.Fatal("Use was not an undoable change")
		}
	}
	// Undoing the plan brings the default fields back.
	w.ctl.Undo()
	w.WaitIdle()
	if got := encoded(t, w.ctl.Study()); got != before {
		t.Error("undo did not return to the study before the density study")
	}
	if got := d.panels.Text; got != "20, 40, 80, 160, 320, 640" {
		t.Errorf("after undo the counts say %q", got)
	}
	// A change of the configuration makes the outcome stale.
	w.controls.alphaEntry.submit("1")
	w.WaitIdle()
	if d.fresh() || !d.use.Disabled() || !strings.Contains(d.caseLabel.Text, "run it again") {
		t.Error("an angle change left the density outcome current")
	}
}

func TestDensityWindowRejectsBadPlans(t *testing.T) {
	w, d := openDensityTest(t)
	before := encoded(t, w.ctl.Study())
	for _, c := range []struct{ panels, nose, tol string }{
		{"40, 20", "", "0.5"},
		{"10, 20, 40", "", "0.5"},
		{"40, 80.5", "", "0.5"},
		{"40, 80, 160", "1.5", "0.5"},
		{"40, 80, 160", "", "-1"},
		{"40, 80, 160", "", "abc"},
		{"40, 80, 160", "NaN", "0.5"},
		{"20, 40, 80, 160, 320, 640, 1280", "0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9", "0.5"},
	} {
		d.panels.SetText(c.panels)
		d.nose.SetText(c.nose)
		d.tolCl.SetText(c.tol)
		d.start()
		w.WaitIdle()
		if d.msg.Hidden {
			t.Errorf("plan %+v shows no message", c)
		}
		if d.running != nil {
			t.Errorf("plan %+v started a run", c)
		}
	}
	if got := encoded(t, w.ctl.Study()); got != before {
		t.Error("a rejected plan changed the study")
	}
}

func TestDensityCancel(t *testing.T) {
	w, d := openDensityTest(t)
	d.start()
	d.stop()
	w.WaitIdle()
	if d.cancel.Visible() || d.run.Disabled() || d.progress.Visible() {
		t.Error("controls not restored after a cancelled run")
	}
	if d.out == nil && !strings.Contains(d.msg.Text, "cancelled") {
		t.Errorf("cancelled run says %q", d.msg.Text)
	}
}

func TestPanelSizesFollowStudy(t *testing.T) {
	w := newTestBench(t)
	w.openDensity(densityTabSizes)
	w.WaitIdle()
	d := w.density
	check := func(want int) {
		t.Helper()
		got, err := d.sizes.shownPanels()
		if err != nil {
			t.Fatal(err)
		}
		for i, n := range got {
			if n != want {
				t.Errorf("element %d shows %d panels, study has %d", i, n, want)
			}
		}
		if d.sizes.fig.Figure() == nil {
			t.Errorf("no panel-size figure (%v)", d.sizes.fig.err)
		}
	}
	check(w.ctl.Study().Panelling.Panels)
	w.controls.panelEntry.submit("48")
	w.WaitIdle()
	check(48)
	// Uniform spacing on a smooth section keeps neighbours alike; the
	// warning clears (property of equal arc-length steps).
	w.controls.spacing.SetSelected("uniform")
	w.WaitIdle()
	if d.sizes.warn.Importance != widget.SuccessImportance {
		t.Errorf("uniform spacing warns: %s", d.sizes.warn.Text)
	}
	d.sizes.ratio.SetText("0.5")
	if d.sizes.msg.Hidden {
		t.Error("a ratio limit below 1 shows no message")
	}
}

// TestDensitySkippedRows: a count the configuration cannot be solved at
// (the two-element wing's slot narrower than 20 panels resolve) shows as
// skipped with its reason, never as NaN.
func TestDensitySkippedRows(t *testing.T) {
	w := openRearWing(t)
	w.openDensity(densityTabConvergence)
	w.WaitIdle()
	d := w.density
	d.panels.SetText("20, 40, 80, 160")
	d.start()
	if !strings.HasPrefix(d.caseLabel.Text, "Running at α") {
		t.Errorf("while the first study runs the summary says %q", d.caseLabel.Text)
	}
	w.WaitIdle()
	rows, cols := d.tableSize()
	skipped := 0
	for r := range rows {
		for c := range cols {
			l := d.table.CreateCell().(*widget.Label)
			d.tableCell(widget.TableCellID{Row: r, Col: c}, l)
			if strings.Contains(l.Text, "NaN") {
				t.Errorf("row %d column %d shows %q", r, c, l.Text)
			}
			if c == 2 && l.Text == "skipped" {
				skipped++
			}
		}
	}
	if skipped == 0 {
		t.Fatalf("no row skipped at 20 panels (%s)", d.caseLabel.Text)
	}
	if !strings.Contains(d.caseLabel.Text, "skipped: 20 panels") || !strings.Contains(d.caseLabel.Text, "gap too small") {
		t.Errorf("summary %q does not give the skipped count and its reason", d.caseLabel.Text)
	}
	if strings.Contains(d.caseLabel.Text, "density study at") {
		t.Errorf("summary %q gives the count twice", d.caseLabel.Text)
	}
	// The summary scrolls in its column: it made the window taller than
	// its size and the screen.
	if h := d.win.Content().MinSize().Height; h > densityHeight {
		t.Errorf("the window needs %g high, more than its %d", h, densityHeight)
	}
}

// TestDensityFieldsApplyOnCommit: the density window's plan fields behave
// as the control column's: typing applies nothing; Enter applies a plan
// that can be used (stored in the study, undoable); a bad one shows its
// message beside its field, leaves the study alone and, when the field is
// left, the field returns to the value in use.
func TestDensityFieldsApplyOnCommit(t *testing.T) {
	w, d := openDensityTest(t)
	const start = "20, 40, 80, 160, 320, 640"
	d.panels.SetText("40, 80")
	if w.ctl.Study().Density.Panels != nil {
		t.Fatal("typing applied the counts")
	}
	d.panels.submit("40, 80, 160")
	if got := w.ctl.Study().Density.Panels; !reflect.DeepEqual(got, []int{40, 80, 160}) {
		t.Errorf("Enter stored counts %v, want [40 80 160]", got)
	}
	if !d.panelsMsg.Hidden {
		t.Errorf("a good plan shows %q", d.panelsMsg.Text)
	}
	before := encoded(t, w.ctl.Study())
	cases := []struct {
		name string
		f    *field
		msg  func() *widget.Label
		text string
	}{
		{"counts not increasing", d.panels, func() *widget.Label { return d.panelsMsg }, "80, 40"},
		{"nose outside 0..1", d.nose, func() *widget.Label { return d.noseMsg }, "1.5"},
		{"tolerance not a percentage", d.tolCl, func() *widget.Label { return d.tolMsg }, "-1"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			inUse := c.f.Text
			c.f.submit(c.text)
			if c.msg().Hidden {
				t.Error("no message beside the field")
			}
			if encoded(t, w.ctl.Study()) != before {
				t.Error("a bad plan changed the study")
			}
			if c.f.Text != c.text {
				t.Errorf("the field shows %q before it is left, want the text typed", c.f.Text)
			}
			c.f.FocusLost()
			if c.f.Text != inUse {
				t.Errorf("left, the field shows %q, want the value in use %q", c.f.Text, inUse)
			}
			if c.msg().Hidden {
				t.Error("leaving hid the message")
			}
		})
	}
	w.ctl.Undo()
	w.WaitIdle()
	if got := d.panels.Text; got != start {
		t.Errorf("after undo the counts show %q, want %q", got, start)
	}
}

// TestDensityViscousColumns: with the coupled viscous solution on (the
// demo as the app opens it) the density table gives the viscous Cl and
// Cd at each count beside the panel method's, as the command line's
// table does (the window gave only their finest values), and the
// recommendation says it judges the panel method only.
func TestDensityViscousColumns(t *testing.T) {
	w := newDemoBench(t)
	w.openDensity(densityTabConvergence)
	w.WaitIdle()
	d := w.density
	d.panels.SetText("40, 80, 160")
	d.start()
	w.WaitIdle()
	if !d.msg.Hidden || d.out == nil || !d.out.res.Viscous {
		t.Fatalf("run: %q, outcome %v", d.msg.Text, d.out)
	}
	rows, cols := d.tableSize()
	if got := d.columns(); cols != 9 || got[7] != "Cl viscous" || got[8] != "Cd viscous" {
		t.Fatalf("columns %q (%d), want the viscous Cl and Cd after the panel method's", got, cols)
	}
	for r := range rows {
		row := d.out.res.Rows[r]
		for c, want := range map[int]string{7: fixed(row.ViscousCl, 4), 8: fixed(row.ViscousCd, 5)} {
			if math.IsNaN(row.ViscousCl) {
				want = "no answer"
			}
			l := d.table.CreateCell().(*widget.Label)
			d.tableCell(widget.TableCellID{Row: r, Col: c}, l)
			if l.Text != want {
				t.Errorf("%d panels, column %d: %q, want %q", row.Panels, c, l.Text, want)
			}
		}
	}
	// 40, 80 and 160 panels recommend one (the demo's Cl settles), so
	// the words are there to check.
	if d.out.res.Series[0].RecommendedPanels == 0 {
		t.Fatalf("no count recommended: %q", d.recommendWhy.Text)
	}
	if !strings.Contains(d.recommendWhy.Text, "panel method's (inviscid) Cl and min Cp only") {
		t.Errorf("recommendation %q does not say it judges the panel method only", d.recommendWhy.Text)
	}
}

// TestDensityHeldMarked: a count whose coupled solution holds transition
// upstream of its e^N position is marked held in the table and said in
// the summary (a hand-typed NACA 2412 at 4° showed −0.6993 at 320 panels
// and −0.6740 at 640, a tripped wing's answer, unmarked). Invented rows.
func TestDensityHeldMarked(t *testing.T) {
	w, d := openDensityTest(t)
	nan := math.NaN()
	res := &engine.DensityResult{Viscous: true, Series: []engine.DensitySeries{{Nose: 0.5, RecommendedPanels: 320}}}
	for _, n := range []int{160, 320, 640} {
		res.Rows = append(res.Rows, engine.DensityRow{Panels: n, Nose: 0.5, Cl: -0.7439, CpMin: -1.44, DCl: nan, DCm: nan, DCpMin: nan,
			ViscousCl: -0.6998, ViscousCd: 0.0092, ViscousTransitionUpper: nan, ViscousTransitionLower: 0.45, ViscousHeld: n == 640})
	}
	d.out, d.runStudy = &densityOutcome{res: res}, w.ctl.Current()
	d.showOutcome()
	for r, want := range []bool{false, false, true} {
		l := d.table.CreateCell().(*widget.Label)
		d.tableCell(widget.TableCellID{Row: r, Col: 7}, l)
		if got := strings.HasSuffix(l.Text, " held"); got != want {
			t.Errorf("%d panels: viscous Cl %q, held mark %v, want %v", res.Rows[r].Panels, l.Text, got, want)
		}
	}
	// A held count without a drag gives no answer there, unmarked.
	res.Rows[2].ViscousCd = nan
	l := d.table.CreateCell().(*widget.Label)
	d.tableCell(widget.TableCellID{Row: 2, Col: 8}, l)
	if l.Text != "no answer" {
		t.Errorf("640 panels without a viscous Cd: %q, want \"no answer\"", l.Text)
	}
	res.Rows[2].ViscousCd = 0.0092
	if !strings.Contains(d.caseLabel.Text, "At 640 panels the viscous solution holds transition upstream") {
		t.Errorf("summary %q does not say 640 panels is held", d.caseLabel.Text)
	}
}

// TestDensityEmptyFiguresSay: before the first run the density window's
// figure areas say what to do and what is drawn there (they were blank),
// and the notes go once a study has run.
func TestDensityEmptyFiguresSay(t *testing.T) {
	w, d := openDensityTest(t)
	for name, c := range map[string]struct {
		b    *figureBox
		want string
	}{"convergence": {d.conv, densityConvEmptyNote}, "leading edge": {d.le, densityLEEmptyNote}} {
		if c.b.note.Hidden || c.b.note.Text != c.want {
			t.Errorf("%s figure before a run: note %q (hidden %v), want %q", name, c.b.note.Text, c.b.note.Hidden, c.want)
		}
	}
	d.panels.SetText("40, 80, 160")
	d.start()
	w.WaitIdle()
	if !d.conv.note.Hidden {
		t.Errorf("after a run the convergence figure still says %q", d.conv.note.Text)
	}
}
