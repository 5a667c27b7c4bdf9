package engine

import (
	"math"

	"sectionbench/model"
	"sectionbench/solver"
)

// Forces are the dimensional results when the flow has a speed.
type Forces struct {
	DynamicPressurePa float64
	Density           float64   // kg/m³
	Viscosity         float64   // Pa·s
	LiftPerSpan       float64   // N/m, positive up (away from the ground)
	DownforcePerSpan  float64   // N/m, = −LiftPerSpan
	DragPerSpan       float64   // N/m from the viscous solution, NaN when not available
	MomentPerSpan     float64   // N·m/m about the moment reference, nose-up positive
	ElementLift       []float64 // N/m per element, positive up
	ElementDrag       []float64 // N/m per element from its Cd on its own chord, NaN where not available
	SpanM             float64   // 0 when not given
	// Coupled is true when lift, moment and drag come from the coupled
	// viscous solution; they are then NaN if it did not converge.
	// InviscidLiftPerSpan is the panel method's lift beside them.
	Coupled             bool
	InviscidLiftPerSpan float64
}

// Downforce returns the downforce of a lift, force or coefficient: −lift,
// positive towards the ground. Lift is positive up (away from the ground)
// throughout the package; a wing mounted upside down on a car makes
// downforce, and its results are read with this sign (Forces.DownforcePerSpan
// is Downforce(LiftPerSpan)).
func Downforce(lift float64) float64 { return -lift }

// SpanTotal returns a per-metre force or moment over the span SpanM:
// perSpan × span. This is the two-dimensional value taken as constant
// along the span, with no tip losses or other end effects, so it is an
// upper estimate of what a finite wing makes. It is NaN when no span was
// given (SpanM is 0).
func (f *Forces) SpanTotal(perSpan float64) float64 {
	if !(f.SpanM > 0) {
		return math.NaN()
	}
	return perSpan * f.SpanM
}

// LiftToDrag returns the configuration's Cl/Cd at the study's angle of
// attack: from the coupled solution in coupled mode (NaN unless it
// converged), else with Cl inviscid and Cd from the boundary-layer
// estimate. It is NaN without a viscous solution, or when the estimate
// gives no drag (a surface separated, solver.ViscousResult.Cd is NaN).
func (r *Result) LiftToDrag() float64 {
	if c := r.Coupled; c != nil {
		return c.Cl / c.Cd
	}
	if r.Solution == nil || r.Viscous == nil {
		return math.NaN()
	}
	return r.Solution.Cl / r.Viscous.Cd
}

// reynolds returns each element's Reynolds number on its own chord: from a
// Reynolds number entered directly (taken on the first element's chord and
// scaled by chord), or from speed, chord and air (model.Reynolds).
func reynolds(st *model.Study, l *model.Layout) []float64 {
	re := make([]float64, len(l.Elements))
	switch {
	case st.Flow.Reynolds > 0:
		for i, e := range l.Elements {
			re[i] = st.Flow.Reynolds * e.Chord / l.Elements[0].Chord
		}
	case st.Flow.SpeedMPS > 0:
		air, err := model.AirFromCelsius(st.Flow.TemperatureC, st.Flow.PressurePa)
		if err != nil {
			return nil // Validate has already refused this
		}
		for i, e := range l.Elements {
			re[i] = model.Reynolds(st.Flow.SpeedMPS, e.Chord, air)
		}
	default:
		return nil
	}
	return re
}

// forces turns coefficients into forces per metre of span:
// L' = q c_ref Cl, M' = q c_ref² Cm, D' = q c_ref Cd, with q = ½ρV²; from
// the coupled solution cp when there is one, else from the inviscid
// solution (and the estimate's drag).
func forces(st *model.Study, l *model.Layout, sol *solver.Solution, v *solver.ViscousResult, cp *CoupledPoint) *Forces {
	air, err := model.AirFromCelsius(st.Flow.TemperatureC, st.Flow.PressurePa)
	if err != nil {
		return nil
	}
	q := model.DynamicPressure(st.Flow.SpeedMPS, air)
	f := &Forces{
		DynamicPressurePa: q, Density: air.Density(), Viscosity: air.Viscosity(),
		LiftPerSpan:   q * l.RefChordM * sol.Cl,
		MomentPerSpan: q * l.RefChordM * l.RefChordM * sol.Cm,
		DragPerSpan:   math.NaN(),
		SpanM:         st.Flow.SpanM,
	}
	f.DownforcePerSpan = -f.LiftPerSpan
	for i, e := range sol.Elements {
		f.ElementLift = append(f.ElementLift, q*l.Elements[i].Chord*e.Cl)
		f.ElementDrag = append(f.ElementDrag, math.NaN())
	}
	if v != nil && !math.IsNaN(v.Cd) {
		f.DragPerSpan = q * l.RefChordM * v.Cd
	}
	if v != nil {
		for i, e := range v.Elements {
			f.ElementDrag[i] = q * l.Elements[i].Chord * e.Cd
		}
	}
	f.InviscidLiftPerSpan = f.LiftPerSpan
	if cp != nil {
		f.Coupled = true
		f.LiftPerSpan = q * l.RefChordM * cp.Cl
		f.DownforcePerSpan = -f.LiftPerSpan
		f.MomentPerSpan = q * l.RefChordM * l.RefChordM * cp.Cm
		f.DragPerSpan = q * l.RefChordM * cp.Cd
		for i, e := range cp.Elements {
			f.ElementLift[i] = q * l.Elements[i].Chord * e.Cl
			f.ElementDrag[i] = q * l.Elements[i].Chord * e.Cd
		}
	}
	return f
}
