package ui

import (
	"math"
	"testing"

	"fyne.io/fyne/v2"

	figures "sectionbench/export/figure"
)

// TestWheelZoomSymmetric: wheel steps zoom by the same factor in and out,
// so a step in and a step out about the same point return the Panels view
// to the window it had.
func TestWheelZoomSymmetric(t *testing.T) {
	p, wheel := panelsWheel(t)
	wid := func(v figures.Window) float64 { return v.XMax - v.XMin }
	wheel(wheelNotch) // into the zoomed state the wheel keeps
	askedStart, _ := p.asked()
	shownStart, ok := p.window()
	if !ok {
		t.Fatal("panels view has no window")
	}
	wheel(wheelNotch)
	askedIn, _ := p.asked()
	if r := wid(askedStart) / wid(askedIn); math.Abs(r-zoomStep) > 1e-9 {
		t.Errorf("a step in narrowed the window by %g, want %g", r, zoomStep)
	}
	wheel(-wheelNotch)
	askedBack, _ := p.asked()
	shownBack, _ := p.window()
	// To within a pixel: the point under the pointer is read from the
	// figure on screen, whose window the view widens to keep x and y at
	// one scale.
	tol := wid(shownStart) / float64(p.Size().Width)
	for _, c := range []struct {
		name       string
		got, start figures.Window
	}{{"asked", askedBack, askedStart}, {"shown", shownBack, shownStart}} {
		g, s := c.got, c.start
		if math.Abs(g.XMin-s.XMin) > tol || math.Abs(g.XMax-s.XMax) > tol || math.Abs(g.YMin-s.YMin) > tol || math.Abs(g.YMax-s.YMax) > tol {
			t.Errorf("%s window after a step in and out %+v, was %+v", c.name, g, s)
		}
	}
}

// panelsWheel opens the workbench at 1280×800 and returns its Panels view
// and a wheel turned by dy (wheelNotch: one step in) over a point of it,
// waiting for the redraw.
func panelsWheel(t *testing.T) (*plotCanvas, func(dy float32)) {
	w := newTestBench(t)
	w.Window().Resize(fyne.NewSize(1280, 800))
	w.WaitIdle()
	p := w.views[viewPanels].canvas
	at := fyne.NewPos(p.Size().Width/2, p.Size().Height/3)
	return p, func(dy float32) {
		p.Scrolled(&fyne.ScrollEvent{PointEvent: fyne.PointEvent{Position: at}, Scrolled: fyne.Delta{DY: dy}})
		w.WaitIdle()
	}
}

// TestWheelZoomFirstStep: the first wheel step from the automatic frame
// narrows the Panels view by the same factor as every later step.
func TestWheelZoomFirstStep(t *testing.T) {
	p, wheel := panelsWheel(t)
	wid := func() float64 {
		v, ok := p.window()
		if !ok {
			t.Fatal("panels view has no window")
		}
		return v.XMax - v.XMin
	}
	w0 := wid()
	wheel(wheelNotch)
	w1 := wid()
	wheel(wheelNotch)
	w2 := wid()
	// To a pixel of the view's width.
	tol := zoomStep / float64(p.Size().Width)
	if r := w0 / w1; math.Abs(r-zoomStep) > tol {
		t.Errorf("first step narrowed the view by %g, want %g", r, zoomStep)
	}
	if r := w1 / w2; math.Abs(r-zoomStep) > tol {
		t.Errorf("second step narrowed the view by %g, want %g", r, zoomStep)
	}
}
