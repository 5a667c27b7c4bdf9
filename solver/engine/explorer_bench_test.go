package engine

import (
	"context"
	"math"
	"runtime"
	"slices"
	"testing"
	"time"

	"sectionbench/model"
	"sectionbench/solver"
)

// A 20 × 20 viscous map of the invented two-element example in ground
// effect (assets/examples/two-element-ground.json, 160 panels per
// element): ride height 40–135 mm in 5 mm against angle of attack −1° to
// 8.5° in 0.5°, the coupled viscous solution at every point, each point
// started from its neighbour's solution (Map). Target (issue "Set-up
// explorer"): 30 s on the project's 2-core machine. Reports the points
// that converged. "compared with solve" also solves every point as
// `solve` does (MapOptions.CompareWithSolve) and reports how many lie on
// another root or have no single solve, and the largest relative
// differences of Cl and Cd among the points that agree. Beside the wall
// time, which on the shared machine says as much about the other
// engineers' work as about the map (state the load), it reports the
// Newton steps and factorisations (reportCounts) and the process's CPU
// time per map (cpu-s; the target's 30 s on two cores is at most 60 s of
// it, less what the cores wait for each other). Run once:
// -bench MapTwoElement20x20 -benchtime 1x.
func BenchmarkMapTwoElement20x20(b *testing.B) {
	st, secs := exampleStudy(b, "two-element-ground.json")
	ranges := []model.SetupRange{mustRange(b, "clearance_mm=40:135:5"), mustRange(b, "alpha_deg=-1:8.5:0.5")}
	for _, bc := range []struct {
		name    string
		compare bool
	}{{"warm", false}, {"compared with solve", true}} {
		b.Run(bc.name, func(b *testing.B) {
			var conv, other, none int
			var dcl, dcd float64
			c0 := solver.ReadCoupledCounts()
			var cpu time.Duration
			cpuKnown := true
			for b.Loop() {
				cpu0, ok0 := processCPU()
				pts, err := Map(context.Background(), st, secs, ranges, MapOptions{CompareWithSolve: bc.compare}, nil, nil)
				if err != nil {
					b.Fatal(err)
				}
				cpu1, ok1 := processCPU()
				cpu, cpuKnown = cpu1-cpu0, ok0 && ok1
				conv, other, none, dcl, dcd = 0, 0, 0, 0, 0
				for _, p := range pts {
					if p.Converged {
						conv++
					}
					switch p.Single {
					case SingleAnotherRoot:
						other++
					case SingleNoAnswer:
						none++
					case SingleAgrees:
						dcl = max(dcl, math.Abs(p.Cl-p.SingleCl)/math.Abs(p.SingleCl))
						dcd = max(dcd, math.Abs(p.Cd-p.SingleCd)/p.SingleCd)
					}
				}
			}
			b.ReportMetric(float64(conv), "converged-points")
			reportCounts(b, c0)()
			if cpuKnown {
				b.ReportMetric(cpu.Seconds(), "cpu-s")
			}
			if bc.compare {
				b.ReportMetric(float64(other), "another-root-points")
				b.ReportMetric(float64(none), "no-single-solve-points")
				b.ReportMetric(dcl, "agreeing-max-rel-dCl")
				b.ReportMetric(dcd, "agreeing-max-rel-dCd")
			}
		})
	}
}

// A setting search over three variables of the invented two-element
// example in ground effect: the flap's deflection (5°–25°) and gap
// (2–12 mm) and the angle of attack (0°–6°), most downforce with every
// suction side attached to x/c 0.9, the default budget of solves. Target
// (issue "Set-up explorer"): 60 s on the project's 2-core machine.
// Reports the solves made, whether a setting met the constraints, the
// best downforce (N/m) and the solve that found it (1 = the start).
func BenchmarkSearchThreeVariables(b *testing.B) {
	st, secs := exampleStudy(b, "two-element-ground.json")
	bounds := []model.SetupRange{mustBounds(b, "elements[1].deflection_deg=5:25"), mustBounds(b, "elements[1].gap_mm=2:12"), mustBounds(b, "alpha_deg=0:6")}
	var evals, feasible, bestAt int
	var best float64
	for b.Loop() {
		res, err := Search(context.Background(), st, secs, bounds, SearchOptions{Objective: ObjectiveDownforce, AttachedToXC: 0.9}, nil)
		if err != nil {
			b.Fatal(err)
		}
		evals, feasible, best, bestAt = res.Evaluations, 0, res.Best.DownforcePerSpan, 0
		if res.Feasible {
			feasible = 1
		}
		for i, p := range res.Path {
			if slices.Equal(p.Values, res.Best.Values) && bestAt == 0 {
				bestAt = i + 1
			}
		}
	}
	b.ReportMetric(float64(evals), "solves")
	b.ReportMetric(float64(feasible), "feasible")
	b.ReportMetric(best, "best-downforce-N/m")
	b.ReportMetric(float64(bestAt), "best-at-solve")
}

// The memory a viscous map of the invented two-element example holds
// while it runs: a one-variable map (clearance 40–200 mm in 10 mm at 3°,
// 17 points, which keeps every converged solution until it ends, for the
// rescue of the points after it) and a two-variable one (clearance
// 40–120 mm in 20 mm against α 0°–4° in 1°, 25 points, which drops a
// row's solutions once it and the next row are done). After each point
// the benchmark collects the garbage and reads runtime.MemStats: it
// reports the largest live heap seen (live-heap-peak-MB), the live heap
// the map added at its end (results only, live-heap-end-MB) and all
// bytes allocated per map (allocated-MB). Run once: -bench MapMemory
// -benchtime 1x.
func BenchmarkMapMemory(b *testing.B) {
	st, secs := exampleStudy(b, "two-element-ground.json")
	for _, bc := range []struct {
		name   string
		ranges []model.SetupRange
	}{
		{"one variable, 17 points", []model.SetupRange{mustRange(b, "clearance_mm=40:200:10")}},
		{"two variables, 5 by 5", []model.SetupRange{mustRange(b, "clearance_mm=40:120:20"), mustRange(b, "alpha_deg=0:4:1")}},
	} {
		b.Run(bc.name, func(b *testing.B) {
			const mb = 1 << 20
			var peak, end, alloc float64
			var conv int
			for b.Loop() {
				var ms runtime.MemStats
				runtime.GC()
				runtime.ReadMemStats(&ms)
				base, total := ms.HeapAlloc, ms.TotalAlloc
				peak = 0
				pts, err := Map(context.Background(), st, secs, bc.ranges, MapOptions{}, nil, func(Point) {
					var m runtime.MemStats
					runtime.GC()
					runtime.ReadMemStats(&m)
					peak = max(peak, float64(m.HeapAlloc)-float64(base))
				})
				if err != nil {
					b.Fatal(err)
				}
				runtime.GC()
				runtime.ReadMemStats(&ms)
				end, alloc = (float64(ms.HeapAlloc)-float64(base))/mb, float64(ms.TotalAlloc-total)/mb
				conv = 0
				for _, p := range pts {
					if p.Converged {
						conv++
					}
				}
				runtime.KeepAlive(pts)
			}
			b.ReportMetric(peak/mb, "live-heap-peak-MB")
			b.ReportMetric(end, "live-heap-end-MB")
			b.ReportMetric(alloc, "allocated-MB")
			b.ReportMetric(float64(conv), "converged-points")
		})
	}
}
