package format

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"sectionbench/export/geometry"
	"strconv"
	"strings"

	"sectionbench/model"
)

// SVG drawing constants, in millimetres.
const (
	// svgHairlineMM is the stroke of cut geometry: a hairline, which
	// laser-cutter drivers take as "cut" (0.001 in, common practice).
	svgHairlineMM = 0.0254
	svgStrokeMM   = 0.25 // other lines, a fine pen
	svgDecimals   = 3    // a micrometre
)

// svgStyle gives each layer its stroke: red hairline cut, blue mark, black
// engrave, grey reference, black title (the colours of the DXF layers).
var svgStyle = map[string]struct {
	colour string
	width  float64
}{
	geometry.LayerCut: {"#ff0000", svgHairlineMM}, geometry.LayerMark: {"#0000ff", svgStrokeMM / 2},
	geometry.LayerEngrave: {"#000000", svgStrokeMM}, geometry.LayerReference: {"#808080", svgStrokeMM / 2},
	geometry.LayerTitle: {"#000000", svgStrokeMM},
}

func svgNum(v float64) string {
	s := strconv.FormatFloat(v, 'f', svgDecimals, 64)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	if s == "-0" || s == "" {
		return "0"
	}
	return s
}

func svgEscape(s string) string {
	var b strings.Builder
	xml.EscapeText(&b, []byte(s))
	return b.String()
}

// svgPath returns a path through pts with y flipped about the drawing's
// height h (SVG's y grows downwards), closed when asked.
func svgPath(pts []model.Point, closed bool, h float64) string {
	var b strings.Builder
	for i, p := range pts {
		if i == 0 {
			b.WriteString("M")
		} else {
			b.WriteString(" L")
		}
		b.WriteString(svgNum(p.X))
		b.WriteByte(' ')
		b.WriteString(svgNum(h - p.Y))
	}
	if closed {
		b.WriteString(" Z")
	}
	return b.String()
}

// WriteSVG writes the outline's drawing (Outline.Drawing) as SVG at true
// scale: width and height in millimetres with a viewBox in millimetres from
// (0, 0), so that one user unit is one millimetre when printed at 100 %.
// Each layer of geometry.Layers is a group whose id is the layer's name,
// holding the same paths, circles and texts as the DXF; cut geometry is
// stroked as a hairline.
func WriteSVG(w io.Writer, o *geometry.Outline) error {
	if o == nil {
		panic("format: nil outline")
	}
	dr := o.Drawing()
	h := dr.Height
	bw := bufio.NewWriter(w)
	p := func(format string, args ...any) { fmt.Fprintf(bw, format, args...) }
	p("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n")
	p("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"%smm\" height=\"%smm\" viewBox=\"0 0 %s %s\">\n",
		svgNum(dr.Width), svgNum(h), svgNum(dr.Width), svgNum(h))
	p("<title>%s</title>\n", svgEscape(dr.Name+" (drawing, millimetres, 1:1)"))
	for _, l := range dr.Layers {
		st := svgStyle[l.Name]
		p("<g id=\"%s\" fill=\"none\" stroke=\"%s\" stroke-width=\"%s\" stroke-linejoin=\"round\">\n", l.Name, st.colour, svgNum(st.width))
		for _, q := range l.Paths {
			p("<path d=\"%s\"/>\n", svgPath(q.Points, q.Closed, h))
		}
		for _, c := range l.Circles {
			p("<circle cx=\"%s\" cy=\"%s\" r=\"%s\"/>\n", svgNum(c.Centre.X), svgNum(h-c.Centre.Y), svgNum(c.Radius))
		}
		for _, t := range l.Texts {
			p("<text x=\"%s\" y=\"%s\" font-size=\"%s\" font-family=\"Liberation Sans, Arial, Helvetica, sans-serif\" fill=\"%s\" stroke=\"none\">%s</text>\n",
				svgNum(t.At.X), svgNum(h-t.At.Y), svgNum(t.Height), st.colour, svgEscape(t.Text))
		}
		p("</g>\n")
	}
	p("</svg>\n")
	return bw.Flush()
}
