package modeltest

import (
	"os"
	"testing"

	"sectionbench/model"
)

// LoadStudy reads a study file and resolves its sections (specs and
// embedded coordinates; no coordinate files), failing the test on any
// error. The solver's and the engine's tests share it.
func LoadStudy(t testing.TB, path string) (*model.Study, []*model.Section) {
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
