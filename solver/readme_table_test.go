package solver

import (
	"flag"
	"fmt"
	"math"
	"os"
	"strings"
	"sync"
	"testing"

	"sectionbench/model"
)

// The README's validation table is written by these tests, so that the
// figures it quotes are the ones the checks assert:
//
//	go test ./solver -update     # rewrite the table after a deliberate change
//	go test ./solver             # fails if the README's table differs
//
// Each row's check, source (with its tag: published, derived or from
// memory, as in docs/validation.md) and tolerance are declared once in
// readmeChecks; the test that asserts the check records the measured result
// with recordReadme. TestMain assembles the table after a full run of the
// package (a run narrowed with -run leaves the README alone).

var updateReadme = flag.Bool("update", false, "rewrite the README's validation table from the checks' results")

// readmeCheck is one row of the README's validation table.
type readmeCheck struct {
	key, check, source, tolerance string
}

// readmeChecks are the rows in the README's order.
var readmeChecks = []readmeCheck{
	{"kt-sample", "Kármán–Trefftz μ = (−0.1, 0.1), τ = 10°, α = 5°, 200 panels",
		"exact conformal-map solution (Milne-Thomson; Katz & Plotkin ch. 6), Cl = 1.2514 [derived, docs/validation.md §2]",
		"Cl ± 0.1 %, Cp RMS ≤ 0.01 over x/c ≤ 0.95"},
	{"kt-order", "observed order of Cl, 80 → 160 → 320 panels, six Kármán–Trefftz cases",
		"second order for linear-vortex panels clustered at both edges [derived, docs/validation.md §7]",
		"≥ 1.5 at every step: tells second order from first"},
	{"thin-airfoil", "NACA 2401/2403/2406 zero-lift angle and Cm",
		"thin-airfoil theory, Anderson, *Fundamentals of Aerodynamics* ch. 4 (NACA 2412: −2.077°, −0.053) [published]",
		"α_L0 within (t/c)° below theory, Cm ± 5 × 10⁻⁴"},
	{"naca-thickness", "NACA 0012 half-thickness at x = 0.3",
		"Abbott & von Doenhoff 1959, ch. 6: 0.06002 [published]",
		"± 10⁻⁵ (half the last tabulated digit)"},
	{"image", "image method vs explicit mirror",
		"exact [derived, docs/validation.md §5]",
		"10⁻⁶ relative"},
	{"plate-ground", "flat plate in ground effect, h/c = 1, 2, 4, 8",
		"lumped vortex: Γ/Γ∞ − 1 = (c/4h)² [derived, docs/validation.md §5]",
		"10 %, 3 %, 2 %, 2 % of the excess (the lumped model is rough near the ground)"},
	{"blasius", "laminar flat plate θ√(Re/x), Cf√Re_x at x = 0.3",
		"Blasius (Schlichting, *Boundary-Layer Theory* ch. 7): 0.664, 0.664 [published]",
		"1.5 %, 2 % (Thwaites' closed form is 0.671)"},
	{"howarth", "Howarth's retarded flow, laminar separation x/L",
		"Thwaites closed form 0.1231 [derived]; exact ≈ 0.120 (Howarth 1938) [from memory]",
		"± 0.001, ± 0.005"},
	{"naca0012-free", "NACA 0012, Re 6 × 10⁶, α = 0°, free transition",
		"Abbott & von Doenhoff App. IV, smooth: Cd 0.0055–0.0065 [from memory]; transition in the first half of the chord, aft of the suction peak [from memory]",
		"Cd 0.0052–0.0068 (the band ± 5 % tunnel uncertainty); transition x/c 0.2–0.6"},
	{"naca0012-tripped", "NACA 0012, Re 6 × 10⁶, α = 4.04°, trip at 5 %",
		"Ladson, NASA TM 4074, 1988, 80 grit: Cd 0.00823 [published, testdata/validation]",
		"± 8 %: twice the ± 4 % spread of the three grit sizes near 4°"},
	{"isa", "ISA sea-level density and viscosity",
		"U.S. Standard Atmosphere, 1976: 1.2250 kg/m³, 1.7894 × 10⁻⁵ Pa·s [published]",
		"half the last tabulated digit"},
}

var readmeResults = struct {
	sync.Mutex
	m map[string]string
}{m: map[string]string{}}

// recordReadme records the measured result of a README check. A check that
// failed records nothing, so the table is never written from a failing run.
func recordReadme(t *testing.T, key, format string, args ...any) {
	t.Helper()
	found := false
	for _, c := range readmeChecks {
		found = found || c.key == key
	}
	if !found {
		panic("solver: no README check " + key)
	}
	if t.Failed() {
		return
	}
	readmeResults.Lock()
	defer readmeResults.Unlock()
	readmeResults.m[key] = fmt.Sprintf(format, args...)
}

const (
	readmePath       = "../README.md"
	readmeTableStart = "<!-- validation table: written by `go test ./solver -update`; do not edit by hand -->\n"
	readmeTableEnd   = "<!-- end of validation table -->\n"
)

// readmeTable renders the table, or reports which checks did not record.
func readmeTable() (string, []string) {
	readmeResults.Lock()
	defer readmeResults.Unlock()
	var b strings.Builder
	var missing []string
	b.WriteString("| check | source | tolerance | result |\n| --- | --- | --- | --- |\n")
	for _, c := range readmeChecks {
		r, ok := readmeResults.m[c.key]
		if !ok {
			missing = append(missing, c.key)
		}
		fmt.Fprintf(&b, "| %s | %s | %s | %s |\n", c.check, c.source, c.tolerance, r)
	}
	return b.String(), missing
}

// checkReadme compares the README's table with the results (or writes it
// with -update). It returns an error to print, or nil.
func checkReadme() error {
	table, missing := readmeTable()
	if len(missing) > 0 {
		if *updateReadme {
			return fmt.Errorf("README table not written: no result for %s (run the whole package)", strings.Join(missing, ", "))
		}
		return nil // a narrowed or failing run
	}
	b, err := os.ReadFile(readmePath)
	if err != nil {
		return err
	}
	s := string(b)
	i := strings.Index(s, readmeTableStart)
	j := strings.Index(s, readmeTableEnd)
	if i < 0 || j < i {
		return fmt.Errorf("%s: the validation table's markers are missing", readmePath)
	}
	i += len(readmeTableStart)
	if s[i:j] == table {
		return nil
	}
	if *updateReadme {
		return os.WriteFile(readmePath, []byte(s[:i]+table+s[j:]), 0o644)
	}
	return fmt.Errorf("%s: the validation table differs from the checks' results; run go test ./solver -update and review the diff.\nwant:\n%s", readmePath, table)
}

func TestMain(m *testing.M) {
	flag.Parse()
	code := m.Run()
	if code == 0 {
		if err := checkReadme(); err != nil {
			fmt.Fprintln(os.Stderr, "FAIL:", err)
			code = 1
		}
	}
	os.Exit(code)
}

// TestReadmeNACAThickness: the NACA 0012 thickness distribution at x = 0.3
// against the tabulated ordinate (Abbott & von Doenhoff, Theory of Wing
// Sections, 1959, ch. 6 and App. I: y_t = 0.06002 at 30 % chord).
func TestReadmeNACAThickness(t *testing.T) {
	c, err := model.ParseNACA("0012")
	if err != nil {
		t.Fatal(err)
	}
	y := c.HalfThickness(0.30, false)
	if math.Abs(y-0.06002) > 1e-5 {
		t.Errorf("y_t(0.30) = %.6f, Abbott & von Doenhoff 0.06002", y)
	}
	recordReadme(t, "naca-thickness", "%.6f", y)
}

// TestReadmeISA: the air at the standard sea level against the U.S.
// Standard Atmosphere, 1976 (NOAA/NASA/USAF), to half the last tabulated
// digit: ρ = 1.2250 kg/m³, μ = 1.7894e-5 Pa·s.
func TestReadmeISA(t *testing.T) {
	a := model.ISASeaLevel()
	if math.Abs(a.Density()-1.2250) > 0.5e-4 || math.Abs(a.Viscosity()-1.7894e-5) > 0.5e-9 {
		t.Errorf("ρ = %.5f kg/m³, μ = %.5g Pa·s; U.S. Standard Atmosphere 1.2250, 1.7894e-5", a.Density(), a.Viscosity())
	}
	recordReadme(t, "isa", "%.4f kg/m³, %.4f × 10⁻⁵ Pa·s", a.Density(), a.Viscosity()*1e5)
}
