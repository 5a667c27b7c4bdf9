package model

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
)

// CleanOptions controls Clean.
type CleanOptions struct {
	// Derotate turns the section so that the chord (leading edge to
	// trailing-edge midpoint) lies along +x.
	Derotate bool
	// CloseTE closes a blunt trailing edge: both trailing-edge points move
	// to their midpoint and the surfaces are blended into them over the
	// last TECloseBlend of the chord.
	CloseTE bool
	// DuplicateTol is the distance, relative to the section's size, below
	// which a point repeats the previous one; 0 means DefaultDuplicateTol.
	// The size is the larger side of the bounding box of the input, which
	// is the chord to within the cosine of the section's incidence.
	DuplicateTol float64
	// Lines optionally holds the file line of each input point
	// (Parsed.Lines): the report then names the points it drops or finds
	// by their lines too, which a user can find in the file.
	Lines []int
}

// DefaultCleanOptions derotates and leaves the trailing edge as it is.
var DefaultCleanOptions = CleanOptions{Derotate: true}

// Cleaning thresholds. They are engineering choices of this package
// (common practice in preparing coordinates for panel methods, not values
// from a published source); each warning message states the value used.
const (
	// DefaultDuplicateTol: 1e-7 of the chord is far below the 5 or 6
	// decimals coordinate files carry, so only true repeats are dropped.
	DefaultDuplicateTol = 1e-7
	// FileFrameTol and FileChordTol: a file gives its own chord when a
	// listed point lies at its origin and its trailing-edge midpoint on its
	// +x axis, both to within FileFrameTol of the chord (rounding of a
	// file printed to 3 decimals in millimetres or 5 in chords), and that
	// point lies within FileChordTol of the spline's leading edge. Clean
	// then keeps that chord line: published coordinates define it (for the
	// NACA sections, from the nose of the mean line, Abbott & von
	// Doenhoff, sec. 6.4), and the farthest point of a cambered section
	// differs from it by a fraction of a degree, which would shift every
	// angle of attack by as much.
	FileFrameTol = 1e-5
	FileChordTol = 0.01
	// LESnapTol: when the listed point nearest to the leading edge found on
	// the spline is within this distance (chord fractions), it is taken as
	// the leading edge, which makes cleaning a clean section change
	// nothing; farther, the spline's point is inserted as a new point.
	LESnapTol = 1e-5
	// TECloseBlend: the fraction of the chord over which CloseTE blends
	// the surfaces into the closed trailing edge, with the smoothstep
	// weight w = 3s² − 2s³ (zero slope change where the blend starts).
	TECloseBlend = 0.05
	// MaxCloseTEGap: CloseTE leaves a gap wider than this fraction of the
	// chord open (and says so): closing it would reshape, not tidy, the
	// section.
	MaxCloseTEGap = 0.1
	// KinkAngleDeg and KinkContrast: a turning between consecutive
	// segments is a kink when it exceeds KinkAngleDeg and KinkContrast
	// times the turning in the same direction at both neighbouring points
	// (a slope discontinuity or a zigzag, not a tight but smooth curve,
	// whose neighbours turn alike). The leading-edge point and its two
	// neighbours are exempt (a sparse nose turns sharply there; see
	// SparseNoseChord), as is the trailing edge.
	KinkAngleDeg = 20.0
	KinkContrast = 2.0
	// SpikeRatio: a point is a spike when it lies farther from the line
	// through its two neighbours than SpikeRatio times their distance: a
	// smooth curve gives about h·κ/8, a kink at most a quarter.
	SpikeRatio = 1.0
	// SparseNoseChord and MinNosePoints: fewer than MinNosePoints points
	// within SparseNoseChord of the leading edge (in x) leave the suction
	// peak unresolved, whatever the repanelling does.
	SparseNoseChord = 0.02
	MinNosePoints   = 5
	// BluntTEGap: a trailing-edge gap above this fraction of the chord is
	// very blunt; panel methods then need the base modelled explicitly.
	BluntTEGap = 0.02
	// MaxWarningsPerKind bounds the warnings of one kind; the rest are
	// counted in one last warning.
	MaxWarningsPerKind = 10
)

// Thresholds of the trailing-edge search (internal; see findTE).
const (
	// teSearchFrac: the trailing edge is searched within this distance
	// (fraction of the size) of the two ends of the section.
	teSearchFrac = 0.1
	// bluntCornerDeg: each corner of a blunt trailing edge turns by at
	// least this much (a square base turns by about 90° at each).
	bluntCornerDeg = 30.0
	// baseStraightDeg and baseStraightness: points drawn along a blunt
	// trailing edge's base (as CAD exports list them) turn by at most
	// baseStraightDeg each, and the run from corner to corner is at most
	// baseStraightness times the straight distance: a nearly straight
	// run, not a rounded end.
	baseStraightDeg  = 10.0
	baseStraightness = 1.05
	maxBaseRunPoints = 50
	// teContrast: a trailing edge turns at least this many times more than
	// the median point of the contour; below it (and below bluntCornerDeg)
	// no corner stands out and the choice is reported as arbitrary.
	teContrast = 3.0
	// smoothMaxDeg: a corner turning by more than this is a trailing edge
	// however coarse the rest of the contour (a sparse file).
	smoothMaxDeg = 90.0
	// startPreference: the file's own start is kept as the trailing edge
	// when its sharpness is at least this fraction of the best candidate's.
	startPreference = 0.8
	// maxClosingGap: a gap between the last and the first point larger than
	// this fraction of the size means an open line, not a section.
	maxClosingGap = 0.25
	// flatAreaFrac: a contour enclosing less than this fraction of its
	// squared size has no thickness.
	flatAreaFrac = 1e-9
	// monotoneTol and crossingTol: chord fractions below which a reversal
	// of x or an overlap of the surfaces is rounding, not data.
	monotoneTol = 1e-7
	crossingTol = 1e-9
	// noseCurlXC: ahead of this chord fraction x may rise towards the
	// leading edge. A cambered section kept on its published chord curls
	// slightly ahead of the leading edge on the upper surface: the upper
	// surface lies at x − y_t sin θ (Abbott & von Doenhoff, Theory of Wing
	// Sections, 1959, eq. 6.1), about −0.0005 c at its foremost for the
	// NACA 23012 and less for the 4- and 6-digit families, so that is no
	// fault of the file.
	noseCurlXC = 0.002
	// reportTol: relative changes smaller than this are not reported.
	reportTol = 1e-9
)

// Sentinel errors of Clean, wrapped by *ContourError.
var (
	ErrAllPointsEqual = errors.New("all points are equal")
	ErrOpenContour    = errors.New("open contour: the points do not form a closed section")
	ErrFlatContour    = errors.New("the contour encloses no area")
	ErrSeveralLoops   = errors.New("several closed loops in one section")
	ErrOutlier        = errors.New("an outlier point")
)

// ContourError reports a contour Clean cannot turn into a section.
type ContourError struct {
	Name  string
	Index int // zero-based input point, or -1
	Err   error
}

func (e *ContourError) Error() string {
	if e.Index >= 0 {
		return fmt.Sprintf("section %q: point %d: %v", e.Name, e.Index+1, e.Err)
	}
	return fmt.Sprintf("section %q: %v", e.Name, e.Err)
}

func (e *ContourError) Unwrap() error { return e.Err }

// WarningKind classifies a CleanWarning.
type WarningKind string

// The warning kinds.
const (
	WarnKink        WarningKind = "kink"
	WarnCrossing    WarningKind = "crossing"
	WarnNonMonotone WarningKind = "non-monotone"
	WarnSparseNose  WarningKind = "sparse-nose"
	WarnBluntTE     WarningKind = "blunt-te"
	WarnSpike       WarningKind = "spike"
	WarnInclined    WarningKind = "inclined" // chord left inclined (Derotate off)
	WarnNoTE        WarningKind = "no-trailing-edge"
)

// CleanWarning is something suspicious Clean found and did not fix.
type CleanWarning struct {
	Kind    WarningKind
	Index   int     // zero-based point of the cleaned section, -1 if none
	X       float64 // x/c of the point along the chord of the cleaned section
	Message string
}

// CleanReport says what Clean found and did.
type CleanReport struct {
	Source   string   // where the points came from (set by Parsed.Clean)
	Name     string   // the section's name
	Detected []string // the parser's notes (added by Parsed.Clean), then where the edges were found
	Changes  []string // every change made, in order
	Warnings []CleanWarning
	TEGap    float64 // trailing-edge gap in chords, after normalising, before CloseTE
	// InputPoints and OutputPoints count the points given and returned.
	InputPoints, OutputPoints int
}

// String returns the report as readable lines.
func (r *CleanReport) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "Section %q", r.Name)
	if r.Source != "" {
		fmt.Fprintf(&b, " from %s", r.Source)
	}
	fmt.Fprintf(&b, ": %d points in, %d out\n", r.InputPoints, r.OutputPoints)
	list := func(title string, items []string) {
		fmt.Fprintf(&b, "%s:", title)
		if len(items) == 0 {
			b.WriteString(" none\n")
			return
		}
		b.WriteString("\n")
		for _, s := range items {
			fmt.Fprintf(&b, "  - %s\n", s)
		}
	}
	if len(r.Detected) > 0 {
		list("Detected", r.Detected)
	}
	list("Changes", r.Changes)
	var ws []string
	for _, w := range r.Warnings {
		ws = append(ws, fmt.Sprintf("%s: %s", w.Kind, w.Message))
	}
	list("Warnings", ws)
	fmt.Fprintf(&b, "Trailing-edge gap: %.4g%% of the chord\n", 100*r.TEGap)
	return b.String()
}

// Clean brings a contour into the package convention and reports every
// change. In order, it:
//
//  1. drops points that repeat the previous one to within DuplicateTol
//     (dropDuplicates);
//  2. finds the trailing edge (findTE): a sharp corner or the gap between
//     two corners at one end of the section, preferring the file's own
//     start, and starts the contour there (a loop may start anywhere;
//     startAtTrailingEdge);
//  3. makes the contour run counter-clockwise: trailing edge, upper
//     surface, leading edge, lower surface, trailing edge (orient);
//  4. finds the leading edge on a spline through the points
//     (ContourSpline.LeadingEdge: the point farthest from the
//     trailing-edge midpoint); a listed point within LESnapTol of it is
//     taken as the leading edge, else the spline's point is inserted; but
//     a file that gives its own chord keeps it (see FileFrameTol;
//     findLeadingEdge);
//  5. moves the leading edge to the origin, scales the chord to 1 and,
//     with Derotate, turns the trailing-edge midpoint onto (1, 0)
//     (normalise);
//  6. with CloseTE, closes the trailing-edge gap (see TECloseBlend;
//     closeTrailingEdge).
//
// Before step 1 the points are checked and moved into a box of size 1
// (prenormalise), and an outlier or several closed loops are refused
// (step 0, checkOutlierAndLoops).
//
// Steps 5 and 6 and the warnings work along the chord whether or not
// Derotate is set; without it the result is turned back to the input's
// chord angle at the end (and a WarnInclined warning states the angle).
// The trailing-edge search compares how sharply the contour turns near its
// two ends (findTE); it is a heuristic, and the report always says where
// the contour was started when that is not where the input started.
//
// It then warns, without changing anything, of kinks, spikes, crossing
// surfaces, x running backwards along a surface, a sparse nose and a very
// blunt trailing edge (see the constants for the thresholds). Warning
// indexes refer to the cleaned section's points.
//
// Errors are *ContourError wrapping ErrAllPointsEqual, ErrOpenContour,
// ErrFlatContour, ErrTooFewPoints or ErrNonFinite, or a *FieldError for a
// bad option. The report is returned even with an error, holding what was
// found so far.
func Clean(name string, pts []Point, opt CleanOptions) (*Section, *CleanReport, error) {
	c := &cleaner{name: name, pts: pts, opt: opt, rep: &CleanReport{Name: name, InputPoints: len(pts)}}
	q, err := c.prenormalise()
	if err != nil {
		return nil, c.rep, err
	}
	if err := c.checkOutlierAndLoops(q); err != nil { // 0.
		return nil, c.rep, err
	}
	ring, orig, closed, err := c.dropDuplicates(q) // 1.
	if err != nil {
		return nil, c.rep, err
	}
	cont, idx := c.startAtTrailingEdge(ring, orig, closed) // 2.
	c.orient(cont, idx)                                    // 3.
	ed, err := c.findLeadingEdge(cont, idx)                // 4.
	if err != nil {
		return nil, c.rep, err
	}
	out, theta := c.normalise(ed)                 // 5.
	closeTE := c.closeTrailingEdge(out, ed.leIdx) // 6.

	c.rep.Warnings = append(c.rep.Warnings, sectionWarnings(out, ed.leIdx, c.rep.TEGap, closeTE)...)
	if !opt.Derotate {
		for i, p := range out {
			out[i] = p.Rotate(Point{}, theta)
		}
	}
	sec, err := NewSection(name, out)
	if err != nil {
		return nil, c.rep, c.fail(-1, err)
	}
	c.rep.OutputPoints = sec.Len()
	return sec, c.rep, nil
}

// cleaner holds what Clean's steps share: the input, the options, the
// report being written and the pre-normalisation q = (p − ctr)/(2·half).
type cleaner struct {
	name string
	pts  []Point
	opt  CleanOptions
	rep  *CleanReport
	tol  float64 // duplicate tolerance, a fraction of the size
	ctr  Point
	half float64
}

// fail returns the *ContourError for the input point idx (−1 for none).
func (c *cleaner) fail(idx int, err error) error {
	return &ContourError{Name: c.name, Index: idx, Err: err}
}

// toOrig undoes the pre-normalisation: p·2·half + ctr.
func (c *cleaner) toOrig(p Point) Point { return toOrigPoint(p, c.ctr, c.half) }

// prenormalise checks the options and the points, and returns the points
// moved into a box of size 1 about its centre, so that every tolerance of
// the steps is a fraction of the size and huge or tiny units neither
// overflow nor underflow: q = (p − c)/size.
func (c *cleaner) prenormalise() ([]Point, error) {
	c.tol = c.opt.DuplicateTol
	if c.tol == 0 {
		c.tol = DefaultDuplicateTol
	}
	if !(c.tol > 0 && c.tol <= 1e-3) {
		return nil, &FieldError{Field: "clean.duplicate_tol", Err: fmt.Errorf("%g is outside (0, 1e-3]", c.opt.DuplicateTol)}
	}
	if len(c.pts) == 0 {
		return nil, c.fail(-1, fmt.Errorf("no points: %w", ErrTooFewPoints))
	}
	for i, p := range c.pts {
		if !p.IsFinite() {
			return nil, c.fail(i, ErrNonFinite)
		}
	}
	box := BoxOf(c.pts...)
	lo, hi := box.Min, box.Max
	c.ctr = Point{lo.X/2 + hi.X/2, lo.Y/2 + hi.Y/2}
	c.half = math.Max(hi.X/2-lo.X/2, hi.Y/2-lo.Y/2)
	if !(c.half > 1e-14*math.Max(math.Abs(c.ctr.X), math.Abs(c.ctr.Y))) {
		return nil, c.fail(-1, fmt.Errorf("all %d points are equal: %w", len(c.pts), ErrAllPointsEqual))
	}
	q := make([]Point, len(c.pts))
	for i, p := range c.pts {
		q[i] = Point{(p.X - c.ctr.X) / c.half / 2, (p.Y - c.ctr.Y) / c.half / 2}
	}
	return q, nil
}

// checkOutlierAndLoops is step 0. An outlier, far from both its
// neighbours while they lie close together (a typing error), would hijack
// the leading edge (the farthest point from the trailing edge) and turn
// the section. Several loops: the list comes back to its first point and
// goes on (a main plane and a flap drawn in one file).
func (c *cleaner) checkOutlierAndLoops(q []Point) error {
	if i, far, gap := outlierPoint(q); i >= 0 {
		return c.fail(i, fmt.Errorf("(%s) lies %.3g of the section's size from its neighbours, which are %.3g apart: %w, perhaps a typing error; correct or delete it",
			fmtPoint(c.pts[i]), far, gap, ErrOutlier))
	}
	if loops := closedLoops(q, c.tol); len(loops) > 1 {
		var parts []string
		for k, from := range loops {
			to := len(q)
			if k+1 < len(loops) {
				to = loops[k+1]
			}
			parts = append(parts, fmt.Sprintf("points %d–%d", from+1, to))
		}
		return c.fail(loops[1], fmt.Errorf("the points close a loop and go on: %d closed loops (%s), as when a main plane and a flap are drawn in one file; one section is one loop, so give each loop its own file and load it as its own element: %w",
			len(loops), strings.Join(parts, ", "), ErrSeveralLoops))
	}
	return nil
}

// dropDuplicates is step 1: it drops points that repeat the previous one
// to within the tolerance (and a last point repeating the first, then
// closed is true) and returns the remaining ring with each point's input
// index. It fails on too few points, an open line or a flat one.
func (c *cleaner) dropDuplicates(q []Point) (ring []Point, orig []int, closed bool, err error) {
	ring = make([]Point, 0, len(q))
	orig = make([]int, 0, len(q))
	var dropped []int
	for i, p := range q {
		if len(ring) > 0 && p.Dist(ring[len(ring)-1]) <= c.tol {
			dropped = append(dropped, i)
			continue
		}
		ring = append(ring, p)
		orig = append(orig, i)
	}
	if len(ring) > 2 && ring[len(ring)-1].Dist(ring[0]) <= c.tol {
		closed = true
		ring, orig = ring[:len(ring)-1], orig[:len(orig)-1]
	}
	if len(dropped) > 0 {
		c.rep.Changes = append(c.rep.Changes, fmt.Sprintf("dropped %d duplicate %s (within %g of the size of the previous point): %s",
			len(dropped), plural(len(dropped), "point", "points"), c.tol, pointList(dropped)+c.lineList(dropped)))
	}
	if len(ring) < MinSectionPoints-1 {
		return nil, nil, false, c.fail(-1, fmt.Errorf("only %d distinct points: %w", len(ring), ErrTooFewPoints))
	}
	if !closed {
		if g := ring[len(ring)-1].Dist(ring[0]); g > maxClosingGap {
			return nil, nil, false, c.fail(-1, fmt.Errorf("the first and last points are %.0f%% of the section's size apart, so the line does not close around a section (a single surface, or two surfaces not joined?): %w", 100*g, ErrOpenContour))
		}
	}
	if a := PolygonArea(ring); math.Abs(a) < flatAreaFrac {
		return nil, nil, false, c.fail(-1, fmt.Errorf("the points lie on a line: %w", ErrFlatContour))
	}
	return ring, orig, closed, nil
}

// startAtTrailingEdge is step 2: it finds the trailing edge (findTE) and
// returns the contour started there, with each point's input index.
func (c *cleaner) startAtTrailingEdge(ring []Point, orig []int, closed bool) (cont []Point, idx []int) {
	rep, pts := c.rep, c.pts
	te := findTE(ring, closed)
	n := len(ring)
	if te.edge {
		for k := range n - te.base {
			j := (te.other(n) + k) % n
			cont = append(cont, ring[j])
			idx = append(idx, orig[j])
		}
	} else {
		for k := range n + 1 {
			j := (te.i + k) % n
			cont = append(cont, ring[j])
			idx = append(idx, orig[j])
		}
	}
	switch {
	case te.edge && te.base > 0:
		j := te.other(n)
		var onBase []int
		for m := 1; m <= te.base; m++ {
			onBase = append(onBase, orig[(te.i+m)%n])
		}
		mid := c.toOrig(ring[te.i].Add(ring[j]).Scale(0.5))
		rep.Detected = append(rep.Detected, fmt.Sprintf("trailing edge: a blunt base drawn from point %d to point %d with %d %s on it (corners turning by %.0f° together)", orig[te.i]+1, orig[j]+1, te.base, plural(te.base, "point", "points"), te.score))
		rep.Changes = append(rep.Changes, fmt.Sprintf("dropped %s, drawn along the trailing-edge base, and took the base's midpoint (%s) as the trailing edge; the base is left open as a blunt trailing edge", pointList(onBase), fmtPoint(mid)))
	case te.edge:
		j := (te.i + 1) % n
		rep.Detected = append(rep.Detected, fmt.Sprintf("trailing edge: the gap between points %d%s and %d%s (corners turning by %.0f° together)", orig[te.i]+1, c.lineOf(orig[te.i]), orig[j]+1, c.lineOf(orig[j]), te.score))
	default:
		rep.Detected = append(rep.Detected, fmt.Sprintf("trailing edge: the corner at point %d%s (turning by %.0f°)", orig[te.i]+1, c.lineOf(orig[te.i]), te.score))
	}
	fileStart := te.i == n-1 && te.edge && !closed || te.i == 0 && !te.edge && closed
	switch {
	case fileStart, te.base > 0 && te.other(n) == 0:
	case te.i == n-1 && te.edge && closed:
		rep.Changes = append(rep.Changes, fmt.Sprintf("the last point repeated the first (point %d), closing the blunt trailing edge with a straight base; dropped it, leaving the gap open", orig[0]+1))
	case te.i == 0 && !te.edge && !closed:
		rep.Changes = append(rep.Changes, fmt.Sprintf("repeated the trailing-edge point (point %d) at the end to close the contour", orig[0]+1))
	default:
		where := fmt.Sprintf("the sharp corner at point %d (%s)", orig[te.i]+1, fmtPoint(pts[orig[te.i]]))
		if te.edge {
			j := te.other(n)
			where = fmt.Sprintf("the gap between points %d (%s) and %d (%s)", orig[te.i]+1, fmtPoint(pts[orig[te.i]]), orig[j]+1, fmtPoint(pts[orig[j]]))
		}
		msg := "the list did not start at the trailing edge: started the contour at " + where
		if closed {
			msg += fmt.Sprintf("; the last point repeated the first (point %d) and was dropped", orig[0]+1)
		}
		rep.Changes = append(rep.Changes, msg)
	}

	if te.smooth {
		k := orig[te.i] + 1
		rep.Warnings = append(rep.Warnings, CleanWarning{Kind: WarnNoTE, Index: -1, X: 1, Message: fmt.Sprintf(
			"no corner marks a trailing edge (the sharpest turns by %.0f°: a circle, an ellipse or a rounded end?); the trailing edge was put at point %d, where the contour turns most, and the results depend on that choice", te.score, k)})
	}
	return cont, idx
}

// orient is step 3: it reverses cont and idx in place if the contour runs
// clockwise.
func (c *cleaner) orient(cont []Point, idx []int) {
	if PolygonArea(cont) < 0 {
		for i, j := 0, len(cont)-1; i < j; i, j = i+1, j-1 {
			cont[i], cont[j] = cont[j], cont[i]
			idx[i], idx[j] = idx[j], idx[i]
		}
		c.rep.Changes = append(c.rep.Changes, "reversed the point order: the contour ran clockwise (lower surface first); the package runs counter-clockwise, upper surface first")
	}
}

// leadingEdge is what step 4 found: the contour (with the leading edge
// inserted if it was), the leading edge and its index in cont, the
// trailing-edge midpoint, and the change to report after step 5's.
type leadingEdge struct {
	cont     []Point
	le       Point
	leIdx    int
	teMid    Point
	leChange string
}

// findLeadingEdge is step 4: the leading edge on the spline. A listed
// point within LESnapTol of it is taken as the leading edge itself (so
// cleaning a clean section changes nothing); otherwise the spline's point
// is inserted. A file that gives its own chord keeps it.
func (c *cleaner) findLeadingEdge(cont []Point, idx []int) (leadingEdge, error) {
	rep := c.rep
	spl, err := NewContourSpline(cont)
	if err != nil {
		return leadingEdge{}, c.fail(-1, err)
	}
	tLE, le := spl.LeadingEdge()
	teMid := cont[0].Add(cont[len(cont)-1]).Scale(0.5)
	chordQ := teMid.Dist(le)
	if !(chordQ > 1e-6) {
		return leadingEdge{}, c.fail(-1, fmt.Errorf("the leading edge coincides with the trailing edge: %w", ErrFlatContour))
	}
	near, nd := 0, math.Inf(1)
	for i, p := range cont {
		if d := p.Dist(le) / chordQ; d < nd {
			near, nd = i, d
		}
	}
	leIdx := near
	var leChange string
	// A file that gives its own chord (a listed point at the origin, the
	// trailing-edge midpoint on +x) keeps it, if that point is the nose.
	origin, od := -1, math.Inf(1)
	teOrig := c.toOrig(teMid)
	for i, p := range cont {
		if d := c.toOrig(p).Norm(); d < od {
			origin, od = i, d
		}
	}
	ownChord := teOrig.X > 0 && od <= FileFrameTol*teOrig.X && math.Abs(teOrig.Y) <= FileFrameTol*teOrig.X &&
		cont[origin].Dist(le) <= FileChordTol*chordQ
	switch {
	case ownChord && cont[origin].Dist(le) > LESnapTol*chordQ:
		d := cont[origin].Dist(le) / chordQ
		alt := math.Abs(math.Atan2(teMid.Y-le.Y, teMid.X-le.X)-math.Atan2(teMid.Y-cont[origin].Y, teMid.X-cont[origin].X)) * 180 / math.Pi
		le, leIdx = cont[origin], origin
		rep.Detected = append(rep.Detected, fmt.Sprintf("leading edge: point %d%s, at the origin of the file, whose trailing edge lies on its x axis: the file's own chord line is kept (the farthest point of the spline is %.2g of the chord away and would incline the chord by %.3g°)", idx[origin]+1, c.lineOf(idx[origin]), d, alt))
	case nd <= LESnapTol:
		le = cont[near]
		if nd < reportTol {
			rep.Detected = append(rep.Detected, fmt.Sprintf("leading edge: point %d%s, the farthest point of the spline", idx[near]+1, c.lineOf(idx[near])))
		} else {
			rep.Detected = append(rep.Detected, fmt.Sprintf("leading edge: point %d%s, %.2g of the chord from the farthest point of the spline (within %g)", idx[near]+1, c.lineOf(idx[near]), nd, LESnapTol))
		}
	default:
		knots := spl.Knots()
		j := 0
		for j+2 < len(knots) && knots[j+1] <= tLE {
			j++
		}
		cont = append(cont[:j+1], append([]Point{le}, cont[j+1:]...)...)
		leIdx = j + 1
		leChange = fmt.Sprintf("inserted the leading edge found on the spline as a new point %d (the nearest listed point was %.2g of the chord away)", leIdx+1, nd)
	}
	return leadingEdge{cont: cont, le: le, leIdx: leIdx, teMid: teMid, leChange: leChange}, nil
}

// normalise is step 5: translate, scale and derotate. It returns the
// contour in the derotated frame (chord along +x; the steps after it work
// there) and the chord's angle theta, by which the result is turned back
// at the end without Derotate.
func (c *cleaner) normalise(ed leadingEdge) (out []Point, theta float64) {
	rep, le, teMid := c.rep, ed.le, ed.teMid
	chordQ := teMid.Dist(le)
	theta = math.Atan2(teMid.Y-le.Y, teMid.X-le.X)
	sin, cos := math.Sincos(-theta)
	out = make([]Point, len(ed.cont))
	for i, p := range ed.cont {
		d := p.Sub(le).Scale(1 / chordQ)
		out[i] = Point{cos*d.X - sin*d.Y, sin*d.X + cos*d.Y}
	}
	out[ed.leIdx] = Point{}
	leOrig := c.toOrig(le)
	chord := chordQ * 2 * c.half
	if leOrig.Norm() > reportTol*chord {
		shown := leOrig
		// Rounding noise (below 1e-12 of the chord) is shown as zero.
		if math.Abs(shown.X) < 1e-12*chord {
			shown.X = 0
		}
		if math.Abs(shown.Y) < 1e-12*chord {
			shown.Y = 0
		}
		rep.Changes = append(rep.Changes, fmt.Sprintf("moved the leading edge from (%s) to the origin", fmtPoint(shown)))
	}
	if math.Abs(chord-1) > reportTol {
		rep.Changes = append(rep.Changes, fmt.Sprintf("scaled by 1/%.9g to unit chord (the chord was %.9g)", chord, chord))
	}
	deg := theta * 180 / math.Pi
	if math.Abs(theta) > reportTol {
		if c.opt.Derotate {
			rep.Changes = append(rep.Changes, fmt.Sprintf("rotated by %s so that the chord lies along x (it was inclined at %s)", fmtDeg(-deg), fmtDeg(deg)))
		} else {
			rep.Warnings = append(rep.Warnings, CleanWarning{Kind: WarnInclined, Index: -1, Message: fmt.Sprintf("the chord is inclined at %s and was left so (derotation off)", fmtDeg(deg))})
		}
	}
	if ed.leChange != "" {
		rep.Changes = append(rep.Changes, ed.leChange)
	}
	return out, theta
}

// closeTrailingEdge is step 6: it records the trailing-edge gap of out
// (unit chord, derotated) and, with CloseTE and a gap up to
// MaxCloseTEGap, closes it in place, blending the surfaces over the last
// TECloseBlend of the chord. It reports whether it closed the gap.
func (c *cleaner) closeTrailingEdge(out []Point, leIdx int) bool {
	rep := c.rep
	last := len(out) - 1
	rep.TEGap = out[0].Dist(out[last])
	closeTE := c.opt.CloseTE && rep.TEGap > 0 && rep.TEGap <= MaxCloseTEGap
	if c.opt.CloseTE && rep.TEGap > MaxCloseTEGap {
		rep.Warnings = append(rep.Warnings, CleanWarning{Kind: WarnBluntTE, Index: -1, X: 1, Message: fmt.Sprintf("the trailing-edge gap of %.3g%% of the chord was left open: closing more than %g%% would reshape the section", 100*rep.TEGap, 100*MaxCloseTEGap)})
	}
	if !closeTE {
		return false
	}
	mid := out[0].Add(out[last]).Scale(0.5)
	blend := func(from, to, step int, p0 Point) {
		x0 := p0.X - TECloseBlend
		d := mid.Sub(p0)
		for i := from; i != to; i += step {
			s := (out[i].X - x0) / (p0.X - x0)
			if s <= 0 {
				continue
			}
			s = math.Min(s, 1)
			out[i] = out[i].Add(d.Scale(s * s * (3 - 2*s)))
		}
	}
	if leIdx > 0 && leIdx < last {
		blend(1, leIdx, 1, out[0])
		blend(last-1, leIdx, -1, out[last])
	}
	out[0], out[last] = mid, mid
	rep.Changes = append(rep.Changes, fmt.Sprintf("closed the trailing-edge gap of %.4g%% of the chord: both trailing-edge points moved to their midpoint, the surfaces blended into it over the last %g%% of the chord", 100*rep.TEGap, 100*TECloseBlend))
	return true
}

// teChoice is the trailing edge in a ring: vertex i (sharp), or the gap
// from corner ring[i] to corner ring[i+1+base] (blunt), with base points
// drawn along the base between them.
type teChoice struct {
	i     int
	edge  bool
	base  int     // points drawn on the base between the two corners
	score float64 // turning in degrees: the vertex's, or both corners'
	// smooth: no corner stands out (see findTE); the choice is arbitrary.
	smooth bool
}

// other returns the second corner of a blunt trailing edge.
func (c teChoice) other(n int) int { return (c.i + 1 + c.base) % n }

// findTE finds the trailing edge of a ring of distinct points. The two ends
// of the section are the point A farthest from the centroid (either edge)
// and the point B farthest from A; a third pass takes the point farthest
// from B in place of A. Near each end (within teSearchFrac) the candidates
// are single vertices, scored by their convex turning angle, and pairs of
// neighbouring vertices that both turn by at least bluntCornerDeg (the
// corners of a blunt trailing edge, the edge between them being the gap),
// scored by the sum. The trailing edge, turning by 180° less its wedge
// angle in one or two corners, outscores the round leading edge. The
// file's own start (vertex 0 of a closed ring, the closing edge of an open
// one) is kept when it scores at least startPreference of the best.
func findTE(ring []Point, closed bool) teChoice {
	c := findCorner(ring, closed)
	turns := make([]float64, len(ring))
	n := len(ring)
	for i := range ring {
		a, b, d := ring[(i+n-1)%n], ring[i], ring[(i+1)%n]
		u, v := b.Sub(a), d.Sub(b)
		turns[i] = math.Abs(math.Atan2(u.Cross(v), u.Dot(v)) * 180 / math.Pi)
	}
	sort.Float64s(turns)
	c.smooth = c.score < bluntCornerDeg || c.score < teContrast*turns[n/2] && c.score < smoothMaxDeg
	return c
}

// findCorner is findTE's search, without the smoothness verdict.
func findCorner(ring []Point, closed bool) teChoice {
	n := len(ring)
	sign := 1.0
	if PolygonArea(ring) < 0 {
		sign = -1
	}
	turn := make([]float64, n) // convex turning in degrees
	for i := range ring {
		a, b, c := ring[(i+n-1)%n], ring[i], ring[(i+1)%n]
		u, v := b.Sub(a), c.Sub(b)
		turn[i] = sign * math.Atan2(u.Cross(v), u.Dot(v)) * 180 / math.Pi
	}
	var cen Point
	for _, p := range ring {
		cen = cen.Add(p)
	}
	cen = cen.Scale(1 / float64(n))
	far := func(from Point) int {
		best, bd := 0, -1.0
		for i, p := range ring {
			if d := p.Dist(from); d > bd {
				best, bd = i, d
			}
		}
		return best
	}
	a := far(cen)
	b := far(ring[a])
	a = far(ring[b])
	candidates := func(end int) []teChoice {
		var cs []teChoice
		near := func(i int) bool { return ring[i].Dist(ring[end]) <= teSearchFrac }
		for i := range ring {
			if !near(i) {
				continue
			}
			cs = append(cs, teChoice{i: i, score: turn[i]})
			j := (i + 1) % n
			if near(j) && turn[i] >= bluntCornerDeg && turn[j] >= bluntCornerDeg {
				cs = append(cs, teChoice{i: i, edge: true, score: turn[i] + turn[j]})
			}
			if turn[i] < bluntCornerDeg {
				continue
			}
			// A base drawn with points on it: corner i, a nearly straight
			// run of points, corner j.
			run := 0.0
			for m := 1; m <= maxBaseRunPoints && m < n-2; m++ {
				k := (i + m) % n
				run += ring[k].Dist(ring[(i+m-1)%n])
				if !near(k) || math.Abs(turn[k]) > baseStraightDeg {
					break
				}
				j := (i + m + 1) % n
				if near(j) && turn[j] >= bluntCornerDeg && run+ring[j].Dist(ring[k]) <= baseStraightness*ring[j].Dist(ring[i]) {
					cs = append(cs, teChoice{i: i, edge: true, base: m, score: turn[i] + turn[j]})
				}
			}
		}
		return cs
	}
	all := append(candidates(a), candidates(b)...)
	if !closed && turn[n-1] >= bluntCornerDeg && turn[0] >= bluntCornerDeg {
		// The file's closing edge, however wide, as a blunt trailing edge.
		all = append(all, teChoice{i: n - 1, edge: true, score: turn[n-1] + turn[0]})
	}
	best := all[0]
	for _, c := range all[1:] {
		if c.score > best.score {
			best = c
		}
	}
	start := teChoice{i: 0}
	if !closed {
		start = teChoice{i: n - 1, edge: true}
	}
	for _, c := range all {
		own := c.i == start.i && c.edge == start.edge && c.base == 0 || c.edge && c.base > 0 && c.other(n) == 0
		if own && c.score >= startPreference*best.score {
			return c
		}
	}
	if !closed {
		// A file that lists a sharp trailing edge once, at the start only.
		for _, c := range all {
			if c.i == 0 && !c.edge && c.score >= startPreference*best.score {
				return c
			}
		}
	}
	return best
}

// sectionWarnings checks a normalised contour (leading edge at index le).
func sectionWarnings(pts []Point, le int, gap float64, closedTE bool) []CleanWarning {
	var ws []CleanWarning
	count := map[WarningKind]int{}
	add := func(k WarningKind, i int, msg string) {
		count[k]++
		if count[k] > MaxWarningsPerKind {
			return
		}
		x := 0.0
		if i >= 0 {
			x = pts[i].X
		} else if k == WarnBluntTE {
			x = 1
		}
		ws = append(ws, CleanWarning{Kind: k, Index: i, X: x, Message: msg})
	}
	n := len(pts)
	if gap > BluntTEGap {
		msg := fmt.Sprintf("trailing-edge gap of %.3g%% of the chord, above %g%%: results near the trailing edge are unreliable", 100*gap, 100*BluntTEGap)
		if closedTE {
			msg += "; closing it reshaped the last part of the section considerably"
		}
		add(WarnBluntTE, -1, msg)
	}
	nose := 0
	for _, p := range pts[:n-1] {
		if p.X < SparseNoseChord {
			nose++
		}
	}
	if nose < MinNosePoints {
		add(WarnSparseNose, le, fmt.Sprintf("%d %s within %g%% of the chord from the leading edge, fewer than %d: the nose shape and the suction peak are poorly defined", nose, plural(nose, "point", "points"), 100*SparseNoseChord, MinNosePoints))
	}
	// Spikes, then kinks away from them.
	spike := make([]bool, n)
	for i := 1; i < n-1; i++ {
		if i == le {
			continue
		}
		a, b, c := pts[i-1], pts[i], pts[i+1]
		h := a.Dist(c)
		d := math.Abs(c.Sub(a).Cross(b.Sub(a)))
		if h > 0 {
			d /= h
		} else {
			d = b.Dist(a)
		}
		if d > SpikeRatio*h {
			spike[i] = true
			add(WarnSpike, i, fmt.Sprintf("point %d (x/c = %.4f) lies %.3g of the chord off the line through its neighbours, more than %g times their distance", i+1, b.X, d, SpikeRatio))
		}
	}
	for i := 1; i < n-1; i++ {
		if i >= le-1 && i <= le+1 || spike[i] || spike[i-1] || (i+1 < n && spike[i+1]) {
			continue
		}
		t := turnAt(pts, i)
		sg := math.Copysign(1, t)
		if math.Abs(t) > KinkAngleDeg && math.Abs(t) > KinkContrast*math.Max(0, math.Max(sg*turnAt(pts, i-1), sg*turnAt(pts, i+1))) {
			add(WarnKink, i, fmt.Sprintf("the contour turns by %.1f° at point %d (x/c = %.4f), more than %g°", t, i+1, pts[i].X, KinkAngleDeg))
		}
	}
	// x must fall along the upper surface and rise along the lower.
	for _, s := range []struct {
		name      string
		from, to  int
		direction float64
	}{{"upper", 0, le, -1}, {"lower", le, n - 1, 1}} {
		bad, first := 0, -1
		for i := s.from; i < s.to; i++ {
			if math.Max(pts[i].X, pts[i+1].X) < noseCurlXC {
				continue // the nose, see noseCurlXC
			}
			if s.direction*(pts[i+1].X-pts[i].X) < -monotoneTol {
				if first < 0 {
					first = i + 1
				}
				bad++
			}
		}
		if bad > 0 {
			add(WarnNonMonotone, first, fmt.Sprintf("x runs backwards along the %s surface at %d %s, first at point %d (x/c = %.4f)", s.name, bad, plural(bad, "point", "points"), first+1, pts[first].X))
		}
	}
	// Crossing: an upper point below the lower surface, or a lower point
	// above the upper surface, away from the ends.
	upper, lower := pts[:le+1], pts[le:]
	for _, s := range []struct {
		name       string
		own, other []Point
		offset     int
		sign       float64
		otherName  string
	}{{"upper", upper, lower, 0, 1, "lower"}, {"lower", lower, upper, le, -1, "upper"}} {
		in := false
		other := newSurface(s.other)
		for k, p := range s.own {
			if p.X <= 0 || p.X >= 1 {
				continue
			}
			y, ok := other.y(p.X)
			cross := ok && s.sign*(p.Y-y) < -crossingTol
			if cross && !in {
				add(WarnCrossing, s.offset+k, fmt.Sprintf("the %s surface crosses the %s surface near point %d (x/c = %.4f)", s.name, s.otherName, s.offset+k+1, p.X))
			}
			in = cross
		}
	}
	for _, k := range []WarningKind{WarnSpike, WarnKink, WarnNonMonotone, WarnCrossing} {
		if c := count[k]; c > MaxWarningsPerKind {
			ws = append(ws, CleanWarning{Kind: k, Index: -1, Message: fmt.Sprintf("and %d more %s warnings", c-MaxWarningsPerKind, k)})
		}
	}
	return ws
}

// turnAt returns the turning angle in degrees at interior point i of an
// open polyline (counter-clockwise positive), 0 at the ends.
func turnAt(pts []Point, i int) float64 {
	if i <= 0 || i >= len(pts)-1 {
		return 0
	}
	u, v := pts[i].Sub(pts[i-1]), pts[i+1].Sub(pts[i])
	return math.Atan2(u.Cross(v), u.Dot(v)) * 180 / math.Pi
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// lineOf gives the file line of input point i, " on line 48", or "" when
// the lines are not known.
func (c *cleaner) lineOf(i int) string {
	if len(c.opt.Lines) != len(c.pts) || i < 0 || i >= len(c.opt.Lines) || c.opt.Lines[i] <= 0 {
		return ""
	}
	return fmt.Sprintf(" on line %d", c.opt.Lines[i])
}

// lineList gives the file lines of input points idx, " on lines 15, 48,
// 69 of the file", or "" when the lines are not known.
func (c *cleaner) lineList(idx []int) string {
	if len(c.opt.Lines) != len(c.pts) || len(idx) == 0 {
		return ""
	}
	var s []string
	for k, i := range idx {
		if k == listedPoints {
			s = append(s, "…")
			break
		}
		if i < 0 || i >= len(c.opt.Lines) || c.opt.Lines[i] <= 0 {
			return ""
		}
		s = append(s, fmt.Sprint(c.opt.Lines[i]))
	}
	return " on " + plural(len(idx), "line ", "lines ") + strings.Join(s, ", ") + " of the file"
}

// listedPoints is how many points a report line names before it says how
// many more there are: enough to find a few stray points in the file,
// short enough to read in one line.
const listedPoints = 8

// pointList lists 1-based point numbers, at most listedPoints of them.
func pointList(idx []int) string {
	var s []string
	for k, i := range idx {
		if k == listedPoints {
			s = append(s, fmt.Sprintf("and %d more", len(idx)-listedPoints))
			break
		}
		s = append(s, fmt.Sprint(i+1))
	}
	return plural(len(idx), "point ", "points ") + strings.Join(s, ", ")
}

func fmtPoint(p Point) string { return fmt.Sprintf("%.6g, %.6g", p.X, p.Y) }

// fmtDeg formats an angle in degrees, with significant digits when tiny.
func fmtDeg(d float64) string {
	if math.Abs(d) < 1e-3 {
		return fmt.Sprintf("%.2g°", d)
	}
	return fmt.Sprintf("%.4f°", d)
}

// surface interpolates y at x along a surface polyline: by bisection when
// x is monotone along it, else by a linear scan for the first bracket.
type surface struct {
	pl        []Point
	mono, inc bool
}

func newSurface(pl []Point) surface {
	s := surface{pl: pl, mono: len(pl) >= 2}
	if !s.mono {
		return s
	}
	s.inc = pl[len(pl)-1].X > pl[0].X
	for i := 0; i+1 < len(pl); i++ {
		if (pl[i+1].X > pl[i].X) != s.inc && pl[i+1].X != pl[i].X {
			s.mono = false
		}
	}
	return s
}

func (s surface) y(x float64) (float64, bool) {
	pl, n := s.pl, len(s.pl)
	if !s.mono {
		return interpAt(pl, x)
	}
	sg := 1.0
	if !s.inc {
		sg = -1
	}
	if sg*x < sg*pl[0].X || sg*x > sg*pl[n-1].X {
		return 0, false
	}
	i := sort.Search(n, func(i int) bool { return sg*pl[i].X >= sg*x })
	if i == 0 {
		return pl[0].Y, true
	}
	a, b := pl[i-1], pl[i]
	if a.X == b.X {
		return b.Y, true
	}
	t := (x - a.X) / (b.X - a.X)
	return a.Y + t*(b.Y-a.Y), true
}

// toOrigPoint undoes Clean's pre-normalisation: p·2·half + ctr.
func toOrigPoint(p, ctr Point, half float64) Point {
	return Point{p.X*2*half + ctr.X, p.Y*2*half + ctr.Y}
}

// closedLoops returns the first index of each loop in pts: a loop ends at
// a point within tol of its own first point that is followed by at least
// MinSectionPoints more points, which start the next loop. One loop (a
// section, closed at its end or not) gives [0].
func closedLoops(pts []Point, tol float64) []int {
	starts := []int{0}
	s := 0
	for i := 3; i < len(pts); i++ {
		if i-s >= 3 && pts[i].Dist(pts[s]) <= tol && len(pts)-1-i >= MinSectionPoints {
			s = i + 1
			starts = append(starts, s)
		}
	}
	return starts
}

// Outlier thresholds: a point is an outlier when both its distances to its
// neighbours exceed outlierRatio times the larger of its neighbours'
// distance to each other and the median spacing of the list, and
// outlierSize of the section's size (pre-normalised, so the size is 1).
// A smooth contour, however sparse, keeps the two below one another; a
// blunt trailing edge's gap is one spacing, not two.
const (
	outlierRatio = 5.0
	outlierSize  = 0.05
)

// outlierPoint returns the first outlier of pts (see outlierRatio), the
// distance to its nearer neighbour and its neighbours' distance, or −1.
// The list is taken as a loop (the first and last points are neighbours).
func outlierPoint(pts []Point) (int, float64, float64) {
	n := len(pts)
	if n < MinSectionPoints {
		return -1, 0, 0
	}
	steps := make([]float64, n)
	for i := range pts {
		steps[i] = pts[i].Dist(pts[(i+1)%n])
	}
	med := append([]float64(nil), steps...)
	sort.Float64s(med)
	median := med[n/2]
	for i := range pts {
		prev, next := pts[(i+n-1)%n], pts[(i+1)%n]
		near := math.Min(pts[i].Dist(prev), pts[i].Dist(next))
		gap := prev.Dist(next)
		if near > outlierSize && near > outlierRatio*math.Max(gap, median) {
			return i, near, gap
		}
	}
	return -1, 0, 0
}
