package ui

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// Size of the density window in Fyne units, and of its control column.
const (
	densityWidth        = 1220
	densityHeight       = 780
	densityControlWidth = 450
)

// The tabs of the density window.
const (
	densityTabConvergence = iota
	densityTabLE
	densityTabSizes
)

// densityWindow runs a density study of the current study and shows its
// table, extrapolations, figures and recommendation, and the panel-size
// chart of the current panelling.
type densityWindow struct {
	w   *Workbench
	win fyne.Window

	panels, nose   *field
	tolCl, tolCp   *field
	panelsMsg      *widget.Label // a plan field's message, beside it
	noseMsg        *widget.Label
	tolMsg         *widget.Label
	noseNote       *widget.Label
	msg            *widget.Label
	run, cancel    *widget.Button
	runRow         *fyne.Container
	progress       *widget.ProgressBar
	caseLabel      *widget.Label
	series         *widget.Select
	extrap         [5][4]*widget.Label // Cl, Cm, min Cp, viscous Cl, viscous Cd × finest, extrapolated, error, order
	extrapName     [5]*widget.Label    // the quantities' names (the viscous rows hidden without the coupled solution)
	recommend      *widget.Label
	recommendWhy   *widget.Label
	use            *widget.Button
	table          *widget.Table
	tabs           *container.AppTabs
	conv, le       *figureBox
	leElement      *widget.Select
	sizes          *panelSizeView
	visible        bool
	running        context.CancelFunc
	gen            int // runs started; a finished run that is not the newest is dropped
	out            *densityOutcome
	runStudy       *model.Study // the study the shown outcome was run for
	seriesIdx      int
	syncedPlan     model.DensityPlan
	syncedPlanSeen bool
}

// openDensity shows the workbench's density window at a tab, making it on
// first use.
func (w *Workbench) openDensity(tab int) {
	if w.density == nil {
		w.density = newDensityWindow(w)
		w.ctl.Subscribe(w.density.studyChanged)
	}
	d := w.density
	d.tabs.SelectIndex(tab)
	d.visible = true
	d.studyChanged()
	d.win.Show()
	d.win.RequestFocus()
}

func newDensityWindow(w *Workbench) *densityWindow {
	d := &densityWindow{w: w}
	d.win = w.app.NewWindow("Density study — Sectionbench")
	d.win.SetCloseIntercept(d.hide)

	// The plan's fields apply as the control column's do: on Enter or
	// leaving, the whole plan checked and stored in the study.
	d.panelsMsg, d.noseMsg, d.tolMsg = message(), message(), message()
	d.panels, d.nose = newField(w, d.panelsMsg, d.applyPlan), newField(w, d.noseMsg, d.applyPlan)
	d.panels.SetPlaceHolder("e.g. 20, 40, 80, 160, 320, 640")
	d.nose.SetPlaceHolder("empty: the study's value")
	d.tolCl, d.tolCp = newField(w, d.tolMsg, d.applyPlan), newField(w, d.tolMsg, d.applyPlan)
	d.noseNote = widget.NewLabel("")
	d.noseNote.Wrapping = fyne.TextWrapWord
	d.noseNote.SizeName = theme.SizeNameCaptionText
	d.msg = message()
	d.run = widget.NewButton("Run density study", d.start)
	d.run.Importance = widget.HighImportance
	d.cancel = widget.NewButton("Cancel", d.stop)
	d.cancel.Hide()
	d.progress = widget.NewProgressBar()
	d.progress.Hide()
	d.runRow = container.NewBorder(nil, nil, nil, d.cancel, d.run)

	d.caseLabel = widget.NewLabel(densityNotRun)
	d.caseLabel.Wrapping = fyne.TextWrapWord
	d.series = widget.NewSelect(nil, func(string) {
		if i := d.series.SelectedIndex(); i >= 0 && i != d.seriesIdx {
			d.seriesIdx = i
			d.showOutcome()
			d.drawLE()
		}
	})
	d.series.Hide()
	grid := []fyne.CanvasObject{widget.NewLabel(""), densityCaption("finest"), densityCaption("extrapolated"), densityCaption("± estimate"), densityCaption("order")}
	for i, q := range []string{"Cl", "Cm", "min Cp", "Cl viscous", "Cd viscous"} {
		d.extrapName[i] = widget.NewLabel(q)
		grid = append(grid, d.extrapName[i])
		for j := range 4 {
			d.extrap[i][j] = widget.NewLabel("—")
			grid = append(grid, d.extrap[i][j])
		}
	}
	d.recommend = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	d.recommendWhy = widget.NewLabel("")
	d.recommendWhy.Wrapping = fyne.TextWrapWord
	d.recommendWhy.SizeName = theme.SizeNameCaptionText
	d.use = widget.NewButton("Use recommended count", d.useRecommended)
	d.use.Importance = widget.HighImportance
	d.use.Disable()

	d.table = widget.NewTableWithHeaders(d.tableSize, func() fyne.CanvasObject {
		return widget.NewLabel("−0.00000")
	}, d.tableCell)
	d.table.ShowHeaderColumn = false
	d.table.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	d.table.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if cols := d.columns(); id.Col >= 0 && id.Col < len(cols) {
			o.(*widget.Label).SetText(cols[id.Col])
		}
	}
	for i, wd := range densityColumnWidths {
		d.table.SetColumnWidth(i, wd)
	}
	for i, wd := range densityViscousWidths {
		d.table.SetColumnWidth(len(densityColumnWidths)+i, wd)
	}

	d.conv = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(420, 320))
	d.le = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(420, 320))
	// Before the first run the figure areas say what to do (they were
	// blank), as the set-up window's do.
	d.conv.setDrawing(nil, densityConvEmptyNote)
	d.le.setDrawing(nil, densityLEEmptyNote)
	d.leElement = widget.NewSelect(nil, func(string) { d.drawLE() })
	d.leElement.Hide()
	d.sizes = newPanelSizeView(w)
	convSplit := container.NewVSplit(d.conv, d.table)
	convSplit.Offset = 0.64
	d.tabs = container.NewAppTabs(
		container.NewTabItem("Convergence", convSplit),
		container.NewTabItem("Leading-edge Cp", container.NewBorder(d.leElement, nil, nil, nil, d.le)),
		container.NewTabItem("Panel sizes", d.sizes.box),
	)
	d.tabs.OnSelected = func(*container.TabItem) { d.sizes.setActive(d.visible && d.tabs.SelectedIndex() == densityTabSizes) }

	plan := container.NewVBox(
		heading("Plan"),
		row("Panel counts", d.panels),
		d.panelsMsg,
		row("Nose clustering", d.nose),
		d.noseMsg,
		d.noseNote,
		container.NewGridWithColumns(2, labelled("Cl within (%)", d.tolCl), labelled("min Cp within (%)", d.tolCp)),
		d.tolMsg,
		d.msg,
		d.runRow,
		d.progress,
		widget.NewSeparator(),
		heading("Result"),
		d.caseLabel,
		d.series,
		container.NewGridWithColumns(5, grid...),
		d.recommend,
		d.recommendWhy,
		d.use,
	)
	// The column scrolls: a long summary (every skipped count with its
	// reason) made the window taller than the screen, its Use button and
	// caution off it.
	side := container.NewPadded(container.NewStack(widthOf(densityControlWidth), container.NewVScroll(plan)))
	note := widget.NewLabelWithStyle(cautionShort+"; a converged count is converged for this method, not for the real flow.", fyne.TextAlignTrailing, fyne.TextStyle{Italic: true})
	content := container.NewBorder(nil, note, side, nil, d.tabs)
	d.win.SetContent(content)
	d.win.Resize(fyne.NewSize(densityWidth, densityHeight))
	// Figures follow a change of the theme variant.
	w.app.Settings().AddListener(func(fyne.Settings) {
		w.do(func() {
			d.conv.redraw()
			d.le.redraw()
			d.sizes.fig.redraw()
		})
	})
	return d
}

// Columns of the density table: the panel method's, then, when the study
// solves the coupled viscous solution, its Cl and Cd at each count (the
// command line's density table has them; the window showed only their
// finest values, and not how they moved with the count).
var (
	densityColumns       = []string{"panels", "nose", "Cl", "ΔCl", "Cm", "min Cp", "Δ min Cp"}
	densityColumnWidths  = []float32{76, 52, 76, 84, 70, 70, 84}
	densityViscous       = []string{"Cl viscous", "Cd viscous"}
	densityViscousWidths = []float32{120, 120}
)

// columns returns the table's columns for the outcome shown.
func (d *densityWindow) columns() []string {
	if d.out != nil && d.out.res.Viscous {
		return append(slices.Clip(densityColumns), densityViscous...)
	}
	return densityColumns
}

// heldMark marks a viscous value of r whose transition is held upstream
// of its e^N position: a trip's answer (the summary says so). A cell
// without an answer ("no answer") gets none.
func heldMark(r *engine.DensityRow) string {
	if r.ViscousHeld {
		return " held"
	}
	return ""
}

func (d *densityWindow) tableSize() (int, int) {
	if d.out == nil {
		return 0, len(densityColumns)
	}
	return len(d.out.res.Rows), len(d.columns())
}

func (d *densityWindow) tableCell(id widget.TableCellID, o fyne.CanvasObject) {
	l := o.(*widget.Label)
	if d.out == nil || id.Row >= len(d.out.res.Rows) {
		l.SetText("")
		return
	}
	r := d.out.res.Rows[id.Row]
	ser := d.out.res.Series[d.seriesIdx]
	rec := r.Nose == ser.Nose && r.Panels == ser.RecommendedPanels
	l.TextStyle = fyne.TextStyle{Bold: rec}
	var s string
	// The viscous Cl and Cd follow the panel method's columns (columns).
	clViscous, cdViscous := len(densityColumns), len(densityColumns)+1
	switch {
	case id.Col == 0:
		s = strconv.Itoa(r.Panels)
		if rec {
			s += " ←"
		}
	case id.Col == 1:
		s = fixed(r.Nose, 2)
	case !r.Solved():
		// The reason is under the table (showOutcome); never NaN here.
		s = map[bool]string{true: "skipped", false: "—"}[id.Col == 2]
	case id.Col == 2:
		s = fixed(r.Cl, 4)
	case id.Col == 3:
		s = signed(r.DCl, 5)
	case id.Col == 4:
		s = fixed(r.Cm, 4)
	case id.Col == 5:
		s = fixed(r.CpMin, 3)
	case id.Col == 6:
		s = signed(r.DCpMin, 4)
	case id.Col == clViscous && math.IsNaN(r.ViscousCl), id.Col == cdViscous && math.IsNaN(r.ViscousCd):
		s = "no answer" // did not converge at this count
	case id.Col == clViscous:
		s = fixed(r.ViscousCl, 4) + heldMark(&r)
	case id.Col == cdViscous:
		s = fixed(r.ViscousCd, 5) + heldMark(&r)
	}
	l.SetText(s)
}

// estimate formats an error estimate to two significant digits.
func estimate(x float64) string {
	if x == 0 {
		return "0"
	}
	s := strconv.FormatFloat(x, 'g', 2, 64)
	return model.Minus(s)
}

// signed formats a change with its sign, "—" when there is none.
func signed(x float64, prec int) string {
	if math.IsNaN(x) {
		return "—"
	}
	s := fixed(x, prec)
	if x >= 0 && !strings.HasPrefix(s, "−") {
		s = "+" + s
	}
	return s
}

// readPlan parses the plan fields. Values equal to the defaults are
// stored as zero values, so that running the defaults leaves a study that
// never had a plan unchanged.
func (d *densityWindow) readPlan() (model.DensityPlan, error) {
	var p model.DensityPlan
	counts, err := parseList(d.panels.Text)
	if err != nil {
		return p, fmt.Errorf("panel counts: %v", err)
	}
	for i, v := range counts {
		n := int(v)
		if float64(n) != v {
			return p, fmt.Errorf("panel counts: %s is not a whole number", entryNum(v))
		}
		if n < model.MinPanels || n > model.MaxPanels {
			return p, fmt.Errorf("panel counts: %d is outside %d..%d", n, model.MinPanels, model.MaxPanels)
		}
		if i > 0 && n <= p.Panels[i-1] {
			return p, errors.New("panel counts must increase from left to right")
		}
		p.Panels = append(p.Panels, n)
	}
	noses, err := parseList(d.nose.Text)
	if err != nil {
		return p, fmt.Errorf("nose clustering: %v", err)
	}
	for _, v := range noses {
		if !(v >= 0 && v <= 1) {
			return p, fmt.Errorf("nose clustering: %s is outside 0..1", entryNum(v))
		}
	}
	p.Nose = noses
	for _, t := range []struct {
		e    *field
		name string
		def  float64
		v    *float64
	}{{d.tolCl, "Cl tolerance", densityDefaultTolCl, &p.TolClPct}, {d.tolCp, "min Cp tolerance", densityDefaultTolCp, &p.TolCpMinPct}} {
		if strings.TrimSpace(t.e.Text) == "" {
			continue
		}
		v, err := parseNumber(t.e.Text)
		if err != nil || !(v > 0 && v <= 100) {
			return p, fmt.Errorf("%s must be a percentage above 0 and at most 100", t.name)
		}
		if v != t.def {
			*t.v = v
		}
	}
	if slices.Equal(p.Panels, densityDefaultPanels) {
		p.Panels = nil
	}
	if err := p.CheckDensityRuns(len(densityDefaultPanels)); err != nil {
		var fe *model.FieldError
		if errors.As(err, &fe) {
			return p, fe.Err
		}
		return p, err
	}
	return p, nil
}

// parseList reads numbers separated by commas or spaces; with a semicolon
// in the text, by semicolons, so that decimal commas can be used.
func parseList(s string) ([]float64, error) {
	sep := func(r rune) bool { return r == ',' || r == ' ' || r == '\t' }
	if strings.ContainsRune(s, ';') {
		sep = func(r rune) bool { return r == ';' }
	}
	var out []float64
	for _, f := range strings.FieldsFunc(s, sep) {
		if strings.TrimSpace(f) == "" {
			continue
		}
		v, err := parseNumber(f)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%q is not a number", strings.TrimSpace(f))
		}
		out = append(out, v)
	}
	return out, nil
}

// syncPlan fills the plan fields from the study's plan when that plan
// changed since the fields were last filled (opened, undone), leaving the
// user's typing alone otherwise.
func (d *densityWindow) syncPlan(st *model.Study) {
	if d.syncedPlanSeen && session.DensityPlansEqual(d.syncedPlan, st.Density) {
		return
	}
	d.syncedPlan, d.syncedPlanSeen = st.Density, true
	p := st.Density
	counts := p.Panels
	if len(counts) == 0 {
		counts = densityDefaultPanels
	}
	cs := make([]string, len(counts))
	for i, n := range counts {
		cs[i] = strconv.Itoa(n)
	}
	d.panels.show(strings.Join(cs, ", "), nil)
	ns := make([]string, len(p.Nose))
	for i, v := range p.Nose {
		ns[i] = entryNum(v)
	}
	d.nose.show(strings.Join(ns, ", "), nil)
	tol := func(v, def float64) string {
		if v == 0 {
			v = def
		}
		return entryNum(v)
	}
	d.tolCl.show(tol(p.TolClPct, densityDefaultTolCl), nil)
	d.tolCp.show(tol(p.TolCpMinPct, densityDefaultTolCp), nil)
}

// applyPlan checks the plan the fields show (the one being committed with
// its new text, the others with their values in use) and stores it in the
// study, an undoable edit; the error names what is wrong.
func (d *densityWindow) applyPlan(string) error {
	plan, err := d.readPlan()
	if err != nil {
		return err
	}
	prev, seen := d.syncedPlan, d.syncedPlanSeen
	d.syncedPlan, d.syncedPlanSeen = plan, true // the fields already show it
	if err := d.w.ctl.SetDensityPlan(plan); err != nil {
		d.syncedPlan, d.syncedPlanSeen = prev, seen
		return err
	}
	return nil
}

// studyChanged follows the study: the plan fields, the nose note, whether
// the shown outcome still holds, and the panel sizes.
func (d *densityWindow) studyChanged() {
	st := d.w.ctl.Current()
	if st == nil {
		return
	}
	d.syncPlan(st)
	if st.Panelling.Spacing == model.SpacingBlend {
		d.noseNote.SetText(fmt.Sprintf("Several values compare nose clusterings (e.g. 0.2, 0.5, 0.8); empty runs the study's %s.", fixed(st.Panelling.Nose, 2)))
	} else {
		// The rule the command line refuses with, in the same words.
		rule := model.ErrNoseNeedsBlend.Error()
		d.noseNote.SetText(fmt.Sprintf("%s%s; this study uses %s spacing, so every nose value gives the same panels.", strings.ToUpper(rule[:1]), rule[1:], st.Panelling.Spacing))
	}
	d.showOutcome()
	if d.visible {
		d.relayout()
	}
	d.sizes.setActive(d.visible && d.tabs.SelectedIndex() == densityTabSizes)
	d.sizes.studyChanged()
}

// start stores the plan in the study and runs it on a goroutine.
// What the density window's result says before its first study and while
// that runs.
const (
	densityConvEmptyNote = "Press Run density study: Cl and min Cp against the panel count are drawn here, with the recommended count marked."
	densityLEEmptyNote   = "Press Run density study: the Cp near the leading edge at each panel count is drawn here."
	densityNotRun        = "Not run yet. The study runs at the current angle of attack, re-panelling every element at each count."
	densityRunning       = "Running at α = %s°: the results appear when every count is solved."
)

func (d *densityWindow) start() {
	plan, err := d.readPlan()
	if err != nil {
		d.setMsg(err)
		return
	}
	ctl := d.w.ctl
	if err := ctl.SetDensityPlan(plan); err != nil {
		d.setMsg(err)
		return
	}
	d.syncedPlan, d.syncedPlanSeen = plan, true
	d.setMsg(nil)
	d.stop()
	st, secs := ctl.Study(), ctl.Sections()
	ctx, cancel := context.WithCancel(context.Background())
	d.running = cancel
	d.gen++
	gen := d.gen
	d.run.Disable()
	d.cancel.Show()
	d.progress.SetValue(0)
	d.progress.Show()
	if d.out == nil {
		d.caseLabel.SetText(fmt.Sprintf(densityRunning, num(st.Flow.AlphaDeg)))
	}
	d.relayout()
	ctl.Activity().Add()
	go func() {
		defer ctl.Activity().Done()
		defer cancel()
		out, err := runDensity(ctx, st, secs, func(done, total int) {
			d.w.do(func() {
				if gen == d.gen {
					d.progress.SetValue(float64(done) / float64(total))
				}
			})
		})
		d.w.do(func() { d.finish(gen, st, out, err) })
	}()
}

// setMsg shows an error under the plan (nil hides it) and lays the
// window out again: a label shown after being hidden needs its container
// laid out anew.
func (d *densityWindow) setMsg(err error) {
	setMessage(d.msg, err)
	d.relayout()
}

// relayout lays the window out again after widgets were shown or hidden.
func (d *densityWindow) relayout() {
	if c := d.win.Content(); c != nil {
		c.Refresh()
	}
}

// hide puts the window away (its close button): the run stops, the
// outcome and plan stay for the next opening.
func (d *densityWindow) hide() {
	d.stop()
	d.visible = false
	d.sizes.setActive(false)
	d.win.Hide()
}

// stop cancels a running density study.
func (d *densityWindow) stop() {
	if d.running != nil {
		d.running()
		d.running = nil
	}
}

func (d *densityWindow) finish(gen int, st *model.Study, out *densityOutcome, err error) {
	if gen != d.gen {
		return // a newer run was started
	}
	d.running = nil
	d.run.Enable()
	d.cancel.Hide()
	d.progress.Hide()
	d.relayout()
	if d.out == nil {
		d.caseLabel.SetText(densityNotRun)
	}
	if errors.Is(err, context.Canceled) {
		d.setMsg(errors.New("density study cancelled; the table keeps the last complete study"))
		return
	}
	if err != nil {
		// Keep the solver's context (which count failed) that friendly
		// would drop for the field's own message.
		msg := firstLine(err.Error())
		d.setMsg(errors.New(strings.ToUpper(msg[:1]) + msg[1:]))
		return
	}
	d.out, d.runStudy = out, st
	d.seriesIdx = 0
	names := make([]string, len(out.res.Series))
	for i, s := range out.res.Series {
		names[i] = "nose " + fixed(s.Nose, 2)
	}
	d.series.SetOptions(names)
	d.series.SetSelectedIndex(0)
	if len(names) > 1 {
		d.series.Show()
	} else {
		d.series.Hide()
	}
	els := make([]string, len(st.Elements))
	for i, e := range st.Elements {
		els[i] = e.Name
	}
	d.leElement.SetOptions(els)
	d.leElement.SetSelectedIndex(0)
	if len(els) > 1 {
		d.leElement.Show()
	} else {
		d.leElement.Hide()
	}
	d.showOutcome()
	d.relayout()
	res := out.res
	d.conv.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderDensity(res, dark, w, h, dpi)
	}, "")
	d.drawLE()
}

// fresh reports whether the shown outcome holds for the current study.
func (d *densityWindow) fresh() bool {
	return d.out != nil && session.SameDensityCase(d.runStudy, d.w.ctl.Current())
}

// showOutcome fills the summary, extrapolations, recommendation and table.
func (d *densityWindow) showOutcome() {
	if d.out == nil {
		return
	}
	res, st := d.out.res, d.runStudy
	if d.seriesIdx >= len(res.Series) {
		d.seriesIdx = 0
	}
	ser := res.Series[d.seriesIdx]
	text := fmt.Sprintf("%s at α = %s°, %d solves.", st.Name, num(st.Flow.AlphaDeg), len(res.Rows))
	var skipped []string
	for _, r := range res.Rows {
		if !r.Solved() {
			skipped = append(skipped, fmt.Sprintf("%d panels (nose %s): %s", r.Panels, fixed(r.Nose, 2), firstLine(report.SkipReason(r))))
		}
	}
	if n := len(skipped); n > 0 {
		text += fmt.Sprintf(" %d count%s skipped: %s.", n, plural(n), strings.Join(skipped, "; "))
	}
	var held []int
	for _, r := range res.Rows {
		if r.Nose == ser.Nose && r.Solved() && r.ViscousHeld && !math.IsNaN(r.ViscousCl) {
			held = append(held, r.Panels)
		}
	}
	if w := report.HeldWords(held); w != "" {
		text += " " + w
	}
	fresh := d.fresh()
	if !fresh {
		text += " The study has changed since (other than its panelling): run it again."
		d.caseLabel.Importance = widget.WarningImportance
	} else {
		d.caseLabel.Importance = widget.MediumImportance
	}
	d.caseLabel.SetText(text)
	last := res.Rows[len(res.Rows)-1]
	for _, r := range res.Rows {
		if r.Nose == ser.Nose && r.Solved() {
			last = r
		}
	}
	lastViscous := last
	for _, r := range res.Rows {
		if r.Nose == ser.Nose && r.Solved() && !math.IsNaN(r.ViscousCl) {
			lastViscous = r
		}
	}
	for i := 3; i < len(d.extrap); i++ {
		// The coupled solution's rows, shown when each count solved it.
		show := func(o fyne.CanvasObject) {
			if res.Viscous {
				o.Show()
			} else {
				o.Hide()
			}
		}
		show(d.extrapName[i])
		for _, l := range d.extrap[i] {
			show(l)
		}
	}
	for i, q := range []struct {
		ex     engine.Extrapolation
		finest float64
		prec   int
	}{{ser.Cl, last.Cl, 4}, {ser.Cm, last.Cm, 4}, {ser.CpMin, last.CpMin, 3}, {ser.ViscousCl, lastViscous.ViscousCl, 4}, {ser.ViscousCd, lastViscous.ViscousCd, 5}} {
		l := d.extrap[i]
		l[0].SetText(fixed(q.finest, q.prec))
		switch {
		case !q.ex.OK:
			l[1].SetText("—")
			l[2].SetText("—")
			l[3].SetText("not monotone")
		case math.IsNaN(q.ex.ObservedOrder):
			l[1].SetText(fixed(q.ex.Value, q.prec))
			l[2].SetText(estimate(q.ex.ErrorEstimate))
			l[3].SetText("converged")
		default:
			l[1].SetText(fixed(q.ex.Value, q.prec))
			l[2].SetText(estimate(q.ex.ErrorEstimate))
			l[3].SetText(fixed(q.ex.ObservedOrder, 2))
		}
	}
	tolCl, tolCp := planTolerances(st.Density)
	cur := d.w.ctl.Current().Panelling
	if ser.RecommendedPanels == 0 {
		d.recommend.SetText("No count recommended")
		d.recommendWhy.SetText(fmt.Sprintf("No count keeps Cl within %s %% and min Cp within %s %% of the extrapolated values (or Cl does not converge monotonically): add finer counts.", num(tolCl), num(tolCp)))
		d.use.SetText("Use recommended count")
		d.use.Disable()
	} else {
		d.recommend.SetText(fmt.Sprintf("Recommended: %d panels", ser.RecommendedPanels))
		why := fmt.Sprintf("The fewest for which this and every finer count keep Cl within %s %% and min Cp within %s %% of their extrapolated values.", num(tolCl), num(tolCp))
		if res.Viscous {
			why += " It judges the panel method's (inviscid) Cl and min Cp only: check in the table that the viscous Cl and Cd have settled at that count."
		}
		d.recommendWhy.SetText(why)
		label := fmt.Sprintf("Use %d panels", ser.RecommendedPanels)
		if ser.Nose != cur.Nose {
			label += ", nose " + fixed(ser.Nose, 2)
		}
		d.use.SetText(label)
		if fresh && (cur.Panels != ser.RecommendedPanels || cur.Nose != ser.Nose) {
			d.use.Enable()
		} else {
			d.use.Disable()
		}
	}
	d.table.Refresh()
}

// planTolerances returns the plan's tolerances with the defaults filled in.
func planTolerances(p model.DensityPlan) (cl, cp float64) {
	cl, cp = p.TolClPct, p.TolCpMinPct
	if cl == 0 {
		cl = densityDefaultTolCl
	}
	if cp == 0 {
		cp = densityDefaultTolCp
	}
	return cl, cp
}

// useRecommended sets the study's panel count (and nose clustering) to the
// recommendation of the selected series: an undoable change.
func (d *densityWindow) useRecommended() {
	if d.out == nil || !d.fresh() {
		return
	}
	ser := d.out.res.Series[d.seriesIdx]
	if ser.RecommendedPanels == 0 {
		return
	}
	d.setMsg(d.w.ctl.UseDensityPanels(ser.RecommendedPanels, ser.Nose))
}

// drawLE draws the leading-edge overlay of the selected series and element.
func (d *densityWindow) drawLE() {
	if d.out == nil {
		return
	}
	nose := d.out.res.Series[d.seriesIdx].Nose
	var curves []figures.DensityCurve
	for _, c := range d.out.curves {
		if c.Nose == nose {
			curves = append(curves, c)
		}
	}
	el := max(d.leElement.SelectedIndex(), 0)
	d.le.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderDensityLE(curves, el, dark, w, h, dpi)
	}, "")
}

// densityCaption is a small column heading.
func densityCaption(s string) *widget.Label {
	l := widget.NewLabel(s)
	l.SizeName = theme.SizeNameCaptionText
	return l
}
