package main

import (
	"fmt"
	"io"

	"sectionbench/export"
	"sectionbench/export/format"
)

func cmdClean(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("clean", "clean IN [-o OUT]", stdout)
	out := fs.String("o", "", "write the cleaned section to `OUT` (default: standard output, with the report on standard error)")
	pos, err := fs.parse(args, 1)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("give the coordinate file to clean: clean IN [-o OUT]")
	}
	sec, rep, err := export.LoadSectionFile(pos[0])
	if err != nil {
		return err
	}
	write := func(w io.Writer) error { return format.WriteCoordinates(w, sec, format.CoordOptions{}) }
	if *out == "" {
		*out = "-"
	}
	wrote, err := writeOutput(*out, false, stdout, write, []string{pos[0]})
	if err != nil {
		return err
	}
	reportTo := stdout
	if !wrote {
		reportTo = stderr
	}
	fmt.Fprint(reportTo, rep.String())
	if wrote {
		fmt.Fprintf(reportTo, "wrote %s (%d points)\n", *out, sec.Len())
	}
	return nil
}
