package session

import "sync"

// Activity counts work in flight (solves, renders) so that tests and the
// benchmark can wait until the workbench is idle.
type Activity struct {
	mu   sync.Mutex
	cond *sync.Cond
	n    int
}

// NewActivity returns a counter with nothing in flight.
func NewActivity() *Activity {
	a := &Activity{}
	a.cond = sync.NewCond(&a.mu)
	return a
}

// Add counts one more piece of work in flight.
func (a *Activity) Add() {
	a.mu.Lock()
	a.n++
	a.mu.Unlock()
}

// Done counts one piece of work finished.
func (a *Activity) Done() {
	a.mu.Lock()
	a.n--
	if a.n == 0 {
		a.cond.Broadcast()
	}
	a.mu.Unlock()
}

// Wait blocks until no work is in flight.
func (a *Activity) Wait() {
	a.mu.Lock()
	for a.n > 0 {
		a.cond.Wait()
	}
	a.mu.Unlock()
}
