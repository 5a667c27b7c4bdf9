package ui

import (
	"bytes"
	"context"
	"testing"

	"fyne.io/fyne/v2/test"

	"sectionbench/assets"
	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// TestPanelsRedrawsOnlyWhatChanged: in free air an angle change leaves the
// bodies where they are, so the panels view keeps its figure without the
// key and lays a new key over a copy (the picture still changes: the key
// shows the angle); in ground effect the configuration pitches with the
// angle, so it is drawn again. Either way the new figure goes into the
// image the figure before last left free, not a new one.
func TestPanelsRedrawsOnlyWhatChanged(t *testing.T) {
	test.NewTempApp(t)
	for _, c := range []struct {
		name        string
		ground      bool
		keepsBodies bool
	}{
		{"free air", false, true},
		{"ground effect", true, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			st, err := model.DecodeStudy(assets.DemoStudy)
			if err != nil {
				t.Fatal(err)
			}
			st.Viscous.Enabled = false
			st.Ground.Enabled = c.ground
			secs, _, err := export.LoadSections(st, ".")
			if err != nil {
				t.Fatal(err)
			}
			eng := engine.NewEngine()
			p := newPlotCanvas(viewPanels, session.NewActivity(), func(f func()) { f() })
			p.pxW, p.pxH, p.dpi = 400, 300, baseDPI
			var shown [3]*figures.Figure
			var pix [3][]byte
			var bases [3]*panelsBase
			for i, alpha := range []float64{2, 4, 6} {
				st.Flow.AlphaDeg = alpha
				res, err := eng.Run(context.Background(), engine.Request{Study: st, Sections: secs})
				if err != nil {
					t.Fatal(err)
				}
				f := p.renderNow(figures.NewScene(res, st))
				if f.err != nil {
					t.Fatal(f.err)
				}
				f.show()
				shown[i], bases[i] = p.Figure(), p.base
				pix[i] = bytes.Clone(shown[i].Image.Pix)
			}
			if kept := bases[1] == bases[0] && bases[2] == bases[0]; kept != c.keepsBodies {
				t.Errorf("figure without the key kept across angle changes: %v, want %v", kept, c.keepsBodies)
			}
			if bytes.Equal(pix[0], pix[1]) {
				t.Error("the panels view did not change with the angle (its key shows it)")
			}
			if shown[2].Image != shown[0].Image {
				t.Error("the third figure was drawn into a new image, not the one the first left free")
			}
		})
	}
}
