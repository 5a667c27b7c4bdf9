package assets

import (
	"bytes"
	"image/png"
	"strings"
	"testing"

	"sectionbench/model"
)

func TestDemoStudyDecodes(t *testing.T) {
	st, err := model.DecodeStudy(DemoStudy)
	if err != nil {
		t.Fatalf("demo study: %v", err)
	}
	if err := st.Validate(); err != nil {
		t.Fatalf("demo study invalid: %v", err)
	}
	// Demo data must say it is invented (project rule).
	if !strings.Contains(strings.ToLower(st.Name), "fictional") {
		t.Errorf("demo study name %q does not say it is fictional", st.Name)
	}
}

func TestIconIsSquarePNG(t *testing.T) {
	img, err := png.Decode(bytes.NewReader(Icon))
	if err != nil {
		t.Fatalf("icon: %v", err)
	}
	if b := img.Bounds(); b.Dx() != b.Dy() || b.Dx() < 256 {
		t.Errorf("icon is %v, want a square of at least 256 px", b)
	}
}

// TestExamplesDecode: every example is a valid study that says its data
// are invented.
func TestExamplesDecode(t *testing.T) {
	for _, ex := range Examples {
		st, err := model.DecodeStudy(ex.Study)
		if err != nil {
			t.Fatalf("%s: %v", ex.Title, err)
		}
		if !strings.Contains(strings.ToLower(st.Team), "invented") {
			t.Errorf("%s: team %q does not say the data are invented", ex.Title, st.Team)
		}
	}
}
