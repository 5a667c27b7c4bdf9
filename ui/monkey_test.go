package ui

import (
	"flag"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"sectionbench/model"
)

// Size of the randomised GUI test: actions in a full run and under
// -short, and a wall-clock bound after which a full run stops early (a
// bound on the test's length on a loaded machine, not a speed check).
const (
	monkeyActions      = 2000
	monkeyShortActions = 300
	monkeyBudget       = 25 * time.Second
	monkeySeed1        = 20261201
	monkeySeed2        = 7
	// The window is small so that each redraw is cheap.
	monkeyWidth, monkeyHeight = 480, 320
)

// monkeySeed chooses the random actions: go test -run Monkey -monkey.seed=N
// tries another sequence (the default is the one the suite runs).
var monkeySeed = flag.Uint64("monkey.seed", monkeySeed1, "seed of TestMonkey's random actions")

// monkeyAction is one kind of random user action; do performs it and
// says what it did.
type monkeyAction struct {
	weight int
	do     func(r *rand.Rand) string
}

func pick[T any](r *rand.Rand, xs []T) T { return xs[r.IntN(len(xs))] }

// monkeyFiles copies the malformed and good coordinate files into a
// temporary folder and writes bad and good study files beside them.
func monkeyFiles(t *testing.T) (sections, studies []string) {
	t.Helper()
	dir := t.TempDir()
	for _, src := range []string{"../model/testdata/malformed", "../model/testdata/sections"} {
		entries, err := os.ReadDir(src)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range entries {
			if e.IsDir() || e.Name() == "expect.json" {
				continue
			}
			b, err := os.ReadFile(filepath.Join(src, e.Name()))
			if err != nil {
				t.Fatal(err)
			}
			p := filepath.Join(dir, filepath.Base(src)+"-"+e.Name())
			if err := os.WriteFile(p, b, 0o644); err != nil {
				t.Fatal(err)
			}
			sections = append(sections, p)
		}
	}
	sections = append(sections, filepath.Join(dir, "missing.dat"))
	good, err := os.ReadFile("../testdata/studies/rear-wing.json")
	if err != nil {
		t.Fatal(err)
	}
	bad := map[string]string{
		"truncated.json":    string(good[:len(good)/2]),
		"empty.json":        "",
		"array.json":        "[]",
		"version.json":      `{"format":"sectionbench-study","version":99}`,
		"few-panels.json":   strings.Replace(string(good), `"panels": 160`, `"panels": 5`, 1),
		"spacing.json":      strings.Replace(string(good), `"cosine"`, `"spiral"`, 1),
		"nan.json":          strings.Replace(string(good), `"alpha_deg": 3`, `"alpha_deg": NaN`, 1),
		"huge-angle.json":   strings.Replace(string(good), `"alpha_deg": 3`, `"alpha_deg": 1e308`, 1),
		"bad-naca.json":     strings.Replace(string(good), `naca:4412`, `naca:44x2`, 1),
		"missing-file.json": strings.Replace(string(good), `naca:4412`, `file:nowhere.dat`, 1),
		"rear-wing.json":    string(good),
	}
	for name, body := range bad {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		studies = append(studies, p)
	}
	studies = append(studies, filepath.Join(dir, "missing.json"))
	return sections, studies
}

// TestMonkey drives the workbench with random actions, valid and invalid,
// from a fixed seed, and after each checks that nothing panicked, that
// the results shown belong to the current study and that the title tells
// whether it has unsaved changes.
func TestMonkey(t *testing.T) {
	n := monkeyActions
	if testing.Short() {
		n = monkeyShortActions
	}
	w := newTestBench(t)
	// A small window keeps each redraw cheap.
	w.Window().Resize(fyne.NewSize(monkeyWidth, monkeyHeight))
	w.WaitIdle()
	sections, studies := monkeyFiles(t)
	saveDir := t.TempDir()
	c := w.controls
	ctl := w.ctl
	r := rand.New(rand.NewPCG(*monkeySeed, monkeySeed2))

	density := func() *densityWindow { return w.density }
	actions := []monkeyAction{
		{6, func(r *rand.Rand) string {
			s := pick(r, []string{"16", "24", "40", "64", "90", "120", "15", "2001", "0", "-40", "abc", "", "1e3", "NaN", " 80 ", "99999999999999999999", "12.5"})
			switch r.IntN(50) {
			case 0:
				s = "600"
			case 1:
				s = "240"
			}
			c.panelEntry.submit(s)
			return "panel entry " + strconv.Quote(s)
		}},
		{3, func(r *rand.Rand) string {
			v := float64(model.MinPanels + r.IntN(150))
			c.panelSlider.SetValue(v)
			return fmt.Sprintf("panel slider %g", v)
		}},
		{2, func(r *rand.Rand) string {
			s := pick(r, model.Spacings)
			c.spacing.SetSelected(string(s))
			return "spacing " + string(s)
		}},
		{2, func(r *rand.Rand) string {
			v := r.Float64()
			if r.IntN(2) == 0 {
				c.nose.SetValue(v)
				return fmt.Sprintf("nose %.2f", v)
			}
			c.tail.SetValue(v)
			return fmt.Sprintf("tail %.2f", v)
		}},
		{6, func(r *rand.Rand) string {
			s := pick(r, []string{"0", "4", "-4", "7.5", "−3,5", "12", "-15", "NaN", "inf", "1e308", "-1e308", "abc", "", "90", "-90", "45", "3."})
			if r.IntN(3) == 0 {
				s = strconv.FormatFloat(-10+20*r.Float64(), 'f', 2, 64)
			}
			c.alphaEntry.submit(s)
			return "alpha entry " + strconv.Quote(s)
		}},
		{2, func(r *rand.Rand) string {
			v := -20 + 40*r.Float64()
			c.alphaSlider.SetValue(v)
			return fmt.Sprintf("alpha slider %.2f", v)
		}},
		{2, func(r *rand.Rand) string {
			if r.IntN(2) == 0 {
				test.Tap(c.alphaUp)
				return "alpha +"
			}
			test.Tap(c.alphaDown)
			return "alpha −"
		}},
		{5, func(r *rand.Rand) string {
			s := pick(r, []string{"0012", "4412", "23012", "2412", "6409", "0006", "44x2", "", "99999", "0000", "abcd", "9999", "0099", "63-412", "NACA 0012", "1", "24012", "4415"})
			c.naca.submit(s)
			return "NACA " + strconv.Quote(s)
		}},
		{2, func(r *rand.Rand) string {
			vals := []string{"-0.1", "0.1", "10", "0", "-0.3", "abc", "NaN", "1e9", "-5", "30", "0.05"}
			x, y, tau := pick(r, vals), pick(r, vals), pick(r, vals)
			c.ktX.submit(x)
			c.ktY.submit(y)
			c.ktTau.submit(tau)
			c.useKT()
			return fmt.Sprintf("Kármán–Trefftz %s %s %s", x, y, tau)
		}},
		{2, func(r *rand.Rand) string {
			c.inverted.SetChecked(!c.inverted.Checked)
			return "inverted toggled"
		}},
		{3, func(r *rand.Rand) string {
			if r.IntN(2) == 0 {
				c.ground.SetChecked(!c.ground.Checked)
				return "ground toggled"
			}
			s := pick(r, []string{"50", "80", "10", "0", "-5", "abc", "1e9", "NaN", "200", "25"})
			c.clearance.submit(s)
			return "clearance " + strconv.Quote(s)
		}},
		{3, func(r *rand.Rand) string {
			sets := [][3]string{{"-4", "12", "1"}, {"0", "8", "2"}, {"-2", "6", "0.5"}, {"4", "4", "1"}, {"10", "-2", "1"}, {"0", "10", "0"}, {"abc", "5", "1"}, {"0", "5", "-1"}, {"-90", "90", "0.01"}, {"0", "1e9", "1"}}
			s := pick(r, sets)
			c.from.submit(s[0])
			c.to.submit(s[1])
			c.step.submit(s[2])
			return fmt.Sprintf("sweep %v", s)
		}},
		{2, func(r *rand.Rand) string {
			c.runSweep()
			if r.IntN(2) == 0 {
				ctl.CancelSweep()
				return "run sweep, cancel"
			}
			return "run sweep"
		}},
		{5, func(r *rand.Rand) string {
			if r.IntN(3) == 0 {
				return fmt.Sprintf("redo %v", ctl.Redo())
			}
			return fmt.Sprintf("undo %v", ctl.Undo())
		}},
		{2, func(r *rand.Rand) string {
			if r.IntN(3) == 0 {
				w.userError(ctl.ClearPins())
				return "clear pins"
			}
			w.userError(ctl.PinCurrent())
			return "pin"
		}},
		{2, func(r *rand.Rand) string {
			switch r.IntN(4) {
			case 0:
				w.userError(ctl.AddElement())
				return "add element"
			case 1:
				i := r.IntN(len(ctl.Current().Elements))
				w.userError(ctl.RemoveElement(i))
				return fmt.Sprintf("remove element %d", i)
			}
			i := r.IntN(len(ctl.Current().Elements))
			ctl.SetElement(i)
			return fmt.Sprintf("choose element %d", i)
		}},
		{3, func(r *rand.Rand) string {
			p := pick(r, sections)
			w.loadSectionFile(p)
			return "open section " + filepath.Base(p)
		}},
		{2, func(r *rand.Rand) string {
			p := pick(r, studies)
			w.loadStudyFile(p)
			return "open study " + filepath.Base(p)
		}},
		{1, func(r *rand.Rand) string {
			w.newStudy()
			if b := findButton(w.Window(), "Continue without saving"); b != nil && r.IntN(2) == 0 {
				test.Tap(b)
				return "new study, discarding changes"
			}
			return "new study (asked)"
		}},
		{1, func(r *rand.Rand) string {
			p := filepath.Join(saveDir, "monkey.json")
			w.userError(ctl.Save(p))
			return "save"
		}},
		{1, func(r *rand.Rand) string {
			k := viewKind(r.IntN(int(numViews) + 1))
			w.toggleEnlarge(k)
			return fmt.Sprintf("enlarge %d", k)
		}},
		{3, func(r *rand.Rand) string {
			tab := r.IntN(3)
			w.openDensity(tab)
			d := density()
			d.win.Resize(fyne.NewSize(monkeyWidth+densityControlWidth, monkeyHeight))
			d.panels.SetText(pick(r, []string{"16, 32, 64", "20, 40, 80", "40, 20", "abc", "16", "16 32 64 128", "16; 32; 64", "0, 5000"}))
			d.nose.SetText(pick(r, []string{"", "", "0.2, 0.8", "2", "x", "0,5"}))
			d.tolCl.SetText(pick(r, []string{"0.5", "1", "0", "-1", "abc", "100", "1e9"}))
			d.start()
			if r.IntN(3) == 0 {
				d.stop()
				return fmt.Sprintf("density tab %d, run %q, cancel", tab, d.panels.Text)
			}
			return fmt.Sprintf("density tab %d, run %q nose %q tol %q", tab, d.panels.Text, d.nose.Text, d.tolCl.Text)
		}},
		{1, func(r *rand.Rand) string {
			d := density()
			if d == nil {
				return "use (no density window)"
			}
			d.useRecommended()
			return "use recommended count"
		}},
		{1, func(r *rand.Rand) string {
			d := density()
			if d == nil {
				return "ratio (no density window)"
			}
			s := pick(r, []string{"1.5", "2", "0.5", "abc", "1.01", "11"})
			d.sizes.ratio.SetText(s)
			d.tabs.SelectIndex(densityTabSizes)
			return "ratio limit " + strconv.Quote(s)
		}},
		{1, func(r *rand.Rand) string {
			d := density()
			if d == nil {
				return "close (no density window)"
			}
			d.hide()
			return "close density window"
		}},
	}
	total := 0
	for _, a := range actions {
		total += a.weight
	}
	var recent []string
	start := time.Now()
	done := 0
	for i := range n {
		if time.Since(start) > monkeyBudget {
			t.Logf("stopped after %d of %d actions (%v)", i, n, monkeyBudget)
			break
		}
		k := r.IntN(total)
		var act monkeyAction
		for _, a := range actions {
			if k < a.weight {
				act = a
				break
			}
			k -= a.weight
		}
		desc := act.do(r)
		recent = append(recent, desc)
		if len(recent) > 12 {
			recent = recent[1:]
		}
		w.WaitIdle()
		dismissOverlays(w.Window())
		if d := density(); d != nil {
			dismissOverlays(d.win)
		}
		if err := monkeyCheck(w); err != nil {
			t.Fatalf("after action %d (%s): %v\nlast actions:\n  %s", i, desc, err, strings.Join(recent, "\n  "))
		}
		done++
	}
	t.Logf("%d actions in %v", done, time.Since(start).Round(time.Millisecond))
}

// dismissOverlays closes every dialog the last action opened.
func dismissOverlays(win fyne.Window) {
	ov := win.Canvas().Overlays()
	for _, o := range ov.List() {
		ov.Remove(o)
	}
}

// monkeyCheck tells whether the workbench shows what its study says.
func monkeyCheck(w *Workbench) error {
	ctl := w.ctl
	st := ctl.Current()
	if st == nil {
		return fmt.Errorf("no study")
	}
	title := w.Window().Title()
	if !strings.HasPrefix(title, st.Name) {
		return fmt.Errorf("title %q does not name the study %q", title, st.Name)
	}
	if strings.Contains(title, "•") != ctl.Dirty() {
		return fmt.Errorf("title %q, unsaved changes %v", title, ctl.Dirty())
	}
	res, gen, err := ctl.Result()
	if err != nil {
		if strings.Contains(err.Error(), "internal error") {
			return fmt.Errorf("the solver failed inside: %v", err)
		}
	} else {
		if res == nil || gen != ctl.Latest() {
			return fmt.Errorf("idle, but the result shown (gen %d) is not the newest request (%d)", gen, ctl.Latest())
		}
		if got, want := len(res.Solution.Elements), len(st.Elements); got != want {
			return fmt.Errorf("result has %d elements, study %d", got, want)
		}
		for _, e := range res.Solution.Elements {
			if len(e.Panels) != st.Panelling.Panels {
				return fmt.Errorf("result element %s has %d panels, study asks for %d", e.Name, len(e.Panels), st.Panelling.Panels)
			}
		}
		sc := w.lastScene()
		if sc == nil || sc.Solution != res.Solution {
			return fmt.Errorf("the views do not show the newest result")
		}
		if sc.AlphaDeg != st.Flow.AlphaDeg || sc.Inverted != st.Inverted || sc.Ground != st.Ground.Enabled || len(sc.Pins) != len(st.Pins) {
			return fmt.Errorf("views show α %g, inverted %v, ground %v, %d pins; study has %g, %v, %v, %d",
				sc.AlphaDeg, sc.Inverted, sc.Ground, len(sc.Pins), st.Flow.AlphaDeg, st.Inverted, st.Ground.Enabled, len(st.Pins))
		}
	}
	c := w.controls
	if c.panelMsg.Hidden {
		if n, err := strconv.Atoi(strings.TrimSpace(c.panelEntry.Text)); err != nil || n != st.Panelling.Panels {
			return fmt.Errorf("panel entry says %q without a message, study has %d", c.panelEntry.Text, st.Panelling.Panels)
		}
	}
	if d := w.density; d != nil {
		if d.running != nil {
			return fmt.Errorf("idle, but a density study is still marked running")
		}
		if d.out != nil && !d.use.Disabled() {
			ser := d.out.res.Series[d.seriesIdx]
			if !d.fresh() || (ser.RecommendedPanels == st.Panelling.Panels && ser.Nose == st.Panelling.Nose) {
				return fmt.Errorf("Use is enabled for an outcome that is stale or already applied")
			}
		}
		if d.sizes.active && d.sizes.sizes != nil {
			got, _ := d.sizes.shownPanels()
			if len(got) != len(st.Elements) {
				return fmt.Errorf("panel sizes of %d elements, study has %d", len(got), len(st.Elements))
			}
			for i, n := range got {
				if n != st.Panelling.Panels {
					return fmt.Errorf("panel sizes of element %d show %d panels, study has %d", i, n, st.Panelling.Panels)
				}
			}
		}
	}
	return nil
}
