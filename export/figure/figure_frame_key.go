package figure

import (
	"fmt"
	"image"
	"image/color"
	imagedraw "image/draw"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/model"
)

// frameKey is the panels view's sign-convention key, drawn in the bottom
// left of the data area on a backing that keeps it readable over a body: an arrow along the freestream, the angle of
// attack with the way a positive angle moves the leading edge as mounted
// (model.AngleShort), and the axes of the as-mounted frame.
type frameKey struct {
	freestreamDeg float64 // direction of the freestream against +x, as drawn
	lines         []string
	arrow         draw.LineStyle
	sty           text.Style
	back          color.Color
}

// newFrameKey returns the key for sc: in ground effect the freestream is
// parallel to the ground and the configuration is pitched; in free air
// the configuration stays and the freestream turns (model.Layout.At).
func newFrameKey(sc *Scene, th *theme) *frameKey {
	fs := 0.0
	if !sc.Ground && sc.Layout != nil {
		_, _, fs = sc.Layout.At(sc.AlphaDeg)
	}
	return &frameKey{
		freestreamDeg: fs,
		lines: []string{
			"freestream",
			fmt.Sprintf("α %s° as mounted (%s)", trimZero(sc.AlphaDeg), model.AngleShort(sc.Inverted)),
			"x downstream, y up (away from the ground)",
		},
		arrow: lineStyle(th.accent, widthBold, nil),
		sty:   noteStyle(th, th.fg, 8, text.XLeft, text.YTop),
		back:  fade(th.bg, 0xd0),
	}
}

// trimZero formats an angle with at most two decimals.
func trimZero(x float64) string {
	return fmt.Sprintf("%.4g", math.Round(x*100)/100)
}

// box returns the key's backing in c, the data area of the panels view.
func (k *frameKey) box(c draw.Canvas) vg.Rectangle {
	pad, length, h, _, height := k.sizes()
	width := length + pad + k.sty.Width(k.lines[0])
	for _, l := range k.lines[1:] {
		width = vg.Length(math.Max(float64(width), float64(k.sty.Width(l))))
	}
	left := c.Min.X + pad
	// Above the bottom of the data area by a line, clear of the ground's label.
	top := c.Min.Y + pad + 2*h + height
	return vg.Rectangle{Min: vg.Point{X: left - pad/2, Y: top - height - pad/2}, Max: vg.Point{X: left + width + pad/2, Y: top + pad/2}}
}

// sizes returns the key's padding, arrow length, line height, height of
// the first line (the arrow's) and total height of its text.
func (k *frameKey) sizes() (pad, length, h, first, height vg.Length) {
	pad = vg.Points(6)
	length = vg.Points(28)
	h = k.sty.Height("Ag") * 1.2
	first = vg.Length(math.Max(float64(h), float64(length/2+pad/2)))
	height = first + h*vg.Length(len(k.lines)-1)
	return pad, length, h, first, height
}

// Plot draws the key (plot.Plotter).
func (k *frameKey) Plot(c draw.Canvas, _ *plot.Plot) {
	pad, length, h, first, _ := k.sizes()
	box := k.box(c)
	left, top := box.Min.X+pad/2, box.Max.Y-pad/2
	c.SetColor(k.back)
	c.Fill(box.Path())
	// The arrow, centred on its box so a turned freestream stays inside.
	mid := vg.Point{X: left + length/2, Y: top - length/4}
	s, co := math.Sincos(k.freestreamDeg * math.Pi / 180)
	d := vg.Point{X: vg.Length(co) * length / 2, Y: vg.Length(s) * length / 2}
	tail, head := mid.Sub(d), mid.Add(d)
	c.StrokeLine2(k.arrow, tail.X, tail.Y, head.X, head.Y)
	// Arrow head: two strokes 25° off the shaft.
	for _, turn := range []float64{25, -25} {
		a := (k.freestreamDeg + 180 + turn) * math.Pi / 180
		hs, hc := math.Sincos(a)
		tip := vg.Point{X: head.X + vg.Length(hc)*vg.Points(6), Y: head.Y + vg.Length(hs)*vg.Points(6)}
		c.StrokeLine2(k.arrow, head.X, head.Y, tip.X, tip.Y)
	}
	y := top
	c.FillText(k.sty, vg.Point{X: left + length + pad, Y: y}, k.lines[0])
	y -= first
	for _, l := range k.lines[1:] {
		c.FillText(k.sty, vg.Point{X: left, Y: y}, l)
		y -= h
	}
}

// FrameKeyFits reports whether DrawFrameKey can lay its key over f: a
// panels figure with a data area (a view too small to have one, or a
// figure of tiles, has none).
func FrameKeyFits(f *Figure) bool {
	return f != nil && !f.composite && f.x1 > f.x0 && f.y1 > f.y0 && f.dpi > 0
}

// DrawFrameKey lays the panels view's sign-convention key for sc over f,
// a panels figure rendered with sc.OmitFrameKey, where the view would
// have drawn it. The key is drawn on a small image of its own, aligned to
// f's pixels, and composited over f.Image: the cost of a key, not of a
// figure. It panics if f has no data area.
func DrawFrameKey(f *Figure, sc *Scene) {
	if !FrameKeyFits(f) {
		panic("figure: DrawFrameKey needs a panels figure")
	}
	k := newFrameKey(sc, themeFor(sc.Dark))
	// Pixels to vg lengths (points, y up from the bottom of f.Image).
	perPx := vg.Length(72 / f.dpi)
	hPx := float64(f.Image.Bounds().Dy())
	data := vg.Rectangle{
		Min: vg.Point{X: vg.Length(f.x0) * perPx, Y: vg.Length(hPx-f.y1) * perPx},
		Max: vg.Point{X: vg.Length(f.x1) * perPx, Y: vg.Length(hPx-f.y0) * perPx},
	}
	box := k.box(draw.Canvas{Rectangle: data})
	// The small image covers the box and a pixel more, whole pixels of f.
	const margin = 1
	x0 := int(math.Floor(float64(box.Min.X/perPx))) - margin
	x1 := int(math.Ceil(float64(box.Max.X/perPx))) + margin
	yb := int(math.Floor(float64(box.Min.Y/perPx))) - margin // from the bottom
	yt := int(math.Ceil(float64(box.Max.Y/perPx))) + margin
	small := image.NewRGBA(image.Rect(0, 0, x1-x0, yt-yb))
	cv := imageCanvas(small, f.dpi)
	clear(small.Pix) // transparent, not the canvas's white
	// The data area shifted so that the small image's corner is (x0, yb) of f.
	shift := vg.Point{X: vg.Length(x0) * perPx, Y: vg.Length(yb) * perPx}
	k.Plot(draw.Canvas{Canvas: cv, Rectangle: vg.Rectangle{Min: data.Min.Sub(shift), Max: data.Max.Sub(shift)}}, nil)
	at := image.Rect(x0, int(hPx)-yt, x1, int(hPx)-yb)
	imagedraw.Draw(f.Image, at, small, image.Point{}, imagedraw.Over)
}
