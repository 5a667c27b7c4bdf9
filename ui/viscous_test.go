package ui

import (
	"math"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
)

// dumpText returns the text of every label, check and button under o.
func dumpText(o fyne.CanvasObject) string {
	var b strings.Builder
	var walk func(o fyne.CanvasObject)
	walk = func(o fyne.CanvasObject) {
		switch x := o.(type) {
		case *widget.Label:
			b.WriteString(x.Text + "\n")
		case *widget.Check:
			b.WriteString(x.Text + "\n")
		case *widget.Button:
			b.WriteString(x.Text + "\n")
		case *container.Scroll:
			walk(x.Content)
		case *widget.Accordion:
			for _, it := range x.Items {
				walk(it.Detail)
			}
		case *fyne.Container:
			for _, c := range x.Objects {
				walk(c)
			}
		}
	}
	walk(o)
	return b.String()
}

func TestBoundaryLayerToggle(t *testing.T) {
	w := newTestBench(t) // the demo: NACA 4412, 16.7 m/s
	vc := w.controls.vc
	if res := current(t, w); res.Viscous != nil || strings.Contains(w.status.Full(), "Cd") {
		t.Fatal("boundary layer without asking for it")
	}
	pv, polar := w.views[viewPressure], w.views[viewPolar]
	if !pv.blToggle.Hidden || !polar.polarMode.Hidden {
		t.Error("boundary-layer view switches offered with the estimate off")
	}
	vc.mode.SetSelected(modeEstimate)
	res := current(t, w)
	if res.Viscous == nil {
		t.Fatalf("no boundary layer in the result (%s)", vc.msg.Text)
	}
	// At 4° the demo's suction side separates before its trailing edge:
	// no drag, said so.
	if math.IsNaN(res.Viscous.Cd) && !strings.Contains(w.status.Full(), "no Cd (separated)") {
		t.Errorf("separated: status %q", w.status.Full())
	}
	w.controls.alphaEntry.submit("0")
	res = current(t, w)
	// A plausibility band, not a validation: profile drag of 12 % thick
	// sections at Re ≈ 3×10⁵ lies around 0.01 (Abbott & von Doenhoff,
	// Theory of Wing Sections, 1959, App. IV, extrapolated below their
	// lowest Re; from memory).
	if cd := res.Viscous.Cd; !(cd > 0.003 && cd < 0.05) {
		t.Errorf("Cd = %g", cd)
	}
	if want := "Cd " + fixed(res.Viscous.Cd, 4); !strings.Contains(w.status.Full(), want) || !strings.Contains(w.status.Full(), "−Cl/Cd") {
		t.Errorf("status %q does not give %q and −Cl/Cd", w.status.Full(), want)
	}
	for _, want := range []string{"Cd", "drag N/m", transitionColumn, separationColumn} {
		if !strings.Contains(w.results.table.Text, want) {
			t.Errorf("results table lacks %q:\n%s", want, w.results.table.Text)
		}
	}
	up := res.Viscous.Elements[0].Upper.TransitionXC
	if !math.IsNaN(up) && !strings.Contains(w.results.table.Text, fixed(up, 3)) {
		t.Errorf("results table does not give the upper transition %s", fixed(up, 3))
	}

	// The pressure view switches to the boundary layer and back.
	if pv.blToggle.Hidden {
		t.Fatal("no boundary-layer switch in the pressure view")
	}
	test.Tap(pv.blToggle)
	w.WaitIdle()
	if pv.canvas.figure() != figBoundaryLayer || pv.canvas.Figure() == nil || pv.title.Text != "Boundary layer" {
		t.Errorf("boundary-layer view: figure %v, drawn %v, title %q (%v)", pv.canvas.figure(), pv.canvas.Figure() != nil, pv.title.Text, pv.canvas.err)
	}
	// The polar offers the drag polar once the sweep has viscous data.
	polar.polarMode.SetSelected(polarDrag)
	w.WaitIdle()
	if polar.canvas.Figure() != nil || polar.note.Hidden {
		t.Error("drag polar drawn, or no note, before a boundary-layer sweep")
	}
	w.controls.runSweep()
	w.WaitIdle()
	sw, sv := w.ctl.Sweep(), w.ctl.SweepViscous()
	if len(sw) == 0 || len(sv) != len(sw) {
		t.Fatalf("sweep has %d angles and %d boundary-layer points", len(sw), len(sv))
	}
	if polar.canvas.Figure() == nil || !polar.note.Hidden {
		t.Errorf("drag polar not drawn after the sweep (%v)", polar.canvas.err)
	}
	polar.polarMode.SetSelected(polarLD)
	w.WaitIdle()
	if polar.canvas.figure() != figLiftToDrag || polar.canvas.Figure() == nil {
		t.Error("Cl/Cd view not drawn")
	}

	// Off again: the views go back to Cp and Cl, Cm.
	vc.mode.SetSelected(modeOff)
	res = current(t, w)
	if res.Viscous != nil || pv.canvas.figure() != figPressure || polar.canvas.figure() != figPolar || !pv.blToggle.Hidden {
		t.Error("turning the estimate off left boundary-layer figures")
	}
}

func TestBoundaryLayerNeedsSpeed(t *testing.T) {
	w := newStudyBench(t) // no speed
	vc := w.controls.vc
	before := encoded(t, w.ctl.Study())
	vc.mode.SetSelected(modeEstimate)
	w.WaitIdle()
	if vc.msg.Hidden || !strings.Contains(vc.msg.Text, "speed or a Reynolds number") {
		t.Errorf("message %q", vc.msg.Text)
	}
	if vc.mode.Selected != modeOff || encoded(t, w.ctl.Study()) != before {
		t.Error("the estimate was switched on without a speed")
	}
	// With a Reynolds number entered directly it runs.
	w.controls.fc.reynolds.submit("5e5")
	vc.mode.SetSelected(modeEstimate)
	if res := current(t, w); res.Viscous == nil {
		t.Errorf("no boundary layer with Re = 5×10⁵ (%s)", vc.msg.Text)
	}
	// Trips reach the study and the estimate: a trip at 5 % chord on both
	// surfaces moves transition there or ahead of it.
	vc.upper.submit("0.05")
	vc.lower.submit("0.05")
	res := current(t, w)
	if v := w.ctl.Study().Viscous; v.TripUpper != 0.05 || v.TripLower != 0.05 {
		t.Fatalf("trips %+v", v)
	}
	for _, s := range []struct {
		name string
		x    float64
	}{{"upper", res.Viscous.Elements[0].Upper.TransitionXC}, {"lower", res.Viscous.Elements[0].Lower.TransitionXC}} {
		if !(s.x <= 0.05+0.02) {
			t.Errorf("%s transition at x/c %g with a trip at 0.05", s.name, s.x)
		}
	}
	// Clearing the Reynolds number with the estimate on is refused.
	w.controls.fc.reynolds.submit("")
	if w.ctl.Study().Flow.Reynolds != 5e5 || w.controls.fc.msg.Hidden {
		t.Error("the Reynolds number was cleared with the estimate on")
	}
}

func TestPressureElementChoice(t *testing.T) {
	w := openRearWing(t)
	pv := w.views[viewPressure]
	if pv.elements.Hidden || len(pv.elements.Options) != 3 || pv.elements.Options[0] != allElements {
		t.Fatalf("element choice %v (hidden %v)", pv.elements.Options, pv.elements.Hidden)
	}
	all := pv.canvas.Figure()
	pv.elements.SetSelectedIndex(2) // the flap
	w.WaitIdle()
	if pv.canvas.element != 1 || pv.canvas.Figure() == nil || pv.canvas.Figure() == all {
		t.Errorf("choosing the flap: element %d, new figure %v", pv.canvas.element, pv.canvas.Figure() != all)
	}
	// Removing the flap falls back to all elements.
	w.ctl.SetElement(1)
	if err := w.ctl.RemoveElement(1); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	if pv.canvas.element != -1 || !pv.elements.Hidden || pv.canvas.Figure() == nil {
		t.Errorf("after removing the flap: element %d, choice hidden %v", pv.canvas.element, pv.elements.Hidden)
	}
}

func TestDragPolarOfSeparatedSweep(t *testing.T) {
	w := openRearWing(t)
	if err := w.ctl.SetViscous("", model.Viscous{Enabled: true}); err != nil {
		t.Fatal(err)
	}
	w.controls.runSweep()
	w.WaitIdle()
	sv := w.ctl.SweepViscous()
	if len(sv) == 0 || len(sv) != len(w.ctl.Sweep()) {
		t.Fatalf("%d boundary-layer points for %d angles", len(sv), len(w.ctl.Sweep()))
	}
	polar := w.views[viewPolar]
	polar.polarMode.SetSelected(polarDrag)
	w.WaitIdle()
	valid := 0
	for _, p := range sv {
		if p.Valid {
			valid++
		}
	}
	// The invented rear wing's flap separates at most angles; with no
	// valid angle the view must say why rather than ask for a sweep.
	if valid == 0 {
		if polar.canvas.Figure() != nil || !strings.Contains(polar.note.Text, "No drag at any angle") {
			t.Errorf("all angles separated: figure %v, note %q", polar.canvas.Figure() != nil, polar.note.Text)
		}
	} else if polar.canvas.Figure() == nil {
		t.Errorf("%d valid angles but no drag polar (%v)", valid, polar.canvas.err)
	}
}
