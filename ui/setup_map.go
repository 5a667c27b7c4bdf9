package ui

import (
	"context"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"slices"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// defaultSeparationLimit is the x/c ahead of which a suction side that
// separates marks a point: separation in the last tenth of the chord is
// common on a loaded flap and costs little (common practice).
const defaultSeparationLimit = 0.9

// mapRun is a map: its inputs and the points that have arrived. It is
// read and written on the UI goroutine only; figures get copies.
type mapRun struct {
	st       *model.Study
	vars     []model.SetupVariable
	axes     [][]float64
	current  []float64 // the study's own value of each variable
	points   []engine.Point
	arrived  []bool
	limit    float64
	forces   bool
	inviscid bool // asked for the panel method only
	compared bool // each point compared with a single solve
	done     int
	status   string // how the run ended; "" while it runs
}

func (r *mapRun) total() int { return len(r.points) }

// failed and separated describe a point for the figures.
func (r *mapRun) failed(k int) bool {
	p := &r.points[k]
	return r.arrived[k] && (!p.Converged || p.Err != "")
}

func (r *mapRun) separated(k int) bool {
	p := &r.points[k]
	return r.arrived[k] && p.Converged && p.Viscous && !p.AttachedTo(r.limit)
}

// curve returns quantity q against the one variable over the points that
// have arrived, with the separation onset nearest the study's value.
func (r *mapRun) curve(q engine.Quantity) figures.SetupCurve {
	var pts []engine.Point
	for k := range r.points {
		if r.arrived[k] {
			pts = append(pts, r.points[k])
		}
	}
	c := figures.MapCurve(r.st, r.vars[0], pts, q, r.forces, r.limit, r.current[0])
	if ax := r.axes[0]; len(ax) > 0 { // the whole range from the first point on
		c.XFrom, c.XTo = slices.Min(ax), slices.Max(ax)
	}
	return c
}

// viscous reports whether the map has the viscous solution: asked for,
// and every point that arrived solved with it (a study without a speed or
// Reynolds number has none).
func (r *mapRun) viscous() bool {
	v := !r.inviscid
	for k := range r.points {
		v = v && (!r.arrived[k] || r.points[k].Viscous)
	}
	return v
}

// grid returns quantity q over the two variables.
func (r *mapRun) grid(q engine.Quantity) figures.SetupGrid {
	inv := r.st.Inverted
	nx, ny := len(r.axes[0]), len(r.axes[1])
	g := figures.SetupGrid{
		Title:  strings.ToUpper(q.Label(inv, r.forces)[:1]) + q.Label(inv, r.forces)[1:],
		XLabel: r.vars[0].Label(r.st), YLabel: r.vars[1].Label(r.st), ZLabel: unitOf(q.Label(inv, r.forces)),
		X: r.axes[0], Y: r.axes[1],
		Z: make([][]float64, nx), Separated: make([][]bool, nx), Failed: make([][]bool, nx), NotSolve: make([][]bool, nx), NearGround: make([][]bool, nx),
		Start: [2]float64{math.NaN(), math.NaN()}, Best: [2]float64{math.NaN(), math.NaN()},
	}
	for i := range nx {
		g.Z[i], g.Separated[i], g.Failed[i], g.NotSolve[i], g.NearGround[i] = make([]float64, ny), make([]bool, ny), make([]bool, ny), make([]bool, ny), make([]bool, ny)
		for j := range ny {
			k := i*ny + j
			g.Z[i][j] = math.NaN()
			if r.arrived[k] {
				g.Z[i][j] = q.Value(&r.points[k], r.forces)
				g.Separated[i][j], g.Failed[i][j] = r.separated(k), r.failed(k)
				g.NotSolve[i][j] = !g.Failed[i][j] && r.points[k].NotSolve()
				g.NearGround[i][j] = r.points[k].NearGround(r.st)
			}
		}
	}
	return g
}

// unitOf returns the unit in a label's parentheses, or "".
func unitOf(label string) string {
	if i := strings.LastIndex(label, "("); i >= 0 && strings.HasSuffix(label, ")") {
		return label[i+1 : len(label)-1]
	}
	return ""
}

// nearest returns the index of the arrived point nearest the data point
// (x, y) of the figure (y only for two variables), or −1.
func (r *mapRun) nearest(x, y float64) int {
	near := func(axis []float64, v float64) int {
		best := 0
		for i, a := range axis {
			if math.Abs(a-v) < math.Abs(axis[best]-v) {
				best = i
			}
		}
		return best
	}
	k := near(r.axes[0], x)
	if len(r.axes) == 2 {
		k = k*len(r.axes[1]) + near(r.axes[1], y)
	}
	if !r.arrived[k] {
		return -1
	}
	return k
}

// describe is the readout of point k: its setting and every quantity.
func (r *mapRun) describe(k int) string {
	var notes []string
	if r.separated(k) {
		notes = append(notes, "suction side separated ahead of x/c "+num(r.limit))
	}
	if r.arrived[k] {
		// As `solve` and a sweep's rows flag it: the ground, a suction
		// peak beyond real flows, transition held upstream (it gave the
		// ground's alone).
		for _, f := range format.MapFlags(&r.points[k]) {
			notes = append(notes, string(f.Kind)+" ("+f.Message+")")
		}
	}
	note := strings.Join(notes, ", ")
	return describePoint(r.st, r.vars, &r.points[k], r.forces, note)
}

// describePoint is a point's setting of vars and every quantity it has, in
// words, with a note after them.
func describePoint(st *model.Study, vars []model.SetupVariable, p *engine.Point, forces bool, note string) string {
	var set []string
	for i, v := range vars {
		set = append(set, v.Setting(st, p.Values[i]))
	}
	s := strings.Join(set, ", ") + ": "
	switch {
	case p.Err != "":
		return s + "not solved: " + p.Err
	case !p.Converged:
		return s + "the viscous solution did not converge"
	}
	var qs []string
	for q := range engine.NumQuantities {
		if v := q.Value(p, forces); !math.IsNaN(v) {
			qs = append(qs, readoutQuantity(q, st.Inverted, forces, v))
		}
	}
	if note != "" {
		qs = append(qs, note)
	}
	if p.FromNeighbour() {
		var from []string
		for i, v := range vars {
			from = append(from, v.Setting(st, p.StartedFrom[i]))
		}
		at := strings.Join(from, ", ")
		switch p.Single {
		case engine.SingleAnotherRoot:
			qs = append(qs, fmt.Sprintf("started from the solution at %s; a single solve lands on another root here (its Cl %s, this point's %s)", at, sig(p.SingleCl), sig(p.Cl)))
		case engine.SingleNoAnswer:
			qs = append(qs, "converged only when started from the solution at "+at+" (a single solve has no answer here)")
		case engine.SingleAgrees:
			qs = append(qs, "started from the solution at "+at+" (a single solve agrees)")
		default:
			qs = append(qs, "started from the solution at "+at)
		}
	}
	return s + strings.Join(qs, ", ")
}

// readoutQuantity is quantity q's value v in the readout of a point, with
// its unit or its coefficient's name as the figures' axes give them: the
// load and drag in N/m with a speed, else −Cl (Cl) and Cd; the ratio as
// −Cl/Cd on an inverted wing, as the status line says; separation at 1 as
// attached. It read "downforce 369.5, drag 3.006, L/D 122.9, separation
// x/c 1", without units.
func readoutQuantity(q engine.Quantity, inverted, forces bool, v float64) string {
	coef := "Cl"
	if inverted {
		coef = "−Cl"
	}
	switch q {
	case engine.QuantityLoad:
		if forces {
			return q.Short(inverted) + " " + sig(v) + " N/m"
		}
		return coef + " " + sig(v)
	case engine.QuantityDrag:
		if forces {
			return "drag " + sig(v) + " N/m"
		}
		return "Cd " + sig(v)
	case engine.QuantityLiftToDrag:
		return coef + "/Cd " + sig(v)
	case engine.QuantitySeparation:
		if v >= 1 {
			return "suction sides attached"
		}
		return "suction side separated from x/c " + sig(v)
	}
	return q.Short(inverted) + " " + sig(v)
}

// sig formats a value to four significant digits with a true minus sign.
func sig(v float64) string {
	return model.Minus(fmt.Sprintf("%.4g", v))
}

// setupMaps is the Maps tab.
type setupMaps struct {
	s       *setupWindow
	content fyne.CanvasObject

	vars           []model.SetupVariable  // offered, in the selects' order
	filled         [2]model.SetupVariable // the variable each range was last filled for
	var1, var2     *widget.Select
	from, to, step [2]*widget.Entry
	second         *widget.Check
	secondBox      *fyne.Container
	viscous        *widget.Check
	compare        *widget.Check // compare each point with a single solve
	limit          *widget.Entry
	msg            *widget.Label
	status         *widget.Label
	export         *widget.Button
	quantity       *widget.Select
	readout        *widget.Label
	curves         [engine.NumQuantities]*figureBox
	cells          [engine.NumQuantities]*readoutBox // the curves with their readout; hidden when the map cannot have the quantity
	shownQ         []engine.Quantity                 // the quantities the two-variable select offers, in its order
	curveArea      *fyne.Container
	gridBox        *figureBox
	gridArea       *fyne.Container
	emptyNote      *fyne.Container // what to do, over the empty curves before the first run

	*runControls
	run0 *mapRun // the map shown; nil before the first run
}

func newSetupMaps(s *setupWindow) *setupMaps {
	m := &setupMaps{s: s}
	w := s.w
	m.var1 = widget.NewSelect(nil, func(string) { m.fillRange(0) })
	m.var2 = widget.NewSelect(nil, func(string) { m.fillRange(1) })
	for i := range 2 {
		m.from[i], m.to[i], m.step[i] = widget.NewEntry(), widget.NewEntry(), widget.NewEntry()
	}
	rangeRow := func(i int) fyne.CanvasObject {
		return container.NewGridWithColumns(3, labelled("from", m.from[i]), labelled("to", m.to[i]), labelled("step", m.step[i]))
	}
	m.secondBox = container.NewVBox(m.var2, rangeRow(1))
	m.secondBox.Hide()
	m.second = widget.NewCheck("A second variable (a map over two)", func(on bool) {
		if on {
			m.secondBox.Show()
		} else {
			m.secondBox.Hide()
		}
		s.relayout()
	})
	m.compare = widget.NewCheck("Compare each point with a single solve (slower)", nil)
	m.viscous = widget.NewCheck("Viscous solution (coupled)", func(on bool) {
		if on {
			m.compare.Enable()
		} else {
			m.compare.Disable()
		}
	})
	m.viscous.SetChecked(true)
	m.limit = widget.NewEntry()
	m.limit.SetText(entryNum(defaultSeparationLimit))
	m.msg = message()
	m.runControls = newRunControls("Run map", m.start)
	m.status = caption("Not run yet. Each point is the study solved with the variables set to the point's values; points stream in as they are solved, on both cores.")
	m.export = widget.NewButton("Export map (CSV)…", func() { w.exportTo(m.csvJob()) })
	m.export.Disable()
	m.quantity = widget.NewSelect(nil, func(string) { m.show() })
	m.readout = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	m.readout.Wrapping = fyne.TextWrapWord

	var cells []fyne.CanvasObject
	for q := range engine.NumQuantities {
		m.curves[q] = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(260, 200))
		m.cells[q] = newReadoutBox(m.curves[q], m.hover)
		cells = append(cells, m.cells[q])
	}
	m.curveArea = container.NewGridWithColumns(3, cells...)
	m.gridBox = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(520, 400))
	m.gridArea = container.NewBorder(m.quantity, nil, nil, nil, newReadoutBox(m.gridBox, m.hover))
	m.gridArea.Hide()

	side := setupColumn(
		heading("Vary"),
		m.var1, rangeRow(0),
		m.second, m.secondBox,
		widget.NewSeparator(),
		m.viscous,
		m.compare,
		caption("Each point starts from its neighbour's solution. Where the viscous equations have two roots (near a slot, past maximum lift) it can land on another than a single solve of its setting: compared, such points are boxed."),
		row("Separation limit, x/c", m.limit),
		caption("A point whose suction side separates ahead of this x/c on any element is marked."),
		m.msg,
		m.row,
		m.progress, m.status, m.export,
	)
	m.emptyNote = emptyFigureNote(mapsEmptyNote)
	m.content = container.NewBorder(nil, m.readout, side, nil, container.NewStack(m.curveArea, m.gridArea, m.emptyNote))
	return m
}

// studyChanged offers the variables the study has, keeping the choices
// that are still there.
func (m *setupMaps) studyChanged() {
	st := m.s.w.ctl.Current()
	vars := setupVariables(st)
	labels := make([]string, len(vars))
	for i, v := range vars {
		labels[i] = v.Label(st)
	}
	prev := m.vars
	keep := func(sel *widget.Select, def int) {
		old := -1
		if i := sel.SelectedIndex(); i >= 0 && i < len(prev) {
			old = slices.Index(vars, prev[i])
		}
		sel.SetOptions(labels)
		if old < 0 {
			old = min(def, len(vars)-1)
		}
		sel.SetSelectedIndex(old)
	}
	m.vars = vars
	def1, def2 := 0, min(1, len(vars)-1)
	if st.Ground.Enabled {
		// The ride height first: the question a team asks first; against
		// the angle of attack, how the car pitches it (speed came second,
		// which the team varies least).
		def1, def2 = 1, 0
	}
	keep(m.var1, def1)
	keep(m.var2, def2)
}

// fillRange fills range i's fields with defaults around the study's value
// when the variable chosen there changes; the same variable offered again
// (after any change of the study) keeps what the user typed.
func (m *setupMaps) fillRange(i int) {
	sel := [2]*widget.Select{m.var1, m.var2}[i]
	k := sel.SelectedIndex()
	if k < 0 || k >= len(m.vars) {
		return
	}
	ctl := m.s.w.ctl
	st := ctl.Current()
	v := m.vars[k]
	if m.filled[i] == v {
		return
	}
	m.filled[i] = v
	from, to, step := setupDefaults(st, v, st.SetupValue(v, ctl.Sections()))
	m.from[i].SetText(entryNum(from))
	m.to[i].SetText(entryNum(to))
	m.step[i].SetText(entryNum(step))
}

// readRanges parses the ranges typed.
func (m *setupMaps) readRanges() ([]model.SetupRange, error) {
	n := 1
	if m.second.Checked {
		n = 2
	}
	var out []model.SetupRange
	for i := range n {
		k := [2]*widget.Select{m.var1, m.var2}[i].SelectedIndex()
		if k < 0 {
			return nil, fmt.Errorf("choose a variable")
		}
		var vals [3]float64
		for j, e := range []*widget.Entry{m.from[i], m.to[i], m.step[i]} {
			x, err := parseNumber(e.Text)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, fmt.Errorf("%s %s: %q is not a number", m.vars[k].Label(m.s.w.ctl.Current()), []string{"from", "to", "step"}[j], strings.TrimSpace(e.Text))
			}
			vals[j] = x
		}
		r, err := parseSetupRange(m.vars[k], vals[0], vals[1], vals[2])
		if err != nil {
			return nil, err
		}
		out = append(out, r)
	}
	return out, nil
}

// readLimit parses the separation limit.
func readLimit(e *widget.Entry) (float64, error) {
	x, err := parseNumber(e.Text)
	if err != nil || !(x > 0 && x <= 1) {
		return 0, fmt.Errorf("the separation limit is an x/c above 0 and at most 1")
	}
	return x, nil
}

// start gathers the map's inputs on the UI goroutine and runs it on its
// own goroutine; its points come back through do, newest run only.
func (m *setupMaps) start() {
	ranges, err := m.readRanges()
	if err == nil {
		var lim float64
		lim, err = readLimit(m.limit)
		if err == nil {
			err = m.begin(ranges, lim)
		}
	}
	setMessage(m.msg, err)
	m.s.relayout()
}

func (m *setupMaps) begin(ranges []model.SetupRange, limit float64) error {
	ctl := m.s.w.ctl
	st, secs := ctl.Study(), slices.Clone(ctl.Sections())
	if err := st.CheckSetup(ranges); err != nil {
		return err
	}
	m.stop()
	r := &mapRun{st: st, limit: limit, inviscid: !m.viscous.Checked, compared: m.viscous.Checked && m.compare.Checked}
	total := 1
	for _, rg := range ranges {
		r.vars = append(r.vars, rg.Var)
		r.axes = append(r.axes, rg.Values())
		r.current = append(r.current, st.SetupValue(rg.Var, secs))
		total *= len(rg.Values())
		r.forces = r.forces || rg.Var.Kind == model.SetupSpeed
	}
	r.forces = r.forces || st.Flow.SpeedMPS > 0
	r.points, r.arrived = make([]engine.Point, total), make([]bool, total)
	m.run0 = r
	m.export.Disable()
	m.readout.SetText("")
	m.quantity.SetOptions(nil)
	var names []string
	m.shownQ = nil
	for q := range engine.NumQuantities {
		if r.inviscid && q.NeedsViscous() {
			continue
		}
		m.shownQ = append(m.shownQ, q)
		names = append(names, q.Label(st.Inverted, r.forces))
	}
	m.quantity.SetOptions(names)
	m.quantity.SetSelectedIndex(int(engine.QuantityLoad))
	opt := engine.MapOptions{PointOptions: engine.PointOptions{Inviscid: !m.viscous.Checked}, CompareWithSolve: m.compare.Checked}
	do := m.s.w.do
	m.launch(ctl.Activity(), func(ctx context.Context, gen int) {
		_, err := runMap(ctx, st, secs, ranges, opt,
			func(done, total int) { do(func() { m.progressed(gen, float64(done)/float64(total)) }) },
			func(p engine.Point) { do(func() { m.arrive(gen, p) }) })
		do(func() { m.finish(gen, err) })
	})
	m.show()
	return nil
}

// arrive adds a point of run gen to the map shown.
func (m *setupMaps) arrive(gen int, p engine.Point) {
	r := m.run0
	if !m.current(gen) || r == nil {
		return
	}
	k := 0
	for a, i := range p.Index {
		k = k*len(r.axes[a]) + i
	}
	if k < 0 || k >= r.total() {
		return
	}
	r.points[k], r.arrived[k] = p, true
	r.done++
	m.show()
}

// finish ends run gen: its state in words, the buttons back.
func (m *setupMaps) finish(gen int, err error) {
	if !m.end(gen) {
		return
	}
	r := m.run0
	switch {
	case err == context.Canceled:
		r.status = "Cancelled:"
	case err != nil:
		r.status = "Stopped: " + friendly(err)
	default:
		r.status = "Done:"
	}
	if r.done > 0 {
		m.export.Enable()
	}
	m.show()
	m.s.relayout()
}

// show draws the map shown: curves for one variable, the chosen quantity
// over two.
func (m *setupMaps) show() {
	r := m.run0
	if r == nil {
		for _, b := range m.curves {
			b.setDrawing(nil, "")
		}
		m.emptyNote.Show()
		return
	}
	m.emptyNote.Hide()
	failed, separated, notSolve := 0, 0, 0
	for k := range r.points {
		if r.failed(k) {
			failed++
		}
		if r.separated(k) {
			separated++
		}
		if r.arrived[k] && r.points[k].NotSolve() {
			notSolve++
		}
	}
	st := r.status
	if st == "" {
		st = "Running:"
	}
	viscous := r.viscous()
	text := fmt.Sprintf("%s %d of %d points done; %d without an answer (not converged or not solvable), %d separated ahead of x/c %s. The map is of the study as it was when run.",
		st, r.done, r.total(), failed, separated, num(r.limit))
	if notSolve > 0 {
		text += fmt.Sprintf(" %d (boxed) are not a single solve's answer: started from a neighbour's solution they reached another root of the coupled equations than a single solve, or converged where it has none.", notSolve)
	} else if r.compared && r.done > 0 {
		text += " Every point so far agrees with a single solve of its setting."
	}
	if !viscous {
		text += " No drag, L/D or separation without the viscous solution (a speed or Reynolds number, and the box ticked)."
	}
	m.status.SetText(text)
	if len(r.axes) == 1 {
		m.gridArea.Hide()
		m.curveArea.Show()
		for q := range engine.NumQuantities {
			if !viscous && q.NeedsViscous() {
				m.cells[q].Hide()
				continue
			}
			m.cells[q].Show()
			c := r.curve(q)
			m.curves[q].setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
				return renderSetupCurve(c, dark, w, h, dpi)
			}, "")
		}
		return
	}
	m.curveArea.Hide()
	m.gridArea.Show()
	q := engine.QuantityLoad
	if i := m.quantity.SelectedIndex(); i >= 0 && i < len(m.shownQ) {
		q = m.shownQ[i]
	}
	g := r.grid(q)
	m.gridBox.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderSetupGrid(g, dark, w, h, dpi)
	}, "")
}

// redraw draws the figures again (a theme change).
func (m *setupMaps) redraw() {
	for _, b := range m.curves {
		b.redraw()
	}
	m.gridBox.redraw()
}

// hover shows the point under the pointer.
func (m *setupMaps) hover(x, y float64, ok bool) {
	r := m.run0
	if !ok || r == nil {
		m.readout.SetText("")
		return
	}
	if k := r.nearest(x, y); k >= 0 {
		m.readout.SetText(r.describe(k))
	} else {
		m.readout.SetText("")
	}
}

// csvJob gathers the map shown for File-style export: the points that
// arrived, in grid order.
func (m *setupMaps) csvJob() exportJob {
	r := m.run0
	w := m.s.w
	base := w.exportBase()
	program := "Sectionbench " + w.app.Metadata().Version
	var st *model.Study
	var vars []model.SetupVariable
	var pts []engine.Point
	if r != nil {
		st, vars = r.st, r.vars
		for k := range r.points {
			if r.arrived[k] {
				pts = append(pts, r.points[k])
			}
		}
	}
	return func(dir string) ([]string, error) {
		if len(pts) == 0 {
			return nil, fmt.Errorf("no map to export yet: run one first")
		}
		name := base + "-map.csv"
		return []string{name}, export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error {
			return writeMapTable(out, st, program, vars, pts)
		})
	}
}
