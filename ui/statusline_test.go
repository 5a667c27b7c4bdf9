package ui

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"
)

// TestStatusLineFits opens the two-element rear wing with the speed, span
// and boundary layer on, at the default window size and at a narrower
// one: the status line shows whole items from the first that fit its
// width, and the caution stays whole inside the window.
func TestStatusLineFits(t *testing.T) {
	test.NewTempApp(t)
	w := openTestBench(t, rearWing)
	fc := w.controls.fc
	fc.unit.SetSelected(unitMPS)
	fc.speed.submit("25")
	fc.span.submit("1.1")
	w.controls.vc.mode.SetSelected(modeEstimate)
	for _, width := range []float32{windowWidth, 1000} {
		w.Window().Resize(fyne.NewSize(width, windowHeight))
		current(t, w)
		full, shown := w.status.Full(), w.status.Text()
		if !strings.HasPrefix(full, shown) || !strings.HasPrefix(shown, "−Cl ") {
			t.Errorf("%g wide: shows %q of %q", width, shown, full)
		}
		if rest := strings.TrimPrefix(full, shown); rest != "" && !strings.HasPrefix(rest, statusSep) {
			t.Errorf("%g wide: an item is cut: %q then %q", width, shown, rest)
		}
		lw := w.status.label.Size().Width - 2*theme.InnerPadding()
		if tw := fyne.MeasureText(shown, theme.TextSize(), w.status.label.TextStyle).Width; tw > lw {
			t.Errorf("%g wide: text %g wide in a label of %g", width, tw, lw)
		}
		if width == windowWidth && !strings.Contains(shown, "min Cp") {
			t.Errorf("at %g the status line leaves out the suction peak: %q", width, shown)
		}
		d := fyne.CurrentApp().Driver()
		pos, size := d.AbsolutePositionForObject(w.caution), w.caution.Size()
		if !w.caution.Visible() || w.caution.Text != cautionStatus || pos.X < 0 || pos.X+size.Width > w.Window().Canvas().Size().Width+0.5 || size.Width < w.caution.MinSize().Width-0.5 {
			t.Errorf("%g wide: caution at %v, %v (min %v), canvas %v", width, pos, size, w.caution.MinSize(), w.Window().Canvas().Size())
		}
	}
}
