package figure

import (
	"bytes"
	"errors"
	"image/png"
	"testing"

	"sectionbench/model"
)

// TestWritePlot writes a panel-size plot in each format: the PNG has the
// asked size in pixels, SVG and PDF their signatures, and an unknown
// format wraps ErrFormat.
func TestWritePlot(t *testing.T) {
	nodes := []model.Point{{X: 1, Y: 0}, {X: 0.5, Y: 0.1}, {X: 0, Y: 0}, {X: 0.5, Y: -0.1}, {X: 1, Y: 0}}
	ps, err := PanelSizesOf(&model.Layout{Elements: []model.PlacedElement{{Name: "rhombus", Nodes: nodes, LE: 2, Chord: 1}}})
	if err != nil {
		t.Fatal(err)
	}
	p, err := PanelSizesPlot(ps[0], DefaultMaxNeighbourRatio, false)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		format string
		prefix string
	}{{"png", "\x89PNG"}, {"svg", "<?xml"}, {"PDF", "%PDF-"}} {
		var b bytes.Buffer
		if err := WritePlot(&b, p, c.format, 3, 2, 100); err != nil {
			t.Fatalf("%s: %v", c.format, err)
		}
		if !bytes.HasPrefix(b.Bytes(), []byte(c.prefix)) {
			t.Errorf("%s starts %q", c.format, b.Bytes()[:min(8, b.Len())])
		}
		if c.format == "png" {
			img, err := png.Decode(&b)
			if err != nil {
				t.Fatal(err)
			}
			if got := img.Bounds().Size(); got.X != 300 || got.Y != 200 {
				t.Errorf("PNG is %v px, want 300×200 (3 × 2 in at 100 dpi)", got)
			}
		}
	}
	if err := WritePlot(new(bytes.Buffer), p, "bmp", 3, 2, 100); !errors.Is(err, ErrFormat) {
		t.Errorf("bmp: error %v, want ErrFormat", err)
	}
}
