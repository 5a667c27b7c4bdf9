package figure

import (
	"image"
	"testing"
)

// maxChannelDiff returns the largest difference of one channel between two
// images of the same size, and how many pixels differ at all.
func maxChannelDiff(a, b *image.RGBA) (maxd, n int) {
	for i := 0; i < len(a.Pix); i += 4 {
		differs := false
		for c := range 4 {
			d := int(a.Pix[i+c]) - int(b.Pix[i+c])
			if d < 0 {
				d = -d
			}
			if d > 0 {
				differs = true
			}
			maxd = max(maxd, d)
		}
		if differs {
			n++
		}
	}
	return maxd, n
}

// TestDrawFrameKeyMatchesInline: the key laid over a figure drawn without
// it is the key the figure draws itself, to a rounding of the compositing
// (8-bit channels composited in two steps instead of one: at most a few
// levels), light and dark, in free air (the arrow turns) and in ground
// effect.
func TestDrawFrameKeyMatchesInline(t *testing.T) {
	const tolerance = 3 // of 255: two 8-bit roundings of Porter–Duff "over"
	cases := []struct {
		name   string
		alpha  float64
		ground bool
		dark   bool
	}{
		{"free air, 4°", 4, false, false},
		{"free air, −12°, dark", -12, false, true},
		{"ground, 3°", 3, true, false},
		{"ground, 3°, dark", 3, true, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sc := synthScene()
			sc.AlphaDeg, sc.Ground, sc.Dark = c.alpha, c.ground, c.dark
			if c.ground {
				sc.GroundY = -0.05
			}
			inline, err := Render(ViewPanels, sc, goldenWidth, goldenHeight, goldenDPI)
			if err != nil {
				t.Fatal(err)
			}
			bare := *sc
			bare.OmitFrameKey = true
			split, err := Render(ViewPanels, &bare, goldenWidth, goldenHeight, goldenDPI)
			if err != nil {
				t.Fatal(err)
			}
			if _, n := maxChannelDiff(inline.Image, split.Image); n < 200 {
				t.Fatalf("the figure without its key differs in %d pixels only: the key is not left out", n)
			}
			DrawFrameKey(split, sc)
			if d, n := maxChannelDiff(inline.Image, split.Image); d > tolerance {
				t.Errorf("key laid over differs from the key drawn in by up to %d/255 (%d pixels), tolerance %d", d, n, tolerance)
			}
		})
	}
}

// TestRenderIntoDrawsInPlace: RenderInto draws into the image it is given
// (no copy) and replaces whatever it held.
func TestRenderIntoDrawsInPlace(t *testing.T) {
	sc := synthScene()
	want, err := Render(ViewPressure, sc, goldenWidth, goldenHeight, goldenDPI)
	if err != nil {
		t.Fatal(err)
	}
	dst := image.NewRGBA(image.Rect(0, 0, goldenWidth, goldenHeight))
	for i := range dst.Pix {
		dst.Pix[i] = 0x5a // left over from an earlier figure
	}
	got, err := RenderInto(dst, ViewPressure, sc, goldenDPI)
	if err != nil {
		t.Fatal(err)
	}
	if got.Image != dst {
		t.Fatal("RenderInto returned another image than the one it was given")
	}
	if d, n := maxChannelDiff(want.Image, dst); n > 0 {
		t.Errorf("drawn in place differs from a fresh render in %d pixels (up to %d/255)", n, d)
	}
}
