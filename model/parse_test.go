package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"unicode/utf16"
)

var updateSections = flag.Bool("update-sections", false, "rewrite testdata/sections from the test shape")

// testSurfaces returns the upper and lower surfaces, each from the leading
// edge to the trailing edge, of a NACA 2412 computed from the 4-digit
// formulas (Abbott & von Doenhoff, Theory of Wing Sections, 1959, sec. 6.4,
// eqs. 6.2 and 6.4: thickness 5t(0.2969√x − 0.1260x − 0.3516x² + 0.2843x³ −
// 0.1015x⁴), camber m/p²(2px − x²) ahead of p, m/(1−p)²(1 − 2p + 2px − x²)
// behind). The open-trailing-edge coefficient −0.1015 leaves a gap of about
// 0.25% chord. n points per surface at cosine spacing x = (1 − cos β)/2.
func testSurfaces(n int) (upper, lower []Point) { return nacaSurfaces(0.02, 0.4, 0.12, n) }

// nacaSurfaces is testSurfaces for any 4-digit camber m at p and thickness t.
func nacaSurfaces(m, p, t float64, n int) (upper, lower []Point) {
	for i := range n {
		beta := math.Pi * float64(i) / float64(n-1)
		x := (1 - math.Cos(beta)) / 2
		yt := 5 * t * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x - 0.1015*x*x*x*x)
		var yc, dyc float64
		if x < p {
			yc, dyc = m/(p*p)*(2*p*x-x*x), 2*m/(p*p)*(p-x)
		} else {
			yc, dyc = m/((1-p)*(1-p))*(1-2*p+2*p*x-x*x), 2*m/((1-p)*(1-p))*(p-x)
		}
		th := math.Atan(dyc)
		s, c := math.Sincos(th)
		upper = append(upper, Point{x - yt*s, yc + yt*c})
		lower = append(lower, Point{x + yt*s, yc - yt*c})
	}
	return upper, lower
}

// testLoop returns the conventional loop: TE, upper, LE, lower, TE.
func testLoop(n int) []Point {
	u, l := testSurfaces(n)
	var loop []Point
	for i := len(u) - 1; i >= 0; i-- {
		loop = append(loop, u[i])
	}
	return append(loop, l[1:]...)
}

func reversed(pts []Point) []Point {
	r := make([]Point, len(pts))
	for i, p := range pts {
		r[len(pts)-1-i] = p
	}
	return r
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// writePoints writes one "x<sep>y" line per point, formatted by f.
func writePoints(b *bytes.Buffer, pts []Point, sep string, f func(float64) string) {
	for _, p := range pts {
		b.WriteString(f(p.X) + sep + f(p.Y) + "\n")
	}
}

func utf16LE(s string) []byte {
	u := utf16.Encode([]rune(s))
	b := []byte{0xFF, 0xFE}
	for _, c := range u {
		b = append(b, byte(c), byte(c>>8))
	}
	return b
}

// sectionLayouts returns the good files: the same NACA 2412 in every
// layout, each with the layout the parser must report.
func sectionLayouts() []struct {
	file   string
	layout FileLayout
	data   []byte
} {
	const n = 41
	up, lo := testSurfaces(n)
	loop := testLoop(n)
	name := "NACA 2412 test shape\n"
	var out []struct {
		file   string
		layout FileLayout
		data   []byte
	}
	add := func(file string, layout FileLayout, b []byte) {
		out = append(out, struct {
			file   string
			layout FileLayout
			data   []byte
		}{file, layout, b})
	}
	var b bytes.Buffer

	b.WriteString(name)
	writePoints(&b, loop, " ", num)
	add("loop-te-upper-first.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, reversed(loop), "  ", num)
	add("loop-te-lower-first.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, up, " ", num)
	writePoints(&b, lo, " ", num)
	add("surfaces-upper-first.dat", LayoutSurfaces, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, lo, " ", num)
	writePoints(&b, up, " ", num)
	add("surfaces-lower-first.dat", LayoutSurfaces, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	fmt.Fprintf(&b, "%d. %d.\n\n", n, n)
	writePoints(&b, up, " ", num)
	b.WriteString("\n")
	writePoints(&b, lo, " ", num)
	add("surfaces-counted.dat", LayoutSurfacesCounted, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString("\"X/c\",\"z\",\"Y/c\"\n")
	for _, p := range loop {
		fmt.Fprintf(&b, "%s,0,%s\n", num(p.X), num(p.Y))
	}
	add("csv-header.csv", LayoutCSV, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, loop, "\t", num)
	add("tabs.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, loop, ", ", num)
	add("commas.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString("x;y\n")
	writePoints(&b, loop, ";", func(v float64) string { return strings.Replace(num(v), ".", ",", 1) })
	add("semicolons-decimal-commas.csv", LayoutCSV, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString("# exported for the parser tests\n% a second comment style\n" + name + "// and a third\n\n")
	for i, p := range loop {
		if i == n/2 {
			b.WriteString("! halfway\n\n")
		}
		fmt.Fprintf(&b, "%s %s # point %d\n", num(p.X), num(p.Y), i+1)
	}
	add("comments.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString("\uFEFF" + name)
	writePoints(&b, loop, " ", num)
	add("utf8-bom.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, loop, " ", num)
	add("utf16-bom.dat", LayoutLoop, utf16LE(strings.ReplaceAll(b.String(), "\n", "\r\n")))

	b.Reset()
	b.WriteString(name)
	writePoints(&b, loop, "   ", func(v float64) string { return strings.Replace(strconv.FormatFloat(v, 'E', -1, 64), "E", "D", 1) })
	add("fortran-d-exponents.dat", LayoutLoop, bytes.Clone(b.Bytes()))

	b.Reset()
	le := n - 1 // index of the leading edge in loop
	start := append(append([]Point(nil), loop[le:]...), loop[:le+1]...)
	writePoints(&b, start, " ", num)
	add("loop-from-le-no-name.dat", LayoutLoop, []byte(strings.ReplaceAll(b.String(), "\n", "\r\n")))
	return out
}

// sameFile reports whether a committed file matches the generator's
// output: byte for byte, or up to the digits of numbers, since a platform
// that fuses multiply-adds may round the test shape differently in the last
// place.
func sameFile(committed, generated []byte) bool {
	if bytes.Equal(committed, generated) {
		return true
	}
	return bytes.Equal(digitRuns.ReplaceAll(committed, []byte("0")), digitRuns.ReplaceAll(generated, []byte("0")))
}

var digitRuns = regexp.MustCompile(`[0-9]+`)

// TestSectionFilesUpToDate checks that testdata/sections holds what the
// generator makes (run with -update-sections to rewrite them).
func TestSectionFilesUpToDate(t *testing.T) {
	for _, c := range sectionLayouts() {
		path := filepath.Join("testdata", "sections", c.file)
		if *updateSections {
			if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(path, c.data, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		got, err := os.ReadFile(path)
		if err != nil {
			t.Fatalf("%v (run go test -run TestSectionFilesUpToDate -update-sections)", err)
		}
		if !sameFile(got, c.data) {
			t.Errorf("%s differs from the generator (run with -update-sections)", path)
		}
	}
}

// TestParseLayoutsSameSection parses every good file and checks that each
// reports its layout and that all clean to the same section.
func TestParseLayoutsSameSection(t *testing.T) {
	const tol = 1e-9 // the files carry the shortest exact decimal forms
	var ref *Section
	var refFile string
	for _, c := range sectionLayouts() {
		path := filepath.Join("testdata", "sections", c.file)
		f, err := os.Open(path)
		if err != nil {
			t.Fatal(err)
		}
		p, err := ParseCoordinates(f, c.file)
		f.Close()
		if err != nil {
			t.Errorf("%s: %v", c.file, err)
			continue
		}
		if p.Layout != c.layout {
			t.Errorf("%s: layout %q, want %q (notes %q)", c.file, p.Layout, c.layout, p.Notes)
		}
		if len(p.Notes) == 0 {
			t.Errorf("%s: no notes", c.file)
		}
		sec, rep, err := p.Clean(DefaultCleanOptions)
		if err != nil {
			t.Errorf("%s: clean: %v", c.file, err)
			continue
		}
		for _, w := range rep.Warnings {
			t.Errorf("%s: unexpected warning %s: %s", c.file, w.Kind, w.Message)
		}
		if ref == nil {
			ref, refFile = sec, c.file
			continue
		}
		if sec.Len() != ref.Len() {
			t.Errorf("%s: %d points, %s has %d\n%s", c.file, sec.Len(), refFile, ref.Len(), rep)
			continue
		}
		worst := 0.0
		for i := range sec.Len() {
			worst = math.Max(worst, sec.At(i).Dist(ref.At(i)))
		}
		if worst > tol {
			t.Errorf("%s: differs from %s by %g\n%s", c.file, refFile, worst, rep)
		}
	}
}

// TestParseNotes checks what the parser says it detected.
func TestParseNotes(t *testing.T) {
	want := map[string][]string{
		"surfaces-upper-first.dat":      {"two surfaces", "41 upper, 41 lower", "upper surface first", "from the leading edge"},
		"surfaces-lower-first.dat":      {"41 lower, 41 upper", "lower surface first"},
		"surfaces-counted.dat":          {"point-count line 2", "41 and 41"},
		"csv-header.csv":                {"x in column 1", "y in column 3", "ignored: z"},
		"semicolons-decimal-commas.csv": {"decimal commas", "semicolons"},
		"utf8-bom.dat":                  {"UTF-8 byte-order mark removed"},
		"utf16-bom.dat":                 {"UTF-16 little-endian"},
		"fortran-d-exponents.dat":       {"Fortran D exponents"},
		"comments.dat":                  {"4 comment lines", `name line 3: "NACA 2412 test shape"`},
		"loop-from-le-no-name.dat":      {`no name line; named "loop-from-le-no-name"`},
		"tabs.dat":                      {"separated by tabs"},
		"commas.dat":                    {"separated by spaces, commas"},
		"loop-te-upper-first.dat":       {"one loop of 81 points"},
	}
	for _, c := range sectionLayouts() {
		p, err := ParseCoordinates(bytes.NewReader(c.data), c.file)
		if err != nil {
			t.Fatalf("%s: %v", c.file, err)
		}
		all := strings.Join(p.Notes, "\n")
		for _, w := range want[c.file] {
			if !strings.Contains(all, w) {
				t.Errorf("%s: notes lack %q:\n%s", c.file, w, all)
			}
		}
	}
}

func TestParseErrorFormat(t *testing.T) {
	for _, c := range []struct {
		name string
		err  *ParseError
		want string
	}{
		{"all", &ParseError{"wing.dat", 7, 12, ErrNotNumber}, "wing.dat: line 7, column 12: not a number"},
		{"no column", &ParseError{"wing.dat", 7, 0, ErrColumns}, "wing.dat: line 7: wrong number of values on a line"},
		{"no line", &ParseError{"wing.dat", 0, 0, ErrEmpty}, "wing.dat: no coordinates"},
		{"no source", &ParseError{"", 3, 1, ErrNonFinite}, "line 3, column 1: coordinate is not a finite number"},
	} {
		if got := c.err.Error(); got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
		if !errors.Is(c.err, c.err.Err) {
			t.Errorf("%s: Unwrap lost the sentinel", c.name)
		}
	}
}

// TestParseColumns checks the line and column of number errors.
func TestParseColumns(t *testing.T) {
	good := "1 0\n0.5 0.06\n0 0\n0.5 -0.05\n1 0\n"
	for _, c := range []struct {
		name      string
		in        string
		line, col int
		is        error
	}{
		{"nan second value", "name\n1 0\n0.5   NaN\n" + good, 3, 7, ErrNonFinite},
		{"inf first value", "1 0\n-Inf 0\n" + good, 2, 1, ErrNonFinite},
		{"overflow", "1 0\n0.5 1e400\n" + good, 2, 5, ErrOutOfRange},
		{"word after numbers", good + "0.3 abc\n", 6, 5, ErrNotNumber},
		{"empty field", "1,,0\n" + good, 1, 3, ErrNotNumber},
		{"hex float", "1 0\n0x1p-2 0\n" + good, 2, 0, ErrNotNumber},
		{"run together, first line", "1.000000-0.000100\n" + good, 1, 1, ErrNotNumber},
		{"run together, y", "1 0\n0.5 0.06\n 0.25 0.04-0.1\n" + good, 3, 7, ErrNotNumber},
	} {
		_, err := ParseCoordinates(strings.NewReader(c.in), "t.dat")
		var pe *ParseError
		if !errors.As(err, &pe) {
			t.Errorf("%s: %v is not a *ParseError", c.name, err)
			continue
		}
		if pe.Line != c.line || (c.col > 0 && pe.Column != c.col) || !errors.Is(err, c.is) {
			t.Errorf("%s: %v; want line %d column %d wrapping %v", c.name, err, c.line, c.col, c.is)
		}
	}
}

// TestParseSizeLimits generates the oversized inputs at run time.
func TestParseSizeLimits(t *testing.T) {
	t.Run("50 MB stops at the limit", func(t *testing.T) {
		r := &countingReader{left: 50 << 20}
		_, err := ParseCoordinates(r, "big.dat")
		if !errors.Is(err, ErrTooLarge) {
			t.Fatalf("got %v, want ErrTooLarge", err)
		}
		if r.read > MaxInputBytes+1 {
			t.Errorf("read %d bytes, want at most %d", r.read, MaxInputBytes+1)
		}
	})
	t.Run("a million points", func(t *testing.T) {
		b := bytes.Repeat([]byte("0.500000 0.010000\n"), 1000000)
		_, err := ParseCoordinates(bytes.NewReader(b), "million.dat")
		if !errors.Is(err, ErrTooLarge) {
			t.Fatalf("got %v, want ErrTooLarge", err)
		}
	})
	t.Run("one point too many", func(t *testing.T) {
		var b bytes.Buffer
		for i := range MaxPoints + 1 {
			fmt.Fprintf(&b, "%d %d\n", i%7, i%3)
		}
		_, err := ParseCoordinates(&b, "many.dat")
		var pe *ParseError
		if !errors.Is(err, ErrTooManyPoints) || !errors.As(err, &pe) || pe.Line != MaxPoints+1 {
			t.Fatalf("got %v, want ErrTooManyPoints on line %d", err, MaxPoints+1)
		}
	})
	t.Run("exactly MaxPoints", func(t *testing.T) {
		var b bytes.Buffer
		for i := range MaxPoints {
			a := 2 * math.Pi * float64(i) / MaxPoints
			fmt.Fprintf(&b, "%.9f %.9f\n", math.Cos(a), 0.1*math.Sin(a))
		}
		p, err := ParseCoordinates(&b, "max.dat")
		if err != nil || len(p.Points) != MaxPoints {
			t.Fatalf("got %v", err)
		}
	})
}

// countingReader yields '1' digits and spaces, counting what is read.
type countingReader struct{ left, read int }

func (r *countingReader) Read(p []byte) (int, error) {
	if r.left == 0 {
		return 0, fmt.Errorf("unexpected read past the end")
	}
	n := min(len(p), r.left)
	for i := range n {
		p[i] = "1 0\n"[(r.read+i)%4]
	}
	r.left -= n
	r.read += n
	return n, nil
}

// TestParseCountLineNotCoordinate: integer first points in millimetres are
// data, not a count line.
func TestParseCountLineNotCoordinate(t *testing.T) {
	in := "150 0\n75 9\n0 0\n75 -9\n150 0\n"
	p, err := ParseCoordinates(strings.NewReader(in), "mm.dat")
	if err != nil {
		t.Fatal(err)
	}
	if p.Layout != LayoutLoop || len(p.Points) != 5 {
		t.Errorf("layout %s with %d points; want a loop of 5", p.Layout, len(p.Points))
	}
}

func TestParseReadError(t *testing.T) {
	_, err := ParseCoordinates(errReader{}, "r.dat")
	var pe *ParseError
	if !errors.As(err, &pe) || !errors.Is(err, errBoom) {
		t.Fatalf("got %v", err)
	}
}

var errBoom = errors.New("boom")

type errReader struct{}

func (errReader) Read([]byte) (int, error) { return 0, errBoom }

func BenchmarkParseCoordinates(b *testing.B) {
	data := sectionLayouts()[0].data
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := ParseCoordinates(bytes.NewReader(data), "b.dat"); err != nil {
			b.Fatal(err)
		}
	}
}

var updateMalformed = flag.Bool("update-malformed", false, "rewrite the files of testdata/malformed (not expect.json) from the generator")

// malformedCorpus returns the files of testdata/malformed: bad or odd
// inputs, most derived from the test shape. Their expected outcomes are in
// testdata/malformed/expect.json, written by hand. Inputs too big to
// commit (over the size limit, a million points) are generated in
// TestParseSizeLimits instead.
func malformedCorpus() map[string][]byte {
	const n = 41
	up, lo := testSurfaces(n)
	loop := testLoop(n)
	le := n - 1
	files := map[string][]byte{}
	text := func(name string, pts []Point) []byte {
		var b bytes.Buffer
		if name != "" {
			b.WriteString(name + "\n")
		}
		writePoints(&b, pts, " ", num)
		return b.Bytes()
	}
	modified := func(f func(i int, p Point) Point) []Point {
		out := make([]Point, len(loop))
		for i, p := range loop {
			out[i] = f(i, p)
		}
		return out
	}
	files["empty.dat"] = nil
	files["whitespace-only.dat"] = []byte("  \n\t\n   \r\n")
	files["comments-only.dat"] = []byte("# nothing here\n% still nothing\n")
	files["name-only.dat"] = []byte("NACA 0012\n")

	// Binary: a PNG signature and pseudo-random bytes (fixed LCG seed).
	bin := []byte("\x89PNG\r\n\x1a\n")
	seed := uint32(12345)
	for range 400 {
		seed = seed*1664525 + 1013904223
		bin = append(bin, byte(seed>>24))
	}
	files["binary.png"] = bin
	ctrl := []byte{}
	for i := range 300 {
		ctrl = append(ctrl, byte(1+i%8), '1', ' ')
	}
	files["control-characters.bin"] = ctrl
	var u16 []byte
	for _, c := range []byte(string(text("NACA 2412", loop))) {
		u16 = append(u16, c, 0)
	}
	files["utf16-no-bom.dat"] = u16
	files["utf16-bom.dat"] = utf16LE(string(text("NACA 2412 in UTF-16", loop)))
	files["utf16-odd-length.dat"] = append(utf16LE("1 0\n"), '0')
	files["utf8-bom.dat"] = append([]byte("\uFEFF"), text("NACA 2412 with a BOM", loop)...)
	files["latin1-name.dat"] = append([]byte("Profil f\xfcr den Fl\xfcgel\n"), text("", loop)...)

	nan := text("with NaN", loop)
	files["nan.dat"] = bytes.Replace(nan, []byte("\n"+num(loop[3].X)+" "), []byte("\n"+num(loop[3].X)+" NaN\n0.1 "), 1)
	files["inf.dat"] = append(append([]byte("with Inf\n1 0\n0.9 0.01\n"), []byte("+Inf 0.02\n")...), text("", loop[3:])...)
	files["huge-values.dat"] = append([]byte("huge\n1 0\n1e300 0\n"), text("", loop[2:])...)
	files["one-point.dat"] = []byte("single\n1.0 0.0\n")
	files["two-points.dat"] = []byte("two\n1.0 0.0\n0.0 0.0\n")
	var eq bytes.Buffer
	eq.WriteString("all equal\n")
	for range 12 {
		eq.WriteString("0.5 0.5\n")
	}
	files["all-points-equal.dat"] = eq.Bytes()
	files["flat-line.dat"] = []byte("out and back\n1 0\n0.75 0\n0.5 0\n0.25 0\n0 0\n0.25 0\n0.5 0\n0.75 0\n1 0\n")
	files["reversed-loop.dat"] = text("NACA 2412 reversed", reversed(loop))
	files["surfaces-lower-first.dat"] = text("NACA 2412 lower first", append(append([]Point(nil), lo...), up...))
	var teFirst []Point
	teFirst = append(append(teFirst, reversed(up)...), reversed(lo)...)
	files["surfaces-from-te.dat"] = text("NACA 2412 surfaces from the TE", teFirst)
	var cnt bytes.Buffer
	cnt.WriteString("NACA 2412 counted\n41. 41.\n")
	writePoints(&cnt, up, " ", num)
	writePoints(&cnt, lo[:n-1], " ", num)
	files["count-line-lies.dat"] = cnt.Bytes()
	files["single-count-lies.dat"] = append([]byte("NACA 2412 counted\n80\n"), text("", loop)...)

	var mixed bytes.Buffer
	mixed.WriteString("mixed separators\n")
	for i, p := range loop {
		sep := []string{" ", "\t", ",", ";", " , ", "\t;"}[i%6]
		mixed.WriteString(num(p.X) + sep + num(p.Y) + "\n")
	}
	files["mixed-separators.dat"] = mixed.Bytes()
	var dc bytes.Buffer
	dc.WriteString("decimal commas and points mixed\n")
	for i, p := range loop {
		s := num(p.X) + " " + num(p.Y)
		if i == 5 {
			s = strings.ReplaceAll(s, ".", ",")
		}
		dc.WriteString(s + "\n")
	}
	files["decimal-comma-ambiguous.dat"] = dc.Bytes()

	// Geometry faults, on the upper or lower surface of the loop.
	xk := loop[20].X
	files["kink.dat"] = text("kink on the upper surface", modified(func(i int, p Point) Point {
		if i < le {
			p.Y += 0.4 * math.Max(0, 0.08-math.Abs(p.X-xk))
		}
		return p
	}))
	files["spike.dat"] = text("one point off", modified(func(i int, p Point) Point {
		if i == le+15 {
			p.Y -= 0.1
		}
		return p
	}))
	files["crossing.dat"] = text("lower surface pushed through the upper", modified(func(i int, p Point) Point {
		if i > le && p.X > 0.2 && p.X < 0.8 {
			s := math.Sin(math.Pi * (p.X - 0.2) / 0.6)
			p.Y += 0.14 * s * s
		}
		return p
	}))
	files["blunt-te.dat"] = text("opened trailing edge", modified(func(i int, p Point) Point {
		if i < le {
			p.Y += 0.025 * p.X
		} else if i > le {
			p.Y -= 0.025 * p.X
		}
		return p
	}))
	files["non-monotone.dat"] = text("a lower point listed behind its neighbour", modified(func(i int, p Point) Point {
		if i == le+20 {
			p.X -= 1.2 * (loop[i].X - loop[i-1].X)
		}
		return p
	}))
	var sparse []Point
	for i := range 12 {
		x := 1 - float64(i)/11
		sparse = append(sparse, Point{x, 0.6 * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x - 0.1036*x*x*x*x)})
	}
	for i := 10; i >= 0; i-- {
		sparse = append(sparse, Point{sparse[i].X, -sparse[i].Y})
	}
	files["sparse-nose.dat"] = text("NACA 0012 at 12 points per surface", sparse)
	files["open-contour.dat"] = text("upper surface only", loop[:le+1])
	var dup []Point
	for i, p := range loop {
		dup = append(dup, p)
		if i%20 == 5 {
			dup = append(dup, p)
		}
	}
	files["duplicates.dat"] = text("repeated points", dup)
	fromLE := append(append([]Point(nil), loop[le:]...), loop[:le+1]...)
	files["loop-from-le.dat"] = text("loop from the leading edge", fromLE)
	fromMid := append(append([]Point(nil), loop[10:]...), loop[:10]...)
	files["loop-from-mid-upper.dat"] = text("loop from the upper surface", fromMid)
	files["millimetres-inclined.dat"] = text("250 mm chord at 5 degrees", modified(func(i int, p Point) Point {
		return p.Rotate(Point{}, 5*math.Pi/180).Scale(250).Add(Point{40, -12})
	}))

	long := "long line\n1 0\n0.5 " + strings.Repeat("0", MaxLineBytes+10) + "\n"
	files["long-line.dat"] = []byte(long)
	files["text-in-middle.dat"] = bytes.Replace(text("text among the numbers", loop), []byte("\n"+num(loop[30].X)), []byte("\nupper surface ends here\n"+num(loop[30].X)), 1)
	files["missing-y.dat"] = bytes.Replace(text("a line without y", loop), []byte(" "+num(loop[12].Y)+"\n"), []byte("\n"), 1)
	files["three-columns.dat"] = []byte("x y z without a header\n1 0 0\n0.5 0.06 0\n0 0 0\n0.5 -0.05 0\n1 0 0\n")
	files["numbered-points.dat"] = []byte("numbered points\n1 1 0\n2 0.5 0.06\n3 0 0\n4 0.5 -0.05\n5 1 0\n")
	files["empty-field.dat"] = []byte("csv with a hole\n1,0\n0.5,,0.06\n0,0\n0.5,-0.05\n1,0\n")
	var csvNoY bytes.Buffer
	csvNoY.WriteString("x,z,w\n")
	for _, p := range loop {
		csvNoY.WriteString(num(p.X) + ",0," + num(p.Y) + "\n")
	}
	files["csv-no-y-column.csv"] = csvNoY.Bytes()
	var csvShort bytes.Buffer
	csvShort.WriteString("id;x;y\n")
	for i, p := range loop {
		if i == 7 {
			csvShort.WriteString("8;" + num(p.X) + "\n")
			continue
		}
		fmt.Fprintf(&csvShort, "%d;%s;%s\n", i+1, num(p.X), num(p.Y))
	}
	files["csv-short-row.csv"] = csvShort.Bytes()
	files["old-mac-line-ends.dat"] = bytes.ReplaceAll(text("carriage returns only", loop), []byte("\n"), []byte("\r"))
	return files
}

// expectation is one entry of testdata/malformed/expect.json.
type expectation struct {
	About         string   `json:"about"`
	Error         string   `json:"error"`          // sentinel name, if an error is expected
	ErrorContains string   `json:"error_contains"` // substring of the message
	Line          *int     `json:"line"`           // ParseError line, if a parse error
	Warnings      []string `json:"warnings"`       // exact set of warning kinds on success
	Changes       []string `json:"changes"`        // substrings, one per expected change
	Detected      []string `json:"detected"`       // substrings of the parser's notes
	Layout        string   `json:"layout"`
}

var sentinels = map[string]error{
	"ErrEmpty": ErrEmpty, "ErrBinary": ErrBinary, "ErrEncoding": ErrEncoding, "ErrNonFinite": ErrNonFinite,
	"ErrOutOfRange": ErrOutOfRange, "ErrTooFewPoints": ErrTooFewPoints, "ErrAllPointsEqual": ErrAllPointsEqual,
	"ErrOpenContour": ErrOpenContour, "ErrFlatContour": ErrFlatContour, "ErrCountMismatch": ErrCountMismatch,
	"ErrLineTooLong": ErrLineTooLong, "ErrNotNumber": ErrNotNumber, "ErrColumns": ErrColumns,
}

func TestMalformedFilesUpToDate(t *testing.T) {
	for name, data := range malformedCorpus() {
		path := filepath.Join("testdata", "malformed", name)
		if *updateMalformed {
			if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(path, data, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		got, err := os.ReadFile(path)
		if err != nil {
			t.Errorf("%v (run with -update-malformed)", err)
		} else if !sameFile(got, data) {
			t.Errorf("%s differs from the generator (run with -update-malformed)", path)
		}
	}
}

// TestMalformedCorpus parses and cleans every file of testdata/malformed
// and checks the outcome against expect.json.
func TestMalformedCorpus(t *testing.T) {
	raw, err := os.ReadFile(filepath.Join("testdata", "malformed", "expect.json"))
	if err != nil {
		t.Fatal(err)
	}
	var want map[string]expectation
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&want); err != nil {
		t.Fatal(err)
	}
	entries, err := os.ReadDir(filepath.Join("testdata", "malformed"))
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	for _, e := range entries {
		if e.Name() == "expect.json" {
			continue
		}
		seen[e.Name()] = true
		if _, ok := want[e.Name()]; !ok {
			t.Errorf("%s has no expectation", e.Name())
		}
	}
	if len(seen) < 30 {
		t.Errorf("corpus has %d files, want at least 30", len(seen))
	}
	for name, w := range want {
		t.Run(name, func(t *testing.T) {
			if !seen[name] {
				t.Fatalf("expectation for a missing file")
			}
			data, err := os.ReadFile(filepath.Join("testdata", "malformed", name))
			if err != nil {
				t.Fatal(err)
			}
			checkExpectation(t, name, data, w)
		})
	}
}

func checkExpectation(t *testing.T, name string, data []byte, w expectation) {
	t.Helper()
	p, err := ParseCoordinates(bytes.NewReader(data), name)
	var rep *CleanReport
	if err == nil {
		if w.Layout != "" && string(p.Layout) != w.Layout {
			t.Errorf("layout %q, want %q", p.Layout, w.Layout)
		}
		notes := strings.Join(p.Notes, "\n")
		for _, d := range w.Detected {
			if !strings.Contains(notes, d) {
				t.Errorf("notes lack %q:\n%s", d, notes)
			}
		}
		_, rep, err = p.Clean(DefaultCleanOptions)
		if w.Line != nil && err != nil {
			t.Errorf("expected a parse error, got a cleaning error: %v", err)
		}
	}
	if w.Error != "" {
		if err == nil {
			t.Fatalf("no error, want %s\n%s", w.Error, rep)
		}
		if !errors.Is(err, sentinels[w.Error]) {
			t.Errorf("error %q does not wrap %s", err, w.Error)
		}
		if !strings.Contains(err.Error(), w.ErrorContains) {
			t.Errorf("error %q lacks %q", err, w.ErrorContains)
		}
		var pe *ParseError
		var ce *ContourError
		switch {
		case errors.As(err, &pe):
			if w.Line == nil {
				t.Errorf("parse error %q, want a cleaning error", err)
			} else if pe.Line != *w.Line {
				t.Errorf("line %d, want %d: %v", pe.Line, *w.Line, err)
			}
		case errors.As(err, &ce):
		default:
			t.Errorf("error %T is neither *ParseError nor *ContourError", err)
		}
		return
	}
	if err != nil {
		t.Fatalf("unexpected error: %v", err)
	}
	kinds := map[string]bool{}
	for _, x := range rep.Warnings {
		kinds[string(x.Kind)] = true
	}
	wk := map[string]bool{}
	for _, k := range w.Warnings {
		wk[k] = true
		if !kinds[k] {
			t.Errorf("no %s warning\n%s", k, rep)
		}
	}
	for k := range kinds {
		if !wk[k] {
			t.Errorf("unexpected %s warning\n%s", k, rep)
		}
	}
	changes := strings.Join(rep.Changes, "\n")
	for _, c := range w.Changes {
		if !strings.Contains(changes, c) {
			t.Errorf("changes lack %q\n%s", c, rep)
		}
	}
}

func TestParseEncodings(t *testing.T) {
	body := "1 0\n0.5 0.06\n0 0\n0.5 -0.06\n1 0\n"
	be := []byte{0xFE, 0xFF}
	for _, c := range utf16.Encode([]rune(body)) {
		be = append(be, byte(c>>8), byte(c))
	}
	for _, c := range []struct {
		name string
		in   []byte
		note string
		is   error
	}{
		{"UTF-16 big-endian", be, "UTF-16 big-endian text", nil},
		{"UTF-32", append([]byte{0xFF, 0xFE, 0, 0}, '1', 0, 0, 0), "", ErrEncoding},
		{"Windows line ends", []byte(strings.ReplaceAll(body, "\n", "\r\n")), "one loop of 5 points", nil},
		{"typeset minus", []byte(strings.ReplaceAll(body, "-", "\u2212")), "Unicode minus signs", nil},
		{"no-break spaces", []byte(strings.ReplaceAll(body, " ", "\u00a0")), "no-break spaces read as spaces", nil},
	} {
		p, err := ParseCoordinates(bytes.NewReader(c.in), "e.dat")
		if c.is != nil {
			if !errors.Is(err, c.is) {
				t.Errorf("%s: got %v, want %v", c.name, err, c.is)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !strings.Contains(strings.Join(p.Notes, "\n"), c.note) || len(p.Points) != 5 {
			t.Errorf("%s: %d points, notes %q", c.name, len(p.Points), p.Notes)
		}
	}
}

// BenchmarkParseMaxPoints parses a file of MaxPoints points (about 0.7 MB).
func BenchmarkParseMaxPoints(b *testing.B) {
	var buf bytes.Buffer
	for i := range MaxPoints {
		a := 2 * math.Pi * float64(i) / MaxPoints
		fmt.Fprintf(&buf, "%.9f %.9f\n", (1+math.Cos(a))/2, 0.06*math.Sin(a))
	}
	data := buf.Bytes()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := ParseCoordinates(bytes.NewReader(data), "b.dat"); err != nil {
			b.Fatal(err)
		}
	}
}

// TestScanNumber checks the hand-written number scanner against the
// regular expressions in its documentation, on listed and random strings.
func TestScanNumber(t *testing.T) {
	dot := regexp.MustCompile(`^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eEdD][+-]?[0-9]+)?$`)
	comma := regexp.MustCompile(`^[+-]?([0-9]*,[0-9]+|[0-9]+)([eEdD][+-]?[0-9]+)?$`)
	cases := []string{"", "+", "-", ".", ",", "0", "-0", "+.5", "5.", "5,", ",5", "1e5", "1e", "1e+", "1.0D-03",
		"1.2.3", "1,2,3", "e5", ".e5", "0x1p3", "1_0", "--1", "1-2", " 1", "1 ", "١"}
	rng := rand.New(rand.NewPCG(3, 4))
	const alphabet = "0123456789+-.,eEdDx "
	for range 20000 {
		b := make([]byte, 1+rng.IntN(7))
		for i := range b {
			b[i] = alphabet[rng.IntN(len(alphabet))]
		}
		cases = append(cases, string(b))
	}
	for _, s := range cases {
		if got, want := isNumber(s), dot.MatchString(s); got != want {
			t.Errorf("isNumber(%q) = %v, want %v", s, got, want)
		}
		if got, want := isDecCommaNumber(s), comma.MatchString(s); got != want {
			t.Errorf("isDecCommaNumber(%q) = %v, want %v", s, got, want)
		}
	}
}

// TestParseNameLikeANumberAndDOSEnd: a name line "Inf" or "NaN" is a
// name, not a point (it was read as data and refused as not finite); a DOS
// end-of-file byte at the end is ignored (it was refused as text among the
// coordinates).
func TestParseNameLikeANumberAndDOSEnd(t *testing.T) {
	const body = "1 0\n0.5 0.06\n0 0\n0.5 -0.06\n1 0\n"
	for _, tc := range []struct {
		name, data, wantName string
	}{
		{"name Inf", "Inf\n" + body, "Inf"},
		{"name NaN", "NaN\n" + body, "NaN"},
		{"DOS end-of-file byte", "wing\n" + body + "\x1a", "wing"},
		{"DOS end after a blank line", "wing\r\n" + body + "\r\n\x1a", "wing"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := ParseCoordinates(strings.NewReader(tc.data), "test.dat")
			if err != nil {
				t.Fatal(err)
			}
			if p.Name != tc.wantName || len(p.Points) != 5 {
				t.Errorf("name %q with %d points, want %q with 5", p.Name, len(p.Points), tc.wantName)
			}
		})
	}
}
