package figure

import (
	"bytes"
	"errors"
	"flag"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/plot"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// -setup.out DIR writes the set-up figures of these tests as PNGs to look
// at.
var setupOut = flag.String("setup.out", "", "write the set-up test figures as PNGs to this directory")

func writeSetup(t *testing.T, name string, p *plot.Plot) {
	t.Helper()
	var b bytes.Buffer
	if err := WritePlot(&b, p, FormatPNG, 6, 4, 96); err != nil {
		t.Fatal(err)
	}
	if *setupOut != "" {
		if err := os.WriteFile(filepath.Join(*setupOut, name+".png"), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// plotTexts writes p as the PNG name (writeSetup) and returns the texts
// of its SVG rendering, for checks on what its key says.
func plotTexts(t *testing.T, name string, p *plot.Plot) []string {
	t.Helper()
	writeSetup(t, name, p)
	var svg bytes.Buffer
	if err := WritePlot(&svg, p, FormatSVG, 6, 4, 96); err != nil {
		t.Fatal(err)
	}
	texts, err := svgTexts(svg.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	return texts
}

// Invented curve: downforce against clearance rising as the clearance
// falls, then dropping, with the lowest points separated, one without
// an answer and two that are not a single solve's answer.
func TestSetupCurvePlot(t *testing.T) {
	c := SetupCurve{Title: "Downforce against clearance (invented)", XLabel: "clearance, mm", YLabel: "downforce, N/m", Current: 150, Onset: 35, OnsetLabel: "separation from 35 mm"}
	for h := 20.0; h <= 200; h += 15 {
		c.X = append(c.X, h)
		c.Y = append(c.Y, 300+4000/h-math.Max(0, 40-h)*8)
		c.Separated = append(c.Separated, h < 40)
		c.Failed = append(c.Failed, h == 65)
		c.NotSolve = append(c.NotSolve, h == 50 || h == 80)
	}
	p, err := SetupCurvePlot(c, false)
	if err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-curve", p)
	if _, err := SetupCurvePlot(SetupCurve{Onset: math.NaN(), Current: math.NaN()}, false); !errors.Is(err, ErrNoSetupData) {
		t.Errorf("empty curve: %v", err)
	}
}

// Invented map: a smooth bump with a separated corner, a failed cell,
// cells that are not a single solve's answer (one of them separated) and
// a search path.
func TestSetupGridPlot(t *testing.T) {
	g := SetupGrid{Title: "Downforce (invented)", XLabel: "flap deflection, °", YLabel: "flap gap, mm", ZLabel: "N/m", Start: [2]float64{20, 10}, Best: [2]float64{28, 12}}
	for x := 10.0; x <= 40; x += 3 {
		g.X = append(g.X, x)
	}
	for y := 4.0; y <= 20; y += 2 {
		g.Y = append(g.Y, y)
	}
	for _, x := range g.X {
		var z []float64
		var s, f, n []bool
		for _, y := range g.Y {
			z = append(z, 400-0.5*(x-30)*(x-30)-2*(y-12)*(y-12))
			s = append(s, x > 34 && y < 10)
			f = append(f, x == 40 && y == 20)
			n = append(n, (x == 37 && y == 18) || (x == 37 && y == 8))
		}
		g.Z, g.Separated, g.Failed, g.NotSolve = append(g.Z, z), append(g.Separated, s), append(g.Failed, f), append(g.NotSolve, n)
	}
	g.Path = [][2]float64{{20, 10}, {24, 10}, {22, 13}, {27, 12}, {28, 12}}
	p, err := SetupGridPlot(g, false)
	if err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-grid", p)
	if p.X.Min != 8.5 || p.X.Max != 41.5 {
		t.Errorf("x range %g..%g, want the cells' edges 8.5..41.5", p.X.Min, p.X.Max)
	}
	p, err = SetupGridPlot(g, true)
	if err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-grid-dark", p)
	// Streaming in: the first rows only.
	for i := 4; i < len(g.X); i++ {
		for j := range g.Y {
			g.Z[i][j] = math.NaN()
			g.Separated[i][j], g.Failed[i][j], g.NotSolve[i][j] = false, false, false
		}
	}
	g.Path = nil
	if p, err = SetupGridPlot(g, false); err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-grid-streaming", p)
}

func TestSearchAndSpanLoadPlots(t *testing.T) {
	steps := []SearchStep{{300, true, false}, {320, true, false}, {310, false, false}, {math.NaN(), false, false}, {335, true, true}, {330, true, false}}
	p, err := SearchPlot("Search (invented)", "downforce, N/m", steps, true, false)
	if err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-search", p)
	if p, err = SearchPlot("Search (invented)", "downforce, N/m", steps[3:4], true, false); err != nil {
		t.Errorf("a search of one solve without an answer: %v", err)
	} else {
		writeSetup(t, "setup-search-no-answer", p)
	}
	s := SpanLoad{Title: "Spanwise load (invented)", YLabel: "downforce, N/m", SpanM: 1, TwoD: 320}
	for i := range 10 {
		y := (float64(i) + 0.5) / 20
		s.YM = append(s.YM, y)
		s.Load = append(s.Load, 250*math.Sqrt(1-4*y*y))
	}
	p, err = SpanLoadPlot(s, false)
	if err != nil {
		t.Fatal(err)
	}
	writeSetup(t, "setup-span", p)
}

// MapCurve marks the first separated point next to an attached one, the
// one nearest the study's value, and crosses points without an answer.
func TestMapCurveOnset(t *testing.T) {
	st := model.NewStudy()
	st.Inverted = true
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 80}
	v := model.SetupVariable{Kind: model.SetupClearance}
	var pts []engine.Point
	for _, h := range []float64{20, 30, 40, 60, 80, 100} {
		p := engine.Point{Values: []float64{h}, Viscous: true, Converged: h != 60, Inverted: true, Cl: -2, Cd: 0.05,
			DownforcePerSpan: 500, Elements: []engine.PointElement{{SeparationSuction: math.NaN()}}}
		if h <= 30 {
			p.Elements[0].SeparationSuction = 0.5
		}
		if h == 40 || h == 100 {
			p.StartedFrom = []float64{80}
			p.Single = engine.SingleAnotherRoot // 100 mm: agrees
		}
		if h == 100 {
			p.Single = engine.SingleAgrees
		}
		pts = append(pts, p)
	}
	c := MapCurve(st, v, pts, engine.QuantityLoad, true, 0.9, 80)
	if c.Onset != 30 || !strings.Contains(c.OnsetLabel, "from 30 mm") {
		t.Errorf("onset %g (%q), want 30 mm", c.Onset, c.OnsetLabel)
	}
	if !c.Failed[3] || c.Failed[0] || !c.Separated[0] || c.Separated[2] || c.Y[4] != 500 {
		t.Errorf("marks: failed %v, separated %v, y %v", c.Failed, c.Separated, c.Y)
	}
	if want := []bool{false, false, true, false, false, false}; !slices.Equal(c.NotSolve, want) {
		t.Errorf("not a single solve's answer %v, want %v (the 40 mm point)", c.NotSolve, want)
	}
	if c.Inviscid {
		t.Error("a viscous map's curve says it is inviscid")
	}
	for i := range pts {
		pts[i].Viscous = false
	}
	if c := MapCurve(st, v, pts, engine.QuantityLoad, true, 0.9, 80); !c.Inviscid {
		t.Error("a panel-method map's curve does not say it is inviscid")
	}
	if c.YLabel != "downforce (N/m)" || c.XLabel != "ground clearance (mm)" {
		t.Errorf("labels %q, %q", c.XLabel, c.YLabel)
	}
}

// Cells without a value take their nearest cell's value for the contour
// lines only.
func TestNearestFilled(t *testing.T) {
	nan := math.NaN()
	got := nearestFilled([][]float64{{1, nan, nan}, {nan, nan, 5}})
	want := [][]float64{{1, 1, 5}, {1, 5, 5}}
	for i := range want {
		if !slices.Equal(got[i], want[i]) {
			t.Errorf("row %d: %v, want %v", i, got[i], want[i])
		}
	}
}

// The key's lowest swatch is the palette's lowest colour even where
// hi − (hi − lo) rounds below lo (values chosen so that it does, near the
// 838.2 and 209.2 N/m of a two-element map whose key showed the lowest
// value grey).
func TestSetupGridKeyLowest(t *testing.T) {
	lo, hi := 209.17436112340447, 838.2170707870134
	if hi-(hi-lo) >= lo {
		t.Skip("these values no longer round below lo")
	}
	g := SetupGrid{Title: "t", X: []float64{0, 1}, Y: []float64{0, 1}, Z: [][]float64{{lo, hi}, {hi, lo}}}
	if _, err := SetupGridPlot(g, false); err != nil {
		t.Fatal(err)
	}
}

// TestSetupCurveRanges: a map's curve with its first point alone spans
// the whole range the variable runs over (its axis was ±1 about the point,
// the tick labels running together, and it jumped as points came in);
// separation x/c, attached everywhere (1), stops just above 1 (it ran
// from 0 to 2).
func TestSetupCurveRanges(t *testing.T) {
	nan := math.NaN()
	c := SetupCurve{Title: "one point (invented)", X: []float64{160}, Y: []float64{276.8}, Current: nan, Onset: nan, XFrom: 20, XTo: 300}
	p, err := SetupCurvePlot(c, false)
	if err != nil {
		t.Fatal(err)
	}
	if p.X.Min > 20 || p.X.Max < 300 || p.X.Max > 320 {
		t.Errorf("x axis %g to %g, want about 20 to 300", p.X.Min, p.X.Max)
	}
	c = SetupCurve{Title: "separation (invented)", X: []float64{20, 40, 60}, Y: []float64{1, 1, 1}, Current: nan, Onset: nan, AtMostOne: true}
	if p, err = SetupCurvePlot(c, false); err != nil {
		t.Fatal(err)
	}
	if p.Y.Max < 1 || p.Y.Max > 1.1 {
		t.Errorf("separation axis up to %g, want just above 1", p.Y.Max)
	}
}

// TestSpanLoadKeyRoom: the span load's axis leaves room above the
// two-dimensional line for the key, which lay over the line's end.
func TestSpanLoadKeyRoom(t *testing.T) {
	s := SpanLoad{Title: "spanwise load (invented)", YLabel: "N/m", SpanM: 1, TwoD: 284.5}
	for i := range 40 {
		y := 0.5 * float64(i) / 40
		s.YM = append(s.YM, y)
		s.Load = append(s.Load, 185*math.Sqrt(1-4*y*y))
	}
	p, err := SpanLoadPlot(s, false)
	if err != nil {
		t.Fatal(err)
	}
	if room := (p.Y.Max - s.TwoD) / (p.Y.Max - p.Y.Min); room < 0.2 {
		t.Errorf("%.0f %% of the axis above the two-dimensional line, want room for the key", 100*room)
	}
}

// TestMapCurveNearGround: a ride-height map marks the points closer to
// the ground than 0.1 of the main chord, where the workbench flags the
// study "very close to the ground" (an inviscid map of the two-element
// example drew 1880 N/m at 20 mm on a 250 mm chord without a word), in
// the figure's key and in the caption's words; the rule is the flag's
// (model.GroundHOverCMin, Zerihan & Zhang 2000, in model). A point
// without an answer is crossed, not marked; in free air nothing is.
func TestMapCurveNearGround(t *testing.T) {
	st, v := rideHeightStudy()
	var pts []engine.Point
	for _, h := range []float64{10, 20, 24.9, 25, 40, 100} {
		pts = append(pts, engine.Point{Values: []float64{h}, Converged: h != 10, Inverted: true, Cl: -40 / math.Sqrt(h),
			DownforcePerSpan: 4000 / math.Sqrt(h), ClearanceMM: h, Elements: []engine.PointElement{{SeparationSuction: math.NaN()}}})
	}
	c := MapCurve(st, v, pts, engine.QuantityLoad, true, 0.9, 100)
	if want := []bool{false, true, true, false, false, false}; !slices.Equal(c.NearGround, want) {
		t.Errorf("near the ground %v, want %v (20 and 24.9 mm: below 25 mm; 10 mm has no answer)", c.NearGround, want)
	}
	if !strings.Contains(c.NearGroundLabel, "25 mm") || !strings.HasSuffix(c.NearGroundLabel, model.GroundCaution()) {
		t.Errorf("caption words %q do not give the 25 mm and what it means", c.NearGroundLabel)
	}
	p, err := SetupCurvePlot(c, false)
	if err != nil {
		t.Fatal(err)
	}
	if texts := plotTexts(t, "setup-curve-near-ground", p); !slices.Contains(texts, nearGroundKey) {
		t.Errorf("the key has no entry for the points too near the ground: %q", texts)
	}

	g := SetupGrid{Title: "t", X: []float64{20, 40}, Y: []float64{1, 2}, Z: [][]float64{{900, 800}, {600, 500}}, NearGround: [][]bool{{true, true}, {false, false}}}
	gp, err := SetupGridPlot(g, false)
	if err != nil {
		t.Fatal(err)
	}
	if texts := plotTexts(t, "setup-grid-near-ground", gp); !slices.Contains(texts, nearGroundKey) {
		t.Errorf("the grid's key has no entry for the cells too near the ground: %q", texts)
	}

	st.Ground.Enabled = false
	for i := range pts {
		pts[i].ClearanceMM = math.NaN()
	}
	if c := MapCurve(st, v, pts, engine.QuantityLoad, true, 0.9, 100); slices.Contains(c.NearGround, true) || c.NearGroundLabel != "" {
		t.Errorf("free air: near the ground %v, %q", c.NearGround, c.NearGroundLabel)
	}
}

// TestMapCurveHeld: a map's point whose coupled solution converged only
// with transition held upstream (model.FlagHeld in engine.Point.Flags) is
// boxed in the curve with its key entry, as the polar boxes such rows; the
// two-element example's ride-height map drew its 40 mm point, held and
// attached between separated neighbours, as a plain "attached" dot.
func TestMapCurveHeld(t *testing.T) {
	st, v := rideHeightStudy()
	var pts []engine.Point
	for _, h := range []float64{40, 60, 80, 100} {
		p := engine.Point{Values: []float64{h}, Converged: true, Viscous: true, Inverted: true, Cl: -40 / math.Sqrt(h),
			DownforcePerSpan: 4000 / math.Sqrt(h), ClearanceMM: h, Elements: []engine.PointElement{{SeparationSuction: math.NaN()}}}
		if h == 40 {
			p.Flags = []model.Flag{{Kind: model.FlagHeld}}
		}
		pts = append(pts, p)
	}
	c := MapCurve(st, v, pts, engine.QuantityLoad, true, 0.9, 100)
	if want := []bool{true, false, false, false}; !slices.Equal(c.Held, want) {
		t.Errorf("held %v, want %v", c.Held, want)
	}
	p, err := SetupCurvePlot(c, false)
	if err != nil {
		t.Fatal(err)
	}
	if texts := plotTexts(t, "setup-curve-held", p); !slices.Contains(texts, heldKey) {
		t.Errorf("the key has no entry for the held point: %q", texts)
	}
}

// rideHeightStudy returns an inverted 250 mm element over the ground and
// the clearance as the map's variable: the ride-height map of the curve
// tests.
func rideHeightStudy() (*model.Study, model.SetupVariable) {
	st := model.NewStudy()
	st.Elements[0].ChordMM = 250
	st.Inverted = true
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 100}
	return st, model.SetupVariable{Kind: model.SetupClearance}
}
