package ui

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"sectionbench/ui/session"
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
	title   *widget.Label
	stale   *staleVeil // over the drawing while its figure is out of date
	// emptyNote says why the view is empty ("" when it shows a figure);
	// sweeping is set while a sweep the view waits for runs, which the
	// note then says instead.
	emptyNote string
	sweeping  bool

	// Pressure view: the element shown and the boundary-layer switch.
	elements *widget.Select
	blToggle *widget.Button
	// Polar view: Cl and Cm, the drag polar or Cl/Cd.
	polarMode *widget.Select
	viscous   bool     // the study has a boundary layer to show (estimate or coupled)
	names     []string // element names for the choice
}

// Polar view modes.
const (
	polarLift = "Cl, Cm – α"
	polarDrag = "Cl – Cd"
	polarLD   = "Cl/Cd – α"
)

// allElements is the pressure view's choice of every element.
const allElements = "All elements"

// newPlotView builds a view; onEnlarge toggles it between its cell and the
// whole view area.
// element tells which element the leading-edge close-up shows.
func newPlotView(kind viewKind, act *session.Activity, do func(func()), onEnlarge func(viewKind), element func() int) *plotView {
	v := &plotView{kind: kind, canvas: newPlotCanvas(kind, act, do), stale: newStaleVeil()}
	v.title = widget.NewLabelWithStyle(kind.String(), fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	v.title.Truncation = fyne.TextTruncateEllipsis
	v.readout = widget.NewLabel("")
	v.readout.TextStyle = fyne.TextStyle{Monospace: true}
	v.canvas.onHover = func(s string) { v.readout.SetText(s) }
	v.note = widget.NewLabelWithStyle("", fyne.TextAlignCenter, fyne.TextStyle{Italic: true})
	v.note.Wrapping = fyne.TextWrapWord // a long note must not widen the view
	v.note.Hide()
	v.canvas.onNote = func(s string) {
		v.emptyNote = s
		v.showNote()
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
	case viewPressure:
		v.elements = widget.NewSelect(nil, func(string) {
			i := v.elements.SelectedIndex()
			if len(v.elements.Options) > 0 && v.elements.Options[0] == allElements {
				i-- // "All elements" is −1
			}
			v.canvas.setElement(i)
		})
		v.elements.Hide()
		v.blToggle = widget.NewButton("BL", func() { v.showBoundaryLayer(v.canvas.figure() != figBoundaryLayer) })
		v.blToggle.Hide()
		v.tools = []fyne.CanvasObject{v.elements, v.blToggle}
	case viewPolar:
		v.polarMode = widget.NewSelect([]string{polarLift, polarDrag, polarLD}, func(s string) { v.setPolarMode(s) })
		v.polarMode.Selected = polarLift
		v.polarMode.Hide()
		v.tools = []fyne.CanvasObject{v.polarMode}
	}
	for _, t := range v.tools {
		if b, ok := t.(*widget.Button); ok {
			b.Importance = widget.LowImportance
		}
	}
	v.ExtendBaseWidget(v)
	return v
}

// sweepRunningNote stands in an empty polar while its first sweep runs.
const sweepRunningNote = "Sweep running: the polar appears when it ends (progress in the Panels & sweep tab)."

// showNote shows why the view is empty, or that its sweep is running.
func (v *plotView) showNote() {
	s := v.emptyNote
	if s != "" && v.sweeping {
		s = sweepRunningNote
	}
	v.note.SetText(s)
	if s == "" {
		v.note.Hide()
	} else {
		v.note.Show()
	}
}

// setStale marks the view out of date while a solve (solving) or a sweep
// it waits for (sweeping) runs. A view with no figure has nothing to dim:
// it keeps its note, which says when the sweep it waits for is running
// (the veil's "Previous sweep: running…" stood over "No sweep for this
// configuration yet: press Run sweep."). UI goroutine.
func (v *plotView) setStale(solving, sweeping bool) {
	v.sweeping = sweeping
	if v.emptyNote != "" {
		v.stale.set(false, false)
	} else {
		v.stale.set(solving, sweeping)
	}
	v.showNote()
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
	right := container.NewHBox(append(append([]fyne.CanvasObject{v.readout}, v.tools...), v.enlarge)...)
	header := container.NewBorder(nil, nil, nil, right, v.title)
	body := container.NewStack(v.canvas, v.stale.box, container.NewVBox(layout.NewSpacer(), v.note, layout.NewSpacer()))
	return widget.NewSimpleRenderer(container.NewBorder(header, nil, nil, nil, body))
}

// showBoundaryLayer switches the pressure view between Cp and the
// boundary layer (θ, δ*, H, Cf) of the chosen element.
func (v *plotView) showBoundaryLayer(on bool) {
	f, title := figPressure, v.kind.String()
	v.blToggle.Importance = widget.LowImportance
	if on {
		f, title = figBoundaryLayer, "Boundary layer"
		v.blToggle.Importance = widget.HighImportance
	}
	v.blToggle.Refresh()
	v.title.SetText(title)
	v.canvas.setFigure(f)
	v.refreshElements()
}

// refreshElements sets the element choice from the names and the element
// shown. Cp can show all elements at once; the boundary layer one at a
// time (the first when none was chosen).
func (v *plotView) refreshElements() {
	bl := v.canvas.figure() == figBoundaryLayer
	sel := v.canvas.element
	if sel >= len(v.names) {
		sel = -1
	}
	opts := v.names
	idx := sel
	if bl {
		idx = max(sel, 0)
	} else {
		opts = append([]string{allElements}, v.names...)
		idx = sel + 1
	}
	v.elements.SetOptions(opts)
	v.elements.SetSelectedIndex(idx)
	if len(v.names) > 1 {
		v.elements.Show()
	} else {
		v.elements.Hide()
	}
}

// setPolarMode switches the polar view's figure.
func (v *plotView) setPolarMode(mode string) {
	f, title := figPolar, v.kind.String()
	switch mode {
	case polarDrag:
		f, title = figDragPolar, "Drag polar"
	case polarLD:
		f, title = figLiftToDrag, "Lift to drag"
	}
	v.title.SetText(title)
	v.canvas.setFigure(f)
}

// setStudy adapts the view's header to the study: the element names,
// whether the boundary-layer figure is offered (bl: the estimate or the
// coupled solution is on) and whether the drag figures are (drag: the
// estimate's sweep).
func (v *plotView) setStudy(names []string, bl, drag bool) {
	v.viscous = bl
	switch v.kind {
	case viewPressure:
		v.names = names
		if v.canvas.figure() == figBoundaryLayer && !bl {
			v.showBoundaryLayer(false) // refreshes the elements
		} else {
			v.refreshElements()
		}
		if bl {
			v.blToggle.Show()
		} else {
			v.blToggle.Hide()
		}
	case viewPolar:
		if !drag && v.polarMode.Selected != polarLift {
			v.polarMode.SetSelected(polarLift)
		}
		if drag {
			v.polarMode.Show()
		} else {
			v.polarMode.Hide()
		}
	}
}
