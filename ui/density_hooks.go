package ui

import (
	"os"

	"sectionbench/model"
)

// setDensityPlan stores the plan in the study (an undoable change) unless
// it is already the study's plan.
func (c *Controller) setDensityPlan(p model.DensityPlan) error {
	if densityPlansEqual(p, c.state.study.Density) {
		return nil
	}
	return c.Edit("density", func(st *model.Study) { st.Density = p })
}

func densityPlansEqual(a, b model.DensityPlan) bool {
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

// useDensityPanels sets the study's panel count, and its nose clustering
// when nose is not the study's: one undoable change.
func (c *Controller) useDensityPanels(panels int, nose float64) error {
	p := c.state.study.Panelling
	p.Panels, p.Nose = panels, nose
	return c.SetPanelling("", p)
}

// sameDensityCase reports whether a density study run on a still holds
// for b: the studies differ at most in the panel count and nose clustering
// (which the study varies), the plan, pins, names and sweep.
func sameDensityCase(a, b *model.Study) bool {
	x, y := cloneStudy(a), cloneStudy(b)
	y.Panelling.Panels, y.Panelling.Nose = x.Panelling.Panels, x.Panelling.Nose
	y.Density, y.Pins, y.Name, y.Team, y.Sweep = x.Density, x.Pins, x.Name, x.Team, x.Sweep
	ex, err1 := encodeStudy(x)
	ey, err2 := encodeStudy(y)
	return err1 == nil && err2 == nil && string(ex) == string(ey)
}

// loadRecovered makes a recovered study current, as belonging to path
// ("" if it was never saved) and with unsaved changes.
func (c *Controller) loadRecovered(st *model.Study, path string) error {
	if err := c.Load(st, path); err != nil {
		return err
	}
	c.state.dirty = true
	c.notify()
	return nil
}

// openWindowEnv names a window to open at start, for screenshots of the
// real app (scripts/screenshot.sh): "density" or "panel-sizes".
const openWindowEnv = "SECTIONBENCH_OPEN_WINDOW"

// startExtras starts the autosave and, if openWindowEnv asks, opens the
// density window once the workbench is built. menu calls it.
func (w *Workbench) startExtras() {
	w.startAutosave()
	tab := -1
	switch os.Getenv(openWindowEnv) {
	case "density":
		tab = densityTabConvergence
	case "panel-sizes":
		tab = densityTabSizes
	}
	if tab < 0 {
		return
	}
	w.ctl.act.add()
	go func() {
		defer w.ctl.act.done()
		w.do(func() {
			w.openDensity(tab)
			if tab == densityTabConvergence {
				w.density.start()
			}
		})
	}()
}
