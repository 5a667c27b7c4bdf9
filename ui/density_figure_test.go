package ui

import (
	"errors"
	"image"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	figures "sectionbench/export/figure"
	"sectionbench/ui/session"
)

// TestFigureBoxNewestWins: a drawing that finishes after a newer one was
// asked for is never shown, and an error empties the box with a note.
func TestFigureBoxNewestWins(t *testing.T) {
	test.NewTempApp(t)
	q := new(uiQueue)
	act := session.NewActivity()
	b := newFigureBox(act, q.Post, fyne.NewSize(100, 80))
	win := test.NewWindow(b)
	defer win.Close()
	win.Resize(fyne.NewSize(200, 160))
	wait := func() {
		for {
			act.Wait()
			if !q.Drain() {
				return
			}
		}
	}
	gate := make(chan struct{})
	figOf := func(w, h int) *figures.Figure { return &figures.Figure{Image: image.NewRGBA(image.Rect(0, 0, w, h))} }
	slow := figOf(1, 1)
	b.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) { <-gate; return slow, nil }, "")
	var fast *figures.Figure
	b.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) { fast = figOf(w, h); return fast, nil }, "")
	close(gate)
	wait()
	if got := b.Figure(); got == nil || got != fast {
		t.Fatalf("box shows %p, want the newest drawing %p (the older one is %p)", got, fast, slow)
	}
	if fast.Image.Bounds().Dx() < 100 {
		t.Errorf("drawn %d px wide in a box of 200 units", fast.Image.Bounds().Dx())
	}
	b.setDrawing(func(bool, int, int, float64) (*figures.Figure, error) { return nil, errors.New("bad data") }, "")
	wait()
	if b.Figure() != nil || !b.note.Visible() || b.note.Text != "bad data" {
		t.Errorf("after an error the box shows %v with note %q", b.Figure(), b.note.Text)
	}
}
