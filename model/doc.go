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
// A Study describes elements in millimetres, in the study frame: x downstream
// (the freestream direction at zero angle of attack), y up. An element's
// position is that of its leading edge; its setting angle is in degrees,
// nose-up positive, about its own leading edge. A Layout places the elements
// in metres in the same frame, ready for the solver.
//
// # Angles and signs
//
// Angles in the public API are in degrees unless a name says otherwise.
// Angle of attack is positive nose-up: the freestream comes from the left at
// angle α above the x axis. Inverted mounting mirrors the whole configuration
// about y = 0 so that the suction side faces the ground (y below the wing).
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
