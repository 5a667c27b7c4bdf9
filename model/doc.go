// Package model holds the geometry of Sectionbench: sections, the section
// generators, coordinate-file parsing, cleaning, repanelling, the placement of
// elements in a configuration, the air and the study. It imports no GUI and no
// solver and does no file or network I/O of its own: readers and byte slices
// come in, values and typed errors go out.
//
// # Frames and units
//
// A Section is non-dimensional: after cleaning, the leading edge is at (0, 0)
// and the trailing edge at (1, 0), x along the chord towards the trailing
// edge, y up (towards the upper surface). Its points form one closed contour
// that starts at the trailing edge, runs over the upper surface to the leading
// edge and returns along the lower surface to the trailing edge. That is
// counter-clockwise: the body lies to the left of the direction of travel. An
// open (blunt) trailing edge keeps its first and last points apart; the gap
// between them is not part of the contour.
//
// A Study describes elements in millimetres as mounted (FrameText): x
// downstream (the freestream direction at zero angle of attack), y up, away
// from the ground. An element's position is that of its leading edge; its
// setting angle is in degrees about its own leading edge. A Layout places
// the elements in metres in the same frame, ready for the solver.
//
// # Angles and signs
//
// Angles in the public API are in degrees unless a name says otherwise.
// Angles of attack, setting angles and flap deflections are positive in the
// sense that loads the wing (AngleSense): nose-up on an upright wing; on an
// inverted wing a positive angle lowers the leading edge towards the ground
// and adds downforce. Inverted mounting turns each section upside down so
// that its suction side faces the ground: Place sets each element in the
// design frame (DesignElement: upright, nose-up positive) and mirrors the
// configuration about y = 0. Cm stays nose-up positive as mounted
// (MomentSense). Multi-element placement uses the trade's gap, overlap and
// deflection (Slot, SlotText). The words every output uses for these
// conventions are in frame.go, so that the app, the command line and the
// report say them the same way.
//
// # Errors
//
// Programmer mistakes (an index out of range, a nil section) panic with a
// "model: " prefix. Bad data returns typed errors carrying context:
// *PointError (which point), *ParseError (which line and column), *FieldError
// (which study field), *ContourError (a contour that cannot be a section),
// *NACAError (which character of a designation), *GeometryError (which
// elements of a configuration). Sentinel errors such as ErrTooFewPoints and
// ErrNonFinite can be matched with errors.Is through any of them.
package model
