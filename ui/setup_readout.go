package ui

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/widget"
)

// readoutBox is a figureBox that reports the data under the pointer: its
// onHover gets the data coordinates (ok false when the pointer leaves the
// data area or the box).
type readoutBox struct {
	widget.BaseWidget
	box     *figureBox
	onHover func(x, y float64, ok bool)
}

func newReadoutBox(box *figureBox, onHover func(x, y float64, ok bool)) *readoutBox {
	r := &readoutBox{box: box, onHover: onHover}
	r.ExtendBaseWidget(r)
	return r
}

// CreateRenderer is part of fyne.Widget.
func (r *readoutBox) CreateRenderer() fyne.WidgetRenderer { return widget.NewSimpleRenderer(r.box) }

// MinSize is the figure's.
func (r *readoutBox) MinSize() fyne.Size { return r.box.MinSize() }

// MouseIn is part of desktop.Hoverable.
func (r *readoutBox) MouseIn(e *desktop.MouseEvent) { r.MouseMoved(e) }

// MouseMoved reads the data under the pointer from the figure on screen.
func (r *readoutBox) MouseMoved(e *desktop.MouseEvent) {
	f := r.box.Figure()
	if f == nil || r.onHover == nil {
		return
	}
	s := float32(1)
	if c := fyne.CurrentApp().Driver().CanvasForObject(r); c != nil && c.Scale() > 0 {
		s = c.Scale()
	}
	x, y, ok := f.DataAt(int(e.Position.X*s), int(e.Position.Y*s))
	r.onHover(x, y, ok)
}

// MouseOut is part of desktop.Hoverable.
func (r *readoutBox) MouseOut() {
	if r.onHover != nil {
		r.onHover(0, 0, false)
	}
}

var _ desktop.Hoverable = (*readoutBox)(nil)
