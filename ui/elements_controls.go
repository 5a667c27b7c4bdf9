package ui

import (
	"errors"
	"fmt"
	"image/color"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// elementControls are the element list and the placement of the selected
// element. Like the rest of the column they edit the study only through
// the controller and are set from it by sync.
type elementControls struct {
	c *controls

	list       *widget.List
	listHeight *canvas.Rectangle
	rows       []string // list texts, set by sync
	add        *widget.Button
	remove     *widget.Button
	up, down   *widget.Button
	msg        *widget.Label

	placeHead            *widget.Label
	name                 *field
	chord, x, y, angle   *field
	angleLabel           *widget.Label
	mainPlace            *fyne.Container // x, y and setting angle: the first element only
	flapHead             *widget.Label
	gap, overlap, deflec *field
	deflecLabel          *widget.Label
	flapPlace            *widget.Label   // a flap's position and setting angle, derived from its slot
	flap                 *fyne.Container // the flap fields, hidden for the first element
	frame                *widget.Label   // the frame and sign convention
	placeMsg             *widget.Label

	refChord *field
	refMsg   *widget.Label
}

func newElementControls(c *controls) *elementControls {
	ec := &elementControls{c: c}
	ctl := c.w.ctl

	ec.list = widget.NewList(
		func() int { return len(ec.rows) },
		func() fyne.CanvasObject {
			l := widget.NewLabel("")
			l.Truncation = fyne.TextTruncateEllipsis
			return l
		},
		func(id widget.ListItemID, o fyne.CanvasObject) {
			if id < len(ec.rows) {
				o.(*widget.Label).SetText(ec.rows[id])
			}
		})
	ec.list.OnSelected = func(id widget.ListItemID) {
		if !c.syncing && id < len(ctl.Current().Elements) {
			ctl.SetElement(id)
		}
	}
	ec.listHeight = canvas.NewRectangle(color.Transparent)
	ec.msg = message()
	ec.add = widget.NewButtonWithIcon("Add flap", theme.ContentAddIcon(), func() { c.w.editFrom(ec.msg); setMessage(ec.msg, ctl.AddElement()) })
	ec.remove = widget.NewButtonWithIcon("Remove", theme.ContentRemoveIcon(), func() { c.w.editFrom(ec.msg); setMessage(ec.msg, ctl.RemoveElement(ctl.Element())) })
	ec.up = widget.NewButtonWithIcon("", theme.MoveUpIcon(), func() { c.w.editFrom(ec.msg); setMessage(ec.msg, ctl.MoveElement(ctl.Element(), -1)) })
	ec.down = widget.NewButtonWithIcon("", theme.MoveDownIcon(), func() { c.w.editFrom(ec.msg); setMessage(ec.msg, ctl.MoveElement(ctl.Element(), 1)) })

	ec.placeHead = heading("Placement")
	ec.placeMsg = message()
	w := c.w
	ec.name = textField(w, ec.placeMsg, func(s string) error {
		i := ctl.Element()
		return ctl.SetElementName("", i, s)
	})
	placeField := func(name string, set func(*session.Placement, float64)) *field {
		return newField(w, ec.placeMsg, func(s string) error { return ec.editPlacement(name, s, set) })
	}
	ec.chord = placeField("chord", func(p *session.Placement, v float64) { p.ChordMM = v })
	ec.x = placeField("leading edge x", func(p *session.Placement, v float64) { p.XMM = v })
	ec.y = placeField("leading edge y", func(p *session.Placement, v float64) { p.YMM = v })
	ec.angle = placeField("setting angle", func(p *session.Placement, v float64) { p.AngleDeg = v })
	slotField := func(name string, set func(*model.Slot, float64)) *field {
		return newField(w, ec.placeMsg, func(s string) error { return ec.editSlot(name, s, set) })
	}
	ec.gap = slotField("gap", func(p *model.Slot, v float64) { p.GapMM = v })
	ec.overlap = slotField("overlap", func(p *model.Slot, v float64) { p.OverlapMM = v })
	ec.deflec = slotField("deflection", func(p *model.Slot, v float64) { p.DeflectionDeg = v })
	ec.angleLabel = captionLabel("")
	ec.deflecLabel = captionLabel("")
	ec.mainPlace = container.NewVBox(
		container.NewBorder(ec.angleLabel, nil, nil, nil, ec.angle),
		container.NewGridWithColumns(2, labelled("leading edge x (mm)", ec.x), labelled("leading edge y (mm)", ec.y)),
	)
	ec.flapHead = caption("")
	ec.flapPlace = caption("")
	ec.flap = container.NewVBox(
		ec.flapHead,
		container.NewCenter(newSlotDiagram()),
		container.NewGridWithColumns(2, labelled("gap (mm)", ec.gap), labelled("overlap (mm)", ec.overlap)),
		container.NewBorder(ec.deflecLabel, nil, nil, nil, ec.deflec),
		ec.flapPlace,
	)
	ec.frame = caption("")

	ec.refMsg = message()
	ec.refChord = newField(w, ec.refMsg, func(s string) error {
		v := 0.0
		if strings.TrimSpace(s) != "" {
			var err error
			if v, err = parseNumber(s); err != nil {
				return errors.New("reference chord must be a number of millimetres, or empty for the sum of the chords")
			}
			if !(v > 0) {
				return errors.New("reference chord must be positive, or empty for the sum of the chords")
			}
		}
		return ctl.SetReferenceChord("", v)
	})
	return ec
}

// captionLabel is a small label over a field.
func captionLabel(s string) *widget.Label {
	l := widget.NewLabel(s)
	l.SizeName = theme.SizeNameCaptionText
	return l
}

// listBox returns the list with its buttons.
func (ec *elementControls) listBox() fyne.CanvasObject {
	return container.NewVBox(
		container.NewStack(ec.listHeight, ec.list),
		container.NewBorder(nil, nil, nil, container.NewHBox(ec.up, ec.down), container.NewGridWithColumns(2, ec.add, ec.remove)),
		ec.msg,
	)
}

// placementBox returns the placement fields of the selected element.
func (ec *elementControls) placementBox() fyne.CanvasObject {
	return container.NewVBox(
		ec.placeHead,
		row("Name", ec.name),
		labelled("chord (mm)", ec.chord),
		ec.mainPlace,
		ec.flap,
		ec.placeMsg,
		ec.frame,
		labelled("reference chord (mm; empty: sum of the chords)", ec.refChord),
		ec.refMsg,
	)
}

// caption returns a small wrapped label.
func caption(s string) *widget.Label {
	l := widget.NewLabel(s)
	l.SizeName = theme.SizeNameCaptionText
	l.Wrapping = fyne.TextWrapWord
	return l
}

// editPlacement sets one placement value of the selected element from
// text; the others stay as they are in the study (not as rounded in their
// entries).
func (ec *elementControls) editPlacement(name, text string, set func(*session.Placement, float64)) error {
	v, err := parseNumber(text)
	if err != nil {
		return fmt.Errorf("%s must be a number", name)
	}
	ctl := ec.c.w.ctl
	i := ctl.Element()
	p := ctl.PlacementOf(i)
	set(&p, v)
	return ctl.SetPlacement("", i, p)
}

// editSlot sets one of gap, overlap and deflection of the selected element
// (not the first) from text.
func (ec *elementControls) editSlot(name, text string, set func(*model.Slot, float64)) error {
	ctl := ec.c.w.ctl
	i := ctl.Element()
	if i == 0 {
		return nil
	}
	v, err := parseNumber(text)
	if err != nil {
		return fmt.Errorf("%s must be a number", name)
	}
	sl := ctl.SlotOf(i)
	set(&sl, v)
	return ctl.SetSlot("", i, sl)
}

// sync sets the list and the fields from st; sel is the selected element.
func (ec *elementControls) sync(st *model.Study, sel int) {
	ec.rows = ec.rows[:0]
	for i, e := range st.Elements {
		ec.rows = append(ec.rows, fmt.Sprintf("%d. %s — %s, %s mm", i+1, e.Name, shortSource(e.Section), num(e.ChordMM)))
	}
	n := len(st.Elements)
	h := ec.list.CreateItem().MinSize().Height
	pad := theme.Padding()
	ec.listHeight.SetMinSize(fyne.NewSize(0, float32(n)*(h+pad)-pad))
	ec.list.Refresh()
	ec.list.Select(sel)
	setEnabled(ec.add, n < model.MaxElements)
	setEnabled(ec.remove, n > 1)
	setEnabled(ec.up, sel > 0)
	setEnabled(ec.down, sel < n-1)
	setMessage(ec.msg, nil)

	e := st.Elements[sel]
	ec.placeHead.SetText("Placement of " + e.Name)
	ec.name.show(e.Name, func(s string) bool { return strings.TrimSpace(s) == e.Name })
	ec.chord.show(entryNum(e.ChordMM), numberIs(e.ChordMM))
	ec.frame.SetText("Positions " + model.FrameText + ". Angles: " + model.AngleSense(st.Inverted) + ".")
	if sel == 0 {
		ec.x.show(entryNum(e.XMM), numberIs(e.XMM))
		ec.y.show(entryNum(e.YMM), numberIs(e.YMM))
		ec.angle.show(entryNum(e.AngleDeg), numberIs(e.AngleDeg))
		ec.angleLabel.SetText("setting angle (°, " + model.AngleShort(st.Inverted) + ")")
		ec.mainPlace.Show()
		ec.flap.Hide()
	} else {
		prev := st.Elements[sel-1]
		sl := ec.c.w.ctl.SlotOf(sel)
		ec.gap.show(entryNum(sl.GapMM), numberNear(sl.GapMM))
		ec.overlap.show(entryNum(sl.OverlapMM), numberNear(sl.OverlapMM))
		ec.deflec.show(entryNum(sl.DeflectionDeg), numberNear(sl.DeflectionDeg))
		ec.deflecLabel.SetText("deflection (°, " + model.AngleShort(st.Inverted) + ")")
		ec.flapHead.SetText(fmt.Sprintf("Slot behind %s (%s).", prev.Name, model.SlotText))
		ec.flapPlace.SetText(fmt.Sprintf("Hence, as mounted: leading edge at x %s, y %s mm; setting angle %s° = %s's %s° + deflection %s°.",
			num(e.XMM), num(e.YMM), num(e.AngleDeg), prev.Name, num(prev.AngleDeg), num(sl.DeflectionDeg)))
		ec.mainPlace.Hide()
		ec.flap.Show()
	}
	setMessage(ec.placeMsg, nil)

	if st.ReferenceChordMM > 0 {
		ec.refChord.show(entryNum(st.ReferenceChordMM), numberIs(st.ReferenceChordMM))
	} else {
		ec.refChord.show("", func(s string) bool { return strings.TrimSpace(s) == "" })
	}
	setMessage(ec.refMsg, nil)
}

// showResult sets what depends on the solve: the reference chord in use.
func (ec *elementControls) showResult(res *engine.Result) {
	if res == nil || res.Layout == nil {
		return
	}
	ec.refChord.SetPlaceHolder("sum of the chords: " + num(refChordMM(res)))
}

func setEnabled(b *widget.Button, on bool) {
	if on {
		b.Enable()
	} else {
		b.Disable()
	}
}

// numberNear is numberIs for values that come back through a placement
// conversion: typed 12 may return as 11.999999999999998, which must not
// rewrite the entry under the cursor. The tolerance is relative to the
// six significant digits an entry shows.
func numberNear(x float64) func(string) bool {
	return func(s string) bool {
		v, err := parseNumber(s)
		return err == nil && entryNum(v) == entryNum(x)
	}
}
