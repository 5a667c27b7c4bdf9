package model

import (
	"fmt"
	"math"
	"strings"
	"unicode/utf8"
)

// NACACode is a parsed NACA 4- or 5-digit designation.
//
// For a 4-digit section MPTT (Abbott & von Doenhoff, Theory of Wing
// Sections, 1959, sec. 6.4): MaxCamber = M/100, CamberPos = P/10,
// Thickness = TT/100.
//
// For a 5-digit section LPQTT (ibid., sec. 6.5): the design lift
// coefficient is DesignCl = 0.15·L, the maximum camber lies near
// CamberPos = P/20, Q = 1 marks a reflexed mean line and Thickness = TT/100.
// MaxCamber is the largest ordinate of the mean line, computed from it.
type NACACode struct {
	Designation string  // the digits only, e.g. "23012"
	Family      int     // 4 or 5
	MaxCamber   float64 // largest mean-line ordinate, fraction of chord
	CamberPos   float64 // chordwise position of MaxCamber (nominal for 5-digit)
	Thickness   float64 // maximum thickness, fraction of chord
	Reflexed    bool    // 5-digit reflexed mean line (Q = 1)
	DesignCl    float64 // 5-digit design lift coefficient; 0 for 4-digit

	// 5-digit mean-line constants from the published tables.
	m, k1, k2k1 float64
}

// MaxNACAThickness is the thickest section (fraction of chord) ParseNACA
// accepts. The published 4- and 5-digit sections stop at 24% (Abbott & von
// Doenhoff 1959, App. I); beyond 40% the thickness formula, applied
// perpendicular to a cambered mean line, folds the lower surface near the
// leading edge. The limit is a project choice.
const MaxNACAThickness = 0.40

// NACAError reports a designation ParseNACA rejects.
type NACAError struct {
	Designation string // as given
	Pos         int    // 0-based index of the offending character, or -1
	Reason      string
}

func (e *NACAError) Error() string {
	if e.Pos >= 0 {
		return fmt.Sprintf("NACA %q: character %d %s", e.Designation, e.Pos+1, e.Reason)
	}
	return fmt.Sprintf("NACA %q: %s", e.Designation, e.Reason)
}

// fiveDigitLine holds the constants of one 5-digit mean line: the standard
// lines of Abbott & von Doenhoff (1959), sec. 6.5 and App. II, for design
// lift coefficient 0.3, and the reflexed lines (k2/k1 ≠ 0) designed for zero
// pitching moment. Values as reproduced widely from those tables (recalled,
// not re-read against the book: the tests check them against thin-airfoil
// theory, which is how they were derived).
type fiveDigitLine struct {
	m, k1, k2k1 float64
}

var fiveDigitLines = map[string]fiveDigitLine{
	// Standard: camber position digit P, x_max = P/20.
	"210": {0.0580, 361.400, 0},
	"220": {0.1260, 51.640, 0},
	"230": {0.2025, 15.957, 0},
	"240": {0.2900, 6.643, 0},
	"250": {0.3910, 3.230, 0},
	// Reflexed.
	"221": {0.1300, 51.990, 0.000764},
	"231": {0.2170, 15.793, 0.00677},
	"241": {0.3180, 6.520, 0.0303},
	"251": {0.4410, 3.191, 0.1355},
}

// fiveDigitDesignCl is the design lift coefficient of the tabulated lines
// (first digit 2: 0.15·2).
const fiveDigitDesignCl = 0.3

// ParseNACA parses a 4- or 5-digit NACA designation. It accepts an optional
// "NACA" prefix in any case, followed by optional blanks (spaces, tabs) or a
// hyphen, and surrounding blanks: "2412", "NACA 2412", "naca2412",
// "NACA-23012".
//
// It rejects, with a *NACAError naming the character where possible:
// anything but 4 or 5 digits; a zero or too large thickness; a 4-digit code
// with camber but camber position 0, or a position without camber; a
// 5-digit code whose mean line (first three digits) is not one of the
// published lines 210, 220, 230, 240, 250 or reflexed 221, 231, 241, 251.
func ParseNACA(designation string) (NACACode, error) {
	bad := func(pos int, format string, a ...any) (NACACode, error) {
		if pos >= 0 {
			pos = utf8.RuneCountInString(designation[:pos]) // byte to character index
		}
		return NACACode{}, &NACAError{Designation: designation, Pos: pos, Reason: fmt.Sprintf(format, a...)}
	}
	blank := func(c byte) bool { return c == ' ' || c == '\t' }
	start := 0
	for start < len(designation) && blank(designation[start]) {
		start++
	}
	if len(designation)-start >= 4 && strings.EqualFold(designation[start:start+4], "naca") {
		start += 4
		for start < len(designation) && (blank(designation[start]) || designation[start] == '-') {
			start++
		}
	}
	end := len(designation)
	for end > start && blank(designation[end-1]) {
		end--
	}
	digits := designation[start:end]
	for i := range len(digits) {
		if digits[i] < '0' || digits[i] > '9' {
			return bad(start+i, "must be a digit")
		}
	}
	switch len(digits) {
	case 4, 5:
	case 0:
		return bad(-1, "no digits (want 4 or 5, e.g. 2412 or 23012)")
	default:
		return bad(-1, "has %d digits, want 4 or 5", len(digits))
	}
	d := func(i int) int { return int(digits[i] - '0') }
	n := len(digits)
	tt := 10*d(n-2) + d(n-1)
	if tt == 0 {
		return bad(start+n-2, "begins a zero thickness (last two digits 00)")
	}
	if float64(tt)/100 > MaxNACAThickness {
		return bad(start+n-2, "begins a thickness of %d%%, above the %g%% limit", tt, 100*MaxNACAThickness)
	}
	c := NACACode{Designation: digits, Family: n, Thickness: float64(tt) / 100}
	if n == 4 {
		m, p := d(0), d(1)
		switch {
		case m > 0 && p == 0:
			return bad(start+1, "is a camber position of 0 with camber %d%%; a cambered 4-digit section needs 1-9", m)
		case m == 0 && p > 0:
			return bad(start+1, "is a camber position of %d0%% without camber (first digit 0)", p)
		}
		c.MaxCamber, c.CamberPos = float64(m)/100, float64(p)/10
		return c, nil
	}
	line, ok := fiveDigitLines[digits[:3]]
	if !ok {
		switch {
		case d(0) != 2:
			return bad(start, "must be 2: only the published mean lines of design lift coefficient 0.3 are known (210-250, reflexed 221-251)")
		case d(2) > 1:
			return bad(start+2, "must be 0 (standard) or 1 (reflexed mean line)")
		case d(2) == 1:
			return bad(start+1, "must be 2-5 for a reflexed mean line (published: 221, 231, 241, 251)")
		default:
			return bad(start+1, "must be 1-5: the camber position digit of a published mean line (210-250)")
		}
	}
	c.Reflexed = line.k2k1 != 0
	c.DesignCl = fiveDigitDesignCl
	c.CamberPos = float64(d(1)) / 20
	c.m, c.k1, c.k2k1 = line.m, line.k1, line.k2k1
	c.MaxCamber = c.maxOrdinate()
	return c, nil
}

// String returns "NACA " and the digits.
func (c NACACode) String() string { return "NACA " + c.Designation }

// Camber returns the mean-line ordinate z and slope dz/dx at x in [0, 1].
//
// 4-digit (Abbott & von Doenhoff 1959, sec. 6.4), m = MaxCamber,
// p = CamberPos:
//
//	z = m/p² (2px − x²)                 for x < p
//	z = m/(1−p)² ((1 − 2p) + 2px − x²)  for x ≥ p
//
// 5-digit standard (ibid., sec. 6.5), constants m, k1 from the tables:
//
//	z = k1/6 (x³ − 3m x² + m²(3 − m) x)  for x < m
//	z = k1 m³/6 (1 − x)                   for x ≥ m
//
// 5-digit reflexed, r = k2/k1:
//
//	z = k1/6 ((x − m)³ − r(1 − m)³ x − m³ x + m³)    for x < m
//	z = k1/6 (r(x − m)³ − r(1 − m)³ x − m³ x + m³)   for x ≥ m
func (c NACACode) Camber(x float64) (z, slope float64) {
	if c.Family == 4 {
		m, p := c.MaxCamber, c.CamberPos
		if m == 0 {
			return 0, 0
		}
		if x < p {
			return m / (p * p) * (2*p*x - x*x), 2 * m / (p * p) * (p - x)
		}
		q := (1 - p) * (1 - p)
		return m / q * ((1 - 2*p) + 2*p*x - x*x), 2 * m / q * (p - x)
	}
	m, k1, r := c.m, c.k1, c.k2k1
	if !c.Reflexed {
		if x < m {
			return k1 / 6 * (x*x*x - 3*m*x*x + m*m*(3-m)*x), k1 / 6 * (3*x*x - 6*m*x + m*m*(3-m))
		}
		return k1 * m * m * m / 6 * (1 - x), -k1 * m * m * m / 6
	}
	a := (1 - m) * (1 - m) * (1 - m)
	xm := x - m
	if x < m {
		return k1 / 6 * (xm*xm*xm - r*a*x - m*m*m*x + m*m*m), k1 / 6 * (3*xm*xm - r*a - m*m*m)
	}
	return k1 / 6 * (r*xm*xm*xm - r*a*x - m*m*m*x + m*m*m), k1 / 6 * (3*r*xm*xm - r*a - m*m*m)
}

// maxOrdinate returns the largest mean-line ordinate of a 5-digit line. On
// x < m the slope is a quadratic in x; its smaller root is the maximum
// (the standard line's x ≥ m part falls linearly, and the reflexed line's
// part beyond m lies below its value at m).
func (c NACACode) maxOrdinate() float64 {
	m, r := c.m, c.k2k1
	// 3(x − m)² = r(1 − m)³ + m³ (reflexed) or 3x² − 6mx + m²(3 − m) = 0.
	var x float64
	if c.Reflexed {
		x = m - math.Sqrt((r*(1-m)*(1-m)*(1-m)+m*m*m)/3)
	} else {
		x = m * (1 - math.Sqrt(m/3))
	}
	z, _ := c.Camber(x)
	return z
}

// NACA 4-digit thickness coefficients (Abbott & von Doenhoff 1959, sec.
// 6.4, eq. 6.2): y_t = 5t(a0√x + a1x + a2x² + a3x³ + a4x⁴), with
// y_t(1) = 0.0105t, an open trailing edge. Replacing a4 by
// naca4CloseA4 closes the trailing edge (common practice).
const (
	naca4A0      = 0.2969
	naca4A1      = -0.1260
	naca4A2      = -0.3516
	naca4A3      = 0.2843
	naca4A4      = -0.1015
	naca4CloseA4 = -0.1036
)

// HalfThickness returns the 4-digit thickness distribution y_t(x), half the
// thickness at x in [0, 1] measured perpendicular to the mean line:
//
//	y_t = 5t (0.2969√x − 0.1260x − 0.3516x² + 0.2843x³ − 0.1015x⁴)
//
// (Abbott & von Doenhoff 1959, sec. 6.4). With closedTE the last
// coefficient is −0.1036, which makes y_t(1) = 0 (common practice). The
// 5-digit sections use the same distribution (ibid., sec. 6.5).
func (c NACACode) HalfThickness(x float64, closedTE bool) float64 {
	a4 := naca4A4
	if closedTE {
		if x == 1 {
			return 0 // exactly, not the rounding of the coefficient sum
		}
		a4 = naca4CloseA4
	}
	return 5 * c.Thickness * (naca4A0*math.Sqrt(x) + x*(naca4A1+x*(naca4A2+x*(naca4A3+x*a4))))
}

// NACAOptions controls NACA's output.
type NACAOptions struct {
	// PointsPerSurface counts the points on each surface including both
	// ends; the leading-edge point is shared, so a section has
	// 2·PointsPerSurface − 1 points. 0 means DefaultNACAPoints.
	PointsPerSurface int
	// ClosedTE uses the closed-trailing-edge thickness coefficient.
	ClosedTE bool
}

// Limits on NACAOptions.PointsPerSurface.
const (
	DefaultNACAPoints = 121
	MinNACAPoints     = 3 // 2·3 − 1 = MinSectionPoints
	MaxNACAPoints     = 5001
)

// NACA returns the section of a 4- or 5-digit designation (see ParseNACA),
// named like "NACA 2412".
//
// Stations are cosine-spaced, x_i = (1 − cos(πi/(N−1)))/2, i = 0..N−1, and
// the thickness is laid off perpendicular to the mean line (Abbott & von
// Doenhoff 1959, sec. 6.4, eq. 6.1): with θ = atan(dz/dx),
//
//	upper: (x − y_t sin θ, z + y_t cos θ)
//	lower: (x + y_t sin θ, z − y_t cos θ).
//
// Points run from the trailing edge over the upper surface to the leading
// edge (0, 0), shared by both surfaces, and back along the lower surface.
// The chord joins (0, 0) and the trailing-edge midpoint (1, 0). On a
// cambered section the upper surface bulges slightly ahead of x = 0 near the
// leading edge, a property of the definition.
func NACA(designation string, opt NACAOptions) (*Section, error) {
	code, err := ParseNACA(designation)
	if err != nil {
		return nil, err
	}
	n := opt.PointsPerSurface
	if n == 0 {
		n = DefaultNACAPoints
	}
	if n < MinNACAPoints || n > MaxNACAPoints {
		return nil, &FieldError{Field: "points_per_surface", Err: fmt.Errorf("%d is outside %d..%d", n, MinNACAPoints, MaxNACAPoints)}
	}
	pts := make([]Point, 2*n-1)
	for i := range n {
		x := 0.5 * (1 - math.Cos(math.Pi*float64(i)/float64(n-1)))
		if i == n-1 {
			x = 1 // exactly, whatever cos(π) rounds to
		}
		z, dz := code.Camber(x)
		yt := code.HalfThickness(x, opt.ClosedTE)
		th := math.Atan(dz)
		s, c := math.Sincos(th)
		pts[n-1-i] = Point{x - yt*s, z + yt*c}
		pts[n-1+i] = Point{x + yt*s, z - yt*c}
	}
	return NewSection(code.String(), pts)
}
