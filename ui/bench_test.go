package ui

import (
	"context"
	"errors"
	"testing"

	"fyne.io/fyne/v2/test"

	"sectionbench/assets"
	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// Size of each view in the update benchmarks, px.
const benchViewW, benchViewH = 600, 400

// benchUpdate measures one workbench update at N = 200: the engine call
// (with the sweep and streamlines, as a live update asks) and the four views
// rendered at 600×400. fresh selects a new engine per update (a panelling
// change: assemble and factorise) instead of one engine stepping the angle
// (factorisation cached).
func benchUpdate(b *testing.B, fresh bool) {
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		b.Fatal(err)
	}
	st.Panelling.Panels = 200
	secs, _, err := export.LoadSections(st, ".")
	if err != nil {
		b.Fatal(err)
	}
	eng := engine.NewEngine()
	i := 0
	for b.Loop() {
		if fresh {
			eng = engine.NewEngine()
		} else {
			st.Flow.AlphaDeg = float64(i%8) - 2
			i++
		}
		res, err := eng.Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true, Streamlines: true})
		if err != nil {
			b.Fatal(err)
		}
		sc := figures.NewScene(res, st)
		for k := range numViews {
			if _, err := renderView(k, sc, benchViewW, benchViewH, baseDPI); err != nil {
				b.Fatalf("%v: %v", k, err)
			}
		}
	}
}

func BenchmarkFullUpdate(b *testing.B)  { benchUpdate(b, true) }
func BenchmarkAngleUpdate(b *testing.B) { benchUpdate(b, false) }

// BenchmarkAngleChange is one angle change as the window makes it: the
// demo study at 160 panels, inviscid, in free air; the engine steps the
// angle on its cached factorisation (with the live sweep and the
// streamlines) and the four views, 600×400 each, are drawn at once and
// shown as Workbench.present does: each into the image its previous
// figure freed, the panels view redrawing only its key. Target: 15 ms on
// a two-core machine.
func BenchmarkAngleChange(b *testing.B) { benchAngleChange(b, false) }

// BenchmarkAngleChangeCoupled is the same angle change with the demo's
// coupled viscous solution on, as it opens (NACA 4412 at Re 2.8e5, free
// transition): the window asks no live sweep then, and each angle is
// warm-started from the one before (1° apart, 2° to 6° and back). Target
// (issue "Coupled viscous solution"): 150 ms on a two-core machine.
func BenchmarkAngleChangeCoupled(b *testing.B) { benchAngleChange(b, true) }

func benchAngleChange(b *testing.B, coupled bool) {
	test.NewTempApp(b)
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		b.Fatal(err)
	}
	st.Panelling.Panels = 160
	st.Viscous.Enabled = coupled
	if coupled && !st.Viscous.IsCoupled() {
		b.Fatal("the demo study's viscous mode is not the coupled solution")
	}
	secs, _, err := export.LoadSections(st, ".")
	if err != nil {
		b.Fatal(err)
	}
	var views [numViews]*plotCanvas
	for k := range numViews {
		views[k] = newPlotCanvas(k, session.NewActivity(), func(f func()) { f() })
		views[k].pxW, views[k].pxH, views[k].dpi = benchViewW, benchViewH, baseDPI
	}
	eng := engine.NewEngine()
	angles := []float64{-2, -1, 0, 1, 2, 3, 4, 5}
	if coupled {
		angles = []float64{2, 3, 4, 5, 6, 5, 4, 3}
	}
	i := 0
	for b.Loop() {
		st.Flow.AlphaDeg = angles[i%len(angles)]
		i++
		res, err := eng.Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: !coupled, Streamlines: true})
		if err != nil {
			b.Fatal(err)
		}
		if coupled && (res.Coupled == nil || !res.Coupled.Converged) {
			b.Fatalf("α = %g°: the coupled solution did not converge", st.Flow.AlphaDeg)
		}
		sc := figures.NewScene(res, st)
		var frames [numViews]frame
		eachViewAtOnce(func(k viewKind) { frames[k] = views[k].renderNow(sc) })
		for k, f := range frames {
			if coupled && errors.Is(f.err, figures.ErrNoData) {
				continue // the polar, until a sweep has run: the window shows its note
			}
			if f.err != nil || f.fig == nil {
				b.Fatalf("%v: %v", viewKind(k), f.err)
			}
			f.show()
		}
	}
}
