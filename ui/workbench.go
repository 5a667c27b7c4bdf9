// Package ui is Sectionbench's desktop workbench: the Fyne widgets and their
// wiring. Each callback makes one call into model, solver or export through
// the Controller; the package does no numerics of its own. It never creates
// the Fyne app: cmd/sectionbench does and passes it in, so the package can be
// tested with fyne.io/fyne/v2/test.
package ui

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"
	"sync"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"sectionbench/assets"
	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// Default window size in Fyne units.
const (
	windowWidth  = 1280
	windowHeight = 800
	controlWidth = 330 // width of the control column
)

// caution is shown in About and Methods, cautionShort in the density
// window and cautionStatus in the status line, where it opens Methods and
// cautions.
const (
	caution       = "2-D estimates — validate by test. Structural design and mounting follow the competition's rules and qualified engineering review."
	cautionShort  = "2-D estimates — validate by test"
	cautionStatus = "2-D estimates — validate by test"
)

// Workbench is the main window: the control column, the four views and the
// status line.
type Workbench struct {
	app fyne.App
	win fyne.Window
	ctl *session.Controller
	// do runs a function on the UI goroutine: fyne.Do, or in tests a
	// queue that WaitIdle drains on the test goroutine.
	do    func(func())
	drain func() bool

	views    [numViews]*plotView
	viewArea *fyne.Container
	grid     *fyne.Container
	enlarged viewKind // numViews when none

	controls *controls
	origin   editOrigin // the control that made the newest edit (refusal.go)
	sceneMu  sync.Mutex
	scene    *figures.Scene // newest scene shown
	status   *statusLine
	busy     *busyMark
	sweeping bool // a sweep has run past busyDelay: the polar is marked out of date
	caution  *widget.Button
	warnings *widget.Button
	results  *resultsPanel
	showRes  *widget.Button

	undoItem, redoItem *fyne.MenuItem // greyed out without a step to take

	opt      Options
	density  *densityWindow // nil until first opened
	setup    *setupWindow   // nil until first opened
	autosave *autosaver     // nil when autosave is off
	saveDlg  *saveDialog    // the last "save as" dialog; nil until one opens
	// startupErr says why the study named at start could not be opened.
	startupErr error
}

// Options configure a workbench.
type Options struct {
	// AutosaveDir is the folder where unsaved changes are kept for
	// recovery after a crash; "" turns autosave off.
	AutosaveDir string
	// SweepOnOpen runs the sweep of a study opened with the viscous
	// solution on (whose polar is not swept live), with its progress and
	// Cancel, so the polar fills in without a press of Run sweep.
	SweepOnOpen bool

	// start is the study opened when no path is given, instead of the
	// embedded demo (tests: the demo with its viscous solution off).
	start *model.Study
}

// DefaultOptions are the desktop app's: autosave in the folder the
// SECTIONBENCH_CONFIG_DIR environment variable names, else in
// "sectionbench" under the user's configuration folder, and the sweep of
// a viscous study run when it is opened.
func DefaultOptions() Options { return Options{AutosaveDir: defaultAutosaveDir(), SweepOnOpen: true} }

// New opens a workbench window in app for the study at path, or for the
// embedded demo study if path is empty, with DefaultOptions. The window is
// not shown yet.
func New(app fyne.App, path string) (*Workbench, error) {
	return NewWithOptions(app, path, DefaultOptions())
}

// NewWithOptions is New with the given options.
func NewWithOptions(app fyne.App, path string, opt Options) (*Workbench, error) {
	return newWorkbench(app, path, opt, fyne.Do, nil)
}

// newWorkbench is NewWithOptions with the UI-goroutine hook: do posts a
// function, drain (if not nil) runs the posted ones and reports whether
// there were any.
func newWorkbench(app fyne.App, path string, opt Options, do func(func()), drain func() bool) (*Workbench, error) {
	var st *model.Study
	var opened *export.OpenedStudy
	var err, pathErr error
	requested := path
	if path != "" {
		// A study that cannot be opened does not stop the app: it starts
		// on the demo, says what is wrong with the file, and still offers
		// the autosave of a window that crashed.
		if opened, pathErr = export.OpenStudy(path); pathErr != nil {
			path = ""
		}
	}
	if path == "" {
		if st, err = model.DecodeStudy(assets.DemoStudy); err != nil {
			return nil, err
		}
		if opt.start != nil {
			st = opt.start
		}
	}
	ctl := session.NewController(do)
	w := &Workbench{app: app, ctl: ctl, enlarged: numViews, do: do, drain: drain, opt: opt}
	w.win = app.NewWindow("Sectionbench")
	ctl.Subscribe(w.studyChanged)
	w.build()
	ctl.OnResult = w.present
	ctl.OnError = w.userError
	ctl.OnRefused = w.refused
	if opened != nil {
		ctl.Open(opened, path)
	} else if err := ctl.Load(st, path); err != nil {
		return nil, err
	}
	w.sweepOnOpen()
	if pathErr != nil {
		why := friendly(pathErr)
		if !strings.Contains(why, requested) {
			why = requested + ": " + why
		}
		w.startupErr = fmt.Errorf("the study could not be opened: %s. The demo study is open instead; the file is left as it is", why)
		showError(w.startupErr, w.win)
	}
	return w, nil
}

// sweepOnOpen starts the sweep of a study just opened when the options
// ask for it and the polar is not swept live (the viscous solution is
// on): the same run as the Run sweep button, with progress and Cancel.
func (w *Workbench) sweepOnOpen() {
	if w.opt.SweepOnOpen && w.ctl.Study().Viscous.Enabled {
		w.controls.runSweep()
	}
}

// Window returns the workbench window.
func (w *Workbench) Window() fyne.Window { return w.win }

// Controller returns the workbench's controller.
func (w *Workbench) Controller() *session.Controller { return w.ctl }

// ShowAndRun shows the window and runs the app until it quits.
func (w *Workbench) ShowAndRun() { w.win.ShowAndRun() }

// WaitIdle blocks until every solve and render in flight has been shown.
func (w *Workbench) WaitIdle() {
	for {
		w.ctl.WaitIdle()
		if w.drain == nil || !w.drain() {
			return
		}
	}
}

func (w *Workbench) build() {
	for k := range numViews {
		w.views[k] = newPlotView(k, w.ctl.Activity(), w.do, w.toggleEnlarge, w.ctl.Element)
	}
	w.grid = container.NewGridWithColumns(2,
		w.views[viewPanels], w.views[viewPressure], w.views[viewStreamlines], w.views[viewPolar])
	w.viewArea = container.NewStack(w.grid)

	w.controls = newControls(w)
	side := container.NewStack(widthOf(controlWidth), w.controls.box)

	w.status = newStatusLine("Solving…")
	w.warnings = widget.NewButtonWithIcon("", theme.WarningIcon(), w.showReport)
	w.warnings.Importance = widget.LowImportance
	w.warnings.Hide()
	// The caution stays on screen; its full text is one click away.
	w.caution = widget.NewButtonWithIcon(cautionStatus, theme.InfoIcon(), w.showMethods)
	w.caution.Importance = widget.LowImportance
	w.results = newResultsPanel()
	w.showRes = widget.NewButtonWithIcon("Results", theme.ListIcon(), w.toggleResults)
	w.showRes.Importance = widget.LowImportance
	w.busy = newBusyMark()
	// The views say so too, on themselves: the status line is easy to miss.
	w.busy.onShow, w.busy.onHide = w.refreshStale, w.refreshStale
	statusLine := container.NewBorder(nil, nil, w.busy.box, container.NewHBox(w.warnings, w.showRes, w.caution), w.status.box)

	content := container.NewBorder(nil, container.NewVBox(w.results.box, widget.NewSeparator(), statusLine), side, nil, w.viewArea)
	w.win.SetContent(content)
	w.win.Resize(fyne.NewSize(windowWidth, windowHeight))
	w.win.SetMainMenu(w.menu())
	w.win.SetCloseIntercept(w.closeRequested)
	w.win.SetOnDropped(w.dropped)
	w.win.SetIcon(fyne.NewStaticResource("icon.png", assets.Icon))
	w.setDark(w.app.Settings().ThemeVariant() == theme.VariantDark)
	w.app.Settings().AddListener(func(s fyne.Settings) {
		w.setDark(s.ThemeVariant() == theme.VariantDark)
	})
}

func (w *Workbench) setDark(dark bool) {
	for _, v := range w.views {
		v.canvas.setDark(dark)
	}
}

// toggleResults shows or hides the results table under the views.
func (w *Workbench) toggleResults() {
	if w.results.box.Hidden {
		w.results.box.Show()
	} else {
		w.results.box.Hide()
	}
}

// toggleEnlarge shows view k alone, or the grid again if it already is.
func (w *Workbench) toggleEnlarge(k viewKind) {
	if w.enlarged == k || k == numViews {
		w.enlarged = numViews
		w.grid.Objects = []fyne.CanvasObject{w.views[viewPanels], w.views[viewPressure], w.views[viewStreamlines], w.views[viewPolar]}
		w.viewArea.Objects = []fyne.CanvasObject{w.grid}
	} else {
		w.enlarged = k
		w.viewArea.Objects = []fyne.CanvasObject{w.views[k]}
	}
	for i, v := range w.views {
		v.setEnlarged(viewKind(i) == w.enlarged)
	}
	w.viewArea.Refresh()
}

// present renders a current result into the four views on the worker
// goroutine, then shows them together on the UI goroutine unless a newer
// request has been made meanwhile.
func (w *Workbench) present(gen uint64, sc *figures.Scene, res *engine.Result, err error) {
	if err != nil {
		w.do(func() {
			w.busy.shown(gen)
			w.showStatusError(err)
			w.results.stale()
		})
		return
	}
	frames := renderViews(w.views, sc)
	w.do(func() {
		if gen != w.ctl.Latest() {
			return // stale: a newer request is on its way
		}
		for _, f := range frames {
			f.show()
		}
		w.busy.shown(gen)
		w.sceneMu.Lock()
		w.scene = sc
		w.sceneMu.Unlock()
		w.showStatus(res)
		w.results.show(res)
		w.controls.showResult(w.ctl.Current(), res)
	})
}

// refreshStale marks the views out of date: every view while the busy
// mark is up (a solve past busyDelay), the polar also while a sweep runs
// past it. UI goroutine.
func (w *Workbench) refreshStale() {
	solving := w.busy.Visible()
	for k, v := range w.views {
		v.setStale(solving, w.sweeping && viewKind(k) == viewPolar)
	}
}

// lastScene returns the scene on screen, or nil before the first result.
func (w *Workbench) lastScene() *figures.Scene {
	w.sceneMu.Lock()
	defer w.sceneMu.Unlock()
	return w.scene
}

func (w *Workbench) showStatus(res *engine.Result) {
	items, imp := statusItems(res), widget.MediumImportance
	if fl := resultFlags(res); len(fl) > 0 {
		// First, so that it is never left off a narrow line.
		// Short: the results table below and its note say more.
		items = append([]string{"Caution: " + model.FlagWords(fl)}, items...)
		imp = widget.WarningImportance
	}
	w.status.set(items, imp)
	clean := 0
	for _, r := range w.ctl.Reports() {
		if r != nil {
			clean += len(r.Warnings)
		}
	}
	solve := 0
	if res.Solution != nil {
		solve = len(res.Solution.Warnings)
	}
	// Short: the report it opens says which are which.
	if n := clean + solve; n > 0 {
		w.warnings.SetText(fmt.Sprintf("%d warning%s", n, plural(n)))
		w.warnings.Show()
	} else {
		w.warnings.Hide()
	}
}

func (w *Workbench) showStatusError(err error) {
	msg := firstLine(err.Error())
	if g, ok := geometryText(err); ok {
		msg = g
	} else if !errors.Is(err, context.Canceled) {
		msg = friendly(err)
	}
	w.status.set([]string{"Not solved: " + msg}, widget.DangerImportance)
}

// statusItems summarises a result in order of importance: Cl (the
// downforce coefficient −Cl when inverted, with its sign stated), the
// force, the drag estimate, the suction peak, Cm and the solve time.
func statusItems(res *engine.Result) []string {
	s := res.Solution
	if s == nil {
		return []string{"No solution"}
	}
	if res.Coupled != nil {
		return coupledStatusItems(res)
	}
	inv := res.Layout != nil && res.Layout.Inverted
	var parts []string
	if inv {
		parts = append(parts, "−Cl "+fixed(engine.Downforce(s.Cl), 3)+" (from circulation, + down)")
	} else {
		parts = append(parts, "Cl "+fixed(s.Cl, 3)+" (from circulation, + up)")
	}
	if f := res.Forces; f != nil {
		name, per := "lift ", f.LiftPerSpan
		if inv {
			name, per = "downforce ", f.DownforcePerSpan
		}
		t := name + fixed(per, 1) + " N/m"
		if f.SpanM > 0 {
			t += ", " + fixed(f.SpanTotal(per), 1) + " N on " + num(f.SpanM) + " m"
		}
		parts = append(parts, t)
	}
	if v := res.Viscous; v != nil {
		if math.IsNaN(v.Cd) {
			parts = append(parts, "no Cd (separated)")
		} else if inv {
			parts = append(parts, "Cd "+fixed(v.Cd, 4), "−Cl/Cd "+fixed(engine.Downforce(res.LiftToDrag()), 1))
		} else {
			parts = append(parts, "Cd "+fixed(v.Cd, 4), "Cl/Cd "+fixed(res.LiftToDrag(), 1))
		}
	}
	best := -1
	for i, e := range s.Elements {
		if best < 0 || e.CpMin < s.Elements[best].CpMin {
			best = i
		}
	}
	if best >= 0 {
		e := s.Elements[best]
		where := "x/c " + fixed(e.XCpMin, 3)
		if len(s.Elements) > 1 {
			where += " on " + e.Name
		}
		parts = append(parts, "min Cp "+fixed(e.CpMin, 2)+" at "+where)
	}
	parts = append(parts, "Cm "+fixed(s.Cm, 3), fmt.Sprintf("solve %d ms", res.Elapsed.Milliseconds()))
	return parts
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i]
	}
	return s
}

// studyChanged refreshes the title and the controls after the study changed.
func (w *Workbench) studyChanged() {
	st := w.ctl.Current()
	title := st.Name
	if w.ctl.Dirty() {
		title += " •"
	}
	w.win.SetTitle(title + " — Sectionbench")
	w.syncUndoItems()
	w.controls.sync(st)
	names := make([]string, len(st.Elements))
	for i, e := range st.Elements {
		names[i] = fmt.Sprintf("%d %s", i+1, e.Name)
	}
	for _, v := range w.views {
		v.setStudy(names, st.Viscous.Enabled, st.Viscous.Enabled && !st.Viscous.IsCoupled()) // drag figures: the estimate's
	}
	w.busy.waitFor(w.ctl.Latest(), w.do)
	if autoSweep(st) && w.ctl.Sweep() == nil {
		w.controls.runSweep()
	}
}

// autoSweep reports whether a study's polar runs by itself, with progress,
// whenever it is out of date: in ground effect, where every angle is a
// solve of its own but an inviscid sweep of up to session.LiveSweepMaxAngles
// angles still takes a fraction of a second. A free-air sweep runs with
// every update instead (liveSweep); one with the boundary layer waits for
// the Run button.
func autoSweep(st *model.Study) bool {
	a, err := st.Sweep.Angles()
	return err == nil && len(a) <= session.LiveSweepMaxAngles && !st.Viscous.Enabled && st.Ground.Enabled
}

// userError explains bad input in a dialog; the study is left unchanged.
func (w *Workbench) userError(err error) {
	if err == nil {
		return
	}
	showError(errors.New(friendly(err)), w.win)
}

// dark reports whether the app uses the dark theme (the figures' colours
// follow it).
func (w *Workbench) dark() bool {
	return w.app.Settings().ThemeVariant() == theme.VariantDark
}

// renderViews renders every view of sc at once, each on its own goroutine:
// the views share the scene read-only and keep their own state, and
// drawing is most of an update's time (a machine with two cores draws an
// angle change in about half the time).
func renderViews(views [numViews]*plotView, sc *figures.Scene) [numViews]frame {
	var frames [numViews]frame
	eachViewAtOnce(func(k viewKind) { frames[k] = views[k].canvas.renderNow(sc) })
	return frames
}

// eachViewAtOnce calls f for every view, each on its own goroutine, and
// returns when all have returned.
func eachViewAtOnce(f func(k viewKind)) {
	var wg sync.WaitGroup
	for k := range numViews {
		wg.Add(1)
		go func() {
			defer wg.Done()
			f(k)
		}()
	}
	wg.Wait()
}
