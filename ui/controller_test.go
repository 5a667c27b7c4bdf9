package ui

import (
	"testing"

	"sectionbench/model"
	"sectionbench/ui/session"
)

// TestDensityPlanKeepsSweep stores a density plan after a sweep that does
// not run with live updates, undoes and redoes it: the sweep stays.
func TestDensityPlanKeepsSweep(t *testing.T) {
	w := newTestBench(t)
	w.controls.step.submit("0.25") // more angles than a live update runs
	w.WaitIdle()
	w.controls.runSweep()
	w.WaitIdle()
	n := len(w.ctl.Sweep())
	if n <= session.LiveSweepMaxAngles {
		t.Fatalf("sweep has %d angles, want more than %d", n, session.LiveSweepMaxAngles)
	}
	steps := []struct {
		name string
		do   func() error
	}{
		{"store plan", func() error { return w.ctl.SetDensityPlan(model.DensityPlan{Panels: []int{40, 80, 160}}) }},
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
