package model

import (
	"errors"
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Limits on every text and list in a study, enforced at load (Validate),
// so that a hostile or damaged file is refused at once instead of stalling
// the app (a 100 000-character pin label froze its text wrapping; 400 000
// embedded points took 11 s to clean).
const (
	// MaxStudyTextChars bounds a name, team, label or side: a line of a
	// title bar or a table cell.
	MaxStudyTextChars = 200
	// MaxSpecChars bounds a section spec, which may be a file path
	// (PATH_MAX on Linux is 4096 bytes).
	MaxSpecChars = 4096
	// MaxPinCurves bounds a pin's Cp curves: one per element and surface.
	MaxPinCurves = 2 * MaxElements
	// MaxPinCurvePoints bounds one Cp curve: a point per panel.
	MaxPinCurvePoints = MaxPanels + 1
)

// ErrTooLong reports a text or list longer than its limit.
var ErrTooLong = errors.New("too long")

// checkText refuses a text over max characters or one holding a control
// character (a line break, a tab), which has no place in a one-line name.
func checkText(field, s string, max int) error {
	if n := utf8.RuneCountInString(s); n > max {
		return &FieldError{Field: field, Err: fmt.Errorf("%d characters, at most %d: %w", n, max, ErrTooLong)}
	}
	if i := strings.IndexFunc(s, unicode.IsControl); i >= 0 {
		return &FieldError{Field: field, Err: fmt.Errorf("a control character (line break, tab or similar) at character %d; names are one line", utf8.RuneCountInString(s[:i])+1)}
	}
	return nil
}

// checkList refuses a list over max items.
func checkList(field string, n, max int, what string) error {
	if n > max {
		return &FieldError{Field: field, Err: fmt.Errorf("%d %s, at most %d: %w", n, what, max, ErrTooLong)}
	}
	return nil
}

// checkLimits enforces the limits on texts and lists, naming the field.
func (st *Study) checkLimits() error {
	for _, t := range []struct{ field, s string }{{"name", st.Name}, {"team", st.Team}} {
		if err := checkText(t.field, t.s, MaxStudyTextChars); err != nil {
			return err
		}
	}
	if err := checkList("elements", len(st.Elements), MaxElements, "elements"); err != nil {
		return err
	}
	for i, e := range st.Elements {
		f := func(name string) string { return fmt.Sprintf("elements[%d].%s", i, name) }
		if err := checkText(f("name"), e.Name, MaxStudyTextChars); err != nil {
			return err
		}
		if err := checkText(f("section"), e.Section.Spec, MaxSpecChars); err != nil {
			return err
		}
		if em := e.Section.Embedded; em != nil {
			if err := checkText(f("section.name"), em.Name, MaxNameBytes); err != nil {
				return err
			}
			if err := checkList(f("section.points"), len(em.Points), MaxPoints, "points"); err != nil {
				return err
			}
		}
	}
	if err := checkList("pins", len(st.Pins), MaxPins, "pins"); err != nil {
		return err
	}
	for i, p := range st.Pins {
		f := func(name string) string { return fmt.Sprintf("pins[%d].%s", i, name) }
		if err := checkText(f("label"), p.Label, MaxStudyTextChars); err != nil {
			return err
		}
		if err := checkList(f("cp"), len(p.Cp), MaxPinCurves, "curves"); err != nil {
			return err
		}
		if err := checkList(f("polar"), len(p.Polar), MaxSweepAngles, "rows"); err != nil {
			return err
		}
		for j, c := range p.Cp {
			g := func(name string) string { return fmt.Sprintf("pins[%d].cp[%d].%s", i, j, name) }
			for _, t := range []struct{ field, s string }{{g("element"), c.Element}, {g("side"), c.Side}} {
				if err := checkText(t.field, t.s, MaxStudyTextChars); err != nil {
					return err
				}
			}
			if err := checkList(g("points"), len(c.Points), MaxPinCurvePoints, "points"); err != nil {
				return err
			}
		}
	}
	return nil
}
