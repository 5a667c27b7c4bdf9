package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"runtime"
	"strings"
	"text/tabwriter"
	"time"

	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// Stage-timing settings of the bench command: the 41-angle sweep and the
// 200 × 150 field grid are the sizes the speed targets are stated for.
const (
	benchAngles  = 41
	benchFromDeg = -10
	benchStepDeg = 0.5
	benchGridX   = 200
	benchGridY   = 150
)

type jsonBench struct {
	Panels      int     `json:"panels"`
	Unknowns    int     `json:"unknowns"`
	Repeats     int     `json:"repeats"`
	AssemblyMS  float64 `json:"assembly_ms"`
	FactorMS    float64 `json:"factorization_ms"`
	SolveMS     float64 `json:"solve_ms"`
	SweepMS     float64 `json:"sweep_ms"`
	SweepAngles int     `json:"sweep_angles"`
	FieldMS     float64 `json:"field_ms"`
	FieldPoints int     `json:"field_points"`
	GOMAXPROCS  int     `json:"gomaxprocs"`
	LoadAverage string  `json:"load_average,omitempty"`
	GoVersion   string  `json:"go_version"`
}

func cmdBench(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("bench", "bench [--section SPEC | --study FILE] [--panels N] [--repeats R] [--format text|json]", stdout)
	in := addInputs(fs, false, "text", "json")
	repeats := fs.Int("repeats", 15, "timed `repeats`; the medians are printed")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	if in.section == "" && in.study == "" {
		in.section = "naca:2412"
	}
	if *repeats < 1 || *repeats > 1000 {
		return usagef("--repeats %d: want 1 to 1000", *repeats)
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return err
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs})
	if err != nil {
		return err
	}
	cfg := res.Config
	alphas := make([]float64, benchAngles)
	for i := range alphas {
		alphas[i] = benchFromDeg + benchStepDeg*float64(i)
	}
	if cfg.Ground {
		alphas = []float64{0} // the solver's ground mode keeps the freestream level
	}
	t, err := solver.MeasureStages(cfg, alphas, solver.DefaultBounds(cfg), benchGridX, benchGridY, *repeats)
	if err != nil {
		return err
	}
	ms := func(d time.Duration) float64 { return float64(d.Microseconds()) / 1000 }
	out := jsonBench{
		Panels: st.Panelling.Panels, Unknowns: t.Unknowns, Repeats: t.Repeats,
		AssemblyMS: ms(t.Assembly), FactorMS: ms(t.Factorization), SolveMS: ms(t.Solve),
		SweepMS: ms(t.Sweep), SweepAngles: len(alphas), FieldMS: ms(t.Field), FieldPoints: t.Points,
		GOMAXPROCS: runtime.GOMAXPROCS(0), GoVersion: runtime.Version(), LoadAverage: loadAverage(),
	}
	if in.format == "json" {
		return writeJSON(stdout, out)
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "panels\t%d per element (%d unknowns), median of %d repeats\n", out.Panels, out.Unknowns, out.Repeats)
	fmt.Fprintf(tw, "assembly\t%.3f ms\n", out.AssemblyMS)
	fmt.Fprintf(tw, "factorisation\t%.3f ms\n", out.FactorMS)
	fmt.Fprintf(tw, "solve\t%.3f ms\t(unit solutions and one angle)\n", out.SolveMS)
	fmt.Fprintf(tw, "sweep\t%.3f ms\t(%d angles, by superposition)\n", out.SweepMS, out.SweepAngles)
	fmt.Fprintf(tw, "field\t%.3f ms\t(%d points)\n", out.FieldMS, out.FieldPoints)
	fmt.Fprintf(tw, "machine\t%d cores for Go, %s, load %s\n", out.GOMAXPROCS, out.GoVersion, out.LoadAverage)
	return tw.Flush()
}

// loadAverage reads the 1-, 5- and 15-minute load averages where the
// system offers them (Linux), so timings can be read against the load.
func loadAverage() string {
	b, err := os.ReadFile("/proc/loadavg")
	if err != nil {
		return ""
	}
	f := strings.Fields(string(b))
	if len(f) < 3 {
		return ""
	}
	return strings.Join(f[:3], " ")
}
