package geometry

import (
	"fmt"
	"strings"
	"testing"

	"sectionbench/model"
)

// The title block gives each element's chord as the study sets it, not the
// distance from its leading-edge node to its trailing edge: an open-edged
// NACA 4412's contour reaches x/c −0.0003 ahead of the chord's origin, and
// its title read 250.1 mm for a 250 mm element.
func TestOutlineTitleGivesStudyChord(t *testing.T) {
	sec, err := model.NACA("4412", model.NACAOptions{})
	if err != nil {
		t.Fatal(err)
	}
	st := model.NewStudy()
	st.Elements[0].ChordMM = 250
	l, err := model.Place(st, []*model.Section{sec})
	if err != nil {
		t.Fatal(err)
	}
	for _, placed := range []bool{false, true} {
		o, err := NewOutline("title", l, OutlineOptions{Placed: placed})
		if err != nil {
			t.Fatal(err)
		}
		e := o.Elements[0]
		want := fmt.Sprintf("%s chord 250.0 mm", e.Name)
		if got := strings.Join(o.titleLines(), "\n"); !strings.Contains(got, want) {
			t.Errorf("placed %v: title has no %q (leading-edge node to trailing edge %.2f mm):\n%s", placed, want, e.TE.Dist(e.LE), got)
		}
	}
}
