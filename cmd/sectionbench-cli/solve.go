package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// num is a float that encodes NaN and ±Inf as JSON null.
type num float64

func (n num) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return strconv.AppendFloat(nil, f, 'g', 10, 64), nil
}

type jsonPoint struct {
	X    num    `json:"x"`
	Y    num    `json:"y"`
	XC   num    `json:"xc"`
	Cp   num    `json:"cp"`
	Side string `json:"side"`
}

type jsonXY struct {
	X num `json:"x"`
	Y num `json:"y"`
}

// jsonCoefficients are the keys an element and the whole configuration
// share.
type jsonCoefficients struct {
	Cl         num    `json:"cl"`
	ClPressure num    `json:"cl_pressure"`
	Cm         num    `json:"cm"`
	CpMin      num    `json:"cp_min"`
	XCpMin     num    `json:"x_cp_min"`
	Stagnation jsonXY `json:"stagnation"`
}

// jsonViscous are the boundary-layer keys, shared likewise.
type jsonViscous struct {
	Cd              *num `json:"cd,omitempty"`
	TransitionUpper *num `json:"transition_upper,omitempty"`
	TransitionLower *num `json:"transition_lower,omitempty"`
	SeparationUpper *num `json:"separation_upper,omitempty"`
	SeparationLower *num `json:"separation_lower,omitempty"`
}

type jsonElement struct {
	Name string `json:"name"`
	jsonCoefficients
	Reynolds *num `json:"reynolds,omitempty"`
	jsonViscous
	LiftPerSpan *num        `json:"lift_per_span_n_per_m,omitempty"`
	Points      []jsonPoint `json:"points"`
}

type jsonSolve struct {
	Name     string `json:"name"`
	AlphaDeg num    `json:"alpha_deg"`
	Panels   int    `json:"panels"`
	jsonCoefficients
	Inverted  bool `json:"inverted"`
	Downforce *num `json:"downforce_coefficient,omitempty"`
	Ground    *num `json:"ground_clearance_mm,omitempty"`
	RefChordM num  `json:"reference_chord_m"`
	jsonViscous
	Q          *num          `json:"dynamic_pressure_pa,omitempty"`
	Force      *num          `json:"force_per_span_n_per_m,omitempty"`
	DownforceN *num          `json:"downforce_per_span_n_per_m,omitempty"`
	DragN      *num          `json:"drag_per_span_n_per_m,omitempty"`
	MomentN    *num          `json:"moment_per_span_n_m_per_m,omitempty"`
	Points     []jsonPoint   `json:"points"`
	Elements   []jsonElement `json:"elements"`
	Warnings   []string      `json:"warnings"`
}

func ptr(f float64) *num { n := num(f); return &n }

func cmdSolve(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("solve", "solve (--section SPEC | --study FILE) [--alpha DEG] [--panels N] [--spacing LAW] [--nose F] [--tail F] [--re RE] [--format text|json]", stdout)
	in := addInputs(fs, false, "text", "json")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	st, secs, reps, err := in.load(fs)
	if err != nil {
		return err
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs})
	if err != nil {
		return err
	}
	warnings := collectWarnings(reps, res)
	out := solveJSON(st, res, warnings)
	if in.format == "json" {
		return writeJSON(stdout, out)
	}
	return solveText(stdout, st, res, out)
}

func collectWarnings(reps []*model.CleanReport, res *engine.Result) []string {
	w := []string{}
	for _, r := range reps {
		for _, cw := range r.Warnings {
			w = append(w, r.Source+": "+cw.Message)
		}
	}
	w = append(w, res.Solution.Warnings...)
	if res.Viscous != nil {
		w = append(w, res.Viscous.Notes...)
	}
	return w
}

func solveJSON(st *model.Study, res *engine.Result, warnings []string) jsonSolve {
	sol := res.Solution
	out := jsonSolve{
		Name: st.Name, AlphaDeg: num(sol.AlphaDeg), Panels: st.Panelling.Panels,
		Inverted: st.Inverted, RefChordM: num(sol.RefChord), Warnings: warnings,
	}
	// The configuration's minimum Cp is that of the element with the lowest
	// Cp; its stagnation point is the main element's.
	best := 0
	for i, e := range sol.Elements {
		if e.CpMin < sol.Elements[best].CpMin {
			best = i
		}
	}
	out.jsonCoefficients = jsonCoefficients{
		Cl: num(sol.Cl), ClPressure: num(sol.ClPressure), Cm: num(sol.Cm),
		CpMin: num(sol.Elements[best].CpMin), XCpMin: num(sol.Elements[best].XCpMin),
		Stagnation: jsonXY{num(sol.Elements[0].Stagnation.X), num(sol.Elements[0].Stagnation.Y)},
	}
	if st.Inverted {
		out.Downforce = ptr(-sol.Cl)
	}
	if st.Ground.Enabled {
		out.Ground = ptr(st.Ground.ClearanceMM)
	}
	for i, e := range sol.Elements {
		je := jsonElement{Name: e.Name, jsonCoefficients: jsonCoefficients{
			Cl: num(e.Cl), ClPressure: num(e.ClPressure), Cm: num(e.Cm),
			CpMin: num(e.CpMin), XCpMin: num(e.XCpMin),
			Stagnation: jsonXY{num(e.Stagnation.X), num(e.Stagnation.Y)},
		}}
		for _, p := range e.Panels {
			je.Points = append(je.Points, jsonPoint{num(p.X), num(p.Y), num(p.XC), num(p.Cp), p.Side.String()})
		}
		if res.Reynolds != nil {
			je.Reynolds = ptr(res.Reynolds[i])
		}
		if v := res.Viscous; v != nil {
			ev := v.Elements[i]
			je.jsonViscous = jsonViscous{ptr(ev.Cd), ptr(ev.Upper.TransitionXC), ptr(ev.Lower.TransitionXC), ptr(ev.Upper.TurbulentSeparationXC), ptr(ev.Lower.TurbulentSeparationXC)}
		}
		if f := res.Forces; f != nil {
			je.LiftPerSpan = ptr(f.ElementLift[i])
		}
		out.Elements = append(out.Elements, je)
	}
	out.Points = out.Elements[0].Points
	if v := res.Viscous; v != nil {
		out.jsonViscous = out.Elements[0].jsonViscous
		out.Cd = ptr(v.Cd)
	}
	if f := res.Forces; f != nil {
		out.Q, out.Force = ptr(f.DynamicPressurePa), ptr(f.LiftPerSpan)
		out.DownforceN, out.MomentN = ptr(f.DownforcePerSpan), ptr(f.MomentPerSpan)
		out.DragN = ptr(f.DragPerSpan)
	}
	return out
}

func solveText(w io.Writer, st *model.Study, res *engine.Result, out jsonSolve) error {
	sol := res.Solution
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "study\t%s\n", st.Name)
	fmt.Fprintf(tw, "angle of attack\t%.3f°\t(%s)\n", sol.AlphaDeg, model.AngleSense(st.Inverted))
	fmt.Fprintf(tw, "frame\t%s\n", model.FrameText)
	fmt.Fprintf(tw, "panels\t%d per element, %s spacing (nose %.2f, tail %.2f)\n", st.Panelling.Panels, st.Panelling.Spacing, st.Panelling.Nose, st.Panelling.Tail)
	fmt.Fprintf(tw, "Cl (circulation)\t%.5f\n", sol.Cl)
	fmt.Fprintf(tw, "Cl (pressure)\t%.5f\n", sol.ClPressure)
	fmt.Fprintf(tw, "Cm\t%.5f\t(%s, about the main element's quarter chord)\n", sol.Cm, model.MomentSense(st.Inverted))
	fmt.Fprintf(tw, "minimum Cp\t%.4f at x/c = %.4f\n", float64(out.CpMin), float64(out.XCpMin))
	fmt.Fprintf(tw, "stagnation point\tx = %.5f, y = %.5f\n", float64(out.Stagnation.X), float64(out.Stagnation.Y))
	if st.Inverted {
		fmt.Fprintf(tw, "downforce coefficient\t%.5f\t(inverted: downforce positive = −Cl)\n", -sol.Cl)
	}
	if v := res.Viscous; v != nil {
		fmt.Fprintf(tw, "Cd (one-way boundary-layer estimate)\t%s\n", fmtNum(v.Cd, "%.5f"))
	}
	if f := res.Forces; f != nil {
		fmt.Fprintf(tw, "dynamic pressure\t%.1f Pa\n", f.DynamicPressurePa)
		fmt.Fprintf(tw, "lift per metre of span\t%.2f N/m\t(positive up; downforce %.2f N/m)\n", f.LiftPerSpan, f.DownforcePerSpan)
	}
	if len(sol.Elements) > 1 {
		for i, e := range sol.Elements {
			fmt.Fprintf(tw, "element %d %q\tCl %.5f, Cm %.5f on its own chord, min Cp %.4f\n", i+1, e.Name, e.Cl, e.Cm, e.CpMin)
		}
	}
	for _, m := range out.Warnings {
		fmt.Fprintf(tw, "warning\t%s\n", m)
	}
	fmt.Fprintln(tw, "caution\t"+strings.TrimPrefix(caution, "caution: "))
	return tw.Flush()
}

func fmtNum(f float64, format string) string {
	if math.IsNaN(f) {
		return "— (outside the method's range)"
	}
	return fmt.Sprintf(format, f)
}

// caution ends every text output: these are estimates that can hurt
// someone if trusted blindly.
const caution = "caution: 2-D estimate: validate by test; structural design and mounting follow the competition's rules and qualified engineering review"
