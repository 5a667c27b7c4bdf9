package solver

import "sectionbench/model"

// LayoutConfig returns the configuration of a placed study (model.Layout)
// at angle of attack alphaDeg, and the freestream angle to solve it at:
// α in free air (−α when inverted), 0 above the ground, where the layout
// itself pitches (model.Layout.At). Lengths stay in metres.
func LayoutConfig(l *model.Layout, alphaDeg float64) (cfg Config, freestreamDeg float64) {
	elems, groundY, fs := l.At(alphaDeg)
	cfg = Config{Ground: l.Ground, GroundY: groundY, RefChord: l.RefChordM, MomentRef: l.MomentRef}
	for _, e := range elems {
		cfg.Elements = append(cfg.Elements, Element{Name: e.Name, Nodes: e.Nodes, LE: e.LE})
	}
	return cfg, fs
}
