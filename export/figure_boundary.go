package export

import "gonum.org/v1/plot"

// boundaryLayerPlot draws θ, δ*, H and Cf against x/c per surface.
func boundaryLayerPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	return nil, noData(ViewBoundaryLayer, "no boundary-layer result")
}
