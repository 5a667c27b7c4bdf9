package session

import (
	"context"
	"errors"
	"sync"
	"testing"
	"time"

	"sectionbench/assets"
	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session/sessiontest"
)

// uiQueue stands in for the UI goroutine in tests.
type uiQueue = sessiontest.Queue

// testController is a controller on the demo study with its viscous
// solution off (as the demo was before the coupled solution became its
// default: the session's logic under test does not depend on it, and an
// edit then solves in milliseconds), without a window, and the queue that
// stands for its UI goroutine.
type testController struct {
	*Controller
	q *uiQueue
}

func newTestController(t *testing.T) *testController {
	t.Helper()
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		t.Fatal(err)
	}
	st.Viscous.Enabled = false
	q := new(uiQueue)
	c := &testController{NewController(q.Post), q}
	if err := c.Load(st, ""); err != nil {
		t.Fatal(err)
	}
	c.idle()
	t.Cleanup(func() { c.CancelSweep(); c.idle() })
	return c
}

// idle waits for the worker and runs what it posted, until neither has
// anything left.
func (c *testController) idle() {
	for {
		c.WaitIdle()
		if !c.q.Drain() {
			return
		}
	}
}

func TestEqualGeometry(t *testing.T) {
	cases := []struct {
		name string
		edit func(*model.Study)
		want bool
	}{
		{"same", func(*model.Study) {}, true},
		{"angle", func(s *model.Study) { s.Flow.AlphaDeg = 9 }, true},
		{"sweep range", func(s *model.Study) { s.Sweep.ToDeg = 20 }, true},
		{"name", func(s *model.Study) { s.Name = "other" }, true},
		{"pins", func(s *model.Study) { s.Pins = []model.Pin{{Label: "x"}} }, true},
		{"panels", func(s *model.Study) { s.Panelling.Panels = 90 }, false},
		{"section", func(s *model.Study) { s.Elements[0].Section.Spec = "naca:0012" }, false},
		{"ground", func(s *model.Study) { s.Ground.Enabled = true }, false},
		{"inverted", func(s *model.Study) { s.Inverted = !s.Inverted }, false},
		{"density plan", func(s *model.Study) { s.Density = model.DensityPlan{Panels: []int{40, 80}, TolClPct: 0.5} }, true},
		{"span", func(s *model.Study) { s.Flow.SpanM = 1.2 }, true},
		{"speed, inviscid", func(s *model.Study) { s.Flow.SpeedMPS = 25 }, true},
		{"trip, inviscid", func(s *model.Study) { s.Viscous.TripUpper = 0.1 }, true},
		{"boundary layer on", func(s *model.Study) { s.Viscous.Enabled = true }, false},
		{"reference chord", func(s *model.Study) { s.ReferenceChordMM = 300 }, false},
		{"element moved", func(s *model.Study) { s.Elements[0].YMM += 1 }, false},
	}
	for _, c := range cases {
		a := model.NewStudy()
		b := a.Clone()
		c.edit(b)
		if got := EqualGeometry(a, b); got != c.want {
			t.Errorf("%s: equalGeometry = %v, want %v", c.name, got, c.want)
		}
	}
	// With the boundary layer on, the air and speed set the Reynolds
	// number of the sweep's drag estimate.
	a := model.NewStudy()
	a.Viscous.Enabled, a.Flow.SpeedMPS = true, 20
	b := a.Clone()
	b.Flow.SpeedMPS = 30
	if EqualGeometry(a, b) {
		t.Error("speed change with the boundary layer on: equalGeometry = true")
	}
}

// heldEngine holds every run until hold is closed, then solves for real.
type heldEngine struct {
	inner Runner
	hold  chan struct{}
}

func (h *heldEngine) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
	<-h.hold
	return h.inner.Run(ctx, req)
}

// PinCurrent never waits for a solve on the UI goroutine: with the newest
// request held in the engine it returns at once, and the pin is taken when
// that result arrives.
func TestPinCurrentDoesNotWait(t *testing.T) {
	w := newTestController(t)
	held := &heldEngine{inner: w.sched.eng, hold: make(chan struct{})}
	w.SetRunner(held) // idle: the next Submit starts the worker
	if err := w.SetAlpha("", 3); err != nil {
		t.Fatal(err)
	}
	returned := make(chan error)
	go func() { returned <- w.PinCurrent() }()
	select {
	case err := <-returned:
		if err != nil {
			t.Fatal(err)
		}
	case <-time.After(10 * time.Second):
		close(held.hold)
		t.Fatal("PinCurrent waited for the solve")
	}
	if n := len(w.Study().Pins); n != 0 {
		t.Fatalf("%d pins before the solve finished", n)
	}
	close(held.hold)
	w.idle()
	if pins := w.Study().Pins; len(pins) != 1 {
		t.Fatalf("%d pins after the solve, want 1", len(pins))
	}
}

// A new study gains a speed: the viscous solution comes on, as the coupled
// solution, in the same undo step, and the result carries it.
func TestSetSpeedTurnsViscousOn(t *testing.T) {
	c := newTestController(t)
	if err := c.Load(model.NewStudy(), ""); err != nil {
		t.Fatal(err)
	}
	c.idle()
	if c.Study().Viscous.Enabled {
		t.Fatal("a new study without a speed has the viscous solution on")
	}
	if err := c.SetSpeed("speed", 20); err != nil {
		t.Fatal(err)
	}
	c.idle()
	if v := c.Study().Viscous; !v.Enabled || !v.IsCoupled() {
		t.Fatalf("after the first speed: viscous %+v, want the coupled solution on", v)
	}
	if !c.Undo() {
		t.Fatal("nothing to undo")
	}
	c.idle()
	if st := c.Study(); st.Viscous.Enabled || st.Flow.SpeedMPS != 0 {
		t.Errorf("undo left speed %g, viscous %+v", st.Flow.SpeedMPS, st.Viscous)
	}
}

// countingEngine counts the runs it is given.
type countingEngine struct {
	inner Runner
	mu    sync.Mutex
	runs  int
}

func (e *countingEngine) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
	e.mu.Lock()
	e.runs++
	e.mu.Unlock()
	return e.inner.Run(ctx, req)
}

// TestRunSweepShowsWithoutResolving: a sweep that ends while the result
// on hand is the newest is presented with that result at once; the study's
// point is not solved again (with the coupled solution that took seconds,
// and the polar stayed empty meanwhile).
func TestRunSweepShowsWithoutResolving(t *testing.T) {
	w := newTestController(t)
	if err := w.Edit("", func(s *model.Study) { s.Ground.Enabled = true }); err != nil { // no live sweep
		t.Fatal(err)
	}
	w.idle()
	var scenes []*figure.Scene
	w.OnResult = func(gen uint64, sc *figure.Scene, res *engine.Result, err error) {
		if err == nil {
			w.q.Post(func() { scenes = append(scenes, sc) })
		}
	}
	count := &countingEngine{inner: w.sched.eng}
	w.SetRunner(count)
	gen := w.Latest()
	var done error = errors.New("not ended")
	if err := w.RunSweep(nil, func(err error) { done = err }); err != nil {
		t.Fatal(err)
	}
	w.idle()
	if done != nil {
		t.Fatalf("sweep: %v", done)
	}
	if count.runs != 0 || w.Latest() != gen { // the sweep runs on an engine of its own
		t.Errorf("the point was solved again: %d runs, generation %d → %d", count.runs, gen, w.Latest())
	}
	if len(scenes) != 1 || len(scenes[0].Sweep) == 0 {
		t.Fatalf("%d scenes presented, want one with the sweep", len(scenes))
	}
}
