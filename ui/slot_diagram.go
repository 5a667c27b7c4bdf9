package ui

import (
	"image/color"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
)

// newSlotDiagram draws what gap, overlap and deflection measure: the
// trailing end of the element before, the flap behind it, the gap from the
// trailing edge to the flap's surface, the overlap along the chord and the
// deflection between the chords. It is drawn upright, as in high-lift
// texts; on an inverted wing the slot is its mirror image.
func newSlotDiagram() fyne.CanvasObject {
	fg := theme.Color(theme.ColorNameForeground)
	faint := theme.Color(theme.ColorNameDisabled)
	accent := theme.Color(theme.ColorNamePrimary)
	line := func(x1, y1, x2, y2 float32, c color.Color, w float32) *canvas.Line {
		l := canvas.NewLine(c)
		l.Position1, l.Position2, l.StrokeWidth = fyne.NewPos(x1, y1), fyne.NewPos(x2, y2), w
		return l
	}
	text := func(s string, x, y float32, c color.Color) *canvas.Text {
		t := canvas.NewText(s, c)
		t.TextSize = theme.CaptionTextSize()
		t.Move(fyne.NewPos(x, y))
		return t
	}
	const w, h = 230, 104
	objs := []fyne.CanvasObject{
		// The element before: the rear of its upper and lower surfaces,
		// meeting at its trailing edge (120, 40).
		line(10, 18, 120, 40, fg, 2), line(10, 56, 120, 40, fg, 2),
		text("element before", 14, 0, fg),
		// Its chord, continued past the trailing edge.
		line(10, 37, 120, 40, faint, 1), line(120, 40, 226, 43, faint, 1),
		// The flap: leading edge at (100, 62), nose rounded by two strokes,
		// chord turned down by the deflection.
		line(100, 62, 108, 55, fg, 2), line(108, 55, 226, 96, fg, 2), line(100, 62, 226, 98, fg, 1.5),
		text("flap", 190, 62, fg),
		// Gap: from the trailing edge to the nearest point of the flap.
		line(120, 40, 117, 60, accent, 2), text("gap", 124, 44, accent),
		// Overlap: along the chord, from the flap's leading edge forward of
		// the trailing edge back to it.
		line(100, 80, 120, 80, accent, 1.5), line(100, 74, 100, 86, accent, 1), line(120, 74, 120, 86, accent, 1),
		text("overlap", 46, 74, accent),
		// Deflection: the angle between the two chords.
		line(200, 42, 204, 58, accent, 1.5), text("deflection", 150, 22, accent),
	}
	c := container.NewWithoutLayout(objs...)
	r := canvas.NewRectangle(color.Transparent)
	r.SetMinSize(fyne.NewSize(w, h))
	return container.NewStack(r, c)
}
