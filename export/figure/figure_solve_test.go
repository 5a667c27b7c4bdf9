package figure

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// demoStudy is the invented demo team's two-element inverted wing: a
// NACA 4412 main plane of 250 mm and a NACA 4412 flap of 110 mm set 22°
// under its trailing edge (above it once inverted), 60 mm above the ground
// (fictional team, demo data).
func demoStudy(panels int, ground bool) *model.Study {
	st := model.NewStudy()
	st.Name = "Demo wing (fictional team)"
	st.Team = "Demo Racing Team (fictional)"
	st.Inverted = true
	st.Panelling.Panels = panels
	st.Elements = append(st.Elements, model.StudyElement{
		Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 110,
		XMM: 232, YMM: -18, AngleDeg: 22,
	})
	st.Ground = model.Ground{Enabled: ground, ClearanceMM: 60}
	st.Flow.SpeedMPS = 20
	st.Sweep = model.SweepRange{FromDeg: -2, ToDeg: 8, StepDeg: 2}
	return st
}

// solveDemo runs the engine on the demo study; streamlines and the sweep
// as asked.
func solveDemo(tb testing.TB, st *model.Study, sweep, stream bool) *engine.Result {
	tb.Helper()
	secs := make([]*model.Section, len(st.Elements))
	for i, e := range st.Elements {
		s, _, err := model.SectionFromSource(e.Section, nil)
		if err != nil {
			tb.Fatal(err)
		}
		secs[i] = s
	}
	r, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: sweep, Streamlines: stream})
	if err != nil {
		tb.Fatal(err)
	}
	return r
}

// TestRealSolveViews renders every live view of a real solve.
func TestRealSolveViews(t *testing.T) {
	st := demoStudy(120, true)
	r := solveDemo(t, st, true, true)
	sc := NewScene(r, st)
	for _, v := range []View{ViewPanels, ViewPressure, ViewStreamlines, ViewPolar} {
		if _, err := Render(v, sc, 600, 400, 96); err != nil {
			t.Errorf("%v: %v", v, err)
		}
	}
	if !sc.Ground || !sc.Inverted || sc.Config == nil {
		t.Errorf("scene ground %v inverted %v config %v", sc.Ground, sc.Inverted, sc.Config != nil)
	}
}

// BenchmarkRenderFourViews is one full refresh of the workbench at 200
// panels per element: a new solve with streamlines (no cached
// factorisation) and the four live views at 600×400 px.
func BenchmarkRenderFourViews(b *testing.B) {
	st := demoStudy(200, false)
	var sweep []solver.Coefficients
	{
		r := solveDemo(b, st, true, false)
		sweep = r.Sweep
	}
	for b.Loop() {
		r := solveDemo(b, st, false, true)
		sc := NewScene(r, st)
		sc.Sweep = sweep
		for _, v := range []View{ViewPanels, ViewPressure, ViewStreamlines, ViewPolar} {
			if _, err := Render(v, sc, 600, 400, 96); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// BenchmarkRenderOnly draws the four live views of one solve.
func BenchmarkRenderOnly(b *testing.B) {
	st := demoStudy(200, false)
	sc := NewScene(solveDemo(b, st, true, true), st)
	for b.Loop() {
		for _, v := range []View{ViewPanels, ViewPressure, ViewStreamlines, ViewPolar} {
			if _, err := Render(v, sc, 600, 400, 96); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// TestWriteRealFigureFiles writes the views of a real solve as PNG to the
// -figures directory, for looking at.
func TestWriteRealFigureFiles(t *testing.T) {
	if *figureDir == "" {
		t.Skip("no -figures directory")
	}
	st := demoStudy(160, true)
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousEstimate // the one-way estimate these checks draw
	sc := NewScene(solveDemo(t, st, true, true), st)
	for _, v := range Views {
		var b bytes.Buffer
		err := WriteFigure(&b, v, sc, FormatPNG, 6.25, 4.17, 96)
		if errors.Is(err, ErrNoData) {
			t.Logf("%v: %v", v, err)
			continue
		}
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(*figureDir, "real-"+v.String()+".png"), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	sc.SpeedColour = true
	sc.Window = LEWindow(sc.Layout, 1, 30)
	for _, v := range []View{ViewStreamlines, ViewPanels} {
		var b bytes.Buffer
		if err := WriteFigure(&b, v, sc, FormatPNG, 6.25, 4.17, 96); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(*figureDir, "real-zoom-"+v.String()+".png"), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}
