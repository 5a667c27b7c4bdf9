package ui

import (
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/test"
)

// submit types s into the field and presses Enter, as a user would.
func (f *field) submit(s string) {
	f.SetText(s)
	f.OnSubmitted(s)
}

// TestFieldAppliesOnCommit: typing does not apply; Enter does; a bad value
// shows its message and, when the field is left, returns to the value in
// use (the value the results are for).
func TestFieldAppliesOnCommit(t *testing.T) {
	w := newTestBench(t)
	c := w.controls
	cv := w.Window().Canvas()
	before := w.ctl.Study().Flow.AlphaDeg

	cv.Focus(c.alphaEntry)
	c.alphaEntry.SetText("")
	test.Type(c.alphaEntry, "9")
	w.WaitIdle()
	if got := w.ctl.Study().Flow.AlphaDeg; got != before {
		t.Fatalf("typing applied α = %g before Enter", got)
	}
	test.Type(c.alphaEntry, "0") // "90": outside ±45°
	c.alphaEntry.TypedKey(&fyne.KeyEvent{Name: fyne.KeyReturn})
	w.WaitIdle()
	if got := w.ctl.Study().Flow.AlphaDeg; got != before {
		t.Errorf("α = 90 was applied as %g", got)
	}
	if c.alphaMsg.Hidden {
		t.Error("α = 90 shows no message")
	}
	cv.Unfocus()
	if c.alphaEntry.Text != entryNum(before) {
		t.Errorf("left with a bad value, the field shows %q, want the value in use %q", c.alphaEntry.Text, entryNum(before))
	}

	c.tabs.SelectIndex(2) // Panels & sweep: a field takes the focus only when shown
	cv.Focus(c.panelEntry)
	c.panelEntry.SetText("")
	test.Type(c.panelEntry, "120")
	cv.Unfocus() // leaving applies
	w.WaitIdle()
	if got := w.ctl.Study().Panelling.Panels; got != 120 {
		t.Errorf("leaving the panel field applied %d panels, want 120 (field %q, message %q)", got, c.panelEntry.Text, c.panelMsg.Text)
	}
}

// TestUndoShortcutsEverywhere: Ctrl+Z undoes and Ctrl+Y or Ctrl+Shift+Z
// redoes a study edit whether the focus is in a field or nowhere, as the
// window's driver delivers them (the toolkit's undo and redo shortcuts).
func TestUndoShortcutsEverywhere(t *testing.T) {
	w := newTestBench(t)
	c := w.controls
	cv := w.Window().Canvas()
	base := w.ctl.Study().Panelling.Panels
	c.panelEntry.submit("100")
	w.WaitIdle()
	for _, tc := range []struct {
		name  string
		focus fyne.Focusable
		undo  fyne.Shortcut
		redo  fyne.Shortcut
	}{
		{"focus in a field", c.alphaEntry, &fyne.ShortcutUndo{}, &fyne.ShortcutRedo{}},
		{"no focus", nil, &fyne.ShortcutUndo{}, &fyne.ShortcutRedo{}},
		{"Ctrl+Shift+Z in a field", c.naca, &fyne.ShortcutUndo{}, shortcut(fyne.KeyZ, true)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.focus != nil {
				cv.Focus(tc.focus)
			} else {
				cv.Unfocus()
			}
			test.TypeOnCanvas(cv, "") // nothing typed: only the shortcut acts
			sendShortcut(cv, tc.undo)
			w.WaitIdle()
			if got := w.ctl.Study().Panelling.Panels; got != base {
				t.Errorf("after undo %d panels, want %d", got, base)
			}
			if got := c.panelEntry.Text; got != entryNum(float64(base)) {
				t.Errorf("after undo the panel field shows %q", got)
			}
			sendShortcut(cv, tc.redo)
			w.WaitIdle()
			if got := w.ctl.Study().Panelling.Panels; got != 100 {
				t.Errorf("after redo %d panels, want 100", got)
			}
		})
	}
}

// sendShortcut delivers s as the window's driver does: to the focused
// widget when it takes shortcuts, otherwise to the canvas.
func sendShortcut(cv fyne.Canvas, s fyne.Shortcut) {
	if f, ok := cv.Focused().(fyne.Shortcutable); ok {
		f.TypedShortcut(s)
		return
	}
	cv.(interface{ TypedShortcut(fyne.Shortcut) }).TypedShortcut(s)
}

// TestWheelOverFieldScrollsColumn: the mouse wheel over a numeric field
// scrolls the control column, not the field.
func TestWheelOverFieldScrollsColumn(t *testing.T) {
	w := newTestBench(t)
	w.Window().Resize(fyne.NewSize(1280, 800))
	c := w.controls
	f := c.ec.chord
	pos := fyne.CurrentApp().Driver().AbsolutePositionForObject(f)
	scroll := c.tabs.Items[0].Content.(*container.Scroll)
	before := scroll.Offset.Y
	test.Scroll(w.Window().Canvas(), pos.Add(fyne.NewPos(5, 5)), 0, -40)
	if scroll.Offset.Y <= before {
		t.Errorf("the wheel over the chord field left the column at offset %g", scroll.Offset.Y)
	}
}

// TestErrorScrolledIntoView: a bad value in a field low in the column
// brings its message into view.
func TestErrorScrolledIntoView(t *testing.T) {
	w := newTestBench(t)
	w.Window().Resize(fyne.NewSize(1280, 500))
	c := w.controls
	c.tabs.SelectIndex(0)
	c.clearance.submit("-5") // near the foot of the Wing tab
	sc := c.tabs.Items[0].Content.(*container.Scroll)
	d := fyne.CurrentApp().Driver()
	bottom := d.AbsolutePositionForObject(c.flowMsg).Y + c.flowMsg.Size().Height - d.AbsolutePositionForObject(sc).Y
	if c.flowMsg.Hidden || bottom > sc.Size().Height+1 || sc.Offset.Y == 0 {
		t.Errorf("message hidden %v, its foot at %g in a column %g high (offset %g)", c.flowMsg.Hidden, bottom, sc.Size().Height, sc.Offset.Y)
	}
}

// TestWheelOverTextFieldsScrollsColumn: the wheel over a free-text field
// (study name, team, element name, pin name), which scrolls its own text
// sideways, still scrolls the control column; what lies over the field to
// take the wheel takes nothing else (clicks, drags, keys, the pointer's
// shape go to the field).
func TestWheelOverTextFieldsScrollsColumn(t *testing.T) {
	w := newTestBench(t)
	w.Window().Resize(fyne.NewSize(1280, 500))
	if err := w.ctl.PinCurrent(); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	c := w.controls
	cases := []struct {
		name string
		tab  int
		f    func() *field
	}{
		{"study name", 0, func() *field { return c.studyName }},
		{"team", 0, func() *field { return c.team }},
		{"element name", 0, func() *field { return c.ec.name }},
		{"pin name", 2, func() *field { return c.pinFields[0] }},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c.tabs.SelectIndex(tc.tab)
			f := tc.f()
			c.reveal(f)
			sc := c.tabs.Items[tc.tab].Content.(*container.Scroll)
			d := fyne.CurrentApp().Driver()
			pos := d.AbsolutePositionForObject(f).Add(fyne.NewPos(5, 5))
			before := sc.Offset.Y
			dy, down := float32(-40), true // the wheel towards the user: the column moves up
			if before > 0 {
				dy, down = 40, false
			}
			test.Scroll(w.Window().Canvas(), pos, 0, dy)
			if moved := sc.Offset.Y > before; moved != down || sc.Offset.Y == before {
				t.Errorf("the wheel over the %s field left the column at offset %g (was %g)", tc.name, sc.Offset.Y, before)
			}
		})
	}
	var catcher any = &wheelCatcher{}
	for name, takes := range map[string]bool{
		"taps":    is[fyne.Tappable](catcher),
		"clicks":  is[desktop.Mouseable](catcher),
		"drags":   is[fyne.Draggable](catcher),
		"focus":   is[fyne.Focusable](catcher),
		"hover":   is[desktop.Hoverable](catcher),
		"pointer": is[desktop.Cursorable](catcher),
	} {
		if takes {
			t.Errorf("the wheel catcher over text fields takes %s", name)
		}
	}
}

// is reports whether v implements T.
func is[T any](v any) bool {
	_, ok := v.(T)
	return ok
}
