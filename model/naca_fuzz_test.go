package model

import (
	"errors"
	"testing"
	"unicode/utf8"
)

// FuzzParseNACA checks that ParseNACA never panics, that every rejection
// is a *NACAError pointing inside the input, and that every accepted
// designation generates a counter-clockwise section of finite points. The
// seed corpus is in testdata/fuzz/FuzzParseNACA.
func FuzzParseNACA(f *testing.F) {
	for _, s := range []string{"2412", "NACA 0012", "naca23012", "23112", "2400", "23a12", "", "NACA-25121 "} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		c, err := ParseNACA(s)
		if err != nil {
			var ne *NACAError
			if !errors.As(err, &ne) {
				t.Fatalf("%q: error %v is not a *NACAError", s, err)
			}
			if ne.Pos < -1 || ne.Pos >= max(1, utf8.RuneCountInString(s)) || ne.Error() == "" {
				t.Fatalf("%q: bad error %+v", s, ne)
			}
			return
		}
		if c.Family != len(c.Designation) || !(c.Thickness > 0 && c.Thickness <= MaxNACAThickness) {
			t.Fatalf("%q: inconsistent code %+v", s, c)
		}
		for _, closed := range []bool{false, true} {
			sec, err := NACA(s, NACAOptions{PointsPerSurface: 41, ClosedTE: closed})
			if err != nil {
				t.Fatalf("%q accepted by ParseNACA but NACA fails: %v", s, err)
			}
			if sec.Len() != 81 || sec.SignedArea() <= 0 {
				t.Fatalf("%q: %d points, signed area %g", s, sec.Len(), sec.SignedArea())
			}
		}
	})
}
