package session

import (
	"testing"
	"time"

	"sectionbench/model"
)

func TestHistoryBounds(t *testing.T) {
	var h history
	st := model.NewStudy()
	for i := range maxUndo + 10 {
		st.Panelling.Panels = 16 + i
		h.Record(st, "")
	}
	if len(h.undo) != maxUndo {
		t.Errorf("undo holds %d steps, want the bound %d", len(h.undo), maxUndo)
	}
	cur := model.NewStudy()
	prev, ok := h.Undo(cur)
	if !ok || prev.Panelling.Panels != 16+maxUndo+9 {
		t.Errorf("undo gave %v, %v", prev, ok)
	}
	if !h.CanRedo() {
		t.Error("no redo after undo")
	}
	h.Record(cur, "")
	if h.CanRedo() {
		t.Error("a new edit kept the redo stack")
	}
}

func TestHistoryMergesQuickEdits(t *testing.T) {
	clock := time.Unix(0, 0)
	h := history{now: func() time.Time { return clock }}
	st := model.NewStudy()
	step := func(n int, key string, after time.Duration) {
		clock = clock.Add(after)
		st.Panelling.Panels = n
		h.Record(st, key)
	}
	step(100, "panels", 0)
	step(110, "panels", 100*time.Millisecond) // same drag: merged
	step(120, "panels", 3*time.Second)        // later: a step of its own
	step(130, "alpha", 10*time.Millisecond)   // other field: a step of its own
	step(140, "", 0)                          // unkeyed: always a step
	if got, want := len(h.undo), 4; got != want {
		t.Errorf("%d undo steps, want %d", got, want)
	}
	// The first step keeps the study from before the drag.
	if got := h.undo[0].Panelling.Panels; got != 100 {
		t.Errorf("first step holds N=%d, want 100", got)
	}
}
