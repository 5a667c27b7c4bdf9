package ui

import (
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// TestPlausibilityFlagsShown: the two-element wing at 5 mm from the ground
// (h/c 0.02) is flagged in the status line and the results note, in words.
func TestPlausibilityFlagsShown(t *testing.T) {
	w := openRearWing(t)
	w.controls.clearance.submit("5")
	current(t, w)
	status := w.status.Full()
	if !strings.HasPrefix(status, "Caution: ") || !strings.Contains(status, string(model.FlagGround)) {
		t.Errorf("status line %q does not lead with the ground flag", status)
	}
	if note := w.results.note.Text; !strings.Contains(note, "lose downforce") {
		t.Errorf("results note %q does not say what the flag means", note)
	}
	for _, s := range []string{status, w.results.note.Text} {
		if strings.Contains(s, "ClPressure") || strings.Contains(s, "CpMin") {
			t.Errorf("a code identifier in %q", s)
		}
	}
	// At a sensible clearance the flag goes.
	w.controls.clearance.submit("150")
	current(t, w)
	if s := w.status.Full(); strings.Contains(s, string(model.FlagGround)) {
		t.Errorf("status line %q still flags the ground at 150 mm", s)
	}
}

// TestViscousFlagsPlugIn: the coupled viscous solution's states raise
// their flags in words.
func TestViscousFlagsPlugIn(t *testing.T) {
	res := &engine.Result{Solution: &solver.Solution{Elements: []solver.ElementSolution{{CpMin: -1}}},
		Coupled: &engine.CoupledPoint{Converged: false, PastClMax: true}}
	if got := model.FlagWords(resultFlags(res)); got != string(model.FlagPastClMax)+"; "+string(model.FlagNotConverged) {
		t.Errorf("flags %q", got)
	}
}

// TestUndoKeepsSweep: undoing back to a configuration whose ground-effect
// sweep ran shows that sweep again at once, without running it.
func TestUndoKeepsSweep(t *testing.T) {
	w := openRearWing(t)
	w.WaitIdle()
	first := w.ctl.Sweep()
	if len(first) == 0 {
		t.Fatal("the ground-effect sweep did not run by itself")
	}
	w.controls.clearance.submit("120")
	w.WaitIdle()
	if s := w.ctl.Sweep(); len(s) == 0 || &s[0] == &first[0] {
		t.Fatal("the new clearance has no sweep of its own")
	}
	w.ctl.Undo()
	if s := w.ctl.Sweep(); len(s) == 0 || &s[0] != &first[0] {
		t.Error("undo did not bring back the sweep already run")
	}
	w.WaitIdle()
}
