package ui

import (
	"errors"
	"fmt"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
)

// maxRatioLimit bounds the neighbour-ratio limit a user may set: beyond
// 10 the warning would never fire on any panelling the app makes.
const maxRatioLimit = 10

// panelSizeView is the panel-size chart of the current study: panel length
// and neighbour ratio along each element's contour, with a warning where
// neighbours differ by more than a set ratio. It follows the study while
// active (its tab is on screen).
type panelSizeView struct {
	w       *Workbench
	box     fyne.CanvasObject
	element *widget.Select
	ratio   *widget.Entry
	msg     *widget.Label
	warn    *widget.Label
	fig     *figureBox

	active   bool
	maxRatio float64
	ticket   int
	sizes    []figures.PanelSizes
	sizesFor string // encoded study the sizes were made for
	stale    bool   // the study changed while inactive
}

func newPanelSizeView(w *Workbench) *panelSizeView {
	v := &panelSizeView{w: w, maxRatio: defaultMaxRatio, stale: true}
	v.element = widget.NewSelect(nil, func(string) { v.draw() })
	v.element.Hide()
	v.ratio = widget.NewEntry()
	v.ratio.SetText(entryNum(defaultMaxRatio))
	v.msg = message()
	v.ratio.OnChanged = func(s string) {
		r, err := parseNumber(s)
		if err != nil || !(r > 1 && r <= maxRatioLimit) {
			setMessage(v.msg, fmt.Errorf("the ratio limit must be a number above 1 and at most %d", maxRatioLimit))
			v.box.Refresh()
			return
		}
		setMessage(v.msg, nil)
		v.box.Refresh()
		v.maxRatio = r
		v.showWarning()
		v.draw()
	}
	v.warn = widget.NewLabel("")
	v.warn.Wrapping = fyne.TextWrapWord
	v.fig = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(420, 360))
	hint := widget.NewLabel("Panel length on the chord and the size ratio of neighbouring panels along the contour: where nose and tail clustering put the panels. Growth of at most about 1.5 from one panel to the next is common practice.")
	hint.Wrapping = fyne.TextWrapWord
	top := container.NewVBox(hint,
		container.NewBorder(nil, nil, nil, container.NewHBox(widget.NewLabel("warn above ratio"), withWidth(v.ratio, 64)), v.element),
		v.msg, v.warn)
	v.box = container.NewBorder(top, nil, nil, nil, v.fig)
	return v
}

// setActive starts or stops following the study.
func (v *panelSizeView) setActive(on bool) {
	was := v.active
	v.active = on
	if on && !was && v.stale {
		v.update()
	}
}

// studyChanged recomputes the sizes if the view is on screen.
func (v *panelSizeView) studyChanged() {
	v.stale = true
	if v.active {
		v.update()
	}
}

// update places the current study on a goroutine and shows its sizes.
func (v *panelSizeView) update() {
	ctl := v.w.ctl
	if ctl.Current() == nil {
		return
	}
	st, secs := ctl.Study(), ctl.Sections()
	enc, err := st.Encode()
	if err == nil && string(enc) == v.sizesFor && v.sizes != nil {
		v.stale = false
		return
	}
	v.stale = false
	v.ticket++
	t := v.ticket
	ctl.Activity().Add()
	go func() {
		defer ctl.Activity().Done()
		var sizes []figures.PanelSizes
		err := recovered(func() error {
			var err error
			sizes, err = placedPanelSizes(st, secs)
			return err
		})
		v.w.do(func() {
			if t != v.ticket {
				return
			}
			if err != nil {
				v.sizes, v.sizesFor = nil, ""
				v.warn.Importance = widget.DangerImportance
				v.warn.SetText("Cannot place the study: " + friendly(err))
				v.fig.setDrawing(nil, "")
				v.box.Refresh()
				return
			}
			v.sizes, v.sizesFor = sizes, string(enc)
			names := make([]string, len(sizes))
			for i, s := range sizes {
				names[i] = s.Element
			}
			sel := v.element.SelectedIndex()
			v.element.SetOptions(names)
			if sel < 0 || sel >= len(names) {
				sel = 0
			}
			v.element.SetSelectedIndex(sel)
			if len(names) > 1 {
				v.element.Show()
			} else {
				v.element.Hide()
			}
			v.showWarning()
			v.box.Refresh()
			v.draw()
		})
	}()
}

// showWarning lists the elements with neighbours above the limit.
func (v *panelSizeView) showWarning() {
	var parts []string
	for _, s := range v.sizes {
		if n := len(s.Over(v.maxRatio)); n > 0 {
			parts = append(parts, fmt.Sprintf("%s: %d neighbour ratio%s above %s (largest %s)", s.Element, n, plural(n), num(v.maxRatio), fixed(s.MaxRatio(), 2)))
		}
	}
	if len(parts) == 0 {
		v.warn.Importance = widget.SuccessImportance
		v.warn.SetText("Every element's neighbouring panels stay within a ratio of " + num(v.maxRatio) + ".")
		return
	}
	v.warn.Importance = widget.WarningImportance
	v.warn.SetText("⚠ " + strings.Join(parts, "; ") + ". Consider more panels or gentler clustering.")
}

// draw shows the selected element's chart.
func (v *panelSizeView) draw() {
	i := v.element.SelectedIndex()
	if i < 0 || i >= len(v.sizes) {
		return
	}
	ps, limit := v.sizes[i], v.maxRatio
	v.fig.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderPanelSizes(ps, limit, dark, w, h, dpi)
	}, "")
}

// shownPanels returns the panel count of each element whose sizes are
// shown (tests check it against the study).
func (v *panelSizeView) shownPanels() ([]int, error) {
	if v.sizes == nil {
		return nil, errors.New("no panel sizes shown")
	}
	out := make([]int, len(v.sizes))
	for i, s := range v.sizes {
		out[i] = len(s.Length)
	}
	return out, nil
}
