package ui

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// rearWing is the invented two-element example study.
const rearWing = "../testdata/studies/rear-wing.json"

func openRearWing(t *testing.T) *Workbench {
	t.Helper()
	test.NewTempApp(t)
	return openTestBench(t, rearWing)
}

func elementNames(res *engine.Result) []string {
	var n []string
	for _, e := range res.Solution.Elements {
		n = append(n, e.Name)
	}
	return n
}

func TestAddRemoveReorderElements(t *testing.T) {
	w := newTestBench(t) // the demo: one element, inverted, free air
	ec := w.controls.ec
	alone := current(t, w)
	if !ec.remove.Disabled() {
		t.Error("Remove is enabled with a single element")
	}

	test.Tap(ec.add)
	two := current(t, w)
	st := w.ctl.Study()
	if len(st.Elements) != 2 || len(two.Solution.Elements) != 2 {
		t.Fatalf("after Add the study has %d elements and the result %d, want 2 (%s)", len(st.Elements), len(two.Solution.Elements), ec.msg.Text)
	}
	if w.ctl.Element() != 1 {
		t.Errorf("the added flap is not selected (element %d)", w.ctl.Element())
	}
	// The new flap keeps the default gap, overlap and deflection.
	fp := st.FlapPlacementOf(1)
	c0 := st.Elements[0].ChordMM
	if math.Abs(fp.GapMM-model.NewFlapGapRatio*c0) > 1e-9 || math.Abs(fp.OverlapMM-model.NewFlapOverlapRatio*c0) > 1e-9 || math.Abs(fp.DeflectionDeg-model.NewFlapDeflectionDeg) > 1e-9 {
		t.Errorf("new flap placed at %+v", fp)
	}
	// A flap behind an element raises that element's circulation (the
	// "circulation effect": A. M. O. Smith, High-lift aerodynamics,
	// J. Aircraft 12(6), 1975). The demo is inverted, so its lift is
	// negative and grows in magnitude.
	if m0, m1 := alone.Solution.Elements[0].Cl, two.Solution.Elements[0].Cl; !(math.Abs(m1) > math.Abs(m0)) || m0*m1 <= 0 {
		t.Errorf("main element Cl %g with a flap, %g alone: want a larger magnitude of the same sign", m1, m0)
	}

	test.Tap(ec.add)
	three := current(t, w)
	if !ec.down.Disabled() {
		t.Error("Down is enabled on the last element")
	}
	if got := elementNames(three); strings.Join(got, ",") != "main element,flap,flap 2" {
		t.Fatalf("elements %v, want main element, flap, flap 2", got)
	}

	// Reorder: the last flap one place up. The geometry is the same and
	// the main element stays first (the moment and pitch reference), so
	// the solution must not change beyond rounding (a property of the
	// method: the unknowns are only renumbered).
	test.Tap(ec.up)
	moved := current(t, w)
	if got := elementNames(moved); strings.Join(got, ",") != "main element,flap 2,flap" {
		t.Errorf("after moving up: %v", got)
	}
	if w.ctl.Element() != 1 {
		t.Errorf("the moved element is not selected (element %d)", w.ctl.Element())
	}
	if d := math.Abs(moved.Solution.Cl - three.Solution.Cl); d > 1e-9*math.Abs(three.Solution.Cl) {
		t.Errorf("reordering changed Cl from %g to %g", three.Solution.Cl, moved.Solution.Cl)
	}

	// Remove the selected element, then all but one.
	test.Tap(ec.remove)
	if got := len(current(t, w).Solution.Elements); got != 2 {
		t.Errorf("after Remove the result has %d elements, want 2", got)
	}
	test.Tap(ec.remove)
	res := current(t, w)
	if len(res.Solution.Elements) != 1 || w.ctl.Study().Elements[0].Name != "main element" {
		t.Errorf("after removing both flaps: %v", elementNames(res))
	}
	if math.Abs(res.Solution.Cl-alone.Solution.Cl) > 1e-12 {
		t.Errorf("Cl %g after removing the flaps, %g before adding them", res.Solution.Cl, alone.Solution.Cl)
	}
	if !ec.remove.Disabled() {
		t.Error("Remove is enabled with a single element")
	}
	if err := w.ctl.RemoveElement(0); !errors.Is(err, session.ErrLastElement) {
		t.Errorf("removing the last element: %v", err)
	}
	// Undo brings the flaps back.
	w.ctl.Undo()
	if got := len(current(t, w).Solution.Elements); got != 2 {
		t.Errorf("undo of a removal gives %d elements, want 2", got)
	}
}

func TestMaxElements(t *testing.T) {
	w := newTestBench(t)
	for len(w.ctl.Study().Elements) < model.MaxElements {
		if err := w.ctl.AddElement(); err != nil {
			t.Fatalf("adding element %d: %v", len(w.ctl.Study().Elements)+1, err)
		}
		w.WaitIdle() // the new flap is placed off the UI goroutine
	}
	if got := len(current(t, w).Solution.Elements); got != model.MaxElements {
		t.Fatalf("result has %d elements, want %d", got, model.MaxElements)
	}
	if !w.controls.ec.add.Disabled() {
		t.Error("Add is enabled at the largest number of elements")
	}
	if err := w.ctl.AddElement(); err == nil {
		t.Error("a sixth element was added")
	}
}

func TestFlapPlacementRoundTrip(t *testing.T) {
	w := openRearWing(t)
	ec := w.controls.ec
	ec.list.Select(1)
	if w.ctl.Element() != 1 || ec.flap.Hidden {
		t.Fatalf("selecting the flap: element %d, flap fields hidden %v", w.ctl.Element(), ec.flap.Hidden)
	}
	before := w.ctl.SlotOf(1)
	if got := ec.gap.Text; got != entryNum(before.GapMM) {
		t.Errorf("gap field says %q, want %q", got, entryNum(before.GapMM))
	}

	cases := []struct {
		name  string
		entry func() // types into one field
		want  model.Slot
	}{
		{"gap", func() { ec.gap.submit("15") }, model.Slot{GapMM: 15, OverlapMM: before.OverlapMM, DeflectionDeg: before.DeflectionDeg}},
		{"overlap", func() { ec.overlap.submit("10.5") }, model.Slot{GapMM: 15, OverlapMM: 10.5, DeflectionDeg: before.DeflectionDeg}},
		{"deflection", func() { ec.deflec.submit("26") }, model.Slot{GapMM: 15, OverlapMM: 10.5, DeflectionDeg: 26}},
	}
	// Overlap and deflection are exact to rounding; the gap is found by
	// bisection to 1e-4 mm on the leading-edge drop.
	const tol, gapTol = 1e-9, 1e-3
	near := func(got, want model.Slot) bool {
		return math.Abs(got.GapMM-want.GapMM) < gapTol && math.Abs(got.OverlapMM-want.OverlapMM) < tol && math.Abs(got.DeflectionDeg-want.DeflectionDeg) < tol
	}
	for _, c := range cases {
		c.entry()
		res := current(t, w)
		st := w.ctl.Study()
		if got := w.ctl.SlotOf(1); !near(got, c.want) {
			t.Errorf("%s: study places the flap at %+v, want %+v (%s)", c.name, got, c.want, ec.placeMsg.Text)
		}
		// The flap's derived position and setting angle are shown, in
		// words, as following from the slot.
		if want := "setting angle " + num(st.Elements[1].AngleDeg) + "°"; !strings.Contains(ec.flapPlace.Text, want) {
			t.Errorf("%s: %q does not say %q", c.name, ec.flapPlace.Text, want)
		}
		if len(res.Solution.Elements) != 2 {
			t.Errorf("%s: %d elements solved", c.name, len(res.Solution.Elements))
		}
	}
	want := model.Slot{GapMM: 15, OverlapMM: 10.5, DeflectionDeg: 26}
	// The saved and reopened study keeps the placement.
	b, err := w.ctl.Study().Encode()
	if err != nil {
		t.Fatal(err)
	}
	back, err := model.DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	if got := back.SlotOf(1, w.ctl.Sections()[1]); !near(got, want) {
		t.Errorf("decoded study places the flap at %+v", got)
	}

	// A flap follows the element it hangs from: turning the main element
	// keeps the flap's gap, overlap and deflection.
	ec.list.Select(0)
	ec.angle.submit("5")
	w.WaitIdle()
	st := w.ctl.Study()
	if got := w.ctl.SlotOf(1); !near(got, want) {
		t.Errorf("after turning the main element the flap sits at %+v", got)
	}
	if st.Elements[0].AngleDeg != 5 || st.Elements[1].AngleDeg != 31 {
		t.Errorf("setting angles %g, %g; want 5, 31", st.Elements[0].AngleDeg, st.Elements[1].AngleDeg)
	}
}

func TestOverlapRefused(t *testing.T) {
	w := openRearWing(t)
	ec := w.controls.ec
	ec.list.Select(1)
	res := current(t, w)
	before := encoded(t, w.ctl.Study())

	// Gap −1 puts the main element's trailing edge 1 mm inside the flap.
	ec.gap.submit("-1")
	w.WaitIdle()
	if ec.placeMsg.Hidden {
		t.Fatal("an overlapping placement shows no message")
	}
	for _, want := range []string{"1 “main”", "2 “flap”", "overlap", "kept"} {
		if !strings.Contains(ec.placeMsg.Text, want) {
			t.Errorf("message %q does not say %q", ec.placeMsg.Text, want)
		}
	}
	if encoded(t, w.ctl.Study()) != before {
		t.Error("an overlapping placement changed the study")
	}
	if r, _, err := w.ctl.Result(); r != res || err != nil {
		t.Errorf("an overlapping placement was solved (err %v)", err)
	}
	if ec.gap.Text != "-1" {
		t.Errorf("the typed gap was replaced by %q", ec.gap.Text)
	}
	// Typing on to a valid value clears the message and solves.
	ec.gap.submit("12")
	res = current(t, w)
	if !ec.placeMsg.Hidden {
		t.Errorf("message stays after a valid placement: %q", ec.placeMsg.Text)
	}
	st := w.ctl.Study()
	if got := st.SlotOf(1, w.ctl.Sections()[1]).GapMM; math.Abs(got-12) > 1e-3 {
		t.Errorf("gap %g after typing 12", got)
	}
	if len(res.Solution.Elements) != 2 {
		t.Errorf("%d elements solved", len(res.Solution.Elements))
	}
}

func TestInvalidEntriesKeepState(t *testing.T) {
	w := openRearWing(t)
	ec, fc, vc := w.controls.ec, w.controls.fc, w.controls.vc
	before := encoded(t, w.ctl.Study())
	res := current(t, w)
	cases := []struct {
		name  string
		entry interface{ submit(string) }
		text  string
		msg   func() bool // the message is shown
	}{
		{"text as chord", ec.chord, "wide", func() bool { return !ec.placeMsg.Hidden }},
		{"negative chord", ec.chord, "-120", func() bool { return !ec.placeMsg.Hidden }},
		{"zero chord", ec.chord, "0", func() bool { return !ec.placeMsg.Hidden }},
		{"text as gap", ec.gap, "small", func() bool { return !ec.placeMsg.Hidden }},
		{"text as angle", ec.angle, "2°°", func() bool { return !ec.placeMsg.Hidden }},
		{"negative reference chord", ec.refChord, "-3", func() bool { return !ec.refMsg.Hidden }},
		{"text as speed", fc.speed, "fast", func() bool { return !fc.msg.Hidden }},
		{"negative speed", fc.speed, "-10", func() bool { return !fc.msg.Hidden }},
		{"hot air", fc.temp, "300", func() bool { return !fc.msg.Hidden }},
		{"pressure in kPa", fc.pressure, "101.3", func() bool { return !fc.msg.Hidden }},
		{"text as span", fc.span, "one", func() bool { return !fc.msg.Hidden }},
		{"trip behind the trailing edge", vc.upper, "1.5", func() bool { return !vc.msg.Hidden }},
	}
	for _, c := range cases {
		if c.entry == ec.chord || c.entry == ec.gap || c.entry == ec.angle {
			ec.list.Select(1)
		}
		c.entry.submit(c.text)
		w.WaitIdle()
		if !c.msg() {
			t.Errorf("%s: no message", c.name)
		}
		if encoded(t, w.ctl.Study()) != before {
			t.Errorf("%s: the study changed", c.name)
		}
		if r, _, _ := w.ctl.Result(); r != res {
			t.Errorf("%s: a new solve ran", c.name)
		}
		// Put the field back: undo the typing, as the user would.
		w.controls.sync(w.ctl.Current())
	}
}

func TestReferenceChord(t *testing.T) {
	w := openRearWing(t)
	ec := w.controls.ec
	res := current(t, w)
	if got := refChordMM(res); got != 370 {
		t.Fatalf("default reference chord %g mm, want the sum 250 + 120", got)
	}
	if !strings.Contains(ec.refChord.PlaceHolder, "370") {
		t.Errorf("placeholder %q does not give the sum of the chords", ec.refChord.PlaceHolder)
	}
	ec.refChord.submit("250")
	on250 := current(t, w)
	// Same flow, coefficients on a shorter chord: Cl scales as 370/250.
	if got, want := on250.Solution.Cl, res.Solution.Cl*370/250; math.Abs(got-want) > 1e-9*math.Abs(want) {
		t.Errorf("Cl on 250 mm is %g, want %g", got, want)
	}
	ec.refChord.submit("")
	if got := w.ctl.Study().ReferenceChordMM; got != 0 {
		t.Errorf("empty reference chord sets %g", got)
	}
}

func TestSelectedElementFollowsList(t *testing.T) {
	w := openRearWing(t)
	ec := w.controls.ec
	ec.list.Select(1)
	if w.controls.element.SelectedIndex() != 1 {
		t.Error("the section-source choice does not follow the list")
	}
	if got := ec.chord.Text; got != "120" {
		t.Errorf("chord field says %q for the flap, want 120", got)
	}
	if !strings.Contains(ec.placeHead.Text, "flap") {
		t.Errorf("placement heading %q does not name the flap", ec.placeHead.Text)
	}
	w.controls.element.SetSelectedIndex(0)
	if got := ec.chord.Text; got != "250" || !ec.flap.Hidden {
		t.Errorf("main element selected: chord %q, flap fields hidden %v", got, ec.flap.Hidden)
	}
}

func TestOverlappingStudyNamesElements(t *testing.T) {
	test.NewTempApp(t)
	st := model.NewStudy()
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 100, XMM: 100, YMM: 0,
	})
	b, err := st.Encode()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "overlap.json")
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	// A study file is loaded as written; its solve reports the overlap.
	w := openTestBench(t, path)
	_, _, serr := w.ctl.Result()
	if !errors.Is(serr, model.ErrOverlap) {
		t.Fatalf("solve error %v, want an overlap", serr)
	}
	want := "Not solved: Elements 1 “main” and 2 “flap” overlap or touch"
	if !strings.HasPrefix(w.status.Full(), want) || w.status.label.Importance != widget.DangerImportance {
		t.Errorf("status %q, want it to start with %q", w.status.Full(), want)
	}
	// Moving the flap clear of the main element solves.
	w.ctl.SetElement(1)
	w.controls.ec.x.submit("300")
	if got := len(current(t, w).Solution.Elements); got != 2 {
		t.Errorf("%d elements solved after moving the flap clear", got)
	}
}

func TestRenameElement(t *testing.T) {
	w := openRearWing(t)
	ec := w.controls.ec
	ec.list.Select(1)
	ec.name.submit("upper flap")
	res := current(t, w)
	if got := w.ctl.Study().Elements[1].Name; got != "upper flap" {
		t.Errorf("name %q", got)
	}
	if got := res.Solution.Elements[1].Name; got != "upper flap" {
		t.Errorf("solved element named %q", got)
	}
	if !strings.Contains(w.results.table.Text, "2 upper flap") {
		t.Errorf("results table:\n%s", w.results.table.Text)
	}
	for _, bad := range []string{"", "  ", "main"} {
		ec.name.submit(bad)
		if ec.placeMsg.Hidden || w.ctl.Study().Elements[1].Name != "upper flap" {
			t.Errorf("name %q accepted or shows no message", bad)
		}
	}
}
