package engine

import "math"

// Quantity is what a set-up map or search shows of each Point: the load
// the wing is mounted for, drag, their ratio, Cm, or where the suction
// side separates first.
type Quantity int

// The quantities, in the order the app and the report list them.
const (
	QuantityLoad Quantity = iota // downforce inverted, lift upright
	QuantityDrag
	QuantityLiftToDrag
	QuantityCm
	QuantitySeparation // the earliest suction-side separation of any element, x/c (1: attached)
	NumQuantities
)

// Label names the quantity with its unit: forces in N/m of span when
// forces is true (the study has a speed), coefficients otherwise.
func (q Quantity) Label(inverted, forces bool) string {
	switch q {
	case QuantityLoad:
		switch {
		case inverted && forces:
			return "downforce (N/m)"
		case inverted:
			return "downforce coefficient −Cl"
		case forces:
			return "lift (N/m)"
		}
		return "lift coefficient Cl"
	case QuantityDrag:
		if forces {
			return "drag (N/m)"
		}
		return "drag coefficient Cd"
	case QuantityLiftToDrag:
		if inverted {
			return "downforce to drag"
		}
		return "lift to drag"
	case QuantityCm:
		return "pitching moment coefficient Cm"
	}
	return "suction-side separation, x/c (1: attached)"
}

// Short is the quantity's name in a readout.
func (q Quantity) Short(inverted bool) string {
	switch q {
	case QuantityLoad:
		if inverted {
			return "downforce"
		}
		return "lift"
	case QuantityDrag:
		return "drag"
	case QuantityLiftToDrag:
		return "L/D"
	case QuantityCm:
		return "Cm"
	}
	return "separation x/c"
}

// NeedsViscous reports a quantity only the viscous solution gives.
func (q Quantity) NeedsViscous() bool {
	return q == QuantityDrag || q == QuantityLiftToDrag || q == QuantitySeparation
}

// Value returns the quantity at p, NaN where it has none (not converged,
// not solved, no drag or separation without the viscous solution): the
// load and drag in N/m when forces is true, else their coefficients.
func (q Quantity) Value(p *Point, forces bool) float64 {
	if !p.Converged || p.Err != "" {
		return math.NaN()
	}
	switch q {
	case QuantityLoad:
		if forces {
			if p.Inverted {
				return p.DownforcePerSpan
			}
			return p.LiftPerSpan
		}
		return p.Load()
	case QuantityDrag:
		if forces {
			return p.DragPerSpan
		}
		return p.Cd
	case QuantityLiftToDrag:
		return p.Load() / p.Cd
	case QuantityCm:
		return p.Cm
	}
	if !p.Viscous {
		return math.NaN()
	}
	first := 1.0
	for _, e := range p.Elements {
		if e.SeparationSuction < first { // false for NaN: attached
			first = e.SeparationSuction
		}
	}
	return first
}
