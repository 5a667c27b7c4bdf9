package solver

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"sectionbench/model"
	"sectionbench/model/modeltest"
)

// ellipseNodes returns n panels' worth of nodes (n+1 points, the first and
// last coinciding) on the ellipse (cx + a cos η, b sin η), η = 2πi/n,
// counter-clockwise from the rear end of the major axis: the node order of
// the package (rear "trailing edge" → upper → front → lower). The front node
// is at i = n/2. It is modeltest.Ellipse (b ≤ a) scaled to the chord 2a.
func ellipseNodes(n int, a, b, cx float64) []model.Point {
	pts := modeltest.Ellipse(b/a, n+1).Points()
	for i, p := range pts {
		pts[i] = model.Point{X: cx + 2*a*(p.X-0.5), Y: 2 * a * p.Y}
	}
	return pts
}

// circleConfig is the circle of radius 1/2 through (0, 0) and (1, 0).
func circleConfig(n int) Config {
	return Config{Elements: []Element{{Name: "circle", Nodes: ellipseNodes(n, 0.5, 0.5, 0.5), LE: n / 2}}}
}

// nacaElement returns a NACA section with the given panels (cosine spaced
// by the generator), transformed by f (nil: none).
func nacaElement(t testing.TB, des string, panels int) Element {
	t.Helper()
	sec, err := model.NACA(des, model.NACAOptions{PointsPerSurface: panels/2 + 1})
	if err != nil {
		t.Fatal(err)
	}
	return Element{Name: sec.Name(), Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}
}

// transform returns e rotated by alphaDeg nose-up about its leading edge
// (clockwise), scaled by k and moved by d.
func transform(e Element, alphaDeg, k float64, d model.Point) Element {
	out := Element{Name: e.Name, LE: e.LE, Nodes: make([]model.Point, len(e.Nodes))}
	le := e.Nodes[e.LE]
	for i, p := range e.Nodes {
		out.Nodes[i] = p.Rotate(le, -alphaDeg*math.Pi/180).Sub(le).Scale(k).Add(le).Add(d)
	}
	return out
}

// mirror returns e reflected about y = y0, node order reversed so that it
// still runs counter-clockwise from its trailing edge.
func mirror(e Element, y0 float64) Element {
	n := len(e.Nodes)
	out := Element{Name: e.Name + " mirrored", LE: n - 1 - e.LE, Nodes: make([]model.Point, n)}
	for i, p := range e.Nodes {
		out.Nodes[n-1-i] = model.Point{X: p.X, Y: 2*y0 - p.Y}
	}
	return out
}

func mustSystem(t testing.TB, cfg Config) *System {
	t.Helper()
	s, err := NewSystem(cfg)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// relErr is the shared relative error of the project's checks.
var relErr = modeltest.RelErr

func TestNewSystemGeometryErrors(t *testing.T) {
	good := ellipseNodes(40, 0.5, 0.1, 0.5)
	with := func(f func([]model.Point) []model.Point) []model.Point {
		c := append([]model.Point(nil), good...)
		return f(c)
	}
	reversed := with(func(p []model.Point) []model.Point {
		for i, j := 0, len(p)-1; i < j; i, j = i+1, j-1 {
			p[i], p[j] = p[j], p[i]
		}
		return p
	})
	for _, tc := range []struct {
		name      string
		cfg       Config
		want      error
		wantElem  int
		wantPanel int
	}{
		{"no elements", Config{}, ErrNoElements, -1, -1},
		{"three nodes", Config{Elements: []Element{{Nodes: good[:3], LE: 1}}}, ErrTooFewPanels, 0, -1},
		{"NaN node", Config{Elements: []Element{{Nodes: with(func(p []model.Point) []model.Point { p[7].Y = math.NaN(); return p }), LE: 20}}}, ErrNonFinite, 0, 7},
		{"repeated node", Config{Elements: []Element{{Nodes: with(func(p []model.Point) []model.Point { p[12] = p[11]; return p }), LE: 20}}}, ErrDegeneratePanel, 0, 11},
		{"clockwise", Config{Elements: []Element{{Nodes: reversed, LE: 20}}}, ErrClockwise, 0, -1},
		{"leading edge index", Config{Elements: []Element{{Nodes: good, LE: 0}}}, ErrLeadingEdge, 0, -1},
		{"below ground", Config{Ground: true, GroundY: -0.05, Elements: []Element{{Nodes: good, LE: 20}}}, ErrBelowGround, 0, 24},
		{"second element", Config{Elements: []Element{{Nodes: good, LE: 20}, {Nodes: reversed, LE: 20}}}, ErrClockwise, 1, -1},
		{"negative reference chord", Config{RefChord: -1, Elements: []Element{{Nodes: good, LE: 20}}}, ErrBadRefChord, -1, -1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := NewSystem(tc.cfg)
			if !errors.Is(err, tc.want) {
				t.Fatalf("error %v, want %v", err, tc.want)
			}
			var ge *GeometryError
			if !errors.As(err, &ge) {
				t.Fatalf("error %T is not a *GeometryError", err)
			}
			if ge.Element != tc.wantElem || ge.Panel != tc.wantPanel {
				t.Errorf("element %d panel %d, want %d %d (%v)", ge.Element, ge.Panel, tc.wantElem, tc.wantPanel, err)
			}
			if !strings.HasPrefix(err.Error(), "solver: ") {
				t.Errorf("message %q lacks the package prefix", err)
			}
		})
	}
}

// Two coincident copies of one element make duplicate rows: the matrix is
// singular in exact arithmetic, so NewSystem must refuse it or warn.
func TestNewSystemCoincidentElements(t *testing.T) {
	e := Element{Name: "a", Nodes: ellipseNodes(40, 0.5, 0.1, 0.5), LE: 20}
	s, err := NewSystem(Config{Elements: []Element{e, e}})
	if err != nil {
		var se *SingularError
		if !errors.Is(err, ErrSingular) || !errors.As(err, &se) {
			t.Fatalf("error %v does not wrap ErrSingular", err)
		}
		return
	}
	if s.Cond() < CondWarn || len(s.Warnings()) == 0 {
		t.Errorf("coincident elements accepted with cond %g and no warning", s.Cond())
	}
}

func TestNewSystemTEWarnings(t *testing.T) {
	open5 := func() Element {
		sec, err := model.NACA("0012", model.NACAOptions{PointsPerSurface: 21})
		if err != nil {
			t.Fatal(err)
		}
		pts := sec.Points()
		// Open the trailing edge to 5% of chord.
		pts[0].Y, pts[len(pts)-1].Y = 0.025, -0.025
		return Element{Nodes: pts, LE: sec.LeadingEdgeIndex()}
	}
	closed := func(n int) Element {
		sec, err := model.NACA("0012", model.NACAOptions{PointsPerSurface: n/2 + 1, ClosedTE: true})
		if err != nil {
			t.Fatal(err)
		}
		return Element{Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}
	}
	for _, tc := range []struct {
		name string
		el   Element
		want []string // substrings, one per expected warning
	}{
		// The standard 0.25% gap, longer and shorter than the last
		// panels (6.2e-3 at 40, 3.9e-4 at 160): the base source keeps the
		// Cp next to it bounded either way, so no warning.
		{"NACA 0012, 40 panels", nacaElement(t, "0012", 40), nil},
		{"NACA 0012, 160 panels", nacaElement(t, "0012", 160), nil},
		{"NACA 0012 closed, 160 panels", closed(160), nil},
		{"gap 5% of chord", open5(), []string{"doubtful beyond"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			w := mustSystem(t, Config{Elements: []Element{tc.el}}).Solve(0).Warnings
			if len(w) != len(tc.want) {
				t.Fatalf("warnings %q, want %d", w, len(tc.want))
			}
			for i := range w {
				if !strings.Contains(w[i], tc.want[i]) {
					t.Errorf("warning %q, want one about %q", w[i], tc.want[i])
				}
			}
		})
	}
}

// CpMin is the lowest Cp over every surface panel, and on an open
// trailing edge (where the base source keeps the last panels' Cp bounded)
// it is the suction peak near the leading edge, in Solve and Sweep alike.
func TestCpMinOverAllPanels(t *testing.T) {
	for _, n := range []int{160, 320, 640} {
		s := mustSystem(t, Config{Elements: []Element{nacaElement(t, "0012", n)}})
		e := s.Solve(4).Elements[0]
		low, xc := math.Inf(1), 0.0
		for _, p := range e.Panels {
			if p.Cp < low {
				low, xc = p.Cp, p.XC
			}
		}
		if e.CpMin != low || e.XCpMin != xc {
			t.Errorf("%d panels: CpMin %.6f at %.4f, lowest panel Cp %.6f at %.4f", n, e.CpMin, e.XCpMin, low, xc)
		}
		if !(e.XCpMin < 0.05 && e.CpMin > -2 && e.CpMin < -1) {
			t.Errorf("%d panels: CpMin %.3f at x/c %.4f, want the suction peak near the leading edge", n, e.CpMin, e.XCpMin)
		}
		if sw := s.Sweep([]float64{4})[0]; math.Abs(sw.CpMin-e.CpMin) > 1e-12 || sw.XCpMin != e.XCpMin {
			t.Errorf("%d panels: sweep CpMin %.6f at %.4f, Solve %.6f at %.4f", n, sw.CpMin, sw.XCpMin, e.CpMin, e.XCpMin)
		}
	}
}

func TestGroundModeRejectsAngle(t *testing.T) {
	cfg := circleConfig(40)
	cfg.Ground, cfg.GroundY = true, -1
	s := mustSystem(t, cfg)
	s.Solve(0) // allowed
	for _, f := range []func(){func() { s.Solve(2) }, func() { s.Sweep([]float64{0, 1}) }} {
		func() {
			defer func() {
				r := recover()
				if msg, ok := r.(string); !ok || !strings.HasPrefix(msg, "solver: ") {
					t.Errorf("panic %v, want a solver: message", r)
				}
			}()
			f()
		}()
	}
}

// Superposition of the unit solutions equals a direct solve with the
// right-hand side of the angle itself.
func TestSolveSuperposition(t *testing.T) {
	two := Config{Elements: []Element{nacaElement(t, "4412", 80), transform(nacaElement(t, "0012", 60), 20, 0.4, model.Point{X: 1.02, Y: -0.05})}}
	s := mustSystem(t, two)
	a, _, _ := s.geo.assemble(context.Background())
	for _, alpha := range []float64{-7, 0, 3.5, 12} {
		sn, c := math.Sincos(alpha * math.Pi / 180)
		b := mat.NewVecDense(s.geo.n, nil)
		for _, e := range s.geo.elems {
			for i := range e.np {
				p := s.geo.panels[e.p0+i]
				b.SetVec(e.u0+i, -(c*p.nx + sn*p.ny))
			}
			if e.open() {
				b.SetVec(e.us, -(c*e.base.nx + sn*e.base.ny))
			}
		}
		var want mat.VecDense
		if err := want.SolveVec(a, b); err != nil {
			t.Fatal(err)
		}
		got := s.Solve(alpha).g
		for i := range got {
			if math.Abs(got[i]-want.AtVec(i)) > 1e-10*(1+math.Abs(want.AtVec(i))) {
				t.Fatalf("α=%g: γ[%d] = %.15g, direct solve %.15g", alpha, i, got[i], want.AtVec(i))
			}
		}
	}
}

// The matrix rows depend only on geometry: filling rows in parallel must
// give exactly the serial result.
func TestAssembleParallelMatchesSerial(t *testing.T) {
	g, err := newGeometry(Config{Elements: []Element{nacaElement(t, "2412", 120)}, Ground: true, GroundY: -0.3})
	if err != nil {
		t.Fatal(err)
	}
	a, _, _ := g.assemble(context.Background())
	sc := newRowScratch(200)
	row := make([]float64, g.n)
	rhs := make([]float64, 1)
	for r := range g.n {
		g.fillRow(r, row, rhs, sc)
		for c := range row {
			if row[c] != a.At(r, c) {
				t.Fatalf("A[%d,%d] = %g, serial %g", r, c, a.At(r, c), row[c])
			}
		}
	}
}

func TestTimingsRecorded(t *testing.T) {
	tm := mustSystem(t, Config{Elements: []Element{nacaElement(t, "2412", 100)}}).Timings()
	if tm.Assembly <= 0 || tm.Factorization <= 0 || tm.UnitSolves <= 0 {
		t.Errorf("timings %+v, want all positive", tm)
	}
}

// A system whose context is already done is not built: NewSystemContext
// returns the context's error.
func TestNewSystemContextCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := NewSystemContext(ctx, Config{Elements: []Element{nacaElement(t, "2412", 200)}}); !errors.Is(err, context.Canceled) {
		t.Errorf("NewSystemContext with a cancelled context: %v, want context.Canceled", err)
	}
}
