package main

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"os"
	"slices"
	"strconv"
	"strings"

	"sectionbench/export"
	"sectionbench/model"
)

// inputs are the flags shared by the commands that solve: where the
// configuration comes from and the panelling and flow that override it.
type inputs struct {
	section, study string
	alpha          float64
	panels         int
	spacing        string
	nose, tail, re float64
	// The viscous solution: mode, critical amplification exponent and
	// trips (x/c on the surfaces as mounted).
	viscousMode          string
	transitionN          float64
	tripUpper, tripLower float64
	format               string
	alphaRange           string          // sweep: FROM:TO:STEP
	set                  map[string]bool // flags given on the command line
	formats              []string
}

// addInputs defines the shared flags; a sweep takes --alpha as a range.
func addInputs(fs *flags, sweep bool, formats ...string) *inputs {
	in := &inputs{formats: formats}
	d := model.DefaultPanelling
	fs.StringVar(&in.section, "section", "", "section `SPEC`: naca:DIGITS, kt:CX,CY,TAU or a coordinate file")
	fs.StringVar(&in.study, "study", "", "study `FILE` (JSON) to solve instead of --section")
	if sweep {
		fs.StringVar(&in.alphaRange, "alpha", "", "angles of attack `FROM:TO:STEP` in degrees (default: the study's sweep, or -4:12:1)")
	} else {
		fs.Float64Var(&in.alpha, "alpha", 4, "angle of attack in `degrees` (positive loads the wing: nose-up upright; leading edge down, more downforce, on an inverted study)")
	}
	fs.IntVar(&in.panels, "panels", d.Panels, fmt.Sprintf("panel `count` per element, %d to %d", model.MinPanels, model.MaxPanels))
	fs.StringVar(&in.spacing, "spacing", string(d.Spacing), "spacing `law`: cosine, uniform, blend or curvature")
	fs.Float64Var(&in.nose, "nose", d.Nose, "nose clustering in [0, 1] (blend law)")
	fs.Float64Var(&in.tail, "tail", d.Tail, "tail clustering in [0, 1] (blend law)")
	fs.Float64Var(&in.re, "re", 0, "Reynolds `number` on the (first) element's chord; turns on the viscous solution")
	fs.StringVar(&in.viscousMode, "viscous-mode", string(model.ViscousCoupled), "viscous `mode`: coupled (boundary layers and wakes that act back on the flow) or estimate (one-way boundary-layer estimate, lift inviscid); default for --study: the study's")
	fs.Float64Var(&in.transitionN, "transition-n", model.DefaultTransitionN, fmt.Sprintf("critical amplification exponent `N` of the e^N transition criterion, %d to %d (Mack: N = −8.43 − 2.4 ln(Tu/100), Tu the free-stream turbulence in %%; 9 is a quiet wind tunnel)", model.MinTransitionN, model.MaxTransitionN))
	fs.Float64Var(&in.tripUpper, "trip-upper", 0, "forced transition on the upper surface as mounted, at this `x/c` (0: free)")
	fs.Float64Var(&in.tripLower, "trip-lower", 0, "forced transition on the lower surface as mounted, at this `x/c` (0: free)")
	in.format = formats[0]
	if len(formats) > 1 { // a command with one output format offers no choice
		fs.StringVar(&in.format, "format", formats[0], "output `format`: "+strings.Join(formats, ", "))
	}
	return in
}

// load builds the study and its sections from the flags. Flags given on
// the command line override the study file's values.
func (in *inputs) load(fs *flags) (*model.Study, []*model.Section, []*model.CleanReport, error) {
	in.set = map[string]bool{}
	fs.Visit(func(f *flag.Flag) { in.set[f.Name] = true })
	if !slices.Contains(in.formats, in.format) {
		return nil, nil, nil, usagef("--format %q: want one of %s", in.format, strings.Join(in.formats, ", "))
	}
	switch {
	case in.section != "" && in.study != "":
		return nil, nil, nil, usagef("give --section or --study, not both")
	case in.section == "" && in.study == "":
		return nil, nil, nil, usagef("give --section SPEC or --study FILE")
	}
	var st *model.Study
	var opened *export.OpenedStudy
	if in.study != "" {
		var err error
		if opened, err = export.OpenStudy(in.study); err != nil {
			return nil, nil, nil, err
		}
		st = opened.Study
	} else {
		st = model.NewStudy()
		st.Name = in.section
		// A 1 m chord at the origin: the layout's metres are chord lengths.
		st.Elements = []model.StudyElement{{Name: "section", Section: model.SectionSource{Spec: in.section}, ChordMM: 1000}}
		st.Viscous.Mode = model.ViscousCoupled
	}
	p := &st.Panelling
	if in.set["panels"] || in.study == "" {
		p.Panels = in.panels
	}
	if in.set["spacing"] || in.study == "" {
		p.Spacing = model.Spacing(in.spacing)
	}
	if in.set["nose"] || in.study == "" {
		p.Nose = in.nose
	}
	if in.set["tail"] || in.study == "" {
		p.Tail = in.tail
	}
	if in.alphaRange != "" {
		r, err := parseRange("--alpha", in.alphaRange)
		if err != nil {
			return nil, nil, nil, err
		}
		st.Sweep = r
	} else if in.set["alpha"] || in.study == "" {
		st.Flow.AlphaDeg = in.alpha
	}
	if in.set["re"] {
		st.Flow.Reynolds = in.re
		st.Viscous.Enabled = in.re > 0
	}
	if in.set["viscous-mode"] {
		// Naming a mode asks for the viscous solution: a study saved with
		// it off gets it on, rather than the flag doing nothing.
		if in.set["re"] && !(in.re > 0) {
			return nil, nil, nil, usagef("--viscous-mode %s with --re %g: a viscous solution needs a Reynolds number (--re 0 turns it off)", in.viscousMode, in.re)
		}
		st.Viscous.Mode = model.ViscousMode(in.viscousMode)
		st.Viscous.Enabled = true
	}
	if in.set["transition-n"] {
		// A study's 0 stands for the default; typed on the command line
		// it is a value outside the range the flag states.
		if in.transitionN == 0 {
			return nil, nil, nil, usagef("--transition-n: 0 is outside %d..%d (leave the flag out for the default %g)", model.MinTransitionN, model.MaxTransitionN, float64(model.DefaultTransitionN))
		}
		st.Viscous.TransitionN = in.transitionN
	}
	if in.set["trip-upper"] {
		st.Viscous.TripUpper = in.tripUpper
	}
	if in.set["trip-lower"] {
		st.Viscous.TripLower = in.tripLower
	}
	if !st.Viscous.Enabled {
		// A viscous setting typed while the viscous solution is off would
		// change nothing: say so instead of answering inviscid silently.
		for _, f := range []string{"transition-n", "trip-upper", "trip-lower"} {
			if in.set[f] {
				return nil, nil, nil, usagef("--%s: the viscous solution is off here; add --viscous-mode coupled (or estimate), or --re", f)
			}
		}
	}
	if err := st.Validate(); err != nil {
		return nil, nil, nil, flagError(err)
	}
	if opened != nil {
		// The flags change no section: they are the file's, loaded with it.
		return st, opened.Sections, opened.Reports, nil
	}
	secs, reps, err := export.LoadSections(st, ".")
	if err != nil {
		var fe *model.FieldError
		if errors.As(err, &fe) {
			inner := fe.Err
			var fle *export.FileError
			if errors.As(inner, &fle) && fle.Path == in.section {
				inner = fle.Err // the flag names the path already
			}
			err = fmt.Errorf("--section %s: %w", in.section, inner)
			if errors.Is(inner, os.ErrNotExist) {
				err = fmt.Errorf("%w (a SPEC is naca:DIGITS, a NACA designation such as naca0012, kt:CX,CY,TAU or a coordinate file)", err)
			}
		}
		return nil, nil, nil, err
	}
	return st, secs, reps, nil
}

// flagError names the command-line flag behind a study field where there is
// one, so the message points at what the user typed.
func flagError(err error) error {
	var fe *model.FieldError
	if !errors.As(err, &fe) {
		return err
	}
	name := map[string]string{
		"panelling.panels": "--panels", "panelling.spacing": "--spacing",
		"panelling.nose": "--nose", "panelling.tail": "--tail",
		"flow.alpha_deg": "--alpha", "flow.reynolds": "--re",
		"viscous.mode": "--viscous-mode", "viscous.transition_n": "--transition-n",
		"viscous.trip_upper": "--trip-upper", "viscous.trip_lower": "--trip-lower",
	}[fe.Field]
	if name == "" {
		return err
	}
	return usagef("%s: %v", name, fe.Err)
}

// parseRange reads FROM:TO:STEP.
func parseRange(flagName, s string) (model.SweepRange, error) {
	parts := strings.Split(s, ":")
	if len(parts) != 3 {
		return model.SweepRange{}, usagef("%s %q: want FROM:TO:STEP, e.g. -4:12:1", flagName, s)
	}
	var v [3]float64
	for i, p := range parts {
		x, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return model.SweepRange{}, usagef("%s %q: %q is not a number", flagName, s, p)
		}
		v[i] = x
	}
	r := model.SweepRange{FromDeg: v[0], ToDeg: v[1], StepDeg: v[2]}
	if err := r.Validate(); err != nil {
		var fe *model.FieldError
		if errors.As(err, &fe) {
			return r, usagef("%s %q: %v", flagName, s, fe.Err)
		}
		return r, usagef("%s %q: %v", flagName, s, err)
	}
	return r, nil
}
