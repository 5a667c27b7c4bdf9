package report

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// Coupled holds what the coupled viscous solution adds to a report: its
// convergence, drag, transition and separation per element and the
// maximum lift of the sweep. The report shows these numbers where they go
// (the summary, the element table, the sweep's marks) as soon as a caller
// fills them in; until the coupled solution runs, Input.Coupled is nil and
// the report says what is not known.
type Coupled struct {
	Converged  bool
	Iterations int
	// Rejected says why iterations that met their tolerance were not
	// taken as converged (engine.CoupledPoint.Rejected); empty otherwise.
	Rejected string
	Cl       float64 // configuration, standard sense (positive up); NaN unless converged
	Cd       float64 // configuration, on the reference chord
	// ClMax is the largest lift coefficient of the sweep in the sense that
	// loads the wing (−Cl, downforce, for an inverted study) and
	// AlphaClMaxDeg its angle; NaN when the sweep found no maximum.
	ClMax, AlphaClMaxDeg float64
	// ClMaxIsPeak is true when lift falls after ClMax inside the sweep;
	// false when the sweep ends before it does (ClMax is then a lower
	// bound).
	ClMaxIsPeak bool
	Elements    []CoupledElement
	// PastClMax, NotConverged and Separated are per sweep angle (parallel
	// to Result.Sweep), nil when not known.
	PastClMax, NotConverged, Separated []bool
	// PointPastClMax and PointSeparated are the verdicts at the study's
	// angle (engine.CoupledPoint.Facts).
	PointPastClMax, PointSeparated bool
	// PointCpMin is the coupled solution's suction peak at the study's
	// angle and CpMin per sweep angle (engine.CoupledPoint.CpMin); NaN
	// where it did not converge, and the flags then judge the inviscid
	// peak. CoupledFrom fills them; a Coupled built otherwise sets them
	// (NaN where not known), as 0 would read as a peak of Cp 0.
	PointCpMin float64
	CpMin      []float64
}

// CoupledElement is the coupled solution on one element; x/c NaN for none.
type CoupledElement struct {
	Name                                 string
	Cd                                   float64
	TransitionUpperXC, TransitionLowerXC float64
	SeparationUpperXC, SeparationLowerXC float64
}

// CoupledFrom takes the coupled viscous solution of an engine result into
// the report's terms: nil when it did not run. The engine's Cl max is in
// the standard sense; the report's is in the sense that loads the wing.
func CoupledFrom(st *model.Study, res *engine.Result) *Coupled {
	cp := res.Coupled
	if cp == nil {
		return nil
	}
	c := &Coupled{Converged: cp.Converged, Iterations: cp.Iterations, Rejected: cp.Rejected, Cl: cp.Cl, Cd: cp.Cd,
		ClMax: loadSign(st) * res.ClMax, AlphaClMaxDeg: res.AlphaClMax, ClMaxIsPeak: res.ClMaxIsPeak}
	for _, e := range cp.Elements {
		c.Elements = append(c.Elements, CoupledElement{Name: e.Name, Cd: e.Cd,
			TransitionUpperXC: e.TransitionUpper, TransitionLowerXC: e.TransitionLower,
			SeparationUpperXC: e.SeparationUpper, SeparationLowerXC: e.SeparationLower})
	}
	f := cp.Facts()
	c.PointPastClMax, c.PointSeparated = f.PastClMax, f.Separated
	c.PointCpMin, _ = cp.CpMin()
	if n := len(res.Sweep); n > 0 && len(res.SweepCoupled) == n {
		c.PastClMax, c.NotConverged, c.Separated, c.CpMin = make([]bool, n), make([]bool, n), make([]bool, n), make([]float64, n)
		for i := range res.SweepCoupled {
			f := res.SweepCoupled[i].Facts()
			c.PastClMax[i], c.NotConverged[i], c.Separated[i] = f.PastClMax, f.NotConverged, f.Separated
			c.CpMin[i], _ = res.SweepCoupled[i].CpMin()
		}
	}
	return c
}

// headline is page 1's set of numbers, computed once so that the tests can
// check them against the engine's own.
type headline struct {
	LoadName     string  // "Downforce" or "Lift"
	LoadCoef     float64 // in the loading sense: −Cl inverted, Cl upright
	LoadN        float64 // over the span, N (per metre when no span: NaN)
	LoadPerSpan  float64 // N/m
	DragN        float64 // NaN when not estimated
	DragPerSpan  float64 // N/m, NaN when not estimated
	DragSource   string
	LiftToDrag   float64 // NaN when no drag
	ClMaxMargin  float64 // NaN when Cl max is not known
	AlphaMargin  float64 // degrees to the angle of Cl max
	WarningCount int
}

// loadSign turns a standard-sense lift into the loading sense of the study.
func loadSign(st *model.Study) float64 {
	if st.Inverted {
		return -1
	}
	return 1
}

func (r *writer) headline() headline {
	st, res := r.in.Study, r.in.Result
	s := loadSign(st)
	cl := res.Solution.Cl
	if c := r.in.Coupled; c != nil {
		cl = c.Cl // NaN when it did not converge: no answer
	}
	h := headline{LoadName: "Lift", LoadCoef: s * cl, LoadN: math.NaN(), LoadPerSpan: math.NaN(),
		DragN: math.NaN(), DragPerSpan: math.NaN(), LiftToDrag: math.NaN(), ClMaxMargin: math.NaN(), AlphaMargin: math.NaN()}
	if st.Inverted {
		h.LoadName = "Downforce"
	}
	q := math.NaN()
	if f := res.Forces; f != nil {
		q = f.DynamicPressurePa
		h.LoadPerSpan = s * f.LiftPerSpan
		h.DragPerSpan = f.DragPerSpan
		if f.SpanM > 0 {
			h.LoadN = h.LoadPerSpan * f.SpanM
			h.DragN = f.DragPerSpan * f.SpanM
		}
	}
	switch {
	case r.in.Coupled != nil && !math.IsNaN(r.in.Coupled.Cd):
		h.DragSource = "viscous solution (coupled)"
		h.DragPerSpan = q * res.Layout.RefChordM * r.in.Coupled.Cd
		if f := res.Forces; f != nil && f.SpanM > 0 {
			h.DragN = h.DragPerSpan * f.SpanM
		}
	case res.Viscous != nil && !math.IsNaN(h.DragPerSpan):
		h.DragSource = "one-way boundary-layer estimate (Squire–Young)"
	}
	if h.DragPerSpan > 0 {
		h.LiftToDrag = h.LoadPerSpan / h.DragPerSpan
	}
	if c := r.in.Coupled; c != nil && !math.IsNaN(c.ClMax) && !math.IsNaN(h.LoadCoef) {
		h.ClMaxMargin = c.ClMax - h.LoadCoef
		h.AlphaMargin = c.AlphaClMaxDeg - st.Flow.AlphaDeg
	}
	h.WarningCount = len(r.warnings())
	return h
}

// newtons formats a force: no decimals from 100 N, one below.
func newtons(v float64) string {
	if math.Abs(v) >= 100 {
		return num(v, 0) + " N"
	}
	return num(v, 1) + " N"
}

func (r *writer) summaryPage() {
	p := r.pdf
	st, res := r.in.Study, r.in.Result
	p.AddPage()
	p.SetFont(fontFamily, "B", titlePt)
	p.MultiCell(0, 9, st.Name, "", "L", false)
	p.SetFont(fontFamily, "", headingPt)
	p.SetTextColor(70, 76, 84)
	p.CellFormat(0, 7, "Wing-section study report — summary", "", 1, "L", false, 0, "")
	p.SetFont(fontFamily, "", bodyPt)
	p.CellFormat(0, 5, fmt.Sprintf("%s · %s · Sectionbench %s", orDash(r.in.Author), r.in.Date.Format("2 January 2006"), orDash(r.in.AppVersion)), "", 1, "L", false, 0, "")
	p.SetTextColor(0, 0, 0)
	p.Ln(2)
	h := r.headline()
	f := res.Forces
	speed := "no speed given: forces not computed"
	if f != nil {
		speed = fmt.Sprintf("at %s km/h (%s m/s), q = %s Pa", num(model.MpsToKmh(st.Flow.SpeedMPS), 0), num(st.Flow.SpeedMPS, 1), num(f.DynamicPressurePa, 0))
		if f.SpanM > 0 {
			speed += fmt.Sprintf(", over a %s m span (2-D, no end effects)", num(f.SpanM, 2))
		} else {
			speed += ", per metre of span (no span given)"
		}
	}
	kv := [][2]string{{h.LoadName, r.loadText(h)}}
	drag := "not estimated: the boundary layer is off"
	switch {
	case r.in.Coupled != nil && !r.in.Coupled.Converged:
		drag = "no answer: the viscous solution did not converge"
	case !math.IsNaN(h.DragPerSpan) && !math.IsNaN(h.DragN):
		drag = fmt.Sprintf("%s (%s N/m), %s", newtons(h.DragN), num(h.DragPerSpan, 2), h.DragSource)
	case !math.IsNaN(h.DragPerSpan):
		drag = fmt.Sprintf("%s N/m, %s", num(h.DragPerSpan, 2), h.DragSource)
	case res.Viscous != nil:
		drag = "not given: the boundary layer separates before the trailing edge on at least one element"
	}
	kv = append(kv, [2]string{"Drag", drag})
	ld := "not known (no drag)"
	if !math.IsNaN(h.LiftToDrag) {
		ld = num(h.LiftToDrag, 1)
	}
	kv = append(kv, [2]string{h.LoadName + " to drag", ld})
	kv = append(kv, [2]string{"Margin to maximum lift", r.marginWords(h)})
	r.box("Conditions", speed+".", [3]int{232, 239, 248})
	r.keyValues(kv)

	r.subheading("Setting as mounted")
	r.para("Frame " + model.FrameText + "; angles: " + model.AngleSense(st.Inverted) + ".")
	r.settingTable()

	r.subheading("Confidence")
	r.keyValues(r.confidence(h))

	r.subheading("Open issues")
	issues := r.openIssues(h)
	if len(issues) == 0 {
		issues = []string{"None found by the checks this program makes. The cautions below still apply."}
	}
	r.bullets(issues)
	r.box("Cautions", cautionText, [3]int{252, 240, 228})
}

func (r *writer) loadText(h headline) string {
	res := r.in.Result
	if math.IsNaN(h.LoadCoef) {
		s := "no answer: the viscous solution did not converge"
		if f := res.Forces; f != nil {
			s += fmt.Sprintf(" (inviscid, for orientation only: %s N/m)", num(loadSign(r.in.Study)*f.InviscidLiftPerSpan, 1))
		}
		return s
	}
	if res.Forces == nil {
		return fmt.Sprintf("coefficient %s (no speed given, so no force)", Coef(h.LoadCoef))
	}
	s := fmt.Sprintf("%s N/m, coefficient %s on the %s mm reference chord", num(h.LoadPerSpan, 1), Coef(h.LoadCoef), mm(res.Layout.RefChordM*1000))
	if !math.IsNaN(h.LoadN) {
		s = newtons(h.LoadN) + " (" + s + ")"
	}
	if h.LoadN < 0 || (math.IsNaN(h.LoadN) && h.LoadPerSpan < 0) {
		s += fmt.Sprintf("; negative: the wing makes %s, not %s", map[bool]string{true: "lift", false: "downforce"}[r.in.Study.Inverted], strings.ToLower(h.LoadName))
	}
	return s
}

// settingTable is every element's setting as mounted: its angle and the
// chord rise a team measures with a ruler, and for each flap its slot
// behind the element before; then the height over the ground.
func (r *writer) settingTable() {
	st, l := r.in.Study, r.in.Result.Layout
	// Each element's height over the ground at the angle solved, over its
	// own chord: its lowest point less the ground's height.
	hc := make([]string, len(st.Elements))
	if st.Ground.Enabled {
		elems, groundY, _ := l.At(st.Flow.AlphaDeg)
		for i, pe := range elems {
			low := math.Inf(1)
			for _, q := range pe.Nodes {
				low = math.Min(low, q.Y)
			}
			if i < len(hc) {
				hc[i] = num((low-groundY)/pe.Chord, 3)
			}
		}
	}
	rows := make([][]string, len(st.Elements))
	for i, e := range st.Elements {
		rise := "—"
		if i < len(l.Elements) {
			pe := l.Elements[i]
			rise = num((pe.TrailingEdge.Y-pe.LeadingEdge.Y)*1000, 1)
		}
		gap, overlap, defl := "—", "—", "—"
		if i > 0 {
			var sec *model.Section
			if i < len(r.in.Sections) {
				sec = r.in.Sections[i]
			}
			if sec != nil {
				s := st.SlotOf(i, sec)
				gap, overlap, defl = mm(s.GapMM), mm(s.OverlapMM), num(s.DeflectionDeg, 1)
			} else {
				fp := st.FlapPlacementOf(i)
				overlap, defl = mm(fp.OverlapMM), num(fp.DeflectionDeg, 1)
			}
		}
		rows[i] = []string{e.Name, mm(e.ChordMM), mm(e.XMM) + ", " + mm(e.YMM), num(e.AngleDeg, 2), rise, gap, overlap, defl}
		if st.Ground.Enabled {
			rows[i] = append(rows[i], hc[i])
		}
	}
	head := []string{"Element", "Chord, mm", "Leading edge x, y, mm", "Angle, ° (" + model.AngleShort(st.Inverted) + ")", "Chord rise, mm", "Gap, mm", "Overlap, mm", "Deflection, °"}
	widths := []float64{1.5, 0.8, 1.3, 1.2, 0.9, 0.8, 0.9, 1.1}
	align := []string{"L", "R", "R", "R", "R", "R", "R", "R"}
	if st.Ground.Enabled {
		head, widths, align = append(head, "Height over ground h/c"), append(widths, 1), append(align, "R")
	}
	r.table(head, widths, align, rows)
	notes := []string{"Chord rise: trailing edge height above the leading edge as mounted, at the setting (α = 0), in mm over the chord; what a ruler from the leading edge shows. " + model.SlotText + "."}
	if st.Ground.Enabled && len(l.Elements) > 0 {
		notes = append(notes, fmt.Sprintf("Ground: %s mm below the lowest point at the angle of attack solved; h/c: each element's lowest point above the ground there, over its own chord.",
			mm(st.Ground.ClearanceMM)))
	}
	r.small(strings.Join(notes, " "))
}

// confidence lists how far the numbers can be trusted.
func (r *writer) confidence(h headline) [][2]string {
	st, res := r.in.Study, r.in.Result
	var kv [][2]string
	conv := "not applicable: potential flow (a direct solve)"
	switch c := r.in.Coupled; {
	case c != nil && c.Converged:
		conv = fmt.Sprintf("yes, the coupled viscous solution converged in %d %s", c.Iterations, plural(c.Iterations, "iteration", "iterations"))
	case c != nil:
		conv = fmt.Sprintf("NO: the coupled viscous solution did not converge (%d iterations)%s; its numbers are not an answer", c.Iterations, rejectedWhy(c))
	case res.Viscous != nil:
		conv = "potential flow with a one-way boundary-layer estimate (no iteration)"
	}
	kv = append(kv, [2]string{"Converged", conv})
	d := r.in.Density
	if d == nil || len(d.Rows) == 0 {
		kv = append(kv, [2]string{"Panel density study", "not run"})
	} else {
		band := "no steady convergence seen over the counts tried: no error band"
		if d.Cl.OK {
			// The density study judges the panel method: with a viscous
			// solution above it, say that its Cl is the inviscid one (the
			// summary's coefficient is the viscous one, and differs).
			name := "Cl"
			if st.Viscous.Enabled {
				name = "inviscid Cl"
			}
			band = fmt.Sprintf("%s → %s ± %.2g extrapolated (observed order %s)", name, Coef(d.Cl.Value), d.Cl.ErrorEstimate, num(d.Cl.ObservedOrder, 2))
		}
		rec := "no count met the tolerances"
		if d.RecommendedPanels > 0 {
			rec = fmt.Sprintf("%d recommended against %d used", d.RecommendedPanels, st.Panelling.Panels)
		}
		kv = append(kv, [2]string{"Panel density study", band + "; " + rec + r.viscousDensityWords()})
	}
	kv = append(kv, [2]string{"Warnings", fmt.Sprintf("%d (listed under Warnings)", h.WarningCount)})
	return kv
}

// viscousDensityWords says, for the summary's confidence, how the coupled
// viscous solution's Cl moved with the panel count, which the
// recommendation does not judge: its extrapolation, or that it did not
// settle, and the counts whose transition was held (a tripped answer).
// Page 1 gave only the inviscid Cl's band, though the headline is the
// viscous Cl. "" without the coupled solution in the density study.
func (r *writer) viscousDensityWords() string {
	d := r.in.Density
	if d == nil || !d.Viscous {
		return ""
	}
	w := "; viscous Cl: no steady convergence over the finest counts"
	if e := d.ViscousCl; e.OK {
		w = fmt.Sprintf("; viscous Cl → %s ± %.2g", Coef(e.Value), e.ErrorEstimate)
	}
	var held []string
	for _, row := range r.in.ViscousDensity {
		if row.Held {
			held = append(held, strconv.Itoa(row.Panels))
		}
	}
	if len(held) > 0 {
		w += fmt.Sprintf(" (transition held upstream at %s panels)", strings.Join(held, ", "))
	}
	return w
}

// openIssues says in plain words what a reader must know before acting.
func (r *writer) openIssues(h headline) []string {
	st, res := r.in.Study, r.in.Result
	var out []string
	for _, f := range r.flags() {
		out = append(out, "At the angle solved: "+f.Message+".")
	}
	if c := r.in.Coupled; c != nil && !c.Converged {
		out = append(out, "The viscous solution did not converge: drag, transition and maximum lift are not answers until it does.")
	}
	if d := r.in.Density; d != nil && len(d.Rows) > 0 {
		switch {
		case d.RecommendedPanels == 0:
			out = append(out, "The density study found no panel count whose answer stays within its tolerances: the numbers still change with the panelling.")
		case d.RecommendedPanels > st.Panelling.Panels:
			out = append(out, fmt.Sprintf("The study uses %d panels per element but the density study recommends %d: solve again at %d before quoting a number.", st.Panelling.Panels, d.RecommendedPanels, d.RecommendedPanels))
		}
		for _, row := range d.Rows {
			if !row.Solved() {
				out = append(out, fmt.Sprintf("The density study could not place %d panels (nose %s): %s.", row.Panels, num(row.Nose, 2), SkipReason(row)))
			}
		}
	}
	if res.Viscous == nil && r.in.Coupled == nil {
		out = append(out, "No drag and no warning of stall: the boundary layer was off. Turn it on (a speed or a Reynolds number) for drag, transition and separation.")
	}
	if v := res.Viscous; v != nil {
		for _, e := range v.Elements {
			if !e.Valid {
				out = append(out, fmt.Sprintf("The boundary layer on %s separates before the trailing edge: the real wing is near or past stall there, and its drag is not given.", e.Name))
			}
		}
	}
	if math.IsNaN(h.ClMaxMargin) {
		// Only the coupled viscous solution's sweep gives a maximum lift
		// (it said "this program estimates no maximum lift yet").
		out = append(out, "How far the wing is from stall is not known: only a sweep with the coupled viscous solution gives a maximum lift, and none converged here (or none ran). Find it by test.")
	}
	if n := reynoldsMismatch(st, res); n != "" {
		out = append(out, n)
	}
	if h.WarningCount > 0 {
		out = append(out, fmt.Sprintf("%d warning%s from loading the sections and solving: see Warnings.", h.WarningCount, map[bool]string{true: "", false: "s"}[h.WarningCount == 1]))
	}
	return out
}

// flags are the plausibility flags at the study's angle of attack: the
// engine's (which take the one-way estimate's separation), or with the
// coupled solution its verdicts as the report holds them.
func (r *writer) flags() []model.Flag {
	res := r.in.Result
	if r.in.Coupled == nil {
		return res.Flags()
	}
	cp := math.Inf(1)
	for _, e := range res.Solution.Elements {
		cp = math.Min(cp, e.CpMin)
	}
	return model.Plausibility(model.PointFacts{CpMin: r.suctionPeak(-1, cp), HOverC: hOverC(res), Viscous: r.viscousFacts(-1), Reynolds: res.Reynolds})
}

// suctionPeak is the suction peak the flags judge at sweep row i, or at
// the study's angle for i < 0: the coupled solution's where it converged
// (its forces are the ones shown), else inviscidCpMin.
func (r *writer) suctionPeak(i int, inviscidCpMin float64) float64 {
	c := r.in.Coupled
	cp := math.NaN()
	switch {
	case c == nil:
	case i < 0:
		cp = c.PointCpMin
	case i < len(c.CpMin):
		cp = c.CpMin[i]
	}
	if math.IsNaN(cp) {
		return inviscidCpMin
	}
	return cp
}

// viscousFacts are the coupled solution's verdicts at sweep row i, or at
// the study's angle for i < 0; nil without a coupled solution.
func (r *writer) viscousFacts(i int) *model.ViscousFacts {
	c := r.in.Coupled
	if c == nil {
		return nil
	}
	if i < 0 {
		return &model.ViscousFacts{PastClMax: c.PointPastClMax, NotConverged: !c.Converged, Separated: c.PointSeparated, Coupled: true}
	}
	at := func(v []bool) bool { return i < len(v) && v[i] }
	return &model.ViscousFacts{PastClMax: at(c.PastClMax), NotConverged: at(c.NotConverged), Separated: at(c.Separated), Coupled: true}
}

func hOverC(res *engine.Result) float64 {
	l := res.Layout
	if l == nil || !l.Ground || len(l.Elements) == 0 {
		return math.NaN()
	}
	return l.ClearanceM / l.Elements[0].Chord
}

// reynoldsMismatch notes a Reynolds number set directly that disagrees by
// more than 10 % with the one speed and air give (a project choice: the
// Reynolds numbers a team quotes are seldom closer than that).
func reynoldsMismatch(st *model.Study, res *engine.Result) string {
	if !(st.Flow.Reynolds > 0) || !(st.Flow.SpeedMPS > 0) || len(res.Layout.Elements) == 0 {
		return ""
	}
	air, err := model.AirFromCelsius(st.Flow.TemperatureC, st.Flow.PressurePa)
	if err != nil {
		return ""
	}
	fromSpeed := model.Reynolds(st.Flow.SpeedMPS, res.Layout.Elements[0].Chord, air)
	if math.Abs(st.Flow.Reynolds-fromSpeed) <= 0.1*fromSpeed {
		return ""
	}
	return fmt.Sprintf("The Reynolds number was set directly to %s, but the speed and air give %s on the %s chord: the boundary layer uses the number set, the forces the speed.",
		strconv.FormatFloat(st.Flow.Reynolds, 'g', 3, 64), strconv.FormatFloat(fromSpeed, 'g', 3, 64), res.Layout.Elements[0].Name)
}

// bullets writes a list, one paragraph an item.
func (r *writer) bullets(items []string) {
	p := r.pdf
	p.SetFont(fontFamily, "", bodyPt)
	for _, it := range items {
		x := p.GetX()
		p.CellFormat(4, 4.6, "•", "", 0, "L", false, 0, "")
		p.MultiCell(r.width()-4, 4.6, it, "", "L", false)
		p.SetX(x)
	}
	p.Ln(1)
}

// small writes a paragraph in the table font.
func (r *writer) small(s string) {
	p := r.pdf
	p.SetFont(fontFamily, "I", tablePt)
	p.MultiCell(0, 4, s, "", "L", false)
	p.Ln(1.5)
}

// rejectedWhy is ": " and the reason a point's iterations that met their
// tolerance were not taken as converged, or "" when they were not
// rejected.
func rejectedWhy(c *Coupled) string {
	if c.Rejected == "" {
		return ""
	}
	return ": " + c.Rejected
}

// SkipReason is why a density study skipped a row, without the count and
// nose the engine's message starts with ("density study at 20 panels,
// nose 0.5: "), which the report and the app give in their own words
// before it: the summary read "could not place 20 panels (nose 0.50):
// density study at 20 panels, nose 0.5: elements …".
func SkipReason(row engine.DensityRow) string {
	return strings.TrimPrefix(row.Skipped, fmt.Sprintf("density study at %d panels, nose %g: ", row.Panels, row.Nose))
}

// marginWords is the summary's margin to maximum lift in words. Where
// the suction peak lies beyond what real flows sustain (model.FlagSuction)
// at the study's angle or a sweep angle short of the maximum, it says that
// the margin is the model's: a real wing separates there first. It gave
// the two-element example "at least 1.8160 … the real maximum lies
// beyond it" with every row from 3° flagged (look10).
func (r *writer) marginWords(h headline) string {
	c := r.in.Coupled
	if math.IsNaN(h.ClMaxMargin) {
		if c != nil && math.IsNaN(c.ClMax) {
			return "not known: no angle of the sweep converged (or no sweep ran)"
		}
		return "not known: maximum lift needs the coupled viscous solution, which has not run; potential flow never stalls"
	}
	margin := fmt.Sprintf("%s in the coefficient (%s of %s at Cl max), %s° in angle of attack", Coef(h.ClMaxMargin), Coef(h.LoadCoef), Coef(c.ClMax), num(h.AlphaMargin, 1))
	if !c.ClMaxIsPeak {
		margin = "at least " + margin + ": the sweep ends before the model's lift falls, so its maximum lies beyond it"
	}
	if a, ok := r.suctionFromDeg(); ok {
		margin += fmt.Sprintf("; but from %s° the suction peak is beyond the Cp %s real flows sustain, where a real wing separates first: this margin is the model's, not the wing's", num(a, 1), model.Minus(fmt.Sprint(model.CpMinPlausible)))
	}
	return margin
}

// suctionFromDeg returns the lowest angle, from the study's own up to
// that of the coupled solution's maximum lift, whose flags say the
// suction peak is beyond real flows (model.FlagSuction), and whether
// there is one. A larger angle loads the wing more, upright or inverted.
func (r *writer) suctionFromDeg() (float64, bool) {
	st, res, c := r.in.Study, r.in.Result, r.in.Coupled
	suction := func(fl []model.Flag) bool {
		return slices.ContainsFunc(fl, func(f model.Flag) bool { return f.Kind == model.FlagSuction })
	}
	if suction(r.flags()) {
		return st.Flow.AlphaDeg, true
	}
	from, ok := math.Inf(1), false
	for i, row := range res.Sweep {
		if row.AlphaDeg < st.Flow.AlphaDeg || row.AlphaDeg > c.AlphaClMaxDeg || row.AlphaDeg >= from {
			continue
		}
		if suction(r.sweepFlags(i)) {
			from, ok = row.AlphaDeg, true
		}
	}
	return from, ok
}
