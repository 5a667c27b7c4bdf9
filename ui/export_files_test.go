package ui

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

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
