package ui

import (
	"context"
	"testing"
	"time"

	"sectionbench/solver/engine"
)

// slowRunner holds every solve for a while before running it.
type slowRunner struct{ hold time.Duration }

func (s slowRunner) Run(ctx context.Context, req engine.Request) (*engine.Result, error) {
	select {
	case <-time.After(s.hold):
	case <-ctx.Done():
		return nil, ctx.Err()
	}
	return engine.NewEngine().Run(ctx, req)
}

// waitFor runs what was posted to the UI goroutine and checks cond, until
// it holds or the time is up.
func waitFor(t *testing.T, w *Workbench, limit time.Duration, cond func() bool) bool {
	t.Helper()
	for end := time.Now().Add(limit); time.Now().Before(end); time.Sleep(20 * time.Millisecond) {
		w.drain()
		if cond() {
			return true
		}
	}
	return cond()
}

// TestViewsMarkedStale: while a solve takes longer than busyDelay, every
// view is veiled and captioned as the previous result, not only the
// status line; when the result arrives the veils go.
func TestViewsMarkedStale(t *testing.T) {
	w := newTestBench(t)
	w.WaitIdle()
	w.ctl.SetRunner(slowRunner{hold: 4 * busyDelay})
	w.controls.alphaEntry.submit("5")
	allVeiled := func() bool {
		for _, v := range w.views {
			if !v.stale.Visible() || v.stale.caption.Text != staleSolving {
				return false
			}
		}
		return true
	}
	if !waitFor(t, w, 3*busyDelay, allVeiled) {
		t.Fatal("a slow solve left some view unmarked")
	}
	for _, v := range w.views {
		if bw, cw := v.stale.captionBack.Size().Width, v.stale.caption.MinSize().Width; bw < cw {
			t.Errorf("%v view: the caption's backing is %g wide, its text %g", v.kind, bw, cw)
		}
	}
	w.WaitIdle()
	for _, v := range w.views {
		if v.stale.Visible() {
			t.Errorf("%v view still marked stale after the result arrived", v.kind)
		}
	}
}

// TestPolarMarkedStaleWhileSweeping: a sweep running longer than
// busyDelay veils the polar (the previous sweep) and no other view; the
// veil goes when the sweep ends, here cancelled.
func TestPolarMarkedStaleWhileSweeping(t *testing.T) {
	w := newTestBench(t)
	w.controls.vc.mode.SetSelected(modeCoupled) // a coupled sweep takes seconds
	w.WaitIdle()
	w.controls.runSweep()
	polar := w.views[viewPolar]
	if !waitFor(t, w, 10*busyDelay, func() bool { return polar.stale.Visible() && polar.stale.caption.Text == staleSweeping }) {
		t.Fatal("a long sweep left the polar unmarked")
	}
	for _, v := range w.views {
		if v.kind != viewPolar && v.stale.Visible() {
			t.Errorf("the sweep marked the %v view", v.kind)
		}
	}
	w.controls.cancel.OnTapped()
	w.WaitIdle()
	if polar.stale.Visible() {
		t.Error("the polar stays marked after the sweep ended")
	}
}
