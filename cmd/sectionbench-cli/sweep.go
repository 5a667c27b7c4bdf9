package main

import (
	"context"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// jsonSweepRow is one angle of a sweep: the inviscid coefficients, and
// with the viscous solution on its drag, transition and separation; in
// coupled mode cl, cd and cm are the viscous ones (null unless the row
// converged) with the row's state.
type jsonSweepRow struct {
	AlphaDeg   num  `json:"alpha_deg"`
	Cl         num  `json:"cl"`
	ClPressure num  `json:"cl_pressure"`
	Cm         num  `json:"cm"`
	CpMin      num  `json:"cp_min"`
	CmInviscid *num `json:"cm_inviscid,omitempty"`
	jsonViscous
	jsonCoupled
	PastClMax *bool `json:"past_cl_max,omitempty"`
	// Flags name, in words, why the row is not to be trusted
	// (model.Plausibility); empty when nothing is flagged.
	Flags []string `json:"flags"`
	// Elements holds, in coupled mode, each element's share of the row
	// with the same keys as solve's elements (without the surface points).
	Elements []jsonSweepElement `json:"elements,omitempty"`
}

// jsonSweepElement is one element's share of a coupled sweep row, on its
// own chord.
type jsonSweepElement struct {
	Name string `json:"name"`
	Cl   num    `json:"cl"`
	Cm   num    `json:"cm"`
	jsonViscous
	jsonCoupled
}

// jsonSweep is the sweep's JSON: its rows and, in coupled mode, the
// maximum lift among the converged rows (null otherwise).
type jsonSweep struct {
	ViscousMode string         `json:"viscous_mode,omitempty"`
	Rows        []jsonSweepRow `json:"rows"`
	ClMax       num            `json:"cl_max"`
	AlphaClMax  num            `json:"alpha_cl_max"`
	ClMaxIsPeak bool           `json:"cl_max_is_peak"`
	Warnings    []string       `json:"warnings"`
}

func cmdSweep(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("sweep", "sweep (--section SPEC | --study FILE) --alpha FROM:TO:STEP [--panels N] [--spacing LAW] [--nose F] [--tail F] [--re RE] [--transition-n N] [--trip-upper XC] [--trip-lower XC] [--format text|csv|json]", stdout)
	in := addInputs(fs, true, "text", "csv", "json")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return err
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true, CoupledMaxIterations: coupledMaxIterations})
	if err != nil {
		return err
	}
	switch in.format {
	case "json":
		return writeJSON(stdout, sweepJSON(res))
	case "csv":
		return sweepCSV(stdout, st, res)
	}
	// The heading states the signs of the columns, as the map's does:
	// on an inverted wing cl is negative where it makes downforce.
	how := "panel method"
	switch {
	case res.SweepCoupled != nil:
		how = "coupled viscous solution (cl, cd, cm viscous)"
	case res.SweepViscous != nil:
		how = "panel method with the one-way boundary-layer estimate (cl inviscid)"
	}
	fmt.Fprintf(stdout, "Sweep of %s, %s; %s\n", st.Name, how, tableSense(st.Inverted, false))
	if res.SweepCoupled != nil {
		if err := sweepCoupledText(stdout, res); err != nil {
			return err
		}
	} else if err := sweepText(stdout, res); err != nil {
		return err
	}
	for _, w := range sweepWarnings(res) {
		fmt.Fprintln(stdout, "warning: "+w)
	}
	_, err = fmt.Fprintln(stdout, caution)
	return err
}

// sweepWarnings are the solution's warnings and the one flag that holds
// for every row alike, a Reynolds number outside the checked range (the
// rows carry their own flags).
func sweepWarnings(res *engine.Result) []string {
	w := append([]string{}, res.Solution.Warnings...)
	for _, f := range res.Flags() {
		if f.Kind == model.FlagReynolds {
			w = append(w, "caution, "+string(f.Kind)+": "+f.Message)
		}
	}
	if b := res.HigherPastClMaxWords(); b != "" {
		w = append(w, b)
	}
	return w
}

func sweepJSON(res *engine.Result) jsonSweep {
	out := jsonSweep{Rows: make([]jsonSweepRow, len(res.Sweep)), ClMax: num(res.ClMax), AlphaClMax: num(res.AlphaClMax), ClMaxIsPeak: res.ClMaxIsPeak, Warnings: sweepWarnings(res)}
	if res.SweepViscous != nil {
		out.ViscousMode = string(model.ViscousEstimate)
	}
	if res.SweepCoupled != nil {
		out.ViscousMode = string(model.ViscousCoupled)
	}
	for i, c := range res.Sweep {
		r := jsonSweepRow{AlphaDeg: num(c.AlphaDeg), Cl: num(c.Cl), ClPressure: num(c.ClPressure), Cm: num(c.Cm), CpMin: num(c.CpMin)}
		r.ClInviscid = num(c.Cl)
		if res.SweepViscous != nil {
			v := res.SweepViscous[i]
			r.jsonViscous = jsonViscous{ptr(v.Cd), ptr(v.TransitionUpper), ptr(v.TransitionLower), ptr(v.SeparationUpper), ptr(v.SeparationLower)}
		}
		if res.SweepCoupled != nil {
			p := &res.SweepCoupled[i]
			var co jsonCoefficients
			co, r.jsonViscous, r.jsonCoupled = coupledKeys(p, -1)
			r.Cl, r.Cm, r.CmInviscid, r.ClInviscid = co.Cl, co.Cm, ptr(c.Cm), num(c.Cl)
			past := p.PastClMax
			r.PastClMax = &past
			for k, e := range p.Elements {
				co, v, cp := coupledKeys(p, k)
				cp.ClInviscid = num(e.ClInviscid)
				r.Elements = append(r.Elements, jsonSweepElement{Name: e.Name, Cl: co.Cl, Cm: co.Cm, jsonViscous: v, jsonCoupled: cp})
			}
			if !p.Converged {
				out.Warnings = append(out.Warnings, notConverged(p))
			}
		}
		r.Flags = rowFlags(res, i)
		out.Rows[i] = r
	}
	return out
}

// rowFlags returns the kinds of the plausibility flags of sweep row i
// (engine.Result.SweepFlags).
func rowFlags(res *engine.Result, i int) []string {
	out := []string{}
	for _, fl := range res.SweepFlags(i) {
		out = append(out, string(fl.Kind))
	}
	return out
}

// sweepText is the inviscid sweep's table (with the one-way estimate's
// drag and transition when it ran).
func sweepText(w io.Writer, res *engine.Result) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	head := "alpha_deg\tcl\tcl_pressure\tcm\tcp_min\t"
	if res.SweepViscous != nil {
		head += "cd\tx_tr_upper\tx_tr_lower\t"
	}
	head += "flags\t"
	fmt.Fprintln(tw, head)
	for i, c := range res.Sweep {
		fmt.Fprintf(tw, "%.3f\t%.5f\t%.5f\t%.5f\t%.4f\t", c.AlphaDeg, c.Cl, c.ClPressure, c.Cm, c.CpMin)
		if res.SweepViscous != nil {
			v := res.SweepViscous[i]
			fmt.Fprintf(tw, "%s\t%s\t%s\t", fmtShort(v.Cd, "%.5f"), fmtShort(v.TransitionUpper, "%.3f"), fmtShort(v.TransitionLower, "%.3f"))
		}
		fmt.Fprintf(tw, "%s\t", flagsText(rowFlags(res, i)))
		fmt.Fprintln(tw)
	}
	return tw.Flush()
}

// sweepCoupledText is the coupled sweep's table: viscous coefficients
// (dashes where a row did not converge), the inviscid Cl beside them and
// each row's state, then the maximum lift.
func sweepCoupledText(w io.Writer, res *engine.Result) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "alpha_deg\tcl\tcd\tcm\tcl_inviscid\ttransition_upper\ttransition_lower\tseparation_upper\tseparation_lower\tstate\tflags\t")
	for i, p := range res.SweepCoupled {
		e := p.Elements[0]
		state := fmt.Sprintf("converged (%d iterations)", p.Iterations)
		if !p.Converged {
			state = fmt.Sprintf("NOT CONVERGED (%d iterations, residual %.1e)", p.Iterations, p.Residual)
		}
		if p.Rejected != "" {
			state = fmt.Sprintf("NOT CONVERGED (%d iterations; rejected: %s)", p.Iterations, p.Rejected)
		}
		if p.Note != "" {
			state = "FAILED: " + p.Note
		}
		if p.PastClMax {
			state += ", past Cl max"
		}
		fmt.Fprintf(tw, "%.3f\t%s\t%s\t%s\t%.5f\t%s\t%s\t%s\t%s\t%s\t%s\t\n", p.AlphaDeg, fmtShort(p.Cl, "%.5f"), fmtShort(p.Cd, "%.5f"), fmtShort(p.Cm, "%.5f"),
			res.Sweep[i].Cl, fmtXC(e.TransitionUpper, p.Converged), fmtXC(e.TransitionLower, p.Converged), fmtXC(e.SeparationUpper, p.Converged), fmtXC(e.SeparationLower, p.Converged), state,
			flagsText(rowFlags(res, i)))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	// On an inverted wing the maximum is the most downforce, the most
	// negative Cl, said so as the app's polar says it: "largest Cl
	// -5.4360" read as the least downforce.
	inverted := res.Layout != nil && res.Layout.Inverted
	most, largest, load := fmt.Sprintf("Cl max %.4f", res.ClMax), fmt.Sprintf("largest Cl %.4f", res.ClMax), "lift"
	if inverted {
		most = fmt.Sprintf("most downforce −Cl %.4f (Cl %.4f)", -res.ClMax, res.ClMax)
		largest, load = most, "the downforce"
	}
	switch {
	case res.ClMax != res.ClMax:
		_, err := fmt.Fprintln(w, "Cl max: none (no row converged)")
		return err
	case res.ClMaxIsPeak:
		_, err := fmt.Fprintf(w, "%s at %g° (viscous, converged rows)\n", most, res.AlphaClMax)
		return err
	}
	_, err := fmt.Fprintf(w, "%s at %g°; no converged row beyond it shows %s falling, so the maximum is not found in this sweep\n", largest, res.AlphaClMax, load)
	return err
}

// flagsText joins a row's flags, or a dash for none.
func flagsText(f []string) string {
	if len(f) == 0 {
		return "—"
	}
	return strings.Join(f, "; ")
}

func fmtShort(f float64, format string) string {
	if f != f {
		return "—"
	}
	return fmt.Sprintf(format, f)
}

func sweepCSV(w io.Writer, st *model.Study, res *engine.Result) error {
	meta := format.StudyMetadata(st, res, "Sectionbench "+version)
	if res.SweepCoupled != nil {
		return format.WriteCoupledSweepTable(w, meta, res.Sweep, res.SweepCoupled)
	}
	return format.WriteSweepTable(w, meta, res.Sweep, res.SweepViscous)
}
