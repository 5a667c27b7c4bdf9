// Command sectionbench is the desktop workbench for two-dimensional wing
// sections. It opens the study given as its argument, or a demo study.
//
//	sectionbench [study.json]
package main

import (
	"fmt"
	"os"

	"fyne.io/fyne/v2/app"

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
	w, err := ui.New(a, path)
	if err != nil {
		fmt.Fprintln(os.Stderr, "sectionbench:", err)
		os.Exit(1)
	}
	w.ShowAndRun()
}
