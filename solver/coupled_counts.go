package solver

import "sync/atomic"

// CoupledCounts are running totals of the coupled solution's work, over
// every SolveCoupled of the process since it started: the Newton steps
// (each one assembly of the Jacobian and one solve of the mass-defect
// system), the LU factorisations of that system (O(n³) each, the rest of
// a step O(n²)) and the solves that went through GMRES on kept factors
// instead (coupled_linear.go). Benchmarks report their differences per
// operation: the work a change saves, counted, where wall time on a
// shared machine only hints at it.
type CoupledCounts struct {
	NewtonSteps    int64
	Factorisations int64
	KrylovSolves   int64
}

// Sub returns the counts of c less those of d (the work between two
// readings).
func (c CoupledCounts) Sub(d CoupledCounts) CoupledCounts {
	return CoupledCounts{
		NewtonSteps:    c.NewtonSteps - d.NewtonSteps,
		Factorisations: c.Factorisations - d.Factorisations,
		KrylovSolves:   c.KrylovSolves - d.KrylovSolves,
	}
}

var counts struct {
	newtonSteps, factorisations, krylovSolves atomic.Int64
}

// ReadCoupledCounts returns the totals now.
func ReadCoupledCounts() CoupledCounts {
	return CoupledCounts{
		NewtonSteps:    counts.newtonSteps.Load(),
		Factorisations: counts.factorisations.Load(),
		KrylovSolves:   counts.krylovSolves.Load(),
	}
}
