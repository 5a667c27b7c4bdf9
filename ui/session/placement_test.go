package session

import (
	"errors"
	"testing"

	"sectionbench/model"
)

// rearWing makes the test controller's study a main element and a flap
// 12 mm behind it, and waits for it to be placed and solved.
func rearWing(t *testing.T, c *testController) {
	t.Helper()
	if err := c.AddElement(); err != nil {
		t.Fatal(err)
	}
	c.idle()
	if n := len(c.Study().Elements); n != 2 {
		t.Fatalf("%d elements after adding a flap", n)
	}
}

// heldPlacer holds each placement until released and counts them.
type heldPlacer struct {
	started chan *model.Study
	release chan struct{}
}

func newHeldPlacer(c *testController) *heldPlacer {
	h := &heldPlacer{started: make(chan *model.Study, 10), release: make(chan struct{})}
	c.placer = func(st *model.Study, secs []*model.Section) error {
		h.started <- st
		<-h.release
		return checkGeometry(st, secs)
	}
	return h
}

// An edit of the elements returns before its placement ends; the study
// changes when it ends, as one undo step.
func TestEditPlacesOffTheUIGoroutine(t *testing.T) {
	c := newTestController(t)
	rearWing(t, c)
	h := newHeldPlacer(c)
	before := c.Study()
	if err := c.SetSlot("", 1, model.Slot{GapMM: 15, OverlapMM: 5, DeflectionDeg: 20}); err != nil {
		t.Fatal(err)
	}
	<-h.started // running, held: Edit has returned meanwhile
	if !c.Pending() {
		t.Error("the edit is not pending while it is placed")
	}
	if got := c.Study(); got.Elements[1] != before.Elements[1] {
		t.Error("the study changed before its placement ended")
	}
	close(h.release)
	c.idle()
	if c.Pending() {
		t.Error("still pending after the placement")
	}
	if got := c.SlotOf(1); got.DeflectionDeg != 20 {
		t.Errorf("flap deflection %g after the edit, want 20", got.DeflectionDeg)
	}
	res, gen, err := c.Result()
	if err != nil || res == nil || gen != c.Latest() {
		t.Fatalf("no current result after the placement (err %v)", err)
	}
	c.Undo()
	if got := c.Study(); got.Elements[1] != before.Elements[1] {
		t.Error("one undo does not go back to before the edit")
	}
}

// Edits made while a placement runs apply to the pending study and wait
// with it; only the newest elements are placed after the one running.
func TestPendingEditsNewestWins(t *testing.T) {
	c := newTestController(t)
	rearWing(t, c)
	h := newHeldPlacer(c)
	if err := c.SetSlot("", 1, model.Slot{GapMM: 15, OverlapMM: 5, DeflectionDeg: 20}); err != nil {
		t.Fatal(err)
	}
	<-h.started
	// While it is held: the angle (no placement of its own), then two
	// more flap settings.
	steps := []func() error{
		func() error { return c.SetAlpha("", 3) },
		func() error { return c.SetSlot("", 1, model.Slot{GapMM: 14, OverlapMM: 5, DeflectionDeg: 22}) },
		func() error { return c.SetSlot("", 1, model.Slot{GapMM: 13, OverlapMM: 5, DeflectionDeg: 24}) },
	}
	for i, f := range steps {
		if err := f(); err != nil {
			t.Fatalf("step %d: %v", i, err)
		}
	}
	h.release <- struct{}{} // the first placement ends
	c.WaitIdle()
	c.q.Drain()           // its verdict, on the UI goroutine
	newest := <-h.started // the newest is placed next, not the one between
	if got := newest.SlotOf(1, c.Sections()[1]).DeflectionDeg; got != 24 {
		t.Errorf("second placement is of deflection %g, want the newest, 24", got)
	}
	close(h.release)
	c.idle()
	st := c.Study()
	if got := c.SlotOf(1).DeflectionDeg; got != 24 || st.Flow.AlphaDeg != 3 {
		t.Errorf("study has deflection %g and α %g, want 24 and 3", got, st.Flow.AlphaDeg)
	}
	if n := len(h.started); n != 0 {
		t.Errorf("%d more placements, want none", n)
	}
}

// Elements that cannot be placed are refused: the study stays as it was
// before the pending edits, and the reason goes to OnRefused.
func TestOverlapRefusedAfterPlacement(t *testing.T) {
	c := newTestController(t)
	rearWing(t, c)
	var refused []error
	c.OnRefused = func(err error) { refused = append(refused, err) }
	before, _ := c.Study().Encode()
	res, _, _ := c.Result()
	if err := c.SetSlot("", 1, model.Slot{GapMM: -1, OverlapMM: 5, DeflectionDeg: 20}); err != nil {
		t.Fatal(err)
	}
	c.idle()
	var ge *model.GeometryError
	if len(refused) != 1 || !errors.As(refused[0], &ge) || !errors.Is(refused[0], model.ErrOverlap) {
		t.Fatalf("refusals %v, want one overlap", refused)
	}
	if after, _ := c.Study().Encode(); string(after) != string(before) {
		t.Error("a refused placement changed the study")
	}
	if r, _, err := c.Result(); r != res || err != nil {
		t.Errorf("a refused placement was solved (err %v)", err)
	}
	if c.Pending() {
		t.Error("still pending after the refusal")
	}
}

// Renaming an element places nothing: it changes no geometry.
func TestRenameDoesNotPlace(t *testing.T) {
	c := newTestController(t)
	rearWing(t, c)
	c.placer = func(*model.Study, []*model.Section) error {
		t.Error("a rename was placed")
		return nil
	}
	if err := c.SetElementName("", 1, "rear flap"); err != nil {
		t.Fatal(err)
	}
	if c.Pending() || c.Study().Elements[1].Name != "rear flap" {
		t.Error("the rename did not apply at once")
	}
	c.idle()
}
