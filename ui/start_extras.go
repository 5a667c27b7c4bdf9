package ui

import "os"

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
