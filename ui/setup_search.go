package ui

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// searchVariables is how many variables the search tab offers at once.
const searchVariables = 3

// setupSearch is the Setting search tab: up to three bounded variables, an
// objective and constraints; the search runs off the UI goroutine with its
// path streaming in; the best setting beside the start, "apply" as one
// undoable edit, and a pin of the starting point.
type setupSearch struct {
	s       *setupWindow
	content fyne.CanvasObject

	vars      []model.SetupVariable                // offered, in the selects' order
	filled    [searchVariables]model.SetupVariable // the variable each row's bounds were last filled for
	use       [searchVariables]*widget.Check
	pick      [searchVariables]*widget.Select
	lo, hi    [searchVariables]*widget.Entry
	objective *widget.Select
	target    *widget.Entry
	attached  *widget.Entry
	minGap    *widget.Entry
	minClear  *widget.Entry
	viscous   *widget.Check
	// reproducible: prefer a best setting a single solve reproduces
	// (engine.SearchOptions.PreferReproducible), so that Apply shows
	// the number found.
	reproducible *widget.Check
	budget       *widget.Entry
	msg          *widget.Label
	status       *widget.Label
	table        *widget.Label
	apply        *widget.Button
	pin          *widget.Button
	applyMsg     *widget.Label
	applyNote    *widget.Label // what the workbench shows after an apply
	trace        *figureBox
	plane        *figureBox
	planeCell    *readoutBox
	readout      *widget.Label

	*runControls
	cur *searchRun
}

// searchRun is a search: its inputs, the path so far and the answer.
type searchRun struct {
	st       *model.Study
	secs     []*model.Section
	vars     []model.SetupVariable
	bounds   []model.SetupRange
	opt      engine.SearchOptions
	forces   bool
	path     []engine.Point
	res      *engine.SearchResult
	status   string
	maxEvals int
}

func newSetupSearch(s *setupWindow) *setupSearch {
	p := &setupSearch{s: s}
	w := s.w
	var rows []fyne.CanvasObject
	for i := range searchVariables {
		p.use[i] = widget.NewCheck("", nil)
		p.pick[i] = widget.NewSelect(nil, func(string) { p.fillBounds(i) })
		p.lo[i], p.hi[i] = widget.NewEntry(), widget.NewEntry()
		rows = append(rows,
			container.NewBorder(nil, nil, p.use[i], nil, p.pick[i]),
			container.NewGridWithColumns(2, labelled("lowest", p.lo[i]), labelled("highest", p.hi[i])))
	}
	p.objective = widget.NewSelect([]string{"most downforce", "best downforce to drag", "least drag at a downforce target"}, func(string) { p.syncTarget() })
	p.target = widget.NewEntry()
	p.target.SetPlaceHolder("N/m, or −Cl without a speed")
	p.attached = widget.NewEntry()
	p.attached.SetText(entryNum(defaultSeparationLimit))
	p.minGap = widget.NewEntry()
	p.minGap.SetPlaceHolder("none")
	p.minClear = widget.NewEntry()
	p.minClear.SetPlaceHolder("the study's own minimum")
	p.viscous = widget.NewCheck("Viscous solution (coupled)", nil)
	p.viscous.SetChecked(true)
	p.reproducible = widget.NewCheck("Prefer a setting a single solve reproduces", nil)
	p.reproducible.SetChecked(true)
	p.budget = widget.NewEntry()
	p.budget.SetText(fmt.Sprint(engine.DefaultSearchEvaluations))
	p.msg = message()
	p.runControls = newRunControls("Search", p.start)
	p.status = caption("Not run yet. The search starts from the study's own setting and finds a local optimum near it (Nelder and Mead's simplex, gonum/optimize), not necessarily the best setting within the bounds: a map of the same bounds shows whether there is a better one elsewhere.")
	p.table = widget.NewLabel("")
	p.table.Wrapping = fyne.TextWrapWord
	p.apply = widget.NewButton("Apply the best setting", p.applyBest)
	p.apply.Importance = widget.HighImportance
	p.apply.Disable()
	p.pin = widget.NewButton("Pin the starting point", p.pinStart)
	p.pin.Disable()
	p.applyMsg = message()
	p.applyNote = caption("")
	p.applyNote.Hide()
	p.trace = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(420, 300))
	p.plane = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(420, 300))
	p.readout = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	p.readout.Wrapping = fyne.TextWrapWord

	// The run button, its progress and state stay in view below the
	// controls, which scroll: in an 800-pixel window they did not fit and
	// the button was out of sight.
	side := setupColumnFooter(container.NewVBox(p.msg, p.row, p.progress, p.status),
		append(append([]fyne.CanvasObject{heading("Vary within")}, rows...),
			widget.NewSeparator(),
			heading("Objective"), p.objective, row("Downforce target", p.target),
			heading("Keep to"),
			row("Attached to x/c", p.attached),
			row("Slot gap at least (mm)", p.minGap),
			row("Clearance at least (mm)", p.minClear),
			caption("Every point must also converge; the configuration stays clear of the ground."),
			p.viscous,
			p.reproducible,
			caption("A setting reached from another's solution can lie on another root than a single solve of it, which is what Apply shows: the best setting then gives way to the best one a single solve reproduces."),
			row("At most (solves)", p.budget),
		)...)
	result := container.NewVBox(heading("Best against start"), p.table,
		container.NewGridWithColumns(2, p.apply, p.pin), p.applyMsg, p.applyNote)
	p.planeCell = newReadoutBox(p.plane, p.hoverPlane)
	figs := container.NewGridWithColumns(2, newReadoutBox(p.trace, p.hoverTrace), p.planeCell)
	p.content = container.NewBorder(nil, p.readout, side, nil, container.NewBorder(nil, result, nil, nil, figs))
	p.objective.SetSelectedIndex(0)
	p.show()
	return p
}

// syncTarget enables the target for the drag objective only.
func (p *setupSearch) syncTarget() {
	if p.objective.SelectedIndex() == 2 {
		p.target.Enable()
	} else {
		p.target.Disable()
	}
}

// studyChanged offers the study's variables, defaults the first time (a
// flap's deflection, gap and overlap when there is a flap, else the angle
// and clearance), and whether the buttons still apply.
func (p *setupSearch) studyChanged() {
	st := p.s.w.ctl.Current()
	vars := setupVariables(st)
	labels := make([]string, len(vars))
	for i, v := range vars {
		labels[i] = v.Label(st)
	}
	first := p.vars == nil
	old := p.vars
	p.vars = vars
	for i := range searchVariables {
		k := -1
		if j := p.pick[i].SelectedIndex(); j >= 0 && j < len(old) {
			k = slices.Index(vars, old[j])
		}
		p.pick[i].SetOptions(labels)
		if k < 0 && first {
			k = searchDefault(st, vars, i)
		}
		if k >= 0 {
			p.pick[i].SetSelectedIndex(k)
		}
		if first {
			p.use[i].SetChecked(k >= 0 && (len(st.Elements) > 1 || i == 0 || (i == 1 && st.Ground.Enabled)))
		}
	}
	p.syncButtons()
}

// searchDefault is the variable offered in row i first: the last flap's
// deflection, gap and overlap, or the angle and the clearance.
func searchDefault(st *model.Study, vars []model.SetupVariable, i int) int {
	want := []model.SetupVariable{{Kind: model.SetupAlpha}, {Kind: model.SetupClearance}, {Kind: model.SetupSpeed}}
	if n := len(st.Elements); n > 1 {
		want = []model.SetupVariable{{Kind: model.SetupDeflection, Element: n - 1}, {Kind: model.SetupGap, Element: n - 1}, {Kind: model.SetupOverlap, Element: n - 1}}
	}
	k := slices.Index(vars, want[i])
	if k < 0 && i < len(vars) {
		k = i
	}
	return k
}

// fillBounds fills row i's bounds around the study's value.
func (p *setupSearch) fillBounds(i int) {
	k := p.pick[i].SelectedIndex()
	if k < 0 || k >= len(p.vars) {
		return
	}
	ctl := p.s.w.ctl
	st := ctl.Current()
	v := p.vars[k]
	if p.filled[i] == v {
		return // the same variable offered again keeps the bounds typed
	}
	p.filled[i] = v
	lo, hi, _ := setupDefaults(st, v, st.SetupValue(v, ctl.Sections()))
	p.lo[i].SetText(entryNum(lo))
	p.hi[i].SetText(entryNum(hi))
}

// readNumber parses an entry; empty is def.
func readNumber(e *widget.Entry, name string, def float64) (float64, error) {
	if strings.TrimSpace(e.Text) == "" {
		return def, nil
	}
	x, err := parseNumber(e.Text)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, fmt.Errorf("%s: %q is not a number", name, strings.TrimSpace(e.Text))
	}
	return x, nil
}

// read gathers the search's inputs.
func (p *setupSearch) read() ([]model.SetupRange, engine.SearchOptions, int, error) {
	var bounds []model.SetupRange
	var opt engine.SearchOptions
	st := p.s.w.ctl.Current()
	for i := range searchVariables {
		k := p.pick[i].SelectedIndex()
		if !p.use[i].Checked || k < 0 {
			continue
		}
		v := p.vars[k]
		lo, err := readNumber(p.lo[i], v.Label(st)+" lowest", math.NaN())
		if err != nil {
			return nil, opt, 0, err
		}
		hi, err := readNumber(p.hi[i], v.Label(st)+" highest", math.NaN())
		if err != nil {
			return nil, opt, 0, err
		}
		b, err := parseSetupBounds(v, lo, hi)
		if err != nil {
			return nil, opt, 0, err
		}
		bounds = append(bounds, b)
	}
	if len(bounds) == 0 {
		return nil, opt, 0, errors.New("tick at least one variable to vary")
	}
	opt.Objective = searchObjectives[max(0, p.objective.SelectedIndex())]
	var err error
	if opt.DownforceTarget, err = readNumber(p.target, "downforce target", 0); err != nil {
		return nil, opt, 0, err
	}
	if opt.AttachedToXC, err = readNumber(p.attached, "attached to x/c", 0); err != nil {
		return nil, opt, 0, err
	}
	if opt.MinGapMM, err = readNumber(p.minGap, "slot gap", 0); err != nil {
		return nil, opt, 0, err
	}
	if opt.MinClearanceMM, err = readNumber(p.minClear, "clearance", 0); err != nil {
		return nil, opt, 0, err
	}
	budget, err := readNumber(p.budget, "solves", float64(engine.DefaultSearchEvaluations))
	if err != nil || budget < 2 || budget > 5000 || budget != math.Trunc(budget) {
		return nil, opt, 0, errors.New("solves: a whole number from 2 to 5000")
	}
	opt.MaxEvaluations = int(budget)
	opt.Inviscid = !p.viscous.Checked
	opt.PreferReproducible = p.reproducible.Checked
	if opt.Inviscid && opt.AttachedToXC == defaultSeparationLimit {
		opt.AttachedToXC = 0 // the default limit needs the viscous solution; without it, none
	}
	return bounds, opt, int(budget), nil
}

// start gathers the inputs on the UI goroutine and runs the search on its
// own goroutine; each solve comes back through do, newest search only.
func (p *setupSearch) start() {
	bounds, opt, budget, err := p.read()
	if err == nil {
		err = p.begin(bounds, opt, budget)
	}
	setMessage(p.msg, err)
	p.s.relayout()
}

func (p *setupSearch) begin(bounds []model.SetupRange, opt engine.SearchOptions, budget int) error {
	ctl := p.s.w.ctl
	st, secs := ctl.Study(), slices.Clone(ctl.Sections())
	if err := st.CheckSetup(bounds); err != nil {
		return err
	}
	p.stop()
	r := &searchRun{st: st, secs: secs, bounds: bounds, opt: opt, maxEvals: budget, forces: st.Flow.SpeedMPS > 0}
	for _, b := range bounds {
		r.vars = append(r.vars, b.Var)
		r.forces = r.forces || b.Var.Kind == model.SetupSpeed
	}
	p.cur = r
	p.applyMsg.Hide()
	p.applyNote.Hide()
	do := p.s.w.do
	p.launch(ctl.Activity(), func(ctx context.Context, gen int) {
		res, err := runSearch(ctx, st, secs, bounds, opt, func(pt engine.Point) {
			do(func() {
				if p.current(gen) {
					r.path = append(r.path, pt)
					p.progressed(gen, float64(len(r.path))/float64(r.maxEvals))
					p.show()
				}
			})
		})
		do(func() { p.finish(gen, res, err) })
	})
	p.show()
	return nil
}

func (p *setupSearch) finish(gen int, res *engine.SearchResult, err error) {
	if !p.end(gen) {
		return
	}
	r := p.cur
	switch {
	case errors.Is(err, context.Canceled):
		r.status = fmt.Sprintf("Cancelled after %d solves.", len(r.path))
	case err != nil:
		r.status = ""
		setMessage(p.msg, err)
	default:
		r.res = res
		r.path = res.Path
		r.status = fmt.Sprintf("%d solves; %s. This is a local optimum near the start.", res.Evaluations, res.Status)
	}
	p.show()
	p.s.relayout()
}

// objectiveValue is the shown value of the search's objective at a point:
// downforce (or lift) in N/m with a speed, else the coefficient; L/D; or
// drag. NaN where the point has none.
func (r *searchRun) objectiveValue(pt *engine.Point) float64 {
	switch r.opt.Objective {
	case searchObjectives[1]:
		return engine.QuantityLiftToDrag.Value(pt, r.forces)
	case searchObjectives[2]:
		return engine.QuantityDrag.Value(pt, r.forces)
	}
	return engine.QuantityLoad.Value(pt, r.forces)
}

// objectiveLabel names the objective's axis.
func (r *searchRun) objectiveLabel() string {
	q := engine.QuantityLoad
	switch r.opt.Objective {
	case searchObjectives[1]:
		q = engine.QuantityLiftToDrag
	case searchObjectives[2]:
		q = engine.QuantityDrag
	}
	return q.Label(r.st.Inverted, r.forces)
}

// show writes the comparison and draws the path.
func (p *setupSearch) show() {
	r := p.cur
	p.syncButtons()
	if r == nil {
		p.trace.setDrawing(nil, searchTraceEmptyNote)
		p.plane.setDrawing(nil, searchPlaneEmptyNote)
		p.table.SetText("")
		return
	}
	st := r.status
	if st == "" && p.busy() {
		st = fmt.Sprintf("Running: %d solves of at most %d.", len(r.path), r.maxEvals)
	}
	p.status.SetText(st)
	steps := make([]figures.SearchStep, len(r.path))
	for i := range r.path {
		steps[i] = figures.SearchStep{Objective: r.objectiveValue(&r.path[i]), Feasible: r.opt.Meets(&r.path[i]), NotSolve: r.path[i].NotSolve()}
	}
	maximise := r.opt.Objective != searchObjectives[2]
	title, label := "Search: "+r.objectiveLabel()+" at each solve", r.objectiveLabel()
	p.trace.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderSearch(title, label, steps, maximise, dark, w, h, dpi)
	}, "")
	if len(r.vars) >= 2 {
		g := figures.SetupGrid{
			Title:  "Path in " + r.vars[0].Words(r.st) + " and " + r.vars[1].Words(r.st),
			XLabel: r.vars[0].Label(r.st), YLabel: r.vars[1].Label(r.st),
			X: []float64{r.bounds[0].From, r.bounds[0].To}, Y: []float64{r.bounds[1].From, r.bounds[1].To},
			Start: [2]float64{math.NaN(), math.NaN()}, Best: [2]float64{math.NaN(), math.NaN()},
		}
		for _, pt := range r.path {
			g.Path = append(g.Path, [2]float64{pt.Values[0], pt.Values[1]})
		}
		if len(r.path) > 0 {
			g.Start = [2]float64{r.path[0].Values[0], r.path[0].Values[1]}
		}
		if r.res != nil && r.res.Feasible {
			g.Best = [2]float64{r.res.Best.Values[0], r.res.Best.Values[1]}
		}
		p.planeCell.Show()
		p.plane.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
			return renderSetupGrid(g, dark, w, h, dpi)
		}, "")
	} else {
		p.planeCell.Hide() // a path in a plane needs two variables
	}
	p.table.SetText(p.comparison())
}

// comparison is the best setting beside the start, in words.
func (p *setupSearch) comparison() string {
	r := p.cur
	if r == nil || r.res == nil {
		return ""
	}
	res := r.res
	var b strings.Builder
	for i, v := range r.vars {
		fmt.Fprintf(&b, "%s: %s → %s %s\n", v.Words(r.st), num(res.Start.Values[i]), num(res.Best.Values[i]), v.Unit())
	}
	for q := range engine.NumQuantities {
		a, z := q.Value(&res.Start, r.forces), q.Value(&res.Best, r.forces)
		if math.IsNaN(a) && math.IsNaN(z) {
			continue
		}
		fmt.Fprintf(&b, "%s: %s → %s\n", q.Label(r.st.Inverted, r.forces), orSig(a), orSig(z))
	}
	if !res.Feasible {
		b.WriteString("No setting met every constraint: the start is kept.\n")
	} else if w := format.NearGroundAdvice(r.st, &res.Best); w != "" {
		b.WriteString(w + "\n")
	}
	if u := res.Unreproduced; u != nil {
		what := "lands on another root"
		if u.Single == engine.SingleNoAnswer {
			what = "has no answer"
		}
		fmt.Fprintf(&b, "A single solve of the best setting found (%s) %s: the best shown is the best setting a single solve reproduces.\n", settingWords(r, u.Values), what)
	}
	switch {
	case !res.Best.NotSolve():
	case res.Best.Single == engine.SingleAnotherRoot:
		fmt.Fprintf(&b, "The best setting, started from the solution of a setting solved before it, lies on another root of the coupled equations than a single solve of it (Cl %s against %s): applied, the workbench shows the single solve's.\n", sig(res.Best.Cl), sig(res.Best.SingleCl))
	default:
		b.WriteString("The best setting converged only when started from the solution of a setting solved before it: a single solve of it has no answer (applied, the workbench may show none).\n")
	}
	b.WriteString(r.status)
	return strings.TrimSpace(b.String())
}

// settingWords names a setting of the search's variables in words.
func settingWords(r *searchRun, values []float64) string {
	var parts []string
	for i, v := range r.vars {
		parts = append(parts, v.Setting(r.st, values[i]))
	}
	return strings.Join(parts, ", ")
}

// orSig formats a value, "—" for none.
func orSig(v float64) string {
	if math.IsNaN(v) {
		return "—"
	}
	return sig(v)
}

// syncButtons enables Apply when a feasible best differs from the start
// and the study is still the one searched, and the pin when the study is
// still at the start.
func (p *setupSearch) syncButtons() {
	r := p.cur
	ok := r != nil && r.res != nil && !p.busy() && studiesEqual(r.st, p.s.w.ctl.Current())
	if ok && r.res.Feasible && !slices.Equal(r.res.Best.Values, r.res.Start.Values) {
		p.apply.Enable()
	} else {
		p.apply.Disable()
	}
	if ok {
		p.pin.Enable()
	} else {
		p.pin.Disable()
	}
}

// applyBest sets the study to the best setting: one edit, undone by Undo.
func (p *setupSearch) applyBest() {
	r := p.cur
	if r == nil || r.res == nil {
		return
	}
	ctl := p.s.w.ctl
	vals := slices.Clone(r.res.Best.Values)
	secs := ctl.Sections()
	next, err := applySetupValues(ctl.Current(), r.vars, vals, secs)
	if err == nil {
		err = ctl.Edit("", func(s *model.Study) { *s = *next })
	}
	setMessage(p.applyMsg, err)
	p.applyNote.Hide()
	if err == nil {
		p.applyNote.SetText(appliedNote(r, next))
		p.applyNote.Show()
	}
	p.syncButtons()
	p.s.relayout()
}

// appliedNote says what was applied (undone by Edit ▸ Undo) and, when the
// search's solution differs from the one the workbench runs for the
// study, that the workbench's numbers are not the search's.
func appliedNote(r *searchRun, st *model.Study) string {
	var set []string
	for i, v := range r.vars {
		set = append(set, v.Setting(r.st, r.res.Best.Values[i]))
	}
	note := "Applied " + strings.Join(set, ", ") + " (Edit ▸ Undo takes it back)."
	pinned := false
	for _, pin := range st.Pins {
		pinned = pinned || strings.HasPrefix(pin.Label, searchStartPin)
	}
	if !pinned {
		// Pin the starting point works only on the study at the start:
		// after Apply it is greyed out without a word.
		note += " To compare with the start: Undo, Pin the starting point, then apply again."
	}
	coupled := st.Viscous.Enabled && st.Viscous.IsCoupled()
	if r.res.Best.Viscous && !coupled {
		note += " The search used the coupled viscous solution; the workbench solves the study with its own viscous setting, which is not the coupled solution, so its numbers differ from the search's: choose the coupled viscous solution in the Flow tab to compare them."
	}
	return note
}

// searchStartPin begins the name of the pin of a search's start.
const searchStartPin = "search start, "

// pinStart pins the study's current result, the starting point, for
// comparison with the setting applied after it, named as the search's
// start.
func (p *setupSearch) pinStart() {
	ctl := p.s.w.ctl
	n := len(ctl.Current().Pins)
	err := ctl.PinCurrent()
	if r := p.cur; err == nil && r != nil && r.res != nil && len(ctl.Current().Pins) == n+1 {
		// The pin was made at once (the result was there): its label
		// names the start; a pin waiting for its result keeps the
		// workbench's label.
		var set []string
		for i, v := range r.vars {
			set = append(set, v.Setting(r.st, r.res.Start.Values[i]))
		}
		if e := ctl.RenamePin(n, searchStartPin+strings.Join(set, ", ")); e != nil {
			err = fmt.Errorf("pinned, with the workbench's name (%v)", e)
		}
	}
	setMessage(p.applyMsg, err)
	p.s.relayout()
}

// redraw draws the figures again.
func (p *setupSearch) redraw() {
	p.trace.redraw()
	p.plane.redraw()
}

// hoverTrace reads the solve under the pointer on the objective figure.
func (p *setupSearch) hoverTrace(x, _ float64, ok bool) {
	r := p.cur
	i := int(math.Round(x)) - 1
	if !ok || r == nil || i < 0 || i >= len(r.path) {
		p.readout.SetText("")
		return
	}
	p.readout.SetText(fmt.Sprintf("Solve %d: %s", i+1, r.describe(&r.path[i])))
}

// hoverPlane reads the solve nearest the pointer on the path figure.
func (p *setupSearch) hoverPlane(x, y float64, ok bool) {
	r := p.cur
	if !ok || r == nil || len(r.path) == 0 || len(r.vars) < 2 {
		p.readout.SetText("")
		return
	}
	sx, sy := r.bounds[0].To-r.bounds[0].From, r.bounds[1].To-r.bounds[1].From
	best, bd := 0, math.Inf(1)
	for i, pt := range r.path {
		if d := math.Hypot((pt.Values[0]-x)/sx, (pt.Values[1]-y)/sy); d < bd {
			best, bd = i, d
		}
	}
	p.readout.SetText(fmt.Sprintf("Solve %d: %s", best+1, r.describe(&r.path[best])))
}

// describe is a solve's setting and values in words.
func (r *searchRun) describe(pt *engine.Point) string {
	note := ""
	if pt.Converged && pt.Err == "" && !r.opt.Meets(pt) {
		note = "outside a constraint"
	}
	return describePoint(r.st, r.vars, pt, r.forces, note)
}
