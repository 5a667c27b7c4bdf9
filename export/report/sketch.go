package report

import (
	"math"
	"strings"

	"codeberg.org/go-pdf/fpdf"

	"sectionbench/model"
)

// Sign-convention sketch geometry, millimetres on the page.
const (
	sketchHMM     = 50 // least height of the sketch
	sketchWMM     = 90 // width of the drawing part; the words go right of it
	sketchAngle   = 10 // degrees the sketched chord is turned, in the positive sense
	sketchChordMM = 46
)

// signSketch draws the as-mounted frame: the ground, the freestream, a
// chord line turned by a positive angle with its arc, the positive force
// and the positive pitching moment, with the words of package model beside
// it, so that every number in the report reads one way.
func (r *writer) signSketch() {
	st := r.in.Study
	p := r.pdf
	words := "Positions " + model.FrameText + ".\nAngles (α, setting, deflection): " + model.AngleSense(st.Inverted) +
		".\nFlap deflection: " + model.DeflectionSense(st.Inverted) + ".\nCm: " + model.MomentSense(st.Inverted) +
		".\nForce: " + model.LiftSense(st.Inverted) + "; the tables also give Cl in the standard sense (positive up)."
	const lineH = 3.6
	p.SetFont(fontFamily, "", 7.5)
	tw := r.width() - sketchWMM - 6
	n := 0
	for _, para := range strings.Split(words, "\n") {
		n += len(p.SplitText(para, tw))
	}
	h := math.Max(sketchHMM, float64(n)*lineH+4)
	r.need(h + 4)
	x0, y0 := float64(marginMM), p.GetY()
	at := func(x, y float64) (float64, float64) { return x0 + x, y0 + y }
	line := func(x1, y1, x2, y2 float64) {
		a, b := at(x1, y1)
		c, d := at(x2, y2)
		p.Line(a, b, c, d)
	}
	text := func(x, y float64, s string) {
		a, b := at(x, y)
		p.Text(a, b, s)
	}
	p.SetDrawColor(60, 66, 74)
	p.SetLineWidth(0.3)
	p.Rect(x0, y0, r.width(), h, "D")
	p.SetFont(fontFamily, "", 7)
	// The ground along the bottom, or nothing in free air.
	gy := h - 5
	if st.Ground.Enabled {
		p.SetLineWidth(0.5)
		line(4, gy, sketchWMM-4, gy)
		p.SetLineWidth(0.2)
		for x := 7.0; x < sketchWMM-4; x += 3 {
			line(x, gy, x-2, gy+2.5)
		}
		text(sketchWMM-16, gy-1.5, "ground")
	}
	// Axes and the freestream.
	p.SetLineWidth(0.3)
	ax, ay := 6.0, gy-6
	a1, b1 := at(ax, ay)
	arrow(p, a1, b1, a1+10, b1)
	arrow(p, a1, b1, a1, b1-10)
	text(ax+11, ay+1, "x")
	text(ax-1.2, ay-11.5, "y")
	a2, b2 := at(6, 9)
	arrow(p, a2, b2, a2+14, b2)
	text(7, 7, "U∞")
	// The chord line turned by a positive angle: the leading edge up on an
	// upright wing (nose-up), down towards the ground on an inverted one.
	sense := 1.0 // the trailing edge lies above the leading edge on the page
	if !st.Inverted {
		sense = -1
	}
	ang := sketchAngle * math.Pi / 180
	lex, ley := 30.0, 22+sense*sketchChordMM*math.Sin(ang)/2
	tex, tey := lex+sketchChordMM*math.Cos(ang), ley-sense*sketchChordMM*math.Sin(ang)
	p.SetLineWidth(0.7)
	line(lex, ley, tex, tey)
	p.SetLineWidth(0.2)
	p.SetDashPattern([]float64{1, 1}, 0)
	line(lex, ley, lex+30, ley)
	p.SetDashPattern(nil, 0)
	text(lex-17, ley+1, "leading edge")
	// The angle's arc at the leading edge, from the horizontal to the chord
	// (fpdf's angles run counter-clockwise on the page).
	start, end := 0.0, float64(sketchAngle)
	if sense < 0 {
		start, end = 360-sketchAngle, 360
	}
	cx, cy := at(lex, ley)
	p.Arc(cx, cy, 22, 22, 0, start, end, "D")
	text(lex+23, ley+sense*-1.5+1, "+α")
	// The positive force at the quarter chord.
	qx, qy := lex+0.25*(tex-lex), ley+0.25*(tey-ley)
	name, dy := "lift +", -9.0
	if st.Inverted {
		name, dy = "downforce +", 9.0
	}
	p.SetDrawColor(29, 79, 145)
	p.SetLineWidth(0.4)
	a3, b3 := at(qx, qy)
	arrow(p, a3, b3, a3, b3+dy)
	text(qx+1.5, qy+dy/2+1, name)
	// The positive (nose-up, clockwise on the page) moment about a point
	// on the chord: an arc over it with its head at the right.
	mx, my := lex+0.7*(tex-lex), ley+0.7*(tey-ley)
	p.SetDrawColor(150, 60, 30)
	ccx, ccy := at(mx, my)
	const mr = 4.0
	p.Arc(ccx, ccy, mr, mr, 0, 30, 160, "D")
	th := 30 * math.Pi / 180
	ex, ey := ccx+mr*math.Cos(th), ccy-mr*math.Sin(th)
	arrowHead(p, ex-math.Sin(th), ey-math.Cos(th), ex, ey)
	text(mx-8, my-mr-2, "+Cm nose-up")
	p.SetDrawColor(0, 0, 0)
	// The words.
	p.SetXY(x0+sketchWMM+4, y0+2)
	p.SetFont(fontFamily, "", 7.5)
	p.MultiCell(tw, lineH, words, "", "L", false)
	p.SetXY(x0, y0+h+2)
}

// arrow draws a line from (x1, y1) to (x2, y2) with a head at the end.
func arrow(p *fpdf.Fpdf, x1, y1, x2, y2 float64) {
	p.Line(x1, y1, x2, y2)
	arrowHead(p, x1, y1, x2, y2)
}

// arrowHead draws a filled head at (x2, y2) pointing away from (x1, y1).
func arrowHead(p *fpdf.Fpdf, x1, y1, x2, y2 float64) {
	const l, w = 1.8, 0.8
	dx, dy := x2-x1, y2-y1
	n := math.Hypot(dx, dy)
	if n == 0 {
		return
	}
	ux, uy := dx/n, dy/n
	r, g, b := p.GetDrawColor()
	p.SetFillColor(r, g, b)
	p.Polygon([]fpdf.PointType{{X: x2, Y: y2}, {X: x2 - l*ux - w*uy, Y: y2 - l*uy + w*ux}, {X: x2 - l*ux + w*uy, Y: y2 - l*uy - w*ux}}, "F")
}
