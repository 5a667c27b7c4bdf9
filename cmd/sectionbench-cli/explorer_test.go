package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"sectionbench/export"
	"sectionbench/model"
)

// example is one of the invented example studies the app ships.
func example(name string) string {
	return filepath.Join("..", "..", "assets", "examples", name)
}

// inviscidExample writes a copy of an example study with its viscous
// solution off (the examples open with the coupled solution on) and
// returns its path: for tests of the panel method's path through a
// command, which the viscous solution would only slow down.
func inviscidExample(t *testing.T, name string) string {
	t.Helper()
	b, err := os.ReadFile(example(name))
	if err != nil {
		t.Fatal(err)
	}
	st, err := model.DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	st.Viscous.Enabled = false
	if b, err = st.Encode(); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// runJSON runs the command and decodes its JSON output.
func runJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	code, out, stderr := runCLI(t, args...)
	if code != exitOK {
		t.Fatalf("%s: exit %d: %s", strings.Join(args, " "), code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	return m
}

// checkPointKeys checks a map point's (or a search's start's and best's)
// keys: the variables' values under their names, the coefficients, the
// state, downforce on an inverted wing, and per element the separation.
func checkPointKeys(t *testing.T, where string, p map[string]any, vars []string, elements int) {
	t.Helper()
	for _, v := range vars {
		if _, ok := p[v].(float64); !ok {
			t.Errorf("%s: variable %q is %v, want a number", where, v, p[v])
		}
	}
	for _, k := range []string{"cl", "cd", "cm", "cl_inviscid", "downforce_per_span_n_per_m", "drag_per_span_n_per_m", "separation_upper", "separation_lower"} {
		if _, ok := p[k]; !ok {
			t.Errorf("%s: no %q", where, k)
		}
	}
	if _, ok := p["converged"].(bool); !ok {
		t.Errorf("%s: converged is %v, want a bool", where, p["converged"])
	}
	switch from, _ := p["started_from"].(map[string]any); p["started_from_neighbour"] {
	case false:
		if p["started_from"] != nil {
			t.Errorf("%s: started_from %v on a point from its own start", where, p["started_from"])
		}
	case true:
		for _, v := range vars {
			if _, ok := from[v].(float64); !ok || p["converged"] != true {
				t.Errorf("%s: started from a neighbour, converged %v, started_from %v", where, p["converged"], p["started_from"])
			}
		}
	default:
		t.Errorf("%s: started_from_neighbour is %v, want a bool", where, p["started_from_neighbour"])
	}
	if single, _ := p["single_solve"].(string); !slices.Contains([]string{"identical", "agrees", "another root", "no answer", "not compared"}, single) {
		t.Errorf("%s: single_solve is %v", where, p["single_solve"])
	}
	if p["converged"] == false && (p["cl"] != nil || p["cd"] != nil || p["downforce_per_span_n_per_m"] != nil) {
		t.Errorf("%s: a point that did not converge has numbers: cl %v cd %v downforce %v", where, p["cl"], p["cd"], p["downforce_per_span_n_per_m"])
	}
	els, _ := p["elements"].([]any)
	if len(els) != elements {
		t.Fatalf("%s: %d elements, want %d", where, len(els), elements)
	}
	for i, e := range els {
		em := e.(map[string]any)
		for _, k := range []string{"name", "cl", "cd", "separation_upper", "separation_lower", "separation_suction_side"} {
			if _, ok := em[k]; !ok {
				t.Errorf("%s: element %d has no %q", where, i, k)
			}
		}
	}
}

// The map's JSON: {"points": [...]} in row-major order of the --vary
// flags, each point with the variables' values and a solve's keys.
func TestMapJSONShape(t *testing.T) {
	m := runJSON(t, "map", "--study", example("two-element-ground.json"), "--vary", "clearance_mm=60:100:20", "--vary", "elements[1].deflection_deg=10:20:10", "--inviscid", "--format", "json")
	pts, _ := m["points"].([]any)
	if len(pts) != 6 {
		t.Fatalf("%d points, want 6", len(pts))
	}
	vars := []string{"clearance_mm", "elements[1].deflection_deg"}
	for i, p := range pts {
		pm := p.(map[string]any)
		checkPointKeys(t, fmt.Sprintf("point %d", i), pm, vars, 2)
		if h, d := 60+20*float64(i/2), 10+10*float64(i%2); pm[vars[0]] != h || pm[vars[1]] != d {
			t.Errorf("point %d at %v, %v; want %g, %g", i, pm[vars[0]], pm[vars[1]], h, d)
		}
		if pm["converged"] != true || pm["cd"] != nil || !(pm["downforce_per_span_n_per_m"].(float64) > 0) {
			t.Errorf("point %d (inviscid): converged %v cd %v downforce %v", i, pm["converged"], pm["cd"], pm["downforce_per_span_n_per_m"])
		}
	}
	if m["viscous_mode"] != "inviscid" {
		t.Errorf("viscous_mode %v", m["viscous_mode"])
	}
}

// A map gives `solve`'s numbers at its grid points (the same study and
// options): inviscid on the two-element example in ground effect to the
// digit, and with the coupled viscous solution on NACA 0012 at Re 6e6
// tripped at 5 % (where it converges, with one root) wherever solve
// converges, to the digit where the point was solved from its own start
// and within single_solve_tolerance where it started from its neighbour.
func TestMapReproducesSolve(t *testing.T) {
	for _, tc := range []struct {
		name   string
		inputs []string
		keys   []string
		long   bool
	}{
		{"inviscid, two elements in ground effect", []string{"--study", inviscidExample(t, "two-element-ground.json"), "--inviscid"}, []string{"cl", "cm", "downforce_per_span_n_per_m"}, false},
		{"coupled, NACA 0012", []string{"--section", "naca:0012", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05"}, []string{"cl", "cd", "cm"}, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.long && testing.Short() {
				t.Skip("coupled viscous solves")
			}
			m := runJSON(t, append([]string{"map", "--vary", "alpha_deg=1:3:1", "--format", "json"}, tc.inputs...)...)
			solveInputs := tc.inputs
			if solveInputs[len(solveInputs)-1] == "--inviscid" {
				solveInputs = solveInputs[:len(solveInputs)-1] // the copy's viscous setting is off
			}
			for i, p := range m["points"].([]any) {
				pm := p.(map[string]any)
				a := pm["alpha_deg"].(float64)
				s := runJSON(t, append([]string{"solve", "--alpha", fmt.Sprint(a), "--format", "json"}, solveInputs...)...)
				if c, ok := s["converged"]; ok && c != true {
					t.Logf("α %g: solve does not converge", a)
					continue
				}
				// Identical: the same digits; started from a neighbour:
				// within single_solve_tolerance (cl and cm of |cl|, cd of cd).
				tol := map[string]any{}
				if pm["single_solve"] != "identical" {
					tol = m["single_solve_tolerance"].(map[string]any)
				}
				for _, k := range tc.keys {
					x, ok1 := pm[k].(float64)
					y, ok2 := s[k].(float64)
					rel, scale := tol["cl"], s["cl"]
					if k == "cd" {
						rel, scale = tol["cd"], s["cd"]
					}
					sc, _ := scale.(float64)
					if r, _ := rel.(float64); !ok1 || !ok2 || math.Abs(x-y) > r*math.Abs(sc) {
						t.Errorf("point %d, α %g (%v): %s map %v, solve %v", i, a, pm["single_solve"], k, pm[k], s[k])
					}
				}
			}
		})
	}
}

// A viscous map of the two-element example in ground effect, each point
// started from its neighbour, agrees with `solve` of the study at each
// clearance (tripped at 5 % and 100 panels per element to keep it
// short), point by point through the command line: with
// --compare-with-solve each point's single_solve is true of solve's
// JSON ("identical": the same digits; "agrees": within
// single_solve_tolerance, solve's cl beside; "another root": beyond it;
// "no answer": solve does not converge), and the map without the
// comparison gives the same numbers. Measured: 120 mm (the middle, solved
// as solve solves it) identical; 80 and 160 mm, started from 120 mm, on
// other roots than the march's (cl 0.033 and 0.0003 apart).
func TestMapReproducesSolveTwoElement(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves of two elements")
	}
	raw, err := os.ReadFile(example("two-element-ground.json"))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	studyAt := func(clearance float64) string {
		var st map[string]any
		if err := json.Unmarshal(raw, &st); err != nil {
			t.Fatal(err)
		}
		st["viscous"] = map[string]any{"enabled": true, "mode": "coupled", "trip_upper": 0.05, "trip_lower": 0.05}
		st["panelling"].(map[string]any)["panels"] = 100
		st["ground"].(map[string]any)["clearance_mm"] = clearance
		b, err := json.Marshal(st)
		if err != nil {
			t.Fatal(err)
		}
		path := filepath.Join(dir, fmt.Sprintf("at-%g.json", clearance))
		if err := os.WriteFile(path, b, 0o644); err != nil {
			t.Fatal(err)
		}
		return path
	}
	m := runJSON(t, "map", "--study", studyAt(100), "--vary", "clearance_mm=80:160:40", "--compare-with-solve", "--format", "json")
	plain := runJSON(t, "map", "--study", studyAt(100), "--vary", "clearance_mm=80:160:40", "--format", "json")
	if m["viscous_mode"] != "coupled" || m["compared_with_solve"] != true || plain["compared_with_solve"] != false {
		t.Fatalf("viscous_mode %v, compared_with_solve %v and %v", m["viscous_mode"], m["compared_with_solve"], plain["compared_with_solve"])
	}
	tol := m["single_solve_tolerance"].(map[string]any)
	within := func(a, b any, rel, scale float64) bool {
		x, ok1 := a.(float64)
		y, ok2 := b.(float64)
		return ok1 && ok2 && math.Abs(x-y) <= rel*scale
	}
	agreed := 0
	for i, p := range m["points"].([]any) {
		pm := p.(map[string]any)
		q := plain["points"].([]any)[i].(map[string]any)
		h := pm["clearance_mm"].(float64)
		s := runJSON(t, "solve", "--study", studyAt(h), "--format", "json")
		if pm["converged"] == true && (q["cl"] != pm["cl"] || q["cd"] != pm["cd"]) {
			t.Errorf("%g mm: the map without the comparison gives cl %v cd %v, with it %v %v", h, q["cl"], q["cd"], pm["cl"], pm["cd"])
		}
		single := pm["single_solve"]
		t.Logf("%g mm: %v from %v; map cl %v cd %v, solve (converged %v) cl %v cd %v", h, single, pm["started_from"], pm["cl"], pm["cd"], s["converged"], s["cl"], s["cd"])
		switch single {
		case "identical":
			for _, k := range []string{"cl", "cd", "cm", "downforce_per_span_n_per_m", "drag_per_span_n_per_m", "converged"} {
				if pm[k] != s[k] {
					t.Errorf("%g mm: identical, but %s map %v, solve %v", h, k, pm[k], s[k])
				}
			}
			agreed++
		case "agrees", "another root":
			cl, _ := s["cl"].(float64)
			cd, _ := s["cd"].(float64)
			same := within(pm["cl"], s["cl"], tol["cl"].(float64), math.Abs(cl)) && within(pm["cm"], s["cm"], tol["cl"].(float64), math.Abs(cl)) && within(pm["cd"], s["cd"], tol["cd"].(float64), cd)
			if s["converged"] != true || pm["single_solve_cl"] != s["cl"] || same != (single == "agrees") || pm["started_from_neighbour"] != true {
				t.Errorf("%g mm: %v, but solve converged %v cl %v (the point's single_solve_cl %v), within the tolerance %v", h, single, s["converged"], s["cl"], pm["single_solve_cl"], same)
			}
			if same {
				agreed++
			}
		case "no answer":
			if s["converged"] != false || pm["converged"] != true {
				t.Errorf("%g mm: no answer, but solve converged %v", h, s["converged"])
			}
		default:
			t.Errorf("%g mm: single_solve %v", h, single)
		}
	}
	if agreed < 1 {
		t.Errorf("no point where the map agrees with solve: the test compares too little")
	}
}

// The search's JSON: start, best (the variables and a map point's keys),
// evaluations and the path.
func TestSearchJSONShape(t *testing.T) {
	m := runJSON(t, "search", "--study", example("two-element-ground.json"), "--vary", "alpha_deg=0:4", "--vary", "clearance_mm=80:120", "--objective", "downforce", "--inviscid", "--max-evaluations", "15", "--prefer-reproducible", "--format", "json")
	vars := []string{"alpha_deg", "clearance_mm"}
	if u, ok := m["unreproduced_best"]; ok {
		t.Errorf("unreproduced_best %v: every inviscid solve is a single solve's", u)
	}
	for _, k := range []string{"start", "best"} {
		p, ok := m[k].(map[string]any)
		if !ok {
			t.Fatalf("%q is %v", k, m[k])
		}
		checkPointKeys(t, k, p, vars, 2)
	}
	n, ok := m["evaluations"].(float64)
	if !ok || n < 1 || n > 15 || int(n) != len(m["path"].([]any)) {
		t.Errorf("evaluations %v, path %d", m["evaluations"], len(m["path"].([]any)))
	}
	start, best := m["start"].(map[string]any), m["best"].(map[string]any)
	if !(best["downforce_per_span_n_per_m"].(float64) >= start["downforce_per_span_n_per_m"].(float64)) {
		t.Errorf("best downforce %v below the start's %v", best["downforce_per_span_n_per_m"], start["downforce_per_span_n_per_m"])
	}
	if start["alpha_deg"] != 3.0 || start["clearance_mm"] != 100.0 {
		t.Errorf("start at %v, %v; want the study's 3°, 100 mm", start["alpha_deg"], start["clearance_mm"])
	}
}

// The map's CSV: a column per variable under its name, then the results.
func TestMapCSV(t *testing.T) {
	code, out, stderr := runCLI(t, "map", "--study", example("two-element-ground.json"), "--vary", "elements[1].gap_mm=4:8:2", "--inviscid", "--format", "csv")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	r := csv.NewReader(strings.NewReader(out))
	r.Comment = '#'
	r.FieldsPerRecord = -1
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 4 || rows[0][0] != "elements[1].gap_mm" || rows[0][1] != "cl" || !strings.Contains(strings.Join(rows[0], ","), "downforce_per_span_n_per_m") {
		t.Fatalf("rows %v", rows)
	}
	if rows[2][0] != "6" {
		t.Errorf("second row at gap %s, want 6", rows[2][0])
	}
	head := strings.Join(rows[0], ",")
	if !strings.Contains(head, ",converged,started_from_neighbour,started_from.elements[1].gap_mm,single_solve,single_solve_cl,iterations,") {
		t.Errorf("header %s: want the start's columns after converged", head)
	}
}

// Bad --vary values are usage errors naming the variable.
func TestExplorerUsage(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"map", "--study", example("two-element-ground.json"), "--vary", "wing=0:1:1"}, "wing"},
		{[]string{"map", "--study", example("two-element-ground.json"), "--vary", "alpha_deg=4:0:1"}, "alpha_deg"},
		{[]string{"map", "--study", example("single-free-air.json"), "--vary", "clearance_mm=20:60:10"}, "clearance_mm"},
		{[]string{"map", "--study", example("two-element-ground.json"), "--vary", "elements[0].gap_mm=2:6:1"}, "elements[0].gap_mm"},
		{[]string{"map", "--study", example("two-element-ground.json")}, "--vary"},
		{[]string{"search", "--study", example("two-element-ground.json"), "--vary", "alpha_deg=0:4:1"}, "alpha_deg"},
		{[]string{"search", "--study", example("two-element-ground.json"), "--vary", "alpha_deg=0:4", "--objective", "lift"}, "objective"},
	} {
		t.Run(strings.Join(tc.args[3:], " "), func(t *testing.T) {
			code, _, stderr := runCLI(t, tc.args...)
			if code != exitUsage || !strings.Contains(stderr, tc.want) {
				t.Errorf("exit %d, stderr %q: want %d naming %q", code, stderr, exitUsage, tc.want)
			}
		})
	}
}

// The README's search example gives the figures the README quotes: the
// least drag at Cl ≥ 0.3 of tripped NACA 0012 at Re 6e6 is where Cl
// reaches 0.3, α ≈ 2.67° (Cl rises 0.1126 per degree there: 0.3/0.1126 =
// 2.66°), below the start's drag at 4°.
func TestSearchReadmeExample(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves")
	}
	m := runJSON(t, "search", "--section", "naca:0012", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05", "--alpha", "4",
		"--vary", "alpha_deg=0.5:4.5", "--objective", "drag", "--downforce-target", "0.3", "--max-evaluations", "30", "--format", "json")
	best, start := m["best"].(map[string]any), m["start"].(map[string]any)
	a, cl, cd := best["alpha_deg"].(float64), best["cl"].(float64), best["cd"].(float64)
	if m["feasible"] != true || math.Abs(a-2.67) > 0.01 || cl < 0.3 || cl > 0.301 || !(cd < start["cd"].(float64)) {
		t.Errorf("best α %g Cl %g Cd %g (start Cd %v, feasible %v): want α 2.67 ± 0.01, Cl 0.300–0.301, less drag than the start", a, cl, cd, start["cd"], m["feasible"])
	}
}

// A speed map of an upright wing gives lift, not downforce, per metre of
// span, growing as the dynamic pressure ½ρV² (the coefficients stay the
// panel method's: the inviscid map has no Reynolds number effect), so 30
// m/s gives nine times the lift of 10 m/s (closed form).
func TestMapSpeedUpright(t *testing.T) {
	m := runJSON(t, "map", "--study", example("single-free-air.json"), "--vary", "speed_mps=10:30:10", "--inviscid", "--format", "json")
	pts := m["points"].([]any)
	first, last := pts[0].(map[string]any), pts[2].(map[string]any)
	if _, ok := first["downforce_per_span_n_per_m"]; ok {
		t.Error("an upright wing's map has downforce_per_span_n_per_m")
	}
	l10, l30 := first["lift_per_span_n_per_m"].(float64), last["lift_per_span_n_per_m"].(float64)
	if math.Abs(l30/l10-9) > 1e-9 {
		t.Errorf("lift %g N/m at 10 m/s, %g at 30 m/s: ratio %g, want 9", l10, l30, l30/l10)
	}
}

// search --apply-to writes the study with the best setting applied (the
// app's Apply) and, with --pin-start, a pin of the start; it writes
// nothing when no setting met every limit.
func TestSearchApplyTo(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "applied.json")
	args := []string{"search", "--study", example("two-element-ground.json"), "--vary", "elements[1].deflection_deg=10:20", "--inviscid", "--max-evaluations", "8", "--format", "json"}
	m := runJSON(t, append(args, "--apply-to", out, "--pin-start")...)
	best := m["best"].(map[string]any)["elements[1].deflection_deg"].(float64)
	st, err := export.LoadStudy(out)
	if err != nil {
		t.Fatal(err)
	}
	secs, _, err := export.LoadSections(st, dir)
	if err != nil {
		t.Fatal(err)
	}
	v, err := model.ParseSetupVariable("elements[1].deflection_deg")
	if err != nil {
		t.Fatal(err)
	}
	if got := st.SetupValue(v, secs); math.Abs(got-best) > 1e-9 || st.Ground.ClearanceMM != 100 {
		t.Errorf("written deflection %g, want the best %g (clearance %g, want the study's 100)", got, best, st.Ground.ClearanceMM)
	}
	if n := len(st.Pins); n != 1 || st.Pins[0].Label != "search start, flap deflection 15 °" || len(st.Pins[0].Cp) != 4 || len(st.Pins[0].Polar) == 0 {
		t.Errorf("%d pins (%+v), want the start's, named so, with Cp on 2 elements × 2 surfaces and a polar", n, st.Pins)
	}
	code, _, stderr := runCLI(t, append(args, "--pin-start")...)
	if code != exitUsage || !strings.Contains(stderr, "--apply-to") {
		t.Errorf("--pin-start alone: exit %d, %q", code, stderr)
	}
	none := filepath.Join(dir, "none.json")
	code, _, stderr = runCLI(t, append(args, "--min-clearance", "500", "--apply-to", none)...)
	if _, err := os.Stat(none); code != exitInput || !strings.Contains(stderr, "nothing written") || err == nil {
		t.Errorf("no feasible setting: exit %d, %q, file there %v; want exit 1, nothing written", code, stderr, err == nil)
	}
}

// A study whose section is a file named from its folder is not written
// into another folder, where it would not find the file.
func TestSectionsReachable(t *testing.T) {
	st := model.NewStudy()
	st.Elements = []model.StudyElement{{Name: "main", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 250}}
	if err := sectionsReachable(st, "a/study.json", "b/out.json"); err != nil {
		t.Errorf("a generated section: %v", err)
	}
	st.Elements = append(st.Elements, model.StudyElement{Name: "flap", Section: model.SectionSource{Spec: "flap.dat"}, ChordMM: 100})
	if err := sectionsReachable(st, "a/study.json", "a/out.json"); err != nil {
		t.Errorf("the same folder: %v", err)
	}
	if err := sectionsReachable(st, "a/study.json", "b/out.json"); err == nil || !strings.Contains(err.Error(), "elements[1].section") {
		t.Errorf("another folder: %v, want a refusal naming elements[1].section", err)
	}
}

// TestMapNearGroundFlags: a ride-height map of the two-element example
// (250 mm main chord) flags the points below 25 mm "very close to the
// ground" in every format, as solve and sweep flag such a clearance
// (the inviscid map gave 1879 N/m at 20 mm without a word).
func TestMapNearGroundFlags(t *testing.T) {
	args := []string{"map", "--study", example("two-element-ground.json"), "--vary", "clearance_mm=20:30:10", "--inviscid"}
	m := runJSON(t, append(args, "--format", "json")...)
	pts, _ := m["points"].([]any)
	if len(pts) != 2 {
		t.Fatalf("%d points, want 2", len(pts))
	}
	// The panel method's suction peak (Cp below −8 at both) is flagged as
	// solve flags it; the map gave the ground's flag alone.
	for i, want := range [][]any{{"suction beyond real flows", "very close to the ground"}, {"suction beyond real flows"}} {
		flags, ok := pts[i].(map[string]any)["flags"].([]any)
		if !ok || !slices.Equal(flags, want) {
			t.Errorf("point %d: flags %v, want %v", i, pts[i].(map[string]any)["flags"], want)
		}
	}
	code, out, stderr := runCLI(t, args...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "very close to the ground: below 25 mm (0.1 of the main element's 250 mm chord): "+model.GroundCaution()) {
		t.Errorf("text map does not say what the flag means:\n%s", out)
	}
}

// TestSearchText: the search's text gives its start and best under its
// own heading, not a map's ("Map of …" stood under "Search of …"), with
// settings to six digits (21.875000000000004 mm), and flags the best
// setting very close to the ground.
func TestSearchText(t *testing.T) {
	code, out, stderr := runCLI(t, "search", "--study", example("two-element-ground.json"), "--vary", "clearance_mm=20:120", "--objective", "downforce", "--inviscid", "--max-evaluations", "10")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.HasPrefix(out, "Search of ") || strings.Contains(out, "Map of ") {
		t.Errorf("search text headed as a map:\n%s", out)
	}
	if strings.Contains(out, "0000000") {
		t.Errorf("settings printed with rounding noise:\n%s", out)
	}
	if !strings.Contains(out, "very close to the ground") {
		t.Errorf("the best setting near the ground is not flagged:\n%s", out)
	}
}

// TestMapTextSigns: the map's text heading states the signs of its own
// columns, cl in the standard sense (negative on an inverted wing making
// downforce) and the downforce in N/m positive; it gave the workbench's
// "downforce coefficient −Cl, positive towards the ground" above a cl
// column of negative numbers.
func TestMapTextSigns(t *testing.T) {
	code, out, stderr := runCLI(t, "map", "--study", example("two-element-ground.json"), "--vary", "clearance_mm=100:100:10", "--inviscid")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	head, _, _ := strings.Cut(out, "\n")
	if !strings.Contains(head, "cl positive up, away from the ground (negative: downforce)") || strings.Contains(head, "−Cl, positive") {
		t.Errorf("heading %q does not state the cl column's sign", head)
	}
}
