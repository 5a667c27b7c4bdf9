package figure

import (
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"math"
	"testing"
	"time"
)

// TestNiceTicksDegenerate: the tick placer ends, without panicking, on
// ranges it cannot step through: a few ulps wide (lo/step beyond 2^53, where
// k·step stops moving as k grows), equal or reversed ends, NaN, infinities,
// the whole float64 range and subnormal widths. Every tick lies in the range.
func TestNiceTicksDegenerate(t *testing.T) {
	const x = 0.74394
	for _, c := range []struct {
		name   string
		lo, hi float64
		want   int // number of labelled ticks; −1: at least one
	}{
		{"one ulp", x, math.Nextafter(x, 1), 2},
		{"four ulps", x, x + 4*(math.Nextafter(x, 1)-x), 2},
		{"one ulp at 1e6", 1e6, math.Nextafter(1e6, 2e6), 2},
		{"one ulp below zero", math.Nextafter(-x, -1), -x, 2},
		{"equal ends", x, x, 0},
		{"reversed", 1, 0, 0},
		{"NaN low", math.NaN(), 1, 0},
		{"NaN high", 0, math.NaN(), 0},
		{"-Inf", math.Inf(-1), 0, 0},
		{"+Inf", 0, math.Inf(1), 0},
		{"whole float64 range", -math.MaxFloat64, math.MaxFloat64, -1},
		{"subnormal width", 0, 5e-324, 2},
		{"tiny but steppable", 1, 1 + 1e-9, -1},
	} {
		done := make(chan struct{})
		var n int
		var bad []float64
		go func() {
			defer close(done)
			for _, tk := range (niceTicks{}).Ticks(c.lo, c.hi) {
				if tk.Label != "" {
					n++
				}
				if !(tk.Value >= c.lo && tk.Value <= c.hi) && !(math.Abs(tk.Value-c.lo) < 1e-9*math.Abs(c.hi-c.lo)) {
					bad = append(bad, tk.Value)
				}
			}
		}()
		select {
		case <-done:
		case <-time.After(10 * time.Second):
			t.Fatalf("%s: Ticks(%g, %g) does not end", c.name, c.lo, c.hi)
		}
		if c.want >= 0 && n != c.want || c.want < 0 && n == 0 {
			t.Errorf("%s: %d labelled ticks, want %d", c.name, n, c.want)
		}
		if len(bad) > 0 {
			t.Errorf("%s: ticks %v outside [%g, %g]", c.name, bad, c.lo, c.hi)
		}
	}
}

// fitLabels shrinks a title wider than the canvas to fit it, and leaves a
// short one alone.
func TestFitLabels(t *testing.T) {
	th := themeFor(false)
	for _, c := range []struct {
		name, title string
		widthIn     float64
		shrunk      bool
	}{
		{"short title, wide figure", "Cp", 6, false},
		{"long title, small figure", "Pressure: α = 2.00°, Cl from circulation −2.8980 on a long reference", 3, true},
	} {
		p := newPlot(th, c.title, "x", "y")
		size := p.Title.TextStyle.Font.Size
		cv := vgimg.New(vg.Length(c.widthIn)*vg.Inch, 2*vg.Inch)
		dc := draw.New(cv)
		fitLabels(p, dc)
		got := p.Title.TextStyle.Font.Size
		if (got < size) != c.shrunk {
			t.Errorf("%s: title %v pt from %v", c.name, got, size)
		}
		if c.shrunk && got > minLabelPt && p.Title.TextStyle.Width(c.title) > dc.Max.X-dc.Min.X {
			t.Errorf("%s: title still wider than the figure", c.name)
		}
	}
}
