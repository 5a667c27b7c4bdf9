package ui

import (
	"sync/atomic"
	"testing"

	"sectionbench/ui/session"
)

// A burst of requests while a render runs costs one more render, not one
// each, and the last render sees the newest input.
func TestRenderLoopCoalesces(t *testing.T) {
	act := session.NewActivity()
	l := &renderLoop{act: act}
	gate := make(chan struct{})
	started := make(chan struct{}, 1)
	var runs, input, seen atomic.Int64
	render := func() {
		runs.Add(1)
		select {
		case started <- struct{}{}:
		default:
		}
		<-gate
		seen.Store(input.Load())
	}
	l.request(render)
	<-started
	for i := 1; i <= 50; i++ {
		input.Store(int64(i))
		l.request(render)
	}
	close(gate)
	act.Wait()
	if n := runs.Load(); n != 2 {
		t.Errorf("%d renders for 51 requests made while the first ran, want 2", n)
	}
	if s := seen.Load(); s != 50 {
		t.Errorf("the last render saw input %d, want the newest, 50", s)
	}
}
