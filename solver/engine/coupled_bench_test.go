package engine

import (
	"context"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
)

// A 41-angle coupled viscous polar, one element (NACA 0012, 160 panels,
// Re 6e6 tripped at 5 %, −10° to 10° in 0.5° steps), through the engine's
// sweep (outward from 0°, warm-started, failed rows retried). Target
// (issue "Coupled viscous solution"): 1 s on the project's 2-core
// machine. Reports how many rows converged.
func BenchmarkCoupledPolar41(b *testing.B) {
	st, secs := engineStudy(b, "0012")
	st.Elements[0].ChordMM = 1000
	st.Flow.Reynolds = 6e6
	st.Viscous = model.Viscous{Enabled: true, Mode: model.ViscousCoupled, TripUpper: 0.05, TripLower: 0.05}
	st.Sweep = model.SweepRange{FromDeg: -10, ToDeg: 10, StepDeg: 0.5}
	var conv int
	defer reportCounts(b, solver.ReadCoupledCounts())()
	for b.Loop() {
		res, err := NewEngine().Run(context.Background(), Request{Study: st, Sections: secs, Sweep: true})
		if err != nil {
			b.Fatal(err)
		}
		conv = 0
		for _, r := range res.SweepCoupled {
			if r.Converged {
				conv++
			}
		}
	}
	b.ReportMetric(float64(conv), "converged-rows")
}

// reportCounts returns a function that reports the coupled solution's
// work per operation since c0 (solver.CoupledCounts): the Newton steps
// and the factorisations of their mass-defect systems, which on this
// shared machine say more than the time does.
func reportCounts(b *testing.B, c0 solver.CoupledCounts) func() {
	return func() {
		d := solver.ReadCoupledCounts().Sub(c0)
		n := float64(max(b.N, 1))
		b.ReportMetric(float64(d.NewtonSteps)/n, "newton-steps/op")
		b.ReportMetric(float64(d.Factorisations)/n, "factorisations/op")
	}
}
