package figure

import (
	"strings"

	"golang.org/x/text/encoding/charmap"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgpdf"
)

// pdfCanvas is gonum's PDF canvas with its text made printable: vgpdf
// encodes text in code page 1252, which has no Greek letters and no minus
// sign, so α, θ and − came out as wrong glyphs and negative tick labels were
// unreadable. Each character outside the code page is written as its name
// or nearest character (pdfText); the fonts are embedded so that the PDF
// shows the same face as the other formats.
type pdfCanvas struct{ *vgpdf.Canvas }

func newPDFCanvas(w, h vg.Length) pdfCanvas {
	c := vgpdf.New(w, h)
	c.EmbedFonts(true)
	return pdfCanvas{c}
}

// FillString writes str in words and characters code page 1252 has,
// encoded in that code page as the PDF's WinAnsi fonts expect (vgpdf
// passes the bytes through).
func (c pdfCanvas) FillString(f font.Face, pt vg.Point, str string) {
	enc, err := charmap.Windows1252.NewEncoder().String(pdfText(str))
	if err != nil { // not reached: pdfText leaves only encodable runes
		enc = "?"
	}
	c.Canvas.FillString(f, pt, enc)
}

// pdfNames spells the characters the figures use that code page 1252
// lacks.
var pdfNames = map[rune]string{
	'α': "alpha", 'θ': "theta", 'δ': "delta", 'Δ': "Delta", 'ν': "nu", 'ρ': "rho", 'τ': "tau", 'Γ': "Gamma",
	'−': "-", '∞': "inf", '≈': "~", '≤': "<=", '≥': ">=", '→': "->", '⋅': "·", '∕': "/",
}

// pdfText returns s with every character code page 1252 cannot encode
// replaced by its name from pdfNames, or "?" as a last resort.
func pdfText(s string) string {
	var b strings.Builder
	for _, r := range s {
		if _, ok := charmap.Windows1252.EncodeRune(r); ok {
			b.WriteRune(r)
			continue
		}
		if n, ok := pdfNames[r]; ok {
			b.WriteString(n)
			continue
		}
		b.WriteByte('?')
	}
	return b.String()
}
