package solver

import (
	"fmt"
	"math"

	bl "sectionbench/solver/boundarylayer"
)

// branchJump returns, in words, where a surface layer of s jumps between
// the separated and the attached branch of its shape equation, or ""
// where none does.
//
// The shape equation carries a layer through its kinetic-energy shape
// factor H*, which is least at H0 (boundarylayer.ShapeMinimum): every H*
// above the least belongs to two shape factors, an attached one below H0
// and a separated one above. Written for H* (boundarylayer.Interval),
//
//	d ln H*/dξ = (2CD/H* − Cf/2)/θ + (H − 1) d ln Ue/dξ,
//
// where the dissipation term is positive at every H above H0 (Cf/2 is
// near zero or negative there, far below 2CD/H*), so where the edge speed
// does not fall H* grows along a layer above H0: its H moves further from
// H0 and cannot come back below it, which only a falling speed (an
// adverse pressure gradient strong enough to make H* fall: the recovery
// behind a laminar bubble, where turbulent layers do reattach) allows. The
// discrete equations fix only H*, θ and the speeds of two stations, so
// beside the layer that stays separated they have a mirror state whose
// next station takes the attached shape factor of the same H*, and over
// an interval much shorter than the layer the dissipation term adds
// almost nothing to tell them apart. Such a jump is rejected: a station
// above H0 followed, within less than the layer's momentum thickness θ,
// by one below it, of the same regime, at an edge speed that does not
// fall. Within θ the integral equations resolve no change of state at
// all (they rest on the boundary-layer approximation, a layer that
// changes slowly over its own thickness δ, several θ; common practice);
// that is where the trailing edge's clustered panels put stations, and
// where the jumps were found. Over longer intervals the check is not
// made: the two-element example in ground effect, tripped, at 8° and
// 100 mm (TestCoupledTwoElementGround) converges on a solution whose
// main element's laminar bubble near the slot reattaches from H 4.02 to
// 3.35 over 12 θ as the slot accelerates the flow, which the same
// argument would reject; that root was not judged here.
//
// Measured on kt:-0.1,0.1,10 at Re 1e6 (free transition, 160 panels),
// the upper layer, separated with H 3.9–4.1 and Cf < 0 up to x/c
// 0.9985–0.9996, took H 2.3 at the next station, 0.0004–0.0011 chord on
// (0.06–0.14 of its θ), at the same edge speed (the closed edge's last
// stations take the speed of a node ahead, coupled_interior.go): its δ*
// fell by 40 % there, the wake started thin, and the lift came out above
// the root that stays separated (9°: 1.498 against 1.390; 15°: 1.855
// against 1.523), with no separation reported; a sweep hopped between
// the two and took its maximum lift from the jump.
//
// The same argument forbids the opposite crossing, an attached layer
// taking the separated shape factor of its H*: below H0, where the speed
// does not fall, H* grows too, so H moves down, away from H0, and the
// layer can only reach the separated branch through H*'s minimum, which
// needs H* to fall, that is a falling speed (the adverse gradient that
// separates real layers). The argument needs the dissipation term
// positive at H0, which holds with Cf near zero there (laminar Cf < 0 at
// H 4; a turbulent layer's 2CD/H* comes from its shear stress, Cτ of
// order 1e-3, against a Cf of order 1e-4). Measured on the two-element
// example in ground effect (tripped at 5 % on every surface, 45 mm,
// 3.5°): the main element's pressure-side layer had H 2.95 at x/c
// 0.9964 and 3.98 at 0.9983, at one edge speed (0.575), 0.43 θ on, and
// stayed separated over the last stations; its δ* at the edge, 0.018
// chord against 0.001 on the neighbours' root, acted as a flap on the
// trailing edge, and the map's point came out at Cl −5.899 between
// −5.185 (3°) and −5.683 (4°); the single solve at 45 mm and 3° landed on
// such a root too (−5.659).
func branchJump(s *CoupledSolution) string {
	if s.state == nil {
		return ""
	}
	re := s.state.re
	for _, e := range s.Elements {
		for _, side := range []struct {
			name string
			sf   *CoupledSurface
		}{{"upper", &e.Upper}, {"lower", &e.Lower}} {
			st := side.sf.Stations
			for j := 1; j < len(st); j++ {
				a, b := &st[j-1], &st[j]
				if a.Regime != b.Regime || a.Regime == bl.Wake || math.Abs(b.Ue) < math.Abs(a.Ue) || b.Xi-a.Xi >= b.Theta {
					continue
				}
				// Reθ (Theta is on the element's chord).
				ra := re * math.Abs(a.Ue) * a.Theta * e.Chord
				rb := re * math.Abs(b.Ue) * b.Theta * e.Chord
				h0a, h0b := bl.ShapeMinimum(a.Regime, ra), bl.ShapeMinimum(b.Regime, rb)
				from, to := "", ""
				switch {
				case a.H > h0a && b.H < h0b:
					from, to = "separated", "attached"
				case a.H < h0a && b.H > h0b:
					from, to = "attached", "separated"
				default:
					continue
				}
				return fmt.Sprintf("the %s layer on the %s surface of %s goes from %s (H %.2f) to %s (H %.2f) at x/c %.4f with an edge speed that does not fall, which the boundary-layer equations forbid (the two states share one H*): a spurious solution",
					b.Regime, side.name, e.Name, from, a.H, to, b.H, b.XC)
			}
		}
	}
	return ""
}
