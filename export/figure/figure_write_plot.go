package figure

import (
	"io"

	"gonum.org/v1/plot"
)

// WritePlot writes a plot made by one of the package's plot builders
// (DensityLEPlot, PanelSizesPlot) to w as "png", "svg" or "pdf", widthIn ×
// heightIn inches, as WriteFigure writes a view; dpi is used by PNG only.
// It panics on a non-positive size or PNG resolution.
func WritePlot(w io.Writer, p *plot.Plot, format string, widthIn, heightIn, dpi float64) error {
	cv, err := figureCanvas(format, widthIn, heightIn, dpi)
	if err != nil {
		return err
	}
	return writePlot(w, cv, p, viewInfo{})
}
