package figure

import (
	"errors"
	"fmt"
	"image"
	"io"
	"math"
	"strings"

	"git.sr.ht/~sbinet/gg"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// View names one figure of the workbench.
type View int

// The views. The first four are the live views of the workbench.
const (
	// ViewPanels draws every element's panel nodes and control points.
	ViewPanels View = iota
	// ViewPressure draws Cp against x/c, negative up.
	ViewPressure
	// ViewStreamlines draws the sections and the streamlines about them.
	ViewStreamlines
	// ViewPolar draws Cl and Cm against the angle of attack.
	ViewPolar
	// ViewDragPolar draws Cl against Cd from the boundary-layer estimate
	// of a sweep.
	ViewDragPolar
	// ViewBoundaryLayer draws θ, δ*, H and Cf against x/c per surface.
	ViewBoundaryLayer
	// ViewLiftToDrag draws Cl/Cd against the angle of attack.
	ViewLiftToDrag
	// ViewDensity draws a density study: Cl and Cp min against the panel
	// count with their extrapolated values.
	ViewDensity
)

var viewNames = [...]string{"panels", "pressure", "streamlines", "polar", "drag-polar", "boundary-layer", "lift-to-drag", "density"}

// Views lists every view in order.
var Views = []View{ViewPanels, ViewPressure, ViewStreamlines, ViewPolar, ViewDragPolar, ViewBoundaryLayer, ViewLiftToDrag, ViewDensity}

// String returns the view's short name, as used in file names.
func (v View) String() string {
	if v < 0 || int(v) >= len(viewNames) {
		return fmt.Sprintf("View(%d)", int(v))
	}
	return viewNames[v]
}

// Window is the visible data range of the panels and streamlines views, in
// millimetres. The zero value frames the configuration automatically.
type Window struct {
	XMin, XMax, YMin, YMax float64
}

// IsZero reports whether w is the zero value (automatic framing).
func (w Window) IsZero() bool { return w == Window{} }

func (w Window) valid() bool {
	return w.XMax > w.XMin && w.YMax > w.YMin &&
		!math.IsInf(w.XMin, 0) && !math.IsInf(w.XMax, 0) && !math.IsInf(w.YMin, 0) && !math.IsInf(w.YMax, 0)
}

// Scene is everything the figures draw. Only the fields a view needs must be
// set: the panels view needs Layout or Config; the pressure view Solution;
// the streamlines view Layout or Config (and Streamlines); the polar view
// Sweep; the drag polar and lift-to-drag views Sweep and SweepViscous (or
// SweepCoupled, which they draw in preference when it is set); the
// boundary-layer view Viscous; the density view Density.
type Scene struct {
	// Layout is the placed configuration, in metres. Config, when set, is
	// the geometry as solved (rotated to the angle of attack in ground
	// effect); the panels and streamlines views draw it in preference to
	// Layout so that streamlines and bodies share a frame.
	Layout   *model.Layout
	Config   *solver.Config
	Solution *solver.Solution
	Sweep    []solver.Coefficients
	// SweepViscous is the boundary-layer estimate at each angle of Sweep;
	// nil when the sweep has none.
	SweepViscous []engine.ViscousPoint

	// Coupled is the coupled viscous solution at the study's angle (nil
	// unless it ran); the pressure view draws its Cp when it converged.
	Coupled *engine.CoupledPoint
	// SweepCoupled is the coupled solution at each angle of Sweep (nil
	// when the sweep ran without it), ClMax and AlphaClMax its maximum
	// lift among the converged rows and ClMaxIsPeak whether lift falls
	// after it (engine.Result).
	SweepCoupled      []engine.CoupledPoint
	ClMax, AlphaClMax float64
	ClMaxIsPeak       bool

	Streamlines []solver.Streamline
	Viscous     *solver.ViscousResult // may be nil
	Density     *engine.DensityResult // may be nil

	Pins        []model.Pin
	AlphaDeg    float64 // current angle of attack, marked on the polars
	Element     int     // element shown in the pressure view (-1 = all) and the boundary-layer view (-1 = the first)
	SpeedColour bool    // colour streamlines by local speed

	GroundY  float64 // ground plane height, m, in the Layout's frame
	Ground   bool
	Inverted bool

	Window Window // zoom and pan of the panels and streamlines views
	Dark   bool   // colours for a dark theme

	// OmitFrameKey leaves the panels view's sign-convention key out; the
	// caller lays it over the figure with DrawFrameKey, so that a change
	// of angle alone (which moves nothing else in free air) redraws the
	// key and not the bodies.
	OmitFrameKey bool
}

// ErrNoData is wrapped by the errors of PlotView when the scene lacks what a
// view needs.
var ErrNoData = errors.New("nothing to draw")

// ViewError reports why a view could not be built.
type ViewError struct {
	View View
	Err  error
}

func (e *ViewError) Error() string { return e.View.String() + " view: " + e.Err.Error() }

func (e *ViewError) Unwrap() error { return e.Err }

func noData(v View, what string) error {
	return &ViewError{View: v, Err: fmt.Errorf("%w: %s", ErrNoData, what)}
}

// PlotView builds view v of sc. Views with equal aspect (panels,
// streamlines) are framed for a 3:2 data area; Render and WriteFigure
// reframe them for the actual size, and FitAspect does so for callers that
// draw the plot themselves. It returns a *ViewError wrapping ErrNoData when
// sc lacks the data v needs.
func PlotView(v View, sc *Scene) (*plot.Plot, error) {
	p, info, err := buildView(v, sc)
	if err != nil {
		return p, err
	}
	c := draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: 6 * vg.Inch, Y: 4 * vg.Inch}}}
	fitKeys(c, info.keys...) // the keys' rows as for a 6 × 4 inch figure
	if info.equal {
		fitAspect(p, c)
	}
	return p, nil
}

// viewInfo carries what drawing needs to know beyond the plot itself.
type viewInfo struct {
	equal     bool   // equal aspect: one data unit is as long on both axes
	composite bool   // panels in tiles: the outer plot has no data coordinates
	keys      []*key // keys above the data area, told their room before drawing
}

func buildView(v View, sc *Scene) (*plot.Plot, viewInfo, error) {
	if sc == nil {
		panic("figure: nil scene")
	}
	th := themeFor(sc.Dark)
	var (
		p    *plot.Plot
		info viewInfo
		err  error
	)
	switch v {
	case ViewPanels:
		p, err = panelsPlot(sc, th)
		info.equal = true
	case ViewPressure:
		var k *key
		p, k, err = pressurePlot(sc, th)
		info.keys = append(info.keys, k)
	case ViewStreamlines:
		p, err = streamlinesPlot(sc, th)
		info.equal = true
	case ViewPolar:
		var k *key
		p, k, err = polarPlot(sc, th)
		info.keys = append(info.keys, k)
	case ViewDragPolar:
		p, err = dragPolarPlot(sc, th)
	case ViewBoundaryLayer:
		p, err = boundaryLayerPlot(sc, th)
		info.composite = true
	case ViewLiftToDrag:
		p, err = liftToDragPlot(sc, th)
	case ViewDensity:
		p, err = densityPlot(sc, th)
	default:
		panic(fmt.Sprintf("figure: unknown view %d", int(v)))
	}
	if err != nil {
		return nil, info, err
	}
	// Not yet fitted to equal scales: Render and WriteFigure fit the
	// ranges asked for to the actual size once (fitting twice, to 3:2 and
	// then to the size, would widen both ranges), PlotView to 3:2.
	return p, info, nil
}

// FitAspect widens p's x or y range about its centre so that one data unit
// has the same length on both axes when p is drawn on a canvas of width w
// and height h. The panels and streamlines views need it; it is harmless on
// others only if their axes share a unit.
func FitAspect(p *plot.Plot, w, h vg.Length) {
	fitAspect(p, draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: w, Y: h}}})
}

// fitAspect iterates because the data area depends on the tick labels,
// which depend on the ranges; three rounds settle it in practice.
func fitAspect(p *plot.Plot, c draw.Canvas) {
	x0, x1, y0, y1 := p.X.Min, p.X.Max, p.Y.Min, p.Y.Max
	for range 3 {
		da := p.DataCanvas(c)
		pw, ph := float64(da.Max.X-da.Min.X), float64(da.Max.Y-da.Min.Y)
		if pw <= 0 || ph <= 0 {
			return
		}
		dx, dy := x1-x0, y1-y0
		if dx/pw > dy/ph { // x is the binding range: widen y
			ny := dx / pw * ph
			cy := (y0 + y1) / 2
			p.X.Min, p.X.Max = x0, x1
			p.Y.Min, p.Y.Max = cy-ny/2, cy+ny/2
		} else {
			nx := dy / ph * pw
			cx := (x0 + x1) / 2
			p.X.Min, p.X.Max = cx-nx/2, cx+nx/2
			p.Y.Min, p.Y.Max = y0, y1
		}
	}
}

// Figure is a view rendered into an image, with the transform between its
// pixels and the data.
type Figure struct {
	Image *image.RGBA
	// Plot is the pixel rectangle of the data area in Image.
	Plot image.Rectangle
	// X and Y are the data ranges across Plot: X[0] at Plot.Min.X, X[1] at
	// Plot.Max.X; Y[0] at the bottom edge unless YDown.
	X, Y [2]float64
	// YDown is true when the data y grows downwards in the image, as Cp
	// does in the pressure view.
	YDown bool

	// Exact data-area edges in pixels (Plot is these rounded).
	x0, x1, y0, y1 float64
	dpi            float64 // the resolution drawn at
	composite      bool    // several panels: DataAt reports nothing
}

// Render draws view v of sc into a widthPx × heightPx image at dpi dots per
// inch (which sets the size of text and lines: 96 is a common screen
// value). It panics if a size or the dpi is not positive.
func Render(v View, sc *Scene, widthPx, heightPx int, dpi float64) (*Figure, error) {
	if widthPx <= 0 || heightPx <= 0 || !(dpi > 0) {
		panic(fmt.Sprintf("figure: bad render size %d×%d at %g dpi", widthPx, heightPx, dpi))
	}
	return RenderInto(image.NewRGBA(image.Rect(0, 0, widthPx, heightPx)), v, sc, dpi)
}

// RenderInto draws view v of sc over the whole of dst, replacing what it
// held, at dpi dots per inch. The Figure's Image is dst itself, not a
// copy, so that a caller can draw into a buffer it reuses. It panics if
// dst is empty or does not start at (0, 0), or the dpi is not positive.
func RenderInto(dst *image.RGBA, v View, sc *Scene, dpi float64) (*Figure, error) {
	if b := dst.Bounds(); b.Min != (image.Point{}) || b.Empty() || !(dpi > 0) {
		panic(fmt.Sprintf("figure: bad render target %v at %g dpi", b, dpi))
	}
	p, info, err := buildView(v, sc)
	if err != nil {
		return nil, err
	}
	return renderPlot(p, info, dst, dpi), nil
}

// imageCanvas returns a vg canvas drawing straight into img at dpi, which
// it first fills white. vgimg.UseImage would draw into a copy of img.
func imageCanvas(img *image.RGBA, dpi float64) *vgimg.Canvas {
	ctx := gg.NewContextForRGBA(img)
	// What vgimg.NewWith does to a context it makes itself: butt caps, and
	// y up as vg expects.
	ctx.SetLineCapButt()
	ctx.InvertY()
	return vgimg.NewWith(vgimg.UseImageWithContext(img, ctx), vgimg.UseDPI(int(math.Round(dpi))))
}

// renderPlot draws p into img at dpi and records the pixel rectangle of
// its data area; info.equal fits the axes to equal scales first,
// info.composite marks a figure of several panels.
func renderPlot(p *plot.Plot, info viewInfo, img *image.RGBA, dpi float64) *Figure {
	cv := imageCanvas(img, dpi)
	dc := draw.New(cv)
	fitLabels(p, dc)
	fitKeys(dc, info.keys...)
	if info.equal {
		fitAspect(p, dc)
	}
	p.Draw(dc)
	da := p.DataCanvas(dc)
	// vg lengths are points (1/72 in) from the bottom-left corner.
	s := float64(cv.DPI()) / 72
	heightPx := img.Bounds().Dy()
	f := &Figure{
		Image:     img,
		X:         [2]float64{p.X.Min, p.X.Max},
		Y:         [2]float64{p.Y.Min, p.Y.Max},
		x0:        float64(da.Min.X) * s,
		x1:        float64(da.Max.X) * s,
		y0:        float64(heightPx) - float64(da.Max.Y)*s,
		y1:        float64(heightPx) - float64(da.Min.Y)*s,
		dpi:       cv.DPI(),
		composite: info.composite,
	}
	_, f.YDown = p.Y.Scale.(plot.InvertedScale)
	f.Plot = image.Rect(int(math.Round(f.x0)), int(math.Round(f.y0)), int(math.Round(f.x1)), int(math.Round(f.y1)))
	return f
}

// DataAt returns the data coordinates under pixel (px, py) of f.Image; ok is
// false outside the data area and everywhere on a figure made of several
// panels (the boundary-layer view).
func (f *Figure) DataAt(px, py int) (x, y float64, ok bool) {
	if f.composite {
		return 0, 0, false
	}
	fx := (float64(px) + 0.5 - f.x0) / (f.x1 - f.x0)
	fy := (float64(py) + 0.5 - f.y0) / (f.y1 - f.y0) // 0 at the top
	if fx < 0 || fx > 1 || fy < 0 || fy > 1 {
		return 0, 0, false
	}
	x = f.X[0] + fx*(f.X[1]-f.X[0])
	if f.YDown {
		y = f.Y[0] + fy*(f.Y[1]-f.Y[0])
	} else {
		y = f.Y[1] - fy*(f.Y[1]-f.Y[0])
	}
	return x, y, true
}

// PixelAt returns the pixel position of data point (x, y), the inverse of
// DataAt; points outside the data range map outside f.Plot.
func (f *Figure) PixelAt(x, y float64) (px, py float64) {
	fx := (x - f.X[0]) / (f.X[1] - f.X[0])
	fy := (y - f.Y[0]) / (f.Y[1] - f.Y[0])
	if !f.YDown {
		fy = 1 - fy
	}
	return f.x0 + fx*(f.x1-f.x0) - 0.5, f.y0 + fy*(f.y1-f.y0) - 0.5
}

// Figure formats accepted by WriteFigure.
const (
	FormatPNG = "png"
	FormatSVG = "svg"
	FormatPDF = "pdf"
)

// ErrFormat is wrapped by WriteFigure's error for an unknown format.
var ErrFormat = errors.New("unknown figure format")

// WriteFigure writes view v of sc to w as "png", "svg" or "pdf", widthIn ×
// heightIn inches; dpi is used by PNG only. Text in SVG and PDF refers to the
// Liberation fonts by name; PDF embeds them.
func WriteFigure(w io.Writer, v View, sc *Scene, format string, widthIn, heightIn, dpi float64) error {
	cv, err := figureCanvas(format, widthIn, heightIn, dpi)
	if err != nil {
		return err
	}
	p, info, err := buildView(v, sc)
	if err != nil {
		return err
	}
	return writePlot(w, cv, p, info)
}

// figureCanvas returns a widthIn × heightIn inch canvas for format. It
// panics on a non-positive size or PNG resolution.
func figureCanvas(format string, widthIn, heightIn, dpi float64) (vg.CanvasWriterTo, error) {
	if !(widthIn > 0 && heightIn > 0) {
		panic(fmt.Sprintf("figure: bad figure size %g × %g in", widthIn, heightIn))
	}
	wl, hl := vg.Length(widthIn)*vg.Inch, vg.Length(heightIn)*vg.Inch
	switch strings.ToLower(format) {
	case FormatPNG:
		if !(dpi > 0) {
			panic(fmt.Sprintf("figure: bad dpi %g", dpi))
		}
		return vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(wl, hl), vgimg.UseDPI(int(math.Round(dpi))))}, nil
	case FormatSVG:
		return vgsvg.New(wl, hl), nil
	case FormatPDF:
		return newPDFCanvas(wl, hl), nil
	}
	return nil, fmt.Errorf("figure format %q (want png, svg or pdf): %w", format, ErrFormat)
}

// writePlot draws p on cv (fitted to equal axis scales if info.equal)
// and writes the result to w.
func writePlot(w io.Writer, cv vg.CanvasWriterTo, p *plot.Plot, info viewInfo) error {
	dc := draw.New(cv)
	fitLabels(p, dc)
	fitKeys(dc, info.keys...)
	if info.equal {
		fitAspect(p, dc)
	}
	p.Draw(dc)
	_, err := cv.WriteTo(w)
	return err
}

// NewScene returns the scene of an engine result for study st (which may
// be nil): geometry, solution, sweep, streamlines, boundary layer and pins,
// the angle of attack, ground and mounting. Element is −1 (all elements);
// the caller sets Window, SpeedColour and Dark.
func NewScene(r *engine.Result, st *model.Study) *Scene {
	if r == nil {
		panic("figure: nil result")
	}
	sc := &Scene{
		Layout: r.Layout, Solution: r.Solution, Sweep: r.Sweep, SweepViscous: r.SweepViscous,
		Streamlines: r.Streamlines, Viscous: r.Viscous, Element: -1,
		Coupled: r.Coupled, SweepCoupled: r.SweepCoupled,
		ClMax: r.ClMax, AlphaClMax: r.AlphaClMax, ClMaxIsPeak: r.ClMaxIsPeak,
	}
	if len(r.Config.Elements) > 0 {
		cfg := r.Config
		sc.Config = &cfg
		sc.Ground, sc.GroundY = cfg.Ground, cfg.GroundY
	}
	if r.Solution != nil {
		sc.AlphaDeg = r.Solution.AlphaDeg
	}
	if r.Layout != nil {
		sc.Inverted = r.Layout.Inverted
	}
	if st != nil {
		sc.Pins = st.Pins
		sc.AlphaDeg = st.Flow.AlphaDeg
		sc.Inverted = st.Inverted
	}
	return sc
}
