package engine

// Meets reports whether a solved point meets every constraint of the
// search options (converged, attached, gaps, clearance, and the load
// target of the drag objective), as the search judges it: a window can
// mark the path's points the search counted.
func (o SearchOptions) Meets(p *Point) bool {
	_, ok := searchValue(p, o)
	return ok
}
