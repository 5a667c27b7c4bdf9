package session

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"sectionbench/model"
)

// Element editing: the controller's side. Each method is one study edit;
// placements go through model.Study.SetElement and model.Study.PlaceSlot,
// so no geometry is computed here.

// newFlapName is the name of an added element, numbered when taken.
const newFlapName = "flap"

// AddElement adds a flap behind the last element, with the default
// proportions (see newFlap), and selects it. It fails when the study holds
// model.MaxElements already or the new flap cannot be placed.
func (c *Controller) AddElement() error {
	st := c.editing()
	n := len(st.Elements)
	if n >= model.MaxElements {
		return fmt.Errorf("a study holds at most %d elements", model.MaxElements)
	}
	name := uniqueElementName(st, newFlapName)
	err := c.edit("", func(s *model.Study) {
		s.AppendFlap(name)
	}, func() { c.elem = n })
	if err != nil {
		return fmt.Errorf("no room for a flap behind %q: %w", st.Elements[n-1].Name, err)
	}
	return nil
}

// uniqueElementName returns base, or base followed by the first number
// that no element of st is named yet.
func uniqueElementName(st *model.Study, base string) string {
	taken := map[string]bool{}
	for _, e := range st.Elements {
		taken[e.Name] = true
	}
	if !taken[base] {
		return base
	}
	for k := 2; ; k++ {
		if s := base + " " + strconv.Itoa(k); !taken[s] {
			return s
		}
	}
}

// ErrLastElement is returned when removing the only element.
var ErrLastElement = errors.New("a study needs at least one element; the last one cannot be removed")

// RemoveElement removes element i. The other elements stay where they are.
func (c *Controller) RemoveElement(i int) error {
	if err := c.editIndex(i); err != nil {
		return err
	}
	n := len(c.editing().Elements)
	if n == 1 {
		return ErrLastElement
	}
	return c.edit("", func(s *model.Study) {
		s.Elements = append(s.Elements[:i], s.Elements[i+1:]...)
	}, func() { c.elem = min(i, n-2) })
}

// MoveElement moves element i by delta places in the order (−1: up, one
// place towards the main element) and keeps it selected. Elements keep
// their positions; the order sets which element a flap's gap, overlap and
// deflection refer to, and the first is the main element the moment and
// the ground-effect pitch are taken about.
func (c *Controller) MoveElement(i, delta int) error {
	if err := c.editIndex(i); err != nil {
		return err
	}
	j := i + delta
	if j < 0 || j >= len(c.editing().Elements) {
		return fmt.Errorf("element %d cannot move %+d places", i+1, delta)
	}
	return c.edit("", func(s *model.Study) {
		s.Elements[i], s.Elements[j] = s.Elements[j], s.Elements[i]
	}, func() { c.elem = j })
}

func (c *Controller) checkIndex(i int) {
	if i < 0 || i >= len(c.state.study.Elements) {
		panic(fmt.Sprintf("session: element %d out of range", i))
	}
}

// errPlacing refuses an edit of an element that pending edits have
// removed (the user was quicker than the placement).
var errPlacing = errors.New("the elements are still being placed; try again")

// editIndex checks that element i of the study can be edited: it panics
// when the study has no element i, and returns errPlacing when the study
// the edit applies to (pending edits included) has none.
func (c *Controller) editIndex(i int) error {
	c.checkIndex(i)
	if i >= len(c.editing().Elements) {
		return errPlacing
	}
	return nil
}

// Placement is where an element sits: chord, leading edge and setting
// angle as mounted (mm, °; model.FrameText, model.AngleSense).
type Placement struct {
	ChordMM, XMM, YMM, AngleDeg float64
}

// PlacementOf returns element i's placement.
func (c *Controller) PlacementOf(i int) Placement {
	c.checkIndex(i)
	e := c.state.study.Elements[i]
	return Placement{ChordMM: e.ChordMM, XMM: e.XMM, YMM: e.YMM, AngleDeg: e.AngleDeg}
}

// SetPlacement places element i; the elements behind it follow, keeping
// their gap, overlap and deflection. key merges a run of typing.
func (c *Controller) SetPlacement(key string, i int, p Placement) error {
	if err := c.editIndex(i); err != nil {
		return err
	}
	return c.Edit(key, func(s *model.Study) {
		e := s.Elements[i]
		e.ChordMM, e.XMM, e.YMM, e.AngleDeg = p.ChordMM, p.XMM, p.YMM, p.AngleDeg
		s.SetElement(i, e)
	})
}

// SlotOf returns the gap, overlap and deflection of element i (not the
// first) behind element i−1, by the trade's definitions (model.Slot).
func (c *Controller) SlotOf(i int) model.Slot {
	c.checkIndex(i)
	if i == 0 {
		panic("session: the first element has no slot")
	}
	return c.state.study.SlotOf(i, c.state.sections[i])
}

// SetSlot places element i (not the first) at gap, overlap and deflection
// behind element i−1; the elements behind it follow.
func (c *Controller) SetSlot(key string, i int, sl model.Slot) error {
	if i == 0 {
		panic("session: the first element has no slot")
	}
	if err := c.editIndex(i); err != nil {
		return err
	}
	next := c.editing().Clone()
	if err := next.PlaceSlot(i, c.editingSections()[i], sl); err != nil {
		return err
	}
	return c.Edit(key, func(s *model.Study) { s.Elements = next.Elements })
}

// SetReferenceChord sets the chord of the configuration's coefficients in
// mm; 0 means the sum of the chords.
func (c *Controller) SetReferenceChord(key string, mm float64) error {
	return c.Edit(key, func(s *model.Study) { s.ReferenceChordMM = mm })
}

// SetElementName renames element i; names label the results, the report
// and the pins. key merges a run of typing.
func (c *Controller) SetElementName(key string, i int, name string) error {
	if err := c.editIndex(i); err != nil {
		return err
	}
	name = strings.TrimSpace(name)
	if name == "" {
		return errors.New("an element needs a name")
	}
	for j, e := range c.editing().Elements {
		if j != i && e.Name == name {
			return fmt.Errorf("element %d is already named %q", j+1, name)
		}
	}
	return c.Edit(key, func(s *model.Study) { s.Elements[i].Name = name })
}

// SetStudyName names the study; the title bar, the report and every export
// file name use it.
func (c *Controller) SetStudyName(name string) error {
	name = strings.TrimSpace(name)
	if name == "" {
		return errors.New("a study needs a name: it names the report and the exported files")
	}
	return c.Edit("", func(s *model.Study) { s.Name = name })
}

// SetTeam sets the team named on the report and the drawings; empty for
// none.
func (c *Controller) SetTeam(team string) error {
	return c.Edit("", func(s *model.Study) { s.Team = strings.TrimSpace(team) })
}
