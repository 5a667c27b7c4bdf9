package ui

import (
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// statusSep separates the items of the status line.
const statusSep = " · "

// statusLine shows a result's summary in the width it is given: its items
// are in order of importance, and those that do not fit are left off from
// the end (the results table and its note give them all), so no item is
// cut in the middle. A single item too long for the line (an error) is
// ellipsized.
type statusLine struct {
	label *widget.Label
	box   *fyne.Container
	items []string
	width float32
}

func newStatusLine(text string) *statusLine {
	s := &statusLine{label: widget.NewLabel(text), items: []string{text}}
	s.label.Truncation = fyne.TextTruncateEllipsis
	s.box = container.New(s, s.label)
	return s
}

// set shows items, as many as fit.
func (s *statusLine) set(items []string, imp widget.Importance) {
	s.items = append([]string(nil), items...)
	s.label.Importance = imp
	s.fit()
}

// Text returns the text on screen.
func (s *statusLine) Text() string { return s.label.Text }

// Full returns every item, as on a line wide enough.
func (s *statusLine) Full() string { return strings.Join(s.items, statusSep) }

// fit chooses the longest run of leading items whose text fits the width.
func (s *statusLine) fit() {
	text := strings.Join(s.items, statusSep)
	if s.width > 0 {
		room := s.width - 2*theme.InnerPadding()
		for k := len(s.items); k > 1; k-- {
			t := strings.Join(s.items[:k], statusSep)
			if fyne.MeasureText(t, theme.TextSize(), s.label.TextStyle).Width <= room {
				text = t
				break
			}
			text = s.items[0]
		}
	}
	if text != s.label.Text {
		s.label.Text = text
	}
	s.label.Refresh()
}

// Layout is the line's fyne.Layout: the label fills it.
func (s *statusLine) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	s.label.Move(fyne.NewPos(0, 0))
	s.label.Resize(size)
	if size.Width != s.width {
		s.width = size.Width
		s.fit()
	}
}

// MinSize is the label's (which truncates, so it is small).
func (s *statusLine) MinSize(objs []fyne.CanvasObject) fyne.Size { return s.label.MinSize() }
