package ui

import (
	"math"
	"testing"

	"fyne.io/fyne/v2"
)

// TestWheelZoomFirstStep: the first wheel step from the automatic frame
// narrows the Panels view by the same factor as every later step.
func TestWheelZoomFirstStep(t *testing.T) {
	w := newTestBench(t)
	w.Window().Resize(fyne.NewSize(1280, 800))
	w.WaitIdle()
	p := w.views[viewPanels].canvas
	at := fyne.NewPos(p.Size().Width/2, p.Size().Height/3)
	wheel := func() {
		p.Scrolled(&fyne.ScrollEvent{PointEvent: fyne.PointEvent{Position: at}, Scrolled: fyne.Delta{DY: wheelNotch}})
		w.WaitIdle()
	}
	wid := func() float64 {
		v, ok := p.window()
		if !ok {
			t.Fatal("panels view has no window")
		}
		return v.XMax - v.XMin
	}
	w0 := wid()
	wheel()
	w1 := wid()
	wheel()
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
