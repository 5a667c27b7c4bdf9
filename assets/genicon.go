//go:build ignore

// Genicon draws the application icon: a cambered section at a small angle
// of attack in a flow whose streamlines part around it, on a rounded
// square. Run from the repository root:
//
//	go run ./assets/genicon.go
package main

import (
	"image/color"
	"image/png"
	"log"
	"math"
	"os"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgimg"

	"sectionbench/model"
)

const size = 512 // icon side, px (one vg point per pixel at 72 dpi)

var (
	background = color.RGBA{0x1d, 0x35, 0x57, 0xff}
	stream     = color.RGBA{0x7f, 0xc8, 0xe0, 0xff}
	body       = color.RGBA{0xf5, 0xf1, 0xe6, 0xff}
	edge       = color.RGBA{0xf0, 0x8a, 0x24, 0xff}
)

func main() {
	c := vgimg.NewWith(vgimg.UseWH(size, size), vgimg.UseDPI(72))
	roundedSquare(c, 16, 96)

	// The section: chord 330 px, centred, nose up by 8°.
	sec, err := model.NACA("4412", model.NACAOptions{})
	if err != nil {
		log.Fatal(err)
	}
	const chord, tilt = 330.0, -8 * math.Pi / 180
	place := func(p model.Point) (float64, float64) {
		q := p.Sub(model.Point{X: 0.5}).Rotate(model.Point{}, tilt)
		return size/2 + chord*q.X, size/2 + chord*q.Y + 10
	}

	// Streamlines: level lines parted by the section's thickness and bent
	// by its lift (upwash ahead, downwash behind). A drawing, not a flow
	// solution.
	c.SetColor(stream)
	c.SetLineWidth(9)
	for _, h := range []float64{-150, -95, -45, 55, 110, 165} {
		var p vg.Path
		for i := 0; i <= 200; i++ {
			x := 70 + float64(i)*(size-140)/200
			u := (x - size/2) / (chord / 2) // −1 at the nose, +1 at the tail
			part := 38 * math.Exp(-u*u*1.6) * math.Exp(-math.Abs(h)/140)
			if h < 0 {
				part = -part * 0.6
			}
			turn := -20 * math.Atan(1.5*u) / (math.Pi / 2) * math.Exp(-math.Abs(h)/160)
			y := size/2 + h + part + turn
			if i == 0 {
				p.Move(vg.Point{X: vg.Length(x), Y: vg.Length(y)})
			} else {
				p.Line(vg.Point{X: vg.Length(x), Y: vg.Length(y)})
			}
		}
		c.Stroke(p)
	}

	var outline vg.Path
	for i := 0; i < sec.Len(); i++ {
		x, y := place(sec.At(i))
		if i == 0 {
			outline.Move(vg.Point{X: vg.Length(x), Y: vg.Length(y)})
		} else {
			outline.Line(vg.Point{X: vg.Length(x), Y: vg.Length(y)})
		}
	}
	outline.Close()
	c.SetColor(body)
	c.Fill(outline)
	c.SetColor(edge)
	c.SetLineWidth(10)
	c.Stroke(outline)

	f, err := os.Create("assets/icon.png")
	if err != nil {
		log.Fatal(err)
	}
	if err := png.Encode(f, c.Image()); err != nil {
		log.Fatal(err)
	}
	if err := f.Close(); err != nil {
		log.Fatal(err)
	}
}

// roundedSquare fills the icon's background inset by m with corner radius r.
func roundedSquare(c *vgimg.Canvas, m, r float64) {
	var p vg.Path
	lo, hi := m, size-m
	pt := func(x, y float64) vg.Point { return vg.Point{X: vg.Length(x), Y: vg.Length(y)} }
	p.Move(pt(lo+r, lo))
	p.Line(pt(hi-r, lo))
	p.Arc(pt(hi-r, lo+r), vg.Length(r), -math.Pi/2, math.Pi/2)
	p.Line(pt(hi, hi-r))
	p.Arc(pt(hi-r, hi-r), vg.Length(r), 0, math.Pi/2)
	p.Line(pt(lo+r, hi))
	p.Arc(pt(lo+r, hi-r), vg.Length(r), math.Pi/2, math.Pi/2)
	p.Line(pt(lo, lo+r))
	p.Arc(pt(lo+r, lo+r), vg.Length(r), math.Pi, math.Pi/2)
	p.Close()
	c.SetColor(background)
	c.Fill(p)
}
