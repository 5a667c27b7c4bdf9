package main

import (
	"context"
	"fmt"
	"io"
	"sectionbench/model"
	"text/tabwriter"

	"sectionbench/export/format"
	"sectionbench/solver/engine"
)

type jsonSweepRow struct {
	AlphaDeg   num  `json:"alpha_deg"`
	Cl         num  `json:"cl"`
	ClPressure num  `json:"cl_pressure"`
	Cm         num  `json:"cm"`
	CpMin      num  `json:"cp_min"`
	Cd         *num `json:"cd,omitempty"`
	TrUpper    *num `json:"transition_upper,omitempty"`
	TrLower    *num `json:"transition_lower,omitempty"`
}

func cmdSweep(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("sweep", "sweep (--section SPEC | --study FILE) --alpha FROM:TO:STEP [--panels N] [--spacing LAW] [--nose F] [--tail F] [--re RE] [--format text|csv|json]", stdout)
	in := addInputs(fs, true, "text", "csv", "json")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return err
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true})
	if err != nil {
		return err
	}
	rows := make([]jsonSweepRow, len(res.Sweep))
	for i, c := range res.Sweep {
		rows[i] = jsonSweepRow{AlphaDeg: num(c.AlphaDeg), Cl: num(c.Cl), ClPressure: num(c.ClPressure), Cm: num(c.Cm), CpMin: num(c.CpMin)}
		if res.SweepViscous != nil {
			v := res.SweepViscous[i]
			rows[i].Cd, rows[i].TrUpper, rows[i].TrLower = ptr(v.Cd), ptr(v.TransitionUpper), ptr(v.TransitionLower)
		}
	}
	switch in.format {
	case "json":
		return writeJSON(stdout, rows)
	case "csv":
		return sweepCSV(stdout, st, res)
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	head := "alpha_deg\tcl\tcl_pressure\tcm\tcp_min\t"
	if res.SweepViscous != nil {
		head += "cd\tx_tr_upper\tx_tr_lower\t"
	}
	fmt.Fprintln(tw, head)
	for i, c := range res.Sweep {
		fmt.Fprintf(tw, "%.3f\t%.5f\t%.5f\t%.5f\t%.4f\t", c.AlphaDeg, c.Cl, c.ClPressure, c.Cm, c.CpMin)
		if res.SweepViscous != nil {
			v := res.SweepViscous[i]
			fmt.Fprintf(tw, "%s\t%s\t%s\t", fmtShort(v.Cd, "%.5f"), fmtShort(v.TransitionUpper, "%.3f"), fmtShort(v.TransitionLower, "%.3f"))
		}
		fmt.Fprintln(tw)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	for _, w := range res.Solution.Warnings {
		fmt.Fprintln(stdout, "warning: "+w)
	}
	_, err = fmt.Fprintln(stdout, caution)
	return err
}

func fmtShort(f float64, format string) string {
	if f != f {
		return "—"
	}
	return fmt.Sprintf(format, f)
}

func sweepCSV(w io.Writer, st *model.Study, res *engine.Result) error {
	return format.WriteSweepTable(w, format.StudyMetadata(st, res, "Sectionbench "+version), res.Sweep, res.SweepViscous)
}
