package figure

import (
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// theme is the figures' restrained engineering look: dark ink on white
// (or light ink on a dark grey), one cool and one warm hue to tell the two
// surfaces apart, and muted greys for everything that is context.
type theme struct {
	bg, fg, grid, faint color.Color
	upper, lower        color.Color // upper and lower surface
	body, bodyFill      color.Color // section outline and fill
	node, control       color.Color // panel nodes and control points
	stream, dividing    color.Color // streamlines
	ground              color.Color
	accent              color.Color // current-state markers
	second              color.Color // a second quantity on a twin axis
	pins                []color.Color
}

func rgb(r, g, b uint8) color.RGBA { return color.RGBA{R: r, G: g, B: b, A: 255} }

func fade(c color.Color, alpha uint8) color.Color {
	r, g, b, _ := c.RGBA()
	f := float64(alpha) / 255
	return color.NRGBA{R: uint8(r >> 8), G: uint8(g >> 8), B: uint8(b >> 8), A: uint8(math.Round(f * 255))}
}

var (
	lightTheme = theme{
		bg: color.White, fg: rgb(0x22, 0x26, 0x2b), grid: rgb(0xe4, 0xe7, 0xeb), faint: rgb(0x8a, 0x92, 0x9b),
		upper: rgb(0x1d, 0x4f, 0x91), lower: rgb(0xb0, 0x4a, 0x1c),
		body: rgb(0x22, 0x26, 0x2b), bodyFill: rgb(0xc9, 0xcf, 0xd6),
		node: rgb(0x1d, 0x4f, 0x91), control: rgb(0xb0, 0x4a, 0x1c),
		stream: rgb(0x5a, 0x7d, 0xa8), dividing: rgb(0xb0, 0x1c, 0x3a),
		ground: rgb(0x4a, 0x4f, 0x55), accent: rgb(0xb0, 0x1c, 0x3a), second: rgb(0x3b, 0x7a, 0x4a),
		pins: []color.Color{rgb(0x6b, 0x5b, 0x95), rgb(0x3b, 0x7a, 0x4a), rgb(0x8c, 0x6d, 0x1f), rgb(0x4a, 0x4f, 0x55)},
	}
	darkTheme = theme{
		bg: rgb(0x1c, 0x1f, 0x23), fg: rgb(0xd9, 0xdd, 0xe2), grid: rgb(0x33, 0x38, 0x3e), faint: rgb(0x86, 0x8e, 0x97),
		upper: rgb(0x7d, 0xae, 0xe8), lower: rgb(0xee, 0x9a, 0x6a),
		body: rgb(0xd9, 0xdd, 0xe2), bodyFill: rgb(0x4a, 0x51, 0x59),
		node: rgb(0x7d, 0xae, 0xe8), control: rgb(0xee, 0x9a, 0x6a),
		stream: rgb(0x6f, 0x93, 0xbf), dividing: rgb(0xf0, 0x6a, 0x84),
		ground: rgb(0xa9, 0xb0, 0xb8), accent: rgb(0xf0, 0x6a, 0x84), second: rgb(0x86, 0xc7, 0x93),
		pins: []color.Color{rgb(0xb3, 0xa4, 0xe0), rgb(0x86, 0xc7, 0x93), rgb(0xd8, 0xbb, 0x6a), rgb(0xa9, 0xb0, 0xb8)},
	}
)

func themeFor(dark bool) *theme {
	if dark {
		return &darkTheme
	}
	return &lightTheme
}

func (th *theme) pin(i int) color.Color { return th.pins[i%len(th.pins)] }

// PinColour is the colour pin i is drawn in, so that a list of pins can
// show it beside each name.
func PinColour(i int, dark bool) color.Color { return themeFor(dark).pin(i) }

// pinDashes give each pin its own line style as well as its own colour, so
// that pins stay apart in grey print.
var pinDashes = [][]vg.Length{
	{vg.Points(1.5), vg.Points(2)},
	{vg.Points(6), vg.Points(2), vg.Points(1.5), vg.Points(2)},
	{vg.Points(4), vg.Points(4)},
	{vg.Points(9), vg.Points(3)},
	{vg.Points(1.5), vg.Points(2), vg.Points(1.5), vg.Points(5)},
	{vg.Points(6), vg.Points(2), vg.Points(1.5), vg.Points(2), vg.Points(1.5), vg.Points(2)},
}

// pinDash is pin i's line style.
func pinDash(i int) []vg.Length { return pinDashes[i%len(pinDashes)] }

// Line widths and glyph sizes in points.
const (
	widthThin   = vg.Length(0.6)
	widthNormal = vg.Length(1.2)
	widthBold   = vg.Length(1.8)
	glyphSmall  = vg.Length(1.3)
	glyphMarker = vg.Length(3)
)

// Dash patterns: lower surfaces dashed, pins dotted, so that a figure read
// in grey (a printed report) still tells them apart.
var (
	dashLower = []vg.Length{vg.Points(5), vg.Points(2.5)}
	dashPin   = []vg.Length{vg.Points(1.5), vg.Points(2)}
	dashRef   = []vg.Length{vg.Points(3), vg.Points(3)}
)

// figureFont is the figures' typeface: a plain sans serif.
var figureFont = font.Font{Typeface: "Liberation", Variant: "Sans"}

func textStyle(c color.Color, size float64, xa text.XAlignment, ya text.YAlignment) text.Style {
	return text.Style{
		Color:   c,
		Font:    font.From(figureFont, vg.Points(size)),
		XAlign:  xa,
		YAlign:  ya,
		Handler: plot.DefaultTextHandler,
	}
}

// newPlot returns a plot in theme th with a title, axis labels and a grid.
func newPlot(th *theme, title, xlabel, ylabel string) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = th.bg
	p.Title.Text = title
	p.Title.TextStyle = textStyle(th.fg, 11, text.XCenter, text.YTop)
	p.Title.Padding = vg.Points(6)
	p.X.Label.Text = xlabel
	p.Y.Label.Text = ylabel
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Color = th.fg
		a.Width = widthThin
		a.Label.TextStyle = textStyle(th.fg, 10, a.Label.TextStyle.XAlign, a.Label.TextStyle.YAlign)
		a.Tick.Color = th.fg
		a.Tick.Width = widthThin
		a.Tick.Length = vg.Points(5)
		a.Tick.Label = textStyle(th.fg, 9, a.Tick.Label.XAlign, a.Tick.Label.YAlign)
		a.Tick.Marker = niceTicks{}
		a.Padding = vg.Points(2)
	}
	g := plotter.NewGrid()
	g.Vertical.Color = th.grid
	g.Horizontal.Color = th.grid
	g.Vertical.Width = widthThin
	g.Horizontal.Width = widthThin
	p.Add(g)
	return p
}

func lineStyle(c color.Color, w vg.Length, dashes []vg.Length) draw.LineStyle {
	return draw.LineStyle{Color: c, Width: w, Dashes: dashes}
}

// newLine returns a line plotter through xys; xys must not be empty.
func newLine(xys plotter.XYs, sty draw.LineStyle) *plotter.Line {
	l := &plotter.Line{XYs: xys, LineStyle: sty}
	return l
}

// newScatter returns a scatter plotter of glyphs.
func newScatter(xys plotter.XYs, c color.Color, r vg.Length, shape draw.GlyphDrawer) *plotter.Scatter {
	return &plotter.Scatter{XYs: xys, GlyphStyle: draw.GlyphStyle{Color: c, Radius: r, Shape: shape}}
}

// refLine is a horizontal (or vertical) line across the whole data area at
// a data value; it does not take part in the plot's data range.
type refLine struct {
	value    float64
	vertical bool
	style    draw.LineStyle
	label    string
	labelSty text.Style
	drop     vg.Length // moves a vertical line's label down, to stack labels
}

func (r *refLine) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	var a, b vg.Point
	if r.vertical {
		x := trX(r.value)
		if x < c.Min.X || x > c.Max.X {
			return
		}
		a, b = vg.Point{X: x, Y: c.Min.Y}, vg.Point{X: x, Y: c.Max.Y}
	} else {
		y := trY(r.value)
		if y < c.Min.Y || y > c.Max.Y {
			return
		}
		a, b = vg.Point{X: c.Min.X, Y: y}, vg.Point{X: c.Max.X, Y: y}
	}
	c.StrokeLine2(r.style, a.X, a.Y, b.X, b.Y)
	if r.label != "" {
		sty := r.labelSty
		pt := vg.Point{X: c.Min.X + vg.Points(4), Y: a.Y + vg.Points(2)}
		if r.vertical {
			pt = vg.Point{X: a.X + vg.Points(3), Y: c.Max.Y - vg.Points(3) - r.drop}
			if pt.X+sty.Width(r.label) > c.Max.X { // label on the other side
				sty.XAlign = text.XRight
				pt.X = a.X - vg.Points(3)
			}
		}
		c.FillText(sty, pt, r.label)
	}
}

// note is a text label at a data point, offset in points; it is clipped to
// nothing when the point is outside the data area.
type note struct {
	x, y   float64
	dx, dy vg.Length
	text   string
	style  text.Style
}

func (n *note) Plot(c draw.Canvas, p *plot.Plot) {
	if sty, at, ok := n.place(c, p); ok {
		c.FillText(sty, at, n.text)
	}
}

// place returns where the note's text goes and in which style; ok is false
// when its point lies outside the data area.
func (n *note) place(c draw.Canvas, p *plot.Plot) (sty text.Style, at vg.Point, ok bool) {
	trX, trY := p.Transforms(&c)
	pt := vg.Point{X: trX(n.x), Y: trY(n.y)}
	if !c.Contains(pt) {
		return sty, at, false
	}
	sty = n.style
	at = pt.Add(vg.Point{X: n.dx, Y: n.dy})
	// A left-aligned label that would run off the right edge flips to the
	// other side of its point.
	if sty.XAlign == text.XLeft && at.X+sty.Width(n.text) > c.Max.X {
		sty.XAlign = text.XRight
		at.X = pt.X - n.dx
	}
	return sty, at, true
}

func noteStyle(th *theme, c color.Color, size float64, xa text.XAlignment, ya text.YAlignment) text.Style {
	return textStyle(c, size, xa, ya)
}

// legendLine returns a zero-size thumbnailer for legend entries that do not
// correspond to one plotter.
type legendLine struct{ style draw.LineStyle }

func (l legendLine) Thumbnail(c *draw.Canvas) {
	y := c.Center().Y
	c.StrokeLine2(l.style, c.Min.X, y, c.Max.X, y)
}

// padRange widens [lo, hi] by frac of its length on each side; a zero
// range becomes ±1 about its value.
func padRange(lo, hi, frac float64) (float64, float64) {
	d := hi - lo
	if !(d > 0) {
		return lo - 1, hi + 1
	}
	return lo - frac*d, hi + frac*d
}

// extent is a running bounding box.
type extent struct{ x0, x1, y0, y1 float64 }

func newExtent() extent { return extent{math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)} }

func (e *extent) add(x, y float64) {
	if math.IsNaN(x) || math.IsNaN(y) || math.IsInf(x, 0) || math.IsInf(y, 0) {
		return
	}
	e.x0, e.x1 = math.Min(e.x0, x), math.Max(e.x1, x)
	e.y0, e.y1 = math.Min(e.y0, y), math.Max(e.y1, y)
}

func (e extent) empty() bool { return e.x0 > e.x1 }

// niceTicks places major ticks at multiples of 1, 2 or 5 × 10^k, about five
// to eight across the range, with minor ticks between, and labels them with
// as many decimals as the step needs and a true minus sign.
type niceTicks struct{}

// maxTickSteps bounds the major steps Ticks walks: about eight fall in any
// range, plus one before the first; the bound only guards the loop.
const maxTickSteps = 64

// Ticks implements plot.Ticker. An empty, reversed, NaN or infinite range
// has no ticks. A range so narrow that the step is below the resolution of
// its ends (a few ulps wide: lo/step beyond 2^52, where k·step no longer
// moves with k), or so wide that the steps overflow, gets one labelled tick
// at each end instead. The loop runs
// over an integer count of steps, so it always ends.
func (niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil
	}
	const target = 6
	raw := hi/target - lo/target // no overflow for ranges near ±MaxFloat64
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	var step float64
	var minor int
	switch f := raw / mag; {
	case f < 1.5:
		step, minor = mag, 5
	case f < 3.5:
		step, minor = 2*mag, 4
	case f < 7.5:
		step, minor = 5*mag, 5
	default:
		step, minor = 10*mag, 5
	}
	first := math.Ceil(lo/step - 1e-9)
	last := math.Floor(hi/step + 1e-9)
	if !(step > 0) || math.IsInf(step, 0) || math.IsNaN(first) || math.IsNaN(last) ||
		math.Max(math.Abs(first), math.Abs(last)) > 1<<52 || last-first > maxTickSteps ||
		math.IsInf((first-1)*step, 0) || math.IsInf((last+1)*step, 0) {
		return endTicks(lo, hi)
	}
	dec := max(0, int(-math.Floor(math.Log10(step)+1e-9)))
	var ts []plot.Tick
	for i := range int(last-first) + 2 {
		v := (first - 1 + float64(i)) * step
		if v > hi+step*1e-9 {
			break
		}
		if v >= lo-step*1e-9 {
			ts = append(ts, plot.Tick{Value: v, Label: formatTick(v, dec)})
		}
		for j := 1; j < minor; j++ {
			m := v + float64(j)*step/float64(minor)
			if m >= lo && m <= hi {
				ts = append(ts, plot.Tick{Value: m})
			}
		}
	}
	return ts
}

// endTicks labels the two ends of a range too narrow (or too wide) for a
// 1, 2, 5 step, with the shortest decimals that tell them apart.
func endTicks(lo, hi float64) []plot.Tick {
	label := func(v float64) string {
		return strings.Replace(strconv.FormatFloat(v, 'g', -1, 64), "-", "\u2212", 1)
	}
	return []plot.Tick{{Value: lo, Label: label(lo)}, {Value: hi, Label: label(hi)}}
}

// formatTick formats v with dec decimals, a true minus sign and no
// negative zero.
func formatTick(v float64, dec int) string {
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(s, "-0.") == "" {
		return strings.TrimPrefix(s, "-")
	}
	return strings.Replace(s, "-", "\u2212", 1)
}

// Key corners.
const (
	keyTopRight = iota
	keyTopLeft
	keyBottomRight
	keyBottomLeft
)

// key is a legend drawn on a filled box in a corner of the data area, so
// that it stays readable over curves.
type key struct {
	entries []keyEntry
	corner  int // preferred corner
	text    text.Style
	bg      color.Color
	border  color.Color
	// avoid holds the data the key should not cover: it goes to the corner
	// whose box covers the fewest of these points, the preferred corner
	// on a tie.
	avoid []plotter.XYs
	// above puts the entries in rows in a band above the data area
	// instead, where they cannot cover data.
	above bool
	// width is the room for a row of an above key (zero: unknown, one
	// row) and height the figure's height (zero: unknown); fitKeys sets
	// them from the canvas before the plot is drawn, since GlyphBoxes,
	// which reserves the band, is not told the size.
	width, height vg.Length
}

type keyEntry struct {
	label string
	thumb plot.Thumbnailer
}

func newKey(th *theme, corner int) *key {
	return &key{corner: corner, text: textStyle(th.fg, keyTextPt, text.XLeft, text.YCenter), bg: fade(th.bg, 225), border: th.grid}
}

func (k *key) add(label string, t plot.Thumbnailer) {
	k.entries = append(k.entries, keyEntry{label, t})
}

// pinKeyPrefix begins a pin's key entry; pinKeyInviscid replaces it
// where the view also draws the viscous solution's curves.
const (
	pinKeyPrefix   = "pin: "
	pinKeyInviscid = "pin (inviscid): "
)

// pinsInviscid says in the key that the pins' curves are the panel
// method's (engine.PinOf freezes the inviscid Cp and polar): beside the
// viscous solution's curves a pin read as the same quantity, and a
// comparison of a pinned start with the viscous answer compared inviscid
// with viscous without a word.
func (k *key) pinsInviscid() {
	for i, e := range k.entries {
		if rest, ok := strings.CutPrefix(e.label, pinKeyPrefix); ok {
			k.entries[i].label = pinKeyInviscid + rest
		}
	}
}

// keep registers data the key should not cover.
func (k *key) keep(xys ...plotter.XYs) { k.avoid = append(k.avoid, xys...) }

// keyRect returns the key's box of size w × h in corner of c.
func keyRect(c draw.Canvas, corner int, w, h vg.Length) vg.Rectangle {
	var x0, y1 vg.Length
	switch corner {
	case keyTopRight:
		x0, y1 = c.Max.X-keyMargin-w, c.Max.Y-keyMargin
	case keyTopLeft:
		x0, y1 = c.Min.X+keyMargin, c.Max.Y-keyMargin
	case keyBottomRight:
		x0, y1 = c.Max.X-keyMargin-w, c.Min.Y+keyMargin+h
	default:
		x0, y1 = c.Min.X+keyMargin, c.Min.Y+keyMargin+h
	}
	// A box wider or taller than the data area starts at its left or top
	// edge rather than off it, where its symbols would be lost.
	x0 = max(x0, c.Min.X+keyMargin)
	y1 = min(y1, c.Max.Y-keyMargin)
	return vg.Rectangle{Min: vg.Point{X: x0, Y: y1 - h}, Max: vg.Point{X: x0 + w, Y: y1}}
}

// bestCorner returns the corner whose box covers the fewest avoided
// points, the preferred corner on a tie.
func (k *key) bestCorner(c draw.Canvas, p *plot.Plot, w, h vg.Length) int {
	if len(k.avoid) == 0 {
		return k.corner
	}
	// The avoided points on the canvas, sparse curves (a sweep) sampled
	// along their segments too.
	trX, trY := p.Transforms(&c)
	var pts []vg.Point
	for _, xys := range k.avoid {
		sub := 1
		if len(xys) < 100 {
			sub = 12
		}
		for i, q := range xys {
			a := vg.Point{X: trX(q.X), Y: trY(q.Y)}
			pts = append(pts, a)
			if i+1 < len(xys) && sub > 1 {
				b := vg.Point{X: trX(xys[i+1].X), Y: trY(xys[i+1].Y)}
				for j := 1; j < sub; j++ {
					f := vg.Length(j) / vg.Length(sub)
					pts = append(pts, vg.Point{X: a.X + f*(b.X-a.X), Y: a.Y + f*(b.Y-a.Y)})
				}
			}
		}
	}
	best, bestN := k.corner, -1
	for _, corner := range []int{k.corner, keyTopRight, keyTopLeft, keyBottomRight, keyBottomLeft} {
		r := keyRect(c, corner, w, h)
		n := 0
		for _, q := range pts {
			if q.X >= r.Min.X && q.X <= r.Max.X && q.Y >= r.Min.Y && q.Y <= r.Max.Y {
				n++
			}
		}
		if bestN < 0 || n < bestN {
			best, bestN = corner, n
		}
	}
	return best
}

const (
	keyThumb  = vg.Length(18)
	keyPad    = vg.Length(4)
	keyMargin = vg.Length(5)
)

// entryWidth is the width of entry e laid out in a row.
func (k *key) entryWidth(e keyEntry) vg.Length {
	return keyThumb + keyPad + k.text.Width(e.label) + 3*keyPad
}

// rows splits the entries into rows no wider than w (one row when w is
// not positive); an entry wider than w has a row of its own.
func (k *key) rows(w vg.Length) [][]keyEntry {
	var rows [][]keyEntry
	var cur []keyEntry
	used := vg.Length(0)
	for _, e := range k.entries {
		ew := k.entryWidth(e)
		if len(cur) > 0 && w > 0 && used+ew > w {
			rows, cur, used = append(rows, cur), nil, 0
		}
		cur = append(cur, e)
		used += ew
	}
	if len(cur) > 0 {
		rows = append(rows, cur)
	}
	return rows
}

// maxKeyRows is the most rows an above key takes whatever the figure's
// height; a taller figure gives it up to keyBandShare of its height.
// Beyond that the key is a box in a corner, over the data.
const maxKeyRows = 4

// keyBandShare is the largest share of a figure's height the band of an
// above key may take when it needs more than maxKeyRows rows: the data
// area keeps about half of the figure (the title and the axes take the
// rest), which a key in a box over it would cover (the polar of a
// two-element wing with its coupled sweep has eight entries).
const keyBandShare = 0.35

// keyTextPt is the size of a key's text, and keySmallPt the size an above
// key shrinks to when its rows do not fit the band at keyTextPt (a
// polar of two elements with its viscous curve has six entries, some of
// them long); the box in a corner, which covers data, is the last resort.
const (
	keyTextPt  = 8.5
	keySmallPt = 7
)

// lineHeight is the height of one row of the key.
func (k *key) lineHeight() vg.Length { return k.text.Height("Xg") * 1.25 }

// maxRows is the most rows the band above the data area may hold.
func (k *key) maxRows() int {
	n := maxKeyRows
	if k.height > 0 {
		n = max(n, int(keyBandShare*k.height/k.lineHeight()))
	}
	return n
}

// reservedRows is the number of rows the band above the data area holds:
// none when the key is a box in a corner.
func (k *key) reservedRows() int {
	if !k.above || len(k.entries) == 0 {
		return 0
	}
	if n := len(k.rows(k.width)); n <= k.maxRows() {
		return n
	}
	return 0
}

// GlyphBoxes reserves the band above the data area for a key in rows.
func (k *key) GlyphBoxes(*plot.Plot) []plot.GlyphBox {
	n := k.reservedRows()
	if n == 0 {
		return nil
	}
	h := k.lineHeight()*vg.Length(n) + keyPad
	return []plot.GlyphBox{{X: 0.5, Y: 1, Rectangle: vg.Rectangle{Min: vg.Point{X: -1}, Max: vg.Point{X: 1, Y: h}}}}
}

// keyAxesAllowance is what fitKeys takes off a canvas's width for the
// axes beside the data area (tick labels and axis titles on both sides
// of a figure with a twin axis), so that a row fits the data area.
const keyAxesAllowance = vg.Length(120)

// fitKeys tells each above key of a figure the room its rows have on
// canvas c.
// An above key whose rows do not fit at keyTextPt is set at keySmallPt
// when they fit at that size.
func fitKeys(c draw.Canvas, keys ...*key) {
	for _, k := range keys {
		k.width = max(c.Max.X-c.Min.X-keyAxesAllowance, 0)
		k.height = c.Max.Y - c.Min.Y
		if !k.above {
			continue
		}
		k.text.Font.Size = vg.Points(keyTextPt)
		if k.reservedRows() == 0 {
			k.text.Font.Size = vg.Points(keySmallPt)
			if k.reservedRows() == 0 {
				k.text.Font.Size = vg.Points(keyTextPt) // a box, at the usual size
			}
		}
	}
}

func (k *key) Plot(c draw.Canvas, p *plot.Plot) {
	if len(k.entries) == 0 {
		return
	}
	if rows := k.rows(c.Max.X - c.Min.X); k.above && len(rows) <= k.reservedRows() { // else a box in a corner
		lh := k.lineHeight()
		// The rows from the top of the band down, each centred.
		yc := c.Max.Y + keyPad/2 + lh*(vg.Length(k.reservedRows())-0.5)
		for _, row := range rows {
			rw := vg.Length(0)
			for _, e := range row {
				rw += k.entryWidth(e)
			}
			x := c.Center().X - rw/2
			for _, e := range row {
				tc := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
					Min: vg.Point{X: x, Y: yc - lh/2 + 1}, Max: vg.Point{X: x + keyThumb, Y: yc + lh/2 - 1},
				}}
				e.thumb.Thumbnail(&tc)
				c.FillText(k.text, vg.Point{X: x + keyThumb + keyPad, Y: yc}, e.label)
				x += k.entryWidth(e)
			}
			yc -= lh
		}
		return
	}
	lh := k.lineHeight()
	tw := vg.Length(0)
	for _, e := range k.entries {
		tw = max(tw, k.text.Width(e.label))
	}
	w := keyPad + keyThumb + keyPad + tw + keyPad
	h := 2*keyPad + lh*vg.Length(len(k.entries))
	r := keyRect(c, k.bestCorner(c, p, w, h), w, h)
	x0, y1 := r.Min.X, r.Max.Y
	c.SetColor(k.bg)
	c.Fill(r.Path())
	c.SetLineStyle(lineStyle(k.border, widthThin, nil))
	c.Stroke(r.Path())
	for i, e := range k.entries {
		yc := y1 - keyPad - lh*(vg.Length(i)+0.5)
		tc := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: x0 + keyPad, Y: yc - lh/2 + 1},
			Max: vg.Point{X: x0 + keyPad + keyThumb, Y: yc + lh/2 - 1},
		}}
		e.thumb.Thumbnail(&tc)
		c.FillText(k.text, vg.Point{X: x0 + 2*keyPad + keyThumb, Y: yc}, e.label)
	}
}

// alphaMark is the vertical line marking the angle of attack solved on a
// figure against α, labelled with it.
func alphaMark(th *theme, alphaDeg float64) *refLine {
	return &refLine{value: alphaDeg, vertical: true, style: lineStyle(th.accent, widthThin, dashRef),
		label: fmt.Sprintf("α = %s°", formatTick(alphaDeg, 2)), labelSty: noteStyle(th, th.accent, 8, text.XLeft, text.YTop)}
}

// minLabelPt is the smallest font a title or axis label is shrunk to.
const minLabelPt = 6

// fitLabels shrinks the title and the axis labels of p, where they are
// wider than the canvas c (less a margin), so that a figure exported small
// keeps its whole title instead of losing both ends; never below
// minLabelPt.
func fitLabels(p *plot.Plot, c draw.Canvas) {
	fit := func(sty *text.Style, s string, room vg.Length) {
		if s == "" || room <= 0 {
			return
		}
		if w := sty.Width(s); w > room {
			size := sty.Font.Size * room / w
			if size < minLabelPt {
				size = minLabelPt
			}
			sty.Font.Size = size
		}
	}
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	margin := vg.Points(8)
	fit(&p.Title.TextStyle, p.Title.Text, w-margin)
	fit(&p.X.Label.TextStyle, p.X.Label.Text, w-margin)
	fit(&p.Y.Label.TextStyle, p.Y.Label.Text, h-margin)
}

// noteSet draws notes so that none overprints another: each is placed as
// note.Plot places it and, while its box overlaps one drawn before, moved
// one line further from the data (down for notes set below their point,
// up otherwise), at most maxNoteShifts times.
type noteSet struct{ notes []*note }

const maxNoteShifts = 8

func (ns *noteSet) add(n *note) { ns.notes = append(ns.notes, n) }

func (ns *noteSet) Plot(c draw.Canvas, p *plot.Plot) {
	var placed []vg.Rectangle
	overlaps := func(r vg.Rectangle) bool {
		for _, q := range placed {
			if r.Min.X < q.Max.X && q.Min.X < r.Max.X && r.Min.Y < q.Max.Y && q.Min.Y < r.Max.Y {
				return true
			}
		}
		return false
	}
	for _, n := range ns.notes {
		sty, at, ok := n.place(c, p)
		if !ok {
			continue
		}
		box := sty.Rectangle(n.text)
		step := box.Max.Y - box.Min.Y + vg.Points(1)
		if n.dy >= 0 {
			step = -step // a note above its point moves down the page only if it must: try up first
		}
		r := box.Add(at)
		shifted := false
		for k := 0; k < maxNoteShifts && overlaps(r); k++ {
			at.Y -= step
			r = box.Add(at)
			shifted = true
		}
		if shifted && (overlaps(r) || r.Min.Y < c.Min.Y || r.Max.Y > c.Max.Y) {
			// Moved off the data area (over the axis's tick labels, in a
			// small figure) or still over another: left out rather than
			// overprinted.
			continue
		}
		placed = append(placed, r)
		c.FillText(sty, at, n.text)
	}
}
