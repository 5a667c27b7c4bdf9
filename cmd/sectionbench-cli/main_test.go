package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// runCLI runs one command line in-process.
func runCLI(t *testing.T, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	var o, e bytes.Buffer
	code = run(args, &o, &e)
	return code, o.String(), e.String()
}

func TestExitCodesAndMessages(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.dat")
	if err := os.WriteFile(bad, []byte("my section\n1.0 0.0\n0.5 x\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name     string
		args     []string
		code     int
		contains []string // in stderr
	}{
		{"no command", nil, exitUsage, nil},
		{"unknown command", []string{"fly"}, exitUsage, []string{`unknown command "fly"`}},
		{"unknown flag", []string{"solve", "--section", "naca:0012", "--wings", "2"}, exitUsage, []string{"wings"}},
		{"bad flag value", []string{"solve", "--section", "naca:0012", "--panels", "lots"}, exitUsage, []string{"panels"}},
		{"panels out of range", []string{"solve", "--section", "naca:0012", "--panels", "5"}, exitUsage, []string{"--panels", "16"}},
		{"alpha out of range", []string{"solve", "--section", "naca:0012", "--alpha", "80"}, exitUsage, []string{"--alpha"}},
		{"bad spacing", []string{"solve", "--section", "naca:0012", "--spacing", "wavy"}, exitUsage, []string{"--spacing", "wavy"}},
		{"bad format", []string{"solve", "--section", "naca:0012", "--format", "xml"}, exitUsage, []string{"--format"}},
		{"no section", []string{"solve"}, exitUsage, []string{"--section"}},
		{"both sources", []string{"solve", "--section", "naca:0012", "--study", "x.json"}, exitUsage, []string{"not both"}},
		{"bad NACA code", []string{"solve", "--section", "naca:12"}, exitInput, []string{"12"}},
		{"missing file", []string{"solve", "--section", filepath.Join(dir, "nope.dat")}, exitInput, []string{"nope.dat", "no such file", "naca:DIGITS"}},
		{"malformed file names the line", []string{"solve", "--section", bad}, exitInput, []string{"bad.dat", "line 3"}},
		{"transition exponent out of range", []string{"solve", "--section", "naca:0012", "--re", "3e5", "--transition-n", "30"}, exitUsage, []string{"--transition-n", "30"}},
		{"transition exponent 0 typed", []string{"solve", "--section", "naca:0012", "--re", "3e5", "--transition-n", "0"}, exitUsage, []string{"--transition-n", "0 is outside", "default 9"}},
		{"trip beyond the chord", []string{"solve", "--section", "naca:0012", "--re", "3e5", "--trip-upper", "1.5"}, exitUsage, []string{"--trip-upper"}},
		{"unknown viscous mode", []string{"solve", "--section", "naca:0012", "--re", "3e5", "--viscous-mode", "exact"}, exitUsage, []string{"--viscous-mode", "exact"}},
		{"trip with the viscous solution off", []string{"solve", "--section", "naca:0012", "--trip-upper", "0.1"}, exitUsage, []string{"--trip-upper", "viscous solution is off"}},
		{"transition exponent with the viscous solution off", []string{"sweep", "--section", "naca:0012", "--alpha", "0:4:2", "--transition-n", "7"}, exitUsage, []string{"--transition-n", "viscous solution is off"}},
		{"viscous mode with Reynolds number 0", []string{"solve", "--section", "naca:0012", "--re", "0", "--viscous-mode", "coupled"}, exitUsage, []string{"--viscous-mode", "--re 0"}},
		{"bad sweep range", []string{"sweep", "--section", "naca:0012", "--alpha", "0:10"}, exitUsage, []string{"FROM:TO:STEP"}},
		{"sweep step zero", []string{"sweep", "--section", "naca:0012", "--alpha", "0:10:0"}, exitUsage, []string{"step"}},
		{"missing study", []string{"solve", "--study", filepath.Join(dir, "none.json")}, exitInput, []string{"none.json: no such file"}},
		{"clean without file", []string{"clean"}, exitUsage, []string{"clean IN"}},
		{"figure dpi zero", []string{"export", "--section", "naca:0012", "--what", "figure", "--dpi", "0", "-o", "x.png"}, exitUsage, []string{"--dpi"}},
		{"figure dpi rounds to zero", []string{"export", "--section", "naca:0012", "--what", "figure", "--dpi", "0.4", "-o", "x.png"}, exitUsage, []string{"--dpi"}},
		{"figure negative width", []string{"export", "--section", "naca:0012", "--what", "figure", "--width-in", "-1", "-o", "x.png"}, exitUsage, []string{"--width-in"}},
		{"figure huge", []string{"export", "--section", "naca:0012", "--what", "figure", "--width-in", "40", "--dpi", "1200", "-o", "x.png"}, exitUsage, []string{"pixels"}},
		{"chord NaN", []string{"export", "--section", "naca:0012", "--what", "outline-svg", "--chord-mm", "NaN", "-o", "x.svg"}, exitUsage, []string{"--chord-mm"}},
		{"nose list without blend", []string{"density", "--section", "naca:0012", "--nose", "0.2,0.8"}, exitUsage, []string{"blend"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, _, stderr := runCLI(t, tc.args...)
			if code != tc.code {
				t.Errorf("exit %d, want %d; stderr: %s", code, tc.code, stderr)
			}
			if strings.Contains(stderr, "goroutine") || strings.Contains(stderr, "panic") {
				t.Errorf("stderr shows a panic: %s", stderr)
			}
			if strings.Contains(stderr, "stat ") || strings.Contains(stderr, "open /") {
				t.Errorf("stderr speaks of system calls: %s", stderr)
			}
			for _, s := range tc.contains {
				if !strings.Contains(stderr, s) {
					t.Errorf("stderr %q does not mention %q", stderr, s)
				}
			}
			if tc.code != exitOK && strings.Count(strings.TrimSpace(stderr), "\n") > 0 && len(tc.contains) > 0 {
				t.Errorf("want one line on stderr, got %q", stderr)
			}
		})
	}
}

// The JSON contract of solve that scripts rely on.
func TestSolveJSONContract(t *testing.T) {
	code, out, stderr := runCLI(t, "solve", "--section", "naca:2412", "--alpha", "4", "--panels", "160", "--format", "json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"cl", "cl_pressure", "cm", "cp_min", "x_cp_min", "stagnation", "panels", "alpha_deg", "points", "warnings", "elements"} {
		if _, ok := m[k]; !ok {
			t.Errorf("missing key %q", k)
		}
	}
	if m["panels"].(float64) != 160 || m["alpha_deg"].(float64) != 4 {
		t.Errorf("panels %v alpha %v, want 160 and 4", m["panels"], m["alpha_deg"])
	}
	pts := m["points"].([]any)
	if len(pts) != 160 {
		t.Fatalf("%d points, want one per panel (160)", len(pts))
	}
	sides := map[string]int{}
	for _, p := range pts {
		pm := p.(map[string]any)
		for _, k := range []string{"x", "y", "cp", "side"} {
			if _, ok := pm[k]; !ok {
				t.Fatalf("point lacks %q: %v", k, pm)
			}
		}
		sides[pm["side"].(string)]++
	}
	if sides["upper"] != 80 || sides["lower"] != 80 {
		t.Errorf("sides %v, want 80 upper and 80 lower", sides)
	}
	st := m["stagnation"].(map[string]any)
	if _, ok := st["x"]; !ok {
		t.Error("stagnation lacks x")
	}
	// NACA 2412 at 4°: thin-airfoil theory gives 2π(α − α_L0) = 2π(4° +
	// 2.077°) = 0.666 (Anderson, Fundamentals of Aerodynamics, NACA 2412
	// example); a 12 % thick section in potential flow lies some 10 % above
	// (docs/validation.md §1, from memory: slope ≈ 2π(1 + 0.77 t/c)).
	cl := m["cl"].(float64)
	if cl < 0.66 || cl > 0.78 {
		t.Errorf("cl = %.4f, want within the thin-airfoil to thick-section band 0.66–0.78", cl)
	}
	if d := math.Abs(cl-m["cl_pressure"].(float64)) / cl; d > 0.005 {
		t.Errorf("circulation and pressure Cl differ by %.2f %%", 100*d)
	}
}

func TestSweepJSONContract(t *testing.T) {
	sw := sweepJSONOf(t, "sweep", "--section", "naca:0012", "--alpha", "-2:2:1")
	if sw.ClMax != nil || sw.AlphaClMax != nil {
		t.Errorf("an inviscid sweep gives Cl max %v at %v, want null (potential flow does not stall)", *sw.ClMax, *sw.AlphaClMax)
	}
	rows := make([]map[string]float64, len(sw.Rows))
	for i, r := range sw.Rows {
		rows[i] = map[string]float64{}
		for k, v := range r {
			if f, ok := v.(float64); ok {
				rows[i][k] = f
			}
		}
	}
	if len(rows) != 5 {
		t.Fatalf("%d rows, want 5", len(rows))
	}
	for i, r := range rows {
		for _, k := range []string{"alpha_deg", "cl", "cm", "cp_min"} {
			if _, ok := r[k]; !ok {
				t.Errorf("row %d lacks %q", i, k)
			}
		}
		// Symmetric section: Cl(−α) = −Cl(α) (exact by symmetry).
		if j := len(rows) - 1 - i; math.Abs(r["cl"]+rows[j]["cl"]) > 1e-9 {
			t.Errorf("Cl(%g) = %g is not −Cl(%g) = %g", r["alpha_deg"], r["cl"], rows[j]["alpha_deg"], -rows[j]["cl"])
		}
	}
}

func TestSweepCSVAndText(t *testing.T) {
	for _, f := range []string{"csv", "text"} {
		code, out, stderr := runCLI(t, "sweep", "--section", "naca:4412", "--alpha", "0:4:2", "--format", f)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", f, code, stderr)
		}
		rows := 0
		for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
			if !strings.HasPrefix(l, "caution:") && !strings.HasPrefix(l, "Sweep of ") && !strings.HasPrefix(l, "warning:") && !strings.HasPrefix(l, "# ") {
				rows++
			}
		}
		if rows != 4 {
			t.Errorf("%s: %d table lines, want a header and 3 rows:\n%s", f, rows, out)
		}
		if f == "text" && !strings.Contains(out, "caution: 2-D estimate") {
			t.Errorf("text output without the caution:\n%s", out)
		}
	}
}

// The answer must not depend on how the coordinate file was laid out.
func TestCleanThenSolveMatchesGenerated(t *testing.T) {
	dir := t.TempDir()
	// Write the generated section as a file via the clean round trip.
	src := filepath.Join(dir, "in.dat")
	code, out, stderr := runCLI(t, "solve", "--section", "naca:4412", "--format", "json")
	if code != exitOK {
		t.Fatal(stderr)
	}
	var gen struct{ Cl float64 }
	if err := json.Unmarshal([]byte(out), &gen); err != nil {
		t.Fatalf("solve's JSON: %v\n%s", err, out)
	}
	// Write the NACA points through the exporter and back.
	code, _, stderr = runCLI(t, "export", "--section", "naca:4412", "--what", "coords", "-o", src)
	if code != exitOK {
		t.Fatalf("export --what coords: exit %d: %s", code, stderr)
	}
	code, out, stderr = runCLI(t, "solve", "--section", src, "--format", "json")
	if code != exitOK {
		t.Fatal(stderr)
	}
	var file struct{ Cl float64 }
	if err := json.Unmarshal([]byte(out), &file); err != nil {
		t.Fatalf("solve's JSON from the file: %v\n%s", err, out)
	}
	if gen.Cl == 0 || file.Cl == 0 {
		t.Fatalf("no cl in the JSON: generated %v, from the file %v", gen.Cl, file.Cl)
	}
	if d := math.Abs(file.Cl - gen.Cl); d > 2e-4 {
		t.Errorf("Cl from the file %.6f, generated %.6f", file.Cl, gen.Cl)
	}
}

func TestCleanCommand(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "reversed.dat")
	// A coarse symmetric section listed from the lower trailing edge
	// (clockwise): the cleaner must reverse it and say so.
	var b strings.Builder
	b.WriteString("reversed test section\n")
	const n = 40
	for i := 0; i <= 2*n; i++ {
		th := 2 * math.Pi * float64(i) / float64(2*n)
		x := 0.5 + 0.5*math.Cos(th)
		y := -0.06 * math.Sin(th) * math.Sqrt(math.Max(0, 1-x)) // lower first
		if i == 2*n {
			x, y = 1, 0
		}
		b.WriteString(strings.TrimSpace(strings.Join([]string{ftoa(x), ftoa(y)}, " ")) + "\n")
	}
	if err := os.WriteFile(in, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "clean.dat")
	code, stdout, stderr := runCLI(t, "clean", in, "-o", out)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(strings.ToLower(stdout), "revers") {
		t.Errorf("report does not say the order was reversed:\n%s", stdout)
	}
	got, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(got)), "\n")
	if lines[0] != "reversed test section" {
		t.Errorf("name line %q", lines[0])
	}
}

func ftoa(f float64) string { return strings.TrimRight(strings.TrimRight(fmtF(f), "0"), ".") }

func fmtF(f float64) string { return strconv.FormatFloat(f, 'f', 6, 64) }

func TestExportAndReport(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		name   string
		args   []string
		out    string
		starts string // expected start of the file
	}{
		{"coords", []string{"--what", "coords", "--chord-mm", "250", "--points", "80"}, "c.dat", "NACA 4412"},
		{"coords csv", []string{"--what", "csv"}, "c.csv", "x,y"},
		{"cp table", []string{"--what", "csv", "--table", "cp"}, "cp.csv", "element,"},
		{"sweep table", []string{"--what", "csv", "--table", "sweep"}, "s.csv", "alpha_deg,cl"},
		{"dxf", []string{"--what", "outline-dxf", "--chord-mm", "250", "--skin-mm", "1.5", "--spar", "0.3,8"}, "o.dxf", "999\nSectionbench drawing"},
		{"svg", []string{"--what", "outline-svg", "--chord-mm", "250"}, "o.svg", "<?xml"},
		{"figure", []string{"--what", "figure", "--view", "polar"}, "f.png", "\x89PNG"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out := filepath.Join(dir, tc.out)
			args := append([]string{"export", "--section", "naca:4412"}, tc.args...)
			code, _, stderr := runCLI(t, append(args, "-o", out)...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			b, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			body := strings.TrimLeft(string(b), " ")
			for strings.HasPrefix(body, "# ") { // CSV metadata
				_, body, _ = strings.Cut(body, "\n")
			}
			if !strings.HasPrefix(body, tc.starts) {
				t.Errorf("file starts %q, want %q", string(b[:min(len(b), 40)]), tc.starts)
			}
		})
	}
	code, _, stderr := runCLI(t, "export", "--section", "naca:4412", "--what", "figure", "-o", "-")
	if code != exitUsage || !strings.Contains(stderr, "binary") {
		t.Errorf("a PNG to standard output: exit %d, %s", code, stderr)
	}
	code, _, stderr = runCLI(t, "export", "--section", "naca:4412", "--what", "drawing", "-o", "x")
	if code != exitUsage || !strings.Contains(stderr, "--what") {
		t.Errorf("unknown --what: exit %d, %s", code, stderr)
	}
	pdf := filepath.Join(dir, "r.pdf")
	if code, _, stderr := runCLI(t, "report", "--section", "naca:2412", "--alpha", "3", "-o", pdf); code != exitOK {
		t.Fatalf("report: exit %d: %s", code, stderr)
	}
	if b, _ := os.ReadFile(pdf); !strings.HasPrefix(string(b), "%PDF-") {
		t.Errorf("report is not a PDF")
	}
}

func TestBenchJSON(t *testing.T) {
	code, out, stderr := runCLI(t, "bench", "--panels", "40", "--repeats", "2", "--format", "json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"assembly_ms", "factorization_ms", "solve_ms", "sweep_ms", "field_ms"} {
		if v, ok := m[k].(float64); !ok || v < 0 {
			t.Errorf("%s = %v", k, m[k])
		}
	}
	if m["unknowns"].(float64) < 41 {
		t.Errorf("unknowns %v for 40 panels", m["unknowns"])
	}
}
