package ui

import (
	"image"
	"math"
	"sync"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/ui/session"
)

// viewKind names the four live views.
type viewKind int

const (
	viewPanels viewKind = iota
	viewPressure
	viewStreamlines
	viewPolar
	numViews
)

var viewTitles = [numViews]string{"Panels", "Surface pressure", "Streamlines", "Polar"}

func (k viewKind) String() string { return viewTitles[k] }

// baseDPI is the figure resolution at canvas scale 1: one Fyne unit is one
// pixel of a 96 dpi screen (common practice for desktop toolkits).
const baseDPI = 96

// Zoom steps: one wheel notch or button press scales the window by
// zoomStep; leCloseUpChords is the side of the square leading-edge close-up
// in chords of the element.
const (
	zoomStep        = 1.25
	wheelNotch      = 10.0 // Fyne scroll units per wheel notch (common practice: 10 on desktop drivers)
	leCloseUpChords = 0.15
)

// plotCanvas is the drawing area of one view: it shows a figure rendered off
// the UI goroutine and turns scrolls, drags and hovers into window changes
// and readouts.
type plotCanvas struct {
	widget.BaseWidget
	kind    viewKind
	act     *session.Activity
	image   *canvas.Image
	onHover func(text string)
	onNote  func(text string) // says why the view is empty, "" when it is not
	do      func(func())      // runs a function on the UI goroutine

	mu      sync.Mutex
	sc      *figures.Scene // newest scene, window not set
	win     figures.Window
	zoomed  bool
	dark    bool
	speed   bool    // colour streamlines by local speed
	shows   figKind // what the view draws: its own figure or an alternative
	element int     // element of the pressure and boundary-layer figures, −1 all (first)
	pxW     int
	pxH     int
	dpi     float64
	ticket  uint64 // last render started
	shown   uint64 // ticket of the figure on screen
	fig     *figures.Figure
	loop    renderLoop
	err     error
	base    *panelsBase // the panels figure without its key (view_draw.go)
	spare   *image.RGBA // an image no longer shown, for the next figure
}

func newPlotCanvas(kind viewKind, act *session.Activity, do func(func())) *plotCanvas {
	p := &plotCanvas{kind: kind, act: act, do: do, shows: figureOf(kind), element: -1, loop: renderLoop{act: act}}
	p.image = canvas.NewImageFromImage(image.NewRGBA(image.Rect(0, 0, 1, 1)))
	p.image.FillMode = canvas.ImageFillStretch
	p.image.ScaleMode = canvas.ImageScalePixels
	p.ExtendBaseWidget(p)
	return p
}

// CreateRenderer is part of fyne.Widget.
func (p *plotCanvas) CreateRenderer() fyne.WidgetRenderer {
	return &plotRenderer{p: p}
}

// MinSize keeps a view legible when the window is small.
func (p *plotCanvas) MinSize() fyne.Size { return fyne.NewSize(200, 140) }

type plotRenderer struct{ p *plotCanvas }

func (r *plotRenderer) Layout(size fyne.Size) {
	r.p.image.Resize(size)
	r.p.image.Move(fyne.NewPos(0, 0))
	r.p.sized(size)
}
func (r *plotRenderer) MinSize() fyne.Size           { return r.p.MinSize() }
func (r *plotRenderer) Refresh()                     { r.p.image.Refresh() }
func (r *plotRenderer) Objects() []fyne.CanvasObject { return []fyne.CanvasObject{r.p.image} }
func (r *plotRenderer) Destroy()                     {}

// scale returns the canvas scale the view is drawn at.
func (p *plotCanvas) scale() float32 {
	if c := fyne.CurrentApp().Driver().CanvasForObject(p); c != nil && c.Scale() > 0 {
		return c.Scale()
	}
	return 1
}

// sized records the pixel size for the next render; on a change it
// re-renders the newest scene.
func (p *plotCanvas) sized(size fyne.Size) {
	if size.Width < 1 || size.Height < 1 {
		return
	}
	s := p.scale()
	w, h := int(math.Round(float64(size.Width*s))), int(math.Round(float64(size.Height*s)))
	p.change(func() bool {
		changed := w != p.pxW || h != p.pxH
		p.pxW, p.pxH = w, h
		p.dpi = baseDPI * float64(w) / float64(size.Width)
		return changed
	})
}

// setDark chooses the figure colours; the UI goroutine calls it on theme
// changes.
func (p *plotCanvas) setDark(dark bool) {
	setAndRedraw(p, &p.dark, dark)
}

// setAndRedraw sets one of p's fields under the lock and redraws if its
// value changed.
func setAndRedraw[T comparable](p *plotCanvas, field *T, v T) {
	p.change(func() bool {
		changed := *field != v
		*field = v
		return changed
	})
}

// change runs set under the lock and redraws if it reports a change.
func (p *plotCanvas) change(set func() (changed bool)) {
	p.mu.Lock()
	changed := set()
	p.mu.Unlock()
	if changed {
		p.renderLater()
	}
}

// frame is one rendered figure waiting to be shown.
type frame struct {
	p      *plotCanvas
	ticket uint64
	fig    *figures.Figure
	err    error
}

// renderNow renders sc at the current size and window on the calling
// goroutine (never the UI goroutine) and returns the frame to show.
func (p *plotCanvas) renderNow(sc *figures.Scene) frame {
	p.mu.Lock()
	if sc != nil {
		p.sc = sc
	}
	p.ticket++
	t := p.ticket
	s, w, h, dpi, win, zoomed, dark, speed := p.sc, p.pxW, p.pxH, p.dpi, p.win, p.zoomed, p.dark, p.speed
	fk, elem := p.shows, p.element
	p.mu.Unlock()
	if s == nil || w < 1 || h < 1 {
		return frame{p: p, ticket: t}
	}
	c := *s
	c.Dark = dark
	c.SpeedColour = speed
	if zoomed {
		c.Window = win
	}
	if fk == figPressure || fk == figBoundaryLayer {
		c.Element = elem
		if s.Solution != nil && elem >= len(s.Solution.Elements) {
			c.Element = -1 // an element removed since the choice
		}
	}
	fig, err := p.draw(fk, &c, w, h, dpi)
	return frame{p: p, ticket: t, fig: fig, err: err}
}

// show puts a frame on screen unless a newer one is already there. UI
// goroutine only.
func (f frame) show() {
	p := f.p
	p.mu.Lock()
	if f.ticket <= p.shown || (f.fig == nil && f.err == nil) { // stale, or nothing was rendered
		p.mu.Unlock()
		if f.fig != nil {
			p.recycle(f.fig.Image)
		}
		return
	}
	p.shown = f.ticket
	p.err = f.err
	old := p.fig
	p.fig = f.fig
	p.mu.Unlock()
	if f.fig != nil {
		// The figure's own image, not a copy.
		p.image.Image = f.fig.Image
	} else {
		// Never leave an old figure up that no longer matches the study.
		p.image.Image = image.NewRGBA(image.Rect(0, 0, 1, 1))
	}
	p.image.Refresh()
	if old != nil {
		// Off screen from the next paint on (which runs on this
		// goroutine): the next figure is drawn into it.
		p.recycle(old.Image)
	}
	if p.onNote != nil {
		p.mu.Lock()
		visSweep := p.sc != nil && len(p.sc.SweepViscous) > 0
		note, coupled := coupledViewNote(p.sc, p.shows, f.err)
		p.mu.Unlock()
		if !coupled {
			note = viewNote(p.figure(), f.err, visSweep)
		}
		p.onNote(note)
	}
}

// figure returns what the view draws.
func (p *plotCanvas) figure() figKind {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.shows
}

// setFigure switches what the view draws and redraws it.
func (p *plotCanvas) setFigure(f figKind) {
	setAndRedraw(p, &p.shows, f)
}

// setElement chooses the element of the pressure and boundary-layer
// figures (−1: all, or the first) and redraws.
func (p *plotCanvas) setElement(i int) {
	setAndRedraw(p, &p.element, i)
}

// viewNote explains an empty view; visSweep tells whether the sweep has
// a boundary-layer estimate (which may have no drag at any angle).
func viewNote(f figKind, err error, visSweep bool) string {
	switch {
	case err == nil:
		return ""
	case f == figPolar && isNoData(err):
		return "No sweep for this configuration yet: press Run sweep."
	case (f == figDragPolar || f == figLiftToDrag) && isNoData(err) && visSweep:
		return "No drag at any angle of the sweep: a surface separates before its trailing edge, outside the method's range (see the results table)."
	case (f == figDragPolar || f == figLiftToDrag) && isNoData(err):
		return "No boundary-layer sweep for this configuration yet: press Run sweep (Panels & sweep tab)."
	case f == figBoundaryLayer && isNoData(err):
		return "No boundary layer: turn the estimate on in the Flow tab."
	case isNoData(err):
		return "Nothing to draw yet."
	}
	return friendly(err)
}

// renderLater re-renders the newest scene on a goroutine of its own,
// coalescing requests that arrive while one runs.
func (p *plotCanvas) renderLater() {
	p.loop.request(func() {
		f := p.renderNow(nil)
		p.do(f.show)
	})
}

// Figure returns the figure on screen, or nil.
func (p *plotCanvas) Figure() *figures.Figure {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.fig
}

// pixel converts a position in the view to figure pixels.
func (p *plotCanvas) pixel(pos fyne.Position) (int, int) {
	s := p.scale()
	return int(pos.X * s), int(pos.Y * s)
}

// window returns the data window on screen.
func (p *plotCanvas) window() (figures.Window, bool) {
	f := p.Figure()
	if f == nil {
		return figures.Window{}, false
	}
	return figureWindow(f)
}

// setWindow zooms to w (zoomed false: the figure's own extent).
func (p *plotCanvas) setWindow(w figures.Window, zoomed bool) {
	p.mu.Lock()
	p.win, p.zoomed = w, zoomed
	p.mu.Unlock()
	p.renderLater()
}

// ToggleSpeedColour switches streamline colouring by local speed.
func (p *plotCanvas) ToggleSpeedColour() {
	p.mu.Lock()
	p.speed = !p.speed
	p.mu.Unlock()
	p.renderLater()
}

// ResetZoom returns to the figure's own extent.
func (p *plotCanvas) ResetZoom() { p.setWindow(figures.Window{}, false) }

// ZoomBy scales the window by f about the data point (cx, cy); f < 1 zooms in.
func (p *plotCanvas) ZoomBy(f, cx, cy float64) {
	w, ok := p.asked()
	if !ok || !(f > 0) {
		return
	}
	p.setWindow(figures.Window{
		XMin: cx + (w.XMin-cx)*f, XMax: cx + (w.XMax-cx)*f,
		YMin: cy + (w.YMin-cy)*f, YMax: cy + (w.YMax-cy)*f,
	}, true)
}

// asked returns the window last asked for when zoomed, else the one on
// screen. The figure widens the window it is given to keep x and y at one
// scale, so zooming and panning start from what was asked: a step in and a
// step out then return exactly where they began.
func (p *plotCanvas) asked() (figures.Window, bool) {
	p.mu.Lock()
	w, zoomed := p.win, p.zoomed
	p.mu.Unlock()
	if zoomed {
		return w, true
	}
	return p.window()
}

// ZoomCentre scales the window about its centre.
func (p *plotCanvas) ZoomCentre(f float64) {
	w, ok := p.asked()
	if ok {
		p.ZoomBy(f, (w.XMin+w.XMax)/2, (w.YMin+w.YMax)/2)
	}
}

// CloseUpLE zooms the Panels view onto an element's leading edge.
func (p *plotCanvas) CloseUpLE(element int) {
	p.mu.Lock()
	sc := p.sc
	p.mu.Unlock()
	if sc == nil || sc.Layout == nil || element >= len(sc.Layout.Elements) {
		return
	}
	p.setWindow(leWindow(sc.Layout, element, leCloseUpChords), true)
}

// Scrolled zooms the Panels view about the pointer.
func (p *plotCanvas) Scrolled(e *fyne.ScrollEvent) {
	if p.kind != viewPanels {
		return
	}
	f := p.Figure()
	if f == nil {
		return
	}
	x, y, ok := f.DataAt(p.pixel(e.Position))
	if !ok {
		return
	}
	// One event zooms one step at most, however fast the wheel spins.
	steps := max(-1, min(1, -float64(e.Scrolled.DY)/wheelNotch))
	p.ZoomBy(math.Pow(zoomStep, steps), x, y)
}

// Dragged pans the Panels view.
func (p *plotCanvas) Dragged(e *fyne.DragEvent) {
	if p.kind != viewPanels {
		return
	}
	f := p.Figure()
	w, ok := p.asked()
	if f == nil || !ok {
		return
	}
	x0, y0, ok0 := f.DataAt(p.pixel(e.Position))
	x1, y1, ok1 := f.DataAt(p.pixel(e.Position.Subtract(e.Dragged)))
	if !ok0 || !ok1 {
		return
	}
	dx, dy := x1-x0, y1-y0
	p.setWindow(figures.Window{XMin: w.XMin + dx, XMax: w.XMax + dx, YMin: w.YMin + dy, YMax: w.YMax + dy}, true)
}

// DragEnd is part of fyne.Draggable.
func (p *plotCanvas) DragEnd() {}

// MouseIn is part of desktop.Hoverable.
func (p *plotCanvas) MouseIn(e *desktop.MouseEvent) { p.MouseMoved(e) }

// MouseMoved shows the value under the pointer on Pressure and Polar.
func (p *plotCanvas) MouseMoved(e *desktop.MouseEvent) {
	if p.onHover == nil || p.kind == viewPanels || p.kind == viewStreamlines {
		return
	}
	f := p.Figure()
	if f == nil {
		return
	}
	x, y, ok := f.DataAt(p.pixel(e.Position))
	if !ok {
		p.onHover("")
		return
	}
	p.onHover(readout(p.figure(), x, y))
}

// MouseOut is part of desktop.Hoverable.
func (p *plotCanvas) MouseOut() {
	if p.onHover != nil {
		p.onHover("")
	}
}

// readout formats the data under the pointer.
func readout(f figKind, x, y float64) string {
	switch f {
	case figPolar:
		return "α " + fixed(x, 2) + "°   Cl " + fixed(y, 3)
	case figDragPolar:
		return "Cd " + fixed(x, 4) + "   Cl " + fixed(y, 3)
	case figLiftToDrag:
		return "α " + fixed(x, 2) + "°   Cl/Cd " + fixed(y, 1)
	case figPressure:
		return "x/c " + fixed(x, 3) + "   Cp " + fixed(y, 3)
	}
	return ""
}

var (
	_ fyne.Scrollable   = (*plotCanvas)(nil)
	_ fyne.Draggable    = (*plotCanvas)(nil)
	_ desktop.Hoverable = (*plotCanvas)(nil)
)
