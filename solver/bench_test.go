package solver

import (
	"context"
	"fmt"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Benchmarks of the panel method's stages on NACA 2412 (cosine spacing) at
// N = 100, 200, 400 and 800 panels. Run with
//
//	go test -run '^$' -bench . -benchmem -count 5 ./solver/
//
// Targets at N = 200 on the project's 2-core machine (medians):
// NewSystemSolve (assembly + factorisation + solve) < 1.5 ms; a 41-angle
// sweep < 1.3 × one solve; the 200 × 150 velocity field < 40 ms.

var benchPanels = []int{100, 200, 400, 800}

func benchConfig(b *testing.B, n int) Config {
	return Config{Elements: []Element{nacaElement(b, "2412", n)}}
}

// sweep41 is −10° to 10° in steps of 0.5°.
func sweep41() []float64 {
	a := make([]float64, 41)
	for i := range a {
		a[i] = -10 + 0.5*float64(i)
	}
	return a
}

func forPanels(b *testing.B, f func(b *testing.B, cfg Config)) {
	for _, n := range benchPanels {
		b.Run(fmt.Sprintf("N=%d", n), func(b *testing.B) { f(b, benchConfig(b, n)) })
	}
}

func BenchmarkAssemble(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		g, err := newGeometry(cfg)
		if err != nil {
			b.Fatal(err)
		}
		for b.Loop() {
			g.assemble(context.Background())
		}
	})
}

// BenchmarkFactorize is the LU factorisation and the condition estimate
// (with a copy of the matrix, which factorize overwrites).
func BenchmarkFactorize(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		g, err := newGeometry(cfg)
		if err != nil {
			b.Fatal(err)
		}
		a, _, anorm := g.assemble(context.Background())
		w := mat.DenseCopyOf(a)
		s := &System{geo: g}
		for b.Loop() {
			w.Copy(a)
			s.warnings = s.warnings[:0]
			if err := s.factorize(w, anorm); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkNewSystem is validation, assembly, factorisation and the two
// unit solves.
func BenchmarkNewSystem(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		for b.Loop() {
			if _, err := NewSystem(cfg); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkNewSystemSolve is one complete solve from geometry: NewSystem
// and Solve at one angle, with the full per-panel results.
func BenchmarkNewSystemSolve(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		for b.Loop() {
			s, err := NewSystem(cfg)
			if err != nil {
				b.Fatal(err)
			}
			s.Solve(4)
		}
	})
}

// BenchmarkNewSystemSweep41 is a 41-angle sweep from geometry, to compare
// with BenchmarkNewSystemSolve.
func BenchmarkNewSystemSweep41(b *testing.B) {
	alphas := sweep41()
	forPanels(b, func(b *testing.B, cfg Config) {
		for b.Loop() {
			s, err := NewSystem(cfg)
			if err != nil {
				b.Fatal(err)
			}
			s.Sweep(alphas)
		}
	})
}

// BenchmarkSolve is Solve at one angle on a factorised system.
func BenchmarkSolve(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		s := mustSystem(b, cfg)
		for b.Loop() {
			s.Solve(4)
		}
	})
}

// BenchmarkSweep41 is Sweep over 41 angles on a factorised system.
func BenchmarkSweep41(b *testing.B) {
	alphas := sweep41()
	forPanels(b, func(b *testing.B, cfg Config) {
		s := mustSystem(b, cfg)
		for b.Loop() {
			s.Sweep(alphas)
		}
	})
}

// BenchmarkField200x150 is the velocity on a 200 × 150 grid over
// DefaultBounds, including the Solve that precedes it and the cluster tree
// the first velocity evaluation of a Solution builds.
func BenchmarkField200x150(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		s := mustSystem(b, cfg)
		pts := fieldGrid(DefaultBounds(cfg), 200, 150)
		u, v := make([]float64, len(pts)), make([]float64, len(pts))
		in := make([]bool, len(pts))
		for b.Loop() {
			s.Solve(4).Velocity(pts, u, v, in)
		}
	})
}

// BenchmarkStreamlines is the default streamline set (DefaultSeeds seeded
// lines and the dividing streamline) over DefaultBounds, including Solve
// and the field's tree.
func BenchmarkStreamlines(b *testing.B) {
	forPanels(b, func(b *testing.B, cfg Config) {
		s := mustSystem(b, cfg)
		for b.Loop() {
			s.Solve(4).Streamlines(StreamOptions{})
		}
	})
}

// The coupled viscous solution at one angle, NACA 0012 at 160 panels,
// Re 6e6 tripped at 5 %: from the march (cold) and from the converged
// solution 1° below (warm). Targets (issue "Coupled viscous solution"):
// 30 ms cold, 10 ms warm on the project's 2-core machine. Each solve
// builds its angle's wakes and source responses (the System's cache of
// them is cleared), as a new angle in the app or a polar does, and the
// warm start forgets the attempts made from it.
func BenchmarkCoupledCold(b *testing.B) {
	sys, err := NewSystem(Config{Elements: []Element{nacaElement(b, "0012", 160)}})
	if err != nil {
		b.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}
	defer reportCounts(b, ReadCoupledCounts())()
	for b.Loop() {
		sys.flows.clear()
		if cs, err := sys.SolveCoupled(context.Background(), 4, opt, nil); err != nil || !cs.Converged {
			b.Fatalf("not converged: %v", err)
		}
	}
}

func BenchmarkCoupledWarm(b *testing.B) {
	sys, err := NewSystem(Config{Elements: []Element{nacaElement(b, "0012", 160)}})
	if err != nil {
		b.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}
	warm, err := sys.SolveCoupled(context.Background(), 3, opt, nil)
	if err != nil || !warm.Converged {
		b.Fatalf("no starting solution: %v", err)
	}
	defer reportCounts(b, ReadCoupledCounts())()
	for b.Loop() {
		sys.flows.clear()
		warm.attempts = &attempts{} // what solving from it again would take
		if cs, err := sys.SolveCoupled(context.Background(), 4, opt, warm); err != nil || !cs.Converged {
			b.Fatalf("not converged: %v", err)
		}
	}
}

// A 41-angle coupled polar of two elements (TestCoupledMainAndFlap's
// NACA 4412 main element, 160 panels, and its flap, 120 panels, 0.35
// chord, 10° down; Re 1e6 and 0.35e6, tripped at 5 %), −10° to 10° in
// 0.5° steps walked as the engine's sweep walks one: outwards from 0°,
// each angle warm-started from its converged neighbour. Target (issue
// "Coupled viscous solution"): 3 s on the project's 2-core machine.
// Reports how many angles converged.
func BenchmarkCoupledPolar41TwoElement(b *testing.B) {
	sys, err := NewSystem(mainAndFlap(b))
	if err != nil {
		b.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{1e6, 0.35e6}, TripUpper: 0.05, TripLower: 0.05}
	alphas := sweep41()
	var conv int
	defer reportCounts(b, ReadCoupledCounts())()
	for b.Loop() {
		sys.flows.clear()
		conv = 0
		var warm, start *CoupledSolution
		for _, i := range polarOrder(len(alphas)) {
			if i == len(alphas)/2-1 {
				warm = start // turning round: downwards from 0°
			}
			cs, err := sys.SolveCoupled(context.Background(), alphas[i], opt, warm)
			if err != nil {
				b.Fatal(err)
			}
			if cs.Converged {
				conv++
				warm = cs
				if i == len(alphas)/2 {
					start = cs
				}
			}
		}
	}
	b.ReportMetric(float64(conv), "converged-rows")
}

// reportCounts returns a function that reports the coupled solution's
// work per operation since c0 (CoupledCounts): the Newton steps and the
// factorisations of their mass-defect systems, which on this shared
// machine say more than the time does. It counts the operations as
// b.Loop runs them (b.N is not theirs).
func reportCounts(b *testing.B, c0 CoupledCounts) func() {
	return func() {
		d := ReadCoupledCounts().Sub(c0)
		n := float64(max(b.N, 1))
		b.ReportMetric(float64(d.NewtonSteps)/n, "newton-steps/op")
		b.ReportMetric(float64(d.Factorisations)/n, "factorisations/op")
	}
}

// polarOrder returns the indices of an odd number n of angles centred on
// 0° in the order the engine's sweep walks them: the middle one, upwards
// from it, then downwards from it.
func polarOrder(n int) []int {
	var o []int
	for i := n / 2; i < n; i++ {
		o = append(o, i)
	}
	for i := n/2 - 1; i >= 0; i-- {
		o = append(o, i)
	}
	return o
}
