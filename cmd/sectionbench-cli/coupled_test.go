package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// ladsonCd is the 80-grit drag of NACA 0012 at Re 6e6 at the tabulated
// angle nearest alphaDeg (C. L. Ladson, NASA TM-4074, 1988, as tabulated
// by the NASA Langley Turbulence Modeling Resource; testdata/validation).
func ladsonCd(t *testing.T, alphaDeg float64) (alpha, cd float64) {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "validation", "naca0012-ladson.json"))
	if err != nil {
		t.Fatal(err)
	}
	var d struct {
		Grit80 struct {
			AlphaDeg []float64 `json:"alpha_deg"`
			Cd       []float64 `json:"cd"`
		} `json:"grit_80"`
	}
	if err := json.Unmarshal(b, &d); err != nil {
		t.Fatal(err)
	}
	best := 0
	for i, a := range d.Grit80.AlphaDeg {
		if math.Abs(a-alphaDeg) < math.Abs(d.Grit80.AlphaDeg[best]-alphaDeg) {
			best = i
		}
	}
	return d.Grit80.AlphaDeg[best], d.Grit80.Cd[best]
}

// The coupled solve's JSON contract: the keys scripts rely on, with their
// types, at the top and per element; and the drag of tripped NACA 0012 at
// Re 6e6, 4°, within 10 % of Ladson's 80-grit value (0.00823 at 4.04°).
// The tolerance is the issue's: the spread between Ladson's three grit
// sizes near 4° is ± 4 % (testdata/validation/README.md) and an integral
// boundary-layer method is good to a few percent on attached tripped
// layers; the 0.04° between the angles moves Cd by far less.
func TestSolveCoupledJSON(t *testing.T) {
	code, out, stderr := runCLI(t, "solve", "--section", "naca:0012", "--alpha", "4", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05", "--format", "json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	keys := func(where string, m map[string]any) {
		for _, k := range []string{"cl", "cd", "cm", "cl_inviscid", "iterations"} {
			if _, ok := m[k].(float64); !ok {
				t.Errorf("%s: %q is %v (%T), want a number", where, k, m[k], m[k])
			}
		}
		if _, ok := m["converged"].(bool); !ok {
			t.Errorf("%s: converged is %v (%T), want a boolean", where, m["converged"], m["converged"])
		}
		for _, k := range []string{"transition_upper", "transition_lower", "separation_upper", "separation_lower"} {
			v, ok := m[k]
			if _, num := v.(float64); !ok || !(num || v == nil) {
				t.Errorf("%s: %q is %v (%T), want x/c or null", where, k, v, v)
			}
		}
	}
	keys("top level", m)
	els, _ := m["elements"].([]any)
	if len(els) != 1 {
		t.Fatalf("%d elements, want 1", len(els))
	}
	keys("elements[0]", els[0].(map[string]any))
	if m["converged"] != true {
		t.Fatalf("not converged: %d iterations, residual %v", int(m["iterations"].(float64)), m["residual"])
	}
	a, want := ladsonCd(t, 4)
	cd := m["cd"].(float64)
	if d := cd/want - 1; math.Abs(d) > 0.10 {
		t.Errorf("cd %.5f, Ladson %.5f at %.2f°: %+.1f %%, 10 %% allowed", cd, want, a, 100*d)
	}
	t.Logf("cd %.5f, Ladson %.5f at %.2f° (%+.1f %%); cl %.4f, inviscid %.4f", cd, want, a, 100*(cd/want-1), m["cl"], m["cl_inviscid"])
	if tr := m["transition_upper"].(float64); !(tr > 0 && tr <= 0.05+1e-9) {
		t.Errorf("upper transition at x/c %g, want at or ahead of the trip at 0.05", tr)
	}
}

// A point that does not converge prints null numbers and converged false,
// with its iterations; the text output says so and shows no numbers.
func TestSolveNotConvergedIsNull(t *testing.T) {
	coupledMaxIterations = 1
	defer func() { coupledMaxIterations = 0 }()
	args := []string{"solve", "--section", "naca:0012", "--alpha", "2", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05"}
	code, out, stderr := runCLI(t, append(args, "--format", "json")...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if m["converged"] != false {
		t.Errorf("converged %v, want false", m["converged"])
	}
	if it, ok := m["iterations"].(float64); !ok || it < 1 {
		t.Errorf("iterations %v, want the count made", m["iterations"])
	}
	for _, k := range []string{"cl", "cd", "cm", "transition_upper", "separation_upper"} {
		if v, ok := m[k]; !ok || v != nil {
			t.Errorf("%q is %v, want null", k, v)
		}
	}
	if _, ok := m["cl_inviscid"].(float64); !ok {
		t.Errorf("cl_inviscid %v, want the inviscid number beside the missing one", m["cl_inviscid"])
	}
	el := m["elements"].([]any)[0].(map[string]any)
	if el["cl"] != nil || el["cd"] != nil || el["converged"] != false {
		t.Errorf("element: cl %v, cd %v, converged %v; want null, null, false", el["cl"], el["cd"], el["converged"])
	}
	code, out, _ = runCLI(t, args...)
	if code != exitOK || !strings.Contains(out, "NOT CONVERGED") || !strings.Contains(out, "Cl (viscous)                  —") {
		t.Errorf("text output does not say the point did not converge or shows numbers:\n%s", out)
	}
}

// The coupled sweep's JSON is an object with rows (each with the solve's
// keys and alpha_deg), cl_max and alpha_cl_max; CSV and text show each
// row's state.
func TestSweepCoupledJSON(t *testing.T) {
	// Angles where the coupled solution converges on this section, 0°
	// included (the stagnation point on the leading-edge node, solved as
	// the mean of ±0.01°), not about 5–6°, where NACA 0012 does not
	// converge yet (DEVELOPERS.md, docs/validation.md §9).
	args := []string{"sweep", "--section", "naca:0012", "--alpha", "0:2:1", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05"}
	sw := sweepJSONOf(t, args...)
	if len(sw.Rows) != 3 {
		t.Fatalf("%d rows, want 3", len(sw.Rows))
	}
	for i, r := range sw.Rows {
		for _, k := range []string{"alpha_deg", "cl", "cd", "cm", "cl_inviscid", "iterations"} {
			if _, ok := r[k].(float64); !ok {
				t.Errorf("row %d: %q is %v, want a number", i, k, r[k])
			}
		}
		for _, k := range []string{"transition_upper", "transition_lower", "separation_upper", "separation_lower"} {
			if _, ok := r[k]; !ok {
				t.Errorf("row %d lacks %q", i, k)
			}
		}
		if r["converged"] != true {
			t.Errorf("row %d (α %v): converged %v", i, r["alpha_deg"], r["converged"])
		}
		// Per element the same keys (one element here: its share is the
		// whole).
		els, _ := r["elements"].([]any)
		if len(els) != 1 {
			t.Fatalf("row %d: elements %v, want one", i, r["elements"])
		}
		el := els[0].(map[string]any)
		for _, k := range []string{"cl", "cd", "cm", "cl_inviscid", "iterations", "transition_upper", "transition_lower", "separation_upper", "separation_lower", "converged"} {
			if _, ok := el[k]; !ok {
				t.Errorf("row %d, element: lacks %q", i, k)
			}
		}
		if el["cl"] != r["cl"] || el["converged"] != true {
			t.Errorf("row %d, element: cl %v (row %v), converged %v", i, el["cl"], r["cl"], el["converged"])
		}
	}
	if sw.ClMax == nil || sw.AlphaClMax == nil || *sw.AlphaClMax != 2 || *sw.ClMax != sw.Rows[2]["cl"] {
		t.Errorf("cl_max %v at %v, want the 2° row's cl %v", sw.ClMax, sw.AlphaClMax, sw.Rows[2]["cl"])
	}
	for _, f := range []string{"csv", "text"} {
		code, out, stderr := runCLI(t, append(args, "--format", f)...)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", f, code, stderr)
		}
		if want := map[string]string{"csv": "converged", "text": "state"}[f]; !strings.Contains(out, want) || strings.Count(out, map[string]string{"csv": ",yes,", "text": "converged ("}[f]) != 3 {
			t.Errorf("%s output lacks the state per row:\n%s", f, out)
		}
	}
}

// --study works as before: a study that selects the coupled solution gets
// it, one saved without viscous.mode keeps the one-way estimate, and the
// flags override the study's trips.
func TestSolveStudyViscousMode(t *testing.T) {
	dir := t.TempDir()
	const doc = `{"format": "sectionbench-study", "version": 2, "name": "tripped NACA 0012 (invented study)",
 "elements": [{"name": "main", "section": "naca:0012", "chord_mm": 1000}],
 "panelling": {"panels": 160, "spacing": "cosine", "nose": 0.5, "tail": 0.2},
 "flow": {"alpha_deg": 4, "reynolds": 6e6}, "sweep": {"from_deg": 0, "to_deg": 4, "step_deg": 2},
 "viscous": {"enabled": %v, "trip_upper": 0.05, "trip_lower": 0.05%s}, "pins": []}`
	for _, tc := range []struct {
		name, extra string
		flags       []string
		mode        string
		off         bool // saved with the viscous solution off
	}{
		{"coupled", `, "mode": "coupled"`, nil, "coupled", false},
		{"saved before the coupled solution", ``, nil, "estimate", false},
		{"mode from the command line", ``, []string{"--viscous-mode", "coupled", "--trip-upper", "0.1"}, "coupled", false},
		{"mode from the command line on a study saved with it off", `, "mode": "coupled"`, []string{"--viscous-mode", "coupled", "--trip-upper", "0.1"}, "coupled", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(dir, "study.json")
			if err := os.WriteFile(path, []byte(strings.NewReplacer("%v", strconv.FormatBool(!tc.off), "%s", tc.extra).Replace(doc)), 0o644); err != nil {
				t.Fatal(err)
			}
			code, out, stderr := runCLI(t, append([]string{"solve", "--study", path, "--format", "json"}, tc.flags...)...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			var m map[string]any
			if err := json.Unmarshal([]byte(out), &m); err != nil {
				t.Fatal(err)
			}
			if m["viscous_mode"] != tc.mode {
				t.Errorf("viscous_mode %v, want %s", m["viscous_mode"], tc.mode)
			}
			_, hasState := m["converged"]
			if hasState != (tc.mode == "coupled") {
				t.Errorf("converged key present %v in %s mode", hasState, tc.mode)
			}
			if tc.flags != nil {
				if tr, _ := m["transition_upper"].(float64); !(tr > 0.05 && tr <= 0.1+1e-9) {
					t.Errorf("upper transition at %v with the trip moved to 0.1 by the flag", m["transition_upper"])
				}
			}
		})
	}
}

// sweepOut is the sweep's JSON object as scripts read it.
type sweepOut struct {
	Rows       []map[string]any `json:"rows"`
	ClMax      *float64         `json:"cl_max"`
	AlphaClMax *float64         `json:"alpha_cl_max"`
	Warnings   []string         `json:"warnings"`
}

// sweepJSONOf runs a sweep command line with --format json and reads its
// object.
func sweepJSONOf(t *testing.T, args ...string) sweepOut {
	t.Helper()
	code, out, stderr := runCLI(t, append(args, "--format", "json")...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var sw sweepOut
	if err := json.Unmarshal([]byte(out), &sw); err != nil {
		t.Fatalf("not a JSON object with rows: %v\n%s", err, out)
	}
	return sw
}

// export --what csv --table bl and sweep follow the coupled solution: the
// boundary layers and the wake of a converged point, a refusal naming the
// state when it did not converge (never a crash), the sweep with its
// state column.
func TestExportCoupledTables(t *testing.T) {
	base := []string{"export", "--section", "naca:0012", "--alpha", "2", "--re", "6e6", "--trip-upper", "0.05", "--trip-lower", "0.05", "--what", "csv", "-o", "-"}
	code, out, stderr := runCLI(t, append(base, "--table", "bl")...)
	if code != exitOK {
		t.Fatalf("bl: exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, ",regime\n") || !strings.Contains(out, ",wake,") || !strings.Contains(out, ",turbulent\n") {
		t.Errorf("bl table lacks the regime column or the wake:\n%.600s", out)
	}
	code, out, _ = runCLI(t, append(base, "--table", "sweep")...)
	if code != exitOK || !strings.Contains(out, ",converged,") {
		t.Errorf("sweep table (exit %d) lacks the state column:\n%.600s", code, out)
	}
	coupledMaxIterations = 1
	defer func() { coupledMaxIterations = 0 }()
	code, _, stderr = runCLI(t, append(base, "--table", "bl")...)
	if code != exitInput || !strings.Contains(stderr, "did not converge") || strings.Contains(stderr, "internal error") {
		t.Errorf("bl of a point that did not converge: exit %d, %q; want a refusal naming the state", code, stderr)
	}
}

// A point whose iterations met their tolerance on a solution the solver
// rejected (more lift than the inviscid flow) says so: the JSON's
// `rejected` holds the reason and the warning and the text give it, so
// converged false beside a residual of 1e-10 is no contradiction. Seen on
// NACA 0012 at −1°, Re 2e5, --trip-upper 0.05 (492 iterations, residual
// 4.9e-10, converged false with no reason given); built here by hand so
// the check stays whatever the solver decides on that case.
func TestRejectedPointSaysWhy(t *testing.T) {
	const why = "the iterations met their tolerance with Cl -0.145, above the inviscid -0.121, which the boundary layers cannot give: a spurious solution"
	nan := math.NaN()
	p := &engine.CoupledPoint{AlphaDeg: -1, Cl: nan, Cd: nan, Cm: nan, ClInviscid: -0.121, Iterations: 492, Residual: 4.9e-10, Rejected: why,
		Elements: []engine.CoupledElementPoint{{Name: "section", Cl: nan, Cd: nan, Cm: nan, ClInviscid: -0.121,
			TransitionUpper: nan, TransitionLower: nan, SeparationUpper: nan, SeparationLower: nan,
			BubbleUpper: [2]float64{nan, nan}, BubbleLower: [2]float64{nan, nan}}}}
	for _, k := range []int{-1, 0} {
		_, _, c := coupledKeys(p, k)
		b, err := json.Marshal(c)
		if err != nil {
			t.Fatal(err)
		}
		var m map[string]any
		if err := json.Unmarshal(b, &m); err != nil {
			t.Fatal(err)
		}
		if m["converged"] != false || m["rejected"] != why {
			t.Errorf("element %d: converged %v, rejected %v; want false and the reason", k, m["converged"], m["rejected"])
		}
	}
	for name, s := range map[string]string{"warning": notConverged(p), "text state": convergenceWords(p)} {
		if !strings.Contains(s, why) || !strings.Contains(s, "492 iterations") {
			t.Errorf("%s %q does not give the reason and the iterations", name, s)
		}
	}
	// A point that simply did not converge has no such key.
	p.Rejected = ""
	_, _, c := coupledKeys(p, -1)
	if b, _ := json.Marshal(c); strings.Contains(string(b), "rejected") {
		t.Errorf("a plain non-converged point has a rejected key: %s", b)
	}
}

// A Reynolds number outside the range the boundary layers are taken on
// trust for (model.ReynoldsMinChecked) is said once by solve and by a
// sweep, not at the team's Reynolds numbers.
func TestReynoldsOutsideCheckedRange(t *testing.T) {
	for _, tc := range []struct {
		name string
		re   string
		want bool
	}{{"below", "2e4", true}, {"the team's", "3e5", false}} {
		t.Run(tc.name, func(t *testing.T) {
			sw := sweepJSONOf(t, "sweep", "--section", "naca:0012", "--alpha", "1:2:1", "--re", tc.re, "--trip-upper", "0.05", "--trip-lower", "0.05")
			code, out, stderr := runCLI(t, "solve", "--section", "naca:0012", "--alpha", "1", "--re", tc.re, "--trip-upper", "0.05", "--trip-lower", "0.05", "--format", "json")
			if code != exitOK {
				t.Fatalf("solve: exit %d: %s", code, stderr)
			}
			if got := strings.Count(strings.Join(sw.Warnings, "\n"), string(model.FlagReynolds)); got != b2i(tc.want) {
				t.Errorf("sweep warnings %q: %d of %q, want %d", sw.Warnings, got, model.FlagReynolds, b2i(tc.want))
			}
			if got := strings.Count(out, string(model.FlagReynolds)); got != b2i(tc.want) {
				t.Errorf("solve: %d of %q, want %d", got, model.FlagReynolds, b2i(tc.want))
			}
		})
	}
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// TestSolveTextDownforceCoefficient: the text's downforce coefficient is
// the viscous answer where the coupled solution converged, as the JSON's
// downforce_coefficient is, and says which it is; it gave the panel
// method's 3.92137 on the two-element example, whose viscous answer is
// 3.20162, under the plain name.
func TestSolveTextDownforceCoefficient(t *testing.T) {
	m := runJSON(t, "solve", "--study", example("two-element-ground.json"), "--format", "json")
	if m["converged"] != true {
		t.Skip("the example's point did not converge")
	}
	code, out, stderr := runCLI(t, "solve", "--study", example("two-element-ground.json"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	want := "downforce coefficient (viscous)    " + strconv.FormatFloat(m["downforce_coefficient"].(float64), 'f', 5, 64)
	if !strings.Contains(out, want) {
		t.Errorf("text lacks %q:\n%s", want, out)
	}
}

// TestSweepTextMostDownforce: on an inverted wing the sweep's text gives
// its maximum as the most downforce, −Cl, as the app's polar does; it
// read "largest Cl -3.2016", the least downforce in words.
func TestSweepTextMostDownforce(t *testing.T) {
	// Its heading states the sign of cl, as the map's does.
	code, out, stderr := runCLI(t, "sweep", "--study", example("two-element-ground.json"), "--alpha", "0:1:1")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "most downforce −Cl ") || strings.Contains(out, "largest Cl") {
		t.Errorf("inverted sweep's maximum not given as the most downforce:\n%s", out)
	}
	// 0° and 1° lie below the stall: the maximum is not found, and what
	// would show it is the downforce falling, not the lift.
	if !strings.Contains(out, "shows the downforce falling") || strings.Contains(out, "shows lift falling") {
		t.Errorf("inverted sweep's unfound maximum not said in terms of downforce:\n%s", out)
	}
	if head, _, _ := strings.Cut(out, "\n"); !strings.Contains(head, "cl positive up, away from the ground (negative: downforce)") {
		t.Errorf("heading %q does not state the sign of cl", head)
	}
}
