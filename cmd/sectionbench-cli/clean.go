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
	reportTo := stdout
	if *out == "" || *out == "-" {
		if err := write(stdout); err != nil {
			return err
		}
		reportTo = stderr
	} else if err := export.WriteFileAtomic(*out, write); err != nil {
		return err
	}
	fmt.Fprint(reportTo, rep.String())
	if *out != "" && *out != "-" {
		fmt.Fprintf(reportTo, "wrote %s (%d points)\n", *out, sec.Len())
	}
	return nil
}
