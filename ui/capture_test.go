package ui

import (
	"image"
	"testing"
)

// TestCaptureMainWindow paints the whole main window with the test
// driver's software painter (which panics on a rectangle without a fill
// colour) and checks that the picture has the window's size and is not
// blank.
func TestCaptureMainWindow(t *testing.T) {
	w := newTestBench(t)
	for _, c := range []struct {
		name string
		prep func()
	}{
		{"demo", func() {}},
		{"results shown", w.toggleResults},
		{"flap added", func() { w.ctl.AddElement() }},
		{"enlarged", func() { w.toggleEnlarge(viewPressure) }},
		{"marked stale", func() {
			w.toggleEnlarge(numViews)
			w.busy.box.Show() // as after busyDelay without the result
			w.sweeping = true
			w.refreshStale()
		}},
	} {
		c.prep()
		w.WaitIdle()
		var img image.Image
		func() {
			defer func() {
				if r := recover(); r != nil {
					t.Fatalf("%s: capturing the main window panicked: %v", c.name, r)
				}
			}()
			img = w.Window().Canvas().Capture()
		}()
		cv := w.Window().Canvas()
		b := img.Bounds()
		if got, want := float32(b.Dx()), cv.Size().Width*cv.Scale(); got < want-1 || got > want+1 {
			t.Errorf("%s: capture is %d px wide, the canvas %g", c.name, b.Dx(), want)
		}
		if !varied(img) {
			t.Errorf("%s: the captured window is a single colour", c.name)
		}
	}
}

// varied reports whether an image has more than one colour.
func varied(img image.Image) bool {
	b := img.Bounds()
	r0, g0, b0, a0 := img.At(b.Min.X, b.Min.Y).RGBA()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			if r, g, bl, a := img.At(x, y).RGBA(); r != r0 || g != g0 || bl != b0 || a != a0 {
				return true
			}
		}
	}
	return false
}
