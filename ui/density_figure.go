package ui

import (
	"image"
	"image/color"
	"math"
	"sync"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/ui/session"
)

// figureRenderer draws a figure at a pixel size and dpi; it runs off the
// UI goroutine and must not touch widgets.
type figureRenderer func(dark bool, w, h int, dpi float64) (*figures.Figure, error)

// figureBox shows a figure drawn off the UI goroutine at the size of the
// box, redrawn when the box is resized or its drawing changes. Drawings
// that finish after a newer one was asked for are dropped.
type figureBox struct {
	widget.BaseWidget
	act   *session.Activity
	do    func(func())
	image *canvas.Image
	note  *widget.Label
	min   fyne.Size

	// UI goroutine only.
	draw   figureRenderer
	size   fyne.Size
	ticket uint64
	shown  uint64

	loop renderLoop

	mu    sync.Mutex
	req   figureRequest   // the newest drawing asked for
	drawn uint64          // ticket of the last drawing made
	fig   *figures.Figure // on screen
	err   error
}

// figureRequest is a drawing asked for, gathered on the UI goroutine.
type figureRequest struct {
	ticket uint64
	draw   figureRenderer
	dark   bool
	w, h   int
	dpi    float64
}

func newFigureBox(act *session.Activity, do func(func()), min fyne.Size) *figureBox {
	b := &figureBox{act: act, do: do, min: min, loop: renderLoop{act: act}}
	b.image = canvas.NewImageFromImage(image.NewRGBA(image.Rect(0, 0, 1, 1)))
	b.image.FillMode = canvas.ImageFillStretch
	b.image.ScaleMode = canvas.ImageScalePixels
	b.note = widget.NewLabelWithStyle("", fyne.TextAlignCenter, fyne.TextStyle{Italic: true})
	b.note.Wrapping = fyne.TextWrapWord
	b.note.Hide()
	b.ExtendBaseWidget(b)
	return b
}

// CreateRenderer is part of fyne.Widget.
func (b *figureBox) CreateRenderer() fyne.WidgetRenderer {
	// The note spans the box's width (a wrapping label centred in its
	// minimum size was one character wide: a column of letters), centred
	// vertically by the spacers.
	return &figureBoxRenderer{b: b, objects: []fyne.CanvasObject{b.image, container.NewVBox(layout.NewSpacer(), b.note, layout.NewSpacer())}}
}

// MinSize keeps the figure legible.
func (b *figureBox) MinSize() fyne.Size { return b.min }

type figureBoxRenderer struct {
	b       *figureBox
	objects []fyne.CanvasObject
}

func (r *figureBoxRenderer) Layout(size fyne.Size) {
	for _, o := range r.objects {
		o.Resize(size)
		o.Move(fyne.NewPos(0, 0))
	}
	if size != r.b.size {
		r.b.size = size
		r.b.redraw()
	}
}
func (r *figureBoxRenderer) MinSize() fyne.Size           { return r.b.min }
func (r *figureBoxRenderer) Refresh()                     { r.b.image.Refresh() }
func (r *figureBoxRenderer) Objects() []fyne.CanvasObject { return r.objects }
func (r *figureBoxRenderer) Destroy()                     {}

// setDrawing replaces what the box draws (nil: nothing, with note as the
// explanation) and redraws it.
func (b *figureBox) setDrawing(draw figureRenderer, note string) {
	b.draw = draw
	if draw == nil {
		b.ticket++
		b.shown = b.ticket
		b.show(nil, nil, note)
		return
	}
	b.redraw()
}

// redraw asks the render loop to draw the current drawing at the current
// size; redraws asked for while one runs coalesce into one.
func (b *figureBox) redraw() {
	if b.draw == nil || b.size.Width < 1 || b.size.Height < 1 {
		return
	}
	scale := float32(1)
	if c := fyne.CurrentApp().Driver().CanvasForObject(b); c != nil && c.Scale() > 0 {
		scale = c.Scale()
	}
	w := int(math.Round(float64(b.size.Width * scale)))
	h := int(math.Round(float64(b.size.Height * scale)))
	dpi := baseDPI * float64(scale)
	dark := fyne.CurrentApp().Settings().ThemeVariant() == theme.VariantDark
	b.ticket++
	b.mu.Lock()
	b.req = figureRequest{ticket: b.ticket, draw: b.draw, dark: dark, w: w, h: h, dpi: dpi}
	b.mu.Unlock()
	b.loop.request(b.drawNewest)
}

// drawNewest draws the newest request on the render loop's goroutine and
// posts it to the UI goroutine, where a drawing older than the newest one
// asked for is dropped.
func (b *figureBox) drawNewest() {
	b.mu.Lock()
	r := b.req
	again := r.ticket <= b.drawn // a coalesced run with nothing newer
	b.drawn = r.ticket
	b.mu.Unlock()
	if again {
		return
	}
	var fig *figures.Figure
	err := recovered(func() error {
		var err error
		fig, err = r.draw(r.dark, r.w, r.h, r.dpi)
		return err
	})
	b.do(func() {
		if r.ticket < b.ticket || r.ticket <= b.shown {
			return // a newer drawing was asked for
		}
		b.shown = r.ticket
		note := ""
		if err != nil {
			note = friendly(err)
			if isNoData(err) {
				note = "Nothing to draw yet."
			}
		}
		b.show(fig, err, note)
	})
}

// show puts a figure (or nothing, with a note) on screen.
func (b *figureBox) show(fig *figures.Figure, err error, note string) {
	b.mu.Lock()
	b.fig, b.err = fig, err
	b.mu.Unlock()
	if fig != nil {
		b.image.Image = fig.Image
	} else {
		b.image.Image = image.NewRGBA(image.Rect(0, 0, 1, 1))
	}
	b.image.Refresh()
	b.note.SetText(note)
	if note == "" {
		b.note.Hide()
	} else {
		b.note.Show()
	}
}

// Figure returns the figure on screen, or nil.
func (b *figureBox) Figure() *figures.Figure {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.fig
}

// widthOf is an invisible object that gives a column its width (a
// transparent fill, which every painter draws).
func widthOf(width float32) fyne.CanvasObject {
	r := canvas.NewRectangle(color.Transparent)
	r.SetMinSize(fyne.NewSize(width, 0))
	return r
}

// withWidth gives an entry a fixed width.
func withWidth(o fyne.CanvasObject, width float32) fyne.CanvasObject {
	return container.NewStack(widthOf(width), o)
}
