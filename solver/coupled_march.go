package solver

import (
	"math"

	bl "sectionbench/solver/boundarylayer"
)

// march sets the initial state and returns the edge velocities it used: each surface marched from its stagnation
// point on the inviscid edge velocities, station by station (a local
// Newton solution of the station's residuals with Ue prescribed), holding
// H at a limit and letting Ue follow where the direct solution would pass
// it (separation), then the wakes. Transition is placed where ñ reaches
// NCrit, at a trip or at the trailing edge.
func (cs *coupledState) march() []float64 {
	n := len(cs.st)
	ueM := make([]float64, n)
	for i := range n {
		s := &cs.st[i]
		u := math.Max(cs.ue0[i], 1e-3)
		switch {
		case s.side == sideWake && !s.wakeStart:
			// The wake recovers towards U∞ downstream.
			u = math.Max(u, ueM[s.prev[0]])
		case s.side != sideWake && !s.first && s.xc > TrailingEdgeCutXC:
			// The inviscid speed falls towards the discrete stagnation
			// of the trailing edge, which the displacement removes: the
			// march holds the speed it had (the Newton iterations then
			// put in the coupled one).
			u = ueM[s.prev[0]]
		}
		ueM[i] = u
		switch {
		case s.first:
			s.kind = bl.Laminar
			th := bl.StagnationTheta(s.xi, u, cs.re)
			cs.th[i], cs.m[i], cs.c[i] = th, u*2.216*th, 0
			continue
		case s.wakeStart:
			a, b := s.prev[0], s.prev[1]
			th := cs.th[a] + cs.th[b]
			u = 0.5 * (ueM[a] + ueM[b])
			ueM[i] = u
			ds := cs.m[a]/ueM[a] + cs.m[b]/ueM[b]
			cs.th[i], cs.m[i] = th, u*ds
			cs.c[i] = (cs.c[a]*cs.th[a] + cs.c[b]*cs.th[b]) / th
			continue
		}
		p := s.prev[0]
		if s.side != sideWake {
			s.kind = cs.st[p].kind
		}
		cs.th[i], cs.c[i] = cs.th[p], cs.c[p]
		cs.m[i] = u * cs.m[p] / ueM[p]
		cs.solveStation(i, ueM)
		if s.kind == bl.Laminar && (cs.c[i] >= cs.ncrit || s.xi >= s.tripXi || s.last) {
			s.kind = bl.Turbulent
			cs.c[i] = cs.initialShear(i, ueM[i])
			cs.solveStation(i, ueM)
		}
	}
	return ueM
}

// initialShear returns √Cτ at transition for station i's state:
// 1.8 exp(−3.3/(Hk − 1)) √Cτ_EQ (boundarylayer.TransitionInterval).
func (cs *coupledState) initialShear(i int, ue float64) float64 {
	st := cs.stationOf(i, ue)
	st.C = 0.03
	c := bl.Eval(bl.Turbulent, st, cs.re)
	return math.Max(1.8*math.Exp(-3.3/(c.Hk-1))*c.SEq, 1e-4)
}

// solveStation solves station i's residuals for its three variables with
// the edge velocities ueM of the march, first directly (Ue fixed), then,
// if H passes its limit, inversely with H held there and Ue free.
func (cs *coupledState) solveStation(i int, ueM []float64) {
	s := &cs.st[i]
	hmax := maxMarchHLaminar
	switch s.kind {
	case bl.Turbulent:
		hmax = maxMarchHTurbulent
	case bl.Wake:
		hmax = maxMarchHWake
	}
	save := [3]float64{cs.c[i], cs.th[i], cs.m[i]}
	pp := s.prev[0]
	hPrev := cs.m[pp] / (ueM[pp] * cs.th[pp])
	uePrev := ueM[i]
	if s.kind != bl.Laminar && hPrev > hmax {
		// A separated layer reattaching (after transition in a bubble):
		// inverse until H is back at hmax, as Drela's march does.
		if cs.localNewton(i, ueM, cs.inverseH(i, hPrev, hmax)) {
			return
		}
		cs.c[i], cs.th[i], cs.m[i] = save[0], save[1], save[2]
		ueM[i] = uePrev
	}
	ok := cs.localNewton(i, ueM, 0)
	h := cs.m[i] / (ueM[i] * cs.th[i])
	grow := cs.th[i] / save[1]
	if ok && h <= hmax && h >= minMarchH && grow < maxMarchGrowth && grow > 1/maxMarchGrowth {
		return
	}
	// Outside the direct solution's range (separation, or the discrete
	// stagnation of the inviscid flow at a trailing edge): hold H and
	// let Ue follow.
	cs.c[i], cs.th[i], cs.m[i] = save[0], save[1], save[2]
	ok = cs.localNewton(i, ueM, cs.inverseH(i, hPrev, hmax))
	grow = cs.th[i] / save[1]
	if ok && ueM[i] > uePrev/maxMarchGrowth && ueM[i] < uePrev*maxMarchGrowth && grow < maxMarchGrowth && grow > 1/maxMarchGrowth {
		return
	}
	// Neither converged: carry the station before over (the coupled
	// iterations, which start by solving the march's problem as a
	// whole, put it right).
	ueM[i] = uePrev
	cs.c[i], cs.th[i], cs.m[i] = save[0], save[1], uePrev*hPrev*save[1]
}

// inverseH returns the shape factor the march holds at station i in
// inverse mode, from its predecessor's hPrev: a laminar layer's H
// grows from at least hmax as in a separation bubble, by 0.03 per
// momentum thickness of run; a turbulent layer's falls back towards hmax
// by 0.15 per momentum thickness, as it reattaches (the rates are those
// of Drela's inverse march as recalled, from memory).
func (cs *coupledState) inverseH(i int, hPrev, hmax float64) float64 {
	s := &cs.st[i]
	p := s.prev[0]
	run := (s.xi - cs.st[p].xi) / cs.th[p]
	if s.kind == bl.Laminar {
		return math.Max(hPrev+0.03*run, hmax)
	}
	if hPrev < hmax {
		return math.Max(hPrev, minMarchH)
	}
	return math.Max(hPrev-0.15*run, hmax)
}

// The march's acceptance of a direct solution: H at least minMarchH and θ
// changing by less than a factor maxMarchGrowth from the station before.
const (
	minMarchH      = 1.1
	maxMarchGrowth = 4
)

// localNewton solves station i's three residuals with its predecessors
// fixed: for hFix = 0 in (c, θ, m) with Ue = ueM[i]; otherwise in (c, θ,
// Ue) with m = Ue hFix θ. It reports convergence.
func (cs *coupledState) localNewton(i int, ueM []float64, hFix float64) bool {
	for range 30 {
		x := [3]float64{cs.c[i], cs.th[i], cs.m[i]}
		if hFix > 0 {
			x[2] = ueM[i]
		}
		eval := func(x [3]float64) bl.Residuals {
			ue := ueM[i]
			m := x[2]
			if hFix > 0 {
				ue = x[2]
				m = ue * hFix * x[1]
			}
			l := cs.localOf(i, ueM)
			l.v[0] = [4]float64{x[0], x[1], m, ue}
			return cs.residual(i, &l)
		}
		r0 := eval(x)
		var j [3][3]float64
		for v := range 3 {
			h := 1e-7*math.Abs(x[v]) + 1e-12
			if v == 0 && cs.st[i].kind == bl.Laminar {
				h = 1e-6
			}
			xp := x
			xp[v] += h
			r1 := eval(xp)
			for e := range 3 {
				j[e][v] = (r1[e] - r0[e]) / h
			}
		}
		dx, ok := solve3(j, [3]float64{-r0[0], -r0[1], -r0[2]})
		if !ok {
			return false
		}
		rlx := 1.0
		for v := 1; v < 3; v++ {
			if rel := dx[v] / x[v]; rel*rlx < -0.5 {
				rlx = -0.5 / rel
			} else if rel*rlx > 1 {
				rlx = 1 / rel
			}
		}
		if cs.st[i].kind != bl.Laminar {
			if rel := dx[0] / x[0]; rel*rlx < -0.5 {
				rlx = -0.5 / rel
			} else if rel*rlx > 1 {
				rlx = 1 / rel
			}
		}
		for v := range 3 {
			x[v] += rlx * dx[v]
		}
		if hFix > 0 {
			ueM[i] = x[2]
			cs.c[i], cs.th[i], cs.m[i] = x[0], x[1], x[2]*hFix*x[1]
		} else {
			cs.c[i], cs.th[i], cs.m[i] = x[0], x[1], x[2]
		}
		if math.IsNaN(x[1]) || !(x[1] > 0) || !(x[2] > 0) {
			return false
		}
		if math.Max(math.Abs(dx[1]/x[1]), math.Abs(dx[2]/x[2])) < 1e-8 {
			return true
		}
	}
	return false
}

// solve3 solves the 3×3 system a x = b by Cramer's rule.
func solve3(a [3][3]float64, b [3]float64) ([3]float64, bool) {
	det := a[0][0]*(a[1][1]*a[2][2]-a[1][2]*a[2][1]) - a[0][1]*(a[1][0]*a[2][2]-a[1][2]*a[2][0]) + a[0][2]*(a[1][0]*a[2][1]-a[1][1]*a[2][0])
	if det == 0 || math.IsNaN(det) {
		return [3]float64{}, false
	}
	var x [3]float64
	for c := range 3 {
		m := a
		for r := range 3 {
			m[r][c] = b[r]
		}
		x[c] = (m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) - m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) + m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])) / det
	}
	return x, true
}

// retype moves transition to where the current state puts it: a laminar
// station whose ñ reached NCrit (or that lies past a trip or at the
// trailing edge) turns turbulent; a turbulent station right after a
// laminar one turns laminar again if the amplification from its
// predecessor does not reach NCrit within the interval (and no trip or
// trailing edge forces it). It reports whether anything changed.
func (cs *coupledState) retype() bool {
	changed := false
	ue := cs.ueLayers()
	for i := range cs.st {
		s := &cs.st[i]
		if s.side == sideWake || s.first {
			continue
		}
		p := s.prev[0]
		if cs.st[p].kind != bl.Laminar {
			if s.kind == bl.Laminar {
				s.kind = bl.Turbulent
				cs.c[i] = cs.c[p]
				changed = true
			}
			continue
		}
		forced := s.xi >= s.tripXi || s.last
		if s.kind == bl.Laminar {
			if cs.c[i] >= cs.ncrit || forced {
				s.kind = bl.Turbulent
				cs.c[i] = cs.initialShear(i, math.Max(ue[i], 1e-6))
				changed = true
			}
			continue
		}
		if forced {
			continue
		}
		a := cs.stationOf(p, math.Max(ue[p], 1e-6))
		b := cs.stationOf(i, math.Max(ue[i], 1e-6))
		b.C = a.C
		ra := bl.Eval(bl.Laminar, a, cs.re).AmpRate
		rb := bl.Eval(bl.Laminar, b, cs.re).AmpRate
		grow := (b.Xi - a.Xi) * 0.5 * (ra + rb)
		if a.C+grow < cs.ncrit {
			s.kind = bl.Laminar
			cs.c[i] = a.C + grow
			changed = true
		}
	}
	return changed
}

// restagnate follows the stagnation points: from the current edge
// velocities it finds each element's sign change of the surface speed;
// if it left its panel, the surfaces are laid out anew (nodes that
// changed side take the values of the first station of their new side).
// It reports a new layout.
func (cs *coupledState) restagnate() bool {
	ue := cs.ue()
	g := make([]float64, cs.geo.n)
	for i := range cs.st {
		s := &cs.st[i]
		if s.side == sideWake {
			continue
		}
		e := &cs.geo.elems[s.elem]
		if s.side == sideUpper {
			g[e.u0+s.node] = ue[i]
		} else {
			g[e.u0+s.node] = -ue[i]
		}
	}
	moved := false
	newStag := make([]int, len(cs.stag))
	for k := range cs.geo.elems {
		e := &cs.geo.elems[k]
		kk, ss := stagnationSplit(e, g, cs.stag[k])
		newStag[k] = kk
		if ss >= 0 {
			cs.sStag[k] = ss
		}
		if kk != cs.stag[k] {
			moved = true
		}
	}
	if !moved {
		// Within its panel the stagnation point is held where the
		// layout put it: moving the stations' ξ between Newton steps,
		// outside the Jacobian, makes the iterations diverge (the first
		// station's θ ∝ √ξ). The error is below one leading-edge panel
		// in ξ.
		return false
	}
	cs.relayout(newStag)
	return true
}

// relayout lays the stations out at new splits and carries the variables
// over by node.
func (cs *coupledState) relayout(newStag []int) {
	type vals struct {
		c, th, m, ueM float64
		kind          bl.Kind
	}
	type key struct{ elem, side, node int }
	old := make(map[key]vals, len(cs.st))
	firsts := make(map[[2]int]vals)
	for i, s := range cs.st {
		v := vals{c: cs.c[i], th: cs.th[i], m: cs.m[i], kind: s.kind}
		if cs.ueMarch != nil {
			v.ueM = cs.ueMarch[i]
		}
		old[key{s.elem, s.side, s.node}] = v
		if s.first {
			firsts[[2]int{s.elem, s.side}] = v
		}
	}
	copy(cs.stag, newStag)
	cs.layout()
	for i := range cs.st {
		s := &cs.st[i]
		v, ok := old[key{s.elem, s.side, s.node}]
		if !ok {
			v = firsts[[2]int{s.elem, s.side}]
			if o, ok := old[key{s.elem, 1 - s.side, s.node}]; ok {
				v.ueM = o.ueM // the speed near the stagnation point, small either way
			}
		}
		if cs.ueMarch != nil {
			cs.ueMarch[i] = v.ueM
		}
		if s.side != sideWake {
			s.kind = v.kind
		}
		cs.c[i], cs.th[i], cs.m[i] = v.c, v.th, v.m
		if s.first {
			s.kind = bl.Laminar
			cs.c[i] = 0
		}
	}
	// A laminar station after a turbulent one is put right by retype.
	cs.retype()
}

// warmFrom starts from a neighbouring solution's state: its stagnation
// splits and variables; it reports false (and changes nothing) when the
// layouts differ (a wake of another length).
func (cs *coupledState) warmFrom(w *coupledState) bool {
	if len(w.st) != len(cs.st) {
		return false
	}
	copy(cs.stag, w.stag)
	copy(cs.sStag, w.sStag)
	cs.layout()
	for i := range cs.st {
		if cs.st[i].side != sideWake {
			cs.st[i].kind = w.st[i].kind
		}
		cs.c[i], cs.th[i], cs.m[i] = w.c[i], w.th[i], w.m[i]
	}
	cs.retype()
	return true
}
