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
	name                 *widget.Entry
	chord, x, y, angle   *widget.Entry
	flapHead             *widget.Label
	gap, overlap, deflec *widget.Entry
	flap                 *fyne.Container // the flap fields, hidden for the first element
	placeMsg             *widget.Label

	refChord *widget.Entry
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
		if !c.syncing && id < len(ctl.state.study.Elements) {
			ctl.SetElement(id)
		}
	}
	ec.listHeight = canvas.NewRectangle(color.Transparent)
	ec.msg = message()
	ec.add = widget.NewButtonWithIcon("Add flap", theme.ContentAddIcon(), func() { setMessage(ec.msg, ctl.AddElement()) })
	ec.remove = widget.NewButtonWithIcon("Remove", theme.ContentRemoveIcon(), func() { setMessage(ec.msg, ctl.RemoveElement(ctl.Element())) })
	ec.up = widget.NewButtonWithIcon("", theme.MoveUpIcon(), func() { setMessage(ec.msg, ctl.MoveElement(ctl.Element(), -1)) })
	ec.down = widget.NewButtonWithIcon("", theme.MoveDownIcon(), func() { setMessage(ec.msg, ctl.MoveElement(ctl.Element(), 1)) })

	ec.placeHead = heading("Placement")
	ec.placeMsg = message()
	ec.name = widget.NewEntry()
	ec.name.OnChanged = func(s string) {
		if c.syncing {
			return
		}
		i := ctl.Element()
		setMessage(ec.placeMsg, ctl.SetElementName(fmt.Sprintf("name-%d", i), i, s))
	}
	ec.chord, ec.x, ec.y, ec.angle = widget.NewEntry(), widget.NewEntry(), widget.NewEntry(), widget.NewEntry()
	placeFields := []struct {
		e    *widget.Entry
		name string
		set  func(*Placement, float64)
	}{
		{ec.chord, "chord", func(p *Placement, v float64) { p.ChordMM = v }},
		{ec.x, "leading edge x", func(p *Placement, v float64) { p.XMM = v }},
		{ec.y, "leading edge y", func(p *Placement, v float64) { p.YMM = v }},
		{ec.angle, "setting angle", func(p *Placement, v float64) { p.AngleDeg = v }},
	}
	for _, f := range placeFields {
		f.e.OnChanged = func(s string) { ec.editPlacement(f.name, s, f.set) }
	}
	ec.gap, ec.overlap, ec.deflec = widget.NewEntry(), widget.NewEntry(), widget.NewEntry()
	flapFields := []struct {
		e    *widget.Entry
		name string
		set  func(*model.FlapPlacement, float64)
	}{
		{ec.gap, "gap", func(p *model.FlapPlacement, v float64) { p.GapMM = v }},
		{ec.overlap, "overlap", func(p *model.FlapPlacement, v float64) { p.OverlapMM = v }},
		{ec.deflec, "deflection", func(p *model.FlapPlacement, v float64) { p.DeflectionDeg = v }},
	}
	for _, f := range flapFields {
		f.e.OnChanged = func(s string) { ec.editFlap(f.name, s, f.set) }
	}
	ec.flapHead = caption("")
	ec.flap = container.NewVBox(
		ec.flapHead,
		container.NewGridWithColumns(3, labelled("gap (mm)", ec.gap), labelled("overlap (mm)", ec.overlap), labelled("deflection (°)", ec.deflec)),
	)

	ec.refChord = widget.NewEntry()
	ec.refMsg = message()
	ec.refChord.OnChanged = func(s string) {
		if c.syncing {
			return
		}
		v := 0.0
		if strings.TrimSpace(s) != "" {
			var err error
			if v, err = parseNumber(s); err != nil {
				setMessage(ec.refMsg, errors.New("reference chord must be a number of millimetres, or empty for the sum of the chords"))
				return
			}
			if !(v > 0) {
				setMessage(ec.refMsg, errors.New("reference chord must be positive, or empty for the sum of the chords"))
				return
			}
		}
		setMessage(ec.refMsg, ctl.SetReferenceChord("refchord", v))
	}
	return ec
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
		container.NewGridWithColumns(2, labelled("chord (mm)", ec.chord), labelled("setting angle (°, nose-up)", ec.angle)),
		container.NewGridWithColumns(2, labelled("leading edge x (mm)", ec.x), labelled("leading edge y (mm)", ec.y)),
		ec.flap,
		ec.placeMsg,
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
func (ec *elementControls) editPlacement(name, text string, set func(*Placement, float64)) {
	if ec.c.syncing {
		return
	}
	v, err := parseNumber(text)
	if err != nil {
		setMessage(ec.placeMsg, fmt.Errorf("%s must be a number", name))
		return
	}
	ctl := ec.c.w.ctl
	i := ctl.Element()
	p := ctl.PlacementOf(i)
	set(&p, v)
	setMessage(ec.placeMsg, ctl.SetPlacement(fmt.Sprintf("place-%d-%s", i, name), i, p))
}

// editFlap sets one of gap, overlap and deflection of the selected
// element (not the first) from text.
func (ec *elementControls) editFlap(name, text string, set func(*model.FlapPlacement, float64)) {
	if ec.c.syncing {
		return
	}
	ctl := ec.c.w.ctl
	i := ctl.Element()
	if i == 0 {
		return
	}
	v, err := parseNumber(text)
	if err != nil {
		setMessage(ec.placeMsg, fmt.Errorf("%s must be a number", name))
		return
	}
	fp := ctl.FlapPlacementOf(i)
	set(&fp, v)
	setMessage(ec.placeMsg, ctl.SetFlapPlacement(fmt.Sprintf("flap-%d-%s", i, name), i, fp))
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
	if strings.TrimSpace(ec.name.Text) != e.Name {
		ec.name.SetText(e.Name)
	}
	setIfDiffers(ec.chord, entryNum(e.ChordMM), numberIs(e.ChordMM))
	setIfDiffers(ec.x, entryNum(e.XMM), numberIs(e.XMM))
	setIfDiffers(ec.y, entryNum(e.YMM), numberIs(e.YMM))
	setIfDiffers(ec.angle, entryNum(e.AngleDeg), numberIs(e.AngleDeg))
	if sel > 0 {
		fp := flapPlacementOf(st.Elements[sel-1], e)
		setIfDiffers(ec.gap, entryNum(fp.GapMM), numberNear(fp.GapMM))
		setIfDiffers(ec.overlap, entryNum(fp.OverlapMM), numberNear(fp.OverlapMM))
		setIfDiffers(ec.deflec, entryNum(fp.DeflectionDeg), numberNear(fp.DeflectionDeg))
		ec.flapHead.SetText(fmt.Sprintf("Relative to %s: gap below, overlap ahead of its trailing edge; deflection trailing edge down (upright frame).", st.Elements[sel-1].Name))
		ec.flap.Show()
	} else {
		ec.flap.Hide()
	}
	setMessage(ec.placeMsg, nil)

	if st.ReferenceChordMM > 0 {
		setIfDiffers(ec.refChord, entryNum(st.ReferenceChordMM), numberIs(st.ReferenceChordMM))
	} else if strings.TrimSpace(ec.refChord.Text) != "" && ec.refMsg.Hidden {
		ec.refChord.SetText("")
	}
	setMessage(ec.refMsg, nil)
}

// showResult sets what depends on the solve: the reference chord in use.
func (ec *elementControls) showResult(res *engineResult) {
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
