package geometry

import (
	"errors"
	"fmt"
	"math"

	"sectionbench/model"
)

// Sentinel errors of the inward offset; match them with errors.Is through
// an *OffsetError.
var (
	// ErrOffsetFolds: the offset outline crosses itself away from the
	// trailing edge, where a radius of curvature or the local thickness is
	// smaller than the offset.
	ErrOffsetFolds = errors.New("offset outline folds over itself")
	// ErrOffsetCollapses: nothing, or more than one piece, is left: the
	// section is thinner than twice the offset over too much of its chord.
	ErrOffsetCollapses = errors.New("offset outline collapses")
)

// OffsetError reports where an inward offset failed: the element, the
// position along its chord (x/c) and the surface.
type OffsetError struct {
	Element  string
	XC       float64 // position along the chord, 0 at the leading edge
	Surface  string  // "upper", "lower" or "" when not one surface
	OffsetMM float64
	Err      error
}

func (e *OffsetError) Error() string {
	where := fmt.Sprintf("x/c %.3f", e.XC)
	if e.Surface != "" {
		where = e.Surface + " surface, " + where
	}
	return fmt.Sprintf("element %q: %.3g mm inward offset: %v (%s)", e.Element, e.OffsetMM, e.Err, where)
}

func (e *OffsetError) Unwrap() error { return e.Err }

// Offset is an inward offset of a closed outline.
type Offset struct {
	Points   []model.Point // closed loop, counter-clockwise, same unit as the input
	Distance float64       // the offset, same unit
	// TrimmedXC is the x/c at which the offset ends short of a sharp
	// trailing edge (where the section is thinner than twice the offset);
	// NaN when nothing was trimmed.
	TrimmedXC float64
	// LoopCutXC is the x/c of the first loop of reversed edges cut out of
	// the offset where a radius of curvature, usually the nose radius, is
	// below the offset (the rib's outline has a corner there rather than
	// following the skin at a constant distance); NaN when none was.
	LoopCutXC float64
}

// InwardOffset returns the closed polygon pts (counter-clockwise, the
// interior on the left; the last point joins the first; pts[0] the
// trailing edge) moved inwards by d > 0.
//
// Every edge moves d along its inward normal n = (−t_y, t_x), t the unit
// edge direction, and consecutive moved edges meet at the intersection of
// their lines (the mitre point), which for a convex polygon is the exact
// offset (Held, On the Computational Geometry of Pocket Machining, 1991,
// ch. 2). The trailing edge is not mitred. The outline is split into the
// upper surface U = pts[0..LE] (LE the point farthest from te), the lower
// surface L = pts[LE..N−1] and the closing edge pts[N−1] → pts[0] (an open
// trailing edge's base, or the last lower panel of a closed one). Each is
// offset as an open polyline, mitred at its interior vertices and moved
// along the plain normal of its end edges, and the pieces are cut where
// they cross next to the trailing edge (least arc length from it, in the
// aft half of each surface) and joined:
//
//   - A closing edge shorter than 2d holds no part of the offset once U
//     and L cross: the offset ends where they cross, at the centre of the
//     circle of radius d touching both surfaces, and TrimmedXC gives its
//     x/c. This is where a sharp trailing edge (closed, or open with a
//     thin base; cambered or not) is thinner than twice the offset: the
//     rib stops there. For a straight wedge of included angle τ the point
//     lies d/sin(τ/2) from the apex along the bisector, just ahead of where
//     the wedge is 2d thick (d/tan(τ/2) from the apex).
//   - Otherwise (a base at least 2d, a corner, a smooth closed curve) the
//     moved closing edge joins U and L, each end cut where it crosses
//     them: at a corner with long enough edges that is the mitre point,
//     and short panels next to the corner are cut away. Nothing is
//     trimmed: TrimmedXC is NaN, unless the loop so joined starts at a
//     point sharper than sharpEdgeMaxDeg (coarse panels along a sharp
//     trailing edge, whose closing edge is a long lower panel): the rib
//     ends there and TrimmedXC says where.
//   - Failing that, U and L are joined where they cross nearest the
//     trailing edge, and without any crossing the plain mitre offset
//     stands; the same sharpness rule sets TrimmedXC.
//
// The joined loop must not cross itself: a small loop next to a trimmed
// trailing edge (a curved tip whose offsets cross more than once, less
// than tipSliverFrac of the remaining area) is cut off too and moves
// TrimmedXC; any other crossing, or an offset edge pointing against its
// source edge, returns an *OffsetError wrapping ErrOffsetFolds (a radius of
// curvature or the thickness there is below the offset), and an offset
// that vanishes, turns inside out or splits into comparable parts wraps
// ErrOffsetCollapses. Both say where along the chord (le → te) it
// happened.
//
// element names the outline in errors. pts must hold at least 3 points.
func InwardOffset(element string, pts []model.Point, d float64, le, te model.Point) (*Offset, error) {
	if len(pts) < 3 || !(d > 0) {
		panic(fmt.Sprintf("geometry: InwardOffset of %d points by %g", len(pts), d))
	}
	chord := te.Sub(le)
	xcOf := func(p model.Point) float64 { return p.Sub(le).Dot(chord) / chord.Dot(chord) }
	fail := func(p model.Point, surface string, err error) error {
		return &OffsetError{Element: element, XC: xcOf(p), Surface: surface, OffsetMM: d, Err: err}
	}
	// Drop repeated points (a closed trailing edge repeats the first).
	in := make([]model.Point, 0, len(pts))
	for _, p := range pts {
		if len(in) == 0 || p.Dist(in[len(in)-1]) > 1e-12 {
			in = append(in, p)
		}
	}
	for len(in) > 1 && in[len(in)-1].Dist(in[0]) <= 1e-12 {
		in = in[:len(in)-1]
	}
	n := len(in)
	if n < 3 {
		panic("geometry: InwardOffset of a degenerate polygon")
	}
	// Raw mitre offset; raw[i] starts the moved edge i (in[i] → in[i+1]).
	raw := make([]model.Point, n)
	for i := range n {
		a, b, c := in[(i+n-1)%n], in[i], in[(i+1)%n]
		n1, n2 := inwardNormal(a, b), inwardNormal(b, c)
		p1, p2 := a.Add(n1.Scale(d)), b.Add(n2.Scale(d))
		q, ok := lineIntersect(p1, b.Sub(a), p2, c.Sub(b))
		if !ok { // collinear edges: the point moves along the normal
			q = b.Add(n1.Scale(d))
		}
		raw[i] = q
	}
	// The upper surface runs from the trailing edge to the leading edge
	// (the point farthest from te), the lower back.
	leIdx := 0
	for i, p := range in {
		if p.Sub(te).Norm() > in[leIdx].Sub(te).Norm() {
			leIdx = i
		}
	}
	if leIdx == 0 || leIdx == n-1 {
		leIdx = n / 2 // te given at a neighbour of pts[0]: split opposite
	}
	surface := func(i int) string {
		if i < leIdx {
			return "upper"
		}
		return "lower"
	}
	// up[k] is the offset of in[k] on the upper surface: up[0] the plain
	// normal offset of in[0], segment up[k]→up[k+1] the moved edge k.
	// lo[m] is the offset of in[leIdx+m]; its last point, the plain normal
	// offset of in[0] by the closing edge, ends moved edge n−1. loOpen is
	// lo without the closing edge, ending at the plain normal offset of
	// in[n−1] by edge n−2.
	up := make([]model.Point, leIdx+1)
	up[0] = in[0].Add(inwardNormal(in[0], in[1]).Scale(d))
	copy(up[1:], raw[1:leIdx+1])
	lo := make([]model.Point, n-leIdx+1)
	copy(lo, raw[leIdx:])
	lo[n-leIdx] = in[0].Add(inwardNormal(in[n-1], in[0]).Scale(d))
	loOpen := append([]model.Point(nil), lo[:n-leIdx]...)
	loOpen[n-leIdx-1] = in[n-1].Add(inwardNormal(in[n-2], in[n-1]).Scale(d))

	// cut joins up and l at their crossing x of segments i and j nearest
	// the trailing edge: x, up[i+1..leIdx], l[1..j], x starting moved
	// edge i. mitre reports that x joins the end edges of up and l.
	cut := func(l []model.Point) (loop []model.Point, owner []int, x model.Point, mitre, ok bool) {
		i, j, x, ok := tipCrossing(up, l)
		if !ok {
			return nil, nil, x, false, false
		}
		loop = append([]model.Point{x}, up[i+1:]...)
		loop = append(loop, l[1:j+1]...)
		owner = []int{i}
		for k := i + 1; k <= leIdx+j; k++ {
			owner = append(owner, k)
		}
		return loop, owner, x, i == 0 && j == len(l)-2, true
	}
	var (
		loop    []model.Point
		owner   []int
		trimmed = math.NaN()
	)
	// A closing edge shorter than 2d holds no part of the offset once the
	// surfaces' offsets cross: a circle of radius d touching it would
	// stick out past its ends. Otherwise the moved closing edge joins the
	// surfaces (see the doc comment for the order of the cases).
	ok := false
	if in[n-1].Dist(in[0]) < 2*d {
		var x model.Point
		if loop, owner, x, _, ok = cut(loOpen); ok {
			trimmed = xcOf(x)
		}
	}
	if !ok {
		loop, owner, ok = cutBase(up, loOpen, in[n-1], in[0], d, leIdx)
	}
	if !ok {
		loop, owner, _, _, ok = cut(lo)
	}
	if !ok {
		loop, owner = raw, make([]int, n)
		for i := range owner {
			owner[i] = i
		}
	}
	if math.IsNaN(trimmed) && sharpJoin(loop) {
		// Coarse panels: the surfaces' offsets meet at a sharp point on
		// the moved closing edge, or at its mitre with its neighbour.
		trimmed = xcOf(loop[0])
	}
	rounded, roundedXC := false, math.NaN()
	for iter := 0; ; iter++ {
		if iter > n {
			return nil, fail(le, "", ErrOffsetCollapses)
		}
		i, j, x, ok := firstCrossing(loop)
		if !ok {
			break
		}
		// Split at x into A = x, loop[i+1..j] and B = x, loop[j+1..],
		// loop[..i]; B holds loop[0], the end next to the trailing edge.
		a := append([]model.Point{x}, loop[i+1:j+1]...)
		ao := append([]int{owner[i]}, owner[i+1:j+1]...)
		b := append([]model.Point{x}, loop[j+1:]...)
		b = append(b, loop[:i+1]...)
		areaA, areaB := model.PolygonArea(a), model.PolygonArea(b)
		switch {
		case areaA > 0 && math.Abs(areaB) < tipSliverFrac*areaA && !math.IsNaN(trimmed):
			// A small loop beside the trimmed tip (a curved sharp edge
			// whose offsets cross again): cut it off too.
			loop, owner = a, ao
			trimmed = xcOf(x)
		case areaA < 0 && areaB > 0:
			// A swallowtail: where a radius of curvature (the nose) is
			// below the offset, the moved edges run backwards and close a
			// loop of reversed orientation. It lies closer than d to the
			// contour and is no part of the offset: cut it out, keeping
			// loop[0] first.
			keep := append(append([]model.Point(nil), loop[:i+1]...), x)
			keep = append(keep, loop[j+1:]...)
			ko := append(append([]int(nil), owner[:i+1]...), owner[j])
			ko = append(ko, owner[j+1:]...)
			loop, owner = keep, ko
			if !rounded {
				rounded = true
				roundedXC = xcOf(x)
			}
		case areaA > 0 && areaB > 0:
			return nil, fail(x, surface(owner[i]), fmt.Errorf("%w: it splits in two", ErrOffsetCollapses))
		case areaA <= 0 && areaB <= 0:
			return nil, fail(x, surface(owner[i]), ErrOffsetCollapses)
		default:
			return nil, fail(x, surface(owner[i]), fmt.Errorf("%w (a radius of curvature or the thickness there is below the offset)", ErrOffsetFolds))
		}
	}
	loop, owner = dropSpikes(loop, owner)
	if model.PolygonArea(loop) <= 0 {
		return nil, fail(le, "", ErrOffsetCollapses)
	}
	// Every remaining edge must keep the direction of the edge it came
	// from; a reversed edge without a crossing means the outline turned
	// inside out there.
	for k := range loop {
		i := owner[k]
		a, b := in[i], in[(i+1)%n]
		p, q := loop[k], loop[(k+1)%len(loop)]
		if owner[(k+1)%len(loop)] == (i+1)%n && q.Sub(p).Dot(b.Sub(a)) < 0 {
			return nil, fail(a, surface(i), fmt.Errorf("%w (a radius of curvature there is below the offset)", ErrOffsetFolds))
		}
	}
	return &Offset{Points: loop, Distance: d, TrimmedXC: trimmed, LoopCutXC: roundedXC}, nil
}

// cutBase joins the upper offset up (from the trailing edge, in[0], to the
// leading edge in[leIdx]) and the lower offset lo (from the leading edge to
// the plain normal offset of in[n−1]) through the closing edge p → q
// (p = in[n−1], q = in[0]) moved d inwards: up is cut where it crosses the
// moved edge nearest q, lo where it crosses it nearest p, and the moved
// edge keeps the part between. It fails when either crossing is missing
// or they come in the wrong order (the closing edge is used up). The loop
// starts at the crossing on up, which starts moved edge i; the last point
// starts moved edge n − 1, the closing edge.
func cutBase(up, lo []model.Point, p, q model.Point, d float64, leIdx int) ([]model.Point, []int, bool) {
	nb := inwardNormal(p, q).Scale(d)
	base := []model.Point{p.Add(nb), q.Add(nb)}
	i, _, x1, ok := tipCrossing(up, base)
	if !ok {
		return nil, nil, false
	}
	_, j, x2, ok := tipCrossing(base, lo)
	if !ok {
		return nil, nil, false
	}
	along := func(x model.Point) float64 { return x.Sub(base[0]).Dot(base[1].Sub(base[0])) }
	if !(along(x2) < along(x1)) {
		return nil, nil, false
	}
	loop := append([]model.Point{x1}, up[i+1:]...)
	loop = append(loop, lo[1:j+1]...)
	loop = append(loop, x2)
	owner := []int{i}
	for k := i + 1; k <= leIdx+j; k++ {
		owner = append(owner, k)
	}
	owner = append(owner, leIdx+len(lo)-1) // n − 1
	return loop, owner, true
}

// tipCrossing finds the crossing of the open polylines up (from the
// trailing edge to the leading edge) and lo (from the leading edge back)
// nearest the trailing edge: the one with the least sum of the arc length
// along up from up[0] and along lo to its last point, within the aft half
// of both. Segment i of up
// (up[i]→up[i+1]) crosses segment j of lo at x. The segments meeting at
// the shared leading-edge point are not compared.
func tipCrossing(up, lo []model.Point) (i, j int, x model.Point, ok bool) {
	su := make([]float64, len(up)) // arc length from up[0]
	for k := 1; k < len(up); k++ {
		su[k] = su[k-1] + up[k].Dist(up[k-1])
	}
	sl := make([]float64, len(lo)) // arc length to lo[last]
	for k := len(lo) - 2; k >= 0; k-- {
		sl[k] = sl[k+1] + lo[k].Dist(lo[k+1])
	}
	type box struct{ x0, x1, y0, y1 float64 }
	boxOf := func(a, b model.Point) box {
		return box{math.Min(a.X, b.X), math.Max(a.X, b.X), math.Min(a.Y, b.Y), math.Max(a.Y, b.Y)}
	}
	lb := make([]box, len(lo)-1)
	for m := range lb {
		lb[m] = boxOf(lo[m], lo[m+1])
	}
	// Only the aft half of each surface (by arc length) is searched: a
	// crossing ahead of it is no trailing-edge trim but a fold, left to
	// the checks of the joined loop.
	halfU, halfL := su[len(su)-1]/2, sl[0]/2
	best := math.Inf(1)
	for k := 0; k+1 < len(up); k++ {
		if su[k] >= best || su[k] >= halfU {
			break // every later crossing is farther along up
		}
		ub := boxOf(up[k], up[k+1])
		for m := len(lo) - 2; m >= 0; m-- {
			if su[k]+sl[m+1] >= best || sl[m+1] >= halfL {
				break
			}
			if k == len(up)-2 && m == 0 {
				continue // adjacent at the leading edge
			}
			if ub.x1 < lb[m].x0 || lb[m].x1 < ub.x0 || ub.y1 < lb[m].y0 || lb[m].y1 < ub.y0 {
				continue
			}
			if p, hit := segmentCross(up[k], up[k+1], lo[m], lo[m+1]); hit {
				if s := su[k] + up[k].Dist(p) + sl[m+1] + lo[m+1].Dist(p); s < best {
					best, i, j, x, ok = s, k, m, p, true
				}
			}
		}
	}
	return i, j, x, ok
}

// sharpEdgeMaxDeg is the largest angle, in degrees, between the upper and
// lower offsets where they meet at the start of the joined loop for the
// meeting point to count as the end of the rib short of a sharp trailing
// edge. Trailing-edge angles of wing sections lie well below it (5°–30°,
// common practice); the corners of a blunt base or a rectangle are 90°,
// and a smooth curve turns by little more than nothing.
const sharpEdgeMaxDeg = 60

// sharpJoin reports whether the closed loop meets itself at loop[0] at an
// angle below sharpEdgeMaxDeg: the included angle there is π less the
// turn from the incoming edge to the outgoing one.
func sharpJoin(loop []model.Point) bool {
	if len(loop) < 3 {
		return false
	}
	in := loop[0].Sub(loop[len(loop)-1])
	out := loop[1].Sub(loop[0])
	turn := math.Atan2(in.Cross(out), in.Dot(out))
	return math.Pi-math.Abs(turn) < sharpEdgeMaxDeg*math.Pi/180
}

// dropSpikes removes the points where the closed loop doubles back on
// itself along a line: a moved edge shorter than zero between two parallel
// neighbours (an edge shorter than the offset next to a corner, followed
// by one in line with it) leaves a spike of no area that no crossing
// reveals. owner[k] stays with the point that starts each remaining edge.
func dropSpikes(loop []model.Point, owner []int) ([]model.Point, []int) {
	for changed := true; changed && len(loop) > 3; {
		changed = false
		for k := 0; k < len(loop) && len(loop) > 3; k++ {
			n := len(loop)
			p, q, r := loop[(k+n-1)%n], loop[k], loop[(k+1)%n]
			a, b := q.Sub(p), r.Sub(q)
			if math.Abs(a.Cross(b)) <= 1e-9*a.Norm()*b.Norm() && a.Dot(b) < 0 {
				loop = append(loop[:k:k], loop[k+1:]...)
				owner = append(owner[:k:k], owner[k+1:]...)
				changed = true
			}
		}
	}
	return loop, owner
}

// tipSliverFrac bounds the area, relative to the rest of the offset, of a
// loop at the trailing edge that InwardOffset cuts off as part of the
// trimmed tip rather than reporting the offset as split in two: a tip
// thinner than twice the skin holds a sliver of the section's area, while a
// real split (a thin waist mid-chord) leaves two parts of similar size.
const tipSliverFrac = 0.02

// inwardNormal is the unit left normal of edge a→b: inwards for a
// counter-clockwise polygon.
func inwardNormal(a, b model.Point) model.Point {
	t := b.Sub(a)
	l := t.Norm()
	return model.Point{X: -t.Y / l, Y: t.X / l}
}

// lineIntersect intersects the lines p + s·u and q + t·v.
func lineIntersect(p, u, q, v model.Point) (model.Point, bool) {
	den := u.Cross(v)
	if math.Abs(den) <= 1e-12*u.Norm()*v.Norm() {
		return model.Point{}, false
	}
	s := q.Sub(p).Cross(v) / den
	return p.Add(u.Scale(s)), true
}

// segmentCross returns the crossing of segments a→b and c→d, excluding
// touching at their ends.
func segmentCross(a, b, c, d model.Point) (model.Point, bool) {
	r, s := b.Sub(a), d.Sub(c)
	den := r.Cross(s)
	if den == 0 {
		return model.Point{}, false
	}
	ca := c.Sub(a)
	t := ca.Cross(s) / den
	u := ca.Cross(r) / den
	const eps = 1e-12
	if t <= eps || t >= 1-eps || u <= eps || u >= 1-eps {
		return model.Point{}, false
	}
	return a.Add(r.Scale(t)), true
}

// firstCrossing finds the first pair of non-adjacent edges i < j of the
// closed polygon loop (edge k joins loop[k] and loop[k+1]) that cross.
// Bounding boxes prune the O(n²) search.
func firstCrossing(loop []model.Point) (i, j int, x model.Point, ok bool) {
	n := len(loop)
	bb := make([]model.Box, n)
	for k := range n {
		bb[k] = model.BoxOf(loop[k], loop[(k+1)%n])
	}
	for i := 0; i < n; i++ {
		for j := i + 2; j < n; j++ {
			if i == 0 && j == n-1 {
				continue // adjacent through the closing edge
			}
			if !bb[i].Overlaps(bb[j]) {
				continue
			}
			if x, ok := segmentCross(loop[i], loop[(i+1)%n], loop[j], loop[(j+1)%n]); ok {
				return i, j, x, true
			}
		}
	}
	return 0, 0, model.Point{}, false
}
