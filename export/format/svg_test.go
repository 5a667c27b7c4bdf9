package format

import (
	"bytes"
	"encoding/xml"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"sectionbench/export/exporttest"
	"sectionbench/export/geometry"
	"strconv"
	"strings"
	"testing"
)

// TestSVGTrueScale: the SVG is well-formed XML whose width and height in
// millimetres equal its viewBox size, so one user unit prints as 1 mm,
// with one closed path per element and a scale bar.
func TestSVGTrueScale(t *testing.T) {
	o, err := geometry.NewOutline("demo <wing> & flap", exporttest.TwoElementLayout(120), geometry.OutlineOptions{Placed: true, SkinMM: 1, ChordLine: true,
		Marks: []geometry.Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8}}})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WriteSVG(&b, o); err != nil {
		t.Fatal(err)
	}
	d := xml.NewDecoder(bytes.NewReader(b.Bytes()))
	var root xml.StartElement
	paths, scaleBar := 0, false
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		if root.Name.Local == "" {
			root = se
		}
		for _, a := range se.Attr {
			if a.Name.Local == "id" && strings.HasPrefix(a.Value, "element-") {
				paths++
				for _, a2 := range se.Attr {
					if a2.Name.Local == "d" && !strings.HasSuffix(a2.Value, "Z") {
						t.Errorf("path %s is not closed", a.Value)
					}
				}
			}
			if a.Name.Local == "id" && a.Value == "scale-bar" {
				scaleBar = true
			}
		}
	}
	if root.Name.Local != "svg" {
		t.Fatalf("root element %q", root.Name.Local)
	}
	attr := map[string]string{}
	for _, a := range root.Attr {
		attr[a.Name.Local] = a.Value
	}
	vb := strings.Fields(attr["viewBox"])
	if len(vb) != 4 {
		t.Fatalf("viewBox %q", attr["viewBox"])
	}
	mm := func(s string) float64 {
		if !strings.HasSuffix(s, "mm") {
			t.Fatalf("size %q is not in mm", s)
		}
		v, _ := strconv.ParseFloat(strings.TrimSuffix(s, "mm"), 64)
		return v
	}
	vw, _ := strconv.ParseFloat(vb[2], 64)
	vh, _ := strconv.ParseFloat(vb[3], 64)
	if mm(attr["width"]) != vw || mm(attr["height"]) != vh {
		t.Errorf("size %s × %s against viewBox %s", attr["width"], attr["height"], attr["viewBox"])
	}
	// The drawing spans the two elements: 0 mm to the flap's trailing
	// edge, plus the margins.
	lo, hi := o.Bounds()
	if math.Abs(vw-(hi.X-lo.X+2*svgMarginMM)) > 1e-3 {
		t.Errorf("viewBox width %g, want %g", vw, hi.X-lo.X+2*svgMarginMM)
	}
	if paths != len(o.Elements) || !scaleBar {
		t.Errorf("%d element paths, scale bar %v", paths, scaleBar)
	}
}

func TestScaleBarLength(t *testing.T) {
	for _, c := range []struct{ width, want float64 }{{350, 50}, {100, 20}, {40, 10}, {1000, 200}} {
		if got := scaleBarLength(c.width); got != c.want {
			t.Errorf("scaleBarLength(%g) = %g, want %g", c.width, got, c.want)
		}
	}
}

// outlineDir, when set, receives the golden outline and a placed one as SVG
// to look at.
var outlineDir = flag.String("figures", "", "write the test outlines as SVG to this directory")

// TestOutlineGolden pins the DXF and SVG text of a small outline: a
// 40-panel NACA 0012 main plane and flap from exporttest.TwoElementLayout with a 1 mm skin,
// chord lines and a spar hole. Run with -update after a deliberate change.
func TestOutlineGolden(t *testing.T) {
	o, err := geometry.NewOutline("golden demo", exporttest.TwoElementLayout(40), geometry.OutlineOptions{SkinMM: 1, ChordLine: true,
		Marks: []geometry.Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8}}})
	if err != nil {
		t.Fatal(err)
	}
	var d, s bytes.Buffer
	if err := WriteDXF(&d, o); err != nil {
		t.Fatal(err)
	}
	if err := WriteSVG(&s, o); err != nil {
		t.Fatal(err)
	}
	golden(t, "outline.dxf", d.Bytes())
	golden(t, "outline.svg", s.Bytes())
	if *outlineDir != "" {
		os.WriteFile(filepath.Join(*outlineDir, "outline.svg"), s.Bytes(), 0o644)
		o2, err := geometry.NewOutline("placed demo", exporttest.TwoElementLayout(120), geometry.OutlineOptions{Placed: true, SkinMM: 1, ChordLine: true,
			Marks: []geometry.Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8}}})
		if err != nil {
			t.Fatal(err)
		}
		var s2 bytes.Buffer
		WriteSVG(&s2, o2)
		os.WriteFile(filepath.Join(*outlineDir, "outline-placed.svg"), s2.Bytes(), 0o644)
	}
}
