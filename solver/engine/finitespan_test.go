package engine

import (
	"context"
	"errors"
	"math"
	"testing"

	"sectionbench/model"
	"sectionbench/model/modeltest"
	"sectionbench/solver"
	"sectionbench/solver/liftingline"
)

// The estimate of an upright NACA 2412 wing of aspect ratio 6 in free air
// from the panel method's (inviscid) polar agrees with the lifting line of
// the straight curve through the polar's points at α ± 1° (validated in
// package liftingline against Anderson, ch. 5) to 1 %: the panel polar
// bends a little over the angles the stations reach (its lift goes as
// sin α). The forces are q S times the coefficients, and the finite wing
// carries less than the two-dimensional figure over the span.
func TestFiniteSpanMatchesStraightCurve(t *testing.T) {
	st, secs := engineStudy(t, "2412")
	st.Flow.AlphaDeg, st.Flow.SpeedMPS = 5, 20
	c := st.Elements[0].ChordMM / 1000
	st.Flow.SpanM = 6 * c
	e := NewEngine()
	fs, res, err := e.FiniteSpan(context.Background(), Request{Study: st, Sections: secs})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(fs.AspectRatio-6) > 1e-9 || fs.EffectiveAspectRatio != fs.AspectRatio || fs.LowAspectRatio {
		t.Fatalf("aspect ratio %g, effective %g; want 6 without end plates", fs.AspectRatio, fs.EffectiveAspectRatio)
	}
	var lo, hi float64
	for _, r := range res.Sweep {
		switch r.AlphaDeg {
		case 4:
			lo = r.Cl
		case 6:
			hi = r.Cl
		}
	}
	slope := (hi - lo) / 2 * 180 / math.Pi
	zero := 5 - (lo+hi)/2/(slope*math.Pi/180)
	want, err := liftingline.Solve(liftingline.Rectangular(st.Flow.SpanM, c), liftingline.Linear{SlopePerRad: slope, ZeroLiftDeg: zero}, 5, liftingline.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if modeltest.RelErr(fs.Load, want.CL) > 0.01 {
		t.Errorf("C_L %.4f, straight curve %.4f", fs.Load, want.CL)
	}
	if modeltest.RelErr(fs.CDi, want.CDi) > 0.02 {
		t.Errorf("C_Di %.5f, straight curve %.5f", fs.CDi, want.CDi)
	}
	q := res.Forces.DynamicPressurePa
	if modeltest.RelErr(fs.LoadN, q*st.Flow.SpanM*c*fs.Load) > 1e-12 {
		t.Errorf("lift %g N is not q S C_L", fs.LoadN)
	}
	if !(fs.LoadN < fs.Load2DN) || !(fs.InducedDragN > 0) {
		t.Errorf("lift %g N, two-dimensional over the span %g N, induced drag %g N", fs.LoadN, fs.Load2DN, fs.InducedDragN)
	}
	if fs.GroundHeightM != 0 {
		t.Errorf("free air: the lifting line %g m above a ground", fs.GroundHeightM)
	}
	if !math.IsNaN(fs.ProfileDragN) || fs.ViscousPolar {
		t.Errorf("profile drag %g N from an inviscid polar, want NaN", fs.ProfileDragN)
	}
	if len(fs.Stations) != liftingline.DefaultStations || !(fs.Stations[0].LoadPerSpan > fs.Stations[len(fs.Stations)-1].LoadPerSpan) {
		t.Errorf("spanwise load does not fall from the centre to the tip: %+v", fs.Stations)
	}
}

// End plates raise the effective aspect ratio by AR(1 + 1.9 h/b) and with
// it the load, and lower the induced drag for a given load; the inverted two-element example
// in ground effect gives downforce (positive) below its two-dimensional
// figure over the span.
func TestFiniteSpanEndPlatesInverted(t *testing.T) {
	st, secs := modeltest.LoadStudy(t, "../../testdata/studies/rear-wing.json")
	e := NewEngine()
	bare, _, err := e.FiniteSpan(context.Background(), Request{Study: st, Sections: secs})
	if err != nil {
		t.Fatal(err)
	}
	st.Flow.EndPlateHeightMM = 250
	plated, _, err := e.FiniteSpan(context.Background(), Request{Study: st, Sections: secs})
	if err != nil {
		t.Fatal(err)
	}
	// The lifting line lies at the main element's quarter chord, above
	// the ground by more than the clearance (the lowest point) and less
	// than the clearance and the chord.
	l := clearanceM(st)
	if !(bare.GroundHeightM > l && bare.GroundHeightM < l+st.Elements[0].ChordMM/1000) {
		t.Errorf("lifting line %.3f m above the ground, clearance %.3f m", bare.GroundHeightM, l)
	}
	t.Logf("lifting line %.3f m above the ground; 2-D × span %.1f N; no plates %.1f N (AR %.2f, e %.3f, induced %.1f N); plates 250 mm %.1f N (AR %.2f, induced %.1f N); polar %g..%g°",
		bare.GroundHeightM, bare.Load2DN, bare.LoadN, bare.EffectiveAspectRatio, bare.Efficiency, bare.InducedDragN, plated.LoadN, plated.EffectiveAspectRatio, plated.InducedDragN, plated.PolarFromDeg, plated.PolarToDeg)
	// The README: below an effective aspect ratio of about 4 the lifting
	// line is flagged a rough guide.
	if !bare.LowAspectRatio || !plated.LowAspectRatio || LowAspectRatioLimit != 4 {
		t.Errorf("aspect ratios %.2f and %.2f not flagged below %d", bare.EffectiveAspectRatio, plated.EffectiveAspectRatio, LowAspectRatioLimit)
	}
	if want := bare.AspectRatio * (1 + 1.9*0.25/st.Flow.SpanM); math.Abs(plated.EffectiveAspectRatio-want) > 1e-12 {
		t.Errorf("effective aspect ratio %g, want %g", plated.EffectiveAspectRatio, want)
	}
	if !(bare.LoadN > 0 && bare.LoadN < plated.LoadN && plated.LoadN < plated.Load2DN) {
		t.Errorf("downforce: no plates %g N, plates %g N, two-dimensional over the span %g N", bare.LoadN, plated.LoadN, plated.Load2DN)
	}
	// At the same angle the plated wing carries more load; its induced
	// drag for a given load, C_Di/C_L², is what falls.
	if f, g := plated.CDi/(plated.Load*plated.Load), bare.CDi/(bare.Load*bare.Load); !(f < g) {
		t.Errorf("induced drag factor C_Di/C_L² with plates %g, not below %g without", f, g)
	}
}

func clearanceM(st *model.Study) float64 { return st.Ground.ClearanceMM / 1000 }

func TestFiniteSpanNeedsSpan(t *testing.T) {
	st, secs := engineStudy(t, "0012")
	_, _, err := NewEngine().FiniteSpan(context.Background(), Request{Study: st, Sections: secs})
	var fe *model.FieldError
	if !errors.As(err, &fe) || fe.Field != "flow.span_m" {
		t.Errorf("error %v, want one on flow.span_m", err)
	}
}

// A finite-span estimate whose stations need the polar beyond the angles
// the coupled solution converged at, on a side where it was solved and
// failed, is refused at once (viscousEdge): widening the sweep would only
// solve more angles that fail. Elsewhere the estimate may widen it.
func TestViscousEdge(t *testing.T) {
	rows := func(from, to float64) *Result {
		r := &Result{SweepCoupled: []CoupledPoint{}}
		for a := from; a <= to; a++ {
			r.Sweep = append(r.Sweep, solver.Coefficients{AlphaDeg: a})
		}
		return r
	}
	for _, tc := range []struct {
		name string
		res  *Result
		re   liftingline.RangeError
		want bool
	}{
		{"below the converged rows, failed rows below them", rows(-13, 5), liftingline.RangeError{AlphaDeg: -12.004, FromDeg: -12, ToDeg: 5}, true},
		{"above the converged rows, failed rows above them", rows(-13, 5), liftingline.RangeError{AlphaDeg: 4.5, FromDeg: -13, ToDeg: 4}, true},
		{"below the sweep, every row converged", rows(-13, 5), liftingline.RangeError{AlphaDeg: -13.5, FromDeg: -13, ToDeg: 5}, false},
		{"the panel method's polar", &Result{Sweep: rows(-13, 5).Sweep}, liftingline.RangeError{AlphaDeg: -12.004, FromDeg: -12, ToDeg: 5}, false},
	} {
		if got := viscousEdge(tc.res, &tc.re); got != tc.want {
			t.Errorf("%s: %v, want %v", tc.name, got, tc.want)
		}
	}
}

// Below the lowest converged row of a coupled sweep the finite-span
// polar takes the panel method's lift less the viscous loss at that row,
// and its drag (polarTable); above it the coupled rows stand, a failed
// row among them stays empty, and nothing is extended when the lowest
// row converged.
func TestPolarTableExtendsBelowViscous(t *testing.T) {
	nan := math.NaN()
	res := &Result{}
	for a := -15.0; a <= 3; a++ {
		inv := 0.1 * (a + 4)
		p := CoupledPoint{AlphaDeg: a, Cl: nan, Cd: nan, ClInviscid: inv}
		if a >= -12 && a != 0 {
			p.Converged, p.Cl, p.Cd = true, 0.09*(a+4)-0.02, 0.01+0.001*(a+12)
		}
		res.Sweep = append(res.Sweep, solver.Coefficients{AlphaDeg: a, Cl: inv})
		res.SweepCoupled = append(res.SweepCoupled, p)
	}
	al, load, cd, used, extended, from := polarTable(res, -1)
	if extended != 3 || from != -12 || used != len(al)-1 {
		t.Fatalf("extended %d rows from %g°, %d of %d used; want 3 from −12°, all but the failed 0°", extended, from, used, len(al))
	}
	loss := (0.09*(-12+4) - 0.02) - 0.1*(-12+4)
	for i, a := range al {
		switch {
		case a < -12:
			want := -(0.1*(a+4) + loss)
			if math.Abs(load[i]-want) > 1e-12 || cd[i] != 0.01 {
				t.Errorf("α %g°: load %g, drag %g; want %g and the −12° row's 0.01", a, load[i], cd[i], want)
			}
		case a == 0:
			if !math.IsNaN(load[i]) {
				t.Errorf("the failed 0° row has load %g", load[i])
			}
		default:
			if want := -(0.09*(a+4) - 0.02); math.Abs(load[i]-want) > 1e-12 {
				t.Errorf("α %g°: load %g, want the coupled %g", a, load[i], want)
			}
		}
	}
	res.SweepCoupled[0].Converged, res.SweepCoupled[0].Cl = true, 0.5
	if _, _, _, _, extended, _ := polarTable(res, 1); extended != 0 {
		t.Errorf("extended %d rows below a converged lowest row", extended)
	}
}

// The two-element example as it opens (viscous, tripped, in ground
// effect) gives a finite-span estimate: its tips work below −12°, where
// its viscous polar ends, and there the polar is extended from the panel
// method (polarTable) and says so; the finite wing carries less than the
// two-dimensional figure over the span (common practice).
func TestFiniteSpanExampleViscous(t *testing.T) {
	if testing.Short() {
		t.Skip("a viscous two-element sweep: run without -short")
	}
	st, secs := modeltest.LoadStudy(t, "../../assets/examples/two-element-ground.json")
	if !st.Viscous.Enabled {
		t.Fatal("the example opens with its viscous solution off; this test is about the viscous one")
	}
	fs, _, err := NewEngine().FiniteSpan(context.Background(), Request{Study: st, Sections: secs})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("downforce %.1f N (2-D over the span %.1f N), polar %g° to %g°, %d of %d rows, %d extended: %s", fs.LoadN, fs.Load2DN, fs.PolarFromDeg, fs.PolarToDeg, fs.PolarRowsUsed, fs.PolarRows, fs.PolarExtended, fs.ExtensionNote())
	if !fs.ViscousPolar || !(fs.LoadN > 0) || !(fs.LoadN < fs.Load2DN) || !(fs.ProfileDragN > 0) {
		t.Errorf("downforce %g N, 2-D %g N, profile drag %g N, viscous polar %v", fs.LoadN, fs.Load2DN, fs.ProfileDragN, fs.ViscousPolar)
	}
	if (fs.PolarExtended > 0) != (fs.ExtensionNote() != "") {
		t.Errorf("%d rows extended, note %q", fs.PolarExtended, fs.ExtensionNote())
	}
}
