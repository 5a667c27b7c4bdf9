package ui

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"

	"sectionbench/export/report"
	"sectionbench/solver/engine"
)

// Size of the set-up window in Fyne units, and of its control column.
const (
	setupWidth        = 1240
	setupHeight       = 800
	setupControlWidth = 400
)

// The tabs of the set-up window.
const (
	setupTabMaps = iota
	setupTabSearch
	setupTabSpan
)

// setupWindow is the set-up explorer: maps of the configuration over one
// or two set-up variables, the setting search and the finite-span
// estimate. Each part gathers its inputs on the UI goroutine, runs off it
// and posts its results back with the workbench's do; a newer run
// supersedes an older one.
type setupWindow struct {
	w       *Workbench
	win     fyne.Window
	tabs    *container.AppTabs
	maps    *setupMaps
	search  *setupSearch
	span    *setupSpan
	visible bool
}

// openSetup shows the set-up window at a tab, making it on first use.
func (w *Workbench) openSetup(tab int) {
	if w.setup == nil {
		w.setup = newSetupWindow(w)
		w.ctl.Subscribe(w.setup.studyChanged)
	}
	s := w.setup
	s.tabs.SelectIndex(tab)
	s.visible = true
	s.studyChanged()
	s.win.Show()
	s.win.RequestFocus()
}

func newSetupWindow(w *Workbench) *setupWindow {
	s := &setupWindow{w: w}
	s.win = w.app.NewWindow("Set-up explorer — Sectionbench")
	s.win.SetCloseIntercept(s.hide)
	s.maps = newSetupMaps(s)
	s.search = newSetupSearch(s)
	s.span = newSetupSpan(s)
	s.tabs = container.NewAppTabs(
		container.NewTabItem("Maps", s.maps.content),
		container.NewTabItem("Setting search", s.search.content),
		container.NewTabItem("Finite span", s.span.content),
	)
	note := widget.NewLabelWithStyle(cautionShort+"; structure and mounting follow the competition's rules and qualified review.", fyne.TextAlignTrailing, fyne.TextStyle{Italic: true})
	s.win.SetContent(container.NewBorder(nil, note, nil, nil, s.tabs))
	s.win.Resize(fyne.NewSize(setupWidth, setupHeight))
	w.app.Settings().AddListener(func(fyne.Settings) { w.do(s.redraw) })
	return s
}

// studyChanged follows the study: the variables offered and whether what
// is shown still belongs to it.
func (s *setupWindow) studyChanged() {
	if s.w.ctl.Current() == nil {
		return
	}
	s.maps.studyChanged()
	s.search.studyChanged()
	s.span.studyChanged()
}

// redraw draws every figure again (a theme change).
func (s *setupWindow) redraw() {
	s.maps.redraw()
	s.search.redraw()
	s.span.redraw()
}

// hide puts the window away (its close button): runs stop, the results
// stay for the next opening.
func (s *setupWindow) hide() {
	s.maps.stop()
	s.search.stop()
	s.span.stop()
	s.visible = false
	s.win.Hide()
}

// relayout lays the window out again after widgets were shown or hidden.
func (s *setupWindow) relayout() {
	if c := s.win.Content(); c != nil {
		c.Refresh()
	}
}

// What each tab's figure area says before its first run: what to do and
// what will be drawn there.
const (
	mapsEmptyNote        = "Choose what to vary and its range, then press Run map: a curve of each quantity is drawn here as the points are solved."
	searchTraceEmptyNote = "Set the ranges, the objective and the limits, then press Search: the objective at each solve is drawn here as the search runs."
	searchPlaneEmptyNote = "With two variables or more, the path over the first two is drawn here."
	spanEmptyNote        = "Set the span and end plates, then press Estimate the finite wing: the load along the span is drawn here."
)

// emptyFigureNote is a figure area's note before its first run, centred
// and wrapped to the area's width.
func emptyFigureNote(text string) *fyne.Container {
	l := widget.NewLabelWithStyle(text, fyne.TextAlignCenter, fyne.TextStyle{Italic: true})
	l.Wrapping = fyne.TextWrapWord
	return container.NewVBox(layout.NewSpacer(), l, layout.NewSpacer())
}

// setupColumn is a control column of the window's width.
func setupColumn(objs ...fyne.CanvasObject) fyne.CanvasObject {
	return setupColumnFooter(nil, objs...)
}

// setupColumnFooter is a control column whose footer (the run button and
// its progress) stays in view below the scrolling controls, however tall
// they are (nil: none).
func setupColumnFooter(footer fyne.CanvasObject, objs ...fyne.CanvasObject) fyne.CanvasObject {
	return container.NewPadded(container.NewStack(widthOf(setupControlWidth), container.NewBorder(nil, footer, nil, nil, container.NewVScroll(container.NewVBox(objs...)))))
}

// reportPart gathers, on the UI goroutine, what the report's set-up page
// shows: the one-variable map shown (its load against the variable), the
// last search that finished and the finite-span estimate when it is of
// the current study. It is nil (no page) when the window was never
// opened or holds none of them.
func (s *setupWindow) reportPart() *report.Setup {
	if s == nil {
		return nil
	}
	cur := s.w.ctl.Current()
	out := &report.Setup{}
	if r := s.maps.run0; r != nil && len(r.axes) == 1 && r.done > 0 {
		out.Curve = r.curve(engine.QuantityLoad)
		viscous := "with the coupled viscous solution"
		if r.inviscid {
			viscous = "with the panel method only (no separation)"
		}
		out.CurveNote = report.CurveNote(r.done, viscous, "", countFailed(r), r.limit)
		if !studiesEqual(r.st, cur) {
			out.CurveNote += " The map is of the study as it was before its last changes."
		}
	}
	if r := s.search.cur; r != nil && r.res != nil {
		out.Search, out.SearchVars, out.SearchOptions = r.res, r.vars, r.opt
	}
	if p := s.span; p.out != nil && !p.stale() {
		out.FiniteSpan = p.out
	}
	if len(out.Curve.X) == 0 && out.Search == nil && out.FiniteSpan == nil {
		return nil
	}
	return out
}

// countFailed counts a map's points without an answer.
func countFailed(r *mapRun) int {
	n := 0
	for k := range r.points {
		if r.failed(k) {
			n++
		}
	}
	return n
}
