package ui

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"
)

// field is an entry that applies what it shows: its text is applied when
// the user presses Enter or leaves the field, never keystroke by keystroke.
// A text that cannot be applied shows its message beside the field; when
// the user leaves, the field returns to the value in use, so the value a
// field shows is always the one the results are for. Undo and redo
// shortcuts go to the study's history, not to the entry's own text.
type field struct {
	widget.Entry
	apply func(text string) error // one study edit; nil for a field that only holds text
	msg   *widget.Label
	inUse string
	w     *Workbench
	left  int // times the field lost the focus (refusal.go)
	// wheelToColumn hands the mouse wheel over the field to the control
	// column (textField).
	wheelToColumn bool
}

// newField returns a field on w that applies its text with apply and shows
// apply's error in msg.
//
// A field holds a short value (a number, a designation) and has no
// scroller of its own, so the mouse wheel over it scrolls the control
// column; textField is for longer free text.
func newField(w *Workbench, msg *widget.Label, apply func(string) error) *field {
	f := &field{w: w, msg: msg, apply: apply}
	f.Wrapping, f.Scroll = fyne.TextWrapOff, fyne.ScrollNone
	f.ExtendBaseWidget(f)
	f.OnSubmitted = func(string) { f.commit(false) }
	return f
}

// textField is newField for free text (a name) that may be longer than
// the field: it scrolls sideways inside the field (keys, selection), but
// the mouse wheel over it still scrolls the control column.
func textField(w *Workbench, msg *widget.Label, apply func(string) error) *field {
	f := &field{w: w, msg: msg, apply: apply, wheelToColumn: true}
	f.Wrapping = fyne.TextWrap(fyne.TextTruncateClip)
	f.ExtendBaseWidget(f)
	f.OnSubmitted = func(string) { f.commit(false) }
	return f
}

// CreateRenderer is the entry's, with a wheelCatcher laid over a text
// field: the toolkit hands the wheel to the innermost scrollable object
// under the pointer, which would otherwise be the entry's own sideways
// scroller.
func (f *field) CreateRenderer() fyne.WidgetRenderer {
	r := f.Entry.CreateRenderer()
	if !f.wheelToColumn {
		return r
	}
	c := &wheelCatcher{onWheel: func(e *fyne.ScrollEvent) {
		if f.w != nil && f.w.controls != nil {
			f.w.controls.scrollColumn(e)
		}
	}}
	c.ExtendBaseWidget(c)
	return &catcherRenderer{WidgetRenderer: r, catcher: c}
}

// wheelCatcher takes the mouse wheel and nothing else: taps, drags, keys
// and the pointer's shape go to what lies under it.
type wheelCatcher struct {
	widget.BaseWidget
	onWheel func(*fyne.ScrollEvent)
}

// Scrolled is part of fyne.Scrollable.
func (c *wheelCatcher) Scrolled(e *fyne.ScrollEvent) { c.onWheel(e) }

// CreateRenderer is part of fyne.Widget: nothing to draw.
func (c *wheelCatcher) CreateRenderer() fyne.WidgetRenderer {
	return widget.NewSimpleRenderer(layout.NewSpacer())
}

// catcherRenderer is an entry's renderer with a wheelCatcher over all of it.
type catcherRenderer struct {
	fyne.WidgetRenderer
	catcher *wheelCatcher
}

func (r *catcherRenderer) Layout(size fyne.Size) {
	r.WidgetRenderer.Layout(size)
	r.catcher.Resize(size)
	r.catcher.Move(fyne.NewPos(0, 0))
}

func (r *catcherRenderer) Objects() []fyne.CanvasObject {
	return append(r.WidgetRenderer.Objects(), r.catcher)
}

// inColumn reports whether f is one of the control column's fields (and
// not one of another window's, such as the density window's).
func (f *field) inColumn() bool {
	if f.w == nil || f.w.controls == nil || f.w.win == nil {
		return false
	}
	return fyne.CurrentApp().Driver().CanvasForObject(f) == f.w.win.Canvas()
}

// FocusLost applies the text, or reverts it to the value in use.
func (f *field) FocusLost() {
	f.Entry.FocusLost()
	f.left++
	f.commit(true)
}

// TypedShortcut sends undo and redo to the study's history.
func (f *field) TypedShortcut(s fyne.Shortcut) {
	if f.w != nil {
		switch historyShortcut(s) {
		case -1:
			f.w.ctl.Undo()
			return
		case 1:
			f.w.ctl.Redo()
			return
		}
	}
	f.Entry.TypedShortcut(s)
}

// historyShortcut returns −1 for an undo shortcut (Ctrl+Z), 1 for redo
// (Ctrl+Y, Ctrl+Shift+Z), 0 otherwise.
func historyShortcut(s fyne.Shortcut) int {
	switch s := s.(type) {
	case *fyne.ShortcutUndo:
		return -1
	case *fyne.ShortcutRedo:
		return 1
	case *desktop.CustomShortcut:
		if s.KeyName == fyne.KeyZ && s.Modifier&fyne.KeyModifierShortcutDefault != 0 {
			if s.Modifier&fyne.KeyModifierShift != 0 {
				return 1
			}
			return -1
		}
		if s.KeyName == fyne.KeyY && s.Modifier&fyne.KeyModifierShortcutDefault != 0 {
			return 1
		}
	}
	return 0
}

// commit applies the text if it differs from the value in use. leaving
// says the field is losing the focus: a text that cannot be applied is then
// replaced by the value in use, its message kept beside the field.
func (f *field) commit(leaving bool) {
	if f.apply == nil {
		return
	}
	if f.Text == f.inUse {
		return
	}
	if f.w != nil {
		f.w.editFromField(f, leaving)
	}
	if err := f.apply(f.Text); err != nil {
		setMessage(f.msg, err)
		if f.inColumn() {
			f.w.controls.reveal(f.msg)
		}
		if leaving {
			f.SetText(f.inUse)
		}
		return
	}
	setMessage(f.msg, nil)
	f.inUse = f.Text
}

// show sets the value in use. A text that already says the same value
// (same reports it: "4." for 4) is left as typed.
func (f *field) show(text string, same func(string) bool) {
	if same != nil && same(f.Text) {
		f.inUse = f.Text
		return
	}
	f.inUse = text
	f.SetText(text)
}
