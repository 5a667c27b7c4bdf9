package report

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"math"
	"strings"

	"codeberg.org/go-pdf/fpdf"

	"sectionbench/model"
)

// Geometry is what a section's shape says at a glance, in fractions of its
// chord: the thickest point and where, the largest camber and where, the
// leading-edge radius and the trailing-edge thickness.
type Geometry struct {
	Thickness, ThicknessXC float64
	Camber, CamberXC       float64
	LERadius               float64
	TEThickness            float64
}

// geometryStations is the number of chord stations the surfaces are
// sampled at (cosine spaced, finer than any panelling a study uses).
const geometryStations = 400

// leFitXC is how far back the leading-edge radius is fitted: the points of
// both surfaces ahead of 0.5 % of the chord. The leading-edge radius is
// the radius of curvature at the leading edge; a parabola x = y²/(2ρ)
// fitted close to it gives ρ (NACA 00xx: ρ = 1.1019 t², Abbott & von
// Doenhoff, Theory of Wing Sections, 1959, eq. 6.3).
const leFitXC = 0.005

// SectionGeometry measures a cleaned unit-chord section (leading edge at
// the origin, trailing edge on the x axis). Thickness and camber are taken
// normal to the chord, from the upper and lower surfaces interpolated at
// the same x.
func SectionGeometry(sec *model.Section) Geometry {
	pts := sec.Points()
	le := sec.LeadingEdgeIndex()
	upper := make([]model.Point, 0, le+1)
	for i := le; i >= 0; i-- {
		upper = append(upper, pts[i])
	}
	lower := pts[le:]
	g := Geometry{Thickness: math.Inf(-1), Camber: 0}
	for k := 1; k < geometryStations; k++ {
		x := 0.5 * (1 - math.Cos(math.Pi*float64(k)/geometryStations))
		yu, ok1 := yAt(upper, x)
		yl, ok2 := yAt(lower, x)
		if !ok1 || !ok2 {
			continue
		}
		if t := yu - yl; t > g.Thickness {
			g.Thickness, g.ThicknessXC = t, x
		}
		if c := (yu + yl) / 2; math.Abs(c) > math.Abs(g.Camber) {
			g.Camber, g.CamberXC = c, x
		}
	}
	g.TEThickness = pts[0].Dist(pts[len(pts)-1])
	// ρ from x = y²/(2ρ) by least squares over the nose points, y measured
	// from the leading edge's own height.
	var sxy, sy4 float64
	for _, p := range pts {
		if p.X > 0 && p.X < leFitXC {
			y := p.Y - pts[le].Y
			sxy += p.X * y * y
			sy4 += y * y * y * y
		}
	}
	g.LERadius = math.NaN()
	if sxy > 0 {
		g.LERadius = sy4 / (2 * sxy)
	}
	return g
}

// yAt interpolates a surface running from the leading edge to the
// trailing edge at x; ok is false outside it.
func yAt(s []model.Point, x float64) (float64, bool) {
	for i := 0; i+1 < len(s); i++ {
		a, b := s[i], s[i+1]
		if (a.X <= x && x <= b.X) || (b.X <= x && x <= a.X) {
			if a.X == b.X {
				return (a.Y + b.Y) / 2, true
			}
			return a.Y + (x-a.X)*(b.Y-a.Y)/(b.X-a.X), true
		}
	}
	return 0, false
}

// Hash returns the SHA-256 of b in hex, as the report lists input files.
func Hash(b []byte) string {
	s := sha256.Sum256(b)
	return hex.EncodeToString(s[:])
}

// appendix is the reproducibility appendix: each section's geometry, the
// program, the command, the input files with their hashes, and the study
// itself, printed and attached to the PDF as study.json.
func (r *writer) appendix() {
	st := r.in.Study
	r.heading("Appendix: reproducing this report")
	if len(r.in.Sections) > 0 {
		r.subheading("Section geometry")
		var rows [][]string
		for i, sec := range r.in.Sections {
			if sec == nil || i >= len(st.Elements) {
				continue
			}
			g := SectionGeometry(sec)
			c := st.Elements[i].ChordMM
			rows = append(rows, []string{st.Elements[i].Name,
				fmt.Sprintf("%s %% at %s", num(g.Thickness*100, 2), XC(g.ThicknessXC)),
				fmt.Sprintf("%s %% at %s", num(g.Camber*100, 2), XC(g.CamberXC)),
				fmt.Sprintf("%s %% (%s mm)", num(g.LERadius*100, 2), num(g.LERadius*c, 2)),
				fmt.Sprintf("%s %% (%s mm)", num(g.TEThickness*100, 2), num(g.TEThickness*c, 2))})
		}
		r.table([]string{"Element", "Thickness, at x/c", "Camber, at x/c", "Leading-edge radius", "Trailing-edge thickness"},
			[]float64{1.4, 1.2, 1.2, 1.3, 1.4}, []string{"L", "R", "R", "R", "R"}, rows)
		r.small("Percent of each element's own chord, normal to its chord line; the leading-edge radius is fitted to the points within 0.5 % of the chord of the leading edge.")
	}
	r.subheading("Program and command")
	kv := [][2]string{{"Program", "Sectionbench " + orDash(r.in.AppVersion)}}
	if r.in.CommandLine != "" {
		kv = append(kv, [2]string{"Command", r.in.CommandLine})
	} else {
		kv = append(kv, [2]string{"Command", "written from the desktop app (File ▸ Export)"})
	}
	for _, f := range r.in.Inputs {
		kv = append(kv, [2]string{"Input " + f.Path, "SHA-256 " + f.SHA256})
	}
	b, err := st.Encode()
	if err == nil {
		kv = append(kv, [2]string{"Study as solved (below, and attached as study.json)", "SHA-256 " + Hash(b)})
	}
	r.wrapKeyValues(kv)
	if err != nil {
		r.para("The study could not be encoded: " + err.Error())
		return
	}
	r.pdf.SetAttachments([]fpdf.Attachment{{Content: b, Filename: "study.json", Description: "The study as solved"}})
	// The study is kept on one page when it fits one: a page holding the
	// last few lines alone helps nobody.
	const lineH = 2.9
	lines := strings.Split(strings.TrimRight(string(b), "\n"), "\n")
	if h := float64(len(lines))*lineH + 8; h > r.space() && h <= r.pageBody() {
		r.pdf.AddPage()
	}
	r.subheading("The study as solved (study.json)")
	p := r.pdf
	p.SetFont(monoFamily, "", 6.5)
	for _, line := range lines {
		p.MultiCell(0, lineH, line, "", "L", false)
	}
	p.SetFont(fontFamily, "", bodyPt)
}

// wrapKeyValues writes names and values whose values may be long (hashes,
// commands): the name in bold, the value wrapped below it.
func (r *writer) wrapKeyValues(kv [][2]string) {
	p := r.pdf
	for _, e := range kv {
		r.need(10)
		p.SetFont(fontFamily, "B", tablePt)
		p.MultiCell(0, 4, e[0], "", "L", false)
		p.SetFont(fontFamily, "", tablePt)
		p.SetX(marginMM + 4)
		p.MultiCell(r.width()-4, 4, e[1], "", "L", false)
		p.Ln(0.8)
	}
	p.Ln(1)
}
