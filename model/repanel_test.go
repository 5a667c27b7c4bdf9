package model

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// repanelTestSections returns cleaned sections of several kinds: open and
// closed trailing edges, symmetric and cambered, generated and mapped.
func repanelTestSections(t testing.TB) []*Section {
	t.Helper()
	var out []*Section
	for _, c := range []struct {
		code string
		opt  NACAOptions
	}{
		{"0012", NACAOptions{}},
		{"2412", NACAOptions{ClosedTE: true}},
		{"23012", NACAOptions{PointsPerSurface: 81}},
	} {
		s, err := NACA(c.code, c.opt)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, s)
	}
	kt, err := KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 10}.Section(161)
	if err != nil {
		t.Fatal(err)
	}
	return append(out, kt)
}

var repanelLaws = []Panelling{
	{Spacing: SpacingCosine},
	{Spacing: SpacingUniform},
	{Spacing: SpacingBlend},
	{Spacing: SpacingBlend, Nose: 0.5, Tail: 0.2},
	{Spacing: SpacingBlend, Nose: 1, Tail: 1},
	{Spacing: SpacingCurvature},
}

func TestRepanelProperties(t *testing.T) {
	for _, s := range repanelTestSections(t) {
		sp, err := NewContourSpline(s.Points())
		if err != nil {
			t.Fatal(err)
		}
		_, le := sp.LeadingEdge()
		for _, law := range repanelLaws {
			for _, n := range []int{MinPanels, 17, 160, 501, MaxPanels} {
				p := law
				p.Panels = n
				t.Run(fmt.Sprintf("%s/%s-%g-%g/%d", s.Name(), p.Spacing, p.Nose, p.Tail, n), func(t *testing.T) {
					r, err := Repanel(s, p)
					if err != nil {
						t.Fatal(err)
					}
					if r.Len() != n+1 || r.Name() != s.Name() {
						t.Fatalf("%d nodes named %q, want %d", r.Len(), r.Name(), n+1)
					}
					if r.At(0) != s.At(0) || r.At(n) != s.At(s.Len()-1) {
						t.Errorf("end nodes %v, %v, want the input's %v, %v", r.At(0), r.At(n), s.At(0), s.At(s.Len()-1))
					}
					nu := (n + 1) / 2
					if d := r.At(nu).Dist(le); d > 1e-9 {
						t.Errorf("node %d is %g from the spline's leading edge", nu, d)
					}
					if i := r.LeadingEdgeIndex(); i != nu {
						t.Errorf("LeadingEdgeIndex %d, want the node at the spline's leading edge, %d", i, nu)
					}
					ts, err := repanelParams(sp, p)
					if err != nil {
						t.Fatal(err)
					}
					for i := 1; i <= n; i++ {
						if !(ts[i] > ts[i-1]) {
							t.Fatalf("parameter %d (%g) not beyond %g: arc length not monotone", i, ts[i], ts[i-1])
						}
					}
					for i := 1; i < n; i++ {
						if d := r.At(i).Dist(sp.At(ts[i])); d > 1e-15 {
							t.Fatalf("node %d is off the spline by %g", i, d)
						}
					}
					if a, b := r.SignedArea(), s.SignedArea(); math.Abs(a-b) > 0.05*b {
						t.Errorf("area %g, input's %g", a, b)
					}
				})
			}
		}
	}
}

func TestRepanelCosine(t *testing.T) {
	// Cosine spacing: x = (1 − cos β)/2 with β uniform on [0, π] on each
	// surface (Kuethe & Chow, Foundations of Aerodynamics; Katz & Plotkin,
	// Low-Speed Aerodynamics, 2nd ed., sec. 11.1). On a symmetric section
	// with its leading edge at (0, 0) and trailing edge at x = 1 the chord
	// coordinate is x itself; on a cambered one it is the chordwise
	// projection ξ scaled to the surface's trailing-edge point.
	for _, s := range repanelTestSections(t) {
		sp, err := NewContourSpline(s.Points())
		if err != nil {
			t.Fatal(err)
		}
		_, le := sp.LeadingEdge()
		te := s.At(0).Add(s.At(s.Len() - 1)).Scale(0.5)
		ch := te.Sub(le)
		xi := func(p Point) float64 { return p.Sub(le).Dot(ch) / ch.Dot(ch) }
		symmetric := s.Name() == "NACA 0012"
		for _, n := range []int{16, 17, 160, 2000} {
			r, err := Repanel(s, Panelling{Panels: n, Spacing: SpacingCosine})
			if err != nil {
				t.Fatal(err)
			}
			nu := (n + 1) / 2
			nl := n - nu
			endU, endL := xi(s.At(0)), xi(s.At(s.Len()-1))
			for i := range n + 1 {
				var want float64
				if i <= nu {
					want = endU * (1 - math.Cos(math.Pi*float64(nu-i)/float64(nu))) / 2
				} else {
					want = endL * (1 - math.Cos(math.Pi*float64(i-nu)/float64(nl))) / 2
				}
				got := xi(r.At(i))
				if symmetric {
					got = r.At(i).X
				}
				if math.Abs(got-want) > 1e-9 {
					t.Errorf("%s N=%d node %d: x = %.12f, want %.12f", s.Name(), n, i, got, want)
				}
			}
		}
	}
}

func TestRepanelCosineHook(t *testing.T) {
	// A lower surface whose x runs backwards for a while (a hook) has no
	// station for every x: the cosine law falls back to cosine spacing in
	// arc length there, s/S = (1 − cos πu)/2, and keeps x-based spacing on
	// the regular upper surface.
	const m = 60
	var pts []Point
	for i := m; i >= 0; i-- { // upper, TE to LE
		u := (1 - math.Cos(math.Pi*float64(i)/m)) / 2
		pts = append(pts, Point{u, 0.12 * math.Sqrt(u) * (1 - u)})
	}
	for i := 1; i <= m; i++ { // lower, LE to TE, hooked between u = 0.7 and 0.9
		u := (1 - math.Cos(math.Pi*float64(i)/m)) / 2
		x := u
		if u > 0.7 && u < 0.9 {
			x -= 0.2 * math.Sin(math.Pi*(u-0.7)/0.2)
		}
		pts = append(pts, Point{x, -0.12 * math.Sqrt(u) * (1 - u)})
	}
	s, err := NewSection("hooked", pts)
	if err != nil {
		t.Fatal(err)
	}
	sp, err := NewContourSpline(pts)
	if err != nil {
		t.Fatal(err)
	}
	const n = 80
	ts, err := repanelParams(sp, Panelling{Panels: n, Spacing: SpacingCosine})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Repanel(s, Panelling{Panels: n, Spacing: SpacingCosine})
	if err != nil {
		t.Fatal(err)
	}
	nu := n / 2
	for i := 0; i <= nu; i++ {
		want := (1 - math.Cos(math.Pi*float64(nu-i)/float64(nu))) / 2
		if math.Abs(r.At(i).X-want) > 1e-9 {
			t.Errorf("upper node %d: x = %.12f, want %.12f", i, r.At(i).X, want)
		}
	}
	sLE, S := sp.ArcLength(ts[nu]), sp.TotalArcLength()-sp.ArcLength(ts[nu])
	backwards := false
	for j := 0; j <= n-nu; j++ {
		want := (1 - math.Cos(math.Pi*float64(j)/float64(n-nu))) / 2
		if got := (sp.ArcLength(ts[nu+j]) - sLE) / S; math.Abs(got-want) > 1e-9 {
			t.Errorf("lower node %d: s/S = %.12f, want %.12f", j, got, want)
		}
		if j > 0 && r.At(nu+j).X < r.At(nu+j-1).X {
			backwards = true
		}
	}
	if !backwards {
		t.Error("no lower node steps backwards in x: the hook was not resolved")
	}
}

func TestRepanelRandomSections(t *testing.T) {
	// Property check over random NACA sections and panellings (fixed
	// seed): node count, end points, leading-edge node and strictly
	// increasing spline parameters.
	rng := rand.New(rand.NewPCG(7, 11))
	lines := []string{"210", "220", "230", "240", "250", "221", "231", "241", "251"}
	for range 40 {
		var code string
		if rng.IntN(2) == 0 {
			m := rng.IntN(10)
			p := 0
			if m > 0 {
				p = 1 + rng.IntN(9)
			}
			code = fmt.Sprintf("%d%d%02d", m, p, 4+rng.IntN(27))
		} else {
			code = fmt.Sprintf("%s%02d", lines[rng.IntN(len(lines))], 6+rng.IntN(20))
		}
		s, err := NACA(code, NACAOptions{PointsPerSurface: 21 + rng.IntN(200), ClosedTE: rng.IntN(2) == 0})
		if err != nil {
			t.Fatalf("%s: %v", code, err)
		}
		p := Panelling{
			Panels:  MinPanels + rng.IntN(MaxPanels/4),
			Spacing: Spacings[rng.IntN(len(Spacings))],
			Nose:    rng.Float64(),
			Tail:    rng.Float64(),
		}
		r, err := Repanel(s, p)
		if err != nil {
			t.Fatalf("%s %+v: %v", code, p, err)
		}
		sp, _ := NewContourSpline(s.Points())
		_, le := sp.LeadingEdge()
		ts, _ := repanelParams(sp, p)
		if r.Len() != p.Panels+1 || r.At(0) != s.At(0) || r.At(p.Panels) != s.At(s.Len()-1) || r.At((p.Panels+1)/2).Dist(le) > 1e-9 {
			t.Errorf("%s %+v: bad ends or leading edge", code, p)
		}
		for i := 1; i < len(ts); i++ {
			if !(ts[i] > ts[i-1]) {
				t.Errorf("%s %+v: parameter %d not increasing", code, p, i)
				break
			}
		}
	}
}

func TestRepanelUniform(t *testing.T) {
	// Equal arc length between nodes on each surface, measured on the
	// spline.
	for _, s := range repanelTestSections(t) {
		sp, _ := NewContourSpline(s.Points())
		const n = 101
		ts, err := repanelParams(sp, Panelling{Panels: n, Spacing: SpacingUniform})
		if err != nil {
			t.Fatal(err)
		}
		nu := (n + 1) / 2
		su := sp.ArcLength(ts[nu]) / float64(nu)
		sl := (sp.TotalArcLength() - sp.ArcLength(ts[nu])) / float64(n-nu)
		for i := 1; i <= n; i++ {
			want := su
			if i > nu {
				want = sl
			}
			if d := sp.ArcLength(ts[i]) - sp.ArcLength(ts[i-1]) - want; math.Abs(d) > 1e-12 {
				t.Errorf("%s panel %d: arc length off by %g", s.Name(), i-1, d)
			}
		}
	}
}

// lePanel returns the shorter of the two panels next to the leading-edge
// node, and tePanel the shorter of the first and last panel.
func lePanel(r *Section) float64 {
	l := PanelLengths(r)
	nu := (len(l) + 1) / 2
	return math.Min(l[nu-1], l[nu])
}

func tePanel(r *Section) float64 {
	l := PanelLengths(r)
	return math.Min(l[0], l[len(l)-1])
}

func TestRepanelBlend(t *testing.T) {
	for _, s := range repanelTestSections(t) {
		const n = 160
		// More nose clustering shrinks the smallest leading-edge panel, more
		// tail clustering the smallest trailing-edge panel.
		prevLE, prevTE := math.Inf(1), math.Inf(1)
		for _, c := range []float64{0, 0.25, 0.5, 0.75, 1} {
			rn, err := Repanel(s, Panelling{Panels: n, Spacing: SpacingBlend, Nose: c, Tail: 0.3})
			if err != nil {
				t.Fatal(err)
			}
			rt, err := Repanel(s, Panelling{Panels: n, Spacing: SpacingBlend, Nose: 0.3, Tail: c})
			if err != nil {
				t.Fatal(err)
			}
			if l := lePanel(rn); !(l < prevLE) {
				t.Errorf("%s nose %g: leading-edge panel %g, not below %g", s.Name(), c, l, prevLE)
			} else {
				prevLE = l
			}
			if l := tePanel(rt); !(l < prevTE) {
				t.Errorf("%s tail %g: trailing-edge panel %g, not below %g", s.Name(), c, l, prevTE)
			} else {
				prevTE = l
			}
		}
		// Nose = Tail = 0 is the uniform law.
		b, _ := Repanel(s, Panelling{Panels: n, Spacing: SpacingBlend})
		u, _ := Repanel(s, Panelling{Panels: n, Spacing: SpacingUniform})
		for i := range n + 1 {
			if d := b.At(i).Dist(u.At(i)); d > 1e-12 {
				t.Errorf("%s: blend 0,0 node %d differs from uniform by %g", s.Name(), i, d)
			}
		}
		// Nose = Tail = 1 clusters at the leading edge at least as strongly
		// as cosine spacing, and about as strongly at the trailing edge.
		b, _ = Repanel(s, Panelling{Panels: n, Spacing: SpacingBlend, Nose: 1, Tail: 1})
		c, _ := Repanel(s, Panelling{Panels: n, Spacing: SpacingCosine})
		if lePanel(b) > lePanel(c) {
			t.Errorf("%s: blend 1,1 leading-edge panel %g, cosine %g", s.Name(), lePanel(b), lePanel(c))
		}
		if tePanel(b) > 2*tePanel(c) {
			t.Errorf("%s: blend 1,1 trailing-edge panel %g, cosine %g", s.Name(), tePanel(b), tePanel(c))
		}
	}
	// The map is strictly increasing from 0 to 1 for all parameters.
	for _, nose := range []float64{0, 0.3, 1} {
		for _, tail := range []float64{0, 0.6, 1} {
			if blendMap(0, nose, tail) != 0 || math.Abs(blendMap(1, nose, tail)-1) > 1e-15 {
				t.Errorf("blend %g,%g: ends %g, %g", nose, tail, blendMap(0, nose, tail), blendMap(1, nose, tail))
			}
			for u := 0.001; u <= 1; u += 0.001 {
				if !(blendMap(u, nose, tail) > blendMap(u-0.001, nose, tail)) {
					t.Fatalf("blend %g,%g not increasing at %g", nose, tail, u)
				}
			}
		}
	}
}

func TestRepanelCurvature(t *testing.T) {
	// Each panel carries an equal share of the node density
	// ρ = (1 − w)/S + w √|κ|/∫√|κ| ds: n ∫ρ ds over each panel of a
	// surface of n panels is 1, to the law's tabulation error.
	for _, s := range repanelTestSections(t) {
		sp, _ := NewContourSpline(s.Points())
		const n = 200
		p := Panelling{Panels: n, Spacing: SpacingCurvature}
		ts, err := repanelParams(sp, p)
		if err != nil {
			t.Fatal(err)
		}
		nu := n / 2
		for _, surf := range []struct{ a, b, panels int }{{0, nu, nu}, {nu, n, n - nu}} {
			S := sp.ArcLength(ts[surf.b]) - sp.ArcLength(ts[surf.a])
			K := 0.0
			const m = 20000
			for j := range m {
				t0 := ts[surf.a] + (ts[surf.b]-ts[surf.a])*float64(j)/m
				t1 := ts[surf.a] + (ts[surf.b]-ts[surf.a])*float64(j+1)/m
				K += math.Sqrt(math.Abs(sp.Curvature((t0+t1)/2))) * (sp.ArcLength(t1) - sp.ArcLength(t0))
			}
			for i := surf.a; i < surf.b; i++ {
				share := 0.0
				const sub = 50
				for j := range sub {
					t0 := ts[i] + (ts[i+1]-ts[i])*float64(j)/sub
					t1 := ts[i] + (ts[i+1]-ts[i])*float64(j+1)/sub
					rho := (1-curvatureWeight)/S + curvatureWeight*math.Sqrt(math.Abs(sp.Curvature((t0+t1)/2)))/K
					share += rho * (sp.ArcLength(t1) - sp.ArcLength(t0)) * float64(surf.panels)
				}
				if math.Abs(share-1) > 0.005 {
					t.Errorf("%s panel %d: density share %g, want 1", s.Name(), i, share)
				}
			}
		}
		// Panels are shorter at the nose than at mid-chord.
		r, _ := Repanel(s, p)
		l := PanelLengths(r)
		if lePanel(r) > 0.5*l[nu/2] {
			t.Errorf("%s: leading-edge panel %g, mid-chord %g", s.Name(), lePanel(r), l[nu/2])
		}
	}
}

func TestRepanelErrors(t *testing.T) {
	s, err := NACA("2412", NACAOptions{PointsPerSurface: 31})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		p     Panelling
		field string
	}{
		{Panelling{Panels: MinPanels - 1, Spacing: SpacingCosine}, "panelling.panels"},
		{Panelling{Panels: MaxPanels + 1, Spacing: SpacingCosine}, "panelling.panels"},
		{Panelling{Panels: 100, Spacing: "bunched"}, "panelling.spacing"},
		{Panelling{Panels: 100, Spacing: SpacingBlend, Nose: 1.5}, "panelling.nose"},
		{Panelling{Panels: 100, Spacing: SpacingBlend, Tail: math.NaN()}, "panelling.tail"},
	} {
		var fe *FieldError
		if _, err := Repanel(s, tc.p); !errors.As(err, &fe) || fe.Field != tc.field {
			t.Errorf("%+v: error %v, want a FieldError on %s", tc.p, err, tc.field)
		}
	}
	pts := s.Points()
	pts[7] = pts[6]
	dup, err := NewSection("dup", pts)
	if err != nil {
		t.Fatal(err)
	}
	var pe *PointError
	if _, err := Repanel(dup, DefaultPanelling); !errors.Is(err, ErrDuplicatePoint) || !errors.As(err, &pe) || pe.Index != 7 {
		t.Errorf("repeated point: error %v, want ErrDuplicatePoint at index 7", err)
	}
	// A contour whose farthest point from the trailing-edge midpoint is
	// an end point has no leading edge to split it.
	hook, err := NewSection("hook", []Point{{1, 0}, {0.8, 0.1}, {0.5, 0.15}, {0.3, 0.1}, {0.2, 0}, {-3, 0}})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Repanel(hook, DefaultPanelling); !errors.Is(err, ErrNoLeadingEdge) {
		t.Errorf("hook: error %v, want ErrNoLeadingEdge", err)
	}
}

func TestPanelLengthsAndRatios(t *testing.T) {
	s, err := NewSection("steps", []Point{{0, 0}, {1, 0}, {1, 2}, {1, 2.5}, {1, 3}, {0, 3}})
	if err != nil {
		t.Fatal(err)
	}
	wantL := []float64{1, 2, 0.5, 0.5, 1}
	wantR := []float64{2, 4, 1, 2}
	l, r := PanelLengths(s), NeighbourRatios(s)
	if len(l) != len(wantL) || len(r) != len(wantR) {
		t.Fatalf("lengths %v, ratios %v", l, r)
	}
	for i := range wantL {
		if math.Abs(l[i]-wantL[i]) > 1e-15 {
			t.Errorf("length %d = %g, want %g", i, l[i], wantL[i])
		}
	}
	for i := range wantR {
		if math.Abs(r[i]-wantR[i]) > 1e-15 {
			t.Errorf("ratio %d = %g, want %g", i, r[i], wantR[i])
		}
	}
}

func BenchmarkRepanel(b *testing.B) {
	s, err := NACA("23012", NACAOptions{})
	if err != nil {
		b.Fatal(err)
	}
	for _, sp := range Spacings {
		b.Run(string(sp), func(b *testing.B) {
			p := Panelling{Panels: 160, Spacing: sp, Nose: 0.5, Tail: 0.2}
			for b.Loop() {
				if _, err := Repanel(s, p); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// The default panelling passes the neighbour-ratio check it is judged by
// (a ratio of at most 1.5 between neighbours, common practice), with the
// cosine law's trailing-edge ends left out as the check leaves them out
// (TrailingEdgeRatiosExempt).
func TestDefaultPanellingPassesRatioCheck(t *testing.T) {
	for _, des := range []string{"0012", "2412", "4412"} {
		sec, err := NACA(des, NACAOptions{})
		if err != nil {
			t.Fatal(err)
		}
		sec, err = Repanel(sec, DefaultPanelling)
		if err != nil {
			t.Fatal(err)
		}
		r := NeighbourRatios(sec)
		for i, v := range r {
			if CheckedRatio(i, len(r)) && v > 1.5 {
				t.Errorf("NACA %s, default panelling: neighbour ratio %.3f at node %d > 1.5", des, v, i+1)
			}
		}
	}
}
