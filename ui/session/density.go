package session

import (
	"reflect"

	"sectionbench/model"
)

// SetDensityPlan stores the plan in the study (an undoable change) unless
// it is already the study's plan.
func (c *Controller) SetDensityPlan(p model.DensityPlan) error {
	if DensityPlansEqual(p, c.state.study.Density) {
		return nil
	}
	return c.Edit("density", func(st *model.Study) { st.Density = p })
}

// DensityPlansEqual reports whether two density plans list the same
// counts and nose values, in the same order, with the same tolerances.
func DensityPlansEqual(a, b model.DensityPlan) bool {
	if len(a.Panels) != len(b.Panels) || len(a.Nose) != len(b.Nose) || a.TolClPct != b.TolClPct || a.TolCpMinPct != b.TolCpMinPct {
		return false
	}
	for i := range a.Panels {
		if a.Panels[i] != b.Panels[i] {
			return false
		}
	}
	for i := range a.Nose {
		if a.Nose[i] != b.Nose[i] {
			return false
		}
	}
	return true
}

// UseDensityPanels sets the study's panel count, and its nose clustering
// when nose is not the study's: one undoable change.
func (c *Controller) UseDensityPanels(panels int, nose float64) error {
	p := c.editing().Panelling
	p.Panels, p.Nose = panels, nose
	return c.SetPanelling("", p)
}

// SameDensityCase reports whether a density study run on a still holds
// for b: the studies differ at most in the panel count and nose clustering
// (which the study varies), the plan, pins, names and sweep.
func SameDensityCase(a, b *model.Study) bool {
	// Shallow copies: only their own top-level fields are overwritten, and
	// reflect.DeepEqual follows the rest, with no encoding per change.
	x, y := *a, *b
	y.Panelling.Panels, y.Panelling.Nose = x.Panelling.Panels, x.Panelling.Nose
	y.Density, y.Pins, y.Name, y.Team, y.Sweep = x.Density, x.Pins, x.Name, x.Team, x.Sweep
	return reflect.DeepEqual(x, y)
}

// LoadRecovered makes a recovered study current, as belonging to path
// ("" if it was never saved) and with unsaved changes.
func (c *Controller) LoadRecovered(st *model.Study, path string) error {
	if err := c.Load(st, path); err != nil {
		return err
	}
	c.state.dirty = true
	c.notify()
	return nil
}
