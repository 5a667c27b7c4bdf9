package solver

import (
	"math"

	"sectionbench/model"
	bl "sectionbench/solver/boundarylayer"
)

// result turns the state into a CoupledSolution: stations, transition and
// separation per surface, forces from the viscous surface pressures and
// drag from each wake's end (Squire–Young).
func (cs *coupledState) result() *CoupledSolution {
	sol := cs.sol
	geo := cs.geo
	ue, ul := cs.ue(), cs.ueLayers()
	c, sn := sol.cosA, sol.sinA
	out := &CoupledSolution{
		AlphaDeg:   sol.AlphaDeg,
		ClInviscid: sol.ClPressure,
		CmInviscid: sol.Cm,
		Inviscid:   sol,
		state:      cs,
	}
	var fxT, fyT, mT, dT float64
	for k := range geo.elems {
		e := &geo.elems[k]
		ce := CoupledElement{Name: e.name, Chord: e.chord, ClInviscid: sol.Elements[k].ClPressure}
		// Edge velocity per node (Vt = −γ along the node order).
		cp := make([]float64, e.np+1)
		for i := cs.base[k]; i < cs.base[k]+e.np+1; i++ {
			u := ue[i]
			cp[cs.st[i].node] = 1 - u*u
		}
		var fx, fy, m float64
		for i := 0; i < e.np; i++ {
			p := &geo.panels[e.p0+i]
			cpm := 0.5 * (cp[i] + cp[i+1])
			dfx, dfy := -cpm*p.nx*p.l, -cpm*p.ny*p.l
			fx += dfx
			fy += dfy
			m += (p.mx-e.qc.X)*dfy - (p.my-e.qc.Y)*dfx
			mT += (p.mx-geo.mref.X)*dfy - (p.my-geo.mref.Y)*dfx
		}
		fxT += fx
		fyT += fy
		ce.Cl = (-fx*sn + fy*c) / e.chord
		ce.Cm = -m / (e.chord * e.chord)
		ce.Upper = cs.surface(k, sideUpper, ue, ul)
		ce.Lower = cs.surface(k, sideLower, ue, ul)
		ce.Wake = cs.surface(k, sideWake, ue, ul)
		last := cs.base[k] + e.np + len(cs.wakes[k].nodes)
		drag := bl.SquireYoung(cs.stationOf(last, math.Max(ue[last], 1e-6)))
		ce.Cd = drag / e.chord
		dT += drag
		out.Elements = append(out.Elements, ce)
	}
	out.Cl = (-fxT*sn + fyT*c) / geo.refChord
	out.Cm = -mT / (geo.refChord * geo.refChord)
	out.Cd = dT / geo.refChord
	return out
}

// surface returns one side of element k: each station's edge velocity and
// Cp from the coupled edge velocities ue, its layer (δ*, H, Cf) on the
// speeds its equations use, ul (ueLayers). The two differ at the stations
// next to a stagnation point that moved by a panel or two from the
// layout: their layers take the speed of a station further on, scaled
// (ueLayers), while the coupled speed there is near zero or even
// reversed; δ* = m/Ue on the latter read 3 to 27 chords there (the
// two-element example at 3°).
func (cs *coupledState) surface(k, side int, ue, ul []float64) CoupledSurface {
	e := &cs.geo.elems[k]
	sf := CoupledSurface{Transition: math.NaN(), Separation: math.NaN()}
	var pos []model.Point
	if side == sideWake {
		pos = cs.wakes[k].nodes
	}
	for i := range cs.st {
		s := &cs.st[i]
		if s.elem != k || s.side != side {
			continue
		}
		u := math.Max(ul[i], 1e-6)
		st := cs.stationOf(i, u)
		cl := bl.Eval(s.kind, st, cs.re)
		p := model.Point{}
		if side == sideWake {
			p = pos[s.node]
		} else {
			p = e.nodes[s.node]
		}
		o := CoupledStation{
			Xi: s.xi / e.chord, XC: s.xc, X: p.X, Y: p.Y, Ue: ue[i], Cp: 1 - ue[i]*ue[i],
			Theta: st.Theta / e.chord, DStar: st.DStar / e.chord, H: cl.H, Cf: cl.Cf, Regime: s.kind,
			Reverse: cl.Cf < 0,
		}
		if s.kind == bl.Laminar {
			o.N = cs.c[i]
		} else {
			o.N = cs.ncrit
			o.CTau = cs.c[i] * cs.c[i]
		}
		if side != sideWake && !s.first && s.kind == bl.Turbulent && cs.st[s.prev[0]].kind == bl.Laminar {
			trip := s.tripXi
			if s.last {
				trip = math.Min(trip, s.xi)
			}
			pp := s.prev[0]
			_, xt := bl.TransitionInterval(cs.stationOf(pp, math.Max(ue[pp], 1e-6)), st, cs.re, cs.ncrit, trip)
			f := (xt - cs.st[pp].xi) / (s.xi - cs.st[pp].xi)
			if !s.last || xt < s.xi {
				sf.Transition = cs.st[pp].xc + f*(s.xc-cs.st[pp].xc)
			}
			sf.Tripped = xt >= s.tripXi*(1-1e-9)
			sf.TransitionHeld = cs.heldAt(i, cs.ueLayers())
		}
		sf.Stations = append(sf.Stations, o)
	}
	if side == sideWake {
		return sf
	}
	st := sf.Stations
	// Trailing-edge separation: the reversed run that reaches the last
	// station; a reversed run that ends before it that began laminar is a
	// bubble.
	n := len(st)
	if n > 1 && st[n-1].Cf < 0 {
		j := n - 1
		for j > 0 && st[j-1].Cf < 0 {
			j--
		}
		sf.Separation = st[j].XC
		if j > 0 {
			f := st[j-1].Cf / (st[j-1].Cf - st[j].Cf)
			sf.Separation = st[j-1].XC + f*(st[j].XC-st[j-1].XC)
		}
	}
	for j := 1; j < n; j++ {
		if st[j].Cf < 0 && st[j-1].Cf >= 0 && st[j-1].Regime == bl.Laminar {
			end := j
			for end < n && st[end].Cf < 0 {
				end++
			}
			if end < n {
				sf.HasBubble = true
				sf.Bubble = [2]float64{st[j].XC, st[end].XC}
			}
			break
		}
	}
	return sf
}
