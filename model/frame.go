package model

// The words every output uses for the as-mounted frame, so that the app,
// the command line and the report state one sign convention the same way.
//
// The as-mounted frame is what a team measures on the car: x downstream
// (along the freestream at zero angle of attack), y up, away from the
// ground; positions in millimetres in a study, metres in a Layout. Angles
// (angle of attack, setting angles, flap deflection) are positive in the
// sense that loads the wing: on an upright wing a positive angle raises
// the leading edge and adds lift; on an inverted wing it lowers the leading
// edge towards the ground and adds downforce. The pitching moment keeps
// the trade's nose-up sense as mounted whatever the mounting.

// FrameText states the frame of positions.
const FrameText = "as mounted: x downstream, y up (away from the ground), millimetres"

// AngleSense says in words which way a positive angle (angle of attack or
// setting angle) moves the leading edge as mounted and what it does to the
// load.
func AngleSense(inverted bool) string {
	if inverted {
		return "positive lowers the leading edge towards the ground and adds downforce"
	}
	return "positive raises the leading edge (nose-up) and adds lift"
}

// AngleShort is AngleSense for a field label.
func AngleShort(inverted bool) string {
	if inverted {
		return "+ = leading edge down"
	}
	return "+ = nose-up"
}

// DeflectionSense says which way a positive flap deflection turns the flap
// relative to the element before it.
func DeflectionSense(inverted bool) string {
	if inverted {
		return "positive turns the flap's trailing edge up, away from the ground, relative to the element before (more downforce)"
	}
	return "positive turns the flap's trailing edge down relative to the element before (more lift)"
}

// MomentSense states the sign of Cm and moments as mounted.
func MomentSense(inverted bool) string {
	if inverted {
		return "positive nose-up as mounted (raises the leading edge; the opposite sense to a positive angle on this inverted wing)"
	}
	return "positive nose-up (raises the leading edge)"
}

// LiftSense states the sign of the lift coefficient shown and of
// downforce.
func LiftSense(inverted bool) string {
	if inverted {
		return "downforce coefficient −Cl, positive towards the ground"
	}
	return "Cl positive up"
}

// SlotText defines gap, overlap and deflection as the fields use them
// (common practice in high-lift work).
const SlotText = "gap: shortest distance from the trailing edge of the element before to this element's surface; " +
	"overlap: distance along the chord of the element before from its trailing edge to this element's leading edge, positive when the leading edge lies ahead of that trailing edge; " +
	"deflection: this element's chord angle relative to the element before"
