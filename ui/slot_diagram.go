package ui

import (
	"image/color"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
)

// newSlotDiagram draws what gap, overlap and deflection measure: the
// trailing end of the element before, the flap below and behind it, the
// gap from the trailing edge to the flap's surface, the overlap along the
// chord and the deflection between the chords (upright, as in every
// high-lift text; an inverted wing is the mirror image).
func newSlotDiagram() fyne.CanvasObject {
	fg := theme.Color(theme.ColorNameForeground)
	accent := theme.Color(theme.ColorNamePrimary)
	line := func(x1, y1, x2, y2 float32, c color.Color, w float32) *canvas.Line {
		l := canvas.NewLine(c)
		l.Position1, l.Position2, l.StrokeWidth = fyne.NewPos(x1, y1), fyne.NewPos(x2, y2), w
		return l
	}
	text := func(s string, x, y float32) *canvas.Text {
		t := canvas.NewText(s, fg)
		t.TextSize = theme.CaptionTextSize()
		t.Move(fyne.NewPos(x, y))
		return t
	}
	const w, h = 110, 86
	objs := []fyne.CanvasObject{
		// The element before: its rear upper and lower surfaces meeting at
		// the trailing edge (62, 26).
		line(4, 14, 62, 26, fg, 2), line(4, 34, 62, 26, fg, 2),
		// Its chord, extended past the trailing edge, dashed by two pieces.
		line(4, 24, 62, 26, fg, 0.5), line(66, 26, 104, 27, fg, 0.5),
		// The flap: leading edge at (52, 40), turned down by the deflection.
		line(52, 40, 104, 70, fg, 2), line(52, 40, 58, 34, fg, 2), line(58, 34, 104, 70, fg, 1),
		// Gap: trailing edge to the nearest point of the flap's surface.
		line(62, 26, 60, 36, accent, 1.5), text("gap", 64, 28),
		// Overlap: along the chord from the flap's leading edge to the trailing edge.
		line(52, 46, 62, 46, accent, 1.5), line(52, 43, 52, 49, accent, 1), line(62, 43, 62, 49, accent, 1),
		text("overlap", 18, 42),
		// Deflection: the angle between the two chords.
		line(84, 27, 84, 58, accent, 1), text("δ", 88, 36),
	}
	c := container.NewWithoutLayout(objs...)
	r := canvas.NewRectangle(color.Transparent)
	r.SetMinSize(fyne.NewSize(w, h))
	return container.NewStack(r, c)
}
