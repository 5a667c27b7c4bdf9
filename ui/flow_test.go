package ui

import (
	"math"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"

	"sectionbench/model"
)

// newStudyBench opens a workbench on a new study: one upright element,
// ISA sea-level air and no speed.
func newStudyBench(t *testing.T) *Workbench {
	t.Helper()
	w := newTestBench(t)
	if err := w.ctl.Load(model.NewStudy(), ""); err != nil {
		t.Fatal(err)
	}
	current(t, w)
	return w
}

func TestSpeedInKmh(t *testing.T) {
	w := newStudyBench(t)
	fc := w.controls.fc
	if fc.unit.Selected != unitKmh {
		t.Fatalf("speed unit %q, want km/h", fc.unit.Selected)
	}
	for _, kmh := range []float64{100, 72, 43.2} {
		fc.speed.submit(entryNum(kmh))
		current(t, w)
		if got, want := w.ctl.Study().Flow.SpeedMPS, model.KmhToMps(kmh); got != want {
			t.Errorf("%g km/h sets speed_mps %v, want exactly %v", kmh, got, want)
		}
	}
	// Switching the unit rewrites the field and leaves the study alone.
	before := encoded(t, w.ctl.Study())
	fc.unit.SetSelected(unitMPS)
	if got := fc.speed.Text; got != "12" {
		t.Errorf("43.2 km/h shows as %q m/s, want 12", got)
	}
	if encoded(t, w.ctl.Study()) != before {
		t.Error("switching the speed unit changed the study")
	}
	fc.speed.submit("20")
	current(t, w)
	if got := w.ctl.Study().Flow.SpeedMPS; got != 20 {
		t.Errorf("20 m/s sets speed_mps %v", got)
	}
	// The first speed turned the viscous solution on, which needs one: an
	// empty speed is refused with its reason; with it off, it clears.
	fc.speed.submit("")
	if got := w.ctl.Study().Flow.SpeedMPS; got != 20 || fc.msg.Hidden {
		t.Errorf("an empty speed with the viscous solution on: speed_mps %v, message %q", got, fc.msg.Text)
	}
	w.controls.vc.mode.SetSelected(modeOff)
	w.WaitIdle()
	fc.speed.submit("")
	if got := w.ctl.Study().Flow.SpeedMPS; got != 0 {
		t.Errorf("an empty speed sets speed_mps %v, want 0 (none)", got)
	}
}

func TestForcesWithSpeed(t *testing.T) {
	w := newStudyBench(t)
	fc := w.controls.fc
	if res := current(t, w); res.Forces != nil || strings.Contains(w.status.Full(), "N/m") {
		t.Fatalf("forces without a speed: %+v, status %q", res.Forces, w.status.Full())
	}
	fc.unit.SetSelected(unitMPS)
	fc.speed.submit("20")
	res := current(t, w)
	if res.Forces == nil {
		t.Fatal("no forces with a speed")
	}
	// The first speed turned the coupled viscous solution on; the forces
	// below are checked inviscid, from the circulation.
	if v := w.ctl.Study().Viscous; !v.Enabled || !v.IsCoupled() || res.Coupled == nil {
		t.Fatalf("the first speed left the viscous solution %+v", v)
	}
	w.controls.vc.mode.SetSelected(modeOff)
	res = current(t, w)
	// ISA sea level: ρ = 1.2250 kg/m³ (U.S. Standard Atmosphere, 1976;
	// docs/validation.md §6), so q = ½ρV² = 245.0 Pa at 20 m/s.
	if q := res.Forces.DynamicPressurePa; math.Abs(q-245.0) > 0.05 {
		t.Errorf("q = %g Pa, want 245.0", q)
	}
	if !strings.Contains(fc.derived.Text, "ρ 1.225 kg/m³") || !strings.Contains(fc.derived.Text, "q 245") {
		t.Errorf("derived values %q", fc.derived.Text)
	}
	if !strings.Contains(fc.derived.Text, "Re (own chord): main") {
		t.Errorf("derived values %q give no Reynolds number", fc.derived.Text)
	}
	// Upright: lift, per metre.
	lift := "lift " + fixed(res.Forces.LiftPerSpan, 1) + " N/m"
	if !strings.Contains(w.status.Full(), lift) || !strings.Contains(w.status.Full(), "Cl ") {
		t.Errorf("status %q does not give %q", w.status.Full(), lift)
	}
	// With a span the total appears beside it.
	fc.span.submit("1.2")
	res = current(t, w)
	total := fixed(res.Forces.LiftPerSpan*1.2, 1) + " N on 1.2 m"
	if !strings.Contains(w.status.Full(), total) || !strings.Contains(w.results.table.Text, "N on 1.2 m span") {
		t.Errorf("status %q or table lacks the span total %q", w.status.Full(), total)
	}
	// Inverted: downforce, positive, with the sign stated.
	w.controls.inverted.SetChecked(true)
	res = current(t, w)
	f := res.Forces
	if !(f.DownforcePerSpan > 0) {
		t.Fatalf("inverted cambered section at 4°: downforce %g N/m, want positive", f.DownforcePerSpan)
	}
	for _, want := range []string{
		"−Cl " + fixed(-res.Solution.Cl, 3) + " (from circulation, + down)",
		"downforce " + fixed(f.DownforcePerSpan, 1) + " N/m",
	} {
		if !strings.Contains(w.status.Full(), want) {
			t.Errorf("status %q does not say %q", w.status.Full(), want)
		}
	}
	if tb := w.results.table.Text; !strings.Contains(tb, "−Cl") || !strings.Contains(tb, "downforce N/m") || !strings.Contains(tb, fixed(f.DownforcePerSpan, 1)) {
		t.Errorf("results table does not give the downforce:\n%s", tb)
	}
	if !strings.Contains(w.results.note.Text, "positive pushes the car down") {
		t.Errorf("results note %q does not state the sign", w.results.note.Text)
	}
}

func TestAirAndReynolds(t *testing.T) {
	w := newStudyBench(t)
	fc := w.controls.fc
	fc.temp.submit("30")
	fc.pressure.submit("95000")
	if f := w.ctl.Study().Flow; f.TemperatureC != 30 || f.PressurePa != 95000 {
		t.Fatalf("air %+v", f)
	}
	test.Tap(fc.isa)
	current(t, w)
	if f := w.ctl.Study().Flow; f.TemperatureC != 15 || f.PressurePa != 101325 {
		t.Errorf("ISA sea level sets %g °C, %g Pa; want 15, 101325 (U.S. Standard Atmosphere, 1976)", f.TemperatureC, f.PressurePa)
	}
	if fc.temp.Text != "15" || fc.pressure.Text != "101325" {
		t.Errorf("fields say %q, %q", fc.temp.Text, fc.pressure.Text)
	}
	fc.reynolds.submit("3e5")
	res := current(t, w)
	if len(res.Reynolds) != 1 || res.Reynolds[0] != 3e5 {
		t.Errorf("Re entered directly gives %v", res.Reynolds)
	}
	if !strings.Contains(fc.derived.Text, "main 3.00×10⁵") {
		t.Errorf("derived values %q", fc.derived.Text)
	}
}

func TestGroundCautionShown(t *testing.T) {
	w := newTestBench(t)
	// The caution sits right under the ground control in the Wing tab.
	found := false
	for _, it := range w.controls.tabs.Items {
		if it.Text == "Wing" {
			found = strings.Contains(dumpText(it.Content), model.GroundCautionSentence())
		}
	}
	if !found {
		t.Error("the ground-effect caution is not in the Wing tab")
	}
}

func TestResultsToggle(t *testing.T) {
	w := newTestBench(t)
	if w.results.box.Hidden || w.results.table.Text == "" {
		t.Fatal("the results table is not shown after the first solve")
	}
	test.Tap(w.showRes)
	if !w.results.box.Hidden {
		t.Error("Results did not hide the table")
	}
	test.Tap(w.showRes)
	if w.results.box.Hidden {
		t.Error("Results did not show the table again")
	}
}

// TestGroundCautionIsTheModels: the caution under the ground control is
// the model's one near-ground caution (model.GroundCautionSentence) in
// every viscous mode, worded as the flags, the maps, the command line and
// the report word it; it said it a fifth way, by mode.
func TestGroundCautionIsTheModels(t *testing.T) {
	w := openRearWing(t) // inviscid
	note := w.controls.groundNote
	want := model.GroundCautionSentence()
	if note.Text != want {
		t.Errorf("inviscid: %q, want %q", note.Text, want)
	}
	for _, mode := range []string{modeCoupled, modeEstimate} {
		w.controls.vc.mode.SetSelected(mode)
		if note.Text != want {
			t.Errorf("%s: %q, want %q", mode, note.Text, want)
		}
	}
}

// TestGroundCautionOnlyWithGround: the caution under the ground control
// is about the ground, so it shows only while the ground is on; it showed
// with the ground off too.
func TestGroundCautionOnlyWithGround(t *testing.T) {
	w := openRearWing(t)
	note := w.controls.groundNote
	if !w.ctl.Current().Ground.Enabled || note.Hidden {
		t.Fatalf("the rear wing opens with the ground on (%v) and its caution shown (hidden %v)", w.ctl.Current().Ground.Enabled, note.Hidden)
	}
	test.Tap(w.controls.ground)
	if w.ctl.Current().Ground.Enabled || !note.Hidden {
		t.Errorf("ground off: ground %v, caution hidden %v; want off and hidden", w.ctl.Current().Ground.Enabled, note.Hidden)
	}
	test.Tap(w.controls.ground)
	if !w.ctl.Current().Ground.Enabled || note.Hidden {
		t.Errorf("ground on again: ground %v, caution hidden %v; want on and shown", w.ctl.Current().Ground.Enabled, note.Hidden)
	}
}
