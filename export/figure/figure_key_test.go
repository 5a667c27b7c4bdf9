package figure

import (
	"bytes"
	"image"
	"image/png"
	"math"
	"os"
	"slices"
	"strings"
	"testing"

	"sectionbench/solver/engine"
)

// TestPolarKeyAboveInAppView: the polar of a two-element inverted wing
// with its coupled sweep carries seven key entries (the inviscid Cl, Cm,
// the flagged points, the viscous Cl, the rows past maximum lift, those
// separated, the most downforce as a lower bound and the rows that did
// not converge). Drawn at the size of the
// workbench's polar view (about 450 × 240 pixels at 96 dpi), and
// enlarged, the key must stay in its band above the data area: as a box
// in a corner it was wider than the data area and covered the curves.
func TestPolarKeyAboveInAppView(t *testing.T) {
	sc := synthCoupledScene()
	sc.Inverted = true
	sc.ClMaxIsPeak = false
	sc.SweepCoupled[1].Converged = false
	sc.SweepCoupled[2].Converged = false
	for i := range sc.Sweep {
		sc.Sweep[i].CpMin = -9 // beyond real flows: ringed, an entry of its own
	}
	for i := range sc.SweepCoupled { // the last converged row separated
		sc.SweepCoupled[i].Elements = []engine.CoupledElementPoint{{Cl: 1, SeparationUpper: math.NaN(), SeparationLower: math.NaN()}}
	}
	sc.SweepCoupled[len(sc.SweepCoupled)-2].Elements[0].SeparationUpper = 0.8
	for _, size := range []struct {
		name string
		w, h int
	}{
		{"cell", 450, 240},
		{"enlarged", 900, 520},
		{"golden", goldenWidth, goldenHeight},
	} {
		t.Run(size.name, func(t *testing.T) {
			p, info, err := buildView(ViewPolar, sc)
			if err != nil {
				t.Fatal(err)
			}
			if len(info.keys) != 1 {
				t.Fatalf("%d keys, want the polar's one", len(info.keys))
			}
			k := info.keys[0]
			if len(k.entries) < 7 {
				t.Fatalf("%d key entries, want the seven of the case", len(k.entries))
			}
			img := image.NewRGBA(image.Rect(0, 0, size.w, size.h))
			renderPlot(p, info, img, 96)
			if n := k.reservedRows(); n == 0 {
				t.Errorf("the key is a box over the data (%d rows needed at %v)", len(k.rows(k.width)), k.text.Font.Size)
			}
			if out := os.Getenv("FIGURE_KEY_OUT"); out != "" {
				f, err := os.Create(out + "-" + size.name + ".png")
				if err == nil {
					png.Encode(f, img)
					f.Close()
				}
			}
		})
	}
}

// TestPolarMarksSeparatedRows: a converged row of the coupled sweep whose
// suction side separates ahead of x/c 0.9 (the sweep table's "separated"
// mark) is ringed on the viscous curve with its own key entry; attached
// rows are not. The polar marked rows past maximum lift and rows that did
// not converge, but not separated ones, which the report's table marked.
func TestPolarMarksSeparatedRows(t *testing.T) {
	sc := attachedCoupledScene()
	const at = 5
	sc.SweepCoupled[at].Elements[0].SeparationUpper = 0.7
	sep := separatedRows(sc)
	if len(sep) != 1 || sep[0].X != sc.SweepCoupled[at].AlphaDeg || sep[0].Y != sc.SweepCoupled[at].Cl {
		t.Fatalf("separated rows %v, want the row at %g°", sep, sc.SweepCoupled[at].AlphaDeg)
	}
	if keyEntryWith(t, ViewPolar, sc, "viscous, separated ahead of x/c 0.9") == "" {
		t.Error("the key has no entry for the separated rows")
	}
}

// TestPressureTitleInviscidAsStatus: with a converged coupled point the
// pressure title gives the inviscid Cl the status line and the results
// give beside the viscous one (from the surface pressure), not the Cl
// from circulation, which differs in the fourth digit (the views read
// −2.8980 against 2.897 on the two-element example).
func TestPressureTitleInviscidAsStatus(t *testing.T) {
	sc := synthCoupledScene()
	sc.Coupled.ClInviscid = sc.Solution.Cl - 0.0013 // as pressure and circulation differ
	s := svgText(t, ViewPressure, sc)
	if want := "Cl inviscid " + formatTick(sc.Coupled.ClInviscid, 4) + ", viscous " + formatTick(sc.Coupled.Cl, 4); !strings.Contains(s, want) {
		t.Errorf("pressure title lacks %q", want)
	}
	if strings.Contains(s, "Cl from circulation") {
		t.Error("the title gives the Cl from circulation beside the viscous Cl")
	}
	sc.Coupled.Converged = false
	if s := svgText(t, ViewPressure, sc); !strings.Contains(s, "Cl from circulation") || !strings.Contains(s, "viscous solution not converged") {
		t.Error("a point that did not converge: the title should keep the Cl from circulation and say so")
	}
}

// TestTwinAxisShortLabel: in a figure as small as the workbench's polar
// cell (4.7 × 2.5 inches) the right axis says "Cm" at a readable size
// rather than its whole label shrunk to 6 pt; a larger figure keeps the
// whole label.
func TestTwinAxisShortLabel(t *testing.T) {
	sc := synthCoupledScene()
	for _, c := range []struct {
		name          string
		wIn, hIn      float64
		whole, shortL bool
	}{
		{"cell", 4.7, 2.5, false, true},
		{"page", 8, 5, true, false},
	} {
		var b bytes.Buffer
		if err := WriteFigure(&b, ViewPolar, sc, "svg", c.wIn, c.hIn, 96); err != nil {
			t.Fatal(err)
		}
		texts, err := svgTexts(b.Bytes())
		if err != nil {
			t.Fatal(err)
		}
		whole, short := slices.Contains(texts, "Cm (about the moment reference)"), slices.Contains(texts, "Cm")
		if whole != c.whole || short != c.shortL {
			t.Errorf("%s: whole label %v, short %v; want %v, %v", c.name, whole, short, c.whole, c.shortL)
		}
	}
}

// TestSearchKeyAboveData: the search trace's key goes in rows above the
// data at the set-up window's size (its box in a corner covered points:
// after some fifty solves every corner holds some), with every kind of
// entry (invented steps: feasible, outside a constraint, not a single
// solve's answer, without an answer).
func TestSearchKeyAboveData(t *testing.T) {
	var steps []SearchStep
	for i := range 52 {
		v := 300 + 40*math.Sin(float64(i)*0.7) + float64(i)
		s := SearchStep{Objective: v, Feasible: i%3 != 1, NotSolve: i%11 == 5}
		if i%13 == 7 {
			s.Objective = math.NaN()
		}
		steps = append(steps, s)
	}
	for _, size := range []struct {
		name string
		w, h int
	}{
		{"window cell", 420, 300},
		{"wide", 640, 420},
	} {
		t.Run(size.name, func(t *testing.T) {
			p, k, err := searchPlot("Search (invented)", "downforce, N/m", steps, true, false)
			if err != nil {
				t.Fatal(err)
			}
			if len(k.entries) < 5 {
				t.Fatalf("%d key entries, want the five of the case", len(k.entries))
			}
			img := image.NewRGBA(image.Rect(0, 0, size.w, size.h))
			renderPlot(p, viewInfo{keys: []*key{k}}, img, 96)
			if n := k.reservedRows(); n == 0 {
				t.Errorf("the key is a box over the data (%d rows needed at %v)", len(k.rows(k.width)), k.text.Font.Size)
			}
			if out := os.Getenv("FIGURE_KEY_OUT"); out != "" {
				f, err := os.Create(out + "-search-" + strings.ReplaceAll(size.name, " ", "-") + ".png")
				if err == nil {
					png.Encode(f, img)
					f.Close()
				}
			}
		})
	}
}

// TestPinsSayInviscid: a pin holds the panel method's Cp and polar
// (engine.PinOf); beside the viscous solution's curves its key entry
// says so (a pinned search start read as the viscous answer's
// comparison), and alone with the panel method's it stays plain.
func TestPinsSayInviscid(t *testing.T) {
	coupled := synthCoupledScene()
	coupled.Pins = synthPins()
	plain := synthScene()
	for _, tc := range []struct {
		name string
		v    View
		sc   *Scene
		want string
	}{
		{"pressure, coupled", ViewPressure, coupled, "pin (inviscid): 160 panels"},
		{"polar, coupled", ViewPolar, coupled, "pin (inviscid): 160 panels"},
		{"pressure, panel method", ViewPressure, plain, "pin: 160 panels"},
		{"polar, panel method", ViewPolar, plain, "pin: 160 panels"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := keyEntryWith(t, tc.v, tc.sc, "pin"); got != tc.want {
				t.Errorf("pin's key entry %q, want %q", got, tc.want)
			}
		})
	}
}

// TestPolarMarksHeldRows: a converged coupled row whose transition is
// held upstream of its e^N position (a tripped wing's answer, flagged
// "transition held upstream" in the sweep table) is marked on the polar
// with its key entry; the two-element example with free transition drew
// its rows at 3°, 4°, 6° and 10° as ordinary ones.
func TestPolarMarksHeldRows(t *testing.T) {
	sc := attachedCoupledScene()
	const at = 4
	sc.SweepCoupled[at].Elements[0].HeldLower = true
	held := heldRows(sc)
	if len(held) != 1 || held[0].X != sc.SweepCoupled[at].AlphaDeg {
		t.Fatalf("held rows %v, want the row at %g°", held, sc.SweepCoupled[at].AlphaDeg)
	}
	if keyEntryWith(t, ViewPolar, sc, "viscous, transition held upstream") == "" {
		t.Error("the key has no entry for the held rows")
	}
}

// keyEntryWith returns the first key entry of view v of sc that begins
// with prefix, "" for none.
func keyEntryWith(t *testing.T, v View, sc *Scene, prefix string) string {
	t.Helper()
	_, info, err := buildView(v, sc)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range info.keys {
		for _, e := range k.entries {
			if strings.HasPrefix(e.label, prefix) {
				return e.label
			}
		}
	}
	return ""
}

// attachedCoupledScene is synthCoupledScene with one element per row,
// attached on both surfaces and without held transition, for a test to
// mark one row.
func attachedCoupledScene() *Scene {
	sc := synthCoupledScene()
	nan := math.NaN()
	for i := range sc.SweepCoupled {
		sc.SweepCoupled[i].Elements = []engine.CoupledElementPoint{{Cl: 1, SeparationUpper: nan, SeparationLower: nan}}
	}
	return sc
}
