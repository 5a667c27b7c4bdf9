package ui

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// plotView is one of the four views: a header with its title, the readout
// and its buttons above the drawing area.
type plotView struct {
	widget.BaseWidget
	kind    viewKind
	canvas  *plotCanvas
	readout *widget.Label
	note    *widget.Label
	enlarge *widget.Button
	tools   []fyne.CanvasObject
}

// newPlotView builds a view; onEnlarge toggles it between its cell and the
// whole view area.
// element tells which element the leading-edge close-up shows.
func newPlotView(kind viewKind, act *activity, do func(func()), onEnlarge func(viewKind), element func() int) *plotView {
	v := &plotView{kind: kind, canvas: newPlotCanvas(kind, act, do)}
	v.readout = widget.NewLabel("")
	v.readout.TextStyle = fyne.TextStyle{Monospace: true}
	v.canvas.onHover = func(s string) { v.readout.SetText(s) }
	v.note = widget.NewLabelWithStyle("", fyne.TextAlignCenter, fyne.TextStyle{Italic: true})
	v.note.Hide()
	v.canvas.onNote = func(s string) {
		v.note.SetText(s)
		if s == "" {
			v.note.Hide()
		} else {
			v.note.Show()
		}
	}
	v.enlarge = widget.NewButtonWithIcon("", theme.ViewFullScreenIcon(), func() { onEnlarge(kind) })
	v.enlarge.Importance = widget.LowImportance
	switch kind {
	case viewPanels:
		le := widget.NewButtonWithIcon("LE", theme.ZoomInIcon(), func() { v.canvas.CloseUpLE(element()) })
		reset := widget.NewButtonWithIcon("", theme.ZoomFitIcon(), v.canvas.ResetZoom)
		v.tools = []fyne.CanvasObject{le, reset}
	case viewStreamlines:
		in := widget.NewButtonWithIcon("", theme.ZoomInIcon(), func() { v.canvas.ZoomCentre(1 / zoomStep) })
		out := widget.NewButtonWithIcon("", theme.ZoomOutIcon(), func() { v.canvas.ZoomCentre(zoomStep) })
		reset := widget.NewButtonWithIcon("", theme.ZoomFitIcon(), v.canvas.ResetZoom)
		speed := widget.NewButtonWithIcon("", theme.ColorPaletteIcon(), v.canvas.ToggleSpeedColour)
		v.tools = []fyne.CanvasObject{speed, in, out, reset}
	}
	for _, t := range v.tools {
		t.(*widget.Button).Importance = widget.LowImportance
	}
	v.ExtendBaseWidget(v)
	return v
}

// setEnlarged switches the enlarge button's icon.
func (v *plotView) setEnlarged(on bool) {
	if on {
		v.enlarge.SetIcon(theme.ViewRestoreIcon())
	} else {
		v.enlarge.SetIcon(theme.ViewFullScreenIcon())
	}
}

// CreateRenderer is part of fyne.Widget.
func (v *plotView) CreateRenderer() fyne.WidgetRenderer {
	title := widget.NewLabelWithStyle(v.kind.String(), fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	right := container.NewHBox(append(append([]fyne.CanvasObject{v.readout}, v.tools...), v.enlarge)...)
	header := container.NewBorder(nil, nil, title, right)
	body := container.NewStack(v.canvas, container.NewCenter(v.note))
	return widget.NewSimpleRenderer(container.NewBorder(header, nil, nil, nil, body))
}
