package ui

import (
	"fyne.io/fyne/v2/widget"
)

// An edit that changes the elements is placed off the UI goroutine
// (session.Controller.Edit returns at once), so a refusal arrives after
// the control's own call returned: it is shown where that control shows
// its errors. Each control that can make such an edit says, just before
// calling the controller, which message label it uses (editFrom), and a
// field also which text was in use, to return to it.

// editOrigin is the control that made the newest edit.
type editOrigin struct {
	msg   *widget.Label
	field *field // nil unless a field made it
	inUse string // the field's value in use before the edit
	left  int    // the field's count of focus losses at the edit
}

// editFrom records that the next edit comes from the control whose errors
// show in msg.
func (w *Workbench) editFrom(msg *widget.Label) { w.origin = editOrigin{msg: msg} }

// editFromField records that the next edit comes from f, as it is left
// (leaving) or on Enter.
func (w *Workbench) editFromField(f *field, leaving bool) {
	w.origin = editOrigin{msg: f.msg, field: f, inUse: f.inUse, left: f.left}
	if leaving {
		w.origin.left-- // counts as left since
	}
}

// refused shows why pending edits were refused, beside the control that
// made the newest of them. The field it came from goes back to the value
// still in use, as a field does with a text it cannot apply: at once when
// the user has left it, else when they leave it (the text typed stays to
// be corrected).
func (w *Workbench) refused(err error) {
	o := w.origin
	if o.msg == nil {
		w.userError(err)
		return
	}
	if f := o.field; f != nil {
		f.inUse = o.inUse
		if f.left != o.left {
			f.SetText(o.inUse)
		}
	}
	setMessage(o.msg, err)
	if w.controls != nil {
		w.controls.reveal(o.msg)
	}
}
