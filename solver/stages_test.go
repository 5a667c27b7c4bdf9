package solver

import (
	"errors"
	"fmt"
	"testing"
	"time"

	"sectionbench/model"
)

func TestMeasureStages(t *testing.T) {
	cfg := Config{Elements: []Element{nacaElement(t, "2412", 100)}}
	grid := DefaultBounds(cfg)
	st, err := MeasureStages(cfg, []float64{-2, 0, 2, 4}, grid, 20, 10, 3)
	if err != nil {
		t.Fatal(err)
	}
	if st.Unknowns != 102 || st.Points != 200 || st.Repeats != 3 {
		t.Errorf("unknowns %d, points %d, repeats %d; want 102, 200, 3", st.Unknowns, st.Points, st.Repeats)
	}
	for name, d := range map[string]time.Duration{"assembly": st.Assembly, "factorisation": st.Factorization, "solve": st.Solve, "sweep": st.Sweep, "field": st.Field} {
		if d <= 0 {
			t.Errorf("%s: %v, want a positive duration", name, d)
		}
	}
	ground := Config{Elements: cfg.Elements, Ground: true, GroundY: -0.5}
	if _, err := MeasureStages(ground, []float64{0}, grid, 2, 2, 1); err != nil {
		t.Errorf("ground mode at 0°: %v", err)
	}
	for _, tc := range []struct {
		name   string
		cfg    Config
		alphas []float64
		grid   Rect
		nx, ny int
		rep    int
	}{
		{"no repeats", cfg, []float64{0}, grid, 2, 2, 0},
		{"one column", cfg, []float64{0}, grid, 1, 5, 1},
		{"empty grid", cfg, []float64{0}, Rect{Min: model.Point{X: 1}, Max: model.Point{X: 1, Y: 1}}, 2, 2, 1},
		{"no angles", cfg, nil, grid, 2, 2, 1},
		{"ground at 2°", ground, []float64{0, 2}, grid, 2, 2, 1},
	} {
		if _, err := MeasureStages(tc.cfg, tc.alphas, tc.grid, tc.nx, tc.ny, tc.rep); !errors.Is(err, ErrBadMeasure) {
			t.Errorf("%s: error %v, want ErrBadMeasure", tc.name, err)
		}
	}
	if _, err := MeasureStages(Config{}, []float64{0}, grid, 2, 2, 1); !errors.Is(err, ErrNoElements) {
		t.Errorf("no elements: %v, want ErrNoElements", err)
	}
}

func TestMedian(t *testing.T) {
	for _, tc := range []struct {
		in   []time.Duration
		want time.Duration
	}{{[]time.Duration{5, 1, 3}, 3}, {[]time.Duration{4, 1, 3, 2}, 2}, {[]time.Duration{7}, 7}} {
		if got := median(tc.in); got != tc.want {
			t.Errorf("median %v = %v, want %v", tc.in, got, tc.want)
		}
	}
}

// MeasureStages times a 100-panel NACA 2412 (the durations depend on the
// machine and its load, so only the sizes are printed here).
func ExampleMeasureStages() {
	sec, err := model.NACA("2412", model.NACAOptions{PointsPerSurface: 51})
	if err != nil {
		panic(err)
	}
	cfg := Config{Elements: []Element{{Name: sec.Name(), Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}}}
	st, err := MeasureStages(cfg, []float64{0, 2, 4}, DefaultBounds(cfg), 40, 30, 5)
	if err != nil {
		panic(err)
	}
	fmt.Printf("%d unknowns, %d grid points, medians of %d repeats\n", st.Unknowns, st.Points, st.Repeats)
	// Output:
	// 102 unknowns, 1200 grid points, medians of 5 repeats
}
