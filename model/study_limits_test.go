package model

import (
	"errors"
	"fmt"
	"strings"
	"testing"
)

// TestStudyLimitsAtLoad: every text and list of a study has a limit that
// DecodeStudy enforces, naming the field. A 100 000-character pin
// label froze the app's text wrapping, and an embedded section of 400 000
// points (past the 20 000-point file limit) took 11 s to clean.
func TestStudyLimitsAtLoad(t *testing.T) {
	long := strings.Repeat("x", 100000)
	points := func(n int) string {
		var b strings.Builder
		for i := range n {
			if i > 0 {
				b.WriteString(",")
			}
			fmt.Fprintf(&b, "[%g, 0]", float64(i)/float64(n))
		}
		return b.String()
	}
	curve := func(n int) string {
		return `{"element": "main", "side": "upper", "points": [` + points(n) + `]}`
	}
	base := func(name, team, element, section, pins string) string {
		return `{"format": "sectionbench-study", "version": 2, "name": "` + name + `", "team": "` + team + `",
			"elements": [{"name": "` + element + `", "section": ` + section + `, "chord_mm": 250}],
			"pins": [` + pins + `]}`
	}
	ok := base("wing", "team", "main", `"naca:4412"`, "")
	if _, err := DecodeStudy([]byte(ok)); err != nil {
		t.Fatalf("a plain study: %v", err)
	}
	for _, tc := range []struct {
		name, study, field string
	}{
		{"long study name", base(long, "t", "main", `"naca:4412"`, ""), "name"},
		{"long team", base("w", long, "main", `"naca:4412"`, ""), "team"},
		{"line break in a name", base(`a\nb`, "t", "main", `"naca:4412"`, ""), "name"},
		{"long element name", base("w", "t", long, `"naca:4412"`, ""), "elements[0].name"},
		{"long spec", base("w", "t", "main", `"`+long+`"`, ""), "elements[0].section"},
		{"long embedded name", base("w", "t", "main", `{"name": "`+long+`", "points": [`+points(10)+`]}`, ""), "elements[0].section.name"},
		{"embedded section past the file limit", base("w", "t", "main", `{"name": "big", "points": [`+points(MaxPoints+1)+`]}`, ""), "elements[0].section.points"},
		{"long pin label", base("w", "t", "main", `"naca:4412"`, `{"label": "`+long+`", "cp": [], "polar": []}`), "pins[0].label"},
		{"too many pin curves", base("w", "t", "main", `"naca:4412"`, `{"label": "p", "cp": [`+strings.Repeat(curve(2)+",", MaxPinCurves)+curve(2)+`], "polar": []}`), "pins[0].cp"},
		{"long pin curve", base("w", "t", "main", `"naca:4412"`, `{"label": "p", "cp": [`+curve(MaxPinCurvePoints+1)+`], "polar": []}`), "pins[0].cp[0].points"},
		{"long pin side", base("w", "t", "main", `"naca:4412"`, `{"label": "p", "cp": [{"element": "main", "side": "`+long+`", "points": []}], "polar": []}`), "pins[0].cp[0].side"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := DecodeStudy([]byte(tc.study))
			var fe *FieldError
			if !errors.As(err, &fe) || fe.Field != tc.field {
				t.Fatalf("error %v, want one naming %s", err, tc.field)
			}
		})
	}
}
