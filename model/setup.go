package model

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Set-up variables are what a map or a setting search varies: the angle of
// attack, the ground clearance, the speed, and each flap's deflection,
// gap and overlap. They are named by their path in the study, in the
// as-mounted frame (FrameText):
//
//	alpha_deg                 flow.alpha_deg, degrees (AngleSense)
//	clearance_mm              ground.clearance_mm, millimetres (ground on)
//	speed_mps                 flow.speed_mps, metres per second
//	elements[K].deflection_deg  element K's chord angle relative to element K−1, degrees (Slot)
//	elements[K].gap_mm          the slot's gap behind element K−1, millimetres (Slot)
//	elements[K].overlap_mm      the slot's overlap with element K−1, millimetres (Slot)
//
// K counts from 0, the main element; the slot variables need K ≥ 1 (the
// main element has no element before it: vary alpha_deg to turn it).
// Changing a slot keeps the slot's other two quantities and moves the
// elements behind element K with it (PlaceSlot), as the window's slot
// fields do.

// SuctionSurface names an element's suction side as mounted: "upper" on
// an upright wing, "lower" on an inverted one (the separation a map and a
// search judge is this side's).
func SuctionSurface(inverted bool) string {
	if inverted {
		return "lower"
	}
	return "upper"
}

// SetupKind is the kind of a set-up variable.
type SetupKind int

// The set-up variables' kinds.
const (
	SetupAlpha SetupKind = iota + 1
	SetupClearance
	SetupSpeed
	SetupDeflection
	SetupGap
	SetupOverlap
)

// setupNames are the variables' names (the per-element ones after
// "elements[K].") and units.
var setupNames = map[SetupKind]struct{ name, unit, words string }{
	SetupAlpha:      {"alpha_deg", "°", "angle of attack"},
	SetupClearance:  {"clearance_mm", "mm", "ground clearance"},
	SetupSpeed:      {"speed_mps", "m/s", "speed"},
	SetupDeflection: {"deflection_deg", "°", "deflection"},
	SetupGap:        {"gap_mm", "mm", "gap"},
	SetupOverlap:    {"overlap_mm", "mm", "overlap"},
}

// SetupVariable is one set-up variable: a kind and, for the slot
// variables, the element (K ≥ 1).
type SetupVariable struct {
	Kind    SetupKind
	Element int
}

// PerElement reports whether the variable belongs to an element's slot.
func (v SetupVariable) PerElement() bool {
	return v.Kind == SetupDeflection || v.Kind == SetupGap || v.Kind == SetupOverlap
}

// Name returns the variable's study path, as ParseSetupVariable reads it.
func (v SetupVariable) Name() string {
	n, ok := setupNames[v.Kind]
	if !ok {
		panic(fmt.Sprintf("model: SetupVariable: unknown kind %d", v.Kind))
	}
	if v.PerElement() {
		return fmt.Sprintf("elements[%d].%s", v.Element, n.name)
	}
	return n.name
}

// String is Name.
func (v SetupVariable) String() string { return v.Name() }

// Unit returns the variable's unit: "°", "mm" or "m/s".
func (v SetupVariable) Unit() string { return setupNames[v.Kind].unit }

// Label returns the variable in words for a figure's axis, with the
// element's name from st when it has one: "flap deflection (°)".
func (v SetupVariable) Label(st *Study) string {
	return v.Words(st) + " (" + v.Unit() + ")"
}

// Words returns the variable in words without its unit, "flap
// deflection": the labels of the set-up window's settings and pins.
func (v SetupVariable) Words(st *Study) string {
	w := setupNames[v.Kind].words
	if v.PerElement() {
		name := fmt.Sprintf("element %d", v.Element)
		if st != nil && v.Element < len(st.Elements) && st.Elements[v.Element].Name != "" {
			name = st.Elements[v.Element].Name
		}
		w = name + " " + w
	}
	return w
}

// Setting returns the variable set to x in words, as the pins, the undo
// labels and the search's readouts name a setting: "flap deflection 15
// °", x to four significant digits with a true minus sign. The command
// line's pins name it so too.
func (v SetupVariable) Setting(st *Study, x float64) string {
	return v.Words(st) + " " + Minus(strconv.FormatFloat(x, 'g', 4, 64)) + " " + v.Unit()
}

// SetupError reports a set-up variable or range that cannot be used,
// naming the variable as the user wrote it.
type SetupError struct {
	Variable string // as written (the whole argument when no name could be read)
	Err      error
}

func (e *SetupError) Error() string { return e.Variable + ": " + e.Err.Error() }

func (e *SetupError) Unwrap() error { return e.Err }

// The reasons a SetupError wraps.
var (
	ErrUnknownVariable = errors.New("not a set-up variable (want alpha_deg, clearance_mm, speed_mps, elements[K].deflection_deg, elements[K].gap_mm or elements[K].overlap_mm)")
	ErrSetupRange      = errors.New("bad range")
	ErrNotInStudy      = errors.New("the study has no such setting")
	ErrRepeatedVar     = errors.New("varied twice")
)

// ParseSetupVariable reads a variable's name (Name). A name it does not
// know returns a *SetupError wrapping ErrUnknownVariable.
func ParseSetupVariable(name string) (SetupVariable, error) {
	s := strings.TrimSpace(name)
	for k, n := range setupNames {
		if s == n.name && k != SetupDeflection && k != SetupGap && k != SetupOverlap {
			return SetupVariable{Kind: k}, nil
		}
	}
	if rest, ok := strings.CutPrefix(s, "elements["); ok {
		idx, field, ok := strings.Cut(rest, "].")
		k, err := strconv.Atoi(idx)
		if ok && err == nil && k >= 0 && idx == strconv.Itoa(k) {
			for kind, n := range setupNames {
				if field == n.name && (kind == SetupDeflection || kind == SetupGap || kind == SetupOverlap) {
					return SetupVariable{Kind: kind, Element: k}, nil
				}
			}
		}
	}
	return SetupVariable{}, &SetupError{Variable: s, Err: ErrUnknownVariable}
}

// Limits of a map: MaxSetupValues values per variable and MaxMapPoints in
// all. A coupled viscous point takes of the order of a second on a
// two-core machine today, so a map of MaxMapPoints already runs for the
// better part of an hour; more is a typing mistake.
const (
	MaxSetupValues = 201
	MaxMapPoints   = 2500
)

// SetupRange is a variable with the values a map visits (From to To in
// Step, end included) or, with Step 0, the bounds Lo = From, Hi = To a
// search keeps to.
type SetupRange struct {
	Var            SetupVariable
	From, To, Step float64
}

// Values returns the range's values, end included to within a small
// fraction of a step (so 0:1:0.1 includes 1); the bounds for a range
// without a step.
func (r SetupRange) Values() []float64 {
	if r.Step == 0 {
		return []float64{r.From, r.To}
	}
	n := int((r.To-r.From)/r.Step+1e-9) + 1
	v := make([]float64, n)
	for i := range v {
		v[i] = decimal(r.From + float64(i)*r.Step)
	}
	return v
}

// decimal rounds x to 12 significant digits, so that a grid value typed
// in decimals is that decimal (0 + 3 × 0.1 is 0.3, not
// 0.30000000000000004) and a point of a map is the same setting as the
// number a user types for `solve`.
func decimal(x float64) float64 {
	y, err := strconv.ParseFloat(strconv.FormatFloat(x, 'g', 12, 64), 64)
	if err != nil {
		panic("model: decimal: " + err.Error())
	}
	return y
}

// ParseSetupRange reads NAME=FROM:TO:STEP, a map's range: FROM ≤ TO, STEP
// positive, at most MaxSetupValues values.
func ParseSetupRange(spec string) (SetupRange, error) {
	return parseSetup(spec, 3)
}

// ParseSetupBounds reads NAME=LO:HI, a search's bounds: LO < HI.
func ParseSetupBounds(spec string) (SetupRange, error) {
	return parseSetup(spec, 2)
}

func parseSetup(spec string, parts int) (SetupRange, error) {
	want := "NAME=FROM:TO:STEP"
	if parts == 2 {
		want = "NAME=LO:HI"
	}
	name, nums, ok := strings.Cut(spec, "=")
	if !ok {
		return SetupRange{}, &SetupError{Variable: strings.TrimSpace(spec), Err: fmt.Errorf("%w: want %s", ErrSetupRange, want)}
	}
	v, err := ParseSetupVariable(name)
	if err != nil {
		return SetupRange{}, err
	}
	bad := func(format string, a ...any) error {
		return &SetupError{Variable: v.Name(), Err: fmt.Errorf("%w %q: %s", ErrSetupRange, nums, fmt.Sprintf(format, a...))}
	}
	fs := strings.Split(nums, ":")
	if len(fs) != parts {
		return SetupRange{}, bad("want %s", want)
	}
	x := make([]float64, parts)
	for i, f := range fs {
		x[i], err = strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil || math.IsNaN(x[i]) || math.IsInf(x[i], 0) {
			return SetupRange{}, bad("%q is not a number", f)
		}
	}
	r := SetupRange{Var: v, From: x[0], To: x[1]}
	if parts == 2 {
		if !(r.From < r.To) {
			return SetupRange{}, bad("the lower bound must be below the upper")
		}
		return r, nil
	}
	r.Step = x[2]
	switch {
	case !(r.Step > 0):
		return SetupRange{}, bad("the step must be positive")
	case r.To < r.From:
		return SetupRange{}, bad("%g is below %g", r.To, r.From)
	case (r.To-r.From)/r.Step+1 > MaxSetupValues:
		return SetupRange{}, bad("more than %d values", MaxSetupValues)
	}
	return r, nil
}

// CheckSetup reports ranges that cannot be used on st together: a
// variable twice, an element the study does not have, a slot variable of
// the main element, the clearance of a study in free air, or a grid of
// more than MaxMapPoints points (map ranges only). Each error is a
// *SetupError naming the variable.
func (st *Study) CheckSetup(ranges []SetupRange) error {
	seen := map[SetupVariable]bool{}
	points := 1
	for _, r := range ranges {
		v := r.Var
		if seen[v] {
			return &SetupError{Variable: v.Name(), Err: ErrRepeatedVar}
		}
		seen[v] = true
		if err := st.checkSetupVar(v); err != nil {
			return err
		}
		if r.Step > 0 {
			points *= len(r.Values())
		}
	}
	if points > MaxMapPoints {
		return &SetupError{Variable: ranges[len(ranges)-1].Var.Name(), Err: fmt.Errorf("%w: %d points in all; a map holds at most %d", ErrSetupRange, points, MaxMapPoints)}
	}
	return nil
}

func (st *Study) checkSetupVar(v SetupVariable) error {
	switch {
	case v.PerElement() && v.Element >= len(st.Elements):
		return &SetupError{Variable: v.Name(), Err: fmt.Errorf("%w: the study has %d elements (elements[0] to elements[%d])", ErrNotInStudy, len(st.Elements), len(st.Elements)-1)}
	case v.PerElement() && v.Element == 0:
		return &SetupError{Variable: v.Name(), Err: fmt.Errorf("%w: elements[0] is the main element, which has no element before it (vary alpha_deg to turn it)", ErrNotInStudy)}
	case v.Kind == SetupClearance && !st.Ground.Enabled:
		return &SetupError{Variable: v.Name(), Err: fmt.Errorf("%w: the study is in free air (turn the ground on to vary the clearance)", ErrNotInStudy)}
	}
	return nil
}

// SetupValue returns the variable's value in st; secs are the study's
// cleaned unit-chord sections (the gap depends on the flap's shape). It
// panics if the variable is not in the study (CheckSetup).
func (st *Study) SetupValue(v SetupVariable, secs []*Section) float64 {
	if err := st.checkSetupVar(v); err != nil {
		panic("model: SetupValue: " + err.Error())
	}
	switch v.Kind {
	case SetupAlpha:
		return st.Flow.AlphaDeg
	case SetupClearance:
		return st.Ground.ClearanceMM
	case SetupSpeed:
		return st.Flow.SpeedMPS
	}
	s := st.SlotOf(v.Element, secs[v.Element])
	switch v.Kind {
	case SetupDeflection:
		return s.DeflectionDeg
	case SetupGap:
		return s.GapMM
	}
	return s.OverlapMM
}

// ApplySetup sets the variable to x in st; secs are the study's cleaned
// unit-chord sections. A slot keeps its other two quantities and the
// elements behind follow (PlaceSlot). It returns a *SetupError when the
// variable is not in the study or the value cannot be set (a speed that
// is not positive, a gap the flap cannot reach: ErrSlotGap), leaving st
// unchanged; the study's own ranges are Validate's to check.
func (st *Study) ApplySetup(v SetupVariable, x float64, secs []*Section) error {
	if err := st.checkSetupVar(v); err != nil {
		return err
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return &SetupError{Variable: v.Name(), Err: errNotFinite}
	}
	switch v.Kind {
	case SetupAlpha:
		st.Flow.AlphaDeg = x
		return nil
	case SetupClearance:
		st.Ground.ClearanceMM = x
		return nil
	case SetupSpeed:
		if !(x > 0) {
			return &SetupError{Variable: v.Name(), Err: fmt.Errorf("%g m/s: the speed must be positive", x)}
		}
		st.Flow.SpeedMPS = x
		return nil
	}
	s := st.SlotOf(v.Element, secs[v.Element])
	switch v.Kind {
	case SetupDeflection:
		s.DeflectionDeg = x
	case SetupGap:
		s.GapMM = x
	case SetupOverlap:
		s.OverlapMM = x
	}
	if err := st.PlaceSlot(v.Element, secs[v.Element], s); err != nil {
		return &SetupError{Variable: v.Name(), Err: err}
	}
	return nil
}

// ApplySetupAll sets each variable to its value in turn (ApplySetup);
// vars and values are parallel. On an error st may hold some of the
// values: apply to a clone.
func (st *Study) ApplySetupAll(vars []SetupVariable, values []float64, secs []*Section) error {
	if len(vars) != len(values) {
		panic("model: ApplySetupAll: one value per variable needed")
	}
	for i, v := range vars {
		if err := st.ApplySetup(v, values[i], secs); err != nil {
			return err
		}
	}
	return nil
}
