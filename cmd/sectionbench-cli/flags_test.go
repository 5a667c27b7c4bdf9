package main

import (
	"encoding/json"
	"slices"
	"strconv"
	"strings"
	"testing"

	"sectionbench/model"
)

// TestSweepRowFlags: every sweep row says in words why it is not to be
// trusted; the example wing in ground effect passes the plausible suction
// peak (model.CpMinPlausible) above about 1.5°.
func TestSweepRowFlags(t *testing.T) {
	code, out, errs := runCLI(t, "sweep", "--study", inviscidExample(t, "two-element-ground.json"), "--format", "json")
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

// TestSweepCSVFlags: the CSV sweep ends each row with its flags in words,
// the same as the JSON rows.
func TestSweepCSVFlags(t *testing.T) {
	code, out, errs := runCLI(t, "sweep", "--study", inviscidExample(t, "two-element-ground.json"), "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var recs [][]string
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		if !strings.HasPrefix(l, "#") {
			recs = append(recs, strings.Split(l, ","))
		}
	}
	head := recs[0]
	col, cp := slices.Index(head, "flags"), slices.Index(head, "cp_min")
	if col != len(head)-1 || cp < 0 {
		t.Fatalf("header %q: want cp_min and flags last", head)
	}
	suction := 0
	for _, r := range recs[1:] {
		v, err := strconv.ParseFloat(r[cp], 64)
		if err != nil {
			t.Fatal(err)
		}
		if v < model.CpMinPlausible {
			suction++
			if !strings.Contains(r[col], string(model.FlagSuction)) {
				t.Errorf("row %q: min Cp %g not flagged", r, v)
			}
		} else if r[col] != "none" {
			t.Errorf("row %q: flags %q, want none", r, r[col])
		}
	}
	if suction == 0 {
		t.Error("no row of the example's sweep passes the plausible suction peak: the check checks nothing")
	}
}
