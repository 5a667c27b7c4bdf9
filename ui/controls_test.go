package ui

import (
	"errors"
	"testing"

	"sectionbench/model"
)

func TestFriendlyMessages(t *testing.T) {
	cases := []struct {
		name string
		err  error
		want string
	}{
		{"field", &model.FieldError{Field: "panelling.panels", Err: errors.New("5000 is outside 16..2000")}, "Panel count: 5000 is outside 16..2000"},
		{"naca", &model.NACAError{Designation: "44x2", Pos: 2, Reason: "is not a digit"}, "Not a NACA designation: character 3 is not a digit"},
		{"naca without position", &model.NACAError{Designation: "", Pos: -1, Reason: "is empty"}, "Not a NACA designation: is empty"},
		{"plain", errors.New("first\nsecond"), "first"},
	}
	for _, c := range cases {
		if got := friendly(c.err); got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}
