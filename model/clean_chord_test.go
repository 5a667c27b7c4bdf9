package model

import (
	"math"
	"testing"
)

// TestCleanGeometricChordOfNACA asserts the README's figure: a coordinate
// file of a cambered NACA section, cleaned, is derotated to its
// geometric chord (leading edge = the point farthest from the
// trailing-edge midpoint), which lies about 0.09° (2412) to 0.26° (23012)
// from the published chord. The file is the generator's points moved off
// the origin (so Clean does not keep the file's own chord); the rotation
// Clean applied is read from the trailing-edge base, the one segment both
// contours keep. It is checked against the geometric definition evaluated
// here: the direction of the farthest point of a much denser copy of the
// section from its trailing-edge midpoint.
func TestCleanGeometricChordOfNACA(t *testing.T) {
	for _, tc := range []struct {
		code      string
		readme    float64 // degrees, as the README gives it (two digits)
		tolerance float64
	}{
		{"2412", 0.09, 0.005},
		{"23012", 0.26, 0.005},
	} {
		t.Run(tc.code, func(t *testing.T) {
			sec, err := NACA(tc.code, NACAOptions{PointsPerSurface: 201})
			if err != nil {
				t.Fatal(err)
			}
			pts := sec.Points()
			file := make([]Point, len(pts))
			for i, p := range pts {
				file[i] = p.Add(Point{X: 0.3, Y: 0.2})
			}
			out, _, err := Clean(tc.code, file, CleanOptions{Derotate: true})
			if err != nil {
				t.Fatal(err)
			}
			o := out.Points()
			base := func(p []Point) float64 { d := p[0].Sub(p[len(p)-1]); return math.Atan2(d.Y, d.X) }
			turned := (base(o) - base(pts)) * 180 / math.Pi

			// The geometric chord on the published frame (leading edge at
			// (0, 0), trailing-edge midpoint te), its leading edge sought
			// among many more points of the same section than the file has.
			dense, err := NACA(tc.code, NACAOptions{PointsPerSurface: MaxNACAPoints})
			if err != nil {
				t.Fatal(err)
			}
			dp := dense.Points()
			te := dp[0].Add(dp[len(dp)-1]).Scale(0.5)
			far := dp[0]
			for _, p := range dp {
				if p.Dist(te) > far.Dist(te) {
					far = p
				}
			}
			geo := math.Atan2(te.Y-far.Y, te.X-far.X) * 180 / math.Pi
			pub := math.Atan2(te.Y, te.X) * 180 / math.Pi
			between := math.Abs(geo - pub)
			t.Logf("NACA %s: Clean turned by %.4f°, geometric chord %.4f° from the published one", tc.code, turned, between)
			if math.Abs(math.Abs(turned)-between) > 0.005 {
				t.Errorf("Clean turned the section by %.4f°, the geometric chord lies %.4f° from the published one", turned, between)
			}
			if math.Abs(between-tc.readme) > tc.tolerance {
				t.Errorf("geometric chord %.3f° from the published one; the README says about %g°", between, tc.readme)
			}
		})
	}
}
