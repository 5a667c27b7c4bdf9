package format

import (
	"bufio"
	"fmt"
	"io"
	"sectionbench/export/geometry"
	"strconv"

	"sectionbench/model"
)

// dxfColours gives each layer its ACI colour number (AutoCAD DXF
// Reference: 1 red, 5 blue, 7 white/black, 8 grey); red cut and blue mark
// follow the habit of laser-cutting shops (common practice).
var dxfColours = map[string]int{
	geometry.LayerCut: 1, geometry.LayerMark: 5, geometry.LayerEngrave: 7, geometry.LayerReference: 8, geometry.LayerTitle: 7,
}

// dxfDecimals is the number of decimals of coordinates in millimetres
// written to DXF: a tenth of a micrometre.
const dxfDecimals = 4

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

// polyline writes an R12 POLYLINE with its VERTEX entities and SEQEND.
func (d *dxfWriter) polyline(layer string, pts []model.Point, closed bool) {
	d.pair(0, "POLYLINE")
	d.pair(8, layer)
	d.int(66, 1) // vertices follow
	d.point(10, model.Point{})
	flags := 0
	if closed {
		flags = 1
	}
	d.int(70, flags)
	for _, p := range pts {
		d.pair(0, "VERTEX")
		d.pair(8, layer)
		d.point(10, p)
	}
	d.pair(0, "SEQEND")
	d.pair(8, layer)
}

// WriteDXF writes the outline's drawing (Outline.Drawing) as an ASCII DXF
// compatible with Release 12 (AutoCAD DXF Reference, R12 group codes): a
// HEADER with $ACADVER AC1009, $INSUNITS 4 (millimetres) and $MEASUREMENT 1
// (metric), a TABLES section with the line type and the layers of
// geometry.Layers, and ENTITIES: a POLYLINE (two points: a LINE) per path,
// a CIRCLE per circle and a TEXT per text, each on its layer.
func WriteDXF(w io.Writer, o *geometry.Outline) error {
	if o == nil {
		panic("format: nil outline")
	}
	dr := o.Drawing()
	d := &dxfWriter{w: bufio.NewWriter(w)}
	d.pair(999, "Sectionbench drawing, millimetres, 1:1")
	d.pair(0, "SECTION")
	d.pair(2, "HEADER")
	d.pair(9, "$ACADVER")
	d.pair(1, "AC1009")
	d.pair(9, "$INSUNITS")
	d.int(70, 4)
	d.pair(9, "$MEASUREMENT")
	d.int(70, 1)
	d.pair(9, "$EXTMIN")
	d.point(10, model.Point{})
	d.pair(9, "$EXTMAX")
	d.point(10, model.Point{X: dr.Width, Y: dr.Height})
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
	d.int(70, len(dr.Layers))
	for _, l := range dr.Layers {
		d.pair(0, "LAYER")
		d.pair(2, l.Name)
		d.int(70, 0)
		d.int(62, dxfColours[l.Name])
		d.pair(6, "CONTINUOUS")
	}
	d.pair(0, "ENDTAB")
	d.pair(0, "ENDSEC")

	d.pair(0, "SECTION")
	d.pair(2, "ENTITIES")
	for _, l := range dr.Layers {
		for _, p := range l.Paths {
			if len(p.Points) == 2 && !p.Closed {
				d.pair(0, "LINE")
				d.pair(8, l.Name)
				d.point(10, p.Points[0])
				d.point(11, p.Points[1])
				continue
			}
			d.polyline(l.Name, p.Points, p.Closed)
		}
		for _, c := range l.Circles {
			d.pair(0, "CIRCLE")
			d.pair(8, l.Name)
			d.point(10, c.Centre)
			d.num(40, c.Radius)
		}
		for _, t := range l.Texts {
			d.pair(0, "TEXT")
			d.pair(8, l.Name)
			d.point(10, t.At)
			d.num(40, t.Height)
			d.pair(1, t.Text)
		}
	}
	d.pair(0, "ENDSEC")
	d.pair(0, "EOF")
	if d.err != nil {
		return d.err
	}
	return d.w.Flush()
}
