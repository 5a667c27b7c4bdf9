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

// jsonCoupled are the coupled solution's state and inviscid companions,
// shared by the configuration, its elements and sweep rows.
type jsonCoupled struct {
	ClInviscid  num     `json:"cl_inviscid"`
	Converged   *bool   `json:"converged,omitempty"`
	Iterations  *int    `json:"iterations,omitempty"`
	Residual    *num    `json:"residual,omitempty"`
	BubbleUpper *[2]num `json:"bubble_upper,omitempty"`
	BubbleLower *[2]num `json:"bubble_lower,omitempty"`
	Note        string  `json:"note,omitempty"`
	// Rejected says why iterations that met their tolerance were not
	// taken as converged (a spurious solution); without it a point with
	// a tiny residual and converged false reads as a contradiction.
	Rejected string `json:"rejected,omitempty"`
}

// coupledKeys fills the coupled solution's keys of one element (k ≥ 0)
// or of the configuration (k < 0, transition and separation of the main
// element) from p; coefficients NaN (null) unless it converged. The
// caller sets cl_inviscid (the panel method's Cl from circulation).
func coupledKeys(p *engine.CoupledPoint, k int) (jsonCoefficients, jsonViscous, jsonCoupled) {
	conv, it := p.Converged, p.Iterations
	e := p.Elements[max(k, 0)]
	c := jsonCoupled{Converged: &conv, Iterations: &it, Residual: ptr(p.Residual), Note: p.Note, Rejected: p.Rejected,
		BubbleUpper: bubble(e.BubbleUpper), BubbleLower: bubble(e.BubbleLower)}
	v := jsonViscous{ptr(p.Cd), ptr(e.TransitionUpper), ptr(e.TransitionLower), ptr(e.SeparationUpper), ptr(e.SeparationLower)}
	co := jsonCoefficients{Cl: num(p.Cl), Cm: num(p.Cm)}
	if k >= 0 {
		v.Cd = ptr(e.Cd)
		co.Cl, co.Cm = num(e.Cl), num(e.Cm)
	}
	return co, v, c
}

// bubble is a laminar separation bubble's extent, nil for none.
func bubble(b [2]float64) *[2]num {
	if math.IsNaN(b[0]) {
		return nil
	}
	return &[2]num{num(b[0]), num(b[1])}
}

type jsonElement struct {
	Name string `json:"name"`
	jsonCoefficients
	Reynolds *num `json:"reynolds,omitempty"`
	jsonViscous
	jsonCoupled
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
	// ViscousMode is "coupled" or "estimate" when the viscous solution
	// ran.
	ViscousMode string `json:"viscous_mode,omitempty"`
	CmInviscid  *num   `json:"cm_inviscid,omitempty"`
	jsonViscous
	jsonCoupled
	Q             *num          `json:"dynamic_pressure_pa,omitempty"`
	Force         *num          `json:"force_per_span_n_per_m,omitempty"`
	ForceInviscid *num          `json:"force_inviscid_per_span_n_per_m,omitempty"`
	DownforceN    *num          `json:"downforce_per_span_n_per_m,omitempty"`
	DragN         *num          `json:"drag_per_span_n_per_m,omitempty"`
	MomentN       *num          `json:"moment_per_span_n_m_per_m,omitempty"`
	Points        []jsonPoint   `json:"points"`
	Elements      []jsonElement `json:"elements"`
	Warnings      []string      `json:"warnings"`
}

func ptr(f float64) *num { n := num(f); return &n }

func cmdSolve(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("solve", "solve (--section SPEC | --study FILE) [--alpha DEG] [--panels N] [--spacing LAW] [--nose F] [--tail F] [--re RE] [--transition-n N] [--trip-upper XC] [--trip-lower XC] [--format text|json]", stdout)
	in := addInputs(fs, false, "text", "json")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	st, secs, reps, err := in.load(fs)
	if err != nil {
		return err
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, CoupledMaxIterations: coupledMaxIterations})
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
	if c := res.Coupled; c != nil && !c.Converged {
		w = append(w, notConverged(c))
	}
	for _, f := range res.Flags() {
		w = append(w, "caution, "+string(f.Kind)+": "+f.Message)
	}
	return w
}

// coupledMaxIterations bounds the coupled solution's iterations; 0 is the
// solver's default. Tests set it to force a point that does not converge;
// it is not a flag.
var coupledMaxIterations int

// notConverged says in words that a coupled point is no answer.
func notConverged(c *engine.CoupledPoint) string {
	if c.Note != "" {
		return fmt.Sprintf("viscous solution at %g° failed (%s): no viscous numbers", c.AlphaDeg, c.Note)
	}
	if c.Rejected != "" {
		return fmt.Sprintf("viscous solution at %g° not taken as converged (%d iterations): %s; it gives no viscous numbers", c.AlphaDeg, c.Iterations, c.Rejected)
	}
	return fmt.Sprintf("viscous solution at %g° did not converge (%d iterations, residual %.2g): it gives no viscous numbers", c.AlphaDeg, c.Iterations, c.Residual)
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
		je.ClInviscid = num(e.Cl)
		if v := res.Viscous; v != nil {
			ev := v.Elements[i]
			je.jsonViscous = jsonViscous{ptr(ev.Cd), ptr(ev.Upper.TransitionXC), ptr(ev.Lower.TransitionXC), ptr(ev.Upper.TurbulentSeparationXC), ptr(ev.Lower.TurbulentSeparationXC)}
		}
		if c := res.Coupled; c != nil {
			var co jsonCoefficients
			co, je.jsonViscous, je.jsonCoupled = coupledKeys(c, i)
			je.Cl, je.Cm, je.ClInviscid = co.Cl, co.Cm, num(e.Cl)
		}
		if f := res.Forces; f != nil {
			je.LiftPerSpan = ptr(f.ElementLift[i])
		}
		out.Elements = append(out.Elements, je)
	}
	out.Points = out.Elements[0].Points
	out.ClInviscid = num(sol.Cl)
	if v := res.Viscous; v != nil {
		out.ViscousMode = string(model.ViscousEstimate)
		out.jsonViscous = out.Elements[0].jsonViscous
		out.Cd = ptr(v.Cd)
	}
	if c := res.Coupled; c != nil {
		out.ViscousMode = string(model.ViscousCoupled)
		var co jsonCoefficients
		co, out.jsonViscous, out.jsonCoupled = coupledKeys(c, -1)
		out.Cl, out.Cm, out.CmInviscid = co.Cl, co.Cm, ptr(sol.Cm)
		out.ClInviscid = num(sol.Cl)
		if st.Inverted {
			out.Downforce = ptr(-c.Cl)
		}
	}
	if f := res.Forces; f != nil {
		out.Q, out.Force = ptr(f.DynamicPressurePa), ptr(f.LiftPerSpan)
		out.DownforceN, out.MomentN = ptr(f.DownforcePerSpan), ptr(f.MomentPerSpan)
		out.DragN = ptr(f.DragPerSpan)
		if f.Coupled {
			out.ForceInviscid = ptr(f.InviscidLiftPerSpan)
		}
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
	// With a viscous solution, the panel method's numbers say what they are.
	inv, cm := "", "Cm"
	if res.Coupled != nil || res.Viscous != nil {
		inv, cm = "inviscid, ", "Cm (inviscid)"
	}
	fmt.Fprintf(tw, "Cl (%scirculation)\t%.5f\n", inv, sol.Cl)
	fmt.Fprintf(tw, "Cl (%spressure)\t%.5f\n", inv, sol.ClPressure)
	fmt.Fprintf(tw, "%s\t%.5f\t(%s, about the main element's quarter chord)\n", cm, sol.Cm, model.MomentSense(st.Inverted))
	fmt.Fprintf(tw, "minimum Cp\t%.4f at x/c = %.4f\n", float64(out.CpMin), float64(out.XCpMin))
	// The solution's positions are metres of the study frame (a --section
	// study has a 1000 mm chord, so they are chord lengths there too).
	fmt.Fprintf(tw, "stagnation point\tx = %.2f mm, y = %.2f mm\t(main element, as mounted)\n", 1000*float64(out.Stagnation.X), 1000*float64(out.Stagnation.Y))
	if st.Inverted {
		// The JSON's downforce_coefficient is −cl, the viscous one where
		// the coupled solution converged; the text gave the panel
		// method's here without saying so (3.92137 on the two-element
		// example, whose viscous answer is 3.20162).
		switch c := res.Coupled; {
		case c != nil && c.Converged:
			fmt.Fprintf(tw, "downforce coefficient (viscous)\t%.5f\t(inverted: downforce positive = −Cl; inviscid %.5f)\n", -c.Cl, -c.ClInviscid)
		case c != nil:
			fmt.Fprintf(tw, "downforce coefficient (inviscid)\t%.5f\t(inverted: downforce positive = −Cl; the viscous solution did not converge)\n", -sol.Cl)
		case res.Viscous != nil:
			fmt.Fprintf(tw, "downforce coefficient (inviscid)\t%.5f\t(inverted: downforce positive = −Cl)\n", -sol.Cl)
		default:
			fmt.Fprintf(tw, "downforce coefficient\t%.5f\t(inverted: downforce positive = −Cl)\n", -sol.Cl)
		}
	}
	if v := res.Viscous; v != nil {
		fmt.Fprintf(tw, "Cd (one-way boundary-layer estimate)\t%s\n", fmtNum(v.Cd, "%.5f"))
	}
	if c := res.Coupled; c != nil {
		coupledText(tw, c)
	}
	if f := res.Forces; f != nil {
		fmt.Fprintf(tw, "dynamic pressure\t%.1f Pa\n", f.DynamicPressurePa)
		src := "inviscid"
		if f.Coupled {
			src = "viscous"
		}
		fmt.Fprintf(tw, "lift per metre of span (%s)\t%s N/m\t(positive up; downforce %s N/m)\n", src, fmtShort(f.LiftPerSpan, "%.2f"), fmtShort(f.DownforcePerSpan, "%.2f"))
		if f.Coupled {
			fmt.Fprintf(tw, "drag per metre of span\t%s N/m\n", fmtShort(f.DragPerSpan, "%.2f"))
			fmt.Fprintf(tw, "lift per metre of span (inviscid)\t%.2f N/m\n", f.InviscidLiftPerSpan)
		}
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

// coupledText writes the coupled solution's lines: its state first, then
// its numbers, which are dashes when it did not converge.
func coupledText(tw io.Writer, c *engine.CoupledPoint) {
	fmt.Fprintf(tw, "viscous solution\t%s\n", convergenceWords(c))
	fmt.Fprintf(tw, "Cl (viscous)\t%s\t(inviscid %.5f)\n", fmtShort(c.Cl, "%.5f"), c.ClInviscid)
	fmt.Fprintf(tw, "Cd (viscous, from the wakes)\t%s\n", fmtShort(c.Cd, "%.5f"))
	fmt.Fprintf(tw, "Cm (viscous)\t%s\t(inviscid %.5f)\n", fmtShort(c.Cm, "%.5f"), c.CmInviscid)
	if c.Converged {
		fmt.Fprintf(tw, "lift-to-drag ratio\t%.1f\n", c.Cl/c.Cd)
	}
	for i, e := range c.Elements {
		name := ""
		if len(c.Elements) > 1 {
			name = fmt.Sprintf(" (element %d %q)", i+1, e.Name)
		}
		fmt.Fprintf(tw, "transition x/c%s\tupper %s, lower %s\n", name, fmtXC(e.TransitionUpper, c.Converged), fmtXC(e.TransitionLower, c.Converged))
		fmt.Fprintf(tw, "separation x/c%s\tupper %s, lower %s\n", name, fmtXC(e.SeparationUpper, c.Converged), fmtXC(e.SeparationLower, c.Converged))
		if len(c.Elements) > 1 {
			fmt.Fprintf(tw, "element %d %q (viscous)\tCl %s, Cd %s, Cm %s on its own chord\n", i+1, e.Name, fmtShort(e.Cl, "%.5f"), fmtShort(e.Cd, "%.5f"), fmtShort(e.Cm, "%.5f"))
		}
	}
}

// convergenceWords says whether a coupled point converged.
func convergenceWords(c *engine.CoupledPoint) string {
	switch {
	case c.Note != "":
		return "FAILED: " + c.Note
	case c.Rejected != "":
		return fmt.Sprintf("NOT CONVERGED after %d iterations: %s; its numbers are not an answer", c.Iterations, c.Rejected)
	case c.Converged:
		if c.Iterations == 1 {
			return fmt.Sprintf("converged in 1 iteration (residual %.1e)", c.Residual)
		}
		return fmt.Sprintf("converged in %d iterations (residual %.1e)", c.Iterations, c.Residual)
	}
	return fmt.Sprintf("NOT CONVERGED after %d iterations (residual %.1e): its numbers are not an answer", c.Iterations, c.Residual)
}

// fmtXC formats a transition or separation position: "none" when there
// is none, a dash when the point did not converge.
func fmtXC(x float64, converged bool) string {
	switch {
	case !converged:
		return "—"
	case math.IsNaN(x):
		return "none"
	}
	return fmt.Sprintf("%.3f", x)
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
