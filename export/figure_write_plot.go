package export

import (
	"fmt"
	"io"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"
)

// WritePlot writes a plot made by one of the package's plot builders
// (DensityLEPlot, PanelSizesPlot) to w as "png", "svg" or "pdf", widthIn ×
// heightIn inches, as WriteFigure writes a view; dpi is used by PNG only.
// It panics on a non-positive size or PNG resolution.
func WritePlot(w io.Writer, p *plot.Plot, format string, widthIn, heightIn, dpi float64) error {
	if !(widthIn > 0 && heightIn > 0) {
		panic(fmt.Sprintf("export: bad figure size %g × %g in", widthIn, heightIn))
	}
	wl, hl := vg.Length(widthIn)*vg.Inch, vg.Length(heightIn)*vg.Inch
	var cv vg.CanvasWriterTo
	switch strings.ToLower(format) {
	case FormatPNG:
		if !(dpi > 0) {
			panic(fmt.Sprintf("export: bad dpi %g", dpi))
		}
		cv = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(wl, hl), vgimg.UseDPI(int(math.Round(dpi))))}
	case FormatSVG:
		cv = vgsvg.New(wl, hl)
	case FormatPDF:
		cv = vgpdf.New(wl, hl)
	default:
		return fmt.Errorf("export: %q (want png, svg or pdf): %w", format, ErrFormat)
	}
	p.Draw(draw.New(cv))
	_, err := cv.WriteTo(w)
	return err
}
