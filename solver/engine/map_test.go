package engine

import (
	"context"
	"errors"
	"math"
	"sync/atomic"
	"testing"

	"sectionbench/model"
	"sectionbench/model/modeltest"
)

func mustRange(t testing.TB, spec string) model.SetupRange {
	t.Helper()
	r, err := model.ParseSetupRange(spec)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// exampleStudy loads one of the invented example studies the app ships.
func exampleStudy(t testing.TB, name string) (*model.Study, []*model.Section) {
	t.Helper()
	return modeltest.LoadStudy(t, "../../assets/examples/"+name)
}

// An inviscid map is the engine's solve at each grid point, bit for bit,
// in row-major order of the ranges, whichever goroutine solved it; each
// and progress see every point once.
func TestMapInviscidReproducesRun(t *testing.T) {
	st, secs := exampleStudy(t, "two-element-ground.json")
	st.Viscous.Enabled = false // Run's answer is then the panel method's, as the map's
	ranges := []model.SetupRange{mustRange(t, "clearance_mm=60:100:20"), mustRange(t, "alpha_deg=0:4:2")}
	var seen, last atomic.Int64
	pts, err := Map(context.Background(), st, secs, ranges, MapOptions{PointOptions: PointOptions{Inviscid: true}},
		func(done, total int) { last.Store(int64(done)); _ = total },
		func(Point) { seen.Add(1) })
	if err != nil {
		t.Fatal(err)
	}
	if len(pts) != 9 || seen.Load() != 9 || last.Load() != 9 {
		t.Fatalf("%d points, each saw %d, progress reached %d; want 9", len(pts), seen.Load(), last.Load())
	}
	for k, p := range pts {
		h, a := 60+20*float64(k/3), 2*float64(k%3)
		if p.Values[0] != h || p.Values[1] != a || p.Index[0] != k/3 || p.Index[1] != k%3 {
			t.Fatalf("point %d has values %v index %v, want [%g %g]", k, p.Values, p.Index, h, a)
		}
		one := st.Clone()
		one.Ground.ClearanceMM, one.Flow.AlphaDeg = h, a
		res := run(t, NewEngine(), one, secs, false)
		if p.Viscous || !p.Converged || p.Err != "" {
			t.Fatalf("point %d: viscous %v converged %v err %q", k, p.Viscous, p.Converged, p.Err)
		}
		if p.Cl != res.Solution.Cl || p.Cm != res.Solution.Cm || p.DownforcePerSpan != res.Forces.DownforcePerSpan {
			t.Errorf("h %g α %g: map Cl %v Cm %v downforce %v, solve %v %v %v", h, a, p.Cl, p.Cm, p.DownforcePerSpan, res.Solution.Cl, res.Solution.Cm, res.Forces.DownforcePerSpan)
		}
		if !math.IsNaN(p.Cd) || !(p.DownforcePerSpan > 0) || p.ClearanceMM != h || !(p.Elements[1].GapMM > 0) {
			t.Errorf("h %g α %g: Cd %v downforce %v clearance %v gap %v", h, a, p.Cd, p.DownforcePerSpan, p.ClearanceMM, p.Elements[1].GapMM)
		}
	}
}

// A viscous map of angle of attack in free air (NACA 0012 at Re 6e6,
// tripped, where the coupled solution converges and has one root:
// DEVELOPERS.md), each angle started from its neighbour as a polar is
// walked, agrees with the engine's solve of every angle within
// SolveAgreementTolerance, and says so truly (checkAgainstSolve).
func TestMapViscousAlpha(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves")
	}
	st, secs := coupledStudy(t)
	st.Viscous.Enabled = false // the map turns it on
	st.Flow.SpeedMPS = 20      // for the forces; Re stays the study's 6e6
	ranges := []model.SetupRange{mustRange(t, "alpha_deg=-2:4:1")}
	compared, plain := mapTwice(t, st, secs, ranges)
	count := checkAgainstSolve(t, st, secs, ranges, compared, plain)
	if count[SingleAnotherRoot]+count[SingleNoAnswer] > 0 {
		t.Errorf("single solve: %v; want every angle to agree", count)
	}
	for _, p := range plain {
		if !p.Viscous || !p.Converged || !(p.Cd > 0) || !(p.DragPerSpan > 0) {
			t.Errorf("α %g: viscous %v converged %v Cd %v drag %v N/m", p.Values[0], p.Viscous, p.Converged, p.Cd, p.DragPerSpan)
		}
	}
}

// Bad ranges are refused before anything is solved, naming the variable;
// cancellation returns the context's error and no points.
func TestMapErrors(t *testing.T) {
	st, secs := exampleStudy(t, "single-free-air.json")
	_, err := Map(context.Background(), st, secs, []model.SetupRange{mustRange(t, "clearance_mm=20:60:10")}, MapOptions{}, nil, nil)
	var se *model.SetupError
	if !errors.As(err, &se) || se.Variable != "clearance_mm" || !errors.Is(err, model.ErrNotInStudy) {
		t.Errorf("clearance in free air: err = %v", err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	var n atomic.Int64
	pts, err := Map(ctx, st, secs, []model.SetupRange{mustRange(t, "alpha_deg=0:10:0.5")}, MapOptions{PointOptions: PointOptions{Inviscid: true}}, nil,
		func(Point) {
			if n.Add(1) == 3 {
				cancel()
			}
		})
	if !errors.Is(err, context.Canceled) || pts != nil {
		t.Errorf("cancelled map: %d points, err %v", len(pts), err)
	}
}

// A setting the flap cannot take (a gap it cannot reach at that overlap
// and deflection) is a point with its reason, not an error of the map.
func TestMapPointErrors(t *testing.T) {
	st, secs := exampleStudy(t, "two-element-ground.json")
	pts, err := Map(context.Background(), st, secs, []model.SetupRange{mustRange(t, "elements[1].gap_mm=-40:0:40")}, MapOptions{PointOptions: PointOptions{Inviscid: true}}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	p := pts[0]
	if p.Err == "" || p.Converged || !math.IsNaN(p.Cl) || !math.IsNaN(p.DownforcePerSpan) {
		t.Errorf("gap -40 mm: err %q converged %v Cl %v", p.Err, p.Converged, p.Cl)
	}
}

// Ride height with the viscous solution: an inverted single element's
// downforce rises as the clearance falls over h/c 1.0 → 0.2 (common
// practice; measured on an inverted wing by Zerihan & Zhang, J. Aircraft
// 37(6), 2000, whose downforce peaks near h/c 0.1 and falls below it as
// the suction side separates). The case is NACA 0012 on a 1 m chord at
// Re 6e6 tripped at 5 %, 4° (leading edge down), where the coupled
// solution converges away from the ground; the test asserts the rise over
// the converged points and reports, without forcing it, whether and
// where the curve turns, mapping h/c 0.05–0.2 as well. Measured: −Cl
// 0.495 at h/c 1.0 rising to 0.751 at 0.3 (the README quotes both, to
// ±0.001) and 0.957 at 0.2; the turn lies below this range (solver's
// TestCoupledGroundPeak), where the second map reports it.
func TestMapRideHeightTrend(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves")
	}
	st, secs := coupledStudy(t)
	st.Viscous.Enabled = false // the map turns it on
	st.Inverted = true
	st.Flow.AlphaDeg = 4
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 1000}
	pts, err := Map(context.Background(), st, secs, []model.SetupRange{mustRange(t, "clearance_mm=200:1000:100")}, MapOptions{}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	var conv []Point
	for i := len(pts) - 1; i >= 0; i-- { // from h/c 1.0 down
		p := pts[i]
		if !p.Converged {
			t.Logf("h/c %.1f: not converged", p.Values[0]/1000)
			continue
		}
		conv = append(conv, p)
	}
	if len(conv) < 5 {
		t.Fatalf("only %d of %d clearances converged", len(conv), len(pts))
	}
	for i := 1; i < len(conv); i++ {
		hi, lo := conv[i-1], conv[i]
		if lo.Load() <= hi.Load() {
			t.Errorf("downforce turns between h/c %.1f (−Cl %.4f) and %.1f (−Cl %.4f): over h/c 1.0 → 0.2 it should rise", hi.Values[0]/1000, hi.Load(), lo.Values[0]/1000, lo.Load())
		}
	}
	if low := conv[len(conv)-1].Values[0] / 1000; low > 0.2 {
		t.Logf("no turn found: the lowest converged clearance is h/c %.1f", low)
	}
	for _, want := range []struct{ h, load float64 }{{1000, 0.495}, {300, 0.751}} {
		for _, p := range conv {
			if p.Values[0] == want.h && math.Abs(p.Load()-want.load) > 1e-3 {
				t.Errorf("h/c %.1f: −Cl %.4f, the README says %.3f", want.h/1000, p.Load(), want.load)
			}
		}
	}
	for _, p := range conv {
		t.Logf("h/c %.1f: −Cl %.4f, Cd %.5f", p.Values[0]/1000, p.Load(), p.Cd)
	}

	// Below the range the source's rise is stated for: where the curve
	// turns, reported and not asserted (Zerihan & Zhang's peak near h/c
	// 0.1 is of their section and Reynolds number, not this case's).
	low, err := Map(context.Background(), st, secs, []model.SetupRange{mustRange(t, "clearance_mm=50:200:25")}, MapOptions{}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	peak := -1
	for i, p := range low {
		if !p.Converged {
			t.Logf("h/c %.3f: not converged", p.Values[0]/1000)
			continue
		}
		t.Logf("h/c %.3f: −Cl %.4f, Cd %.5f", p.Values[0]/1000, p.Load(), p.Cd)
		if peak < 0 || p.Load() > low[peak].Load() {
			peak = i
		}
	}
	switch {
	case peak < 0:
		t.Logf("below h/c 0.2 nothing converged: no turn found")
	case peak == 0:
		t.Logf("no turn down to h/c %.3f: downforce still rises there", low[0].Values[0]/1000)
	case peak == len(low)-1:
		t.Logf("downforce falls below h/c %.3f", low[peak].Values[0]/1000)
	default:
		t.Logf("downforce turns at h/c %.3f (−Cl %.4f), between h/c %.3f and %.3f", low[peak].Values[0]/1000, low[peak].Load(), low[peak-1].Values[0]/1000, low[peak+1].Values[0]/1000)
	}
}

// One goroutine or two, the map is the same, point for point (each point
// is solved by an engine of its own chain, whatever goroutine runs it).
func TestMapWorkersAgree(t *testing.T) {
	st, secs := exampleStudy(t, "two-element-ground.json")
	ranges := []model.SetupRange{mustRange(t, "elements[1].deflection_deg=10:20:5"), mustRange(t, "alpha_deg=1:3:1")}
	opt := MapOptions{PointOptions: PointOptions{Inviscid: true}}
	one, err := Map(context.Background(), st, secs, ranges, MapOptions{PointOptions: opt.PointOptions, Workers: 1}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	two, err := Map(context.Background(), st, secs, ranges, MapOptions{PointOptions: opt.PointOptions, Workers: 2}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	for k := range one {
		if one[k].Cl != two[k].Cl || one[k].Values[0] != two[k].Values[0] || one[k].Values[1] != two[k].Values[1] {
			t.Errorf("point %d: one worker %v Cl %v, two %v Cl %v", k, one[k].Values, one[k].Cl, two[k].Values, two[k].Cl)
		}
	}
}
