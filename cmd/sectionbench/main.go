// Command sectionbench is the desktop workbench for two-dimensional wing
// sections. It opens the study given as its argument, or a demo study.
//
//	sectionbench [study.json]
package main

import (
	"fmt"
	"os"

	"fyne.io/fyne/v2/app"

	"sectionbench/export"
	"sectionbench/ui"
)

func main() {
	if len(os.Args) > 2 {
		fmt.Fprintln(os.Stderr, "usage: sectionbench [study.json]")
		os.Exit(2)
	}
	path := ""
	if len(os.Args) == 2 {
		path = os.Args[1]
	}
	a := app.NewWithID("org.sectionbench.app")
	// The toolkit reads FyneApp.toml only when started from the
	// repository's folder (or packaged); elsewhere its version was 0.0.1,
	// which the report's appendix then gave to reproduce it.
	if m := a.Metadata(); m.Version != export.Version {
		m.Version, m.Name = export.Version, "Sectionbench"
		if m.ID == "" {
			m.ID = "org.sectionbench.app"
		}
		app.SetMetadata(m)
	}
	w, err := ui.New(a, path)
	if err != nil {
		fmt.Fprintln(os.Stderr, "sectionbench:", err)
		os.Exit(1)
	}
	w.ShowAndRun()
}
