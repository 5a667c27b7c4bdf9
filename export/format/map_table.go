package format

import (
	"fmt"
	"io"
	"strconv"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// WriteMapTable writes a map or a search path (engine.Map, engine.Search)
// as CSV after the metadata m, one row per point in the order given: the
// variables' values under their names (alpha_deg, elements[1].gap_mm, …);
// cl, cd, cm and cl_inviscid; converged (yes or no);
// started_from_neighbour (yes when the point's solve started from a
// neighbouring setting's converged solution) and the setting it started
// from, started_from.NAME per variable (empty otherwise); single_solve,
// what is known of `solve` of the point's setting (engine.SingleSolve:
// identical, agrees, another root, no answer, not compared) and
// single_solve_cl, `solve`'s Cl when compared (empty otherwise);
// iterations;
// downforce_per_span_n_per_m on an inverted wing or lift_per_span_n_per_m
// on an upright one, and drag_per_span_n_per_m (empty without a speed);
// per element K, elements[K].separation_suction_xc (empty: attached, or
// not converged) and, behind the main element, elements[K].gap_mm; then
// flags (MapFlags in words, as a sweep's rows give them: "very close to
// the ground", "transition held upstream", "suction beyond real flows",
// or none) and error (why a point could not be solved).
// Coefficients are empty where the point did not converge.
func WriteMapTable(w io.Writer, m Metadata, st *model.Study, vars []model.SetupVariable, points []engine.Point) error {
	m.AlphaDeg = NoAngle
	units := "angles in degrees, lengths in millimetres, speed in m/s, forces in N per metre of span; coefficients on the reference chord, cl positive away from the ground (standard sense); " + model.FrameText
	if err := m.write(w, units, "along each element's own chord from its leading edge, on its suction side as mounted ("+model.SuctionSurface(st.Inverted)+" surface); empty: attached, or the point did not converge"); err != nil {
		return err
	}
	load := "lift_per_span_n_per_m"
	if st.Inverted {
		load = "downforce_per_span_n_per_m"
	}
	head := []string{}
	for _, v := range vars {
		head = append(head, v.Name())
	}
	head = append(head, "cl", "cd", "cm", "cl_inviscid", "converged", "started_from_neighbour")
	for _, v := range vars {
		head = append(head, "started_from."+v.Name())
	}
	head = append(head, "single_solve", "single_solve_cl", "iterations", load, "drag_per_span_n_per_m")
	for k := range st.Elements {
		head = append(head, fmt.Sprintf("elements[%d].separation_suction_xc", k))
		if k > 0 {
			head = append(head, fmt.Sprintf("elements[%d].gap_mm", k))
		}
	}
	head = append(head, "flags", "error")
	t, err := newTable(w, head...)
	if err != nil {
		return err
	}
	yes := map[bool]string{true: "yes", false: "no"}
	for _, p := range points {
		row := []string{}
		for _, x := range p.Values {
			row = append(row, cell(x))
		}
		loadN := p.LiftPerSpan
		if st.Inverted {
			loadN = p.DownforcePerSpan
		}
		row = append(row, cell(p.Cl), cell(p.Cd), cell(p.Cm), cell(p.ClInviscid), yes[p.Converged], yes[p.FromNeighbour()])
		for i := range vars {
			from := ""
			if p.FromNeighbour() {
				from = cell(p.StartedFrom[i])
			}
			row = append(row, from)
		}
		row = append(row, p.Single.String(), cell(p.SingleCl), strconv.Itoa(p.Iterations), cell(loadN), cell(p.DragPerSpan))
		for k, e := range p.Elements {
			row = append(row, cell(e.SeparationSuction))
			if k > 0 {
				row = append(row, cell(e.GapMM))
			}
		}
		flags := "none"
		if f := MapFlags(&p); len(f) > 0 {
			flags = model.FlagWords(f)
		}
		row = append(row, flags, p.Err)
		if err := t.row(row...); err != nil {
			return err
		}
	}
	return t.close()
}

// MapFlags returns the flags a map's or a search's point raises that
// its other columns do not say, as `solve` and a sweep's rows raise them
// (engine.Point.Flags): a suction peak beyond real flows, transition held
// upstream, a Reynolds number outside the checked range, and a clearance
// below model.GroundHOverCMin of the main element's chord
// (model.Study.NearGround), "very close to the ground". Separation and
// convergence have columns of their own (the map judges separation
// against its own x/c). A point without an answer raises none (it has no
// numbers to doubt). Ground-only before: a point whose suction peak
// `solve` flagged was "none" on the map.
func MapFlags(p *engine.Point) []model.Flag {
	if !p.Converged || p.Err != "" {
		return nil
	}
	var flags []model.Flag
	for _, f := range p.Flags {
		switch f.Kind {
		case model.FlagSeparated, model.FlagNotConverged, model.FlagPastClMax:
		default:
			flags = append(flags, f)
		}
	}
	return flags
}

// groundFlag returns the ground's flag among MapFlags(p), if any.
func groundFlag(p *engine.Point) (model.Flag, bool) {
	for _, f := range MapFlags(p) {
		if f.Kind == model.FlagGround {
			return f, true
		}
	}
	return model.Flag{}, false
}

// NearGroundAdvice says, for a search's best setting p, when it lies too
// near the ground (MapFlags): the model shows downforce rising all the
// way down, so a search for downforce over the clearance runs to the
// lowest it may, where real wings lose it; "" otherwise. The app's
// search and the report's set-up page give it.
func NearGroundAdvice(st *model.Study, p *engine.Point) string {
	f, ok := groundFlag(p)
	if !ok {
		return ""
	}
	return fmt.Sprintf("The best setting is %s: %s. A search for downforce goes there because the model's downforce keeps rising towards the ground; keep the clearance to at least %s mm to search above it.",
		f.Kind, f.Message, strconv.FormatFloat(st.NearGroundMM(), 'g', 4, 64))
}
