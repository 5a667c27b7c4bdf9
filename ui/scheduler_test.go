package ui

import (
	"context"
	"errors"
	"sync"
	"testing"

	"sectionbench/model"
)

// gateEngine blocks each Run until released and records the angles run.
type gateEngine struct {
	mu      sync.Mutex
	ran     []float64
	gate    chan struct{}
	started chan struct{} // receives once per Run, if not nil
	panic   bool
}

func (g *gateEngine) Run(ctx context.Context, req engineRequest) (*engineResult, error) {
	if g.started != nil {
		g.started <- struct{}{}
	}
	<-g.gate
	g.mu.Lock()
	g.ran = append(g.ran, req.Study.Flow.AlphaDeg)
	g.mu.Unlock()
	if g.panic {
		panic("boom")
	}
	return &engineResult{}, nil
}

func alphaReq(a float64) engineRequest {
	st := model.NewStudy()
	st.Flow.AlphaDeg = a
	return engineRequest{Study: st}
}

func TestSchedulerLatestWins(t *testing.T) {
	g := &gateEngine{gate: make(chan struct{}), started: make(chan struct{}, 10)}
	act := newActivity()
	var got []uint64
	s := newScheduler(g, act, func(u update, _ *engineResult, err error) {
		if err != nil {
			t.Errorf("unexpected error %v", err)
		}
		got = append(got, u.gen)
	})
	s.Submit(alphaReq(1)) // starts running, blocked at the gate
	<-g.started
	for a := 2.0; a <= 5; a++ {
		s.Submit(alphaReq(a)) // each replaces the one waiting
	}
	close(g.gate)
	act.wait()
	// Request 1 ran but was stale when it finished; 2..4 never ran; 5 ran
	// and was shown.
	if want := []float64{1, 5}; len(g.ran) != 2 || g.ran[0] != want[0] || g.ran[1] != want[1] {
		t.Errorf("engine ran angles %v, want %v", g.ran, want)
	}
	if len(got) != 1 || got[0] != s.Latest() {
		t.Errorf("delivered generations %v, want only the latest %d", got, s.Latest())
	}
}

func TestSchedulerRecoversPanic(t *testing.T) {
	g := &gateEngine{gate: make(chan struct{}), panic: true}
	close(g.gate)
	act := newActivity()
	var err error
	s := newScheduler(g, act, func(_ update, _ *engineResult, e error) { err = e })
	s.Submit(alphaReq(0))
	act.wait()
	if err == nil {
		t.Fatal("a panicking engine gave no error")
	}
}

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

func TestFriendlyMessages(t *testing.T) {
	cases := []struct {
		name string
		err  error
		want string
	}{
		{"field", &model.FieldError{Field: "panelling.panels", Err: errors.New("5000 is outside 16..2000")}, "Panel count: 5000 is outside 16..2000"},
		{"naca", &model.NACAError{Designation: "44x2", Pos: 2, Reason: "is not a digit"}, "Not a NACA designation: character 3 is not a digit"},
		{"naca without position", &model.NACAError{Designation: "", Pos: -1, Reason: "is empty"}, "Not a NACA designation: is empty"},
		{"plain", errors.New("first\nsecond"), "first"},
	}
	for _, c := range cases {
		if got := friendly(c.err); got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}

func TestFileNameFor(t *testing.T) {
	for in, want := range map[string]string{
		"Demo — fictional student team, rear-wing main element": "demo-fictional-student-team-rear-wing-main-element.json",
		"":       "study.json",
		"Wing 2": "wing-2.json",
	} {
		if got := fileNameFor(in); got != want {
			t.Errorf("fileNameFor(%q) = %q, want %q", in, got, want)
		}
	}
}
