package ui

import (
	"context"
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// Ranges of the sliders. The panel-count entry accepts up to
// model.MaxPanels; the slider stops at sliderMaxPanels, beyond which a live
// drag would be slow and fine steps meaningless. The angle slider covers
// the range where a section is usually run; the entry takes ±MaxAlphaDeg.
const (
	sliderMaxPanels = 1000
	sliderMaxAlpha  = 20
	alphaSliderStep = 0.25
	clusterStep     = 0.05
)

// controls is the left column. Its widgets edit the study only through the
// controller; sync sets them from the study without feeding back.
type controls struct {
	w       *Workbench
	box     *fyne.Container
	syncing bool

	element   *widget.Select
	naca      *field
	sourceMsg *widget.Label
	source    *widget.Label
	ktX, ktY  *field
	ktTau     *field
	ktMsg     *widget.Label
	kt        *widget.Accordion

	panelSlider *widget.Slider
	panelEntry  *field
	spacing     *widget.Select
	nose, tail  *widget.Slider
	noseVal     *widget.Label
	tailVal     *widget.Label
	panelMsg    *widget.Label

	alphaSlider *widget.Slider
	alphaEntry  *field
	alphaDown   *widget.Button
	alphaUp     *widget.Button
	flowMsg     *widget.Label
	inverted    *widget.Check
	ground      *widget.Check
	groundNote  *widget.Label // model.GroundCautionSentence, shown with a ground
	clearance   *field

	from, to, step *field
	run, cancel    *widget.Button
	progress       *widget.ProgressBar
	sweepMsg       *widget.Label

	pins        *widget.Label
	pinRows     *fyne.Container
	pinFields   []*field
	pinSwatches []*canvas.Rectangle
	pinMsg      *widget.Label

	alphaMsg   *widget.Label
	alphaSense *widget.Label // the sign convention of α, in words
	sweepSeq   int           // the latest sweep run; the end of an earlier one is ignored
	studyName  *field
	team       *field
	studyMsg   *widget.Label
	runRow     *fyne.Container // Run sweep, and Cancel while it runs
	sectionRow *fyne.Container // the element choice beside the section heading
	tabs       *container.AppTabs
	ec         *elementControls
	fc         *flowControls
	vc         *viscousControls
}

// message returns an empty label for inline errors.
func message() *widget.Label {
	l := widget.NewLabel("")
	l.Importance = widget.DangerImportance
	l.Wrapping = fyne.TextWrapWord
	l.Hide()
	return l
}

// setMessage shows err under a field, or hides the message when nil.
func setMessage(l *widget.Label, err error) {
	if err == nil {
		l.Hide()
		return
	}
	l.SetText(friendly(err))
	l.Show()
}

// friendly turns an error into a short sentence for the user.
func friendly(err error) string {
	if g, ok := geometryText(err); ok {
		var me *model.GeometryError
		if errors.As(err, &me) {
			// Only a refused edit meets the model's check first.
			return g + " Not applied: the previous placement is kept."
		}
		return g
	}
	var fe *model.FieldError
	if errors.As(err, &fe) {
		return fieldLabel(fe.Field) + ": " + fe.Err.Error()
	}
	var ne *model.NACAError
	if errors.As(err, &ne) {
		if ne.Pos >= 0 {
			return fmt.Sprintf("Not a NACA designation: character %d %s", ne.Pos+1, ne.Reason)
		}
		return "Not a NACA designation: " + ne.Reason
	}
	return firstLine(err.Error())
}

// geometryText explains a configuration that cannot be solved as
// placed, naming the elements by number and name.
func geometryText(err error) (string, bool) {
	var me *model.GeometryError
	if errors.As(err, &me) {
		a := fmt.Sprintf("%d “%s”", me.Elements[0]+1, me.Names[0])
		if me.Elements[1] < 0 {
			return "Element " + a + ": " + me.Err.Error() + ".", true
		}
		b := fmt.Sprintf("%d “%s”", me.Elements[1]+1, me.Names[1])
		switch {
		case errors.Is(err, model.ErrOverlap):
			return "Elements " + a + " and " + b + " overlap or touch: open the gap or reduce the overlap.", true
		case errors.Is(err, model.ErrSmallGap):
			return "Elements " + a + " and " + b + " are too close: " + me.Err.Error() + ".", true
		}
		return "Elements " + a + " and " + b + ": " + me.Err.Error() + ".", true
	}
	var se *solver.GeometryError
	if errors.As(err, &se) {
		msg := firstLine(se.Err.Error())
		if se.Element < 0 {
			return "Configuration: " + msg + ".", true
		}
		if se.Panel >= 0 {
			return fmt.Sprintf("Element %d “%s”, panel %d: %s.", se.Element+1, se.Name, se.Panel+1, msg), true
		}
		return fmt.Sprintf("Element %d “%s”: %s.", se.Element+1, se.Name, msg), true
	}
	return "", false
}

// elementFields names the per-element fields of a study.
var elementFields = map[string]string{
	"chord_mm":  "chord",
	"x_mm":      "leading edge x",
	"y_mm":      "leading edge y",
	"angle_deg": "setting angle",
	"section":   "section",
}

// fieldLabel names a study field as the controls do.
func fieldLabel(path string) string {
	var i int
	var rest string
	if n, _ := fmt.Sscanf(path, "elements[%d].%s", &i, &rest); n == 2 {
		if name, ok := elementFields[rest]; ok {
			return fmt.Sprintf("Element %d %s", i+1, name)
		}
	}
	switch path {
	case "flow.speed_mps":
		return "Speed (m/s)"
	case "flow.temperature_c":
		return "Air temperature"
	case "flow.pressure_pa":
		return "Air pressure"
	case "flow.span_m":
		return "Span (m)"
	case "flow.end_plate_height_mm":
		return "End-plate height (mm)"
	case "flow.reynolds":
		return "Reynolds number"
	case "reference_chord_mm":
		return "Reference chord"
	case "viscous.trip_upper":
		return "Upper trip"
	case "viscous.trip_lower":
		return "Lower trip"
	case "viscous.enabled", "viscous.mode":
		return "Viscous solution"
	case "viscous.transition_n":
		return "Critical amplification N"
	case "elements":
		return "Elements"
	case "panelling.panels":
		return "Panel count"
	case "panelling.nose":
		return "Nose clustering"
	case "panelling.tail":
		return "Tail clustering"
	case "flow.alpha_deg":
		return "Angle of attack"
	case "sweep.from_deg":
		return "Sweep from"
	case "sweep.to_deg":
		return "Sweep to"
	case "sweep.step_deg":
		return "Sweep step"
	case "ground.clearance_mm":
		return "Ground clearance"
	case "kt.cx":
		return "Centre x"
	case "kt.cy":
		return "Centre y"
	case "kt.tau":
		return "TE angle"
	}
	return path
}

func heading(s string) *widget.Label {
	return widget.NewLabelWithStyle(s, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
}

// row puts a caption left of a field.
func row(caption string, field fyne.CanvasObject) *fyne.Container {
	return container.NewBorder(nil, nil, widget.NewLabel(caption), nil, field)
}

func newControls(w *Workbench) *controls {
	c := &controls{w: w}
	source := c.sourceControls()
	panelling := c.panellingControls()
	alpha := c.alphaControls()
	mounting := c.mountingControls()
	sweep := c.sweepControls()
	pins := c.pinControls()
	c.ec = newElementControls(c)
	c.fc = newFlowControls(c)
	c.vc = newViscousControls(c)
	study := c.studyControls()

	wing := container.NewVBox(slices.Concat(
		study,
		[]fyne.CanvasObject{
			widget.NewSeparator(),
			heading("Elements"),
			c.ec.listBox(),
			widget.NewSeparator(),
			c.ec.placementBox(),
			widget.NewSeparator(),
		},
		source,
		[]fyne.CanvasObject{widget.NewSeparator()},
		mounting,
	)...)
	flow := container.NewVBox(
		c.fc.box(),
		widget.NewSeparator(),
		heading("Viscous solution"),
		c.vc.box(),
	)
	solve := container.NewVBox(slices.Concat(
		panelling,
		[]fyne.CanvasObject{widget.NewSeparator()},
		sweep,
		[]fyne.CanvasObject{widget.NewSeparator()},
		pins,
	)...)
	c.tabs = container.NewAppTabs(
		container.NewTabItem("Wing", scrolled(wing)),
		container.NewTabItem("Flow", scrolled(flow)),
		container.NewTabItem("Panels & sweep", scrolled(solve)),
	)
	// The angle of attack is the most used control: it stays above the
	// tabs.
	c.box = container.NewBorder(container.NewVBox(alpha...), nil, nil, nil, c.tabs)
	return c
}

// The builders below make one group of the column each and return its
// rows, top to bottom, for newControls to lay out.

// sourceControls builds the section source of the element chosen: a NACA
// designation, a coordinate file or a Kármán–Trefftz section.
func (c *controls) sourceControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.element = widget.NewSelect(nil, func(string) {
		if !c.syncing && c.element.SelectedIndex() >= 0 {
			ctl.SetElement(c.element.SelectedIndex())
		}
	})
	c.element.Hide()
	c.sourceMsg = message()
	c.naca = newField(w, c.sourceMsg, ctl.SetNACA)
	c.naca.SetPlaceHolder("e.g. 4412 or 23012")
	c.source = widget.NewLabel("")
	c.source.Wrapping = fyne.TextWrapWord
	c.source.SizeName = theme.SizeNameCaptionText
	openFile := widget.NewButton("Open coordinate file…", w.openSection)
	c.ktMsg = message()
	c.ktX, c.ktY, c.ktTau = newField(w, c.ktMsg, nil), newField(w, c.ktMsg, nil), newField(w, c.ktMsg, nil)
	c.ktX.SetText(entryNum(ktDefault.CenterX))
	c.ktY.SetText(entryNum(ktDefault.CenterY))
	c.ktTau.SetText(entryNum(ktDefault.TEAngleDeg))
	useKT := widget.NewButton("Use this section", c.useKT)
	// The analytic family is for checking the method, less often used:
	// folded away so that the sweep fits on screen.
	c.kt = widget.NewAccordion(widget.NewAccordionItem("Kármán–Trefftz section",
		container.NewVBox(
			container.NewGridWithColumns(3, labelled("centre x", c.ktX), labelled("centre y", c.ktY), labelled("TE angle (°)", c.ktTau)),
			useKT,
			c.ktMsg)))
	report := widget.NewButton("Cleaning report", w.showReport)
	c.sectionRow = container.NewBorder(nil, nil, widget.NewLabel("of"), nil, c.element)
	return []fyne.CanvasObject{
		container.NewBorder(nil, nil, heading("Section source"), nil, c.sectionRow),
		row("NACA", c.naca),
		c.sourceMsg,
		c.source,
		container.NewGridWithColumns(2, openFile, report),
		c.kt,
	}
}

// panellingControls builds the panel count, spacing law and clustering.
func (c *controls) panellingControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.panelSlider = widget.NewSlider(model.MinPanels, sliderMaxPanels)
	c.panelSlider.Step = 1
	c.panelMsg = message()
	c.panelEntry = newField(w, c.panelMsg, func(s string) error {
		n, err := strconv.Atoi(strings.TrimSpace(s))
		if err != nil {
			return fmt.Errorf("panel count must be a whole number from %d to %d", model.MinPanels, model.MaxPanels)
		}
		p := ctl.Current().Panelling
		p.Panels = n
		return ctl.SetPanelling("", p)
	})
	c.panelSlider.OnChanged = func(v float64) {
		if c.syncing {
			return
		}
		c.editPanelling("panels", func(p *model.Panelling) { p.Panels = int(v) })
	}
	c.panelSlider.OnChangeEnded = func(float64) { ctl.BreakMerge() }
	spacings := make([]string, len(model.Spacings))
	for i, s := range model.Spacings {
		spacings[i] = string(s)
	}
	c.spacing = widget.NewSelect(spacings, func(s string) {
		if c.syncing {
			return
		}
		c.editPanelling("", func(p *model.Panelling) { p.Spacing = model.Spacing(s) })
	})
	c.nose, c.noseVal = c.clusterSlider("nose", func(p *model.Panelling, v float64) { p.Nose = v })
	c.tail, c.tailVal = c.clusterSlider("tail", func(p *model.Panelling, v float64) { p.Tail = v })
	return []fyne.CanvasObject{
		heading("Panelling"),
		row("Panels", container.NewBorder(nil, nil, nil, sized(c.panelEntry, 64), c.panelSlider)),
		row("Spacing", c.spacing),
		row("Nose", container.NewBorder(nil, nil, nil, c.noseVal, c.nose)),
		row("Tail", container.NewBorder(nil, nil, nil, c.tailVal, c.tail)),
		c.panelMsg,
	}
}

// alphaControls builds the angle of attack: slider, entry and steps of
// the sweep's step.
func (c *controls) alphaControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.alphaSlider = widget.NewSlider(-sliderMaxAlpha, sliderMaxAlpha)
	c.alphaSlider.Step = alphaSliderStep
	c.alphaMsg = message()
	c.alphaSense = caption("")
	c.alphaEntry = newField(w, c.alphaMsg, func(s string) error {
		v, err := parseNumber(s)
		if err != nil {
			return errors.New("angle of attack must be a number of degrees")
		}
		return ctl.SetAlpha("", v)
	})
	c.alphaSlider.OnChanged = func(v float64) {
		if !c.syncing {
			setMessage(c.alphaMsg, ctl.SetAlpha("alpha", v))
		}
	}
	c.alphaSlider.OnChangeEnded = func(float64) { ctl.BreakMerge() }
	stepAlpha := func(sign float64) {
		st := ctl.Current()
		ctl.BreakMerge()
		setMessage(c.alphaMsg, ctl.SetAlpha("", st.Flow.AlphaDeg+sign*st.Sweep.StepDeg))
	}
	c.alphaDown = widget.NewButton("−", func() { stepAlpha(-1) })
	c.alphaUp = widget.NewButton("+", func() { stepAlpha(1) })
	return []fyne.CanvasObject{
		row("α (°)", container.NewBorder(nil, nil, nil, container.NewHBox(sized(c.alphaEntry, 64), c.alphaDown, c.alphaUp), c.alphaSlider)),
		c.alphaSense,
		c.alphaMsg,
	}
}

// mountingControls builds the inverted mounting and the ground.
func (c *controls) mountingControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.flowMsg = message()
	c.inverted = widget.NewCheck("Inverted (suction side down)", func(on bool) {
		if !c.syncing {
			setMessage(c.flowMsg, ctl.SetInverted(on))
		}
	})
	c.clearance = newField(w, c.flowMsg, func(s string) error {
		v, err := parseNumber(s)
		if err != nil {
			return errors.New("ground clearance must be a number of millimetres")
		}
		g := ctl.Current().Ground
		g.ClearanceMM = v
		return ctl.SetGround("", g)
	})
	c.ground = widget.NewCheck("Ground, clearance (mm)", func(on bool) {
		if !c.syncing {
			g := ctl.Current().Ground
			g.Enabled = on
			setMessage(c.flowMsg, ctl.SetGround("", g))
		}
	})
	c.groundNote = caption(model.GroundCautionSentence())
	c.groundNote.TextStyle = fyne.TextStyle{Italic: true}
	c.groundNote.Importance = widget.WarningImportance
	return []fyne.CanvasObject{
		heading("Mounting and ground"),
		c.inverted,
		container.NewBorder(nil, nil, nil, sized(c.clearance, 72), c.ground),
		c.groundNote,
		c.flowMsg,
	}
}

// sweepControls builds the sweep range and its Run and Cancel.
func (c *controls) sweepControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.sweepMsg = message()
	c.from, c.to, c.step = newField(w, c.sweepMsg, c.editSweep), newField(w, c.sweepMsg, c.editSweep), newField(w, c.sweepMsg, c.editSweep)
	c.progress = widget.NewProgressBar()
	c.progress.Hide()
	c.run = widget.NewButton("Run sweep", c.runSweep)
	c.run.Importance = widget.HighImportance
	c.cancel = widget.NewButton("Cancel", ctl.CancelSweep)
	c.cancel.Hide()
	c.runRow = container.NewBorder(nil, nil, nil, c.cancel, c.run)
	return []fyne.CanvasObject{
		heading("Sweep"),
		container.NewGridWithColumns(3, labelled("from (°)", c.from), labelled("to (°)", c.to), labelled("step (°)", c.step)),
		c.sweepMsg,
		c.runRow,
		c.progress,
	}
}

// pinControls builds the pins: Pin current, Clear pins and the list.
func (c *controls) pinControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.pins = widget.NewLabel("")
	c.pins.Wrapping = fyne.TextWrapWord
	c.pinMsg = message()
	c.pinRows = container.NewVBox()
	pin := widget.NewButton("Pin current", func() { w.userError(ctl.PinCurrent()) })
	clear := widget.NewButton("Clear pins", func() { w.userError(ctl.ClearPins()) })
	return []fyne.CanvasObject{
		heading("Pins"),
		container.NewGridWithColumns(2, pin, clear),
		c.pins,
		c.pinRows,
		c.pinMsg,
	}
}

// studyControls builds the study's name and team.
func (c *controls) studyControls() []fyne.CanvasObject {
	w, ctl := c.w, c.w.ctl
	c.studyMsg = message()
	c.studyName = textField(w, c.studyMsg, ctl.SetStudyName)
	c.team = textField(w, c.studyMsg, ctl.SetTeam)
	c.team.SetPlaceHolder("none")
	return []fyne.CanvasObject{
		heading("Study"),
		row("Name", c.studyName),
		row("Team", c.team),
		c.studyMsg,
	}
}

// scrolled puts a tab's content in a vertical scroll, with a right inset
// that keeps fields clear of the scroll bar.
func scrolled(o fyne.CanvasObject) fyne.CanvasObject {
	return container.NewVScroll(container.NewBorder(nil, nil, nil, widthOf(theme.Padding()*3), o))
}

// ktDefault is the analytic section offered first: a cambered 10° TE-angle
// section (the sample case of docs/validation.md §2).
var ktDefault = model.KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 10}

// useKT reads the three Kármán–Trefftz parameters and applies them.
func (c *controls) useKT() {
	var v [3]float64
	for i, e := range []*field{c.ktX, c.ktY, c.ktTau} {
		x, err := parseNumber(e.Text)
		if err != nil {
			setMessage(c.ktMsg, fmt.Errorf("%s must be a number", [3]string{"centre x", "centre y", "TE angle"}[i]))
			return
		}
		v[i] = x
	}
	c.w.editFrom(c.ktMsg)
	setMessage(c.ktMsg, c.w.ctl.SetKT(model.KarmanTrefftz{CenterX: v[0], CenterY: v[1], TEAngleDeg: v[2]}))
}

// sized gives an entry a fixed width.
func sized(o fyne.CanvasObject, width float32) fyne.CanvasObject {
	return container.NewStack(widthOf(width), o)
}

// labelled stacks a small caption over a field.
func labelled(caption string, field fyne.CanvasObject) fyne.CanvasObject {
	l := widget.NewLabel(caption)
	l.SizeName = theme.SizeNameCaptionText
	return container.NewBorder(l, nil, nil, nil, field)
}

// clusterSlider builds a 0..1 slider for nose or tail clustering.
func (c *controls) clusterSlider(key string, set func(*model.Panelling, float64)) (*widget.Slider, *widget.Label) {
	s := widget.NewSlider(0, 1)
	s.Step = clusterStep
	val := widget.NewLabel("")
	s.OnChanged = func(v float64) {
		if c.syncing {
			return
		}
		c.editPanelling(key, func(p *model.Panelling) { set(p, v) })
	}
	s.OnChangeEnded = func(float64) { c.w.ctl.BreakMerge() }
	return s, val
}

func (c *controls) editPanelling(key string, f func(*model.Panelling)) {
	p := c.w.ctl.Current().Panelling
	f(&p)
	setMessage(c.panelMsg, c.w.ctl.SetPanelling(key, p))
}

// editSweep applies the three sweep fields as they read.
func (c *controls) editSweep(string) error {
	var vals [3]float64
	for i, e := range []*field{c.from, c.to, c.step} {
		v, err := parseNumber(e.Text)
		if err != nil {
			return fmt.Errorf("sweep %s must be a number of degrees", [3]string{"from", "to", "step"}[i])
		}
		vals[i] = v
	}
	return c.w.ctl.SetSweep(model.SweepRange{FromDeg: vals[0], ToDeg: vals[1], StepDeg: vals[2]})
}

func (c *controls) runSweep() {
	ctl := c.w.ctl
	// Set the running state before the sweep starts, so that its end,
	// however soon, comes after. A run that replaces one still going
	// (the configuration changed) owns the progress from now on.
	c.sweepSeq++
	seq := c.sweepSeq
	setMessage(c.sweepMsg, nil)
	c.progress.SetValue(0)
	c.run.Disable()
	c.progress.Show()
	c.cancel.Show()
	c.runRow.Refresh() // lay the row out again with Cancel beside Run
	running := true
	time.AfterFunc(busyDelay, func() {
		c.w.do(func() {
			if running && seq == c.sweepSeq {
				c.w.sweeping = true
				c.w.refreshStale()
			}
		})
	})
	finish := func(err error) {
		running = false
		if seq != c.sweepSeq {
			return
		}
		if c.w.sweeping {
			c.w.sweeping = false
			c.w.refreshStale()
		}
		c.progress.Hide()
		c.cancel.Hide()
		c.runRow.Refresh()
		c.run.Enable()
		if errors.Is(err, context.Canceled) {
			err = errors.New("sweep cancelled; the polar keeps the last complete sweep")
		}
		if err != nil {
			setMessage(c.sweepMsg, err)
		}
	}
	err := ctl.RunSweep(func(done, total int) {
		c.w.do(func() { c.progress.SetValue(float64(done) / float64(total)) })
	}, finish)
	if err != nil {
		finish(err)
	}
}

// sourceError shows or clears a message under the section source.
func (c *controls) sourceError(err error) { setMessage(c.sourceMsg, err) }

// sync sets every control from st without editing the study.
func (c *controls) sync(st *model.Study) {
	c.syncing = true
	defer func() { c.syncing = false }()
	names := make([]string, len(st.Elements))
	for i, e := range st.Elements {
		names[i] = fmt.Sprintf("%d. %s", i+1, e.Name)
	}
	c.element.SetOptions(names)
	c.element.SetSelectedIndex(c.w.ctl.Element())
	if len(names) > 1 {
		c.element.Show()
		c.sectionRow.Show()
	} else {
		c.element.Hide()
		c.sectionRow.Hide()
	}
	el := st.Elements[c.w.ctl.Element()]
	c.studyName.show(st.Name, func(s string) bool { return strings.TrimSpace(s) == st.Name })
	c.team.show(st.Team, func(s string) bool { return strings.TrimSpace(s) == st.Team })
	setMessage(c.studyMsg, nil)
	c.ec.sync(st, c.w.ctl.Element())
	c.fc.sync(st)
	c.vc.sync(st)
	if d, ok := strings.CutPrefix(el.Section.Spec, "naca:"); ok {
		c.naca.show(d, func(s string) bool { return strings.EqualFold(strings.TrimSpace(s), d) })
		setMessage(c.sourceMsg, nil)
	} else {
		c.naca.show("", nil)
	}
	if d, ok := strings.CutPrefix(el.Section.Spec, "kt:"); ok {
		c.kt.Open(0)
		if k, err := model.ParseKT(d); err == nil {
			c.ktX.SetText(entryNum(k.CenterX))
			c.ktY.SetText(entryNum(k.CenterY))
			c.ktTau.SetText(entryNum(k.TEAngleDeg))
		}
		setMessage(c.ktMsg, nil)
	}
	c.source.SetText(fmt.Sprintf("%s — %s, chord %s mm", el.Name, shortSource(el.Section), num(el.ChordMM)))

	p := st.Panelling
	c.panelSlider.SetValue(float64(min(p.Panels, sliderMaxPanels)))
	setIfDiffers(c.panelEntry, strconv.Itoa(p.Panels), func(s string) bool {
		n, err := strconv.Atoi(strings.TrimSpace(s))
		return err == nil && n == p.Panels
	})
	c.spacing.SetSelected(string(p.Spacing))
	c.nose.SetValue(p.Nose)
	c.tail.SetValue(p.Tail)
	c.noseVal.SetText(fixed(p.Nose, 2))
	c.tailVal.SetText(fixed(p.Tail, 2))
	setMessage(c.panelMsg, nil)

	a := st.Flow.AlphaDeg
	c.alphaSlider.SetValue(max(-sliderMaxAlpha, min(sliderMaxAlpha, a)))
	setIfDiffers(c.alphaEntry, entryNum(a), numberIs(a))
	c.alphaSense.SetText("Angle of attack as mounted: " + model.AngleSense(st.Inverted) + ".")
	c.inverted.SetChecked(st.Inverted)
	c.ground.SetChecked(st.Ground.Enabled)
	if st.Ground.Enabled {
		c.groundNote.Show()
	} else {
		c.groundNote.Hide() // a caution about the ground, with no ground
	}
	setIfDiffers(c.clearance, entryNum(st.Ground.ClearanceMM), numberIs(st.Ground.ClearanceMM))
	step := num(st.Sweep.StepDeg) + "°"
	c.alphaDown.SetText("−" + step)
	c.alphaUp.SetText("+" + step)
	setMessage(c.flowMsg, nil)
	setMessage(c.alphaMsg, nil)

	setIfDiffers(c.from, entryNum(st.Sweep.FromDeg), numberIs(st.Sweep.FromDeg))
	setIfDiffers(c.to, entryNum(st.Sweep.ToDeg), numberIs(st.Sweep.ToDeg))
	setIfDiffers(c.step, entryNum(st.Sweep.StepDeg), numberIs(st.Sweep.StepDeg))
	setMessage(c.sweepMsg, nil)

	if len(st.Pins) == 0 {
		c.pins.SetText("No pins. A pin freezes the current Cp and polar for comparison (the panel method's, inviscid, also with the viscous solution on).")
	} else {
		c.pins.SetText("Each pin has its own colour and line style in the views; its name says what differed from the pin before. Rename a pin in its field.")
	}
	c.syncPins(st)
}

// syncPins shows one row per pin: its colour and its name in a field that
// renames it.
func (c *controls) syncPins(st *model.Study) {
	for len(c.pinFields) < len(st.Pins) {
		i := len(c.pinFields)
		f := textField(c.w, c.pinMsg, func(s string) error { return c.w.ctl.RenamePin(i, s) })
		sw := canvas.NewRectangle(figures.PinColour(i, c.w.dark()))
		sw.SetMinSize(fyne.NewSize(18, 18))
		c.pinFields = append(c.pinFields, f)
		c.pinSwatches = append(c.pinSwatches, sw)
		c.pinRows.Add(container.NewBorder(nil, nil, container.NewCenter(sw), nil, f))
	}
	for i, f := range c.pinFields {
		row := c.pinRows.Objects[i]
		if i >= len(st.Pins) {
			row.Hide()
			continue
		}
		label := st.Pins[i].Label
		f.show(label, func(s string) bool { return strings.TrimSpace(s) == label })
		c.pinSwatches[i].FillColor = figures.PinColour(i, c.w.dark())
		c.pinSwatches[i].Refresh()
		row.Show()
	}
	setMessage(c.pinMsg, nil)
}

// setIfDiffers sets an entry's text unless it already says the same value,
// so that typing "4." is not rewritten to "4" under the cursor.
func setIfDiffers(e *field, text string, same func(string) bool) { e.show(text, same) }

// entryNum formats a number for an entry, with an ASCII minus that the
// user can edit like any other character.
func entryNum(x float64) string { return strconv.FormatFloat(x, 'g', 6, 64) }

func numberIs(x float64) func(string) bool {
	return func(s string) bool {
		v, err := parseNumber(s)
		return err == nil && v == x
	}
}

// showResult shows what the column derives from a result.
func (c *controls) showResult(st *model.Study, res *engine.Result) {
	c.ec.showResult(res)
	c.fc.showResult(st, res)
}

// scrollColumn scrolls the control column's open tab by a wheel event
// that arrived over one of its fields.
func (c *controls) scrollColumn(e *fyne.ScrollEvent) {
	if it := c.tabs.Selected(); it != nil {
		if sc, ok := it.Content.(*container.Scroll); ok {
			sc.Scrolled(e)
		}
	}
}

// reveal scrolls the control column so that o (a message under a field)
// is in view.
func (c *controls) reveal(o fyne.CanvasObject) {
	it := c.tabs.Selected()
	if it == nil {
		return
	}
	sc, ok := it.Content.(*container.Scroll)
	if !ok {
		return
	}
	sc.Refresh() // lay the column out with the message shown
	if o.Size().Height == 0 {
		return
	}
	d := fyne.CurrentApp().Driver()
	top := d.AbsolutePositionForObject(o).Y - d.AbsolutePositionForObject(sc).Y
	bottom := top + o.Size().Height
	switch {
	case bottom > sc.Size().Height:
		sc.Offset.Y += bottom - sc.Size().Height
	case top < 0:
		sc.Offset.Y += top
	default:
		return
	}
	sc.Refresh()
}
