package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// jsonSearch is the search's JSON.
type jsonSearch struct {
	Objective   string       `json:"objective"`
	Variables   []string     `json:"variables"`
	ViscousMode string       `json:"viscous_mode"`
	Inverted    bool         `json:"inverted"`
	Start       jsonMapPoint `json:"start"`
	Best        jsonMapPoint `json:"best"`
	Feasible    bool         `json:"feasible"`
	Evaluations int          `json:"evaluations"`
	Status      string       `json:"status"`
	// Target is the drag objective's least downforce as used (the flag,
	// or the start's); null otherwise.
	Target *num `json:"downforce_target,omitempty"`
	// Unreproduced is, with --prefer-reproducible, the best setting found
	// when a single solve does not reproduce it (best is then the best
	// that one does); absent otherwise.
	Unreproduced *jsonMapPoint  `json:"unreproduced_best,omitempty"`
	Path         []jsonMapPoint `json:"path"`
	Note         string         `json:"note"`
	Caution      string         `json:"caution"`
}

// localNote says what the search's answer is.
const localNote = "a local optimum near the start (Nelder–Mead simplex): a map of the same bounds shows whether a better setting lies elsewhere"

func cmdSearch(args []string, stdout, stderr io.Writer) (err error) {
	fs := newFlags("search", "search (--study FILE | --section SPEC) --vary NAME=LO:HI [--vary …] --objective downforce|lift-to-drag|drag [--downforce-target N] [--attached-to XC] [--min-gap MM] [--min-clearance MM] [--max-evaluations N] [--prefer-reproducible] [--inviscid] [--apply-to FILE [--pin-start]] [--format text|json]", stdout)
	in := addInputs(fs, false, "text", "json")
	ef := addExplorerFlags(fs, "a variable and its bounds `NAME=LO:HI`")
	objective := fs.String("objective", "downforce", "what to optimise: `downforce` (the most; lift on an upright wing), lift-to-drag (the best ratio) or drag (the least, at --downforce-target)")
	target := fs.Float64("downforce-target", 0, "with --objective drag: the least downforce (lift upright) in `N/m` of span with a speed, else as a coefficient (−Cl inverted); 0: the start's")
	attached := fs.Float64("attached-to", engine.SeparatedFromXC, "every element's suction side must stay attached at least to this `x/c` (0: no limit; needs the viscous solution; the default is where the results flag a separated wing)")
	minGap := fs.Float64("min-gap", 0, "the least slot gap in `mm` behind every element after the first (a manufacturing minimum; 0: none)")
	minClear := fs.Float64("min-clearance", 0, "the least ground clearance in `mm` (0: the method's own minimum only)")
	maxEval := fs.Int("max-evaluations", engine.DefaultSearchEvaluations, "the most `solves` the search may make")
	reproducible := fs.Bool("prefer-reproducible", false, fmt.Sprintf("when a single solve (what solve and --apply-to's study give) does not reproduce the best setting found, take the best setting of the path that one reproduces (up to %d more single solves)", engine.ReproducibleTries))
	pinStart := fs.Bool("pin-start", false, "with --apply-to: the written study also carries a pin of the start (its Cp and polar, the panel method's), as the app's Pin the starting point")
	applyTo := fs.String("apply-to", "", "write the study with the best setting found applied to `FILE` (the app's Apply; the start stays in the --study file); nothing is written, and the exit status is 1, when no setting met every limit")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	if len(ef.vary) == 0 {
		return usagef("--vary: give at least one variable and its bounds NAME=LO:HI")
	}
	obj, err := engine.ParseObjective(*objective)
	if err != nil {
		return usagef("--objective %v", err)
	}
	if *maxEval < 1 {
		return usagef("--max-evaluations %d: at least 1", *maxEval)
	}
	st, secs, bounds, err := ef.load(in, fs, model.ParseSetupBounds)
	if err != nil {
		return err
	}
	vars := rangeVars(bounds)
	opt := engine.SearchOptions{
		PointOptions: engine.PointOptions{Inviscid: ef.inviscid, CoupledMaxIterations: coupledMaxIterations},
		Objective:    obj, DownforceTarget: *target, MinGapMM: *minGap, MinClearanceMM: *minClear, MaxEvaluations: *maxEval,
		PreferReproducible: *reproducible,
	}
	mode := engine.MapMode(st, opt.PointOptions, vars)
	if mode == string(model.ViscousCoupled) || fs.isSet("attached-to") {
		opt.AttachedToXC = *attached
	}
	var each func(engine.Point)
	if ef.progress {
		n := 0
		each = func(p engine.Point) {
			n++
			state := "converged"
			if !p.Converged {
				state = "not converged"
			}
			fmt.Fprintf(stderr, "search: solve %d at %v, %s\n", n, p.Values, state)
		}
	}
	if *pinStart && *applyTo == "" {
		return usagef("--pin-start goes with --apply-to FILE")
	}
	if *applyTo != "" {
		if err := sectionsReachable(st, in.study, *applyTo); err != nil {
			return err
		}
	}
	res, err := engine.Search(context.Background(), st, secs, bounds, opt, each)
	if err != nil {
		return setupUsage(err)
	}
	if *applyTo != "" {
		defer func() {
			if err == nil {
				err = writeApplied(*applyTo, st, vars, res, secs, *pinStart)
			}
		}()
	}
	hasSpeed := st.Flow.SpeedMPS > 0 || slicesHasSpeed(vars)
	if in.format == "json" {
		out := jsonSearch{Objective: string(obj), ViscousMode: mode, Inverted: st.Inverted,
			Start: mapPointJSON(st, vars, res.Start, hasSpeed), Best: mapPointJSON(st, vars, res.Best, hasSpeed),
			Feasible: res.Feasible, Evaluations: res.Evaluations, Status: res.Status, Path: []jsonMapPoint{}, Note: localNote, Caution: caution}
		for _, v := range vars {
			out.Variables = append(out.Variables, v.Name())
		}
		if obj == engine.ObjectiveDrag {
			out.Target = ptr(res.Target)
		}
		if u := res.Unreproduced; u != nil {
			p := mapPointJSON(st, vars, *u, hasSpeed)
			out.Unreproduced = &p
		}
		for _, p := range res.Path {
			out.Path = append(out.Path, mapPointJSON(st, vars, p, hasSpeed))
		}
		return writeJSON(stdout, out)
	}
	fmt.Fprintf(stdout, "Search of %s for the %s, %s; %s\n", st.Name, objectiveWords(obj, *target), modeWords(mode), tableSense(st.Inverted, true))
	fmt.Fprintf(stdout, "%d solves; %s\n", res.Evaluations, res.Status)
	if err := mapText(stdout, false, st, vars, []engine.Point{res.Start, res.Best}, mode, hasSpeed); err != nil {
		return err
	}
	_, err = fmt.Fprintf(stdout, "first row: the start (the study's setting); second: the best setting found, %s\n", localNote)
	return err
}

// writeApplied writes st with the search's best setting applied to path,
// as the app's Apply sets it, with a pin of the search's start when pin;
// refused when no setting met every limit.
func writeApplied(path string, st *model.Study, vars []model.SetupVariable, res *engine.SearchResult, secs []*model.Section, pin bool) error {
	if !res.Feasible {
		return fmt.Errorf("--apply-to %s: no setting met every limit; nothing written", path)
	}
	next := st.Clone()
	if pin {
		// The pin holds the panel method's Cp and polar, which the
		// viscous solution does not change: solved without it, quickly.
		start := st.Clone()
		start.Viscous.Enabled = false
		if err := start.ApplySetupAll(vars, res.Start.Values, secs); err != nil { // the study's own setting, moved inside the bounds
			return fmt.Errorf("--pin-start: %w", err)
		}
		r, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: start, Sections: secs, Sweep: true})
		if err != nil {
			return fmt.Errorf("--pin-start: %w", err)
		}
		var set []string
		for i, v := range vars {
			// As the app names the pin: "flap deflection 15 °".
			set = append(set, v.Setting(st, res.Start.Values[i]))
		}
		next.Pins = append(next.Pins, engine.PinOf("search start, "+strings.Join(set, ", "), r, r.Sweep))
	}
	if err := next.ApplySetupAll(vars, res.Best.Values, secs); err != nil {
		return fmt.Errorf("--apply-to %s: %w", path, err)
	}
	return export.SaveStudy(path, next)
}

// sectionsReachable refuses to write the study to path when an element's
// section is a coordinate file named relative to the study's own folder
// and path lies in another (the written study would not find it).
func sectionsReachable(st *model.Study, from, path string) error {
	if from == "" {
		return nil // a --section study names a generated section
	}
	a, errA := filepath.Abs(filepath.Dir(from))
	b, errB := filepath.Abs(filepath.Dir(path))
	if errA == nil && errB == nil && a == b {
		return nil
	}
	for k, e := range st.Elements {
		spec := e.Section.Spec
		if _, _, err := model.SectionFromSpec(spec, nil); errors.Is(err, model.ErrSpec) && !filepath.IsAbs(spec) {
			return usagef("--apply-to %s: elements[%d].section %q is a file named from the study's folder; write the study into that folder", path, k, spec)
		}
	}
	return nil
}

// objectiveWords says what the search optimised.
func objectiveWords(o engine.Objective, target float64) string {
	switch o {
	case engine.ObjectiveLiftToDrag:
		return "best lift-to-drag ratio"
	case engine.ObjectiveDrag:
		if target == 0 {
			return "least drag at no less downforce than the start's"
		}
		return fmt.Sprintf("least drag at a downforce of at least %g", target)
	}
	return "most downforce"
}

// isSet reports whether a flag was given on the command line.
func (fs *flags) isSet(name string) bool {
	set := false
	fs.Visit(func(f *flag.Flag) {
		if f.Name == name {
			set = true
		}
	})
	return set
}
