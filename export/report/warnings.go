package report

import (
	"fmt"
	"strings"
)

// warning is one thing the reader is warned of, and where it comes from.
type warning struct {
	Source, Message string
}

// warnings gathers every warning of the study: the cleaning report of
// each section loaded from a file, everything the solver and the
// boundary-layer estimate noted (as sectionbench-cli solve prints them),
// the sweep angles where the estimate failed, the plausibility flags, a
// Reynolds number set directly that disagrees with speed and air, and the
// density study's skipped counts.
func (r *writer) warnings() []warning {
	st, res := r.in.Study, r.in.Result
	var out []warning
	for i, rep := range r.in.CleanReports {
		if rep == nil {
			continue
		}
		src := "section"
		if i < len(st.Elements) {
			src = "section of " + st.Elements[i].Name
		}
		if rep.Source != "" {
			src += " (" + rep.Source + ")"
		}
		for _, w := range rep.Warnings {
			out = append(out, warning{src, w.Message})
		}
	}
	for _, w := range res.Solution.Warnings {
		out = append(out, warning{"solver", w})
	}
	if v := res.Viscous; v != nil {
		for _, n := range v.Notes {
			out = append(out, warning{"boundary layer", n})
		}
	}
	if len(res.SweepViscous) == len(res.Sweep) {
		for _, v := range res.SweepViscous {
			if !v.Valid && v.Note != "" {
				out = append(out, warning{fmt.Sprintf("sweep at %s°", num(v.AlphaDeg, 1)), v.Note})
			}
		}
	}
	for _, f := range r.flags() {
		out = append(out, warning{"plausibility (" + string(f.Kind) + ")", f.Message})
	}
	if r.glyphNote != "" {
		out = append(out, warning{"names", r.glyphNote})
	}
	if n := reynoldsMismatch(st, res); n != "" {
		out = append(out, warning{"flow", n})
	}
	if d := r.in.Density; d != nil {
		for _, row := range d.Rows {
			if !row.Solved() {
				out = append(out, warning{"density study", fmt.Sprintf("%d panels (nose %s) skipped: %s", row.Panels, num(row.Nose, 2), row.Skipped)})
			}
		}
	}
	return out
}

// warningsSection lists every warning, then what cleaning did to each
// section loaded from a file.
func (r *writer) warningsSection() {
	ws := r.warnings()
	r.heading("Warnings")
	if len(ws) == 0 {
		r.para("None: the sections loaded cleanly, the solver noted nothing and no result is flagged.")
	}
	p := r.pdf
	for _, w := range ws {
		r.need(10)
		p.SetFont(fontFamily, "B", bodyPt)
		p.MultiCell(0, 4.6, w.Source, "", "L", false)
		p.SetFont(fontFamily, "", bodyPt)
		p.SetX(marginMM + 4)
		p.MultiCell(r.width()-4, 4.6, w.Message, "", "L", false)
		p.Ln(1)
	}
	var loaded bool
	for i, rep := range r.in.CleanReports {
		if rep == nil || rep.Source == "" || strings.HasPrefix(rep.Source, "naca:") {
			continue
		}
		if !loaded {
			r.subheading("Sections loaded from files: what cleaning did")
			loaded = true
		}
		name := "section"
		if i < len(r.in.Study.Elements) {
			name = r.in.Study.Elements[i].Name
		}
		r.need(15)
		p.SetFont(fontFamily, "B", bodyPt)
		p.MultiCell(0, 4.6, fmt.Sprintf("%s: %s, %d points in, %d out", name, rep.Source, rep.InputPoints, rep.OutputPoints), "", "L", false)
		items := append([]string{}, rep.Changes...)
		if len(items) == 0 {
			items = []string{"no changes"}
		}
		items = append(items, fmt.Sprintf("trailing-edge gap %s %% of the chord", num(rep.TEGap*100, 3)))
		r.bullets(items)
	}
}
