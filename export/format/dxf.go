package format

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sectionbench/export/geometry"
	"strconv"
	"strings"

	"sectionbench/model"
)

// DXF layers of an outline, one per kind of line so that a cutter or a CAD
// user can switch them separately.
const (
	LayerOutline = "OUTLINE"    // element contours
	LayerRib     = "RIB-INNER"  // inward offsets by the skin thickness
	LayerChord   = "CHORD-LINE" // chord lines
	LayerMarks   = "MARKS"      // reference marks (spar holes)
	LayerLabels  = "LABELS"     // element names
)

// dxfLayers lists the layers with their ACI colour numbers (AutoCAD DXF
// Reference: 7 white/black, 1 red, 8 grey, 5 blue, 3 green).
var dxfLayers = []struct {
	name   string
	colour int
}{
	{LayerOutline, 7}, {LayerRib, 1}, {LayerChord, 8}, {LayerMarks, 5}, {LayerLabels, 3},
}

// dxfDecimals is the number of decimals of coordinates in millimetres
// written to DXF: a tenth of a micrometre.
const dxfDecimals = 4

// labelHeightMM is the height of element labels.
const labelHeightMM = 3

// dxfWriter writes group-code pairs, keeping the first error.
type dxfWriter struct {
	w   *bufio.Writer
	err error
}

func (d *dxfWriter) pair(code int, value string) {
	if d.err != nil {
		return
	}
	_, d.err = fmt.Fprintf(d.w, "%3d\n%s\n", code, value)
}

func (d *dxfWriter) num(code int, v float64) {
	d.pair(code, strconv.FormatFloat(v, 'f', dxfDecimals, 64))
}

func (d *dxfWriter) int(code, v int) { d.pair(code, strconv.Itoa(v)) }

func (d *dxfWriter) point(code int, p model.Point) {
	d.num(code, p.X)
	d.num(code+10, p.Y)
	d.num(code+20, 0)
}

// polyline writes a closed R12 POLYLINE with its VERTEX entities and SEQEND.
func (d *dxfWriter) polyline(layer string, pts []model.Point) {
	d.pair(0, "POLYLINE")
	d.pair(8, layer)
	d.int(66, 1) // vertices follow
	d.point(10, model.Point{})
	d.int(70, 1) // closed
	for _, p := range pts {
		d.pair(0, "VERTEX")
		d.pair(8, layer)
		d.point(10, p)
	}
	d.pair(0, "SEQEND")
	d.pair(8, layer)
}

// dxfText cleans a string for a DXF value: one line, ASCII only (R12 has
// no Unicode), so that any reader takes it.
func dxfText(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r == '\n' || r == '\r' || r == '\t':
			b.WriteByte(' ')
		case r < 0x80:
			b.WriteRune(r)
		default:
			b.WriteByte('?')
		}
	}
	return b.String()
}

// WriteDXF writes the outline as an ASCII DXF drawing compatible with
// Release 12 (AutoCAD DXF Reference, R12 group codes): a HEADER with
// $ACADVER AC1009, $INSUNITS 4 (millimetres) and $MEASUREMENT 1 (metric),
// a TABLES section with the line type and layers, and ENTITIES: one closed
// POLYLINE per element contour (layer OUTLINE), one per inward offset
// (RIB-INNER), a LINE per chord line (CHORD-LINE), a CIRCLE per mark
// (MARKS) and a TEXT with each element's name (LABELS).
func WriteDXF(w io.Writer, o *geometry.Outline) error {
	if o == nil {
		panic("format: nil outline")
	}
	d := &dxfWriter{w: bufio.NewWriter(w)}
	lo, hi := o.Bounds()
	d.pair(999, dxfText("Sectionbench outline: "+o.Name+"; millimetres"))
	d.pair(0, "SECTION")
	d.pair(2, "HEADER")
	d.pair(9, "$ACADVER")
	d.pair(1, "AC1009")
	d.pair(9, "$INSUNITS")
	d.int(70, 4)
	d.pair(9, "$MEASUREMENT")
	d.int(70, 1)
	d.pair(9, "$EXTMIN")
	d.point(10, lo)
	d.pair(9, "$EXTMAX")
	d.point(10, hi)
	d.pair(0, "ENDSEC")

	d.pair(0, "SECTION")
	d.pair(2, "TABLES")
	d.pair(0, "TABLE")
	d.pair(2, "LTYPE")
	d.int(70, 1)
	d.pair(0, "LTYPE")
	d.pair(2, "CONTINUOUS")
	d.int(70, 0)
	d.pair(3, "Solid line")
	d.int(72, 65)
	d.int(73, 0)
	d.num(40, 0)
	d.pair(0, "ENDTAB")
	d.pair(0, "TABLE")
	d.pair(2, "LAYER")
	d.int(70, len(dxfLayers))
	for _, l := range dxfLayers {
		d.pair(0, "LAYER")
		d.pair(2, l.name)
		d.int(70, 0)
		d.int(62, l.colour)
		d.pair(6, "CONTINUOUS")
	}
	d.pair(0, "ENDTAB")
	d.pair(0, "ENDSEC")

	d.pair(0, "SECTION")
	d.pair(2, "ENTITIES")
	for _, e := range o.Elements {
		d.polyline(LayerOutline, e.Contour)
		if e.Inner != nil {
			d.polyline(LayerRib, e.Inner.Points)
		}
		if o.ChordLines {
			d.pair(0, "LINE")
			d.pair(8, LayerChord)
			d.point(10, e.LE)
			d.point(11, e.TE)
		}
		for _, m := range e.Marks {
			d.pair(0, "CIRCLE")
			d.pair(8, LayerMarks)
			d.point(10, m.Centre)
			d.num(40, m.DiameterMM/2)
		}
		// The label sits above the leading edge, clear of the contour.
		ymax := math.Inf(-1)
		for _, p := range e.Contour {
			ymax = math.Max(ymax, p.Y)
		}
		d.pair(0, "TEXT")
		d.pair(8, LayerLabels)
		d.point(10, model.Point{X: e.LE.X, Y: ymax + labelHeightMM})
		d.num(40, labelHeightMM)
		d.pair(1, dxfText(e.Name))
	}
	d.pair(0, "ENDSEC")
	d.pair(0, "EOF")
	if d.err != nil {
		return d.err
	}
	return d.w.Flush()
}
