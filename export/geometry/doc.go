// Package geometry builds the geometry manufacturing needs from a placed
// configuration: the inward skin offset of each element's contour
// (InwardOffset), spar holes and marks, and the Outline of rib templates
// or of the assembly that package format writes as DXF and SVG.
//
// Units and frames: millimetres throughout (a model.Layout's metres ×
// 1000). A template lies with its chord along +x and its leading edge at
// the origin; the assembly keeps the study frame as mounted (x downstream,
// y up). Contours run trailing edge → upper surface → leading edge → lower
// surface, counter-clockwise, as in package model.
package geometry
