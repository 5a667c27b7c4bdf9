package model

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// naca0012Loop returns a NACA 0012 with the closed-trailing-edge thickness
// coefficient −0.1036 (common practice, in place of Abbott & von
// Doenhoff's −0.1015, so that y(1) = 0 to rounding), n points per surface at cosine
// spacing, as the conventional loop. Its leading edge is (0, 0), its
// trailing edge (1, 0), and by symmetry the point of the contour farthest
// from the trailing edge is the leading edge: cleaning must leave it as it
// is.
func naca0012Loop(n int) []Point {
	var up []Point
	for i := range n {
		x := (1 - math.Cos(math.Pi*float64(i)/float64(n-1))) / 2
		y := 0.6 * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x - 0.1036*x*x*x*x)
		up = append(up, Point{x, y})
	}
	up[n-1].Y = 0 // the coefficients sum to 1e-4, not 0: close exactly
	var loop []Point
	for i := n - 1; i >= 0; i-- {
		loop = append(loop, up[i])
	}
	for i := 1; i < n; i++ {
		loop = append(loop, Point{up[i].X, -up[i].Y})
	}
	return loop
}

func maxDist(a, b []Point) float64 {
	if len(a) != len(b) {
		return math.Inf(1)
	}
	d := 0.0
	for i := range a {
		d = math.Max(d, a[i].Dist(b[i]))
	}
	return d
}

func mustClean(t *testing.T, name string, pts []Point, opt CleanOptions) (*Section, *CleanReport) {
	t.Helper()
	sec, rep, err := Clean(name, pts, opt)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return sec, rep
}

// TestCleanConventionalUnchanged: a section already in the convention, with
// its leading edge on a listed point, comes back unchanged and the report
// says so.
func TestCleanConventionalUnchanged(t *testing.T) {
	in := naca0012Loop(61)
	sec, rep := mustClean(t, "NACA 0012", in, DefaultCleanOptions)
	if d := maxDist(sec.Points(), in); d > 1e-12 {
		t.Errorf("points moved by %g", d)
	}
	if len(rep.Changes) != 0 || len(rep.Warnings) != 0 {
		t.Errorf("report not empty:\n%s", rep)
	}
	if rep.InputPoints != 121 || rep.OutputPoints != 121 || rep.TEGap != 0 {
		t.Errorf("counts %d→%d, gap %g", rep.InputPoints, rep.OutputPoints, rep.TEGap)
	}
	if !strings.Contains(rep.String(), "Changes: none") {
		t.Errorf("String:\n%s", rep)
	}
}

// TestCleanInvariance is a property test: scaling, translating and
// rotating the input, reversing it and starting it elsewhere give the same
// cleaned section.
func TestCleanInvariance(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	shapes := []struct {
		name string
		pts  []Point
	}{
		{"NACA 0012 sharp", naca0012Loop(51)},
		{"NACA 2412 blunt", testLoop(41)},
	}
	for _, s := range shapes {
		// The reference is itself moved, so that neither it nor the trials
		// give their own chord (see TestCleanKeepsFileChord).
		moved := make([]Point, len(s.pts))
		for i, p := range s.pts {
			moved[i] = p.Rotate(Point{}, 0.1).Add(Point{0.5, 0.25})
		}
		ref, _ := mustClean(t, s.name, moved, DefaultCleanOptions)
		for trial := range 20 {
			scale := math.Pow(10, -3+6*rng.Float64())
			rot := (rng.Float64()*2 - 1) * math.Pi / 6
			off := Point{(rng.Float64()*2 - 1) * 1e3, (rng.Float64()*2 - 1) * 1e3}
			pts := make([]Point, len(s.pts))
			for i, p := range s.pts {
				pts[i] = p.Rotate(Point{}, rot).Scale(scale).Add(off)
			}
			if trial%2 == 1 {
				pts = reversed(pts)
			}
			if trial%3 == 2 {
				// Start elsewhere: a sharp closed loop drops its repeated
				// end point and repeats the new start instead.
				k := 1 + rng.IntN(len(pts)-2)
				ring := pts
				if pts[0].Dist(pts[len(pts)-1]) < 1e-12*scale {
					ring = pts[:len(pts)-1]
				}
				pts = append(append([]Point(nil), ring[k:]...), ring[:k]...)
			}
			got, rep := mustClean(t, s.name, pts, DefaultCleanOptions)
			// The tolerance allows for rounding at coordinates of 1e3
			// scaled down by up to 1e-3: 1e3/1e-3 × 1e-16 ≈ 1e-10.
			if d := maxDist(got.Points(), ref.Points()); d > 1e-9 {
				t.Errorf("%s trial %d (scale %g, rotation %g°, offset %v, reversed %v): differs by %g\n%s",
					s.name, trial, scale, rot*180/math.Pi, off, trial%2 == 1, d, rep)
			}
		}
	}
}

// TestCleanConvention checks the convention on a cleaned, transformed,
// reversed section: LE at the origin, TE midpoint at (1, 0),
// counter-clockwise, upper surface first.
func TestCleanConvention(t *testing.T) {
	var pts []Point
	for _, p := range reversed(testLoop(41)) {
		pts = append(pts, p.Rotate(Point{0.3, 0}, 0.2).Scale(180).Add(Point{-50, 7}))
	}
	sec, rep := mustClean(t, "moved", pts, DefaultCleanOptions)
	le := sec.At(sec.LeadingEdgeIndex())
	if le != (Point{}) {
		t.Errorf("leading edge at %v", le)
	}
	mid := sec.At(0).Add(sec.At(sec.Len() - 1)).Scale(0.5)
	if mid.Dist(Point{1, 0}) > 1e-12 {
		t.Errorf("trailing-edge midpoint at %v", mid)
	}
	if sec.SignedArea() <= 0 {
		t.Errorf("area %g, want counter-clockwise", sec.SignedArea())
	}
	if sec.At(1).Y <= sec.At(sec.Len()-2).Y {
		t.Errorf("does not start on the upper surface: %v then %v", sec.At(1), sec.At(sec.Len()-2))
	}
	// NACA 2412 formula: open trailing edge of 2·5·0.12·(0.2969 − 0.1260 −
	// 0.3516 + 0.2843 − 0.1015) = 0.252% chord (Abbott & von Doenhoff eq.
	// 6.2), here measured along the cleaned chord.
	if want := 2 * 5 * 0.12 * (0.2969 - 0.1260 - 0.3516 + 0.2843 - 0.1015); math.Abs(rep.TEGap-want)/want > 1e-3 {
		t.Errorf("TE gap %g, want %g", rep.TEGap, want)
	}
	for _, c := range []string{"reversed the point order", "moved the leading edge", "scaled by 1/", "rotated by"} {
		if !strings.Contains(strings.Join(rep.Changes, "\n"), c) {
			t.Errorf("changes lack %q:\n%s", c, rep)
		}
	}
}

// TestCleanRecoversKnownShape: a NACA 0012 moved, scaled, turned and
// listed backwards from the leading edge comes back as the formula gives
// it.
func TestCleanRecoversKnownShape(t *testing.T) {
	ref := naca0012Loop(41)
	le := 40
	var pts []Point
	for _, p := range append(append([]Point(nil), ref[le:]...), ref[1:le+1]...) {
		pts = append(pts, p.Rotate(Point{}, -0.3).Scale(0.25).Add(Point{3, 4}))
	}
	sec, rep := mustClean(t, "0012", reversed(pts), DefaultCleanOptions)
	if d := maxDist(sec.Points(), ref); d > 1e-12 {
		t.Errorf("differs from the formula by %g\n%s", d, rep)
	}
}

func TestCleanCloseTE(t *testing.T) {
	in := testLoop(41)
	open, _ := mustClean(t, "open", in, DefaultCleanOptions)
	sec, rep := mustClean(t, "closed", in, CleanOptions{Derotate: true, CloseTE: true})
	n := sec.Len()
	if sec.At(0) != sec.At(n-1) {
		t.Errorf("trailing-edge points %v and %v differ", sec.At(0), sec.At(n-1))
	}
	if sec.At(0).Dist(Point{1, 0}) > 1e-12 {
		t.Errorf("closed trailing edge at %v, want the midpoint (1, 0)", sec.At(0))
	}
	if rep.TEGap < 0.002 {
		t.Errorf("report gap %g, want the gap before closing", rep.TEGap)
	}
	if !strings.Contains(strings.Join(rep.Changes, "\n"), "closed the trailing-edge gap") {
		t.Errorf("no change reported:\n%s", rep)
	}
	for i := range n {
		p, q := sec.At(i), open.At(i)
		if p.X < 1-TECloseBlend-1e-3 && p != q {
			t.Errorf("point %d at x = %g moved from %v to %v, outside the blend", i, p.X, q, p)
		}
		if d := p.Dist(q); d > rep.TEGap/2+1e-12 {
			t.Errorf("point %d moved by %g, more than half the gap", i, d)
		}
	}
}

func TestCleanNoDerotate(t *testing.T) {
	var pts []Point
	for _, p := range naca0012Loop(41) {
		pts = append(pts, p.Rotate(Point{}, 10*math.Pi/180))
	}
	sec, rep := mustClean(t, "tilted", pts, CleanOptions{})
	te := sec.At(0)
	if ang := math.Atan2(te.Y, te.X) * 180 / math.Pi; math.Abs(ang-10) > 1e-9 {
		t.Errorf("chord at %g°, want 10° kept", ang)
	}
	if len(rep.Warnings) != 1 || rep.Warnings[0].Kind != WarnInclined || !strings.Contains(rep.Warnings[0].Message, "10.0000°") {
		t.Errorf("warnings %+v", rep.Warnings)
	}
}

// TestCleanLeadingEdgePoint: a listed point near the spline's leading edge
// is moved onto it, a farther one leaves the leading edge to be inserted.
func TestCleanLeadingEdgePoint(t *testing.T) {
	base := naca0012Loop(41)
	for _, c := range []struct {
		name     string
		shift    float64 // of the listed leading-edge point along the upper surface, in chords
		change   string
		detected string
		points   int
	}{
		{"exact", 0, "", "leading edge: point 41, the farthest point of the spline", 81},
		{"near", LESnapTol / 4, "moved the leading edge from", "of the chord from the farthest point of the spline (within 1e-05)", 81},
		{"inserted", 20 * LESnapTol, "inserted the leading edge found on the spline as a new point 42", "", 82},
	} {
		pts := append([]Point(nil), base...)
		if c.shift > 0 {
			// Slide the leading-edge point along the circle of the nose
			// (radius 1.1019 t², Abbott & von Doenhoff sec. 6.4).
			r := 1.1019 * 0.12 * 0.12
			a := c.shift / r
			pts[40] = Point{r - r*math.Cos(a), r * math.Sin(a)}
		}
		sec, rep := mustClean(t, c.name, pts, DefaultCleanOptions)
		if sec.Len() != c.points {
			t.Errorf("%s: %d points, want %d", c.name, sec.Len(), c.points)
		}
		changes := strings.Join(rep.Changes, "\n")
		if c.change == "" && strings.Contains(changes, "leading edge") || !strings.Contains(changes, c.change) {
			t.Errorf("%s: changes\n%s", c.name, changes)
		}
		if !strings.Contains(strings.Join(rep.Detected, "\n"), c.detected) {
			t.Errorf("%s: detected\n%s", c.name, rep.Detected)
		}
		if p := sec.At(sec.LeadingEdgeIndex()); p != (Point{}) {
			t.Errorf("%s: leading edge point %v", c.name, p)
		}
		// The leading edge sits between an upper and a lower point.
		k := sec.LeadingEdgeIndex()
		if !(sec.At(k-1).Y > 0 && sec.At(k+1).Y < 0) {
			t.Errorf("%s: leading edge %d between %v and %v", c.name, k, sec.At(k-1), sec.At(k+1))
		}
	}
}

// TestCleanKinkThreshold builds a tent of slope a on the upper surface:
// the contour turns by 2·atan(a) at its peak.
func TestCleanKinkThreshold(t *testing.T) {
	for _, c := range []struct {
		slope float64
		kink  bool
	}{{0.1, false}, {0.15, false}, {0.25, true}, {0.5, true}} {
		pts := naca0012Loop(41)
		xk := pts[20].X
		for i := 1; i < 40; i++ {
			pts[i].Y += c.slope * math.Max(0, 0.06-math.Abs(pts[i].X-xk))
		}
		_, rep := mustClean(t, "tent", pts, DefaultCleanOptions)
		got := false
		for _, w := range rep.Warnings {
			if w.Kind == WarnKink && w.Index == 20 {
				got = true
				if math.Abs(w.X-xk) > 1e-9 {
					t.Errorf("kink at x %g, want %g", w.X, xk)
				}
			}
		}
		turn := 2 * math.Atan(c.slope) * 180 / math.Pi
		if got != c.kink {
			t.Errorf("slope %g (turn %.1f°, threshold %g°): kink %v, want %v\n%s", c.slope, turn, KinkAngleDeg, got, c.kink, rep)
		}
	}
}

func TestCleanWarningsCapped(t *testing.T) {
	// A saw-tooth on the lower surface: every other point kinks.
	pts := naca0012Loop(81)
	for i := 90; i < 150; i += 2 {
		pts[i].Y -= 0.004
	}
	_, rep := mustClean(t, "saw", pts, DefaultCleanOptions)
	kinks, more := 0, false
	for _, w := range rep.Warnings {
		if w.Kind == WarnKink {
			kinks++
			more = more || strings.HasPrefix(w.Message, "and ")
		}
	}
	if kinks != MaxWarningsPerKind+1 || !more {
		t.Errorf("%d kink warnings (summary %v), want %d and a summary\n%s", kinks, more, MaxWarningsPerKind+1, rep)
	}
}

func TestCleanErrors(t *testing.T) {
	good := naca0012Loop(11)
	nan := append([]Point(nil), good...)
	nan[4].Y = math.NaN()
	for _, c := range []struct {
		name  string
		pts   []Point
		opt   CleanOptions
		is    error
		index int
	}{
		{"nil", nil, DefaultCleanOptions, ErrTooFewPoints, -1},
		{"NaN", nan, DefaultCleanOptions, ErrNonFinite, 4},
		{"equal", []Point{{2, 3}, {2, 3}, {2, 3}, {2, 3}, {2, 3}, {2, 3}}, DefaultCleanOptions, ErrAllPointsEqual, -1},
		{"equal large", []Point{{1e8, 1e8}, {1e8, 1e8}, {1e8, 1e8}}, DefaultCleanOptions, ErrAllPointsEqual, -1},
		{"three distinct", []Point{{1, 0}, {1, 0}, {0, 0.1}, {0, 0.1}, {0, -0.1}, {1, 0}}, DefaultCleanOptions, ErrTooFewPoints, -1},
		{"open", good[:11], DefaultCleanOptions, ErrOpenContour, -1},
		{"flat", []Point{{1, 0}, {0.5, 0}, {0, 0}, {0.5, 0}, {0.75, 0}, {1, 0}}, DefaultCleanOptions, ErrFlatContour, -1},
	} {
		_, rep, err := Clean(c.name, c.pts, c.opt)
		var ce *ContourError
		if !errors.As(err, &ce) || !errors.Is(err, c.is) || ce.Index != c.index {
			t.Errorf("%s: got %v, want a *ContourError at %d wrapping %v", c.name, err, c.index, c.is)
		}
		if rep == nil || rep.InputPoints != len(c.pts) {
			t.Errorf("%s: report %v", c.name, rep)
		}
	}
	_, _, err := Clean("tol", good, CleanOptions{DuplicateTol: -1})
	var fe *FieldError
	if !errors.As(err, &fe) {
		t.Errorf("negative tolerance: %v", err)
	}
}

func TestCleanDuplicateTol(t *testing.T) {
	pts := naca0012Loop(41)
	near := append([]Point(nil), pts[:10]...)
	near = append(near, pts[9].Add(Point{1e-5, 0}))
	near = append(near, pts[10:]...)
	for _, c := range []struct {
		tol  float64
		drop bool
	}{{0, false}, {1e-4, true}} {
		_, rep := mustClean(t, "near", near, CleanOptions{Derotate: true, DuplicateTol: c.tol})
		got := strings.Contains(strings.Join(rep.Changes, "\n"), "dropped 1 duplicate point")
		if got != c.drop {
			t.Errorf("tol %g: dropped %v, want %v\n%s", c.tol, got, c.drop, rep)
		}
	}
}

func TestCleanReportString(t *testing.T) {
	p, err := ParseCoordinates(strings.NewReader(string(malformedCorpus()["spike.dat"])), "spike.dat")
	if err != nil {
		t.Fatal(err)
	}
	_, rep, err := p.Clean(DefaultCleanOptions)
	if err != nil {
		t.Fatal(err)
	}
	s := rep.String()
	for _, want := range []string{`Section "one point off" from spike.dat: 81 points in, 81 out`, "Detected:\n  - name line 1", "Changes: none", "Warnings:\n  - spike: point 56", "Trailing-edge gap: 0.2"} {
		if !strings.Contains(s, want) {
			t.Errorf("report lacks %q:\n%s", want, s)
		}
	}
}

func BenchmarkClean(b *testing.B) {
	pts := testLoop(101)
	for b.Loop() {
		if _, _, err := Clean("b", pts, DefaultCleanOptions); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkCleanMaxPoints(b *testing.B) {
	pts := testLoop(MaxPoints / 2)
	for b.Loop() {
		if _, _, err := Clean("b", pts, DefaultCleanOptions); err != nil {
			b.Fatal(err)
		}
	}
}

// TestCleanTrailingEdgeForms covers how files list the trailing edge: once
// at the start only (sharp), closed by repeating the first point across a
// blunt base, and as listed.
func TestCleanTrailingEdgeForms(t *testing.T) {
	sharp := naca0012Loop(41)
	blunt := testLoop(41)
	refSharp, _ := mustClean(t, "sharp", sharp, DefaultCleanOptions)
	refBlunt, _ := mustClean(t, "blunt", blunt, DefaultCleanOptions)
	for _, c := range []struct {
		name   string
		pts    []Point
		ref    *Section
		change string
	}{
		{"sharp, listed once", sharp[:len(sharp)-1], refSharp, "repeated the trailing-edge point (point 1) at the end"},
		{"blunt, base closed", append(append([]Point(nil), blunt...), blunt[0]), refBlunt, "closing the blunt trailing edge with a straight base; dropped it"},
		{"sharp, from the lower surface", append(append([]Point(nil), sharp[60:80]...), sharp[:60]...), refSharp, "started the contour at the sharp corner at point 21"},
	} {
		sec, rep := mustClean(t, c.name, c.pts, DefaultCleanOptions)
		if d := maxDist(sec.Points(), c.ref.Points()); d > 1e-12 {
			t.Errorf("%s: differs by %g\n%s", c.name, d, rep)
		}
		if !strings.Contains(strings.Join(rep.Changes, "\n"), c.change) {
			t.Errorf("%s: changes lack %q\n%s", c.name, c.change, rep)
		}
	}
}

// TestCleanFindsTrailingEdge lists sections of very different shape from
// several starting points, both ways round: the trailing edge must be
// found each time, giving the same section as the conventional listing.
func TestCleanFindsTrailingEdge(t *testing.T) {
	for _, s := range []struct {
		name    string
		m, p, t float64
		n       int
	}{
		{"NACA 0004, thin", 0, 0.4, 0.04, 61},
		{"NACA 0030, thick", 0, 0.4, 0.30, 61},
		{"NACA 9512, flap-like camber", 0.09, 0.5, 0.12, 61},
		{"NACA 4412, 15 points per surface", 0.04, 0.4, 0.12, 15},
	} {
		up, lo := nacaSurfaces(s.m, s.p, s.t, s.n)
		var loop []Point
		for i := len(up) - 1; i >= 0; i-- {
			loop = append(loop, up[i])
		}
		loop = append(loop, lo[1:]...)
		ref, _ := mustClean(t, s.name, loop, DefaultCleanOptions)
		for _, start := range []int{0, 1, s.n / 3, s.n - 1, s.n + 2, 2*s.n - 3} {
			pts := append(append([]Point(nil), loop[start:]...), loop[:start]...)
			for _, rev := range []bool{false, true} {
				in := pts
				if rev {
					in = reversed(pts)
				}
				got, rep := mustClean(t, s.name, in, DefaultCleanOptions)
				if d := maxDist(got.Points(), ref.Points()); d > 1e-9 {
					t.Errorf("%s from point %d, reversed %v: differs by %g\n%s", s.name, start+1, rev, d, rep)
				}
			}
		}
	}
}

// TestCleanRandomContours feeds random point sets (fixed seed) to Clean:
// it must not panic, must return typed errors, and every section it
// returns must be finite with its leading edge at the origin.
func TestCleanRandomContours(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for trial := range 2000 {
		n := 1 + rng.IntN(40)
		pts := make([]Point, n)
		for i := range pts {
			switch rng.IntN(4) {
			case 0:
				if i > 0 {
					pts[i] = pts[i-1] // duplicates
					continue
				}
				fallthrough
			default:
				pts[i] = Point{rng.NormFloat64(), rng.NormFloat64() * 0.1}
			}
		}
		opt := CleanOptions{Derotate: trial%2 == 0, CloseTE: trial%3 == 0}
		sec, rep, err := Clean("random", pts, opt)
		if rep == nil {
			t.Fatalf("trial %d: no report", trial)
		}
		if err != nil {
			var ce *ContourError
			if !errors.As(err, &ce) {
				t.Fatalf("trial %d: error %T is not a *ContourError: %v", trial, err, err)
			}
			continue
		}
		for i := range sec.Len() {
			if !sec.At(i).IsFinite() {
				t.Fatalf("trial %d: point %d is %v", trial, i, sec.At(i))
			}
		}
		checkLeadingEdge(t, sec, rep)
	}
}

// TestCleanCloseTELimit: a gap above MaxCloseTEGap is left open, with a
// warning, even with CloseTE.
func TestCleanCloseTELimit(t *testing.T) {
	for _, c := range []struct {
		open   float64 // added to each surface at the trailing edge, in chords
		closed bool
	}{{0.04, true}, {0.08, false}} {
		pts := testLoop(41)
		for i := range pts {
			switch {
			case i < 40:
				pts[i].Y += c.open * pts[i].X
			case i > 40:
				pts[i].Y -= c.open * pts[i].X
			}
		}
		sec, rep := mustClean(t, "gap", pts, CleanOptions{Derotate: true, CloseTE: true})
		if got := sec.TrailingEdgeGap() == 0; got != c.closed {
			t.Errorf("gap %.3g: closed %v, want %v\n%s", rep.TEGap, got, c.closed, rep)
		}
		left := false
		for _, w := range rep.Warnings {
			left = left || w.Kind == WarnBluntTE && strings.Contains(w.Message, "left open")
		}
		if left == c.closed {
			t.Errorf("gap %.3g: warning of a gap left open %v\n%s", rep.TEGap, left, rep)
		}
	}
}

// TestCleanIdempotent: cleaning a cleaned section changes nothing (a study
// re-cleans the sections it embeds).
func TestCleanIdempotent(t *testing.T) {
	for _, c := range []struct {
		name string
		pts  []Point
		opt  CleanOptions
	}{
		{"NACA 2412, leading edge inserted", testLoop(41), DefaultCleanOptions},
		{"NACA 2412, closed", testLoop(41), CleanOptions{Derotate: true, CloseTE: true}},
		{"NACA 0012 moved", malformedLoop(t, "millimetres-inclined.dat"), DefaultCleanOptions},
	} {
		once, _ := mustClean(t, c.name, c.pts, c.opt)
		twice, rep := mustClean(t, c.name, once.Points(), c.opt)
		if d := maxDist(once.Points(), twice.Points()); d > 1e-12 {
			t.Errorf("%s: moved by %g on the second pass\n%s", c.name, d, rep)
		}
		if len(rep.Changes) != 0 {
			t.Errorf("%s: second pass reports changes\n%s", c.name, rep)
		}
	}
}

func malformedLoop(t *testing.T, file string) []Point {
	t.Helper()
	p, err := ParseCoordinates(strings.NewReader(string(malformedCorpus()[file])), file)
	if err != nil {
		t.Fatal(err)
	}
	return p.Points
}

// TestCleanKeepsFileChord: a file already in the frame (a listed point at
// the origin, the trailing edge on +x) keeps its chord line, as published
// coordinates define it, although the cambered section's farthest point
// from the trailing edge is elsewhere; moved off that frame, the same
// section gets the farthest point as its leading edge.
func TestCleanKeepsFileChord(t *testing.T) {
	in := testLoop(41) // NACA 2412: nose of the mean line at (0, 0)
	sec, rep := mustClean(t, "in frame", in, DefaultCleanOptions)
	if d := maxDist(sec.Points(), in); d > 1e-12 || len(rep.Changes) != 0 {
		t.Errorf("moved by %g\n%s", d, rep)
	}
	if !strings.Contains(strings.Join(rep.Detected, "\n"), "the file's own chord line is kept") {
		t.Errorf("not reported:\n%s", rep)
	}
	var mm []Point
	for _, p := range in {
		mm = append(mm, p.Scale(250)) // millimetres, same frame
	}
	sec2, rep2 := mustClean(t, "in millimetres", mm, DefaultCleanOptions)
	if d := maxDist(sec2.Points(), in); d > 1e-12 {
		t.Errorf("millimetres: moved by %g\n%s", d, rep2)
	}
	var off []Point
	for _, p := range in {
		off = append(off, p.Add(Point{0.01, 0}))
	}
	sec3, rep3 := mustClean(t, "offset", off, DefaultCleanOptions)
	if !strings.Contains(strings.Join(rep3.Changes, "\n"), "inserted the leading edge found on the spline") {
		t.Errorf("offset: spline leading edge not used\n%s", rep3)
	}
	// The two chord lines differ by the angle of the farthest point seen
	// from the trailing edge, about 0.09° here: mid-chord points move by
	// about half a chord times that angle.
	if sec3.Len() != sec.Len()+1 || sec3.At(20).Dist(sec.At(20)) < 1e-4 {
		t.Errorf("offset: %d points, mid-chord point %v, in frame %v", sec3.Len(), sec3.At(20), sec.At(20))
	}
}

// bluntBaseLoop returns a symmetric section with a blunt trailing edge
// whose base is drawn with base interior points, as CAD exports list it:
// upper corner, upper surface, leading edge, lower surface, lower corner,
// the points up the base, and (closed) the upper corner again. The
// thickness is the NACA 0012 form of Abbott & von Doenhoff (1959, ch. 6)
// plus 0.0125·x, so the base is 2·(0.6·0.0021 + 0.0125) = 0.02752 of the
// chord high (closed form).
func bluntBaseLoop(n, base int, closed bool) []Point {
	yt := func(x float64) float64 {
		return 0.6*(0.2969*math.Sqrt(x)-0.1260*x-0.3516*x*x+0.2843*x*x*x-0.1015*x*x*x*x) + 0.0125*x
	}
	var loop []Point
	for i := n - 1; i >= 0; i-- {
		x := (1 - math.Cos(math.Pi*float64(i)/float64(n-1))) / 2
		loop = append(loop, Point{x, yt(x)})
	}
	for i := 1; i < n; i++ {
		x := (1 - math.Cos(math.Pi*float64(i)/float64(n-1))) / 2
		loop = append(loop, Point{x, -yt(x)})
	}
	h := yt(1)
	for k := 1; k <= base; k++ {
		loop = append(loop, Point{1, -h + 2*h*float64(k)/float64(base+1)})
	}
	if closed {
		loop = append(loop, loop[0])
	}
	return loop
}

// TestCleanDrawnBase: a blunt trailing edge drawn with points on its base
// is found as one trailing edge at the base's midpoint, not at one corner
// (which rotated the chord: a symmetric section gave Cl −0.84 at α = 0).
// The cleaned section is symmetric about its chord, the base points are
// gone and the report says so.
func TestCleanDrawnBase(t *testing.T) {
	const wantGap = 2 * (0.6*0.0021 + 0.0125) // closed form, see bluntBaseLoop
	rotate := func(pts []Point, deg float64, scale float64, shift Point) []Point {
		out := make([]Point, len(pts))
		for i, p := range pts {
			out[i] = p.Rotate(Point{}, deg*math.Pi/180).Scale(scale).Add(shift)
		}
		return out
	}
	startAt := func(pts []Point, k int) []Point { // an open loop started at point k
		return append(append([]Point{}, pts[k:]...), pts[:k]...)
	}
	reverse := func(pts []Point) []Point {
		out := make([]Point, len(pts))
		for i, p := range pts {
			out[len(pts)-1-i] = p
		}
		return out
	}
	open5 := bluntBaseLoop(61, 5, false)
	for _, tc := range []struct {
		name string
		pts  []Point
	}{
		{"closed, 3 base points", bluntBaseLoop(61, 3, true)},
		{"open, 5 base points", open5},
		{"one base point", bluntBaseLoop(61, 1, true)},
		{"started on the base", startAt(open5, len(open5)-2)},
		{"clockwise", reverse(bluntBaseLoop(61, 3, true))},
		{"inclined, in millimetres", rotate(bluntBaseLoop(61, 4, true), -12, 250, Point{40, -7})},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sec, rep := mustClean(t, tc.name, tc.pts, DefaultCleanOptions)
			p := sec.Points()
			n := len(p)
			if n != 2*61-1 {
				t.Errorf("%d points, want %d (base points dropped)", n, 2*61-1)
			}
			const tol = 1e-9 // rounding of the normalisation
			for i := range n {
				a, b := p[i], p[n-1-i]
				if math.Abs(a.X-b.X) > tol || math.Abs(a.Y+b.Y) > tol {
					t.Fatalf("not symmetric about the chord at point %d: %v and %v", i+1, a, b)
				}
			}
			if mid := p[0].Add(p[n-1]).Scale(0.5); mid.Dist(Point{1, 0}) > tol {
				t.Errorf("trailing-edge midpoint %v, want (1, 0)", mid)
			}
			if math.Abs(rep.TEGap-wantGap) > 1e-9 {
				t.Errorf("gap %.6f, want %.6f", rep.TEGap, wantGap)
			}
			if !strings.Contains(strings.Join(rep.Changes, "\n"), "base's midpoint") || !strings.Contains(strings.Join(rep.Detected, "\n"), "blunt base drawn") {
				t.Errorf("the report does not say the base was found:\n%s", rep)
			}
		})
	}
}

// TestCleanRefusesSeveralLoops: a main plane and a flap drawn in one file
// (each a closed loop) used to be accepted as one section and solved; it
// is refused with the reason, naming where the second loop starts.
func TestCleanRefusesSeveralLoops(t *testing.T) {
	main := naca0012Loop(31)
	var flap []Point
	for _, p := range naca0012Loop(21) {
		flap = append(flap, p.Rotate(Point{}, -0.4).Scale(0.3).Add(Point{1.02, -0.06}))
	}
	for _, tc := range []struct {
		name  string
		pts   []Point
		loops int
		at    int // zero-based first point of the second loop
	}{
		{"main plane and flap", append(append([]Point{}, main...), flap...), 2, len(main)},
		{"three loops", append(append(append([]Point{}, main...), flap...), main...), 3, len(main)},
		{"second loop left open", append(append([]Point{}, main...), flap[:len(flap)-1]...), 2, len(main)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, _, err := Clean(tc.name, tc.pts, DefaultCleanOptions)
			var ce *ContourError
			if !errors.Is(err, ErrSeveralLoops) || !errors.As(err, &ce) || ce.Index != tc.at {
				t.Fatalf("error %v, want ErrSeveralLoops at point %d", err, tc.at+1)
			}
			if want := fmt.Sprintf("%d closed loops", tc.loops); !strings.Contains(err.Error(), want) || !strings.Contains(err.Error(), "own element") {
				t.Errorf("message %q does not say %q and what to do", err, want)
			}
		})
	}
	// One loop closed at its end is one section.
	if _, _, err := Clean("one loop", main, DefaultCleanOptions); err != nil {
		t.Errorf("one closed loop: %v", err)
	}
}

// TestCleanNamesAnOutlier: a point far off the contour (a typing error)
// used to become the leading edge, turning the section until the solver
// failed with an internal message about the node order; it is refused as
// an outlier, by number and position.
func TestCleanNamesAnOutlier(t *testing.T) {
	for _, k := range []int{5, 30, 44} {
		pts := naca0012Loop(31)
		pts[k] = Point{3, 2}
		_, _, err := Clean("typo", pts, DefaultCleanOptions)
		var ce *ContourError
		if !errors.Is(err, ErrOutlier) || !errors.As(err, &ce) || ce.Index != k || !strings.Contains(err.Error(), "(3, 2)") {
			t.Errorf("outlier at point %d: %v", k+1, err)
		}
	}
	// Sparse, blunt and ordinary sections are not outliers.
	for name, pts := range map[string][]Point{
		"NACA 0012, 61 points": naca0012Loop(31),
		"drawn base":           bluntBaseLoop(31, 3, true),
		"diamond":              {{1, 0}, {0.5, 0.1}, {0, 0}, {0.5, -0.1}, {1, 0}},
		"sparse, 9 points":     naca0012Loop(5),
	} {
		if i, _, _ := outlierPoint(pts); i >= 0 {
			t.Errorf("%s: point %d taken for an outlier", name, i+1)
		}
	}
}

// TestCleanWarnsWithoutATrailingEdge: a circle or an ellipse has no
// corner to take as the trailing edge; the one chosen is arbitrary and
// the report says so. Sections with a sharp or a blunt trailing edge get
// no such warning.
func TestCleanWarnsWithoutATrailingEdge(t *testing.T) {
	ellipse := func(n int, b float64) []Point {
		var pts []Point
		for i := range n {
			th := 2 * math.Pi * float64(i) / float64(n)
			pts = append(pts, Point{0.5 + 0.5*math.Cos(th), b * math.Sin(th)})
		}
		return pts
	}
	has := func(rep *CleanReport) bool {
		for _, w := range rep.Warnings {
			if w.Kind == WarnNoTE {
				return true
			}
		}
		return false
	}
	for _, tc := range []struct {
		name string
		pts  []Point
		want bool
	}{
		{"circle", ellipse(60, 0.5), true},
		{"ellipse", ellipse(80, 0.1), true},
		{"NACA 0012", naca0012Loop(31), false},
		{"drawn base", bluntBaseLoop(31, 3, true), false},
		{"sparse NACA 0012", naca0012Loop(5), false},
	} {
		_, rep := mustClean(t, tc.name, tc.pts, DefaultCleanOptions)
		if has(rep) != tc.want {
			t.Errorf("%s: warned %v, want %v\n%s", tc.name, has(rep), tc.want, rep)
		}
	}
}

// TestCleanReportNamesFileLines: the cleaning report names the points it
// drops and finds by their file lines too. Points are numbered in the
// joined loop (two surfaces listed from the leading edge: the first runs
// backwards), which a user cannot find in the file; the report read
// "dropped 3 duplicate points …: points 32, 43, 64" of a hand-typed
// NACA 2412 whose repeats sit on lines 14, 48 and 69.
func TestCleanReportNamesFileLines(t *testing.T) {
	var b strings.Builder
	b.WriteString("hand typed (invented)\n")
	upper := [][2]float64{{0, 0}, {0.05, 0.04}, {0.2, 0.07}, {0.2, 0.07}, {0.5, 0.06}, {0.8, 0.03}, {1, 0.001}}
	lower := [][2]float64{{0, 0}, {0.05, -0.03}, {0.2, -0.04}, {0.5, -0.03}, {0.8, -0.01}, {1, -0.001}}
	for _, p := range append(upper, lower...) {
		fmt.Fprintf(&b, "%g %g\n", p[0], p[1])
	}
	// Lines: 1 name, 2–8 upper (the repeat on line 5), 9–14 lower (its
	// leading edge on line 9 repeats line 2).
	parsed, err := ParseCoordinates(strings.NewReader(b.String()), "hand.dat")
	if err != nil {
		t.Fatal(err)
	}
	_, rep, err := parsed.Clean(DefaultCleanOptions)
	if err != nil {
		t.Fatal(err)
	}
	text := strings.Join(append(rep.Detected, rep.Changes...), "\n")
	for _, want := range []string{"on lines 4, 9 of the file", "leading edge: point 7 on line 2"} {
		if !strings.Contains(text, want) {
			t.Errorf("report lacks %q:\n%s", want, text)
		}
	}
	// Without lines (points given directly) it says only the points.
	if _, rep, err = Clean("direct", parsed.Points, DefaultCleanOptions); err != nil || strings.Contains(strings.Join(rep.Changes, " "), "line") {
		t.Errorf("report without lines: %v, %q", err, rep.Changes)
	}
}
