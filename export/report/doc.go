// Package report writes the PDF team report of a study: a summary page
// (the forces in newtons, L/D, margin to maximum lift, the setting as
// mounted, confidence and open issues), the inputs with a sign-convention
// sketch, the results with loads per element, every warning, the figures,
// the sweep with its marked rows, the density study, the methods with their
// references and the cautions, and an appendix to reproduce it all.
//
// Frames: every position, angle and moment is as mounted (model.FrameText,
// model.AngleSense); coefficients keep the standard sense (Cl positive up)
// beside the downforce of an inverted wing. The coupled viscous solution
// enters through Input.Coupled; until it runs the report says what is not
// known.
//
// Figures are drawn by package export/figure and embedded as PNG images rendered
// at FigureDPI. fpdf cannot place another PDF's vector pages, and its SVG
// import draws paths but no text, so a figure's labels would be lost; a
// 300 dpi raster prints as sharp as the printers a team uses and keeps
// every figure exactly as the workbench draws it. Text and tables are real
// PDF text in an embedded Unicode font (Liberation Sans), so they can be
// searched and copied.
package report
