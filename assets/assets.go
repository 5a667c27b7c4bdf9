// Package assets holds the files the desktop app embeds: its icon and the
// demo study it opens on first start.
package assets

import _ "embed"

// Icon is the application icon, a 512×512 PNG drawn by genicon.go
// (go run ./assets/genicon.go).
//
//go:embed icon.png
var Icon []byte

// DemoStudy is the study the app opens when it is started without one: an
// invented rear-wing main element of a fictional student team, at 60 km/h
// (16.7 m/s).
//
//go:embed demo-study.json
var DemoStudy []byte

// Example is a study offered under File ▸ Examples. Its data are invented
// and its name and team say so.
type Example struct {
	Title string // the menu item
	Study []byte
}

// exampleTwoElement opens with the coupled viscous solution on, its
// boundary layers tripped at 5 % chord on every surface (a trip strip; the
// data are invented like the rest). With free transition the coupled
// equations of its 2 mm slot have several roots (laminar bubbles on the
// main's slot side and the flap's suction side; DEVELOPERS.md), and its
// sweep converges at 12–14 of 15 angles, on more than one root, half its
// rows with transition held upstream of its e^N position; tripped, every
// angle converges on one smooth curve in about a sixth of the time.
//
//go:embed examples/two-element-ground.json
var exampleTwoElement []byte

//go:embed examples/single-free-air.json
var exampleSingle []byte

// Examples are the example studies, in menu order.
var Examples = []Example{
	{"Two-element inverted rear wing in ground effect", exampleTwoElement},
	{"Single element in free air", exampleSingle},
}
