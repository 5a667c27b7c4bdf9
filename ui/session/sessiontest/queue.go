// Package sessiontest holds what tests of the session and of the window
// share: a stand-in for the UI goroutine.
package sessiontest

import "sync"

// Queue stands in for the UI goroutine in tests: the test driver runs
// fyne.Do at once on the calling goroutine, which would let workers touch
// widgets (or the controller's UI-goroutine state) while the test does.
// Functions posted with Post wait here until the test goroutine runs them
// with Drain. The zero value is ready to use.
type Queue struct {
	mu sync.Mutex
	fs []func()
}

// Post queues f; it is what the controller or the window gets as do.
func (q *Queue) Post(f func()) {
	q.mu.Lock()
	q.fs = append(q.fs, f)
	q.mu.Unlock()
}

// Drain runs the functions posted so far, in order, and reports whether
// there were any.
func (q *Queue) Drain() bool {
	q.mu.Lock()
	fs := q.fs
	q.fs = nil
	q.mu.Unlock()
	for _, f := range fs {
		f()
	}
	return len(fs) > 0
}
