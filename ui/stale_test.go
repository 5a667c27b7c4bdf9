package ui

import (
	"context"
	"strings"
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

// TestPolarMarkedStaleWhileSweeping: with no sweep for the configuration
// (the coupled solution just turned on) the empty polar asks for one;
// while its first sweep runs it says that the sweep runs, with no veil
// over the empty view (it read "Previous sweep: running…" over "No sweep
// for this configuration yet: press Run sweep."). A second sweep running
// longer than busyDelay veils the polar, which shows the first, and no
// other view; the veil goes when the sweep ends, here cancelled.
func TestPolarMarkedStaleWhileSweeping(t *testing.T) {
	w := newTestBench(t)
	w.controls.vc.mode.SetSelected(modeCoupled) // a coupled sweep takes seconds
	w.WaitIdle()
	polar := w.views[viewPolar]
	askNote := polar.note.Text
	if polar.note.Hidden || !strings.Contains(askNote, "press Run sweep") {
		t.Fatalf("the polar without a sweep says %q (hidden %v)", askNote, polar.note.Hidden)
	}
	w.controls.runSweep()
	if !waitFor(t, w, 10*busyDelay, func() bool { return polar.note.Text == sweepRunningNote }) {
		t.Fatalf("while the first sweep runs the empty polar says %q", polar.note.Text)
	}
	if polar.stale.Visible() || polar.note.Hidden {
		t.Errorf("veil %v over the empty polar, note hidden %v", polar.stale.Visible(), polar.note.Hidden)
	}
	w.WaitIdle()
	if !waitFor(t, w, 10*busyDelay, func() bool { return polar.note.Hidden && polar.canvas.Figure() != nil }) {
		t.Fatalf("after the sweep the polar shows no figure: note %q", polar.note.Text)
	}

	w.controls.runSweep()
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
