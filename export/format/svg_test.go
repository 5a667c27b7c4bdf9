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
	"slices"
	"strconv"
	"strings"
	"testing"
)

// TestSVGTrueScale: the SVG is well-formed XML whose width and height in
// millimetres equal its viewBox size from (0, 0), so one user unit prints
// as 1 mm; it holds one group per layer of geometry.Layers, named as in the
// DXF, with the drawing's paths, circles and texts, and the cut layer is
// stroked as a hairline.
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
	type count struct{ paths, circles int }
	got := map[string]*count{}
	var texts []string
	var root xml.StartElement
	var group string
	d := xml.NewDecoder(bytes.NewReader(b.Bytes()))
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		switch tk := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range tk.Attr {
				attr[a.Name.Local] = a.Value
			}
			switch tk.Name.Local {
			case "svg":
				root = tk
			case "g":
				group = attr["id"]
				got[group] = &count{}
				if group == geometry.LayerCut && attr["stroke-width"] != svgNum(svgHairlineMM) {
					t.Errorf("cut stroke %s mm, want a hairline", attr["stroke-width"])
				}
			case "path":
				got[group].paths++
			case "circle":
				got[group].circles++
			}
		case xml.CharData:
			if group != "" && strings.TrimSpace(string(tk)) != "" {
				texts = append(texts, string(tk))
			}
		}
	}
	dr := o.Drawing()
	var want []string
	for _, l := range dr.Layers {
		c := got[l.Name]
		if c == nil || c.paths != len(l.Paths) || c.circles != len(l.Circles) {
			t.Errorf("layer %s: %+v, want %d paths, %d circles", l.Name, c, len(l.Paths), len(l.Circles))
		}
		for _, tx := range l.Texts {
			want = append(want, tx.Text)
		}
	}
	if !slices.Equal(texts, want) {
		t.Errorf("texts %q, want the DXF's %q", texts, want)
	}
	attr := map[string]string{}
	for _, a := range root.Attr {
		attr[a.Name.Local] = a.Value
	}
	mm := func(s string) float64 {
		if !strings.HasSuffix(s, "mm") {
			t.Fatalf("size %q is not in mm", s)
		}
		v, _ := strconv.ParseFloat(strings.TrimSuffix(s, "mm"), 64)
		return v
	}
	if vb := "0 0 " + strings.TrimSuffix(attr["width"], "mm") + " " + strings.TrimSuffix(attr["height"], "mm"); attr["viewBox"] != vb {
		t.Errorf("viewBox %q, want %q", attr["viewBox"], vb)
	}
	if math.Abs(mm(attr["width"])-dr.Width) > 1e-3 || math.Abs(mm(attr["height"])-dr.Height) > 1e-3 {
		t.Errorf("size %s × %s, want %g × %g mm", attr["width"], attr["height"], dr.Width, dr.Height)
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
		if err := os.WriteFile(filepath.Join(*outlineDir, "outline.svg"), s.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		o2, err := geometry.NewOutline("placed demo", exporttest.TwoElementLayout(120), geometry.OutlineOptions{Placed: true, SkinMM: 1, ChordLine: true,
			Marks: []geometry.Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8}}})
		if err != nil {
			t.Fatal(err)
		}
		var s2 bytes.Buffer
		if err := WriteSVG(&s2, o2); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(*outlineDir, "outline-placed.svg"), s2.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}
