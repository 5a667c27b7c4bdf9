package ui

import (
	"strings"
	"testing"

	"sectionbench/assets"
)

// TestExamplesAndStudyName: each example opens as an unsaved study whose
// name and team say the data are invented; the study name and team fields
// edit the study and its title, and an empty name is refused beside the
// field.
func TestExamplesAndStudyName(t *testing.T) {
	w := newTestBench(t)
	for _, ex := range assets.Examples {
		w.openExample(ex)
		res := current(t, w)
		st := w.ctl.Study()
		if w.ctl.Path() != "" || !strings.Contains(strings.ToLower(st.Team), "invented") || res.Solution == nil {
			t.Errorf("%s: path %q, team %q, solved %v", ex.Title, w.ctl.Path(), st.Team, res.Solution != nil)
		}
		if w.controls.studyName.Text != st.Name {
			t.Errorf("%s: name field %q, study %q", ex.Title, w.controls.studyName.Text, st.Name)
		}
	}
	c := w.controls
	c.studyName.submit("Rear wing 2027")
	c.team.submit("Team Example")
	st := w.ctl.Study()
	if st.Name != "Rear wing 2027" || st.Team != "Team Example" {
		t.Errorf("name %q, team %q", st.Name, st.Team)
	}
	if !strings.Contains(w.Window().Title(), "Rear wing 2027") {
		t.Errorf("title %q", w.Window().Title())
	}
	c.studyName.submit("  ")
	if c.studyMsg.Hidden || w.ctl.Study().Name != "Rear wing 2027" {
		t.Errorf("an empty name: message hidden %v, name %q", c.studyMsg.Hidden, w.ctl.Study().Name)
	}
}

// TestExportNamesTeamAndStudy: exported files are named by the team and
// the study.
func TestExportNamesTeamAndStudy(t *testing.T) {
	w := newTestBench(t)
	w.controls.studyName.submit("Rear wing 2027")
	w.controls.team.submit("Team Example")
	if got := w.exportBase(); got != "team-example-rear-wing-2027" {
		t.Errorf("export stem %q", got)
	}
	w.controls.team.submit("")
	if got := w.exportBase(); got != "rear-wing-2027" {
		t.Errorf("export stem without a team %q", got)
	}
}
