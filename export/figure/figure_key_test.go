package figure

import (
	"image"
	"image/png"
	"os"
	"testing"
)

// TestPolarKeyAboveInAppView: the polar of a two-element inverted wing
// with its coupled sweep carries six key entries (the inviscid Cl, Cm,
// the flagged points, the viscous Cl, the most downforce as a lower bound
// and the rows that did not converge). Drawn at the size of the
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
			if len(k.entries) < 6 {
				t.Fatalf("%d key entries, want the six of the case", len(k.entries))
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
