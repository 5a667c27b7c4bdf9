package model

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf16"
	"unicode/utf8"
)

// Limits on coordinate files. They exist so that a wrong file (an image, a
// log, a whole scan dump) fails fast with a clear message instead of
// exhausting memory or the solver.
const (
	// MaxInputBytes bounds the size of a coordinate file. MaxPoints points
	// at about 50 bytes a line is under 1 MiB, so 4 MiB leaves room for
	// comments and wide columns; ParseCoordinates reads at most one byte
	// more than this, however long the input is.
	MaxInputBytes = 4 << 20
	// MaxPoints bounds the number of points: ten times MaxPanels, enough for
	// densely digitised or scanned contours, which repanelling thins out.
	MaxPoints = 20000
	// MaxLineBytes bounds one line. A coordinate line is under 100 bytes; a
	// longer line is not a coordinate line (or is a whole file on one line).
	MaxLineBytes = 4096
	// MaxAbsCoordinate bounds each coordinate's magnitude. No unit makes a
	// wing section this large (a 1 km chord in micrometres is 1e9); larger
	// values are corrupt data and would lose all precision after scaling.
	MaxAbsCoordinate = 1e9
	// MaxNameBytes bounds the section name taken from the name line.
	MaxNameBytes = 200
)

// Thresholds of the format detection, as fractions of the x range of the
// points (common practice for coordinate files; chosen here, not from a
// published source).
const (
	// surfaceEndFrac: how close to the smallest or largest x a surface must
	// start and end for the two-surface layout to be recognised.
	surfaceEndFrac = 0.1
	// surfaceJumpFrac: the jump between the two surfaces must span at least
	// this fraction of the x range; consecutive points of a loop never do.
	surfaceJumpFrac = 0.5
	// countLineMargin: a point-count line must lie outside the bounding box
	// of the coordinates by this fraction of the box's size, so a real first
	// point with integer coordinates (say 150 0 in millimetres) is not taken
	// for a count.
	countLineMargin = 0.05
	// binaryFrac: the largest fraction of control bytes and invalid UTF-8
	// tolerated before the input is called binary.
	binaryFrac = 0.1
)

// FileLayout names how a coordinate file lists its points.
type FileLayout string

// The layouts ParseCoordinates recognises.
const (
	// LayoutLoop: one loop, normally from the trailing edge over one
	// surface to the leading edge and back along the other, either
	// direction. Clean also accepts loops that start elsewhere.
	LayoutLoop FileLayout = "loop"
	// LayoutSurfaces: two surfaces, each from the leading edge to the
	// trailing edge (or each from the trailing edge to the leading edge),
	// upper first or lower first, without a count line.
	LayoutSurfaces FileLayout = "surfaces"
	// LayoutSurfacesCounted: two surfaces after a line giving the number of
	// points of each, such as "61. 61." or "61 61".
	LayoutSurfacesCounted FileLayout = "surfaces-counted"
	// LayoutCSV: a header row naming the x and y columns (in any case; x/c,
	// "X (mm)" and the like are recognised); other columns are ignored.
	LayoutCSV FileLayout = "csv"
)

// Sentinel errors wrapped by ParseError; match them with errors.Is.
var (
	ErrEmpty         = errors.New("no coordinates")
	ErrBinary        = errors.New("binary data, not a text file")
	ErrTooLarge      = errors.New("input too large")
	ErrLineTooLong   = errors.New("line too long")
	ErrTooManyPoints = errors.New("too many points")
	ErrNotNumber     = errors.New("not a number")
	ErrColumns       = errors.New("wrong number of values on a line")
	ErrCountMismatch = errors.New("point-count line does not match the points")
	ErrEncoding      = errors.New("unreadable text encoding")
	ErrOutOfRange    = errors.New("coordinate out of range")
)

// ParseError reports a problem in a coordinate file: the source it came
// from, the 1-based line and column (byte offset within the line, as
// encoding/csv counts it; 0 when the problem is not at one place) and the
// underlying error, which wraps one of the sentinels above or ErrNonFinite
// or ErrTooFewPoints.
type ParseError struct {
	Source       string
	Line, Column int
	Err          error
}

// Error returns "SOURCE: line L, column C: MESSAGE", leaving out the parts
// that are unknown.
func (e *ParseError) Error() string {
	var b strings.Builder
	if e.Source != "" {
		b.WriteString(e.Source)
		b.WriteString(": ")
	}
	if e.Line > 0 {
		fmt.Fprintf(&b, "line %d", e.Line)
		if e.Column > 0 {
			fmt.Fprintf(&b, ", column %d", e.Column)
		}
		b.WriteString(": ")
	}
	b.WriteString(e.Err.Error())
	return b.String()
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

// Parsed is a coordinate file as read, before cleaning.
type Parsed struct {
	Name   string     // from the name line, or the source's base name
	Source string     // the source given to ParseCoordinates
	Layout FileLayout // how the file listed its points
	// Points holds the contour as one loop in the file's traversal: a loop
	// as listed, or two surfaces joined at the leading edge (the first
	// surface run towards the leading edge, then the second away from it).
	// Orientation, start point, duplicates and scale are left to Clean.
	Points []Point
	// Lines holds the file line of each of Points (as reordered), so
	// that the cleaning report can name a point by the line the user
	// sees in the file.
	Lines []int
	// Notes says, in words, everything that was detected or assumed.
	Notes []string
}

// Section returns the parsed points as a section, without cleaning.
func (p *Parsed) Section() (*Section, error) { return NewSection(p.Name, p.Points) }

// Clean cleans the parsed points (see Clean) and fills in the report's
// source and what the parser detected.
func (p *Parsed) Clean(opt CleanOptions) (*Section, *CleanReport, error) {
	if opt.Lines == nil && len(p.Lines) == len(p.Points) {
		opt.Lines = p.Lines
	}
	sec, rep, err := Clean(p.Name, p.Points, opt)
	if rep != nil {
		rep.Source = p.Source
		rep.Detected = append(append([]string(nil), p.Notes...), rep.Detected...)
	}
	return sec, rep, err
}

// ParseCoordinates reads a coordinate text file as the trade circulates
// them. It accepts:
//
//   - an optional name line (the first line before the data that is not
//     all numbers, so "250 mm flap" is a name) and further text lines
//     before the data, which are noted and skipped;
//   - comment lines starting with #, %, // or !, and comments after the
//     numbers starting with #, // or !; blank lines anywhere;
//   - numbers separated by spaces, tabs, commas or semicolons, in any mix;
//     Fortran exponents (1.0D-03) are read as E exponents;
//   - decimal commas (0,5) only when unambiguous: every data line has
//     exactly two fields separated by spaces, tabs or semicolons, and no
//     data line has a decimal point. Otherwise commas separate values, and a
//     line such as "0,5 0,25" is rejected as having four numbers;
//   - a UTF-8 byte-order mark (removed) and UTF-16 with a byte-order mark
//     (decoded); UTF-32 is rejected; text without a mark is read as UTF-8,
//     invalid bytes (a Latin-1 name, say) being replaced and noted;
//     Unicode minus signs and no-break spaces, as copied from typeset
//     documents, are read as '-' and ' ';
//   - the layouts of FileLayout: one loop; two surfaces (recognised when x
//     runs from one end to the other and jumps back); two surfaces after a
//     point-count line, which must agree with the points that follow (two
//     integers on the first data line lying well outside the box of the
//     other points; inside it they are a point); a header row naming x and
//     y columns, with as many fields as the first data line. A single
//     number on the first data line is taken as the total point count and
//     checked. A third column that is zero on every line (z, as CAD
//     exports write it) is dropped and noted; other extra columns need a
//     header row.
//
// It rejects, with a *ParseError naming the line and column: empty input,
// binary data (NUL bytes, or more than 10% control bytes or invalid UTF-8),
// input over MaxInputBytes (reading stops there), lines over MaxLineBytes,
// more than MaxPoints points, fewer than MinSectionPoints, NaN or infinite
// values, magnitudes over MaxAbsCoordinate, text among the data, and a
// line with other than two values. Every assumption is stated in
// Parsed.Notes; nothing is guessed silently.
func ParseCoordinates(r io.Reader, source string) (*Parsed, error) {
	if r == nil {
		panic("model: ParseCoordinates with a nil reader")
	}
	fail := func(line, col int, err error) (*Parsed, error) {
		return nil, &ParseError{Source: source, Line: line, Column: col, Err: err}
	}
	data, err := io.ReadAll(io.LimitReader(r, MaxInputBytes+1))
	if err != nil {
		return fail(0, 0, fmt.Errorf("reading: %w", err))
	}
	if len(data) > MaxInputBytes {
		return fail(0, 0, fmt.Errorf("more than %d bytes (%d MiB), larger than any coordinate file: %w", MaxInputBytes, MaxInputBytes>>20, ErrTooLarge))
	}
	text, notes, err := decodeText(data)
	if err != nil {
		return fail(0, 0, err)
	}
	lines := splitLines(text)
	p := &parser{source: source, notes: notes}
	if err := p.scan(lines); err != nil {
		return nil, err
	}
	return p.finish()
}

// decodeText turns the bytes into UTF-8 text, removing a byte-order mark
// and rejecting binary data.
func decodeText(data []byte) (string, []string, error) {
	var notes []string
	if len(data) == 0 {
		return "", nil, fmt.Errorf("the input is empty: %w", ErrEmpty)
	}
	switch {
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE, 0, 0}), bytes.HasPrefix(data, []byte{0, 0, 0xFE, 0xFF}):
		return "", nil, fmt.Errorf("UTF-32 text (byte-order mark) is not read; save it as UTF-8: %w", ErrEncoding)
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE}), bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
		le := data[0] == 0xFF
		body := data[2:]
		if len(body)%2 != 0 {
			return "", nil, fmt.Errorf("UTF-16 byte-order mark but an odd number of bytes: %w", ErrEncoding)
		}
		u := make([]uint16, len(body)/2)
		for i := range u {
			if le {
				u[i] = uint16(body[2*i]) | uint16(body[2*i+1])<<8
			} else {
				u[i] = uint16(body[2*i])<<8 | uint16(body[2*i+1])
			}
		}
		data = []byte(string(utf16.Decode(u)))
		order := "big"
		if le {
			order = "little"
		}
		notes = append(notes, fmt.Sprintf("UTF-16 %s-endian text (byte-order mark); decoded", order))
	case bytes.HasPrefix(data, []byte{0xEF, 0xBB, 0xBF}):
		data = data[3:]
		notes = append(notes, "UTF-8 byte-order mark removed")
	}
	if i := bytes.IndexByte(data, 0); i >= 0 {
		if looksUTF16(data) {
			return "", nil, fmt.Errorf("NUL bytes at every other position: this looks like UTF-16 text without a byte-order mark; save it as UTF-8: %w", ErrBinary)
		}
		return "", nil, fmt.Errorf("NUL byte at offset %d: %w", i, ErrBinary)
	}
	bad := 0
	for i := 0; i < len(data); {
		r, n := utf8.DecodeRune(data[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			bad++
		case r < 0x20 && r != '\t' && r != '\n' && r != '\r' && r != '\f' && r != '\v' && r != 0x1A, r == 0x7F:
			bad++
		}
		i += n
	}
	if float64(bad) > binaryFrac*float64(len(data)) {
		return "", nil, fmt.Errorf("%d of %d bytes are control characters or invalid UTF-8: %w", bad, len(data), ErrBinary)
	}
	if bad > 0 {
		notes = append(notes, fmt.Sprintf("%d bytes of invalid UTF-8 or control characters replaced", bad))
		data = []byte(strings.ToValidUTF8(string(data), "\uFFFD"))
	}
	// DOS editors end a file with an end-of-file byte (Ctrl-Z, 0x1A).
	if trimmed := bytes.TrimRight(data, "\x1a\r\n\t "); len(trimmed) < len(data) && bytes.IndexByte(data[len(trimmed):], 0x1A) >= 0 {
		data = trimmed
		notes = append(notes, "a DOS end-of-file byte (Ctrl-Z) at the end ignored")
	}
	text := string(data)
	// Text copied from typeset documents carries Unicode minus signs and
	// no-break spaces; read them as their ASCII forms, and say so.
	if strings.ContainsRune(text, '\u2212') {
		text = strings.ReplaceAll(text, "\u2212", "-")
		notes = append(notes, "Unicode minus signs (\u2212) read as -")
	}
	if strings.ContainsRune(text, '\u00a0') {
		text = strings.ReplaceAll(text, "\u00a0", " ")
		notes = append(notes, "no-break spaces read as spaces")
	}
	return text, notes, nil
}

// looksUTF16 reports whether most NUL bytes sit at alternate positions, as
// in ASCII text saved as UTF-16.
func looksUTF16(data []byte) bool {
	var nul [2]int
	for i, b := range data {
		if b == 0 {
			nul[i%2]++
		}
	}
	half := len(data) / 2
	return half > 0 && (nul[0] > half*9/10 || nul[1] > half*9/10)
}

// splitLines splits at \n, \r\n or a lone \r.
func splitLines(s string) []string {
	var out []string
	for len(s) > 0 {
		i := strings.IndexAny(s, "\r\n")
		if i < 0 {
			out = append(out, s)
			break
		}
		out = append(out, s[:i])
		if s[i] == '\r' && i+1 < len(s) && s[i+1] == '\n' {
			i++
		}
		s = s[i+1:]
	}
	return out
}

// field is one token of a line with its 1-based byte column.
type field struct {
	text string
	col  int
}

// record is a data line: its 1-based number and its fields.
type record struct {
	line   int
	fields []field
}

type parser struct {
	source string
	notes  []string

	name     string
	nameLine int
	header   []field // CSV header fields, nil if none
	headLine int
	ix, iy   int // CSV column indexes of x and y
	records  []record
	decComma bool
	dExp     bool
	seps     map[string]bool
	comments int
}

func (p *parser) errAt(line, col int, err error) error {
	return &ParseError{Source: p.source, Line: line, Column: col, Err: err}
}

// scanNumber reports whether s is a number with the decimal separator sep
// ('.' or ','): an optional sign, digits with at most one separator and at
// least one digit (for ',' at least one digit after it), and an optional
// exponent of E, e, D or d, an optional sign and digits. As regular
// expressions (checked in the tests):
//
//	'.': ^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eEdD][+-]?[0-9]+)?$
//	',': ^[+-]?([0-9]*,[0-9]+|[0-9]+)([eEdD][+-]?[0-9]+)?$
func scanNumber(s string, sep byte) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	before, after, seen := 0, 0, false
	for ; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= '0' && c <= '9':
			if seen {
				after++
			} else {
				before++
			}
			continue
		case c == sep && !seen:
			seen = true
			continue
		}
		break
	}
	if before+after == 0 || sep == ',' && seen && after == 0 {
		return false
	}
	if i < len(s) && strings.IndexByte("eEdD", s[i]) >= 0 {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		d := 0
		for ; i < len(s) && s[i] >= '0' && s[i] <= '9'; i++ {
			d++
		}
		if d == 0 {
			return false
		}
	}
	return i == len(s)
}

func isNumber(s string) bool         { return scanNumber(s, '.') }
func isDecCommaNumber(s string) bool { return scanNumber(s, ',') }

var nonFiniteRE = regexp.MustCompile(`^(?i)[+-]?(nan|inf|infinity)$`)

// runTogetherRE matches two numbers with no blank between them, as
// fixed-width columns print a negative value (0.500000-0.012345), which
// is also how some Fortran output writes an exponent without its letter
// (1.0-3). Being ambiguous, it is rejected with that explanation.
var runTogetherRE = regexp.MustCompile(`^[+-]?[0-9]*\.?[0-9]+[+-][0-9]*\.?[0-9]+$`)

// isComment reports whether a trimmed line is a whole-line comment.
func isComment(s string) bool {
	return strings.HasPrefix(s, "#") || strings.HasPrefix(s, "%") || strings.HasPrefix(s, "//") || strings.HasPrefix(s, "!")
}

// stripInline cuts a trailing comment (#, // or !) off a data line.
func stripInline(s string) string {
	cut := len(s)
	for _, m := range []string{"#", "//", "!"} {
		if i := strings.Index(s, m); i >= 0 && i < cut {
			cut = i
		}
	}
	return s[:cut]
}

// looksNumeric reports whether a token starts a data line: a number in
// either decimal convention, or NaN/Inf (rejected later with its place).
func looksNumeric(tok string) bool {
	return isNumber(tok) || isDecCommaNumber(tok) || nonFiniteRE.MatchString(tok) || runTogetherRE.MatchString(tok)
}

// splitFields splits a line at runs of the given separator characters,
// recording each field's column and which separators were seen.
func splitFields(s, seps string, seen map[string]bool) []field {
	var out []field
	start := -1
	for i := 0; i <= len(s); i++ {
		if i == len(s) || strings.IndexByte(seps, s[i]) >= 0 {
			if start >= 0 {
				out = append(out, field{text: s[start:i], col: start + 1})
				start = -1
			}
			if i < len(s) && seen != nil {
				seen[sepName(s[i])] = true
			}
			continue
		}
		if start < 0 {
			start = i
		}
	}
	return out
}

func sepName(c byte) string {
	switch c {
	case ' ':
		return "spaces"
	case '\t':
		return "tabs"
	case ',':
		return "commas"
	case ';':
		return "semicolons"
	}
	return string(c)
}

// scan classifies the lines into the name, a header, text lines and data
// records, and decides the decimal convention.
func (p *parser) scan(lines []string) error {
	type raw struct {
		line int
		text string
	}
	var data []raw
	var leading []raw // text lines before the first data line
	var header []field
	headLine, ix, iy := 0, -1, -1
	for i, ln := range lines {
		num := i + 1
		if len(ln) > MaxLineBytes {
			return p.errAt(num, MaxLineBytes+1, fmt.Errorf("%d bytes, more than %d: %w", len(ln), MaxLineBytes, ErrLineTooLong))
		}
		t := strings.TrimFunc(ln, unicode.IsSpace)
		if t == "" {
			continue
		}
		if isComment(t) {
			p.comments++
			continue
		}
		fs := splitFields(stripInline(ln), " \t,;", nil)
		if len(data) > 0 {
			// Among the data, a line is data when it starts with a number
			// (or, under a header, has numbers in the x and y columns).
			if len(fs) > 0 && (looksNumeric(fs[0].text) || header != nil && numericAt(fs, ix) && numericAt(fs, iy)) {
				data = append(data, raw{num, stripInline(ln)})
				continue
			}
			col := strings.Index(ln, t) + 1
			return p.errAt(num, col, fmt.Errorf("text %q among the coordinates: %w", clip(t, 40), ErrNotNumber))
		}
		// Before the data: a line is data when all its fields are numbers
		// (or, under a header, those in the x and y columns are), so a
		// name such as "250 mm section" stays a name.
		allNum := len(fs) > 0
		for _, f := range fs {
			allNum = allNum && looksNumeric(f.text)
		}
		// A single word such as "Inf" or "NaN" on the first line is a name,
		// not a point (a point has two values, a count line one finite one).
		if len(fs) == 1 && nonFiniteRE.MatchString(fs[0].text) {
			allNum = false
		}
		if allNum || header != nil && numericAt(fs, ix) && numericAt(fs, iy) {
			data = append(data, raw{num, stripInline(ln)})
			continue
		}
		if header == nil {
			hf := splitFields(stripInline(ln), " \t,;", nil)
			if x, y, ok := headerColumns(hf); ok {
				header, headLine, ix, iy = hf, num, x, y
				continue
			}
		}
		leading = append(leading, raw{num, ln})
	}
	if len(data) == 0 {
		what := "only blank lines"
		if len(leading) > 0 || p.comments > 0 || header != nil {
			what = "only text and comments, no coordinate lines"
		}
		return p.errAt(0, 0, fmt.Errorf("%s: %w", what, ErrEmpty))
	}
	// Decimal commas: every data line has two fields separated by spaces,
	// tabs or semicolons, each an integer or a decimal-comma number, at
	// least one with a comma, and no line has a decimal point. A single
	// field is allowed on the first data line (a point count).
	dec, anyComma := true, false
	for k, d := range data {
		fs := splitFields(d.text, " \t;", nil)
		if strings.Contains(d.text, ".") || len(fs) > 2 || (len(fs) == 1 && k > 0) {
			dec = false
			break
		}
		for _, f := range fs {
			if !isDecCommaNumber(f.text) {
				dec = false
			}
			anyComma = anyComma || strings.Contains(f.text, ",")
		}
		if !dec {
			break
		}
	}
	p.decComma = dec && anyComma
	seps := " \t,;"
	if p.decComma {
		seps = " \t;"
		p.notes = append(p.notes, "decimal commas (0,5 read as 0.5): every data line has two fields and none has a decimal point")
	}
	p.seps = map[string]bool{}
	for _, d := range data {
		fs := splitFields(d.text, seps, p.seps)
		// An empty field between two commas or semicolons is a missing value.
		if err := p.checkEmptyFields(d.line, d.text); err != nil {
			return err
		}
		p.records = append(p.records, record{line: d.line, fields: fs})
	}
	// A header row must have as many fields as the first data line; if not,
	// it was a text line (a name such as "x y z coordinates").
	if header != nil && len(data) > 0 && len(p.records[0].fields) != len(header) {
		leading = append(leading, raw{headLine, lines[headLine-1]})
		sort.Slice(leading, func(i, j int) bool { return leading[i].line < leading[j].line })
		header = nil
	}
	if header != nil {
		p.header, p.headLine, p.ix, p.iy = header, headLine, ix, iy
	}
	// Leading text lines: the name, then others (noted).
	for _, l := range leading {
		if p.nameLine == 0 {
			p.name, p.nameLine = cleanName(l.text), l.line
			continue
		}
		p.notes = append(p.notes, fmt.Sprintf("text line %d skipped: %q", l.line, clip(strings.TrimSpace(l.text), 60)))
	}
	return nil
}

// checkEmptyFields rejects ",," or ";;" (possibly with blanks between)
// inside a data line; one trailing separator is tolerated.
func (p *parser) checkEmptyFields(line int, s string) error {
	if p.decComma {
		return nil
	}
	prev := -1
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == ',' || c == ';':
			if prev >= 0 {
				return p.errAt(line, i+1, fmt.Errorf("empty value between separators: %w", ErrNotNumber))
			}
			prev = i
		case c == ' ' || c == '\t':
		default:
			prev = -1
		}
	}
	if t := strings.TrimSpace(s); strings.HasPrefix(t, ",") || strings.HasPrefix(t, ";") {
		return p.errAt(line, strings.IndexAny(s, ",;")+1, fmt.Errorf("line starts with a separator (missing first value): %w", ErrNotNumber))
	}
	return nil
}

// numericAt reports whether field i exists and looks like a number.
func numericAt(fs []field, i int) bool { return i >= 0 && i < len(fs) && looksNumeric(fs[i].text) }

// headerColumns finds the x and y columns of a header row: a field that is
// x or y, or starts with x or y followed by a non-letter (x/c, "Y (mm)").
func headerColumns(fs []field) (ix, iy int, ok bool) {
	ix, iy = -1, -1
	for i, f := range fs {
		name := strings.ToLower(strings.Trim(f.text, `"' `))
		switch columnAxis(name) {
		case 'x':
			if ix >= 0 {
				return 0, 0, false
			}
			ix = i
		case 'y':
			if iy >= 0 {
				return 0, 0, false
			}
			iy = i
		}
	}
	return ix, iy, ix >= 0 && iy >= 0
}

func columnAxis(name string) byte {
	if name == "" || (name[0] != 'x' && name[0] != 'y') {
		return 0
	}
	if len(name) == 1 {
		return name[0]
	}
	if r, _ := utf8.DecodeRuneInString(name[1:]); !unicode.IsLetter(r) && !unicode.IsDigit(r) {
		return name[0]
	}
	return 0
}

// number parses one field, naming its place on error.
func (p *parser) number(line int, f field) (float64, error) {
	t := f.text
	if !isNumber(t) && nonFiniteRE.MatchString(t) {
		return 0, p.errAt(line, f.col, fmt.Errorf("%q: %w", t, ErrNonFinite))
	}
	if p.decComma {
		if !isDecCommaNumber(t) {
			return 0, p.errAt(line, f.col, fmt.Errorf("%q is not a decimal-comma number: %w", clip(t, 30), ErrNotNumber))
		}
		t = strings.Replace(t, ",", ".", 1)
	} else if !isNumber(t) {
		if runTogetherRE.MatchString(t) {
			return 0, p.errAt(line, f.col, fmt.Errorf("%q: two numbers run together (fixed-width columns without a blank) or an exponent without its E; put a blank between the numbers or write the E: %w", t, ErrNotNumber))
		}
		return 0, p.errAt(line, f.col, fmt.Errorf("%q: %w", clip(t, 30), ErrNotNumber))
	}
	if i := strings.IndexAny(t, "dD"); i >= 0 {
		t = t[:i] + "e" + t[i+1:]
		p.dExp = true
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil && !math.IsInf(v, 0) {
		return 0, p.errAt(line, f.col, fmt.Errorf("%q: %w", clip(f.text, 30), ErrNotNumber))
	}
	if math.IsInf(v, 0) || math.Abs(v) > MaxAbsCoordinate {
		return 0, p.errAt(line, f.col, fmt.Errorf("%s is beyond ±%g, larger than a section in any unit: %w", f.text, float64(MaxAbsCoordinate), ErrOutOfRange))
	}
	return v, nil
}

// finish turns the records into points and recognises the layout.
func (p *parser) finish() (*Parsed, error) {
	out := &Parsed{Source: p.source, Name: p.name}
	if p.nameLine > 0 {
		p.notes = append(p.notes, fmt.Sprintf("name line %d: %q", p.nameLine, p.name))
	} else {
		out.Name = nameFromSource(p.source)
		p.notes = append(p.notes, fmt.Sprintf("no name line; named %q after the source", out.Name))
	}
	if p.comments > 0 {
		p.notes = append(p.notes, fmt.Sprintf("%d comment %s skipped", p.comments, plural(p.comments, "line", "lines")))
	}
	recs := p.records
	var pts []Point
	var pointLines []int
	counts := []int(nil)
	countLine := 0
	if p.header != nil {
		out.Layout = LayoutCSV
		need := max(p.ix, p.iy) + 1
		var ignored []string
		for i, f := range p.header {
			if i != p.ix && i != p.iy {
				ignored = append(ignored, strings.Trim(f.text, `"' `))
			}
		}
		note := fmt.Sprintf("header row on line %d: x in column %d (%q), y in column %d (%q)", p.headLine, p.ix+1, strings.Trim(p.header[p.ix].text, `"' `), p.iy+1, strings.Trim(p.header[p.iy].text, `"' `))
		if len(ignored) > 0 {
			note += fmt.Sprintf("; other columns ignored: %s", strings.Join(ignored, ", "))
		}
		p.notes = append(p.notes, note)
		for _, r := range recs {
			if len(r.fields) < need {
				return nil, p.errAt(r.line, 0, fmt.Errorf("%d %s, but the header on line %d puts y in column %d and x in column %d: %w", len(r.fields), plural(len(r.fields), "value", "values"), p.headLine, p.iy+1, p.ix+1, ErrColumns))
			}
			x, err := p.number(r.line, r.fields[p.ix])
			if err != nil {
				return nil, err
			}
			y, err := p.number(r.line, r.fields[p.iy])
			if err != nil {
				return nil, err
			}
			if len(pts) == MaxPoints {
				return nil, p.errAt(r.line, 0, fmt.Errorf("more than %d points: %w", MaxPoints, ErrTooManyPoints))
			}
			pts = append(pts, Point{x, y})
			pointLines = append(pointLines, r.line)
		}
	} else {
		// A third column that is zero on every line is a z coordinate, as
		// CAD exports write it: unambiguous, so it is dropped (and noted).
		zcol := len(recs) > 0
		for _, r := range recs {
			zcol = zcol && len(r.fields) == 3 && isNumber(r.fields[2].text)
			if zcol {
				v, err := strconv.ParseFloat(strings.Map(dToE, r.fields[2].text), 64)
				zcol = err == nil && v == 0
			}
		}
		if zcol {
			for i := range recs {
				recs[i].fields = recs[i].fields[:2]
			}
			p.notes = append(p.notes, "a third column, zero on every line (z), ignored")
		}
		for k, r := range recs {
			if len(r.fields) != 2 && !(k == 0 && len(r.fields) == 1) {
				msg := fmt.Sprintf("%d %s; expected 2 (x and y)", len(r.fields), plural(len(r.fields), "value", "values"))
				if len(r.fields) > 2 && p.seps["commas"] && !strings.Contains(lineText(r), ".") {
					msg += "; if the commas are decimal commas, every data line must have two fields and no decimal points"
				} else if len(r.fields) > 2 {
					msg += "; for more columns use a header row naming x and y"
				}
				return nil, p.errAt(r.line, 0, fmt.Errorf("%s: %w", msg, ErrColumns))
			}
			vals := make([]float64, len(r.fields))
			for i, f := range r.fields {
				v, err := p.number(r.line, f)
				if err != nil {
					return nil, err
				}
				vals[i] = v
			}
			if k == 0 && len(vals) == 1 && isCount(vals[0], 3) {
				counts, countLine = []int{int(vals[0])}, r.line
				continue
			}
			if k == 0 && len(vals) == 2 && isCount(vals[0], 2) && isCount(vals[1], 2) {
				counts, countLine = []int{int(vals[0]), int(vals[1])}, r.line
				pointLines = append(pointLines, r.line)
				pts = append(pts, Point{vals[0], vals[1]}) // a count or a point: decided below
				continue
			}
			if len(vals) != 2 {
				return nil, p.errAt(r.line, 0, fmt.Errorf("1 value; expected 2 (x and y): %w", ErrColumns))
			}
			if len(pts) == MaxPoints {
				return nil, p.errAt(r.line, 0, fmt.Errorf("more than %d points: %w", MaxPoints, ErrTooManyPoints))
			}
			pts = append(pts, Point{vals[0], vals[1]})
			pointLines = append(pointLines, r.line)
		}
		if len(counts) == 2 {
			// The first line is a count line only if it lies well outside
			// the box of the other points.
			if !outsideBox(pts[0], pts[1:]) {
				counts, countLine = nil, 0
			} else {
				pts, pointLines = pts[1:], pointLines[1:]
			}
		}
	}
	if p.dExp {
		p.notes = append(p.notes, "Fortran D exponents read as E")
	}
	if len(p.seps) > 0 {
		var names []string
		for _, s := range []string{"spaces", "tabs", "commas", "semicolons"} {
			if p.seps[s] {
				names = append(names, s)
			}
		}
		if len(names) > 0 {
			p.notes = append(p.notes, "values separated by "+strings.Join(names, ", "))
		}
	}
	if len(pts) < MinSectionPoints {
		return nil, p.errAt(0, 0, fmt.Errorf("%d %s; a section needs at least %d: %w", len(pts), plural(len(pts), "point", "points"), MinSectionPoints, ErrTooFewPoints))
	}
	switch len(counts) {
	case 1:
		if counts[0] != len(pts) {
			return nil, p.errAt(countLine, 0, fmt.Errorf("the point-count line says %d points, but %d follow: %w", counts[0], len(pts), ErrCountMismatch))
		}
		p.notes = append(p.notes, fmt.Sprintf("point-count line %d: %d points, as found", countLine, counts[0]))
	case 2:
		if counts[0]+counts[1] != len(pts) || counts[0] < 2 || counts[1] < 2 {
			return nil, p.errAt(countLine, 0, fmt.Errorf("the point-count line says %d + %d = %d points, but %d follow: %w", counts[0], counts[1], counts[0]+counts[1], len(pts), ErrCountMismatch))
		}
		out.Layout = LayoutSurfacesCounted
		out.Lines = joinedLoop(pts[:counts[0]], pts[counts[0]:], pointLines[:counts[0]], pointLines[counts[0]:])
		out.Points, p.notes = joinSurfaces(pts[:counts[0]], pts[counts[0]:], p.notes,
			fmt.Sprintf("point-count line %d: two surfaces of %d and %d points", countLine, counts[0], counts[1]))
		out.Notes = p.notes
		return out, nil
	}
	if k, ok := surfaceSplit(pts); ok {
		if out.Layout == "" {
			out.Layout = LayoutSurfaces
		}
		out.Lines = joinedLoop(pts[:k], pts[k:], pointLines[:k], pointLines[k:])
		out.Points, p.notes = joinSurfaces(pts[:k], pts[k:], p.notes,
			fmt.Sprintf("x runs end to end and jumps back at line %d: two surfaces", pointLines[k]))
		out.Notes = p.notes
		return out, nil
	}
	if out.Layout == "" {
		out.Layout = LayoutLoop
	}
	out.Points, out.Lines = pts, pointLines
	p.notes = append(p.notes, fmt.Sprintf("one loop of %d points, taken in the order listed", len(pts)))
	out.Notes = p.notes
	return out, nil
}

func lineText(r record) string {
	var b strings.Builder
	for _, f := range r.fields {
		b.WriteString(f.text)
	}
	return b.String()
}

// isCount reports whether v is an integer of at least lo and at most
// MaxPoints.
func isCount(v float64, lo int) bool {
	return v == math.Trunc(v) && v >= float64(lo) && v <= MaxPoints
}

// outsideBox reports whether q lies outside the bounding box of pts by more
// than countLineMargin of the box's larger side.
func outsideBox(q Point, pts []Point) bool {
	if len(pts) == 0 {
		return false
	}
	box := BoxOf(pts...)
	lo, hi := box.Min, box.Max
	m := countLineMargin * math.Max(hi.X-lo.X, hi.Y-lo.Y)
	return q.X > hi.X+m || q.X < lo.X-m || q.Y > hi.Y+m || q.Y < lo.Y-m
}

// surfaceSplit recognises two uncounted surfaces: x runs from one end of
// its range to the other, jumps back across at least surfaceJumpFrac of
// the range, and runs end to end again. It returns the index of the first
// point of the second surface.
func surfaceSplit(pts []Point) (int, bool) {
	box := BoxOf(pts...)
	lo, hi := box.Min, box.Max
	rx := hi.X - lo.X
	if rx <= 0 {
		return 0, false
	}
	nearLo := func(x float64) bool { return x <= lo.X+surfaceEndFrac*rx }
	nearHi := func(x float64) bool { return x >= hi.X-surfaceEndFrac*rx }
	n := len(pts)
	for _, fromLE := range []bool{true, false} {
		start, end := nearLo, nearHi
		if !fromLE {
			start, end = nearHi, nearLo
		}
		if !start(pts[0].X) || !end(pts[n-1].X) {
			continue
		}
		split, jumps := -1, 0
		for k := 1; k < n; k++ {
			if end(pts[k-1].X) && start(pts[k].X) && math.Abs(pts[k].X-pts[k-1].X) >= surfaceJumpFrac*rx {
				split, jumps = k, jumps+1
			}
		}
		if jumps == 1 && split >= 2 && n-split >= 2 {
			return split, true
		}
	}
	return 0, false
}

// joinSurfaces joins two surfaces into one loop in the file's traversal:
// the first surface run towards the leading edge, then the second run away
// from it. Which surface is upper follows from the sign of the enclosed
// area (positive, counter-clockwise, when the first one is upper).
func joinSurfaces(a, b []Point, notes []string, what string) ([]Point, []string) {
	dir := func(s []Point) string {
		if s[0].X <= s[len(s)-1].X {
			return "from the leading edge"
		}
		return "from the trailing edge"
	}
	da, db := dir(a), dir(b)
	loop := joinedLoop(a, b, a, b)
	first, second := "upper", "lower"
	if PolygonArea(loop) < 0 {
		first, second = "lower", "upper"
	}
	listed := "listed " + da
	if da != db {
		listed = fmt.Sprintf("the first listed %s, the second %s", da, db)
	}
	notes = append(notes, fmt.Sprintf("%s, %s (%d %s, %d %s points; %s surface first); joined into one loop at the leading edge",
		what, listed, len(a), first, len(b), second, first))
	return loop, notes
}

// joinedLoop orders va and vb, which belong to the points of two
// surfaces a and b, as one loop joined at the leading edge: the first
// surface run towards the leading edge (reversed if it starts there),
// then the second away from it (reversed if it ends there). joinSurfaces
// orders the points with it, Parse their file lines.
func joinedLoop[T any](a, b []Point, va, vb []T) []T {
	loop := make([]T, 0, len(va)+len(vb))
	if a[0].X <= a[len(a)-1].X {
		for i := len(va) - 1; i >= 0; i-- {
			loop = append(loop, va[i])
		}
	} else {
		loop = append(loop, va...)
	}
	if b[0].X <= b[len(b)-1].X {
		return append(loop, vb...)
	}
	for i := len(vb) - 1; i >= 0; i-- {
		loop = append(loop, vb[i])
	}
	return loop
}

// cleanName trims a name line, drops control characters and limits it to
// MaxNameBytes.
func cleanName(s string) string {
	s = strings.Map(func(r rune) rune {
		if unicode.IsControl(r) {
			return ' '
		}
		return r
	}, s)
	s = strings.Join(strings.Fields(s), " ")
	return clip(s, MaxNameBytes)
}

// clip shortens s to at most n bytes at a rune boundary, marking the cut.
func clip(s string, n int) string {
	if len(s) <= n {
		return s
	}
	for n > 0 && !utf8.RuneStart(s[n]) {
		n--
	}
	return s[:n] + "…"
}

// nameFromSource returns the base name of a path without its extension.
func nameFromSource(src string) string {
	if i := strings.LastIndexAny(src, `/\`); i >= 0 {
		src = src[i+1:]
	}
	if i := strings.LastIndexByte(src, '.'); i > 0 {
		src = src[:i]
	}
	if src = cleanName(src); src == "" {
		return "unnamed"
	}
	return src
}

// dToE turns a Fortran exponent letter into E.
func dToE(r rune) rune {
	if r == 'd' || r == 'D' {
		return 'e'
	}
	return r
}
