package report

import (
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// ViscousDensityRow is the viscous answer at one panel count: lift, drag
// and the main element's transition, from the coupled solution when the
// study uses it, else drag and transition from the one-way estimate (its
// lift is the inviscid one: Cl NaN). Skipped says why there is no answer
// at this count ("" when there is one).
type ViscousDensityRow struct {
	Panels                           int
	Cl, Cd                           float64
	TransitionUpper, TransitionLower float64 // x/c on the main element, NaN for none
	Skipped                          string
	// Held: the coupled solution converged only with transition held
	// upstream of its e^N position (engine.DensityRow.ViscousHeld): the
	// answer of a trip there, not the free transition of the other counts.
	Held bool
}

// HeldWords says at which counts of a density study the coupled
// solution's transition is held upstream ("" for none), for the report
// and the density window: such a count's Cl and Cd are a tripped wing's,
// and among free-transition counts they look like a convergence failure
// of the panelling (a hand-typed NACA 2412 at 4° gave viscous Cl
// −0.6993 at 320 panels and a held −0.6740 at 640, unmarked).
func HeldWords(panels []int) string {
	if len(panels) == 0 {
		return ""
	}
	counts := make([]string, len(panels))
	for i, n := range panels {
		counts[i] = strconv.Itoa(n)
	}
	return fmt.Sprintf("At %s panels the viscous solution holds transition upstream of its e^N position (marked held): the answer there is that of a trip, not the free transition of the other counts.", joinWords(counts))
}

// ViscousDensity returns the viscous answer of st (boundary layer on)
// against panel count: the density study of the lift, drag and
// transition. When d is the density study of st with the coupled solution
// (d.Viscous), its rows of the first nose value are the answer, with no
// more solving; otherwise it solves st at half, once and twice its panel
// count (a refinement ratio of 2), a full solve each. It returns nil when
// the boundary layer is off.
func ViscousDensity(ctx context.Context, st *model.Study, secs []*model.Section, d *engine.DensityResult) []ViscousDensityRow {
	if !st.Viscous.Enabled {
		return nil
	}
	if d != nil && d.Viscous && len(d.Series) > 0 {
		return viscousDensityFrom(d)
	}
	var rows []ViscousDensityRow
	for _, n := range []int{st.Panelling.Panels / 2, st.Panelling.Panels, 2 * st.Panelling.Panels} {
		row := ViscousDensityRow{Panels: n, Cl: math.NaN(), Cd: math.NaN(), TransitionUpper: math.NaN(), TransitionLower: math.NaN()}
		if n < model.MinPanels || n > model.MaxPanels {
			row.Skipped = fmt.Sprintf("outside %d to %d panels", model.MinPanels, model.MaxPanels)
			rows = append(rows, row)
			continue
		}
		c := st.Clone()
		c.Panelling.Panels = n
		res, err := engine.NewEngine().Run(ctx, engine.Request{Study: c, Sections: secs})
		switch {
		case err != nil:
			row.Skipped = err.Error()
		case res.Coupled != nil && !res.Coupled.Converged:
			row.Skipped = notConverged(res.Coupled.Iterations)
		case res.Coupled != nil && len(res.Coupled.Elements) > 0:
			e := res.Coupled.Elements[0]
			row.Cl, row.Cd, row.TransitionUpper, row.TransitionLower = res.Coupled.Cl, res.Coupled.Cd, e.TransitionUpper, e.TransitionLower
		case res.Viscous != nil && len(res.Viscous.Elements) > 0:
			e := res.Viscous.Elements[0]
			// Cd is NaN where the estimate separates; transition still holds.
			row.Cd, row.TransitionUpper, row.TransitionLower = res.Viscous.Cd, e.Upper.TransitionXC, e.Lower.TransitionXC
		default:
			row.Skipped = "no viscous answer"
		}
		rows = append(rows, row)
	}
	return rows
}

// viscousDensityFrom takes the coupled solution's rows of a density study's
// first nose value.
func viscousDensityFrom(d *engine.DensityResult) []ViscousDensityRow {
	var rows []ViscousDensityRow
	for _, r := range d.Rows {
		if r.Nose != d.Series[0].Nose {
			continue
		}
		row := ViscousDensityRow{Panels: r.Panels, Cl: r.ViscousCl, Cd: r.ViscousCd, TransitionUpper: r.ViscousTransitionUpper, TransitionLower: r.ViscousTransitionLower, Held: r.ViscousHeld}
		switch {
		case !r.Solved():
			row.Skipped = r.Skipped
		case math.IsNaN(r.ViscousCl):
			// Why, in the density study's words: the iterations
			// spent and whether they diverged or ran out.
			if row.Skipped = engine.ViscousFailure(r); row.Skipped == "" {
				row.Skipped = notConverged(r.ViscousIterations)
			}
		}
		rows = append(rows, row)
	}
	return rows
}

func notConverged(iterations int) string {
	return fmt.Sprintf("the viscous solution did not converge (%d iterations)", iterations)
}

// viscousDensitySection reports the viscous answer's density study: a row
// per count with the change from the count before, and Richardson's
// extrapolation of Cl (coupled solution) and Cd over the three finest
// counts when they converge steadily.
func (r *writer) viscousDensitySection() {
	rows := r.in.ViscousDensity
	if len(rows) == 0 {
		return
	}
	withCl := false
	for _, row := range rows {
		withCl = withCl || (row.Skipped == "" && !math.IsNaN(row.Cl))
	}
	r.need(tableHeight(len(rows)) + 30)
	head, widths := []string{"Panels", "Cd", "ΔCd from the count before", "Transition x/c on the main element, upper / lower"}, []float64{0.8, 1, 1.3, 2}
	if withCl {
		r.subheading("Viscous lift, drag and transition against panel count")
		head, widths = append([]string{"Panels", "Cl viscous", "ΔCl from the count before"}, head[1:]...), []float64{0.7, 0.9, 1.1, 0.9, 1.1, 1.8}
	} else {
		r.subheading("Drag and transition against panel count")
	}
	var t [][]string
	var skipped []string // the reasons, in full under the table: a cell would cut them
	var held []int
	prevCl, prevCd := math.NaN(), math.NaN()
	for _, row := range rows {
		var cells []string
		if row.Skipped != "" {
			cells = append([]string{strconv.Itoa(row.Panels), "no answer"}, make([]string, len(head)-2)...)
			skipped = append(skipped, fmt.Sprintf("%d panels: %s.", row.Panels, row.Skipped))
			prevCl, prevCd = math.NaN(), math.NaN()
		} else {
			cells = []string{strconv.Itoa(row.Panels)}
			if row.Held {
				cells[0] += " held"
				held = append(held, row.Panels)
			}
			if withCl {
				cells = append(cells, Coef(row.Cl), Coef(row.Cl-prevCl))
			}
			cells = append(cells, num(row.Cd, 5), num(row.Cd-prevCd, 5), XC(row.TransitionUpper)+" / "+XC(row.TransitionLower))
			prevCl, prevCd = row.Cl, row.Cd
		}
		t = append(t, cells)
	}
	align := make([]string, len(head))
	for i := range align {
		align[i] = "R"
	}
	r.table(head, widths, align, t)
	msgs := []string{}
	if len(skipped) > 0 {
		msgs = append(msgs, "No answer at "+strings.Join(skipped, " "))
	}
	if w := HeldWords(held); w != "" {
		msgs = append(msgs, w)
	}
	if withCl {
		msgs = append(msgs, viscousExtrapolation("Cl", 4, rows, func(row ViscousDensityRow) float64 { return row.Cl }))
	}
	msgs = append(msgs, viscousExtrapolation("Cd", 5, rows, func(row ViscousDensityRow) float64 { return row.Cd }))
	r.small(strings.Join(msgs, " ") + " Transition is placed inside the interval between two stations where the amplification reaches N (or at the trip), so it moves smoothly with the panel count; a trip's position is fixed.")
}

// viscousExtrapolation says how coefficient name (printed to digits
// decimals) of the three finest rows converges: Richardson's extrapolation
// when the three have answers, double in count and converge steadily.
func viscousExtrapolation(name string, digits int, rows []ViscousDensityRow, value func(ViscousDensityRow) float64) string {
	var counts []int
	var f []float64
	for _, row := range rows {
		if row.Skipped == "" && !math.IsNaN(value(row)) {
			counts, f = append(counts, row.Panels), append(f, value(row))
		}
	}
	ex := engine.Extrapolate(counts, f)
	change := ""
	if n := len(f); n >= 2 {
		change = fmt.Sprintf("%s changes by %.2g %% from %d to %d panels; ", name, 100*math.Abs(f[n-1]-f[n-2])/math.Abs(f[n-1]), counts[n-2], counts[n-1])
	}
	switch {
	case !ex.OK && change == "":
		return fmt.Sprintf("No extrapolation of %s: %s.", name, ex.Why)
	case !ex.OK:
		return fmt.Sprintf("%sno extrapolation of %s: %s.", change, name, ex.Why)
	case math.IsNaN(ex.ObservedOrder):
		return fmt.Sprintf("%s%s is the same to the last digit over the three finest counts with an answer.", change, name)
	}
	return fmt.Sprintf("%s%s → %s ± %.2g extrapolated (observed order %s, Richardson over the three finest counts with an answer).", change, name, num(ex.Value, digits), ex.ErrorEstimate, num(ex.ObservedOrder, 2))
}
