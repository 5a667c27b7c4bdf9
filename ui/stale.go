package ui

import (
	"image/color"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// Captions of a view whose figure is out of date.
const (
	staleSolving  = "Previous result: solving…"
	staleSweeping = "Previous sweep: running…"
)

// staleVeil lies over a view while what it shows is out of date (a solve
// or a sweep running for longer than busyDelay): the figure dimmed and a
// caption saying it is the previous result. It takes no input: the view
// under it still zooms, pans and reads out.
type staleVeil struct {
	dim         *canvas.Rectangle
	captionBack *canvas.Rectangle
	caption     *widget.Label
	box         *fyne.Container

	solving, sweeping bool
}

func newStaleVeil() *staleVeil {
	v := &staleVeil{dim: canvas.NewRectangle(color.Transparent)}
	v.caption = widget.NewLabelWithStyle("", fyne.TextAlignCenter, fyne.TextStyle{Bold: true})
	v.caption.Importance = widget.WarningImportance
	v.captionBack = canvas.NewRectangle(color.Transparent)
	v.box = container.NewStack(v.dim, container.NewVBox(container.NewHBox(layout.NewSpacer(),
		container.NewStack(v.captionBack, v.caption), layout.NewSpacer())))
	v.box.Hide()
	return v
}

// set marks the view out of date while a solve (solving) or a sweep
// (sweeping) it waits for runs. UI goroutine.
func (v *staleVeil) set(solving, sweeping bool) {
	v.solving, v.sweeping = solving, sweeping
	switch {
	case solving:
		v.caption.SetText(staleSolving)
	case sweeping:
		v.caption.SetText(staleSweeping)
	default:
		v.box.Hide()
		return
	}
	// The theme's background, part-transparent: the figure shows through,
	// visibly faded, in light and dark alike.
	r, g, b, _ := theme.Color(theme.ColorNameBackground).RGBA()
	v.dim.FillColor = color.NRGBA{R: uint8(r >> 8), G: uint8(g >> 8), B: uint8(b >> 8), A: staleDimAlpha}
	v.dim.Refresh()
	v.captionBack.FillColor = theme.Color(theme.ColorNameBackground)
	v.captionBack.Refresh()
	v.box.Show()
	v.box.Refresh() // lay the caption out again for its new text
}

// staleDimAlpha is how much the veil covers a figure: enough to see at a
// glance that it is not current, little enough to still read it.
const staleDimAlpha = 0x90

// Visible reports whether the view is marked out of date.
func (v *staleVeil) Visible() bool { return v.box.Visible() }
