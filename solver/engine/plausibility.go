package engine

import (
	"math"

	"sectionbench/model"
	"sectionbench/solver"
)

// SeparatedFromXC: a boundary layer that separates ahead of this x/c and
// stays separated to the trailing edge marks its point separated, for the
// coupled solution and the one-way estimate alike. From memory (Coles &
// Wadcock's NACA 4412 near maximum lift separates at about x/c 0.85): a
// tenth of the chord or more separated is a wing at or past maximum lift,
// and its inviscid lift is not reached.
const SeparatedFromXC = 0.9

// separatedAhead reports whether either surface separates ahead of
// SeparatedFromXC; NaN (none) is attached.
func separatedAhead(upperXC, lowerXC float64) bool {
	return upperXC < SeparatedFromXC || lowerXC < SeparatedFromXC
}

// estimateSeparated reports whether the one-way boundary-layer estimate
// separates ahead of SeparatedFromXC on some element.
func estimateSeparated(v *solver.ViscousResult) bool {
	for _, e := range v.Elements {
		if separatedAhead(e.Upper.TurbulentSeparationXC, e.Lower.TurbulentSeparationXC) {
			return true
		}
	}
	return false
}

// Flags returns the plausibility flags (model.Plausibility) of the result
// at the study's angle: the suction peak over every element (suctionPeak), the ground
// clearance, and the verdict of the coupled viscous solution or, when the
// one-way estimate ran instead, its separation (the lift shown is then
// the inviscid one, which a separated wing does not reach).
func (r *Result) Flags() []model.Flag {
	if r == nil || r.Solution == nil {
		return nil
	}
	cp := math.Inf(1)
	for _, e := range r.Solution.Elements {
		cp = math.Min(cp, e.CpMin)
	}
	f := model.PointFacts{CpMin: suctionPeak(cp, r.Coupled), HOverC: r.Layout.HOverC()}
	switch {
	case r.Coupled != nil:
		f.Viscous = r.Coupled.Facts()
	case r.Viscous != nil:
		f.Viscous = &model.ViscousFacts{Separated: estimateSeparated(r.Viscous)}
	}
	if f.Viscous != nil {
		f.Reynolds = r.Reynolds
	}
	return model.Plausibility(f)
}

// SweepFlags returns the plausibility flags of row i of the result's sweep
// (RowFlags).
func (r *Result) SweepFlags(i int) []model.Flag {
	var v *ViscousPoint
	var p *CoupledPoint
	if i < len(r.SweepViscous) {
		v = &r.SweepViscous[i]
	}
	if i < len(r.SweepCoupled) {
		p = &r.SweepCoupled[i]
	}
	return RowFlags(r.Sweep[i], r.Layout.HOverC(), v, p)
}

// RowFlags returns the plausibility flags of one sweep row c at clearance
// over chord hOverC (NaN in free air), with the one-way estimate's point v
// or the coupled solution's p at its angle when they ran (either may be
// nil): for a sweep kept apart from its result.
func RowFlags(c solver.Coefficients, hOverC float64, v *ViscousPoint, p *CoupledPoint) []model.Flag {
	f := model.PointFacts{CpMin: suctionPeak(c.CpMin, p), HOverC: hOverC}
	switch {
	case p != nil:
		f.Viscous = p.Facts()
	case v != nil:
		f.Viscous = &model.ViscousFacts{Separated: v.Separated}
	}
	return model.Plausibility(f)
}

// suctionPeak is the suction peak a point's flags judge: the coupled
// solution's when it converged (the forces shown are then the viscous
// ones, and its peak lies above the inviscid one as the layers decamber
// the section: NACA 4412 at 13.87°, Re 1.52e6, tripped as Coles and
// Wadcock, −6.6 against −10.2), else the inviscid one, inviscidCpMin.
func suctionPeak(inviscidCpMin float64, p *CoupledPoint) float64 {
	if cp, ok := p.CpMin(); ok {
		return cp
	}
	return inviscidCpMin
}
