package main

import (
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

type jsonDensityRow struct {
	Panels int `json:"panels"`
	Nose   num `json:"nose"`
	Cl     num `json:"cl"`
	Cm     num `json:"cm"`
	CpMin  num `json:"cp_min"`
	DCl    num `json:"d_cl"`
	DCpMin num `json:"d_cp_min"`
	// ViscousCl and ViscousCd are the coupled viscous solution's, when the
	// study has it on (null where it did not converge; absent without it).
	ViscousCl *num `json:"viscous_cl,omitempty"`
	ViscousCd *num `json:"viscous_cd,omitempty"`
	// Skipped says why a count was not solved (the configuration could not
	// be placed with that many panels); absent when it was.
	Skipped string `json:"skipped,omitempty"`
}

type jsonExtrapolation struct {
	Value num  `json:"value"`
	Error num  `json:"error_estimate"`
	Order num  `json:"observed_order"`
	OK    bool `json:"ok"`
	// Why says why there is no extrapolation (absent when OK).
	Why string `json:"why,omitempty"`
}

type jsonDensity struct {
	AlphaDeg     num                          `json:"alpha_deg"`
	Spacing      string                       `json:"spacing"`
	Rows         []jsonDensityRow             `json:"rows"`
	Order        num                          `json:"observed_order"`
	Extrapolated map[string]jsonExtrapolation `json:"extrapolated"`
	Recommended  int                          `json:"recommended_panels"`
	TolClPct     num                          `json:"tol_cl_pct"`
	TolCpMinPct  num                          `json:"tol_cp_min_pct"`
}

func cmdDensity(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("density", "density (--section SPEC | --study FILE) --alpha DEG [--panels LIST] [--nose LIST] [--tol-cl PCT] [--tol-cp PCT] [--spacing LAW] [--format text|csv|json]", stdout)
	in := addInputs(fs, false, "text", "csv", "json")
	// --panels and --nose take lists here; the shared single values are
	// replaced by these.
	fs.FlagSet.Lookup("panels").Usage = "comma-separated panel `counts`, increasing (default 20,40,80,160,320,640)"
	fs.FlagSet.Lookup("nose").Usage = "comma-separated nose clustering `values` in [0, 1] (blend spacing)"
	var panelsList, noseList string
	tolCl := fs.Float64("tol-cl", engine.DefaultTolClPct, "tolerance on Cl in `percent` for the recommendation")
	tolCp := fs.Float64("tol-cp", engine.DefaultTolCpMinPct, "tolerance on minimum Cp in `percent`")
	if _, err := fs.parse(rewriteLists(args, &panelsList, &noseList), 0); err != nil {
		return err
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return err
	}
	if panelsList != "" {
		if st.Density.Panels, err = parseIntList("--panels", panelsList); err != nil {
			return err
		}
	}
	if noseList != "" {
		if st.Density.Nose, err = parseFloatList("--nose", noseList, 0, 1); err != nil {
			return err
		}
	}
	for _, t := range []struct {
		name string
		v    float64
	}{{"tol-cl", *tolCl}, {"tol-cp", *tolCp}} {
		if in.set[t.name] && !(t.v > 0 && t.v <= 100) {
			return usagef("--%s %g: want a tolerance above 0 and at most 100 percent", t.name, t.v)
		}
	}
	if in.set["tol-cl"] || st.Density.TolClPct == 0 {
		st.Density.TolClPct = *tolCl
	}
	if in.set["tol-cp"] || st.Density.TolCpMinPct == 0 {
		st.Density.TolCpMinPct = *tolCp
	}
	*tolCl, *tolCp = st.Density.TolClPct, st.Density.TolCpMinPct
	if err := st.CheckDensityNose(); err != nil {
		return usagef("--nose %q: %v; give --spacing blend", noseList, errors.Unwrap(err))
	}
	if err := st.Validate(); err != nil {
		return flagError(err)
	}
	res, err := engine.NewEngine().Density(context.Background(), st, secs, nil)
	if err != nil {
		return flagError(err)
	}
	out := jsonDensity{
		AlphaDeg: num(st.Flow.AlphaDeg), Spacing: string(st.Panelling.Spacing),
		Order: num(res.Cl.ObservedOrder), Recommended: res.RecommendedPanels,
		TolClPct: num(*tolCl), TolCpMinPct: num(*tolCp),
		Extrapolated: map[string]jsonExtrapolation{
			"cl": extrap(res.Cl), "cm": extrap(res.Cm), "cp_min": extrap(res.CpMin),
		},
	}
	if res.Viscous {
		out.Extrapolated["viscous_cl"], out.Extrapolated["viscous_cd"] = extrap(res.ViscousCl), extrap(res.ViscousCd)
	}
	for _, r := range res.Rows {
		row := jsonDensityRow{Panels: r.Panels, Nose: num(r.Nose), Cl: num(r.Cl), Cm: num(r.Cm), CpMin: num(r.CpMin), DCl: num(r.DCl), DCpMin: num(r.DCpMin), Skipped: r.Skipped}
		if res.Viscous {
			vcl, vcd := num(r.ViscousCl), num(r.ViscousCd)
			row.ViscousCl, row.ViscousCd = &vcl, &vcd
		}
		out.Rows = append(out.Rows, row)
	}
	switch in.format {
	case "json":
		return writeJSON(stdout, out)
	case "csv":
		cw := csv.NewWriter(stdout)
		head := []string{"panels", "nose", "cl", "cm", "cp_min", "d_cl", "d_cp_min", "skipped"}
		if res.Viscous {
			head = append(head, "viscous_cl", "viscous_cd")
		}
		cw.Write(head)
		for _, r := range res.Rows {
			rec := []string{strconv.Itoa(r.Panels), g(r.Nose), g(r.Cl), g(r.Cm), g(r.CpMin), g(r.DCl), g(r.DCpMin), r.Skipped}
			if res.Viscous {
				rec = append(rec, g(r.ViscousCl), g(r.ViscousCd))
			}
			cw.Write(rec)
		}
		cw.Flush()
		return cw.Error()
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
	viscousHead, viscousCols := "", func(engine.DensityRow) string { return "" }
	if res.Viscous {
		viscousHead = "Cl viscous\tCd viscous\t"
		viscousCols = func(r engine.DensityRow) string {
			return fmtShort(r.ViscousCl, "%.5f") + "\t" + fmtShort(r.ViscousCd, "%.6f") + "\t"
		}
	}
	fmt.Fprintln(tw, "panels\tnose\tCl\tΔCl\tCm\tmin Cp\tΔ min Cp\t"+viscousHead)
	var skipped []string
	for _, r := range res.Rows {
		if !r.Solved() {
			fmt.Fprintf(tw, "%d\t%.2f\tskipped\t\t\t\t\t\n", r.Panels, r.Nose)
			skipped = append(skipped, fmt.Sprintf("%d panels: %s", r.Panels, r.Skipped))
			continue
		}
		fmt.Fprintf(tw, "%d\t%.2f\t%.5f\t%s\t%.5f\t%.4f\t%s\t%s\n", r.Panels, r.Nose, r.Cl, fmtShort(r.DCl, "%+.5f"), r.Cm, r.CpMin, fmtShort(r.DCpMin, "%+.4f"), viscousCols(r))
	}
	tw.Flush()
	for _, s := range skipped {
		fmt.Fprintln(stdout, "skipped "+s)
	}
	for _, r := range res.Rows {
		if why := engine.ViscousFailure(r); why != "" {
			fmt.Fprintln(stdout, why)
		}
		if r.ViscousHeld {
			fmt.Fprintf(stdout, "at %d panels the viscous solution holds transition upstream of its e^N position: its answer is that of a trip there, not the free transition of the other counts\n", r.Panels)
		}
	}
	for _, q := range []struct {
		name    string
		e       engine.Extrapolation
		viscous bool // the coupled solution's, reported when the study ran it
	}{{"Cl", res.Cl, false}, {"Cm", res.Cm, false}, {"min Cp", res.CpMin, false}, {"Cl viscous", res.ViscousCl, true}, {"Cd viscous", res.ViscousCd, true}} {
		if q.viscous && !res.Viscous {
			continue
		}
		switch {
		case q.e.OK:
			fmt.Fprintf(stdout, "%-7s extrapolated %.5f ± %.5f, observed order %.2f\n", q.name, q.e.Value, q.e.ErrorEstimate, q.e.ObservedOrder)
		case q.viscous:
			fmt.Fprintf(stdout, "%-7s no extrapolation over the counts where the viscous solution converged: %s%s\n", q.name, q.e.Why, finest(q.e.Value))
		default:
			fmt.Fprintf(stdout, "%-7s no extrapolation: %s%s\n", q.name, q.e.Why, finest(q.e.Value))
		}
	}
	if res.RecommendedPanels > 0 {
		fmt.Fprintf(stdout, "recommended: %d panels (Cl within %g %%, min Cp within %g %% of the extrapolated values)\n", res.RecommendedPanels, *tolCl, *tolCp)
	} else {
		fmt.Fprintf(stdout, "no count in the list meets Cl within %g %% and min Cp within %g %%: extend the list\n", *tolCl, *tolCp)
	}
	fmt.Fprintln(stdout, caution)
	return nil
}

// finest is the text giving the finest value of a quantity without an
// extrapolation, empty when there is none.
func finest(v float64) string {
	if math.IsNaN(v) {
		return ""
	}
	return fmt.Sprintf("; finest value %.5f", v)
}

func extrap(e engine.Extrapolation) jsonExtrapolation {
	return jsonExtrapolation{num(e.Value), num(e.ErrorEstimate), num(e.ObservedOrder), e.OK, e.Why}
}

func g(x float64) string {
	if x != x {
		return ""
	}
	return strconv.FormatFloat(x, 'g', 8, 64)
}

// rewriteLists takes the list forms of --panels and --nose out of args
// (the shared flags define them as single values) and returns the rest.
func rewriteLists(args []string, panels, nose *string) []string {
	var rest []string
	for i := 0; i < len(args); i++ {
		a := args[i]
		name, val, hasVal := strings.Cut(strings.TrimLeft(a, "-"), "=")
		if !strings.HasPrefix(a, "-") || (name != "panels" && name != "nose") {
			rest = append(rest, a)
			continue
		}
		if !hasVal {
			if i+1 >= len(args) {
				rest = append(rest, a) // let the flag package report it
				continue
			}
			i++
			val = args[i]
		}
		if name == "panels" {
			*panels = val
		} else {
			*nose = val
		}
	}
	return rest
}

// parseIntList reads "20,40,80".
func parseIntList(flagName, s string) ([]int, error) {
	var out []int
	for _, f := range strings.Split(s, ",") {
		n, err := strconv.Atoi(strings.TrimSpace(f))
		if err != nil {
			return nil, usagef("%s %q: %q is not a whole number", flagName, s, f)
		}
		if n < model.MinPanels || n > model.MaxPanels {
			return nil, usagef("%s %q: %d is outside %d..%d", flagName, s, n, model.MinPanels, model.MaxPanels)
		}
		if len(out) > 0 && n <= out[len(out)-1] {
			return nil, usagef("%s %q: counts must increase", flagName, s)
		}
		out = append(out, n)
	}
	return out, nil
}

// parseFloatList reads "0.2,0.5,0.8" with each value in [lo, hi].
func parseFloatList(flagName, s string, lo, hi float64) ([]float64, error) {
	var out []float64
	for _, f := range strings.Split(s, ",") {
		x, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil || !(x >= lo && x <= hi) {
			return nil, usagef("%s %q: %q is not a number in [%g, %g]", flagName, s, f, lo, hi)
		}
		out = append(out, x)
	}
	return out, nil
}
