package solver

import (
	"os"
	"testing"

	"sectionbench/model"
)

// loadStudy reads a study file and resolves its sections (specs and
// embedded coordinates; no coordinate files).
func loadStudy(t *testing.T, path string) (*model.Study, []*model.Section) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	st, err := model.DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	var secs []*model.Section
	for _, e := range st.Elements {
		sec, _, err := model.SectionFromSource(e.Section, nil)
		if err != nil {
			t.Fatal(err)
		}
		secs = append(secs, sec)
	}
	return st, secs
}
