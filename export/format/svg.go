package format

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"sectionbench/export/geometry"
	"strconv"
	"strings"

	"sectionbench/model"
)

// SVG drawing constants, in millimetres.
const (
	svgMarginMM    = 10   // blank border round the drawing
	svgStrokeMM    = 0.25 // contour line width, a fine pen
	svgScaleBarGap = 8    // space between the drawing and the scale bar
	svgTextMM      = 3    // text height
	svgDecimals    = 3    // a micrometre
)

// scaleBarLength returns a round length (1, 2 or 5 × 10^k mm) near a
// quarter of width.
func scaleBarLength(width float64) float64 {
	target := width / 4
	if !(target > 0) {
		return 10
	}
	mag := math.Pow(10, math.Floor(math.Log10(target)))
	for _, f := range []float64{5, 2, 1} {
		if f*mag <= target {
			return f * mag
		}
	}
	return mag
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

// svgPath returns a closed path through pts with y flipped (SVG's y grows
// downwards).
func svgPath(pts []model.Point) string {
	var b strings.Builder
	for i, p := range pts {
		if i == 0 {
			b.WriteString("M")
		} else {
			b.WriteString(" L")
		}
		b.WriteString(svgNum(p.X))
		b.WriteByte(' ')
		b.WriteString(svgNum(-p.Y))
	}
	b.WriteString(" Z")
	return b.String()
}

// WriteSVG writes the outline as an SVG drawing at true scale: width and
// height in millimetres with a viewBox in millimetres, so that one user
// unit is one millimetre when printed at 100 %. Each element is a closed
// path (id "element-N"), offsets dashed, chord lines and marks thin, with a
// scale bar below the drawing to check the print scale.
func WriteSVG(w io.Writer, o *geometry.Outline) error {
	if o == nil {
		panic("format: nil outline")
	}
	lo, hi := o.Bounds()
	width := hi.X - lo.X
	bar := scaleBarLength(width)
	// The viewBox in SVG coordinates (y down): x from lo.X − margin, y from
	// −hi.Y − margin (text above the elements included in the margin) to
	// below the scale bar.
	vx := lo.X - svgMarginMM
	vy := -hi.Y - svgMarginMM - svgTextMM
	vw := width + 2*svgMarginMM
	barY := -lo.Y + svgScaleBarGap
	vh := barY + 2*svgTextMM + svgMarginMM - vy
	bw := bufio.NewWriter(w)
	p := func(format string, args ...any) { fmt.Fprintf(bw, format, args...) }
	p("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n")
	p("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"%smm\" height=\"%smm\" viewBox=\"%s %s %s %s\">\n",
		svgNum(vw), svgNum(vh), svgNum(vx), svgNum(vy), svgNum(vw), svgNum(vh))
	p("<title>%s</title>\n", svgEscape(o.Name+" (outline, millimetres, true scale)"))
	p("<g id=\"outline\" fill=\"none\" stroke=\"#000000\" stroke-width=\"%s\" stroke-linejoin=\"round\">\n", svgNum(svgStrokeMM))
	for i, e := range o.Elements {
		p("<path id=\"element-%d\" d=\"%s\"/>\n", i, svgPath(e.Contour))
	}
	p("</g>\n")
	p("<g id=\"rib-inner\" fill=\"none\" stroke=\"#b00000\" stroke-width=\"%s\" stroke-dasharray=\"2 1\">\n", svgNum(svgStrokeMM))
	for i, e := range o.Elements {
		if e.Inner != nil {
			p("<path id=\"rib-%d\" d=\"%s\"/>\n", i, svgPath(e.Inner.Points))
		}
	}
	p("</g>\n")
	p("<g id=\"chord-marks\" fill=\"none\" stroke=\"#404040\" stroke-width=\"%s\">\n", svgNum(svgStrokeMM/2))
	for _, e := range o.Elements {
		if o.ChordLines {
			p("<line x1=\"%s\" y1=\"%s\" x2=\"%s\" y2=\"%s\" stroke-dasharray=\"4 1 1 1\"/>\n", svgNum(e.LE.X), svgNum(-e.LE.Y), svgNum(e.TE.X), svgNum(-e.TE.Y))
		}
		for _, m := range e.Marks {
			r := m.DiameterMM / 2
			cx, cy := m.Centre.X, -m.Centre.Y
			p("<circle cx=\"%s\" cy=\"%s\" r=\"%s\"/>\n", svgNum(cx), svgNum(cy), svgNum(r))
			// Centre cross, a little longer than the hole.
			p("<path d=\"M%s %s H%s M%s %s V%s\"/>\n", svgNum(cx-1.4*r), svgNum(cy), svgNum(cx+1.4*r), svgNum(cx), svgNum(cy-1.4*r), svgNum(cy+1.4*r))
		}
	}
	p("</g>\n")
	p("<g id=\"labels\" font-family=\"Liberation Sans, Arial, Helvetica, sans-serif\" font-size=\"%s\" fill=\"#000000\" stroke=\"none\">\n", svgNum(svgTextMM))
	for _, e := range o.Elements {
		ymax := math.Inf(-1)
		for _, q := range e.Contour {
			ymax = math.Max(ymax, q.Y)
		}
		p("<text x=\"%s\" y=\"%s\">%s</text>\n", svgNum(e.LE.X), svgNum(-ymax-1), svgEscape(e.Name))
		for _, m := range e.Marks {
			if m.Label != "" {
				r := m.DiameterMM / 2
				p("<text x=\"%s\" y=\"%s\" font-size=\"%s\">%s</text>\n", svgNum(m.Centre.X+1.5*r), svgNum(-m.Centre.Y-1.5*r), svgNum(svgTextMM*0.7), svgEscape(m.Label))
			}
		}
	}
	p("</g>\n")
	// Scale bar: a bar of round length with end ticks and its length.
	x0 := lo.X
	p("<g id=\"scale-bar\" stroke=\"#000000\" stroke-width=\"%s\" font-family=\"Liberation Sans, Arial, Helvetica, sans-serif\" font-size=\"%s\">\n", svgNum(svgStrokeMM), svgNum(svgTextMM))
	p("<path fill=\"none\" d=\"M%s %s V%s H%s V%s\"/>\n", svgNum(x0), svgNum(barY-1.5), svgNum(barY), svgNum(x0+bar), svgNum(barY-1.5))
	p("<text stroke=\"none\" fill=\"#000000\" x=\"%s\" y=\"%s\">%s mm (check the print scale)</text>\n", svgNum(x0+bar+2), svgNum(barY), svgNum(bar))
	p("</g>\n")
	p("</svg>\n")
	return bw.Flush()
}
