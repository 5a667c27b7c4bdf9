package session

import (
	"context"
	"sync"
	"testing"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// gateEngine blocks each Run until released and records the angles run.
type gateEngine struct {
	mu      sync.Mutex
	ran     []float64
	gate    chan struct{}
	started chan struct{} // receives once per Run, if not nil
	panic   bool
}

func (g *gateEngine) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
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
	return &engine.Result{}, nil
}

func alphaReq(a float64) engine.Request {
	st := model.NewStudy()
	st.Flow.AlphaDeg = a
	return engine.Request{Study: st}
}

func TestSchedulerLatestWins(t *testing.T) {
	g := &gateEngine{gate: make(chan struct{}), started: make(chan struct{}, 10)}
	act := NewActivity()
	var got []uint64
	s := newScheduler(g, act, func(u update, _ *engine.Result, err error) {
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
	act.Wait()
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
	act := NewActivity()
	var err error
	s := newScheduler(g, act, func(_ update, _ *engine.Result, e error) { err = e })
	s.Submit(alphaReq(0))
	act.Wait()
	if err == nil {
		t.Fatal("a panicking engine gave no error")
	}
}

// ctxEngine blocks each Run until its context is cancelled or the gate
// opens, and reports which happened.
type ctxEngine struct {
	started   chan struct{}
	gate      chan struct{}
	cancelled chan float64
}

func (g *ctxEngine) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
	g.started <- struct{}{}
	select {
	case <-ctx.Done():
		g.cancelled <- req.Study.Flow.AlphaDeg
		return nil, ctx.Err()
	case <-g.gate:
		return &engine.Result{}, nil
	}
}

// A newer request cancels the context of the solve running, so the worker
// moves on to it instead of finishing a stale factorisation; so does
// Invalidate.
func TestSchedulerCancelsStaleSolve(t *testing.T) {
	g := &ctxEngine{started: make(chan struct{}, 10), gate: make(chan struct{}), cancelled: make(chan float64, 10)}
	act := NewActivity()
	var shown []uint64
	s := newScheduler(g, act, func(u update, _ *engine.Result, err error) {
		if err != nil {
			t.Errorf("delivered error %v", err)
		}
		shown = append(shown, u.gen)
	})
	s.Submit(alphaReq(1))
	<-g.started
	last := s.Submit(alphaReq(2))
	if a := <-g.cancelled; a != 1 {
		t.Errorf("cancelled the solve at %g°, want the stale one at 1°", a)
	}
	<-g.started // the newest request runs
	close(g.gate)
	act.Wait()
	if len(shown) != 1 || shown[0] != last {
		t.Errorf("shown generations %v, want only %d", shown, last)
	}

	g.gate = make(chan struct{})
	s.Submit(alphaReq(3))
	<-g.started
	s.Invalidate()
	if a := <-g.cancelled; a != 3 {
		t.Errorf("Invalidate cancelled %g°, want 3°", a)
	}
	act.Wait()
}
