package ui

import (
	"os"
	"strings"
)

// openWindowEnv names a window to open at start, for screenshots of the
// real app (scripts/screenshot.sh): "density", "panel-sizes", "setup" (the
// set-up window running a map of its first variable; "setup-two" over
// two variables; a suffix "-compare" compares each point with a single
// solve), "setup-span" (its
// finite-span estimate) or "setup-search" (its setting search).
const openWindowEnv = "SECTIONBENCH_OPEN_WINDOW"

// startExtras starts the autosave and, if openWindowEnv asks, opens the
// density window once the workbench is built. menu calls it.
func (w *Workbench) startExtras() {
	w.startAutosave()
	tab := -1
	if w.startSetup(os.Getenv(openWindowEnv)) {
		return
	}
	switch os.Getenv(openWindowEnv) {
	case "density":
		tab = densityTabConvergence
	case "panel-sizes":
		tab = densityTabSizes
	}
	if tab < 0 {
		return
	}
	w.ctl.Activity().Add()
	go func() {
		defer w.ctl.Activity().Done()
		w.do(func() {
			w.openDensity(tab)
			if tab == densityTabConvergence {
				w.density.start()
			}
		})
	}()
}

// startSetup opens the set-up window at start when which names one of
// its tabs, and starts that tab's run; it reports whether it did. A
// suffix "-inviscid" runs a map or search with the panel method only,
// "-compare" a map comparing each point with a single solve.
func (w *Workbench) startSetup(which string) bool {
	base, inviscid := strings.CutSuffix(which, "-inviscid")
	base, compare := strings.CutSuffix(base, "-compare")
	tab := map[string]int{"setup": setupTabMaps, "setup-two": setupTabMaps, "setup-span": setupTabSpan, "setup-search": setupTabSearch}
	t, ok := tab[base]
	if !ok {
		return false
	}
	w.ctl.Activity().Add()
	go func() {
		defer w.ctl.Activity().Done()
		w.do(func() {
			w.openSetup(t)
			switch t {
			case setupTabMaps:
				m := w.setup.maps
				m.viscous.SetChecked(!inviscid)
				m.compare.SetChecked(compare)
				m.second.SetChecked(base == "setup-two")
				m.start()
			case setupTabSpan:
				w.setup.span.start()
			case setupTabSearch:
				w.setup.search.viscous.SetChecked(!inviscid)
				w.setup.search.start()
			}
		})
	}()
	return true
}
