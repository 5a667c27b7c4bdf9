package session

import (
	"reflect"
	"strings"

	"sectionbench/model"
)

// changeMaxParts is how many settings a change label names before it
// ends with "…": a menu item stays short.
const changeMaxParts = 2

// changeLabel names what going from study from to study to sets, with
// to's values ("flap deflection 17.7°", "α=2°"): the settings that change
// the solution as a pin label names them, then the others (viscous mode,
// span, sweep, name, pins…). It is "" when nothing differs that it knows
// of. toSecs may be nil: a flap's gap is then named without its value.
func changeLabel(from, to *model.Study, fromSecs, toSecs []*model.Section) string {
	parts := settingDiffs(from, to, fromSecs, toSecs)
	add := func(differs bool, s string) {
		if differs {
			parts = append(parts, s)
		}
	}
	add(from.Viscous.Mode != to.Viscous.Mode, "viscous mode "+string(to.Viscous.Mode))
	add(from.Viscous.TransitionN != to.Viscous.TransitionN, "transition N "+Number(to.Viscous.TransitionN))
	add(from.Flow.SpanM != to.Flow.SpanM, "span "+Number(to.Flow.SpanM)+" m")
	add(from.Flow.EndPlateHeightMM != to.Flow.EndPlateHeightMM, "end plates "+Number(to.Flow.EndPlateHeightMM)+" mm")
	add(from.ReferenceChordMM != to.ReferenceChordMM, "reference chord "+Number(to.ReferenceChordMM)+" mm")
	add(from.Sweep != to.Sweep, "sweep "+Number(to.Sweep.FromDeg)+"° to "+Number(to.Sweep.ToDeg)+"°")
	add(!reflect.DeepEqual(from.Density, to.Density), "density study settings")
	add(from.Name != to.Name, "name “"+to.Name+"”")
	add(from.Team != to.Team, "team")
	add(!reflect.DeepEqual(from.Pins, to.Pins), "pins")
	add(len(parts) == 0 && !reflect.DeepEqual(from.Elements, to.Elements), "elements")
	if len(parts) > changeMaxParts {
		parts = append(parts[:changeMaxParts], "…")
	}
	return strings.Join(parts, ", ")
}

// UndoLabel names what Undo would set, "" when there is no step or
// nothing to name. UI goroutine.
func (c *Controller) UndoLabel() string { return c.stepLabel(c.hist.peekUndo()) }

// RedoLabel names what Redo would set, likewise.
func (c *Controller) RedoLabel() string { return c.stepLabel(c.hist.peekRedo()) }

func (c *Controller) stepLabel(to *model.Study) string {
	cur := c.state.study
	if to == nil || cur == nil {
		return ""
	}
	var toSecs []*model.Section
	if reflect.DeepEqual(sourcesOf(to), c.state.sources) {
		toSecs = c.state.sections // the same sections: a flap's gap has its value
	}
	return changeLabel(cur, to, c.state.sections, toSecs)
}
