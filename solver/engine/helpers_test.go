package engine

import (
	"sectionbench/model"
	"sectionbench/model/modeltest"
	"sectionbench/solver"
)

// nacaSystem is a NACA section on a unit chord, repanelled with cosine
// spacing at the given count as the workbench does, factorised in free air
// with the moment about the quarter chord.
func nacaSystem(digits string, panels int) (*solver.System, error) {
	base, err := model.NACA(digits, model.NACAOptions{})
	if err != nil {
		return nil, err
	}
	sec, err := model.Repanel(base, model.Panelling{Panels: panels, Spacing: model.SpacingCosine})
	if err != nil {
		return nil, err
	}
	return solver.NewSystem(solver.Config{
		Elements:  []solver.Element{{Name: "NACA " + digits, Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}},
		RefChord:  1,
		MomentRef: model.Point{X: 0.25},
	})
}

// relErr is the shared relative error of the project's checks.
var relErr = modeltest.RelErr
