package figure

import (
	"bytes"
	"encoding/xml"
	"errors"
	"flag"
	"fmt"
	"image"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"sectionbench/export/exporttest"
	"sync"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
)

// distinctColours counts the distinct colours in the rectangle r of img,
// up to limit.
func distinctColours(img *image.RGBA, r image.Rectangle, limit int) int {
	seen := map[[4]uint8]bool{}
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			i := img.PixOffset(x, y)
			seen[[4]uint8{img.Pix[i], img.Pix[i+1], img.Pix[i+2], img.Pix[i+3]}] = true
			if len(seen) >= limit {
				return len(seen)
			}
		}
	}
	return len(seen)
}

func TestRenderViews(t *testing.T) {
	for _, dark := range []bool{false, true} {
		sc := synthScene()
		sc.Dark = dark
		for _, v := range Views {
			f, err := Render(v, sc, 600, 400, 96)
			if err != nil {
				t.Errorf("%v dark=%v: %v", v, dark, err)
				continue
			}
			if f.Image.Bounds() != image.Rect(0, 0, 600, 400) {
				t.Errorf("%v: image bounds %v", v, f.Image.Bounds())
			}
			if !f.Plot.In(f.Image.Bounds()) || f.Plot.Dx() < 300 || f.Plot.Dy() < 180 {
				t.Errorf("%v: data area %v is not a sensible part of the image", v, f.Plot)
			}
			if n := distinctColours(f.Image, f.Plot, 8); n < 8 {
				t.Errorf("%v: only %d colours in the data area", v, n)
			}
			// Dark theme: the corner pixel is the background.
			c := f.Image.RGBAAt(1, 1)
			if isDark := c.R < 0x60; isDark != dark {
				t.Errorf("%v dark=%v: corner colour %v", v, dark, c)
			}
		}
	}
}

// TestFigureTransform checks DataAt and PixelAt against each other and the
// data ranges at the edges of the data area.
func TestFigureTransform(t *testing.T) {
	sc := synthScene()
	for _, c := range []struct {
		view  View
		ydown bool
	}{
		{ViewPanels, false},
		{ViewPressure, true},
		{ViewPolar, false},
	} {
		f, err := Render(c.view, sc, 640, 480, 96)
		if err != nil {
			t.Fatal(err)
		}
		if f.YDown != c.ydown {
			t.Errorf("%v: YDown = %v, want %v", c.view, f.YDown, c.ydown)
		}
		// Round trip through the pixel centre: within half a pixel.
		for _, px := range [][2]int{{f.Plot.Min.X + 3, f.Plot.Min.Y + 5}, {f.Plot.Max.X - 4, f.Plot.Max.Y - 2}, {(f.Plot.Min.X + f.Plot.Max.X) / 2, (f.Plot.Min.Y + f.Plot.Max.Y) / 2}} {
			x, y, ok := f.DataAt(px[0], px[1])
			if !ok {
				t.Fatalf("%v: DataAt%v outside", c.view, px)
			}
			gx, gy := f.PixelAt(x, y)
			if math.Abs(gx-float64(px[0])) > 1e-6 || math.Abs(gy-float64(px[1])) > 1e-6 {
				t.Errorf("%v: pixel %v → (%g, %g) → (%g, %g)", c.view, px, x, y, gx, gy)
			}
		}
		// The top-left pixel of the data area is near (X[0], Y[1]), or
		// (X[0], Y[0]) when y grows downwards.
		x, y, _ := f.DataAt(f.Plot.Min.X, f.Plot.Min.Y)
		wantY := f.Y[1]
		if f.YDown {
			wantY = f.Y[0]
		}
		tolX := 1.5 * (f.X[1] - f.X[0]) / float64(f.Plot.Dx())
		tolY := 1.5 * (f.Y[1] - f.Y[0]) / float64(f.Plot.Dy())
		if math.Abs(x-f.X[0]) > tolX || math.Abs(y-wantY) > tolY {
			t.Errorf("%v: top-left data (%g, %g), want (%g, %g)", c.view, x, y, f.X[0], wantY)
		}
		if _, _, ok := f.DataAt(f.Plot.Min.X-5, f.Plot.Min.Y); ok {
			t.Errorf("%v: DataAt left of the data area reported ok", c.view)
		}
	}
}

// TestEqualAspect checks that a millimetre is as long across as up in the
// panels and streamlines views, at several image shapes and windows.
func TestEqualAspect(t *testing.T) {
	sc := synthScene()
	for _, c := range []struct {
		name string
		view View
		w, h int
		win  Window
	}{
		{"panels wide", ViewPanels, 800, 300, Window{}},
		{"panels tall", ViewPanels, 300, 600, Window{}},
		{"streamlines", ViewStreamlines, 600, 400, Window{}},
		{"nose close-up", ViewPanels, 600, 400, LEWindow(sc.Layout, 0, 20)},
	} {
		sc.Window = c.win
		f, err := Render(c.view, sc, c.w, c.h, 96)
		if err != nil {
			t.Fatal(err)
		}
		sx := (f.X[1] - f.X[0]) / (f.x1 - f.x0)
		sy := (f.Y[1] - f.Y[0]) / (f.y1 - f.y0)
		if math.Abs(sx/sy-1) > 0.01 {
			t.Errorf("%s: mm per pixel %g across, %g up", c.name, sx, sy)
		}
		if !c.win.IsZero() && (f.X[0] > c.win.XMin+1e-9 || f.X[1] < c.win.XMax-1e-9 || f.Y[0] > c.win.YMin+1e-9 || f.Y[1] < c.win.YMax-1e-9) {
			t.Errorf("%s: shown %v %v does not hold the window %+v", c.name, f.X, f.Y, c.win)
		}
	}
}

// TestPressureNegativeUp checks the trade's convention: the suction peak is
// drawn above the stagnation point (common practice).
func TestPressureNegativeUp(t *testing.T) {
	sc := synthScene()
	sc.Element = 0
	f, err := Render(ViewPressure, sc, 600, 400, 96)
	if err != nil {
		t.Fatal(err)
	}
	es := sc.Solution.Elements[0]
	_, yPeak := f.PixelAt(es.XCpMin, es.CpMin)
	_, yStag := f.PixelAt(0, 1)
	if !(yPeak < yStag) {
		t.Errorf("suction peak at pixel row %g is not above the stagnation point at row %g", yPeak, yStag)
	}
	if !(f.Y[0] <= es.CpMin && f.Y[1] >= 1) {
		t.Errorf("Cp range %v does not hold %g..1", f.Y, es.CpMin)
	}
}

func TestLEWindow(t *testing.T) {
	l := exporttest.TwoElementLayout(80)
	for i, e := range l.Elements {
		w := LEWindow(l, i, 30)
		if math.Abs(w.XMax-w.XMin-30) > 1e-9 || math.Abs(w.YMax-w.YMin-30) > 1e-9 {
			t.Errorf("element %d: window %+v is not 30 mm square", i, w)
		}
		le := e.LeadingEdge.Scale(mmPerM)
		if !(le.X > w.XMin && le.X < w.XMax && le.Y > w.YMin && le.Y < w.YMax) {
			t.Errorf("element %d: leading edge %v outside %+v", i, le, w)
		}
		// The nose sits a quarter of the side upstream of the centre along
		// the chord.
		c := [2]float64{(w.XMin + w.XMax) / 2, (w.YMin + w.YMax) / 2}
		if d := math.Hypot(c[0]-le.X, c[1]-le.Y); math.Abs(d-7.5) > 1e-9 {
			t.Errorf("element %d: centre %.3f mm from the nose, want 7.5", i, d)
		}
	}
}

func TestViewErrors(t *testing.T) {
	full := synthScene()
	for _, c := range []struct {
		name   string
		view   View
		sc     *Scene
		noData bool
	}{
		{"panels without layout", ViewPanels, &Scene{}, true},
		{"pressure without solution", ViewPressure, &Scene{Layout: full.Layout}, true},
		{"polar without sweep", ViewPolar, &Scene{Solution: full.Solution}, true},
		{"drag polar without drag", ViewDragPolar, &Scene{Sweep: full.Sweep}, true},
		{"lift-to-drag without drag", ViewLiftToDrag, &Scene{Sweep: full.Sweep}, true},
		{"boundary layer without result", ViewBoundaryLayer, &Scene{}, true},
		{"density without study", ViewDensity, &Scene{}, true},
		{"element out of range", ViewPressure, &Scene{Solution: full.Solution, Element: 2}, false},
	} {
		_, err := PlotView(c.view, c.sc)
		var ve *ViewError
		if !errors.As(err, &ve) || ve.View != c.view {
			t.Errorf("%s: error %v is not a *ViewError for %v", c.name, err, c.view)
			continue
		}
		if errors.Is(err, ErrNoData) != c.noData {
			t.Errorf("%s: errors.Is(err, ErrNoData) = %v", c.name, !c.noData)
		}
	}
}

func TestWriteFigure(t *testing.T) {
	sc := synthScene()
	for _, format := range []string{FormatPNG, FormatSVG, FormatPDF} {
		var b bytes.Buffer
		if err := WriteFigure(&b, ViewPressure, sc, format, 6, 4, 100); err != nil {
			t.Fatalf("%s: %v", format, err)
		}
		switch format {
		case FormatPNG:
			img, err := png.Decode(&b)
			if err != nil {
				t.Fatal(err)
			}
			if img.Bounds().Dx() != 600 || img.Bounds().Dy() != 400 {
				t.Errorf("png is %v, want 600×400", img.Bounds())
			}
		case FormatSVG:
			d := xml.NewDecoder(&b)
			for {
				_, err := d.Token()
				if err == io.EOF {
					break
				}
				if err != nil {
					t.Fatalf("svg is not well-formed: %v", err)
				}
			}
		case FormatPDF:
			if !bytes.HasPrefix(b.Bytes(), []byte("%PDF-")) {
				t.Errorf("pdf starts %q", b.Bytes()[:8])
			}
		}
	}
	if err := WriteFigure(io.Discard, ViewPolar, sc, "bmp", 6, 4, 100); !errors.Is(err, ErrFormat) {
		t.Errorf("bmp: error %v does not wrap ErrFormat", err)
	}
}

// TestTwinAxisMap checks the Cm axis's linear map onto the Cl axis: its
// ends map to the ends of the left axis, and it is affine.
func TestTwinAxisMap(t *testing.T) {
	p := plot.New()
	p.Y.Min, p.Y.Max = -0.5, 1.5
	tw := &twinAxis{min: -0.2, max: 0.1}
	for _, c := range []struct{ v, want float64 }{{-0.2, -0.5}, {0.1, 1.5}, {-0.05, 0.5}} {
		if got := tw.toLeft(p, c.v); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("toLeft(%g) = %g, want %g", c.v, got, c.want)
		}
	}
}

// figureDir, when set, makes TestWriteFigureFiles write every view of the
// synthetic scene as PNG there, for looking at.
var figureDir = flag.String("figures", "", "write the synthetic scene's figures as PNG to this directory")

func TestWriteFigureFiles(t *testing.T) {
	if *figureDir == "" {
		t.Skip("no -figures directory")
	}
	for _, dark := range []bool{false, true} {
		sc := synthScene()
		sc.Dark = dark
		sc.SpeedColour = dark
		for _, v := range Views {
			var b bytes.Buffer
			err := WriteFigure(&b, v, sc, FormatPNG, 6.25, 4.17, 96)
			if errors.Is(err, ErrNoData) {
				continue
			}
			if err != nil {
				t.Fatal(err)
			}
			name := v.String()
			if dark {
				name += "-dark"
			}
			if err := os.WriteFile(filepath.Join(*figureDir, name+".png"), b.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
		}
		sc.Window = LEWindow(sc.Layout, 0, 25)
		var b bytes.Buffer
		if err := WriteFigure(&b, ViewPanels, sc, FormatPNG, 6.25, 4.17, 96); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(*figureDir, fmt.Sprintf("nose-dark%v.png", dark)), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// TestRenderConcurrent renders views from several goroutines at once, as
// the desktop app does off its UI thread; run with -race to check that
// the figures share no mutable state.
func TestRenderConcurrent(t *testing.T) {
	sc := synthScene()
	var wg sync.WaitGroup
	errs := make(chan error, 8)
	for i := range 8 {
		wg.Add(1)
		go func(v View) {
			defer wg.Done()
			s := *sc
			s.Dark = v%2 == 0
			if _, err := Render(v, &s, 300, 200, 72); err != nil {
				errs <- err
			}
		}(Views[i%4])
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		t.Error(err)
	}
}

// TestNiceTicks: major ticks at a 1, 2 or 5 × 10^k step inside the range,
// labelled with the decimals the step needs and a true minus sign.
func TestNiceTicks(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		labels []string
	}{
		{0, 1, []string{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}},
		{-25, 5, []string{"\u221225", "\u221220", "\u221215", "\u221210", "\u22125", "0", "5"}},
		{-0.07, -0.04, []string{"\u22120.070", "\u22120.065", "\u22120.060", "\u22120.055", "\u22120.050", "\u22120.045", "\u22120.040"}},
		{40, 360, []string{"50", "100", "150", "200", "250", "300", "350"}},
	} {
		var got []string
		for _, tk := range (niceTicks{}).Ticks(c.lo, c.hi) {
			if tk.Label != "" {
				got = append(got, tk.Label)
			}
			if tk.Value < c.lo-1e-9 || tk.Value > c.hi+1e-9 {
				t.Errorf("[%g, %g]: tick %g outside", c.lo, c.hi, tk.Value)
			}
		}
		if fmt.Sprint(got) != fmt.Sprint(c.labels) {
			t.Errorf("[%g, %g]: labels %q, want %q", c.lo, c.hi, got, c.labels)
		}
	}
}

// TestSmoothPath: the Catmull–Rom curve passes through every traced point
// and leaves no piece longer than smoothSegment (but for the 64-piece cap).
func TestSmoothPath(t *testing.T) {
	pts := []vg.Point{{X: 0, Y: 0}, {X: 30, Y: 10}, {X: 60, Y: 0}, {X: 61, Y: 0}, {X: 100, Y: 40}}
	out := smoothPath(pts, 0, len(pts)-1)
	k := 0
	for _, q := range out {
		if k < len(pts) && q == pts[k] {
			k++
		}
	}
	if k != len(pts) {
		t.Errorf("passes through %d of %d points", k, len(pts))
	}
	for i := 0; i+1 < len(out); i++ {
		if d := math.Hypot(float64(out[i+1].X-out[i].X), float64(out[i+1].Y-out[i].Y)); d > 2*float64(smoothSegment) {
			t.Errorf("piece %d is %.2f pt long", i, d)
		}
	}
}

// TestPinAbscissa: on the configuration abscissa a pin's x/c = 0 and 1
// land on the element's leading and trailing edge.
func TestPinAbscissa(t *testing.T) {
	sc := synthScene()
	ab := cpAbscissa{x0: -0.01, cref: 0.35}
	for i, e := range sc.Layout.Elements {
		for _, c := range []struct {
			xc float64
			x  float64
		}{{0, e.Nodes[e.LE].X}, {1, (e.Nodes[0].X + e.Nodes[len(e.Nodes)-1].X) / 2}} {
			got, ok := ab.pinX(sc, i, c.xc)
			if want := (c.x - ab.x0) / ab.cref; !ok || math.Abs(got-want) > 1e-12 {
				t.Errorf("element %d x/c %g: %g, want %g", i, c.xc, got, want)
			}
		}
	}
}
