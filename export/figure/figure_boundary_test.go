package figure

import (
	"image/color"
	"math"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"

	"sectionbench/model"
	"sectionbench/solver"
)

func TestBLCaption(t *testing.T) {
	nan := math.NaN()
	surf := func(tr, lam, sep float64) solver.SurfaceBL {
		return solver.SurfaceBL{TransitionXC: tr, LaminarSeparationXC: lam, TurbulentSeparationXC: sep}
	}
	for _, c := range []struct {
		name         string
		upper, lower solver.SurfaceBL
		want         []string
	}{
		{"attached laminar", surf(nan, nan, nan), surf(nan, nan, nan), []string{"no transition or separation on either surface"}},
		{"transition both", surf(0.31, nan, nan), surf(0.6, nan, nan), []string{"transition (dashed) at x/c upper 0.31, lower 0.60"}},
		{"separated", surf(0.2, nan, 0.93), surf(0.6, nan, nan), []string{"transition (dashed) at x/c upper 0.20, lower 0.60", "separation (solid line) at x/c upper 0.93"}},
		{"all three kinds", surf(nan, nan, nan), surf(0.01, 0.01, 0.89), []string{
			"transition (dashed) at x/c lower 0.01",
			"laminar separation (dotted) at x/c lower 0.01",
			"separation (solid line) at x/c lower 0.89",
		}},
	} {
		got := blCaption(solver.ElementBL{Upper: c.upper, Lower: c.lower})
		if !reflect.DeepEqual(got, c.want) {
			t.Errorf("%s: caption %q, want %q", c.name, got, c.want)
		}
	}
}

func TestPackLines(t *testing.T) {
	sty := textStyle(color.Black, 10, text.XLeft, text.YTop)
	items := []string{"aaaa", "bb", "cccccc", "d"}
	for _, c := range []struct {
		name  string
		width vg.Length
		want  []string
	}{
		{"wide", 1000, []string{"aaaa · bb · cccccc · d"}},
		{"one per line", 1, items},
		{"two and two", max(sty.Width("aaaa · bb"), sty.Width("cccccc · d")), []string{"aaaa · bb", "cccccc · d"}},
	} {
		if got := packLines(items, " · ", sty, c.width); !reflect.DeepEqual(got, c.want) {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}

func TestBLRange(t *testing.T) {
	lines := []plotter.XYs{
		{{X: 0, Y: 0}, {X: 0.01, Y: 180}, {X: 0.1, Y: 40}, {X: 0.9, Y: 5}},
		{{X: 0.02, Y: 3}, {X: 0.5, Y: 22}},
	}
	aft, all := blRange(lines)
	if aft != 40 || all != 180 {
		t.Errorf("blRange = %g, %g; want 40 (largest aft of x/c %g), 180", aft, all, blRangeFromXC)
	}
	if aft, all := blRange(nil); !math.IsInf(aft, -1) || !math.IsInf(all, -1) {
		t.Errorf("no lines: %g, %g", aft, all)
	}
}

// TestBoundaryLayerFigureReadable renders a real boundary layer at the
// workbench's view size: the Cf panel's range leaves the stagnation peak
// off the top, so the curves aft of it fill the panel.
func TestBoundaryLayerFigureReadable(t *testing.T) {
	st := demoStudy(160, true)
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousEstimate // the one-way estimate these checks draw
	sc := NewScene(solveDemo(t, st, false, false), st)
	panels, _, err := boundaryLayerPanels(sc, themeFor(false))
	if err != nil {
		t.Fatal(err)
	}
	eb := sc.Viscous.Elements[0]
	peak, aft := 0.0, 0.0
	for _, s := range []solver.SurfaceBL{eb.Upper, eb.Lower} {
		for i, v := range s.Cf {
			if math.IsNaN(v) {
				continue
			}
			peak = math.Max(peak, blScale*v)
			if s.XC[i] >= blRangeFromXC {
				aft = math.Max(aft, blScale*v)
			}
		}
	}
	if !(peak > blPeakRatio*aft) {
		t.Fatalf("the demo has no stagnation peak to leave off (peak %g, aft %g)", peak, aft)
	}
	if top := panels.cf.Y.Max; top >= peak || top < aft {
		t.Errorf("Cf axis tops at %g; want it between the largest value aft of x/c %g, %g, and the peak %g", top, blRangeFromXC, aft, peak)
	}
	// The workbench's view cell at 1280 × 800 (about 450 × 290 px at 96
	// dpi, less the title) shows Cf alone and says so; 600 × 400 px has
	// room for every panel.
	px := func(n float64) vg.Length { return vg.Length(n) * vg.Inch / 96 }
	for _, c := range []struct {
		w, h  float64 // px at 96 dpi, of the area under the title
		small bool
	}{{450, 270, true}, {600, 380, false}, {1200, 760, false}} {
		lines, small := panels.layout(px(c.w), px(c.h))
		if small != c.small || (strings.HasSuffix(strings.Join(lines, ""), blSmallNote) != small) {
			t.Errorf("%g × %g px: small %v, caption %q", c.w, c.h, small, lines)
		}
		for _, l := range lines {
			if panels.captionSty.Width(l) > px(c.w) && !strings.Contains(l, blCaptionSep) {
				continue // a single item wider than the figure has its own line
			}
			if panels.captionSty.Width(l) > px(c.w) {
				t.Errorf("%g px wide: caption line %q is wider", c.w, l)
			}
		}
	}
	if _, err := Render(ViewBoundaryLayer, sc, 600, 400, 96); err != nil {
		t.Fatal(err)
	}
}
