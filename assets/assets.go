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
