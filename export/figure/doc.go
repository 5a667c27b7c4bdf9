// Package figure draws Sectionbench's figures with gonum/plot.
//
// Each View is built as a *plot.Plot from a Scene by PlotView. Render draws
// one into an *image.RGBA for the desktop app, off the UI thread if the
// caller likes (it shares no state), and returns the transform between
// pixels and data so the cursor can be read as data values. WriteFigure
// writes PNG, SVG or PDF; WritePlot writes any plot the package built.
//
// Units and frames: lengths in the panels and streamlines views are
// millimetres in the study frame (the Layout's metres × 1000, x downstream,
// y up, as mounted); the pressure view uses x/c of each element's own
// chord with Cp negative up; the polar views use the angle of attack in
// degrees, nose-up positive, and Cl in the standard sense (positive away
// from the ground) unless a figure says it shows downforce.
package figure
