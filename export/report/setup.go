package report

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// Setup is what the set-up explorer adds to the report: a map over one
// variable (the ride height, normally) with where the suction side starts
// to separate, the best setting a search found, and the finite-span
// totals. Each part is left out when empty.
type Setup struct {
	// Curve is downforce (or lift) against one set-up variable, with the
	// separation onset and the study's value marked (figure.SetupCurve);
	// no points leaves it out. CurveNote says how it was made.
	Curve     figure.SetupCurve
	CurveNote string
	// Search is a setting search's answer, with its variables and options;
	// nil leaves it out.
	Search        *engine.SearchResult
	SearchVars    []model.SetupVariable
	SearchOptions engine.SearchOptions
	// FiniteSpan is the finite-span estimate; nil leaves it out.
	FiniteSpan *engine.FiniteSpan
}

// CurveNote is the caption note of a one-variable map of points points
// solved how ("with the coupled viscous solution"), failed of them
// without an answer, its separation limit limitXC: the app and the
// command line give it alike (made by, say, "report --map …", given as
// made, or "" for none). "1 without an answer are crossed" stood on the
// team's report.
func CurveNote(points int, how, madeBy string, failed int, limitXC float64) string {
	if madeBy != "" {
		how += " (" + madeBy + ")"
	}
	return fmt.Sprintf("A map of %d %s %s; %d without an answer %s crossed on the axis, not drawn; points separating ahead of x/c %s are ringed.",
		points, plural(points, "point", "points"), how, failed, plural(failed, "is", "are"), strconv.FormatFloat(limitXC, 'g', 3, 64))
}

// setupCaution is the set-up page's caution.
const setupCaution = "Every figure on this page is an estimate from two-dimensional section solutions: the maps and the search from the panel method (with the coupled viscous solution where stated), the finite-span totals from a lifting line over those polars. None replaces a wind-tunnel or track test; validate by test before relying on them. The structure and mounting of the wing follow the competition's rules and qualified engineering review."

// empty reports whether there is nothing to show.
func (s *Setup) empty() bool {
	return s == nil || (len(s.Curve.X) == 0 && s.Search == nil && s.FiniteSpan == nil)
}

// setupPage writes the set-up page.
func (r *writer) setupPage() {
	s := r.in.Setup
	if s.empty() {
		return
	}
	r.need(figureHMM + 60)
	r.heading("Set-up")
	r.box("Caution", setupCaution, [3]int{252, 240, 228})
	if len(s.Curve.X) > 0 {
		if pl, err := figure.SetupCurvePlot(s.Curve, false); err == nil {
			caption := fmt.Sprintf("%s against %s.", upperFirst(s.Curve.YLabel), s.Curve.XLabel)
			if !math.IsNaN(s.Curve.Onset) {
				caption += " The dashed line marks where the suction side starts to separate (" + s.Curve.OnsetLabel + ")."
			} else {
				caption += " No separation onset was found in this range."
			}
			note := s.CurveNote
			if n := countTrue(s.Curve.NotSolve); n > 0 {
				note += fmt.Sprintf(" Boxed (%d): not a single solve's answer; started from a neighbouring setting's solution they converged where a single solve of their setting reaches another root of the coupled equations, or none.", n)
			}
			if n := countTrue(s.Curve.NearGround); n > 0 {
				note += fmt.Sprintf(" Very close to the ground (%d): %s.", n, s.Curve.NearGroundLabel)
			}
			r.image(func(w io.Writer, win, hin float64) error {
				return figure.WritePlot(w, pl, figure.FormatPNG, win, hin, FigureDPI)
			}, "set-up curve", caption+" "+note, figureHMM*0.85)
		}
	}
	if s.Search != nil {
		r.searchSection(s)
	}
	if s.FiniteSpan != nil {
		r.finiteSpanSection(s.FiniteSpan)
	}
}

// searchSection writes the best setting beside the start.
func (r *writer) searchSection(s *Setup) {
	res, st := s.Search, r.in.Study
	r.need(tableHeight(len(s.SearchVars)+int(engine.NumQuantities)) + 30)
	r.subheading("Best setting found")
	forces := st.Flow.SpeedMPS > 0
	var rows [][]string
	for i, v := range s.SearchVars {
		rows = append(rows, []string{v.Label(st), num(res.Start.Values[i], 1), num(res.Best.Values[i], 1)})
	}
	for q := range engine.NumQuantities {
		a, b := q.Value(&res.Start, forces), q.Value(&res.Best, forces)
		if math.IsNaN(a) && math.IsNaN(b) {
			continue
		}
		dec := 3
		if forces && (q == engine.QuantityLoad || q == engine.QuantityDrag) {
			dec = 1 // N/m
		}
		rows = append(rows, []string{q.Label(st.Inverted, forces), num(a, dec), num(b, dec)})
	}
	r.table([]string{"", "Start", "Best found"}, []float64{2.2, 1, 1}, []string{"L", "R", "R"}, rows)
	o := s.SearchOptions
	limits := []string{"every point converged"}
	if o.AttachedToXC > 0 {
		limits = append(limits, "every suction side attached to x/c "+num(o.AttachedToXC, 2))
	}
	if o.MinGapMM > 0 {
		limits = append(limits, "slot gaps of at least "+num(o.MinGapMM, 1)+" mm")
	}
	if o.MinClearanceMM > 0 {
		limits = append(limits, "a clearance of at least "+num(o.MinClearanceMM, 1)+" mm")
	}
	viscous := "with the coupled viscous solution"
	if !res.Start.Viscous {
		viscous = "with the panel method only (no viscous solution)"
	}
	feasible := ""
	if !res.Feasible {
		feasible = " No setting met every limit: the start is kept."
	} else if w := format.NearGroundAdvice(st, &res.Best); w != "" {
		feasible = " " + w
	}
	for _, e := range []struct {
		name string
		p    *engine.Point
	}{{"start", &res.Start}, {"best setting", &res.Best}} {
		switch {
		case !e.p.NotSolve():
		case e.p.Single == engine.SingleAnotherRoot:
			feasible += fmt.Sprintf(" The %s's solution, started from the solution of a setting solved before it, lies on another root of the coupled equations than a single solve of it (Cl %s against %s).", e.name, num(e.p.Cl, 4), num(e.p.SingleCl, 4))
		default:
			feasible += " The " + e.name + "'s solution converged only when started from the solution of a setting solved before it: a single solve of it has no answer, and the coupled equations may have another root there."
		}
	}
	r.para(fmt.Sprintf("Objective: %s, %s, keeping %s. %s solves; %s.%s This is a local optimum found by Nelder and Mead's simplex from the study's own setting, not necessarily the best setting within the bounds.",
		objectiveWords(o), viscous, joinWords(limits), strconv.Itoa(res.Evaluations), res.Status, feasible))
}

// countTrue counts the marked entries.
func countTrue(marks []bool) int {
	n := 0
	for _, m := range marks {
		if m {
			n++
		}
	}
	return n
}

// objectiveWords states a search's objective.
func objectiveWords(o engine.SearchOptions) string {
	switch o.Objective {
	case engine.ObjectiveLiftToDrag:
		return "the best ratio of load to drag"
	case engine.ObjectiveDrag:
		return "the least drag for a load of at least " + num(o.DownforceTarget, 1)
	}
	return "the most load (downforce on an inverted wing)"
}

// joinWords joins items as "a, b and c".
func joinWords(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	}
	out := items[0]
	for _, s := range items[1 : len(items)-1] {
		out += ", " + s
	}
	return out + " and " + items[len(items)-1]
}

// finiteSpanSection writes the finite-span totals beside the
// two-dimensional figures, and the spanwise load.
func (r *writer) finiteSpanSection(fs *engine.FiniteSpan) {
	r.need(figureHMM + 50)
	r.subheading("Finite span (an estimate the wind tunnel or the track must confirm)")
	name := "Lift"
	if fs.Inverted {
		name = "Downforce"
	}
	kv := [][2]string{
		{"Span, reference chord", num(fs.SpanM, 3) + " m, " + num(fs.ChordM*1000, 0) + " mm"},
		{"Aspect ratio", num(fs.AspectRatio, 2)},
	}
	if fs.EndPlateHeightM > 0 {
		kv = append(kv, [2]string{"End plates, effective aspect ratio", num(fs.EndPlateHeightM*1000, 0) + " mm, " + num(fs.EffectiveAspectRatio, 2)})
	}
	if fs.GroundHeightM > 0 {
		kv = append(kv, [2]string{"Lifting line above the ground (trailing vortices mirrored)", num(fs.GroundHeightM*1000, 0) + " mm"})
	}
	kv = append(kv, [2]string{"Span efficiency", num(fs.Efficiency, 3)})
	if math.IsNaN(fs.DynamicPressurePa) {
		kv = append(kv,
			[2]string{name + " coefficient (finite span)", num(fs.Load, 3)},
			[2]string{"Induced, profile drag coefficients", num(fs.CDi, 4) + ", " + num(fs.CDp, 4)})
	} else {
		kv = append(kv,
			[2]string{name + " (finite span)", num(fs.LoadN, 1) + " N"},
			[2]string{name + " (2-D over the span, no end effects)", num(fs.Load2DN, 1) + " N (" + num(fs.Load2DPerSpan, 1) + " N/m)"},
			[2]string{"Induced drag", num(fs.InducedDragN, 1) + " N"},
			[2]string{"Profile drag", newtonsOr(fs.ProfileDragN)},
			[2]string{"Drag (2-D over the span)", newtonsOr(fs.Drag2DN)})
	}
	r.keyValues(kv)
	if fs.PastMaxLoad {
		r.para("Some stations work past the polar's maximum load: at or beyond stall, where the estimate is not unique.")
	}
	if note := fs.ExtensionNote(); note != "" {
		r.para(note)
	}
	if fs.LowAspectRatio {
		r.para(fmt.Sprintf("The effective aspect ratio is below about %d: a lifting line is a rough guide here, and a lifting-surface method (Weissinger's, a vortex lattice) is the usual choice.", engine.LowAspectRatioLimit))
	}
	sl := figure.SpanLoadOf(fs)
	if pl, err := figure.SpanLoadPlot(sl, false); err == nil {
		r.image(func(w io.Writer, win, hin float64) error {
			return figure.WritePlot(w, pl, figure.FormatPNG, win, hin, FigureDPI)
		}, "spanwise load", "Spanwise load of the finite-span estimate, with the two-dimensional value dashed. The lifting line takes the load to zero at the tips, as on a wing without end plates; end plates enter only through the effective aspect ratio.", figureHMM*0.7)
	}
	r.small("Method: " + engine.FiniteSpanMethod + ". " + engine.FiniteSpanCaution)
}

// newtonsOr formats a force in N, or says that the viscous solution is
// needed for it.
func newtonsOr(v float64) string {
	if math.IsNaN(v) {
		return "n/a (needs the viscous solution)"
	}
	return num(v, 1) + " N"
}

// upperFirst puts the first letter in upper case.
func upperFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
