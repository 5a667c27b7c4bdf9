package ui

import (
	"context"
	"testing"
	"time"

	"sectionbench/model"
)

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
		if got := equalGeometry(a, b); got != c.want {
			t.Errorf("%s: equalGeometry = %v, want %v", c.name, got, c.want)
		}
	}
	// With the boundary layer on, the air and speed set the Reynolds
	// number of the sweep's drag estimate.
	a := model.NewStudy()
	a.Viscous.Enabled, a.Flow.SpeedMPS = true, 20
	b := a.Clone()
	b.Flow.SpeedMPS = 30
	if equalGeometry(a, b) {
		t.Error("speed change with the boundary layer on: equalGeometry = true")
	}
}

// TestDensityPlanKeepsSweep stores a density plan after a sweep that does
// not run with live updates, undoes and redoes it: the sweep stays.
func TestDensityPlanKeepsSweep(t *testing.T) {
	w := newTestBench(t)
	w.controls.step.submit("0.25") // more angles than a live update runs
	w.WaitIdle()
	w.controls.runSweep()
	w.WaitIdle()
	n := len(w.ctl.Sweep())
	if n <= liveSweepMaxAngles {
		t.Fatalf("sweep has %d angles, want more than %d", n, liveSweepMaxAngles)
	}
	steps := []struct {
		name string
		do   func() error
	}{
		{"store plan", func() error { return w.ctl.setDensityPlan(model.DensityPlan{Panels: []int{40, 80, 160}}) }},
		{"undo", func() error { w.ctl.Undo(); return nil }},
		{"redo", func() error { w.ctl.Redo(); return nil }},
		{"pin", w.ctl.PinCurrent},
		{"undo pin", func() error { w.ctl.Undo(); return nil }},
	}
	for _, s := range steps {
		if err := s.do(); err != nil {
			t.Fatalf("%s: %v", s.name, err)
		}
		w.WaitIdle()
		if got := len(w.ctl.Sweep()); got != n {
			t.Errorf("after %s the sweep has %d angles, want %d", s.name, got, n)
		}
	}
	w.ctl.Undo() // the plan: still the same configuration
	w.ctl.SetAlpha("", 3)
	w.WaitIdle()
	if got := len(w.ctl.Sweep()); got != n {
		t.Errorf("after an angle change the sweep has %d angles, want %d", got, n)
	}
	w.ctl.Undo()
	p := w.ctl.Study().Panelling
	p.Panels += 20
	if err := w.ctl.SetPanelling("", p); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	if w.ctl.Sweep() != nil {
		t.Error("the sweep of another panelling is still shown")
	}
	w.ctl.Undo() // back to the panelling the sweep ran with: it comes back
	w.WaitIdle()
	if got := len(w.ctl.Sweep()); got != n {
		t.Errorf("undo back to the panelling it ran with shows a sweep of %d angles, want %d", got, n)
	}
}

// heldEngine holds every run until hold is closed, then solves for real.
type heldEngine struct {
	inner studyRunner
	hold  chan struct{}
}

func (h *heldEngine) Run(ctx context.Context, req engineRequest) (*engineResult, error) {
	<-h.hold
	return h.inner.Run(ctx, req)
}

// PinCurrent never waits for a solve on the UI goroutine: with the newest
// request held in the engine it returns at once, and the pin is taken when
// that result arrives.
func TestPinCurrentDoesNotWait(t *testing.T) {
	w := newTestBench(t)
	held := &heldEngine{inner: w.ctl.sched.eng, hold: make(chan struct{})}
	w.ctl.sched.eng = held // idle: the next Submit starts the worker
	if err := w.ctl.SetAlpha("", 3); err != nil {
		t.Fatal(err)
	}
	returned := make(chan error)
	go func() { returned <- w.ctl.PinCurrent() }()
	select {
	case err := <-returned:
		if err != nil {
			t.Fatal(err)
		}
	case <-time.After(10 * time.Second):
		close(held.hold)
		t.Fatal("PinCurrent waited for the solve")
	}
	if n := len(w.ctl.Study().Pins); n != 0 {
		t.Fatalf("%d pins before the solve finished", n)
	}
	close(held.hold)
	w.WaitIdle()
	if pins := w.ctl.Study().Pins; len(pins) != 1 {
		t.Fatalf("%d pins after the solve, want 1", len(pins))
	}
}
