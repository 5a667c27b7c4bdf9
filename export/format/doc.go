// Package format writes files other programs read: section coordinates
// (text and CSV), result tables (CSV: Cp, sweep, boundary layer) and the
// manufacturing outline of package geometry as DXF (R12) and SVG.
//
// Every writer takes an io.Writer and writes nothing else; the caller
// chooses the file, atomically through export.WriteFileAtomic.
//
// Units: coordinates in millimetres unless the options ask for unit chord;
// table lengths in millimetres, angles in degrees, x/c along the element's
// own chord from its leading edge. DXF and SVG drawings are 1:1 in
// millimetres with y up in the drawing (SVG flips it for its y-down
// canvas).
package format
