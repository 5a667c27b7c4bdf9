package ui

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"

	"sectionbench/model"
)

// TestViscousModeChoice: the Flow tab chooses the coupled solution, the
// one-way estimate or neither, in words; N applies on Enter, says what
// turbulence it stands for, refuses a value out of range, and the choice
// is one undo step.
func TestViscousModeChoice(t *testing.T) {
	w := newTestBench(t) // the demo: NACA 4412 inverted, 16.7 m/s, viscous off
	vc := w.controls.vc
	if vc.mode.Selected != modeOff || !vc.ncrit.Disabled() {
		t.Fatalf("demo opens with %q (N field disabled %v)", vc.mode.Selected, vc.ncrit.Disabled())
	}
	for _, o := range vc.mode.Options {
		if len(strings.Fields(o)) < 2 {
			t.Errorf("mode %q is not in full words", o)
		}
	}
	vc.mode.SetSelected(modeCoupled)
	res := current(t, w)
	if v := w.ctl.Study().Viscous; !v.Enabled || !v.IsCoupled() {
		t.Fatalf("study viscous %+v after choosing the coupled solution", v)
	}
	if res.Coupled == nil || res.Viscous != nil {
		t.Fatalf("coupled mode gave coupled %v, estimate %v", res.Coupled != nil, res.Viscous != nil)
	}
	if vc.ncrit.Disabled() || !strings.Contains(vc.note.Text, "validate by test") {
		t.Errorf("coupled mode: N disabled %v, note %q", vc.ncrit.Disabled(), vc.note.Text)
	}
	if !strings.Contains(vc.tu.Text, "N 9") || !strings.Contains(vc.tu.Text, "0.07 %") {
		t.Errorf("meaning of the default N: %q", vc.tu.Text)
	}

	// N: typing does not apply, Enter does.
	vc.ncrit.SetText("")
	test.Type(vc.ncrit, "5")
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 0 {
		t.Fatalf("N applied as %g while typing", n)
	}
	vc.ncrit.OnSubmitted(vc.ncrit.Text)
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 5 {
		t.Fatalf("N = %g after Enter, want 5", n)
	}
	if !strings.Contains(vc.tu.Text, "N 5") {
		t.Errorf("N 5 explained as %q", vc.tu.Text)
	}
	// Out of range: refused with a message naming the field; the study keeps 5.
	vc.ncrit.submit("40")
	w.WaitIdle()
	if n := w.ctl.Study().Viscous.TransitionN; n != 5 || vc.msg.Hidden || !strings.Contains(vc.msg.Text, "Critical amplification N") {
		t.Errorf("N 40: study N %g, message %q", n, vc.msg.Text)
	}
	vc.ncrit.FocusLost()
	if vc.ncrit.Text != "5" {
		t.Errorf("leaving the field kept %q, not the value in use", vc.ncrit.Text)
	}

	// The estimate: N is not used, the note says the lift stays inviscid.
	vc.mode.SetSelected(modeEstimate)
	res = current(t, w)
	if res.Coupled != nil || res.Viscous == nil || !vc.ncrit.Disabled() || !strings.Contains(vc.note.Text, "stay inviscid") {
		t.Errorf("estimate: coupled %v, estimate %v, N disabled %v", res.Coupled != nil, res.Viscous != nil, vc.ncrit.Disabled())
	}
	// Undo goes back through the history: the coupled mode with N 5.
	w.ctl.Undo()
	w.WaitIdle()
	if v := w.ctl.Study().Viscous; !v.IsCoupled() || v.TransitionN != 5 || vc.mode.Selected != modeCoupled {
		t.Errorf("undo: study %+v, choice %q", v, vc.mode.Selected)
	}
	vc.mode.SetSelected(modeOff)
	res = current(t, w)
	if res.Coupled != nil || res.Viscous != nil || w.ctl.Study().Viscous.Mode != model.ViscousCoupled {
		t.Error("off: a viscous result remains, or the mode to come back to was lost")
	}
}
