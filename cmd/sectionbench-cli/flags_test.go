package main

import (
	"encoding/json"
	"testing"

	"sectionbench/model"
)

// TestSweepRowFlags: every sweep row says in words why it is not to be
// trusted; the example wing in ground effect passes the plausible suction
// peak (model.CpMinPlausible) above about 1.5°.
func TestSweepRowFlags(t *testing.T) {
	code, out, errs := runCLI(t, "sweep", "--study", "../../assets/examples/two-element-ground.json", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var sw struct {
		Rows []struct {
			AlphaDeg float64  `json:"alpha_deg"`
			CpMin    float64  `json:"cp_min"`
			Flags    []string `json:"flags"`
		} `json:"rows"`
	}
	if err := json.Unmarshal([]byte(out), &sw); err != nil {
		t.Fatal(err)
	}
	for _, r := range sw.Rows {
		flagged := len(r.Flags) > 0 && r.Flags[0] == string(model.FlagSuction)
		if flagged != (r.CpMin < model.CpMinPlausible) {
			t.Errorf("α %g°, min Cp %g: flags %q", r.AlphaDeg, r.CpMin, r.Flags)
		}
	}
}
