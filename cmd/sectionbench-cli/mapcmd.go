package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"

	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// varyFlag collects the repeated --vary flag.
type varyFlag []string

func (v *varyFlag) String() string { return strings.Join(*v, " ") }

func (v *varyFlag) Set(s string) error {
	*v = append(*v, s)
	return nil
}

// jsonMapElement is one element's share of a map point.
type jsonMapElement struct {
	Name            string `json:"name"`
	Cl              num    `json:"cl"`
	Cd              num    `json:"cd"`
	SeparationUpper num    `json:"separation_upper"`
	SeparationLower num    `json:"separation_lower"`
	// SeparationSuction is x/c on the suction side as mounted (lower on
	// an inverted wing); null when attached or not converged.
	SeparationSuction num  `json:"separation_suction_side"`
	GapMM             *num `json:"gap_mm,omitempty"`
}

// jsonMapPoint is a map point (and a search's start, best and path): the
// variables' values under their names first, then the keys of a solve.
type jsonMapPoint struct {
	names  []string
	values []float64
	jsonMapKeys
}

// jsonMapKeys are the fixed keys of a map point.
type jsonMapKeys struct {
	Cl         num  `json:"cl"`
	Cd         num  `json:"cd"`
	Cm         num  `json:"cm"`
	ClInviscid num  `json:"cl_inviscid"`
	Converged  bool `json:"converged"`
	// StartedFromNeighbour: the point's solve started from a
	// neighbouring setting's converged solution (StartedFrom, under the
	// variables' names).
	StartedFromNeighbour bool         `json:"started_from_neighbour"`
	StartedFrom          *namedValues `json:"started_from,omitempty"`
	// SingleSolve is what is known of `solve` of the point's setting
	// (engine.SingleSolve): "identical", "agrees" (within the relative
	// tolerances), "another root" (SingleSolveCl, Cd, Cm are solve's),
	// "no answer" (solve does not converge) or "not compared".
	SingleSolve   string `json:"single_solve"`
	SingleSolveCl *num   `json:"single_solve_cl,omitempty"`
	SingleSolveCd *num   `json:"single_solve_cd,omitempty"`
	SingleSolveCm *num   `json:"single_solve_cm,omitempty"`
	Iterations    int    `json:"iterations"`
	// Downforce on an inverted wing (null without a speed), lift on an
	// upright one with a speed; drag with a speed.
	DownforceN *num `json:"downforce_per_span_n_per_m,omitempty"`
	LiftN      *num `json:"lift_per_span_n_per_m,omitempty"`
	DragN      *num `json:"drag_per_span_n_per_m,omitempty"`
	// The main element's separation, as solve gives it.
	SeparationUpper num              `json:"separation_upper"`
	SeparationLower num              `json:"separation_lower"`
	ClearanceMM     *num             `json:"ground_clearance_mm,omitempty"`
	Elements        []jsonMapElement `json:"elements"`
	// Flags say, in words, why the point is not to be taken at face
	// value beyond its other keys (format.MapFlags: "very close to the
	// ground", "transition held upstream", "suction beyond real flows"),
	// as a sweep's rows say them; empty when none.
	Flags []string `json:"flags"`
	Error string   `json:"error,omitempty"`
}

// MarshalJSON writes the variables' keys, then the fixed ones.
func (p jsonMapPoint) MarshalJSON() ([]byte, error) {
	rest, err := json.Marshal(p.jsonMapKeys)
	if err != nil {
		return nil, err
	}
	var b bytes.Buffer
	b.WriteByte('{')
	writeNamed(&b, p.names, p.values)
	if len(p.names) > 0 && len(rest) > 2 {
		b.WriteByte(',')
	}
	b.Write(rest[1:])
	return b.Bytes(), nil
}

// namedValues is a setting as a JSON object: the variables' values under
// their names, in the variables' order.
type namedValues struct {
	names  []string
	values []float64
}

func (n namedValues) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	writeNamed(&b, n.names, n.values)
	b.WriteByte('}')
	return b.Bytes(), nil
}

// writeNamed writes "name":value pairs separated by commas.
func writeNamed(b *bytes.Buffer, names []string, values []float64) {
	for i, n := range names {
		if i > 0 {
			b.WriteByte(',')
		}
		k, _ := json.Marshal(n)
		v, _ := num(values[i]).MarshalJSON()
		b.Write(k)
		b.WriteByte(':')
		b.Write(v)
	}
}

// mapPointJSON is p's JSON form; speed says whether forces are known.
func mapPointJSON(st *model.Study, vars []model.SetupVariable, p engine.Point, hasSpeed bool) jsonMapPoint {
	out := jsonMapPoint{values: p.Values}
	for _, v := range vars {
		out.names = append(out.names, v.Name())
	}
	k := &out.jsonMapKeys
	k.Cl, k.Cd, k.Cm, k.ClInviscid = num(p.Cl), num(p.Cd), num(p.Cm), num(p.ClInviscid)
	k.Converged, k.Iterations, k.Error = p.Converged, p.Iterations, p.Err
	if p.FromNeighbour() {
		k.StartedFromNeighbour = true
		k.StartedFrom = &namedValues{names: out.names, values: p.StartedFrom}
	}
	k.SingleSolve = p.Single.String()
	if p.Single == engine.SingleAgrees || p.Single == engine.SingleAnotherRoot {
		k.SingleSolveCl, k.SingleSolveCd, k.SingleSolveCm = ptr(p.SingleCl), ptr(p.SingleCd), ptr(p.SingleCm)
	}
	switch {
	case p.Inverted:
		k.DownforceN = ptr(p.DownforcePerSpan) // null without a speed
	case hasSpeed:
		k.LiftN = ptr(p.LiftPerSpan)
	}
	if hasSpeed {
		k.DragN = ptr(p.DragPerSpan)
	}
	if p.ClearanceMM == p.ClearanceMM {
		k.ClearanceMM = ptr(p.ClearanceMM)
	}
	k.Flags = []string{}
	for _, f := range format.MapFlags(&p) {
		k.Flags = append(k.Flags, string(f.Kind))
	}
	k.Elements = []jsonMapElement{}
	for i, e := range p.Elements {
		je := jsonMapElement{Name: e.Name, Cl: num(e.Cl), Cd: num(e.Cd), SeparationUpper: num(e.SeparationUpper), SeparationLower: num(e.SeparationLower), SeparationSuction: num(e.SeparationSuction)}
		if i > 0 {
			je.GapMM = ptr(e.GapMM)
		}
		k.Elements = append(k.Elements, je)
	}
	if len(p.Elements) > 0 {
		k.SeparationUpper, k.SeparationLower = num(p.Elements[0].SeparationUpper), num(p.Elements[0].SeparationLower)
	}
	return out
}

// jsonMap is the map's JSON.
type jsonMap struct {
	Variables   []string       `json:"variables"`
	ViscousMode string         `json:"viscous_mode"`
	Inverted    bool           `json:"inverted"`
	Points      []jsonMapPoint `json:"points"`
	Converged   int            `json:"converged_points"`
	// FromNeighbour counts the converged points whose solve started from
	// a neighbour's solution (each says so: started_from_neighbour).
	FromNeighbour int `json:"started_from_neighbour_points"`
	// ComparedWithSolve: every point was compared with solve of its
	// setting (--compare-with-solve); AnotherRoot and NoSingleSolve
	// count the converged points where solve reached another root or
	// none; Tolerance holds the relative tolerances of "agrees".
	ComparedWithSolve bool          `json:"compared_with_solve"`
	AnotherRoot       int           `json:"another_root_points"`
	NoSingleSolve     int           `json:"no_single_solve_points"`
	Tolerance         jsonTolerance `json:"single_solve_tolerance"`
	Note              string        `json:"note"`
	Caution           string        `json:"caution"`
}

// jsonTolerance is how far, relative, a map point and solve may differ
// and agree (engine.SolveAgreementTolerance): cl and cm of |cl|, cd of cd.
type jsonTolerance struct {
	Cl float64 `json:"cl"`
	Cd float64 `json:"cd"`
}

// warmNote says what a warm-started map's numbers are.
const warmNote = "each point starts from its converged neighbour's solution; where the coupled equations have one root there it is solve's answer within single_solve_tolerance, where they have two (near a slot, past maximum lift) it can be the other one: --compare-with-solve solves every point as solve does and marks those (single_solve)"

// explorerFlags are the flags map and search share beyond the inputs.
type explorerFlags struct {
	vary     varyFlag
	inviscid bool
	progress bool
}

func addExplorerFlags(fs *flags, what string) *explorerFlags {
	ef := &explorerFlags{}
	fs.Var(&ef.vary, "vary", what+" (repeat the flag for another variable); NAME is alpha_deg, clearance_mm, speed_mps, elements[K].deflection_deg, elements[K].gap_mm or elements[K].overlap_mm (K from 0, the main element; as mounted)")
	fs.BoolVar(&ef.progress, "progress", false, "write a line on standard error after each solve (the viscous solution is slow)")
	fs.BoolVar(&ef.inviscid, "inviscid", false, "solve with the panel method only (default: the coupled viscous solution whenever the study has a speed or a Reynolds number)")
	return ef
}

// load reads the --vary flags with parse, then the study and its
// sections, and checks that the study has the variables.
func (ef *explorerFlags) load(in *inputs, fs *flags, parse func(string) (model.SetupRange, error)) (*model.Study, []*model.Section, []model.SetupRange, error) {
	var ranges []model.SetupRange
	for _, s := range ef.vary {
		r, err := parse(s)
		if err != nil {
			return nil, nil, nil, setupUsage(err)
		}
		ranges = append(ranges, r)
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return nil, nil, nil, err
	}
	if err := st.CheckSetup(ranges); err != nil {
		return nil, nil, nil, setupUsage(err)
	}
	return st, secs, ranges, nil
}

// setupUsage turns a set-up or option error into a usage error naming the
// flag.
func setupUsage(err error) error {
	var se *model.SetupError
	if errors.As(err, &se) {
		return usagef("--vary %v", err)
	}
	var oe *engine.OptionError
	if errors.As(err, &oe) {
		return usagef("%v", err)
	}
	return err
}

func cmdMap(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("map", "map (--study FILE | --section SPEC) --vary NAME=FROM:TO:STEP [--vary NAME=FROM:TO:STEP] [--inviscid] [--compare-with-solve] [--alpha DEG] [--panels N] [--re RE] [--transition-n N] [--trip-upper XC] [--trip-lower XC] [--format text|csv|json]", stdout)
	in := addInputs(fs, false, "text", "csv", "json")
	ef := addExplorerFlags(fs, "a variable and its values `NAME=FROM:TO:STEP`")
	compare := fs.Bool("compare-with-solve", false, "also solve every point as solve does (from the march: several times slower) and mark the points on another root of the coupled equations or where solve has no answer")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	if len(ef.vary) < 1 || len(ef.vary) > 2 {
		return usagef("--vary: give one or two variables to map (%d given)", len(ef.vary))
	}
	st, secs, ranges, err := ef.load(in, fs, model.ParseSetupRange)
	if err != nil {
		return err
	}
	vars := rangeVars(ranges)
	opt := engine.MapOptions{PointOptions: engine.PointOptions{Inviscid: ef.inviscid, CoupledMaxIterations: coupledMaxIterations}, CompareWithSolve: *compare}
	var each func(engine.Point)
	if ef.progress {
		done, conv := 0, 0
		each = func(p engine.Point) {
			done++
			if p.Converged {
				conv++
			}
			fmt.Fprintf(stderr, "map: %d points solved, %d converged\n", done, conv)
		}
	}
	points, err := engine.Map(context.Background(), st, secs, ranges, opt, nil, each)
	if err != nil {
		return setupUsage(err)
	}
	mode := engine.MapMode(st, opt.PointOptions, vars)
	hasSpeed := st.Flow.SpeedMPS > 0 || slicesHasSpeed(vars)
	switch in.format {
	case "json":
		out := jsonMap{ViscousMode: mode, Inverted: st.Inverted, Points: []jsonMapPoint{}, Caution: caution,
			ComparedWithSolve: *compare, Tolerance: jsonTolerance{engine.SolveAgreementTolerance, engine.SolveAgreementToleranceCd}, Note: warmNote}
		for _, v := range vars {
			out.Variables = append(out.Variables, v.Name())
		}
		for _, p := range points {
			out.Points = append(out.Points, mapPointJSON(st, vars, p, hasSpeed))
			if p.Converged {
				out.Converged++
			}
			switch {
			case !p.NotSolve():
			case p.Single == engine.SingleAnotherRoot:
				out.AnotherRoot++
			default:
				out.NoSingleSolve++
			}
		}
		out.FromNeighbour = fromNeighbour(points)
		return writeJSON(stdout, out)
	case "csv":
		m := format.StudyMetadata(st, nil, "Sectionbench "+version)
		m.Extra = append(m.Extra, "map solved with the "+modeWords(mode)+"; "+caution)
		if mode == string(model.ViscousCoupled) {
			m.Extra = append(m.Extra, warmNote+fmt.Sprintf(" (relative: cl and cm %g of |cl|, cd %g)", engine.SolveAgreementTolerance, engine.SolveAgreementToleranceCd))
		}
		return format.WriteMapTable(stdout, m, st, vars, points)
	}
	return mapText(stdout, true, st, vars, points, mode, hasSpeed)
}

// settingWords is a setting as "name value, name value".
func settingWords(vars []model.SetupVariable, values []float64) string {
	var parts []string
	for i, v := range vars {
		parts = append(parts, fmt.Sprintf("%s %g", v.Name(), values[i]))
	}
	return strings.Join(parts, ", ")
}

// rangeVars returns the ranges' variables.
func rangeVars(ranges []model.SetupRange) []model.SetupVariable {
	vars := make([]model.SetupVariable, len(ranges))
	for i, r := range ranges {
		vars[i] = r.Var
	}
	return vars
}

// slicesHasSpeed reports whether the speed is one of the variables.
func slicesHasSpeed(vars []model.SetupVariable) bool {
	for _, v := range vars {
		if v.Kind == model.SetupSpeed {
			return true
		}
	}
	return false
}

// modeWords names how the points were solved.
func modeWords(mode string) string {
	if mode == string(model.ViscousCoupled) {
		return "coupled viscous solution"
	}
	return "panel method only (inviscid: no drag, no separation)"
}

// mapText is the map as a table: the variables, then the load and drag,
// the state and each element's suction-side separation; titled "Map of"
// the study when title, else (a search's start and best, under the
// search's own heading) without a heading.
func mapText(w io.Writer, title bool, st *model.Study, vars []model.SetupVariable, points []engine.Point, mode string, hasSpeed bool) error {
	if title {
		fmt.Fprintf(w, "Map of %s, %s; %s\n", st.Name, modeWords(mode), tableSense(st.Inverted, true))
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	head := ""
	for _, v := range vars {
		head += v.Name() + "\t"
	}
	head += "cl\tcd\t"
	if hasSpeed {
		if st.Inverted {
			head += "downforce N/m\t"
		} else {
			head += "lift N/m\t"
		}
		head += "drag N/m\t"
	}
	for k := range st.Elements {
		head += fmt.Sprintf("elements[%d] separation x/c (%s)\t", k, model.SuctionSurface(st.Inverted))
	}
	fmt.Fprintln(tw, head+"flags\tstate\t")
	near := false
	for _, p := range points {
		line := ""
		for _, x := range p.Values {
			line += fmt.Sprintf("%.6g\t", x) // a search's settings are not on a grid: 21.875000000000004
		}
		line += fmtShort(p.Cl, "%.4f") + "\t" + fmtShort(p.Cd, "%.5f") + "\t"
		if hasSpeed {
			load := p.LiftPerSpan
			if st.Inverted {
				load = p.DownforcePerSpan
			}
			line += fmtShort(load, "%.1f") + "\t" + fmtShort(p.DragPerSpan, "%.2f") + "\t"
		}
		for _, e := range p.Elements {
			switch {
			case !p.Converged || !p.Viscous:
				line += "—\t"
			case e.SeparationSuction != e.SeparationSuction:
				line += "attached\t"
			default:
				line += fmt.Sprintf("%.3f\t", e.SeparationSuction)
			}
		}
		flags := "none"
		if f := format.MapFlags(&p); len(f) > 0 {
			flags = model.FlagWords(f)
			near = near || slices.ContainsFunc(f, func(f model.Flag) bool { return f.Kind == model.FlagGround })
		}
		line += flags + "\t"
		state := "converged"
		switch {
		case p.Err != "":
			state = "FAILED: " + p.Err
		case !p.Converged:
			state = fmt.Sprintf("NOT CONVERGED (%d iterations)", p.Iterations)
		case !p.Viscous:
			state = "inviscid"
		case p.Single == engine.SingleAnotherRoot:
			state = fmt.Sprintf("converged from the neighbour at %s; ANOTHER ROOT: solve gives cl %.4f cd %.5f", settingWords(vars, p.StartedFrom), p.SingleCl, p.SingleCd)
		case p.Single == engine.SingleNoAnswer:
			state = "converged only from the neighbour at " + settingWords(vars, p.StartedFrom) + " (solve does not converge here)"
		case p.FromNeighbour():
			state = "converged from the neighbour at " + settingWords(vars, p.StartedFrom)
			if p.Single == engine.SingleAgrees {
				state += " (solve agrees)"
			}
		}
		fmt.Fprintln(tw, line+state+"\t")
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	if near {
		fmt.Fprintf(w, "%s: below %g mm (%g of the main element's %g mm chord): %s\n",
			model.FlagGround, st.NearGroundMM(), model.GroundHOverCMin, st.GroundChordMM(), model.GroundCaution())
	}
	other, none, compared := 0, 0, false
	for i := range points {
		p := &points[i]
		compared = compared || p.Single == engine.SingleAgrees
		switch {
		case !p.NotSolve():
		case p.Single == engine.SingleAnotherRoot:
			other++
		default:
			none++
		}
	}
	if mode == string(model.ViscousCoupled) {
		fmt.Fprintf(w, "Each point started from its converged neighbour's solution (%d of %d). ", fromNeighbour(points), len(points))
		if other+none > 0 || compared {
			fmt.Fprintf(w, "Compared with solve of each setting: %d on another root of the coupled equations, %d where solve does not converge; the rest agree within %g of cl (cd %g).\n", other, none, engine.SolveAgreementTolerance, engine.SolveAgreementToleranceCd)
		} else {
			fmt.Fprintf(w, "Where the coupled equations have one root that is solve's answer within %g of cl (cd %g); near a slot or past maximum lift they can have two, and --compare-with-solve marks the points on the other.\n", engine.SolveAgreementTolerance, engine.SolveAgreementToleranceCd)
		}
	}
	_, err := fmt.Fprintln(w, caution)
	return err
}

// tableSense states the signs of the map's and search's text columns:
// cl in the standard sense, the load in N/m as named. Their heading gave
// the workbench's "downforce coefficient −Cl, positive towards the
// ground" above a cl column of negative numbers.
// load adds the sign of the downforce column (a map's and a search's).
func tableSense(inverted, load bool) string {
	switch {
	case inverted && load:
		return "cl positive up, away from the ground (negative: downforce); downforce N/m positive towards the ground"
	case inverted:
		return "cl positive up, away from the ground (negative: downforce)"
	}
	return "cl positive up"
}

// fromNeighbour counts the points that converged only from a neighbour.
func fromNeighbour(points []engine.Point) int {
	n := 0
	for i := range points {
		if points[i].FromNeighbour() {
			n++
		}
	}
	return n
}
