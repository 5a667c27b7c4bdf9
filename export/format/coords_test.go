package format

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"

	"sectionbench/model"
)

func nacaSection(t *testing.T, d string) *model.Section {
	t.Helper()
	s, err := model.NACA(d, model.NACAOptions{ClosedTE: true})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestCoordinatesRoundTrip writes coordinates and reads them back with
// model.ParseCoordinates: every point within half a unit in the last
// printed decimal, in the project's order (the first point the trailing
// edge, the upper surface next).
func TestCoordinatesRoundTrip(t *testing.T) {
	sec := nacaSection(t, "2412")
	for _, c := range []struct {
		name string
		opt  CoordOptions
		n    int // expected points; 0 = as the section
	}{
		{"unit chord as given", CoordOptions{}, 0},
		{"250 mm", CoordOptions{ChordMM: 250}, 0},
		{"repanelled 120 cosine", CoordOptions{Panelling: &model.Panelling{Panels: 120, Spacing: model.SpacingCosine, Nose: 0.5, Tail: 0.2}}, 121},
		{"repanelled 80 at 180 mm, 2 decimals", CoordOptions{ChordMM: 180, Decimals: 2, Panelling: &model.Panelling{Panels: 80, Spacing: model.SpacingUniform}}, 81},
	} {
		var b bytes.Buffer
		if err := WriteCoordinates(&b, sec, c.opt); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		want, err := coordPoints(sec, c.opt)
		if err != nil {
			t.Fatal(err)
		}
		if c.n > 0 && len(want) != c.n {
			t.Errorf("%s: %d points, want %d", c.name, len(want), c.n)
		}
		p, err := model.ParseCoordinates(bytes.NewReader(b.Bytes()), c.name)
		if err != nil {
			t.Fatalf("%s: %v\n%s", c.name, err, b.String()[:200])
		}
		if !strings.HasPrefix(p.Name, sec.Name()) {
			t.Errorf("%s: name %q", c.name, p.Name)
		}
		if len(p.Points) != len(want) {
			t.Fatalf("%s: read %d points, wrote %d", c.name, len(p.Points), len(want))
		}
		tol := 0.5*math.Pow(10, -float64(c.opt.decimals())) + 1e-12
		for i := range want {
			if math.Abs(p.Points[i].X-want[i].X) > tol || math.Abs(p.Points[i].Y-want[i].Y) > tol {
				t.Fatalf("%s: point %d read %v, wrote %v (tolerance %g)", c.name, i, p.Points[i], want[i], tol)
			}
		}
		// Project order: trailing edge first, then the upper surface.
		scale := math.Max(c.opt.ChordMM, 1)
		if math.Abs(p.Points[0].X-scale) > tol || !(p.Points[1].Y > 0) {
			t.Errorf("%s: starts %v, %v", c.name, p.Points[0], p.Points[1])
		}
	}
}

func TestCoordinatesCSV(t *testing.T) {
	sec := nacaSection(t, "0012")
	for _, c := range []struct {
		opt  CoordOptions
		head string
	}{{CoordOptions{}, "x,y"}, {CoordOptions{ChordMM: 300}, "x_mm,y_mm"}} {
		var b bytes.Buffer
		if err := WriteCoordinatesCSV(&b, sec, c.opt); err != nil {
			t.Fatal(err)
		}
		recs := readCSV(t, b.Bytes())
		if strings.Join(recs[0], ",") != c.head || len(recs) != sec.Len()+1 {
			t.Errorf("header %v, %d rows for %d points", recs[0], len(recs)-1, sec.Len())
		}
		scale := math.Max(c.opt.ChordMM, 1)
		if recs[1][0] != formatCoord(scale, c.opt.decimals()) {
			t.Errorf("first x %q, want the trailing edge at %g", recs[1][0], scale)
		}
	}
}

func TestCoordinatesErrors(t *testing.T) {
	sec := nacaSection(t, "0012")
	for _, c := range []struct {
		name  string
		opt   CoordOptions
		field string
	}{
		{"negative chord", CoordOptions{ChordMM: -1}, "coords.chord_mm"},
		{"too many decimals", CoordOptions{Decimals: 20}, "coords.decimals"},
		{"too few panels", CoordOptions{Panelling: &model.Panelling{Panels: 4, Spacing: model.SpacingCosine}}, "panelling.panels"},
	} {
		err := WriteCoordinates(&bytes.Buffer{}, sec, c.opt)
		var fe *model.FieldError
		if !errors.As(err, &fe) || fe.Field != c.field {
			t.Errorf("%s: error %v, want field %s", c.name, err, c.field)
		}
	}
}

func TestFormatCoord(t *testing.T) {
	for _, c := range []struct {
		v    float64
		dec  int
		want string
	}{{-0.0000001, 6, "0.000000"}, {-0.5, 3, "-0.500"}, {1, 6, "1.000000"}} {
		if got := formatCoord(c.v, c.dec); got != c.want {
			t.Errorf("formatCoord(%g, %d) = %q, want %q", c.v, c.dec, got, c.want)
		}
	}
}

// A name line this package wrote is rewritten for the scale written, so a
// mm file cleaned back to unit chord never says "coordinates in mm".
func TestCoordNameRewritesUnits(t *testing.T) {
	for _, c := range []struct {
		name, in string
		o        CoordOptions
		want     string
	}{
		{"mm file to unit chord", "NACA 4412 (element flap, chord 120 mm, coordinates in mm)", CoordOptions{}, "NACA 4412 (element flap)"},
		{"mm file to another chord", "NACA 4412 (chord 120 mm, coordinates in mm)", CoordOptions{ChordMM: 250}, "NACA 4412 (chord 250 mm, coordinates in mm)"},
		{"element kept once", "NACA 4412 (element flap)", CoordOptions{Element: "flap"}, "NACA 4412 (element flap)"},
		{"other parentheses kept", "Team section B (modified)", CoordOptions{}, "Team section B (modified)"},
	} {
		sec, err := model.NewSection(c.in, []model.Point{{X: 1}, {X: 0.5, Y: 0.05}, {X: 0}, {X: 0.5, Y: -0.05}, {X: 1}})
		if err != nil {
			t.Fatal(err)
		}
		if got := coordName(sec, c.o); got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}
