package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/assets"
)

// With the coupled viscous solution on (the single-element example as it
// opens), the density study reports the viscous Cl and Cd at each count
// and their extrapolations beside the panel method's, in JSON, CSV and
// text; without it, none of them.
func TestDensityViscous(t *testing.T) {
	var study []byte
	for _, ex := range assets.Examples {
		if strings.HasPrefix(ex.Title, "Single element") {
			study = ex.Study
		}
	}
	if study == nil {
		t.Fatal("no single-element example")
	}
	path := filepath.Join(t.TempDir(), "single.json")
	if err := os.WriteFile(path, study, 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errs := runCLI(t, "density", "--study", path, "--alpha", "4", "--panels", "40,80,160", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var d struct {
		Rows []struct {
			ViscousCl *float64 `json:"viscous_cl"`
			ViscousCd *float64 `json:"viscous_cd"`
		} `json:"rows"`
		Extrapolated map[string]json.RawMessage `json:"extrapolated"`
	}
	if err := json.Unmarshal([]byte(out), &d); err != nil {
		t.Fatal(err)
	}
	for i, r := range d.Rows {
		if r.ViscousCl == nil || r.ViscousCd == nil || !(*r.ViscousCd > 0) {
			t.Errorf("row %d: viscous Cl %v, Cd %v", i, r.ViscousCl, r.ViscousCd)
		}
	}
	if d.Extrapolated["viscous_cl"] == nil || d.Extrapolated["viscous_cd"] == nil {
		t.Errorf("extrapolations %v lack the viscous ones", d.Extrapolated)
	}
	_, out, _ = runCLI(t, "density", "--study", path, "--alpha", "4", "--panels", "40,80,160")
	if !strings.Contains(out, "Cd viscous") {
		t.Errorf("text output lacks the viscous drag:\n%s", out)
	}
	_, out, _ = runCLI(t, "density", "--section", "naca:2412", "--alpha", "4", "--panels", "40,80,160", "--format", "csv")
	if strings.Contains(out, "viscous") {
		t.Errorf("an inviscid density study reports viscous columns:\n%s", out)
	}
}
