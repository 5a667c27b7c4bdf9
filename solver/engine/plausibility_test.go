package engine

import (
	"math"
	"slices"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
)

func kinds(flags []model.Flag) []model.FlagKind {
	var k []model.FlagKind
	for _, f := range flags {
		k = append(k, f.Kind)
	}
	return k
}

// TestSeparatedFromXC: a point separated ahead of SeparatedFromXC is
// flagged separated, by the coupled solution (when it converged) and by
// the one-way estimate alike; separation in the last tenth of the chord,
// none, or a coupled point that did not converge (flagged as such) are not.
func TestSeparatedFromXC(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		name      string
		converged bool
		upper     float64
		want      bool
	}{
		{"separated from 0.7", true, 0.7, true},
		{"last 5 % only", true, 0.95, false},
		{"attached", true, nan, false},
		{"not converged", false, 0.7, false},
	}
	for _, c := range cases {
		t.Run("coupled, "+c.name, func(t *testing.T) {
			p := &CoupledPoint{Converged: c.converged, Elements: []CoupledElementPoint{{SeparationUpper: c.upper, SeparationLower: nan}}}
			if got := p.Facts().Separated; got != c.want {
				t.Errorf("separated %v, want %v", got, c.want)
			}
		})
		if !c.converged {
			continue
		}
		t.Run("estimate, "+c.name, func(t *testing.T) {
			v := &solver.ViscousResult{Elements: []solver.ElementBL{{}, {}}}
			v.Elements[0].Upper.TurbulentSeparationXC, v.Elements[0].Lower.TurbulentSeparationXC = nan, nan
			v.Elements[1].Upper.TurbulentSeparationXC, v.Elements[1].Lower.TurbulentSeparationXC = nan, c.upper // the flap's
			r := &Result{Solution: &solver.Solution{Elements: []solver.ElementSolution{{CpMin: -2}}}, Viscous: v}
			if got := slices.Contains(kinds(r.Flags()), model.FlagSeparated); got != c.want {
				t.Errorf("flagged separated %v, want %v", got, c.want)
			}
		})
	}
}

// TestRowFlags: each row of a sweep is flagged from its own suction peak,
// the clearance, and the viscous verdict at its angle.
func TestRowFlags(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		name   string
		cpMin  float64
		hOverC float64
		v      *ViscousPoint
		p      *CoupledPoint
		want   []model.FlagKind
	}{
		{"plain", -3, nan, nil, nil, nil},
		{"suction", -9, nan, nil, nil, []model.FlagKind{model.FlagSuction}},
		{"close to the ground", -3, 0.05, nil, nil, []model.FlagKind{model.FlagGround}},
		{"estimate separated", -3, nan, &ViscousPoint{Separated: true}, nil, []model.FlagKind{model.FlagSeparated}},
		{"coupled past Cl max, not converged", -3, nan, nil, &CoupledPoint{PastClMax: true}, []model.FlagKind{model.FlagPastClMax, model.FlagNotConverged}},
		{"inviscid peak beyond, coupled within", -10, nan, nil, &CoupledPoint{Converged: true, Elements: []CoupledElementPoint{{CpMin: -6.6, SeparationUpper: nan, SeparationLower: nan}}}, nil},
		{"coupled peak beyond", -10, nan, nil, &CoupledPoint{Converged: true, Elements: []CoupledElementPoint{{CpMin: -8.5, SeparationUpper: nan, SeparationLower: nan}}}, []model.FlagKind{model.FlagSuction}},
		{"not converged: the inviscid peak", -10, nan, nil, &CoupledPoint{Elements: []CoupledElementPoint{{CpMin: nan}}}, []model.FlagKind{model.FlagNotConverged, model.FlagSuction}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := kinds(RowFlags(solver.Coefficients{CpMin: c.cpMin}, c.hOverC, c.v, c.p))
			if !slices.Equal(got, c.want) {
				t.Errorf("flags %v, want %v", got, c.want)
			}
		})
	}
}

// The separated flag looks at the suction side (the upper surface as
// mounted of an element lifting upwards, the lower of one pushing down)
// from SeparatedFromXC and at the pressure side only from
// PressureSideSeparatedFromXC: a laminar layer leaving the last fifth of
// a pressure side at low Reynolds numbers is no stall.
func TestCoupledSeparatedSuctionSide(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		name         string
		cl, up, low  float64
		wantSeparate bool
	}{
		{"attached", 0.5, nan, nan, false},
		{"upright, suction side from 0.8", 0.5, 0.8, nan, true},
		{"upright, pressure side from 0.85", 0.5, nan, 0.85, false},
		{"upright, pressure side from 0.4", 0.5, nan, 0.4, true},
		{"inverted, suction side from 0.8", -1.2, nan, 0.8, true},
		{"inverted, pressure side from 0.85", -1.2, 0.85, nan, false},
		{"suction side at the trailing edge only", 0.5, 0.95, nan, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := CoupledPoint{Converged: true, Elements: []CoupledElementPoint{{Cl: tc.cl, SeparationUpper: tc.up, SeparationLower: tc.low}}}
			if got := p.Facts().Separated; got != tc.wantSeparate {
				t.Errorf("separated %v, want %v", got, tc.wantSeparate)
			}
		})
	}
}
