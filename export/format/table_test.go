package format

import (
	"bytes"
	"encoding/csv"
	"flag"
	"math"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"sectionbench/export/exporttest"
	"sectionbench/model"
	"sectionbench/solver"
	bl "sectionbench/solver/boundarylayer"
	"sectionbench/solver/engine"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// golden compares got with the golden file name in testdata/golden at the
// repository root, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	exporttest.GoldenText(t, filepath.Join("..", "..", "testdata", "golden", name), got, *update,
		"go test ./export/format -run "+t.Name()+" -update")
}

// readCSV reads a CSV whose metadata comment lines start with "#".
func readCSV(t *testing.T, b []byte) [][]string {
	t.Helper()
	r := csv.NewReader(bytes.NewReader(b))
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatalf("not valid CSV: %v", err)
	}
	return recs
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	if s == "" {
		return math.NaN()
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// relClose reports whether a and b agree to TableDigits significant digits
// (half a unit in the last printed digit).
func relClose(a, b float64) bool {
	if math.IsNaN(a) || math.IsNaN(b) {
		return math.IsNaN(a) && math.IsNaN(b)
	}
	return math.Abs(a-b) <= 0.5*math.Pow(10, 1-TableDigits)*math.Abs(b)+1e-300
}

func TestCpTable(t *testing.T) {
	sol := exporttest.Solution(exporttest.TwoElementLayout(40), 3)
	var b bytes.Buffer
	if err := WriteCpTable(&b, Metadata{Study: "demo", AlphaDeg: NoAngle}, sol); err != nil {
		t.Fatal(err)
	}
	// The units say whose Cp it is: the panel method's, beside the
	// coupled viscous Cp the workbench shows.
	if !strings.Contains(b.String(), "the panel method's, inviscid") {
		t.Errorf("the cp table does not say its cp is inviscid:\n%s", b.String()[:min(b.Len(), 600)])
	}
	recs := readCSV(t, b.Bytes())
	want := []string{"element", "side", "x_mm", "y_mm", "xc", "cp", "tangential_velocity"}
	if len(recs[0]) != len(want) {
		t.Fatalf("header %v, want %v", recs[0], want)
	}
	for i := range want {
		if recs[0][i] != want[i] {
			t.Fatalf("header %v, want %v", recs[0], want)
		}
	}
	rows := recs[1:]
	k := 0
	for _, e := range sol.Elements {
		for _, p := range e.Panels {
			r := rows[k]
			k++
			if r[0] != e.Name || r[1] != p.Side.String() {
				t.Fatalf("row %d: %v for %s %v", k, r, e.Name, p.Side)
			}
			for j, v := range []float64{p.X * 1000, p.Y * 1000, p.XC, p.Cp, p.Vt} {
				if g := num(t, r[j+2]); !relClose(g, v) {
					t.Errorf("row %d column %s = %g, want %g", k, want[j+2], g, v)
				}
			}
		}
	}
	if k != len(rows) {
		t.Errorf("%d rows, want %d panels", len(rows), k)
	}
}

// TestSweepTableGolden writes the synthetic sweep (closed forms, see
// synthSweep) with and without drag columns.
func TestSweepTableGolden(t *testing.T) {
	sw := exporttest.Sweep()
	dr := exporttest.Drag(sw)
	dr[2].Cd = math.NaN() // the estimate failed at one angle: an empty cell
	for _, c := range []struct {
		name string
		drag []engine.ViscousPoint
		cols int
	}{
		{"sweep.csv", nil, 7},
		{"sweep_drag.csv", dr, 12},
	} {
		var b bytes.Buffer
		if err := WriteSweepTable(&b, Metadata{Study: "synthetic sweep (invented)", Reynolds: 5e5, Program: "Sectionbench test"}, sw, c.drag); err != nil {
			t.Fatal(err)
		}
		recs := readCSV(t, b.Bytes())
		if len(recs) != len(sw)+1 || len(recs[0]) != c.cols {
			t.Fatalf("%s: %d rows of %d columns", c.name, len(recs), len(recs[0]))
		}
		for i, s := range sw {
			if g := num(t, recs[i+1][1]); !relClose(g, s.Cl) {
				t.Errorf("%s: cl[%d] = %g, want %g", c.name, i, g, s.Cl)
			}
		}
		if c.drag != nil && recs[3][6] != "" {
			t.Errorf("%s: unavailable cd written as %q", c.name, recs[3][6])
		}
		golden(t, c.name, b.Bytes())
	}
}

// TestSweepTableFlags: each row of a sweep table says in words which
// plausibility cautions it raises (engine.RowFlags): a suction peak beyond
// the plausible one, a clearance below a tenth of the chord, the one-way
// estimate or the coupled solution separated, past maximum lift or not
// converged; "none" otherwise.
func TestSweepTableFlags(t *testing.T) {
	nan := math.NaN()
	sw := []solver.Coefficients{{AlphaDeg: 0, CpMin: -2}, {AlphaDeg: 8, CpMin: model.CpMinPlausible - 1}}
	vis := []engine.ViscousPoint{{Valid: true}, {Separated: true}}
	el := []engine.CoupledElementPoint{{SeparationUpper: 0.5, SeparationLower: nan}}
	coupled := []engine.CoupledPoint{{Converged: true, Elements: el}, {PastClMax: true, Elements: el}}
	cases := []struct {
		name  string
		hc    float64
		write func(*bytes.Buffer, Metadata) error
		want  [2]string
	}{
		{"inviscid, free air", 0, func(b *bytes.Buffer, m Metadata) error { return WriteSweepTable(b, m, sw, nil) },
			[2]string{"none", "suction beyond real flows"}},
		{"inviscid, 0.05 chords off the ground", 0.05, func(b *bytes.Buffer, m Metadata) error { return WriteSweepTable(b, m, sw, nil) },
			[2]string{"very close to the ground", "suction beyond real flows; very close to the ground"}},
		{"estimate", 0, func(b *bytes.Buffer, m Metadata) error { return WriteSweepTable(b, m, sw, vis) },
			[2]string{"none", "separated; suction beyond real flows"}},
		{"coupled", 0, func(b *bytes.Buffer, m Metadata) error { return WriteCoupledSweepTable(b, m, sw, coupled) },
			[2]string{"separated", "past maximum lift; viscous solution not converged; suction beyond real flows"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var b bytes.Buffer
			if err := c.write(&b, Metadata{Study: "flags (invented)", ClearanceOverChord: c.hc}); err != nil {
				t.Fatal(err)
			}
			recs := readCSV(t, b.Bytes())
			col := slices.Index(recs[0], "flags")
			if col < 0 {
				t.Fatalf("no flags column in %q", recs[0])
			}
			for i, want := range c.want {
				if got := recs[i+1][col]; got != want {
					t.Errorf("row %d: flags %q, want %q", i, got, want)
				}
			}
		})
	}
}

func TestBoundaryLayerTable(t *testing.T) {
	vr := exporttest.Viscous()
	vr.Elements[0].Lower.H[5] = math.NaN()
	var b bytes.Buffer
	if err := WriteBoundaryLayerTable(&b, Metadata{AlphaDeg: 4}, vr); err != nil {
		t.Fatal(err)
	}
	recs := readCSV(t, b.Bytes())
	eb := vr.Elements[0]
	if n := len(eb.Upper.XC) + len(eb.Lower.XC); len(recs) != n+1 {
		t.Fatalf("%d rows, want %d", len(recs)-1, n)
	}
	r := recs[1+len(eb.Upper.XC)+5]
	if r[1] != "lower" || r[7] != "" {
		t.Errorf("row with NaN H: %v", r)
	}
	// Transition at x/c 0.3 on the upper surface: rows past it are turbulent.
	for _, r := range recs[1 : 1+len(eb.Upper.XC)] {
		if want := num(t, r[3]) > 0.3; (r[9] == "yes") != want {
			t.Errorf("x/c %s: turbulent %s", r[3], r[9])
		}
	}
	if g := num(t, recs[1][5]); !relClose(g, eb.Upper.Theta[0]) {
		t.Errorf("theta %g, want %g", g, eb.Upper.Theta[0])
	}
}

func TestSweepTableMismatch(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("no panic for drag of the wrong length")
		}
	}()
	WriteSweepTable(&bytes.Buffer{}, Metadata{}, exporttest.Sweep(), make([]engine.ViscousPoint, 2))
}

// TestCSVMetadata: every CSV starts with comment lines naming the study,
// the element, the angle of attack, the Reynolds number, the units and the
// chord x/c refers to, and its columns are full words.
func TestCSVMetadata(t *testing.T) {
	sol := exporttest.Solution(exporttest.TwoElementLayout(40), 3)
	sec, err := model.NACA("4412", model.NACAOptions{PointsPerSurface: 10, ClosedTE: true})
	if err != nil {
		t.Fatal(err)
	}
	meta := Metadata{Study: "rear wing", Element: "flap", AlphaDeg: NoAngle, Reynolds: 2.5e5, Program: "Sectionbench test"}
	for _, c := range []struct {
		name  string
		write func(*bytes.Buffer) error
		want  []string // comment lines that must be there
		head  string
	}{
		{"cp", func(b *bytes.Buffer) error { return WriteCpTable(b, meta, sol) },
			[]string{"# study: rear wing", "# element: flap", "# angle of attack: 3 deg", "# reynolds number: 2.5e+05 on the element's own chord", "# units: x_mm and y_mm in millimetres", "# x/c: along each element's own chord"},
			"element,side,x_mm,y_mm,xc,cp,tangential_velocity"},
		{"sweep", func(b *bytes.Buffer) error {
			sw := exporttest.Sweep()
			return WriteSweepTable(b, meta, sw, exporttest.Drag(sw))
		}, []string{"# study: rear wing", "# units: alpha_deg in degrees", "# x/c: along the main element's own chord"},
			"alpha_deg,cl,cl_pressure,cm,cp_min,cp_min_xc,cd,transition_upper_xc,transition_lower_xc,separation_upper_xc,separation_lower_xc,flags"},
		{"boundary layer", func(b *bytes.Buffer) error { return WriteBoundaryLayerTable(b, meta, exporttest.Viscous()) },
			[]string{"# study: rear wing", "# units: lengths over each element's own chord"},
			"element,side,arc_length_over_chord,xc,edge_velocity,momentum_thickness_over_chord,displacement_thickness_over_chord,shape_factor,skin_friction,turbulent"},
		{"coordinates", func(b *bytes.Buffer) error {
			return WriteCoordinatesCSV(b, sec, CoordOptions{ChordMM: 120, Element: "flap", Study: "rear wing"})
		}, []string{"# study: rear wing", "# element: flap", "# units: millimetres at a chord of 120 mm", "# x/c: x runs along the element's own chord", "# section: NACA 4412"},
			"x_mm,y_mm"},
	} {
		var b bytes.Buffer
		if err := c.write(&b); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		lines := strings.Split(b.String(), "\n")
		k := 0
		for k < len(lines) && strings.HasPrefix(lines[k], "# ") {
			k++
		}
		comments := strings.Join(lines[:k], "\n")
		for _, w := range c.want {
			if !strings.Contains(comments, w) {
				t.Errorf("%s: metadata lacks %q:\n%s", c.name, w, comments)
			}
		}
		if k == len(lines) || lines[k] != c.head {
			t.Errorf("%s: header %q, want %q", c.name, lines[min(k, len(lines)-1)], c.head)
		}
	}
}

// The coupled boundary-layer table: one row per station of each surface
// and the wake, in that order, with the regime in words and no shear
// stress on a laminar station (invented values).
func TestCoupledBoundaryLayerTable(t *testing.T) {
	st := func(xc, ctau float64, k bl.Kind) solver.CoupledStation {
		return solver.CoupledStation{XC: xc, Ue: 1, Theta: 1e-3, DStar: 2e-3, H: 2, Cf: 3e-3, CTau: ctau, Regime: k}
	}
	cs := &solver.CoupledSolution{Elements: []solver.CoupledElement{{
		Name:  "main",
		Upper: solver.CoupledSurface{Stations: []solver.CoupledStation{st(0.1, 0, bl.Laminar), st(0.5, 0.01, bl.Turbulent)}},
		Lower: solver.CoupledSurface{Stations: []solver.CoupledStation{st(0.2, 0, bl.Laminar)}},
		Wake:  solver.CoupledSurface{Stations: []solver.CoupledStation{st(1.1, 0.02, bl.Wake)}},
	}}}
	var b bytes.Buffer
	if err := WriteCoupledBoundaryLayerTable(&b, Metadata{AlphaDeg: 4}, cs); err != nil {
		t.Fatal(err)
	}
	recs := readCSV(t, b.Bytes())
	if len(recs) != 5 {
		t.Fatalf("%d rows, want a header and 4 stations", len(recs))
	}
	var sides, regimes, ctau []string
	for _, r := range recs[1:] {
		sides, regimes, ctau = append(sides, r[1]), append(regimes, r[12]), append(ctau, r[11])
	}
	if want := []string{"upper", "upper", "lower", "wake"}; !slices.Equal(sides, want) {
		t.Errorf("sides %v, want %v", sides, want)
	}
	if want := []string{"laminar", "turbulent", "laminar", "wake"}; !slices.Equal(regimes, want) {
		t.Errorf("regimes %v, want %v", regimes, want)
	}
	if want := []string{"", "0.01", "", "0.02"}; !slices.Equal(ctau, want) {
		t.Errorf("shear-stress cells %q, want %q", ctau, want)
	}
}

// TestMapTableFlags: a map's CSV row says "very close to the ground" where
// the point's clearance is below 0.1 of the main chord, as a sweep's row
// and the workbench say of the study (an inviscid ride-height map of the
// two-element example gave 1880 N/m at 20 mm on its 250 mm chord without
// a word); a point without an answer, and one above the limit, say none.
func TestMapTableFlags(t *testing.T) {
	st := model.NewStudy()
	st.Elements[0].ChordMM = 250
	st.Inverted = true
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 100}
	vars := []model.SetupVariable{{Kind: model.SetupClearance}}
	el := []engine.PointElement{{SeparationSuction: math.NaN()}}
	ground := model.GroundFlag(0.08)
	held := model.Flag{Kind: model.FlagHeld}
	suction := model.Flag{Kind: model.FlagSuction}
	separated := model.Flag{Kind: model.FlagSeparated}
	pts := []engine.Point{
		{Values: []float64{10}, Converged: false, Inverted: true, ClearanceMM: 10, Elements: el, Flags: []model.Flag{{Kind: model.FlagNotConverged}, ground}},
		{Values: []float64{20}, Converged: true, Inverted: true, Cl: -7.5, ClearanceMM: 20, Elements: el, Flags: []model.Flag{ground}},
		{Values: []float64{25}, Converged: true, Inverted: true, Cl: -6, ClearanceMM: 25, Elements: el},
		{Values: []float64{30}, Converged: true, Inverted: true, Cl: -5, ClearanceMM: 30, Elements: el, Flags: []model.Flag{separated, held, suction}},
	}
	var b bytes.Buffer
	if err := WriteMapTable(&b, Metadata{Study: "ride height (invented)", AlphaDeg: NoAngle}, st, vars, pts); err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(strings.NewReader(b.String()))
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := slices.Index(rows[0], "flags")
	if col < 0 {
		t.Fatalf("no flags column: %v", rows[0])
	}
	// The flags of solve (engine.Point.Flags) but separation, which has
	// its column: the map gave the ground's alone.
	for i, want := range []string{"none", string(model.FlagGround), "none", string(model.FlagHeld) + "; " + string(model.FlagSuction)} {
		if got := rows[i+1][col]; got != want {
			t.Errorf("%s mm: flags %q, want %q", rows[i+1][0], got, want)
		}
	}
	// A search's best there gets the advice the app and the report give.
	if w := NearGroundAdvice(st, &pts[1]); !strings.Contains(w, "very close to the ground") || !strings.Contains(w, "at least 25 mm") {
		t.Errorf("advice at 20 mm: %q", w)
	}
	for _, k := range []int{2, 3} {
		if w := NearGroundAdvice(st, &pts[k]); w != "" {
			t.Errorf("advice at %g mm: %q", pts[k].Values[0], w)
		}
	}
}
