package report

import (
	"bytes"
	"strings"
	"testing"

	"sectionbench/model"
)

// TestReportPrintsAnyName: an emoji in a study's name aborted the report
// ("character outside the supported range") and CJK names printed as
// empty boxes. Characters the embedded font cannot draw are replaced by a
// visible "?" and the report lists them; the study itself is unchanged.
func TestReportPrintsAnyName(t *testing.T) {
	st := model.NewStudy()
	st.Name = "Wing 🚀 翼"
	st.Team = "Équipe ☃"
	st.Elements[0].Name = "主翼"
	res := solve(t, st)
	var buf bytes.Buffer
	if err := Write(&buf, Input{Study: st, Result: res}); err != nil {
		t.Fatalf("report of a study with an emoji and CJK names: %v", err)
	}
	if st.Name != "Wing 🚀 翼" || st.Elements[0].Name != "主翼" || res.Solution.Elements[0].Name == "??" {
		t.Error("the report changed the study or its result")
	}
	in, note := printable(Input{Study: st, Result: res})
	if in.Study.Name != "Wing ? ?" || in.Study.Team != "Équipe ?" || in.Study.Elements[0].Name != "??" {
		t.Errorf("printable names %q, %q, %q; want the undrawable characters as ?", in.Study.Name, in.Study.Team, in.Study.Elements[0].Name)
	}
	for _, code := range []string{"U+1F680", "U+7FFC", "U+2603", "U+4E3B", "U+7FFC"} {
		if !strings.Contains(note, code) {
			t.Errorf("the note %q does not list %s", note, code)
		}
	}
	plain := model.NewStudy()
	if _, note := printable(Input{Study: plain, Result: solve(t, plain)}); note != "" {
		t.Errorf("a plain study gets the note %q", note)
	}
}
