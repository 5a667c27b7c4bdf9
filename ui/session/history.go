package session

import (
	"time"

	"sectionbench/model"
)

// maxUndo bounds the undo history; older snapshots are dropped. A study is
// a few kilobytes unless it embeds coordinates, so this stays small.
const maxUndo = 200

// mergeWindow is how soon an edit must follow the last one with the same
// key to join its undo step: typing "120" is one step, a second edit of
// the same field a while later is another.
const mergeWindow = 2 * time.Second

// history keeps snapshots of the study for undo and redo. It stores clones;
// callers hand in and get back studies they own.
//
// Consecutive edits that carry the same non-empty merge key (the ticks of
// one slider drag) make a single undo step; Break ends such a run.
type history struct {
	undo, redo []*model.Study
	lastKey    string
	lastAt     time.Time
	now        func() time.Time // time.Now unless a test sets it
}

// Record saves before, the study as it was before an edit, as an undo step
// and clears the redo stack.
func (h *history) Record(before *model.Study, key string) {
	h.redo = nil
	now := time.Now
	if h.now != nil {
		now = h.now
	}
	t := now()
	merge := key != "" && key == h.lastKey && len(h.undo) > 0 && t.Sub(h.lastAt) < mergeWindow
	h.lastKey, h.lastAt = key, t
	if merge {
		return
	}
	h.undo = append(h.undo, before.Clone())
	if len(h.undo) > maxUndo {
		h.undo = h.undo[len(h.undo)-maxUndo:]
	}
}

// Break ends a run of merged edits.
func (h *history) Break() { h.lastKey = "" }

// Undo returns the study to go back to, given the current one, or false if
// there is nothing to undo.
func (h *history) Undo(cur *model.Study) (*model.Study, bool) {
	h.lastKey = ""
	if len(h.undo) == 0 {
		return nil, false
	}
	prev := h.undo[len(h.undo)-1]
	h.undo = h.undo[:len(h.undo)-1]
	h.redo = append(h.redo, cur.Clone())
	return prev.Clone(), true
}

// Redo returns the study undone last, given the current one, or false.
func (h *history) Redo(cur *model.Study) (*model.Study, bool) {
	h.lastKey = ""
	if len(h.redo) == 0 {
		return nil, false
	}
	next := h.redo[len(h.redo)-1]
	h.redo = h.redo[:len(h.redo)-1]
	h.undo = append(h.undo, cur.Clone())
	return next.Clone(), true
}

// peekUndo and peekRedo return the study a step would go to (not a
// copy: callers only read it), nil when there is none.
func (h *history) peekUndo() *model.Study { return peek(h.undo) }
func (h *history) peekRedo() *model.Study { return peek(h.redo) }

func peek(s []*model.Study) *model.Study {
	if len(s) == 0 {
		return nil
	}
	return s[len(s)-1]
}

// CanUndo and CanRedo report whether a step is available.
func (h *history) CanUndo() bool { return len(h.undo) > 0 }
func (h *history) CanRedo() bool { return len(h.redo) > 0 }

// Reset forgets all steps (a new or opened study).
func (h *history) Reset() { *h = history{now: h.now} }
