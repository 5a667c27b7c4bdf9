package report

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// Number formats of the report's tables. The tests format the solver's
// numbers with the same functions and look for them in the PDF's text.

// Coef formats a force or moment coefficient: four decimals.
func Coef(v float64) string { return num(v, 4) }

// Cp formats a pressure coefficient: three decimals.
func Cp(v float64) string { return num(v, 3) }

// XC formats a chord fraction: three decimals.
func XC(v float64) string { return num(v, 3) }

// num formats v with dec decimals, "n/a" for NaN and no negative zero.
func num(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(s, "-0.") == "" {
		return strings.TrimPrefix(s, "-")
	}
	return s
}

func mm(v float64) string { return num(v, 1) }

// describe is the one-line description of the configuration.
func describe(st *model.Study, l *model.Layout) string {
	var b strings.Builder
	names := make([]string, len(st.Elements))
	for i, e := range st.Elements {
		names[i] = e.Name
	}
	if len(names) == 1 {
		fmt.Fprintf(&b, "Single element (%s)", names[0])
	} else {
		fmt.Fprintf(&b, "%d elements (%s)", len(names), strings.Join(names, ", "))
	}
	if st.Inverted {
		b.WriteString(", inverted")
	}
	if st.Ground.Enabled {
		fmt.Fprintf(&b, ", %s mm above the ground", mm(st.Ground.ClearanceMM))
	} else {
		b.WriteString(", free air")
	}
	fmt.Fprintf(&b, ", α = %s°, %d panels per element (%s spacing)", num(st.Flow.AlphaDeg, 2), st.Panelling.Panels, st.Panelling.Spacing)
	if st.Flow.SpeedMPS > 0 {
		fmt.Fprintf(&b, ", %s km/h", num(model.MpsToKmh(st.Flow.SpeedMPS), 0))
	}
	return b.String() + "."
}

func (r *writer) inputsSection() {
	st, res := r.in.Study, r.in.Result
	r.heading("Inputs")
	r.box("Configuration", describe(st, res.Layout), [3]int{232, 239, 248})
	r.need(sketchHMM + 12)
	r.subheading("Frame and signs")
	r.signSketch()
	r.subheading("Elements")
	rows := make([][]string, len(st.Elements))
	for i, e := range st.Elements {
		rows[i] = []string{e.Name, e.Section.String(), mm(e.ChordMM), mm(e.XMM) + ", " + mm(e.YMM), num(e.AngleDeg, 2)}
	}
	r.table([]string{"Element", "Section source", "Chord, mm", "Leading edge x, y, mm (as mounted)", "Angle, ° (" + model.AngleShort(st.Inverted) + ")"},
		[]float64{1.3, 2.0, 0.8, 1.7, 1.2}, []string{"L", "L", "R", "R", "R"}, rows)
	pn := st.Panelling
	lmin, lmax := panelLengths(res.Layout)
	kv := [][2]string{
		{"Panels per element", strconv.Itoa(pn.Panels)},
		{"Spacing law, nose / tail clustering", fmt.Sprintf("%s, %s / %s", pn.Spacing, num(pn.Nose, 2), num(pn.Tail, 2))},
		{"Panel length, smallest to largest", fmt.Sprintf("%s to %s mm", num(lmin*1000, 3), num(lmax*1000, 2))},
		{"Angle of attack α (" + model.AngleShort(st.Inverted) + ")", num(st.Flow.AlphaDeg, 2) + "°"},
		{"Mounting", mounting(st)},
		{"Ground", ground(st)},
		{"Reference chord", mm(res.Layout.RefChordM*1000) + " mm"},
		{"Moment reference (x, y)", mm(res.Layout.MomentRef.X*1000) + ", " + mm(res.Layout.MomentRef.Y*1000) + " mm"},
	}
	if st.Flow.SpeedMPS > 0 {
		kv = append(kv, [2]string{"Speed", fmt.Sprintf("%s m/s (%s km/h)", num(st.Flow.SpeedMPS, 2), num(model.MpsToKmh(st.Flow.SpeedMPS), 1))})
	}
	if air, err := model.AirFromCelsius(st.Flow.TemperatureC, st.Flow.PressurePa); err == nil {
		kv = append(kv, [2]string{"Air", fmt.Sprintf("%s °C, %s Pa: ρ = %s kg/m³, ν = %.4g m²/s",
			num(st.Flow.TemperatureC, 1), num(st.Flow.PressurePa, 0), num(air.Density(), 4), air.KinematicViscosity())})
	}
	for i, re := range res.Reynolds {
		if i < len(st.Elements) {
			kv = append(kv, [2]string{"Reynolds number, " + st.Elements[i].Name, fmt.Sprintf("%.3g", re)})
		}
	}
	if st.Viscous.Enabled {
		name := "Boundary-layer estimate"
		if st.Viscous.IsCoupled() {
			name = "Viscous solution"
		}
		kv = append(kv, [2]string{name, trips(st)})
	}
	r.need(tableHeight(len(kv)) + 10)
	r.subheading("Panelling and flow")
	r.keyValues(kv)
}

func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

func mounting(st *model.Study) string {
	if st.Inverted {
		return "inverted (suction side towards the ground)"
	}
	return "upright"
}

func ground(st *model.Study) string {
	if !st.Ground.Enabled {
		return "off (free air)"
	}
	return fmt.Sprintf("on: %s mm below the lowest point, image method", mm(st.Ground.ClearanceMM))
}

func trips(st *model.Study) string {
	s := "on (one-way estimate), free transition"
	if st.Viscous.IsCoupled() {
		s = fmt.Sprintf("on (coupled viscous solution, critical N %s), free transition", num(st.Viscous.CriticalN(), 1))
	}
	if st.Viscous.TripUpper > 0 || st.Viscous.TripLower > 0 {
		s = strings.TrimSuffix(s, "free transition") + fmt.Sprintf("trips at x/c %s (upper), %s (lower)", XC(st.Viscous.TripUpper), XC(st.Viscous.TripLower))
	}
	return s
}

func panelLengths(l *model.Layout) (lmin, lmax float64) {
	lmin = math.Inf(1)
	for _, e := range l.Elements {
		for i := 0; i+1 < len(e.Nodes); i++ {
			d := e.Nodes[i].Dist(e.Nodes[i+1])
			lmin, lmax = math.Min(lmin, d), math.Max(lmax, d)
		}
	}
	return lmin, lmax
}

func (r *writer) resultsSection() {
	st, res := r.in.Study, r.in.Result
	sol := res.Solution
	kv := [][2]string{
		{"Cl from circulation (Kutta–Joukowski)", Coef(sol.Cl)},
		{"Cl from surface pressure", Coef(sol.ClPressure)},
		{"Cm about the moment reference (nose-up positive)", Coef(sol.Cm)},
	}
	if st.Inverted {
		kv = append(kv, [2]string{"Downforce coefficient −Cl (positive pushes the car down)", Coef(-sol.Cl)})
	}
	if v := res.Viscous; v != nil {
		kv = append(kv, [2]string{"Cd, boundary-layer estimate (Squire–Young)", Coef(v.Cd)})
	}
	if c := r.in.Coupled; c != nil {
		kv = append(kv, [2]string{"Cl, viscous solution (coupled)", Coef(c.Cl)}, [2]string{"Cd, viscous solution (coupled)", Coef(c.Cd)})
	}
	if f := res.Forces; f != nil {
		from := " (inviscid)"
		if f.Coupled {
			from = " (viscous solution; n/a when it did not converge)"
		}
		kv = append(kv,
			[2]string{"Dynamic pressure q", num(f.DynamicPressurePa, 1) + " Pa"},
			[2]string{"Lift per metre of span (positive up)" + from, num(f.LiftPerSpan, 1) + " N/m"},
			[2]string{"Downforce per metre of span (= −lift)" + from, num(f.DownforcePerSpan, 1) + " N/m"},
			[2]string{"Pitching moment per metre of span" + from, num(f.MomentPerSpan, 2) + " N·m/m"},
		)
		if !math.IsNaN(f.DragPerSpan) {
			kv = append(kv, [2]string{"Drag per metre of span" + map[bool]string{true: " (viscous solution)", false: " (estimate)"}[f.Coupled], num(f.DragPerSpan, 2) + " N/m"})
		}
		if f.SpanM > 0 {
			kv = append(kv, [2]string{fmt.Sprintf("Downforce over a %s m span (2-D, no end effects)", num(f.SpanM, 3)), num(f.DownforcePerSpan*f.SpanM, 1) + " N"})
		}
	}
	r.need(minSpaceMM + 10)
	r.heading("Results")
	r.subheading("Configuration")
	r.keyValues(kv)
	r.para("Signs: lift is positive up, away from the ground; downforce is −lift. Cm is positive nose-up. Cp = 1 − (V/U∞)², negative where the flow is faster than the freestream. Element coefficients are on the element's own chord, Cm about its own quarter chord; configuration coefficients are on the reference chord.")

	r.need(tableHeight(len(sol.Elements)) + 10)
	r.subheading("Elements")
	head := []string{"Element", "Cl (circ.)", "Cl (pressure)", "Cm (c/4)", "Cp min", "at x/c", "Stagnation x/c"}
	widths := []float64{1.2, 1, 1.1, 1, 0.9, 0.8, 1.1}
	align := []string{"L", "R", "R", "R", "R", "R", "R"}
	var rows [][]string
	for _, e := range sol.Elements {
		rows = append(rows, []string{e.Name, Coef(e.Cl), Coef(e.ClPressure), Coef(e.Cm), Cp(e.CpMin), XC(e.XCpMin), XC(e.Stagnation.XC)})
	}
	r.table(head, widths, align, rows)
	r.loadsTable()
	if v := res.Viscous; v != nil {
		r.need(tableHeight(len(v.Elements)) + 10)
		r.subheading("Boundary layer")
		var rows [][]string
		for _, e := range v.Elements {
			rows = append(rows, []string{e.Name, Coef(e.Cd), XC(e.Upper.TransitionXC) + " / " + XC(e.Lower.TransitionXC),
				XC(e.Upper.TurbulentSeparationXC) + " / " + XC(e.Lower.TurbulentSeparationXC), validity(e)})
		}
		r.table([]string{"Element", "Cd", "Transition x/c, upper / lower", "Separation x/c, upper / lower", "Estimate"},
			[]float64{1, 0.8, 1.6, 1.6, 1.2}, []string{"L", "R", "R", "R", "L"}, rows)
	}
	if c := r.in.Coupled; c != nil {
		r.need(tableHeight(len(c.Elements)) + 15)
		r.subheading("Viscous solution (coupled)")
		// The inviscid Cl the coupled solution is compared with, as the
		// window's status line and results give it (from the surface
		// pressure); it gave the Cl from circulation, which differs in
		// the fourth digit.
		inv := res.Solution.Cl
		if res.Coupled != nil && !math.IsNaN(res.Coupled.ClInviscid) {
			inv = res.Coupled.ClInviscid
		}
		state := fmt.Sprintf("Converged in %d %s: Cl %s, Cd %s on the reference chord (inviscid Cl %s beside it).", c.Iterations, plural(c.Iterations, "iteration", "iterations"), Coef(c.Cl), Coef(c.Cd), Coef(inv))
		if !c.Converged {
			state = fmt.Sprintf("Did not converge (%d iterations%s): no viscous numbers at this angle; the inviscid ones above are for orientation only.", c.Iterations, rejectedWhy(c))
		}
		r.para(state)
		var rows [][]string
		for _, e := range c.Elements {
			rows = append(rows, []string{e.Name, Coef(e.Cd), XC(e.TransitionUpperXC) + " / " + XC(e.TransitionLowerXC), XC(e.SeparationUpperXC) + " / " + XC(e.SeparationLowerXC)})
		}
		r.table([]string{"Element", "Cd", "Transition x/c, upper / lower", "Separation x/c, upper / lower"},
			[]float64{1.4, 0.8, 1.6, 1.6}, []string{"L", "R", "R", "R"}, rows)
		r.small("x/c on each element's own chord, on its surfaces as mounted; n/a: none (no transition or no separation before the trailing edge) or not converged.")
	}
	var notes []string // the solver's and boundary layer's own notes are under Warnings
	if st.Ground.Enabled || len(sol.Elements) > 1 {
		notes = append(notes, caveatCirculation)
	}
	if st.Ground.Enabled {
		notes = append(notes, model.GroundCautionSentence())
	}
	if len(notes) > 0 {
		r.box("Notes on these results", strings.Join(notes, "\n"), [3]int{243, 244, 246})
	}
}

func validity(e solver.ElementBL) string {
	if e.Valid {
		return "attached to the trailing edge"
	}
	return "separates: Cd not given"
}

func (r *writer) figurePages() {
	sc := r.scene()
	r.need(figureHMM + 32)
	r.heading("Section and panels")
	r.figure(figure.ViewPanels, sc, "The configuration as solved, with panel nodes and control points (panel midpoints). Lengths in millimetres.", figureHMM)
	l := r.in.Result.Layout
	if len(l.Elements) > 0 {
		size := leWindowChords * l.Elements[0].Chord * metresToMM
		le := *sc
		le.Window = figure.LEWindow(l, 0, size)
		r.figure(figure.ViewPanels, &le, fmt.Sprintf("Leading edge of %s, a %s mm window: nose panelling.", l.Elements[0].Name, num(size, 0)), figureHMM)
	}
	r.need(figureHMM + 32)
	r.heading("Pressure and flow")
	r.figure(figure.ViewPressure, sc, "Pressure coefficient against chord position, negative up. Solid: upper surface; dashed: lower surface.", figureHMM)
	if dwarfed(r.in.Result.Solution) {
		for i, e := range r.in.Result.Solution.Elements {
			one := *sc
			one.Element = i
			r.figure(figure.ViewPressure, &one, fmt.Sprintf("Pressure coefficient on %s alone, on its own scale: the elements' suction peaks differ too much to read them all on one scale.", e.Name), figureHMM*0.8)
		}
	}
	r.figure(figure.ViewStreamlines, sc, "Streamlines; the dividing streamline of each element is drawn bold.", figureHMM)
}

func (r *writer) sweepPage() {
	res := r.in.Result
	if len(res.Sweep) == 0 {
		return
	}
	sc := r.scene()
	r.need(figureHMM + 32)
	r.heading("Sweep")
	r.figure(figure.ViewPolar, sc, "Cl (left axis) and Cm (right axis) against the angle of attack; the current angle is marked.", figureHMM)
	coupled := len(res.SweepCoupled) == len(res.Sweep)
	head := []string{"α, °", "Cl", "Cl (pressure)", "Cm", "Cp min", "at x/c"}
	if coupled { // the inviscid columns beside the viscous ones
		head = []string{"α, °", "Cl (inviscid)", "Cl (pressure, inviscid)", "Cm (inviscid)", "Cp min (inviscid)", "at x/c"}
	}
	widths := []float64{0.7, 0.9, 1, 0.9, 0.9, 0.8}
	align := []string{"R", "R", "R", "R", "R", "R"}
	vis := len(res.SweepViscous) == len(res.Sweep)
	if vis {
		head = append(head, "Cd", "Transition x/c, upper / lower")
		widths = append(widths, 0.8, 1.6)
		align = append(align, "R", "R")
	}
	if coupled {
		head = append(head, "Cl (viscous)", "Cd (viscous)", "Cm (viscous)")
		widths = append(widths, 0.9, 0.9, 0.9) // "(viscous)" whole on its line
		align = append(align, "R", "R", "R")
	}
	head = append(head, "Marks")
	widths = append(widths, 0.9)
	align = append(align, "L")
	var rows [][]string
	order := []model.FlagKind{model.FlagSeparated, model.FlagPastClMax, model.FlagNotConverged, model.FlagSuction, model.FlagGround, flagBLSeparates}
	marked := map[model.FlagKind]bool{}
	for i, c := range res.Sweep {
		row := []string{num(c.AlphaDeg, 2), Coef(c.Cl), Coef(c.ClPressure), Coef(c.Cm), Cp(c.CpMin), XC(c.XCpMin)}
		if vis {
			v := res.SweepViscous[i]
			row = append(row, Coef(v.Cd), XC(v.TransitionUpper)+" / "+XC(v.TransitionLower))
		}
		if coupled {
			p := res.SweepCoupled[i]
			row = append(row, Coef(p.Cl), Coef(p.Cd), Coef(p.Cm))
		}
		var marks []string
		for _, f := range r.sweepFlags(i) {
			marked[f.Kind] = true
			marks = append(marks, strconv.Itoa(slices.Index(order, f.Kind)+1))
		}
		row = append(row, strings.Join(marks, ", "))
		rows = append(rows, row)
	}
	r.table(head, widths, align, rows)
	var foot []string
	for k, kind := range order {
		if marked[kind] {
			foot = append(foot, fmt.Sprintf("(%d) %s: %s", k+1, kind, flagMeaning[kind]))
		}
	}
	if len(foot) > 0 {
		r.small("Marked rows are not to be taken at face value. " + strings.Join(foot, " "))
	}
	r.small(sweepPositioning(r.in.Study))
	r.forceCurve()
	if vis {
		r.figure(figure.ViewDragPolar, sc, "Drag polar from the boundary-layer estimate; angles where a surface separates are left out.", figureHMM)
	}
}

func (r *writer) viscousPage() {
	res := r.in.Result
	var names []string
	heading, caption := "Boundary layer", "Boundary layer on %s: momentum and displacement thickness, shape factor and skin friction; transition and separation marked."
	switch c := res.Coupled; {
	case res.Viscous != nil:
		for _, e := range res.Viscous.Elements {
			names = append(names, e.Name)
		}
	case c != nil && c.Converged && c.Detail != nil:
		// The coupled viscous solution's layers, when it converged (a
		// point that did not has no layers to show: the results page
		// says so).
		for _, e := range c.Elements {
			names = append(names, e.Name)
		}
		heading, caption = "Boundary layers (coupled viscous solution)", "Boundary layers on %s, against arc length from the stagnation point: momentum and displacement thickness, shape factor, skin friction and the e^N amplification; transition and separation marked."
	}
	if len(names) == 0 {
		return
	}
	r.need(110 + 32)
	r.heading(heading)
	for i, name := range names {
		sc := r.scene()
		sc.Element = i
		r.figure(figure.ViewBoundaryLayer, sc, fmt.Sprintf(caption, name), 110)
	}
}

func (r *writer) densityPage() {
	d := r.in.Density
	if d == nil || len(d.Rows) == 0 {
		if len(r.in.ViscousDensity) > 0 {
			r.heading("Panel density study")
			r.viscousDensitySection()
		}
		return
	}
	defer r.viscousDensitySection()
	r.need(figureHMM + 32)
	r.heading("Panel density study")
	r.figure(figure.ViewDensity, r.scene(), "Cl and Cp min against the panel count for each nose clustering.", figureHMM)
	st := r.in.Study
	tolCl, tolCp := st.Density.TolClPct, st.Density.TolCpMinPct
	if tolCl == 0 {
		tolCl = engine.DefaultTolClPct
	}
	if tolCp == 0 {
		tolCp = engine.DefaultTolCpMinPct
	}
	var rows [][]string
	var skipped []string // the reasons, in full under the table: a cell would cut them
	for _, row := range d.Rows {
		if !row.Solved() {
			rows = append(rows, []string{strconv.Itoa(row.Panels), num(row.Nose, 2), "skipped", "", "", "", "", ""})
			skipped = append(skipped, fmt.Sprintf("Skipped %d panels (nose %s): %s.", row.Panels, num(row.Nose, 2), row.Skipped))
			continue
		}
		rows = append(rows, []string{strconv.Itoa(row.Panels), num(row.Nose, 2), Coef(row.Cl), Coef(row.DCl), Coef(row.Cm), Cp(row.CpMin), Cp(row.DCpMin), num(row.ShortestPanel*1000, 3)})
	}
	r.table([]string{"Panels", "Nose", "Cl", "ΔCl from the count before", "Cm", "Cp min", "ΔCp min", "Smallest panel, mm"}, []float64{0.7, 0.6, 1.3, 1, 0.9, 0.9, 0.9, 1},
		[]string{"R", "R", "R", "R", "R", "R", "R", "R"}, rows)
	ex := func(name string, e engine.Extrapolation) string {
		if !e.OK {
			return name + ": no steady convergence over the three finest counts (no extrapolation)"
		}
		return fmt.Sprintf("%s → %s ± %.2g (observed order %s)", name, num(e.Value, 4), e.ErrorEstimate, num(e.ObservedOrder, 2))
	}
	var lines []string
	for _, se := range d.Series {
		rec := "no count meets the tolerances"
		if se.RecommendedPanels > 0 {
			rec = fmt.Sprintf("%d panels recommended", se.RecommendedPanels)
		}
		viscous := ""
		if d.Viscous {
			viscous = fmt.Sprintf("; %s; %s", ex("Cl viscous", se.ViscousCl), ex("Cd viscous", se.ViscousCd))
		}
		lines = append(lines, fmt.Sprintf("Nose %s: %s; %s; %s%s; %s.", num(se.Nose, 2), ex("Cl", se.Cl), ex("Cm", se.Cm), ex("Cp min", se.CpMin), viscous, rec))
	}
	r.bullets(append(skipped, lines...))
	used := fmt.Sprintf("This study uses %d panels per element.", st.Panelling.Panels)
	if d.RecommendedPanels > 0 {
		used = fmt.Sprintf("Recommended: %d panels per element, the smallest count from which every finer count stays within %s %% in Cl and %s %% in Cp min; this study uses %d.",
			d.RecommendedPanels, num(tolCl, 2), num(tolCp, 2), st.Panelling.Panels)
	}
	r.para(used + " The extrapolation is Richardson's from the three finest counts, kept only for an observed order between " +
		num(engine.MinObservedOrder, 1) + " and " + num(engine.MaxObservedOrder, 1) + " (Roache, Verification and Validation in Computational Science and Engineering, 1998, ch. 5); its ± is the error band of the finest count.")
}

func (r *writer) methodsPage() {
	r.heading("Methods")
	r.para("Geometry. Each section is cleaned to unit chord (leading edge at the origin, trailing edge at x = 1), repanelled by the chosen spacing law, scaled to its chord and placed by its leading edge and setting angle. Inverted mounting mirrors the configuration about the horizontal so that the suction side faces the ground.")
	r.para("Potential flow. The surface of every element carries a vortex sheet of linearly varying strength on straight panels (Katz & Plotkin, ch. 11); flow tangency is imposed at the panel midpoints and the Kutta condition at each trailing edge. In ground effect the ground is represented by the mirror image of the configuration with opposite circulation, which makes the ground a streamline; the configuration pitches about its reference point and the freestream stays parallel to the ground. Lift follows from the circulation (Kutta–Joukowski) and from the integrated surface pressure. For a configuration in free air the two agree to within the discretisation error; near the ground, and for one element among others, only the pressure gives the force on the body (see the notes with the results).")
	r.para("Coupled viscous solution (when enabled, the default with a speed). Integral laminar and turbulent boundary layers on every surface and wake (the kinetic-energy shape equation with a shear-stress lag equation for turbulent flow, closures of the Falkner–Skan family for laminar flow; Drela & Giles, AIAA J. 25(10), 1987; Green, Weeks & Brooman, ARC R&M 3791, 1977) whose displacement acts back on the panel solution through surface and wake sources; layers and panels are solved together by Newton's method. Transition by the e^N envelope method with the critical exponent N (9 by default, a quiet wind tunnel) or at a trip; drag from each wake's far end (Squire–Young). Each result says whether it converged; a point that did not shows no viscous numbers. Lift and maximum lift come from the converged layers; past maximum lift the method gives a gentle fall where a real section may stall abruptly.")
	r.para("Boundary layer (when the one-way estimate is chosen). From the inviscid surface speed: Thwaites' method for the laminar layer, Michel's criterion for transition, Head's entrainment method for the turbulent layer and the Squire–Young formula for the profile drag. The estimate is one-way: the boundary layer does not displace the outer flow, so Cl, Cm and Cp stay inviscid.")
	r.para("Air. Density from the ideal-gas law with the constants of the U.S. Standard Atmosphere, 1976; viscosity from Sutherland's law.")
	r.heading("References")
	for _, ref := range references {
		r.pdf.SetFont(fontFamily, "", bodyPt)
		r.pdf.MultiCell(0, 4.6, ref, "", "L", false)
		r.pdf.Ln(0.8)
	}
	r.pdf.Ln(2)
	r.box("Limitations and cautions", limitations, [3]int{252, 240, 228})
}

var references = []string{
	"Katz, J. and Plotkin, A., Low-Speed Aerodynamics, 2nd ed., Cambridge University Press, 2001.",
	"Kuethe, A. M. and Chow, C.-Y., Foundations of Aerodynamics: Bases of Aerodynamic Design, 5th ed., Wiley, 1998.",
	"Abbott, I. H. and von Doenhoff, A. E., Theory of Wing Sections, Dover, 1959.",
	"Thwaites, B., Approximate calculation of the laminar boundary layer, Aeronautical Quarterly 1, 1949.",
	"Head, M. R., Entrainment in the turbulent boundary layer, ARC R&M 3152, 1958.",
	"Michel, R., Étude de la transition sur les profils d'aile, ONERA, 1951.",
	"Squire, H. B. and Young, A. D., The calculation of the profile drag of aerofoils, ARC R&M 1838, 1938.",
	"U.S. Standard Atmosphere, 1976, NOAA, NASA and USAF, U.S. Government Printing Office, Washington, 1976.",
	"Sutherland, W., The viscosity of gases and molecular force, Philosophical Magazine 36, 1893.",
}

const limitations = "2-D estimates; validate by test; structural design and mounting follow the competition's rules and qualified engineering review.\n" +
	"The panel method assumes attached, incompressible, steady two-dimensional flow; alone it does not predict stall or maximum lift, and it overstates lift near and beyond separation. The coupled viscous solution adds the boundary layers and wakes acting back on that flow: drag, transition, trailing-edge separation and the section's maximum lift, with lift still above wind-tunnel data, by 4–9 % on NACA 0012 at Re 6e6 (0.02 to 0.08 in Cl) and by up to a third on a section with laminar bubbles at Re 2e5 (E387: 5–32 %, 0.03 to 0.10 in Cl), and no leading-edge stall; a point that did not converge is shown as such. Ground effect is modelled with a fixed ground; a moving ground, wheels and the car's body change the flow. The boundary-layer estimate is sensitive to transition, which the criterion predicts only roughly; trips fix it where the test article has them. Check convergence with the panel density study before quoting a number."

// The leading-edge close-up of the report frames the first 15 % of the
// main element's chord: the nose region where panel density matters most
// (the suction peak of a wing section lies within a few percent of chord).
const (
	leWindowChords = 0.15
	metresToMM     = 1000
)

// flagBLSeparates marks a sweep angle where the one-way boundary-layer
// estimate finds the flow separating before the trailing edge.
const flagBLSeparates model.FlagKind = "boundary layer separates"

// flagMeaning says in a footnote what each mark means for the wing.
var flagMeaning = map[model.FlagKind]string{
	model.FlagSeparated:    fmt.Sprintf("the viscous solution or the boundary-layer estimate finds the flow separated ahead of x/c %.1f; the real wing stalls there.", engine.SeparatedFromXC),
	model.FlagPastClMax:    "beyond the angle of maximum lift; the real wing gives less, not more.",
	model.FlagNotConverged: "the viscous solution did not converge; the row is no answer.",
	model.FlagSuction:      fmt.Sprintf("suction peak below Cp %d, beyond what real flows sustain at these Reynolds numbers; the wing would separate.", model.CpMinPlausible),
	model.FlagGround:       fmt.Sprintf("closer to the ground than %g chords: %s.", model.GroundHOverCMin, model.GroundCaution()),
	flagBLSeparates:        "the boundary-layer estimate separates before the trailing edge: near or past stall, drag not given.",
}

// sweepFlags are the marks of sweep row i: the plausibility rules of
// package model, with the coupled solution's verdicts when it ran, and the
// one-way estimate's separation.
func (r *writer) sweepFlags(i int) []model.Flag {
	res := r.in.Result
	var flags []model.Flag
	if r.in.Coupled == nil {
		flags = res.SweepFlags(i) // with the one-way estimate's separation
	} else {
		flags = model.Plausibility(model.PointFacts{CpMin: r.suctionPeak(i, res.Sweep[i].CpMin), HOverC: hOverC(res), Viscous: r.viscousFacts(i)})
	}
	if len(res.SweepViscous) == len(res.Sweep) && !res.SweepViscous[i].Valid {
		flags = append(flags, model.Flag{Kind: flagBLSeparates})
	}
	return flags
}

// sweepPositioning says how the wing is positioned at each angle of the
// sweep.
func sweepPositioning(st *model.Study) string {
	if st.Ground.Enabled {
		return fmt.Sprintf("At each angle the whole wing pitches about the main element's quarter chord and is then set %s mm above the ground at its lowest point; the freestream stays parallel to the ground.", mm(st.Ground.ClearanceMM))
	}
	return "In free air the wing stays as set and the freestream turns to each angle."
}

// dwarfRatio is how many times one element's suction peak must exceed
// another's for the shared pressure figure to flatten the smaller one; the
// report then adds a figure per element (a layout choice: at three times
// the scale the smaller curve uses a third of the height).
const dwarfRatio = 3

// dwarfed reports whether one element's Cp dwarfs another's.
func dwarfed(sol *solver.Solution) bool {
	if len(sol.Elements) < 2 {
		return false
	}
	lo, hi := math.Inf(1), 0.0
	for _, e := range sol.Elements {
		span := 1 - e.CpMin // the Cp range from stagnation (Cp = 1) to the peak
		lo, hi = math.Min(lo, span), math.Max(hi, span)
	}
	return hi > dwarfRatio*lo
}

// forceCurve draws the downforce (or lift) against α in newtons at the
// study's speed: q × reference chord × span × Cl, the sweep's coefficients
// turned into the force the team feels, marked rows ringed.
func (r *writer) forceCurve() {
	st, res := r.in.Study, r.in.Result
	f := res.Forces
	if f == nil || len(res.Sweep) == 0 {
		return
	}
	fc := figure.ForceCurve{Sweep: res.Sweep, Sign: loadSign(st), Name: "Lift", Unit: "N/m", AlphaDeg: st.Flow.AlphaDeg,
		PerCl: f.DynamicPressurePa * res.Layout.RefChordM}
	if st.Inverted {
		fc.Name = "Downforce"
	}
	if f.SpanM > 0 {
		fc.PerCl *= f.SpanM
		fc.Unit = "N"
	}
	for i := range res.Sweep {
		fc.Marked = append(fc.Marked, len(r.sweepFlags(i)) > 0)
	}
	what := "the sweep's Cl"
	if len(res.SweepCoupled) == len(res.Sweep) {
		for _, c := range res.SweepCoupled {
			fc.ClViscous = append(fc.ClViscous, c.Cl) // NaN unless converged
		}
		what = "the sweep's viscous Cl (the inviscid load dashed for comparison)"
	}
	pl, err := figure.ForcePlot(fc)
	if err != nil {
		return
	}
	r.image(func(w io.Writer, win, hin float64) error {
		return figure.WritePlot(w, pl, figure.FormatPNG, win, hin, FigureDPI)
	},
		"force", fmt.Sprintf("%s against the angle of attack at %s km/h: %s × q × reference chord%s, two-dimensional (no end effects).",
			fc.Name, num(model.MpsToKmh(st.Flow.SpeedMPS), 0), what, map[bool]string{true: " × span", false: " per metre of span"}[f.SpanM > 0]), figureHMM*0.8)
}
