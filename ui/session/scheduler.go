package session

import (
	"context"
	"sync"

	"sectionbench/solver/engine"
)

// update is one request to the engine with the generation it was made in.
type update struct {
	gen uint64
	req engine.Request
}

// scheduler runs engine requests on one worker goroutine, latest request
// wins: a request submitted while another runs replaces any request still
// waiting and cancels the context of the one running, and a result whose
// generation is no longer the latest is dropped without being shown. The
// engine checks the context between its stages (placement, factorisation,
// each angle of a sweep, the boundary layer), so a slider tick does not
// wait behind a stale solve for longer than one stage.
type scheduler struct {
	eng     Runner
	act     *Activity
	deliver func(u update, res *engine.Result, err error) // on the worker goroutine

	mu      sync.Mutex
	idle    *sync.Cond // signalled when the worker stops
	gen     uint64
	pending *update
	busy    bool
	cancel  context.CancelFunc // of the request running, nil when none
}

func newScheduler(eng Runner, act *Activity, deliver func(update, *engine.Result, error)) *scheduler {
	s := &scheduler{eng: eng, act: act, deliver: deliver}
	s.idle = sync.NewCond(&s.mu)
	return s
}

// Wait blocks until the worker has delivered the newest request.
func (s *scheduler) Wait() {
	s.mu.Lock()
	for s.busy {
		s.idle.Wait()
	}
	s.mu.Unlock()
}

// Submit queues req and returns its generation.
func (s *scheduler) Submit(req engine.Request) uint64 {
	s.mu.Lock()
	defer s.mu.Unlock()
	s.gen++
	s.pending = &update{gen: s.gen, req: req}
	s.cancelRunning()
	if !s.busy {
		s.busy = true
		s.act.Add()
		go s.loop()
	}
	return s.gen
}

// Latest returns the generation of the newest request.
func (s *scheduler) Latest() uint64 {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.gen
}

// Invalidate makes every request made so far stale.
func (s *scheduler) Invalidate() {
	s.mu.Lock()
	s.gen++
	s.pending = nil
	s.cancelRunning()
	s.mu.Unlock()
}

// cancelRunning cancels the request running, which has just become stale.
// s.mu must be held.
func (s *scheduler) cancelRunning() {
	if s.cancel != nil {
		s.cancel()
		s.cancel = nil
	}
}

func (s *scheduler) loop() {
	defer s.act.Done()
	for {
		s.mu.Lock()
		u := s.pending
		s.pending = nil
		if u == nil {
			s.busy = false
			s.idle.Broadcast()
			s.mu.Unlock()
			return
		}
		ctx, cancel := context.WithCancel(context.Background())
		s.cancel = cancel
		s.mu.Unlock()
		res, err := safeRun(s.eng, ctx, u.req)
		s.mu.Lock()
		s.cancel = nil
		s.mu.Unlock()
		cancel()
		if u.gen != s.Latest() {
			continue // stale: a newer request is waiting or the study changed
		}
		s.deliver(*u, res, err)
	}
}

// safeRun calls the engine and turns a panic into an error, so that bad
// input can never bring the workbench down.
func safeRun(eng Runner, ctx context.Context, req engine.Request) (res *engine.Result, err error) {
	defer func() {
		if r := recover(); r != nil {
			res, err = nil, InternalError("in the solver", r)
		}
	}()
	return eng.Run(ctx, req)
}
