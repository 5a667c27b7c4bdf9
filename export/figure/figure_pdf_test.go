package figure

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/export/exporttest"
)

func TestPDFText(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"α, °", "alpha, °"},
		{"−4", "-4"},
		{"θ and H", "theta and H"},
		{"Cl × 10²", "Cl × 10²"},
		{"☃", "?"},
	} {
		if got := pdfText(c.in); got != c.want {
			t.Errorf("pdfText(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// A figure exported as PDF reads back (poppler's pdftotext) with its
// negative tick labels, the angle's name and the degree sign intact.
func TestPDFFigureText(t *testing.T) {
	path, err := exec.LookPath("pdftotext")
	if err != nil {
		t.Fatal("pdftotext not on PATH: install poppler-utils (scripts/setup.sh)")
	}
	sc := &Scene{Layout: exporttest.TwoElementLayout(40), Sweep: exporttest.Sweep(), AlphaDeg: 4, Element: -1}
	sc.Solution = exporttest.Solution(sc.Layout, 4)
	var b bytes.Buffer
	if err := WriteFigure(&b, ViewPolar, sc, FormatPDF, 6, 4, 0); err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "polar.pdf")
	if err := os.WriteFile(file, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	out, err := exec.Command(path, file, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	text := string(out)
	for _, w := range []string{"alpha", "°", "-4", "-0.5"} {
		if !strings.Contains(text, w) {
			t.Errorf("PDF text lacks %q:\n%s", w, text)
		}
	}
	if strings.Contains(text, "Â") || strings.Contains(text, "Î") {
		t.Errorf("PDF text has mojibake:\n%s", text)
	}
}
