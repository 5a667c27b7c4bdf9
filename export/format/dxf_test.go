package format

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"sectionbench/export/exporttest"
	"sectionbench/export/geometry"
	"slices"
	"strconv"
	"strings"
	"testing"

	"sectionbench/model"
)

// dxfEntity is one entity read back from a DXF file.
type dxfEntity struct {
	kind   string // POLYLINE, LWPOLYLINE, LINE, CIRCLE, TEXT
	layer  string
	points []model.Point // vertices, or a LINE's two ends, or a CIRCLE's centre
	closed bool
	radius float64
	text   string
}

type dxfFile struct {
	header   map[string]string // variable → first value
	layers   []string
	entities []dxfEntity
}

// readDXF reads the ASCII DXF entities this package writes (and the R12
// forms a CAD program writes for the same shapes): group-code/value line
// pairs (AutoCAD DXF Reference, R12), POLYLINE + VERTEX … SEQEND,
// LWPOLYLINE, LINE, CIRCLE, TEXT, the HEADER variables and the LAYER table.
func readDXF(r io.Reader) (*dxfFile, error) {
	sc := bufio.NewScanner(r)
	type pair struct {
		code int
		val  string
	}
	var pairs []pair
	line := 0
	for sc.Scan() {
		line++
		c, err := strconv.Atoi(strings.TrimSpace(sc.Text()))
		if err != nil {
			return nil, fmt.Errorf("line %d: group code %q", line, sc.Text())
		}
		if !sc.Scan() {
			return nil, fmt.Errorf("line %d: group code without a value", line)
		}
		line++
		pairs = append(pairs, pair{c, strings.TrimSpace(sc.Text())})
	}
	if err := sc.Err(); err != nil {
		return nil, err
	}
	f := &dxfFile{header: map[string]string{}}
	num := func(s string) float64 {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			return math.NaN()
		}
		return v
	}
	section := ""
	var cur *dxfEntity
	var inPoly *dxfEntity // an open POLYLINE collecting vertices
	var vertex *model.Point
	lastVar := ""
	flush := func() {
		if cur == nil {
			return
		}
		switch cur.kind {
		case "VERTEX":
			if inPoly != nil && vertex != nil {
				inPoly.points = append(inPoly.points, *vertex)
			}
		case "SEQEND":
			if inPoly != nil {
				f.entities = append(f.entities, *inPoly)
				inPoly = nil
			}
		case "POLYLINE":
			p := *cur
			inPoly = &p
		case "LWPOLYLINE", "LINE", "CIRCLE", "TEXT":
			f.entities = append(f.entities, *cur)
		}
		cur, vertex = nil, nil
	}
	for i := 0; i < len(pairs); i++ {
		p := pairs[i]
		if p.code == 999 {
			continue
		}
		if p.code == 0 {
			flush()
			switch p.val {
			case "SECTION":
				if i+1 < len(pairs) && pairs[i+1].code == 2 {
					section = pairs[i+1].val
					i++
				}
				continue
			case "ENDSEC", "EOF", "TABLE", "ENDTAB":
				continue
			}
			if section == "TABLES" && p.val == "LAYER" {
				for i+1 < len(pairs) && pairs[i+1].code != 0 {
					i++
					if pairs[i].code == 2 {
						f.layers = append(f.layers, pairs[i].val)
					}
				}
				continue
			}
			if section == "ENTITIES" {
				cur = &dxfEntity{kind: p.val}
				if p.val == "VERTEX" {
					vertex = &model.Point{}
				}
			}
			continue
		}
		switch section {
		case "HEADER":
			if p.code == 9 {
				lastVar = p.val
			} else if _, ok := f.header[lastVar]; !ok && lastVar != "" {
				f.header[lastVar] = p.val
			}
		case "ENTITIES":
			if cur == nil {
				continue
			}
			switch p.code {
			case 8:
				cur.layer = p.val
			case 1:
				cur.text = p.val
			case 40:
				cur.radius = num(p.val)
			case 70:
				if flags, err := strconv.Atoi(p.val); err == nil {
					cur.closed = flags&1 != 0
				}
			case 10, 11:
				pt := model.Point{X: num(p.val)}
				if i+1 < len(pairs) && pairs[i+1].code == p.code+10 {
					pt.Y = num(pairs[i+1].val)
					i++
				}
				switch {
				case cur.kind == "VERTEX":
					*vertex = pt
				case cur.kind == "POLYLINE":
					// the POLYLINE's own 10/20 is a dummy elevation point
				default:
					cur.points = append(cur.points, pt)
				}
			}
		}
	}
	flush()
	return f, nil
}

// TestReadHandWrittenDXF checks the reader on a file written by hand from
// the AutoCAD DXF Reference (R12 group codes), not by WriteDXF.
func TestReadHandWrittenDXF(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "dxf", "plate_r12.dxf"))
	if err != nil {
		t.Fatal(err)
	}
	f, err := readDXF(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	if f.header["$INSUNITS"] != "4" || f.header["$ACADVER"] != "AC1009" {
		t.Errorf("header %v", f.header)
	}
	if len(f.entities) != 4 {
		t.Fatalf("%d entities, want 4: %+v", len(f.entities), f.entities)
	}
	plate := []model.Point{{X: 0, Y: 0}, {X: 100, Y: 0}, {X: 100, Y: 20}, {X: 0, Y: 20}}
	for k, e := range f.entities[:2] {
		if !e.closed || len(e.points) != 4 {
			t.Fatalf("entity %d (%s): closed %v, %d points", k, e.kind, e.closed, len(e.points))
		}
		for i, p := range e.points {
			want := plate[i].Add(model.Point{Y: 30 * float64(k)})
			if p.Dist(want) > 0.01 {
				t.Errorf("%s vertex %d = %v, want %v", e.kind, i, p, want)
			}
		}
	}
	if c := f.entities[2]; c.kind != "CIRCLE" || c.layer != "HOLES" || c.radius != 3 || c.points[0] != (model.Point{X: 25, Y: 10}) {
		t.Errorf("circle %+v", c)
	}
	if l := f.entities[3]; l.kind != "LINE" || len(l.points) != 2 || l.points[1] != (model.Point{X: 100, Y: 10}) {
		t.Errorf("line %+v", l)
	}
}

// TestDXFRoundTrip writes the outline of the synthetic two-element wing
// and reads it back: every path, circle and text of the drawing on its
// layer within 0.01 mm, in millimetres, all in the positive quadrant, and
// the cut rib is the skin offset.
func TestDXFRoundTrip(t *testing.T) {
	l := exporttest.TwoElementLayout(120)
	for _, placed := range []bool{true, false} {
		o, err := geometry.NewOutline("demo wing", l, geometry.OutlineOptions{
			Placed: placed, SkinMM: 1, ChordLine: true,
			Marks: []geometry.Mark{{Element: 0, Label: "spar", XC: 0.3, YC: 0, DiameterMM: 8}},
		})
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := WriteDXF(&b, o); err != nil {
			t.Fatal(err)
		}
		f, err := readDXF(&b)
		if err != nil {
			t.Fatal(err)
		}
		if f.header["$INSUNITS"] != "4" {
			t.Errorf("$INSUNITS = %q, want 4 (millimetres)", f.header["$INSUNITS"])
		}
		if !slices.Equal(f.layers, geometry.Layers) {
			t.Errorf("layers %v, want %v", f.layers, geometry.Layers)
		}
		byLayer := map[string][]dxfEntity{}
		for _, e := range f.entities {
			byLayer[e.layer] = append(byLayer[e.layer], e)
			for _, p := range e.points {
				if p.X < 0 || p.Y < 0 {
					t.Errorf("placed=%v: %s on %s at %v, outside the positive quadrant", placed, e.kind, e.layer, p)
				}
			}
		}
		dr := o.Drawing()
		for _, dl := range dr.Layers {
			got := byLayer[dl.Name]
			if len(got) != len(dl.Paths)+len(dl.Circles)+len(dl.Texts) {
				t.Fatalf("placed=%v layer %s: %d entities, want %d", placed, dl.Name, len(got), len(dl.Paths)+len(dl.Circles)+len(dl.Texts))
			}
			for i, p := range dl.Paths {
				samePoints(t, fmt.Sprintf("placed=%v %s path %d", placed, dl.Name, i), got[i], p)
			}
			for i, c := range dl.Circles {
				e := got[len(dl.Paths)+i]
				if e.kind != "CIRCLE" || math.Abs(e.radius-c.Radius) > 0.01 || e.points[0].Dist(c.Centre) > 0.01 {
					t.Errorf("placed=%v %s circle %d: %+v, want %+v", placed, dl.Name, i, e, c)
				}
			}
			for i, tx := range dl.Texts {
				if e := got[len(dl.Paths)+len(dl.Circles)+i]; e.kind != "TEXT" || e.text != tx.Text {
					t.Errorf("placed=%v %s text %d: %q, want %q", placed, dl.Name, i, e.text, tx.Text)
				}
			}
		}
		// The cut layer holds the ribs (offsets) and the 8 mm hole.
		cut := dr.Layer(geometry.LayerCut)
		if len(cut.Paths) != len(o.Elements) || len(cut.Circles) != 1 || math.Abs(cut.Circles[0].Radius-4) > 1e-9 {
			t.Errorf("placed=%v: cut layer %d paths, %d circles", placed, len(cut.Paths), len(cut.Circles))
		}
		for i, e := range o.Elements {
			if len(cut.Paths[i].Points) != len(e.Inner.Points) {
				t.Errorf("placed=%v: element %d's cut path is not its rib", placed, i)
			}
		}
		// Real size: the main plane's chord line is 250 mm long.
		if c := o.Elements[0].TE.Dist(o.Elements[0].LE); math.Abs(c-250) > 0.01 {
			t.Errorf("main chord %.4f mm, want 250", c)
		}
	}
}

// samePoints compares a DXF entity with a drawing path: a LINE for two
// open points, a POLYLINE otherwise.
func samePoints(t *testing.T, what string, e dxfEntity, want geometry.Path) {
	t.Helper()
	if len(want.Points) == 2 && !want.Closed {
		if e.kind != "LINE" || e.points[0].Dist(want.Points[0]) > 0.01 || e.points[1].Dist(want.Points[1]) > 0.01 {
			t.Errorf("%s: %+v, want the line %v", what, e, want.Points)
		}
		return
	}
	if e.closed != want.Closed || len(e.points) != len(want.Points) {
		t.Errorf("%s: closed %v, %d points, want %v, %d", what, e.closed, len(e.points), want.Closed, len(want.Points))
		return
	}
	for i := range want.Points {
		if d := e.points[i].Dist(want.Points[i]); d > 0.01 {
			t.Errorf("%s: point %d off by %.4f mm", what, i, d)
			return
		}
	}
}
