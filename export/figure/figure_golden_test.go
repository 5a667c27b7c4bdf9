package figure

import (
	"bytes"
	"encoding/xml"
	"flag"
	"fmt"
	"image"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/export/exporttest"
)

// Golden images: the main views of the synthetic scene (synthScene, invented
// data) rendered at a fixed size and dpi and compared with the PNGs in
// testdata/golden/figure at the repository root. After a deliberate change
// to the figures, rewrite them with
//
//	go test ./export/figure -run Golden -update
//
// and look at the new PNGs before committing them.

var update = flag.Bool("update", false, "rewrite the golden images in testdata/golden/figure")

// The golden render size: small enough to keep the PNGs light, large
// enough that every label is drawn at its normal size.
const (
	goldenWidth  = 560
	goldenHeight = 400
	goldenDPI    = 96
)

// The comparison tolerance. A pixel counts as different only when its
// colour is more than goldenChannel (of 255) away in some channel from
// every pixel of the other image within goldenReach pixels, both ways
// round. Text and lines rasterised on another machine (another CPU's
// floating point, another Go version's rasteriser) move their anti-aliased
// edges by a fraction of a pixel, which the one-pixel reach and the
// channel slack absorb; a curve moved by two pixels or more, or an element
// that is missing, leaves whole runs of pixels with no match near them.
// goldenFraction bounds the share of such pixels, so that a stray glyph
// pixel does not fail the test but a moved or missing curve does
// (TestGoldenCompareCatches measures both).
const (
	goldenChannel  = 48
	goldenReach    = 1
	goldenFraction = 0.0005 // 0.05 %: about 110 pixels of 560 × 400
)

// goldenViews are the views pinned by golden images: every view of the
// synthetic scene, then the pressure and polar views with a coupled
// viscous solution, the drag polar with a coupled sweep and the boundary
// layer from the coupled stations (each file
// named after the view, "-coupled" for the second set).
var goldenViews = []View{ViewPanels, ViewPressure, ViewPolar, ViewStreamlines, ViewBoundaryLayer, ViewDragPolar, ViewLiftToDrag, ViewDensity}

// goldenCoupledViews are drawn from synthCoupledScene.
var goldenCoupledViews = []View{ViewPressure, ViewPolar, ViewDragPolar, ViewBoundaryLayer}

// goldenSet is a scene and the views of it pinned by golden files, named
// after the view with suffix.
type goldenSet struct {
	suffix string
	scene  *Scene
	views  []View
}

func goldenSets() []goldenSet {
	return []goldenSet{
		{"", synthScene(), goldenViews},
		{"-coupled", synthCoupledScene(), goldenCoupledViews},
	}
}

func TestFiguresGolden(t *testing.T) {
	for _, set := range goldenSets() {
		for _, v := range set.views {
			name := v.String() + set.suffix
			t.Run(name, func(t *testing.T) {
				f, err := Render(v, set.scene, goldenWidth, goldenHeight, goldenDPI)
				if err != nil {
					t.Fatal(err)
				}
				goldenImage(t, name+".png", f.Image)
			})
		}
	}
}

// TestFiguresGoldenText pins every text the golden views draw (title,
// axis labels, tick labels, key entries, annotations), in drawing order,
// as their SVG rendering holds it: testdata/golden/figure/texts.txt, one
// block per view. The image comparison's tolerance lets a changed digit
// through (the pressure title's Cl 0.5702 → 0.5703 changes 6 unmatched
// pixels, under the limit of about 110); this catches it. -update rewrites
// the file with the images.
func TestFiguresGoldenText(t *testing.T) {
	var b strings.Builder
	for _, set := range goldenSets() {
		for _, v := range set.views {
			var svg bytes.Buffer
			if err := WriteFigure(&svg, v, set.scene, "svg", float64(goldenWidth)/goldenDPI, float64(goldenHeight)/goldenDPI, goldenDPI); err != nil {
				t.Fatalf("%v%s: %v", v, set.suffix, err)
			}
			texts, err := svgTexts(svg.Bytes())
			if err != nil {
				t.Fatalf("%v%s: %v", v, set.suffix, err)
			}
			fmt.Fprintf(&b, "== %v%s\n%s\n", v, set.suffix, strings.Join(texts, "\n"))
		}
	}
	exporttest.GoldenText(t, filepath.Join("..", "..", "testdata", "golden", "figure", "texts.txt"), []byte(b.String()), *update,
		"go test ./export/figure -run Golden -update")
}

// svgTexts returns the character data of the <text> elements of an SVG
// document, in document order.
func svgTexts(svg []byte) ([]string, error) {
	d := xml.NewDecoder(bytes.NewReader(svg))
	var out []string
	in := 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return nil, err
		}
		switch tk := tok.(type) {
		case xml.StartElement:
			if tk.Name.Local == "text" {
				in++
				out = append(out, "")
			}
		case xml.EndElement:
			if tk.Name.Local == "text" {
				in--
			}
		case xml.CharData:
			if in > 0 {
				out[len(out)-1] += string(tk)
			}
		}
	}
}

// TestFiguresGoldenMore pins what the view tests only smoke-test (a count
// of colours): the dark theme (the pressure view), the density window's
// leading-edge Cp (three panel counts of the synthetic solution, flap
// shown) and its panel-size chart (the synthetic flap at 60 panels).
func TestFiguresGoldenMore(t *testing.T) {
	dark := synthScene()
	dark.Dark = true
	var curves []DensityCurve
	for _, n := range []int{40, 80, 160} {
		curves = append(curves, DensityCurve{Panels: n, Nose: 0.5, Solution: exporttest.Solution(exporttest.TwoElementLayout(n), 4)})
	}
	ps, err := PanelSizesOf(exporttest.TwoElementLayout(60))
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name   string
		render func() (*Figure, error)
	}{
		{"pressure-dark", func() (*Figure, error) { return Render(ViewPressure, dark, goldenWidth, goldenHeight, goldenDPI) }},
		{"density-leading-edge", func() (*Figure, error) {
			p, err := DensityLEPlot(curves, 1, DensityLEChord, false)
			if err != nil {
				return nil, err
			}
			return RenderPlot(p, false, goldenWidth, goldenHeight, goldenDPI), nil
		}},
		{"panel-sizes", func() (*Figure, error) {
			p, err := PanelSizesPlot(ps[1], DefaultMaxNeighbourRatio, false)
			if err != nil {
				return nil, err
			}
			return RenderPlot(p, true, goldenWidth, goldenHeight, goldenDPI), nil
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, err := tc.render()
			if err != nil {
				t.Fatal(err)
			}
			goldenImage(t, tc.name+".png", f.Image)
		})
	}
}

// goldenImage compares got with the golden PNG name, or rewrites it with
// -update.
func goldenImage(t *testing.T, name string, got image.Image) {
	t.Helper()
	path := filepath.Join("..", "..", "testdata", "golden", "figure", name)
	if *update {
		var b bytes.Buffer
		if err := png.Encode(&b, got); err != nil {
			t.Fatal(err)
		}
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	r, err := os.Open(path)
	if err != nil {
		t.Fatalf("%v (run go test ./export/figure -run Golden -update to create it)", err)
	}
	defer r.Close()
	want, err := png.Decode(r)
	if err != nil {
		t.Fatalf("golden image %s: %v", path, err)
	}
	if err := compareImages(got, want); err != nil {
		out := filepath.Join(t.TempDir(), name)
		var b bytes.Buffer
		if png.Encode(&b, got) == nil && os.WriteFile(out, b.Bytes(), 0o644) == nil {
			t.Errorf("%s: %v; the new rendering is %s (run with -update if the change is deliberate)", name, err, out)
		} else {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// compareImages reports an error when got and want differ by more than the
// golden tolerance (see goldenChannel).
func compareImages(got, want image.Image) error {
	if got.Bounds().Size() != want.Bounds().Size() {
		return fmt.Errorf("size %v, golden %v", got.Bounds().Size(), want.Bounds().Size())
	}
	n, total := differingPixels(got, want)
	if frac := float64(n) / float64(total); frac > goldenFraction {
		return fmt.Errorf("%d of %d pixels differ (%.3f %%, tolerance %.3f %%)", n, total, 100*frac, 100*goldenFraction)
	}
	return nil
}

// differingPixels counts the pixels of a or b with no match in the other
// within goldenReach pixels and goldenChannel per channel, and returns the
// count and the number of pixels of one image.
func differingPixels(a, b image.Image) (n, total int) {
	ra, rb := toRGBA(a), toRGBA(b)
	w, h := ra.Bounds().Dx(), ra.Bounds().Dy()
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			if !matchNear(ra, rb, x, y) || !matchNear(rb, ra, x, y) {
				n++
			}
		}
	}
	return n, w * h
}

// matchNear reports whether pixel (x, y) of a matches some pixel of b
// within goldenReach pixels.
func matchNear(a, b *image.RGBA, x, y int) bool {
	pa := a.PixOffset(x, y)
	w, h := b.Bounds().Dx(), b.Bounds().Dy()
	for dy := -goldenReach; dy <= goldenReach; dy++ {
		for dx := -goldenReach; dx <= goldenReach; dx++ {
			qx, qy := x+dx, y+dy
			if qx < 0 || qy < 0 || qx >= w || qy >= h {
				continue
			}
			pb := b.PixOffset(qx, qy)
			ok := true
			for c := 0; c < 4; c++ {
				d := int(a.Pix[pa+c]) - int(b.Pix[pb+c])
				if d > goldenChannel || d < -goldenChannel {
					ok = false
					break
				}
			}
			if ok {
				return true
			}
		}
	}
	return false
}

// toRGBA copies m into an RGBA image whose bounds start at the origin.
func toRGBA(m image.Image) *image.RGBA {
	b := m.Bounds()
	out := image.NewRGBA(image.Rect(0, 0, b.Dx(), b.Dy()))
	for y := 0; y < b.Dy(); y++ {
		for x := 0; x < b.Dx(); x++ {
			out.Set(x, y, m.At(b.Min.X+x, b.Min.Y+y))
		}
	}
	return out
}

// shifted returns m moved right by dx and down by dy pixels, the uncovered
// edge filled with white.
func shifted(m *image.RGBA, dx, dy int) *image.RGBA {
	b := m.Bounds()
	out := image.NewRGBA(b)
	for i := range out.Pix {
		out.Pix[i] = 0xff
	}
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			if p := image.Pt(x+dx, y+dy); p.In(b) {
				out.SetRGBA(p.X, p.Y, m.RGBAAt(x, y))
			}
		}
	}
	return out
}

// TestGoldenCompareCatches checks the tolerance both ways: the same figure
// passes, and so does one moved by a single pixel (a sub-pixel difference
// of rasterisation rounds to at most that); a figure moved by two pixels or
// missing its comparison curve fails.
func TestGoldenCompareCatches(t *testing.T) {
	sc := synthScene()
	ref, err := Render(ViewPressure, sc, goldenWidth, goldenHeight, goldenDPI)
	if err != nil {
		t.Fatal(err)
	}
	noPins := *sc
	noPins.Pins = nil
	bare, err := Render(ViewPressure, &noPins, goldenWidth, goldenHeight, goldenDPI)
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name string
		got  image.Image
		pass bool
	}{
		{"same figure", ref.Image, true},
		{"moved one pixel right", shifted(ref.Image, 1, 0), true},
		{"moved two pixels right", shifted(ref.Image, 2, 0), false},
		{"moved two pixels down", shifted(ref.Image, 0, 2), false},
		{"pinned curve missing", bare.Image, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			n, total := differingPixels(c.got, ref.Image)
			t.Logf("%d of %d pixels differ (%.3f %%)", n, total, 100*float64(n)/float64(total))
			if err := compareImages(c.got, ref.Image); (err == nil) != c.pass {
				t.Errorf("passes = %v, want %v (%v)", err == nil, c.pass, err)
			}
		})
	}
}
