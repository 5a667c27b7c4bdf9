package report

import (
	"context"
	"fmt"
	"math"
	"strconv"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// ViscousDensityRow is the viscous answer at one panel count: drag and the
// main element's transition, from the coupled solution when the study
// uses it, else from the one-way estimate. Skipped says why there is no
// answer at this count ("" when there is one).
type ViscousDensityRow struct {
	Panels                           int
	Cd                               float64
	TransitionUpper, TransitionLower float64 // x/c on the main element, NaN for none
	Skipped                          string
}

// ViscousDensity solves st (boundary layer on) at half, once and twice its
// panel count, a refinement ratio of 2, and returns the viscous answer at
// each: the density study of the drag and transition. It returns nil when
// the boundary layer is off. Each count is a full solve; the coupled
// solution takes seconds for each.
func ViscousDensity(ctx context.Context, st *model.Study, secs []*model.Section) []ViscousDensityRow {
	if !st.Viscous.Enabled {
		return nil
	}
	var rows []ViscousDensityRow
	for _, n := range []int{st.Panelling.Panels / 2, st.Panelling.Panels, 2 * st.Panelling.Panels} {
		row := ViscousDensityRow{Panels: n, Cd: math.NaN(), TransitionUpper: math.NaN(), TransitionLower: math.NaN()}
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
			row.Skipped = fmt.Sprintf("the viscous solution did not converge (%d iterations)", res.Coupled.Iterations)
		case res.Coupled != nil && len(res.Coupled.Elements) > 0:
			e := res.Coupled.Elements[0]
			row.Cd, row.TransitionUpper, row.TransitionLower = res.Coupled.Cd, e.TransitionUpper, e.TransitionLower
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

// viscousDensitySection reports the drag's and transition's density study:
// a row per count with the change from the count before, and Richardson's
// extrapolation of Cd over the three counts when they converge steadily.
func (r *writer) viscousDensitySection() {
	rows := r.in.ViscousDensity
	if len(rows) == 0 {
		return
	}
	r.need(tableHeight(len(rows)) + 30)
	r.subheading("Drag and transition against panel count")
	var t [][]string
	prev := math.NaN()
	for _, row := range rows {
		if row.Skipped != "" {
			t = append(t, []string{strconv.Itoa(row.Panels), "skipped: " + row.Skipped, "", ""})
			prev = math.NaN()
			continue
		}
		t = append(t, []string{strconv.Itoa(row.Panels), num(row.Cd, 5), num(row.Cd-prev, 5), XC(row.TransitionUpper) + " / " + XC(row.TransitionLower)})
		prev = row.Cd
	}
	r.table([]string{"Panels", "Cd", "ΔCd from the count before", "Transition x/c on the main element, upper / lower"},
		[]float64{0.8, 1, 1.3, 2}, []string{"R", "R", "R", "R"}, t)
	msg := "No extrapolation of Cd: a count has no drag (skipped, or n/a where the boundary layer separates)."
	finite := func(row ViscousDensityRow) bool { return row.Skipped == "" && !math.IsNaN(row.Cd) }
	if len(rows) == 3 && finite(rows[0]) && finite(rows[1]) && finite(rows[2]) {
		change := fmt.Sprintf("Cd changes by %.2g %% from %d to %d panels", 100*math.Abs(rows[2].Cd-rows[1].Cd)/math.Abs(rows[2].Cd), rows[1].Panels, rows[2].Panels)
		msg = change + "; the three counts do not converge steadily enough for an extrapolation."
		if p, ok := engine.ObservedOrder(rows[0].Cd, rows[1].Cd, rows[2].Cd, 2); ok && p >= engine.MinObservedOrder && p <= engine.MaxObservedOrder {
			v, e := engine.Richardson(rows[1].Cd, rows[2].Cd, 2, p)
			msg = fmt.Sprintf("%s; Cd → %s ± %.2g extrapolated (observed order %s, Richardson over the three counts).", change, num(v, 5), e, num(p, 2))
		}
	}
	r.small(msg + " Transition moves by whole panels: its change between counts is the panel spacing there.")
}
