package model

// PlacedElement is one element of a configuration, repanelled, scaled to
// its chord, set at its angle and moved to its position: ready for the
// solver. Lengths are in metres in the study frame.
type PlacedElement struct {
	Name         string
	Nodes        []Point // panel nodes, trailing edge → upper → leading edge → lower → trailing edge
	LE           int     // index of the leading-edge node
	Chord        float64 // m
	LeadingEdge  Point   // m
	TrailingEdge Point   // m (midpoint of the trailing-edge nodes)
}

// Layout is a placed configuration at zero angle of attack, mirrored if the
// study is inverted. At gives it at any angle of attack.
type Layout struct {
	Elements   []PlacedElement
	Inverted   bool
	Ground     bool
	ClearanceM float64 // ground to the lowest point at the current angle, m
	PitchRef   Point   // point the configuration pitches about in ground effect, m
	MomentRef  Point   // reference point of the configuration's Cm, m
	RefChordM  float64 // reference chord of the configuration's coefficients, m
}
