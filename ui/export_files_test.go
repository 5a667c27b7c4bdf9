package ui

import (
	"context"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
)

// The manufacturing exports write files a cutter and the loader accept: the
// coordinates read back to the printed precision at the element's chord.
func TestExportCoordinatesAndOutline(t *testing.T) {
	w := newTestBench(t)
	current(t, w)
	dir := t.TempDir()
	files, err := w.writeCoordinates()(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(files) != 4*len(w.ctl.Study().Elements) {
		t.Fatalf("wrote %v", files)
	}
	chord := w.ctl.Study().Elements[0].ChordMM
	for _, f := range files {
		if !strings.HasSuffix(f, "-mm.dat") {
			continue
		}
		b, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil {
			t.Fatal(err)
		}
		sec, _, err := model.SectionFromFile(b, f)
		if err != nil {
			t.Fatalf("%s does not load back: %v", f, err)
		}
		// Cleaning rescales to unit chord: the file's points, divided by
		// the chord, are the section's to the printed 0.001 mm.
		orig := w.ctl.Sections()[0]
		if sec.Len() != orig.Len() {
			t.Fatalf("%d points back, want %d", sec.Len(), orig.Len())
		}
		for i := range orig.Len() {
			if d := sec.At(i).Dist(orig.At(i)) * chord; d > 2e-3 {
				t.Fatalf("point %d is %g mm off", i, d)
			}
		}
	}
	out, err := w.writeOutline(outlineSettings{skinMM: 1.5, sparXC: 0.3, sparDiaMM: 6, chordLine: true})(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range out {
		b, _ := os.ReadFile(filepath.Join(dir, f))
		if len(b) == 0 {
			t.Errorf("%s is empty", f)
		}
	}
	if _, err := w.writeBoundaryLayer()(dir); err == nil {
		t.Error("a boundary-layer table without the estimate on")
	}
}

func TestParseOutlineSettings(t *testing.T) {
	for _, tc := range []struct {
		skin, xc, dia, lig string
		ok                 bool
		skinMM, ligMM      float64
	}{
		{"", "", "", "", true, 0, 2},
		{"1,5", "0.3", "8", "", true, 1.5, 2},
		{"1", "0.3", "8", "0", true, 1, 0},
		{"1", "0.3", "8", "3.5", true, 1, 3.5},
		{"1", "0.3", "8", "-1", false, 0, 0},
		{"-1", "", "", "", false, 0, 0},
		{"thick", "", "", "", false, 0, 0},
		{"1", "0.3", "", "", false, 0, 0},
		{"1", "1.2", "8", "", false, 0, 0},
		{"NaN", "", "", "", false, 0, 0},
	} {
		s, err := parseOutlineSettings(tc.skin, tc.xc, tc.dia, tc.lig, "")
		if (err == nil) != tc.ok || (tc.ok && (math.Abs(s.skinMM-tc.skinMM) > 1e-12 || s.minLigamentMM != tc.ligMM)) {
			t.Errorf("%q %q %q %q: %+v, %v", tc.skin, tc.xc, tc.dia, tc.lig, s, err)
		}
	}
}

// TestOutlineFieldsApplyOnCommit: the outline dialog's number fields apply
// on Enter or leaving; a bad value shows its message beside its field and,
// left, the field returns to the value in use, which is what the export
// then uses.
func TestOutlineFieldsApplyOnCommit(t *testing.T) {
	test.NewTempApp(t)
	o := newOutlineForm()
	w := test.NewWindow(widget.NewForm(o.items...))
	defer w.Close()
	msgOf := func(f *field) *widget.Label { return f.msg }

	o.skin.submit("1.5")
	o.skin.SetText("99") // beyond the thickest skin: typed, not yet applied
	if !msgOf(o.skin).Hidden {
		t.Errorf("typing showed %q", msgOf(o.skin).Text)
	}
	o.skin.submit("99")
	if msgOf(o.skin).Hidden || !strings.Contains(msgOf(o.skin).Text, "skin thickness") {
		t.Errorf("a bad skin thickness shows %q (hidden %v), want a message naming the field", msgOf(o.skin).Text, msgOf(o.skin).Hidden)
	}
	o.skin.FocusLost()
	if o.skin.Text != "1.5" {
		t.Errorf("left, the field shows %q, want the value in use 1.5", o.skin.Text)
	}
	o.sparXC.submit("0.3")
	o.sparDia.SetText("x") // typed and never left: refused when the dialog is confirmed
	s, err := o.settings()
	if err == nil || !strings.Contains(err.Error(), "both its position and its diameter") {
		t.Errorf("settings with a spar position and no diameter: %v", err)
	}
	if s.skinMM != 1.5 || o.sparDia.Text != "" || msgOf(o.sparDia).Hidden {
		t.Errorf("skin %g mm, diameter field %q (message hidden %v): want 1.5 mm, the field back to empty with its message", s.skinMM, o.sparDia.Text, msgOf(o.sparDia).Hidden)
	}
	o.sparDia.submit("8")
	if s, err = o.settings(); err != nil || s.sparXC != 0.3 || s.sparDiaMM != 8 {
		t.Errorf("settings %+v, %v; want a spar at 0.3 of 8 mm", s, err)
	}
}

// With the coupled viscous solution on (the demo as it opens), the
// boundary-layer table holds its stations: it refused them, asking for the
// one-way estimate.
func TestExportBoundaryLayerCoupled(t *testing.T) {
	w := newDemoBench(t)
	if c := current(t, w).Coupled; c == nil || !c.Converged {
		t.Fatalf("the demo opens without a converged coupled result: %+v", c)
	}
	dir := t.TempDir()
	files, err := w.writeBoundaryLayer()(dir)
	if err != nil || len(files) != 1 {
		t.Fatalf("wrote %v, %v", files, err)
	}
	b, err := os.ReadFile(filepath.Join(dir, files[0]))
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	for _, want := range []string{"shear_stress_coefficient", "turbulent", "wake"} {
		if !strings.Contains(s, want) {
			t.Errorf("the coupled boundary-layer table lacks %q", want)
		}
	}
}

// TestReportExportCancels: the team report's export stops when cancelled
// (its busy dialog has Cancel: the density study it runs first takes
// minutes on a two-element wing with the coupled solution) and writes
// nothing.
func TestReportExportCancels(t *testing.T) {
	w := newTestBench(t)
	w.WaitIdle()
	job := w.writeReportCtx()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	dir := t.TempDir()
	if _, err := job(ctx, dir); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled export: %v, want the cancellation", err)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Errorf("a cancelled export left %d files", len(ents))
	}
}
