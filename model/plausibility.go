package model

import (
	"fmt"
	"math"
	"strings"
)

// A Flag marks a result that must not be taken at face value, saying in
// plain words what it means for the wing. Rules live here, not in the user
// interface, so the app, the command line and the report flag alike.
type Flag struct {
	Kind    FlagKind
	Message string
}

// FlagKind names what a flag is about, in words fit for a table column.
type FlagKind string

// The kinds of flag. The viscous ones are raised from facts the coupled
// viscous solution supplies (PointFacts.Viscous); until it does, they stay
// silent.
const (
	FlagSuction      FlagKind = "suction beyond real flows"
	FlagGround       FlagKind = "very close to the ground"
	FlagPastClMax    FlagKind = "past maximum lift"
	FlagNotConverged FlagKind = "viscous solution not converged"
	FlagSeparated    FlagKind = "separated"
	FlagHeld         FlagKind = "transition held upstream"
	FlagReynolds     FlagKind = "Reynolds number outside the checked range"
)

// CpMinPlausible is the lowest suction-peak pressure coefficient taken as
// physically possible at the team's Reynolds numbers (1.5e5–8e5). From
// memory, common practice: measured suction peaks on wing sections in this
// range seldom go below about −6 to −8 before the boundary layer separates
// (flight-Reynolds-number high-lift rules such as Valarezo and Chin's
// pressure-difference rule allow more, up to about −12); a potential-flow
// answer beyond −8 is a wing that would have stalled.
const CpMinPlausible = -8

// GroundHOverCMin is the clearance over chord below which real inverted
// wings lose downforce as the suction side separates (Zerihan & Zhang,
// J. Aircraft 37(6), 2000: the force peaks near h/c ≈ 0.1 and falls below);
// potential flow shows only the rise.
const GroundHOverCMin = 0.1

// groundCaution is the one sentence every place gives about a clearance
// below GroundHOverCMin: the app's caution under the ground control, the
// flag of a result, a map's key and readout, the command line's and the
// report's notes (GroundCaution). It holds for every viscous mode: potential flow
// and the one-way estimate show only the rise; the coupled solution can
// show the fall, but in 2-D over a ground without a boundary layer (a
// fixed ground, no moving-belt floor), so its peak is no guide.
var groundCaution = fmt.Sprintf("real wings lose downforce below about %g chords of ground clearance as the suction side separates (Zerihan & Zhang 2000); potential flow shows only the rise, and the coupled viscous solution shows the fall only in 2-D over a ground without a boundary layer: do not rely on where it peaks", GroundHOverCMin)

// GroundCaution returns the near-ground caution as a clause, lower case
// and without a full stop, for a message that leads into it ("…: " +
// GroundCaution()). Capitalised as a sentence of its own:
// GroundCautionSentence.
func GroundCaution() string { return groundCaution }

// GroundCautionSentence returns GroundCaution as a sentence of its own.
func GroundCautionSentence() string {
	return strings.ToUpper(groundCaution[:1]) + groundCaution[1:] + "."
}

// GroundFlag is the flag of a result at a clearance of hOverC chords
// below GroundHOverCMin (Plausibility raises it; a map's point too).
func GroundFlag(hOverC float64) Flag {
	return Flag{FlagGround, fmt.Sprintf("ground clearance %.2f chords; %s", hOverC, groundCaution)}
}

// ReynoldsMinChecked and ReynoldsMaxChecked bound the chord Reynolds
// numbers at which the viscous solution's boundary layers are taken on
// trust. The project's own validation spans 2e5 (E387, Illinois) to 6e6
// (NACA 0012, Ladson); integral boundary layers with e^N transition of
// this kind are used from about 5e4 (below it laminar separation without
// reattachment dominates and the closures' fits end) to about 5e7 (from
// memory, common practice). The team's range, 1.5e5–8e5, lies well
// inside.
const (
	ReynoldsMinChecked = 5e4
	ReynoldsMaxChecked = 5e7
)

// PointFacts are what the plausibility rules look at for one result.
type PointFacts struct {
	CpMin float64 // smallest Cp over every element
	// HOverC is the ground clearance over the main element's chord; NaN
	// without a ground.
	HOverC float64
	// Viscous holds the viscous solution's verdict on this point; nil
	// when it has not run.
	Viscous *ViscousFacts
	// Reynolds are the elements' chord Reynolds numbers where a viscous
	// solution ran (nil otherwise).
	Reynolds []float64
}

// ViscousFacts are the states the coupled viscous solution reports for a
// point; each true one raises its flag.
type ViscousFacts struct {
	PastClMax    bool // beyond the angle of the viscous solution's maximum lift
	NotConverged bool
	Separated    bool // the coupled solution or the one-way estimate finds the flow separated well ahead of the trailing edge: the inviscid answer does not hold
	// Coupled: the facts are the coupled solution's, whose forces already
	// include the separation (the one-way estimate's lift is inviscid).
	Coupled bool
	// TransitionHeld: on some surface with free transition the coupled
	// solution's transition lies upstream of where the e^N criterion
	// puts it, because the solution with it further on did not converge.
	TransitionHeld bool
}

// Plausibility returns the flags a result raises, most serious first.
func Plausibility(f PointFacts) []Flag {
	var flags []Flag
	if v := f.Viscous; v != nil {
		switch {
		case v.Separated && v.Coupled:
			flags = append(flags, Flag{FlagSeparated, "the boundary layer separates well ahead of the trailing edge: the wing is at or near stall, where the viscous solution's forces are least certain; confirm by test before relying on them"})
		case v.Separated:
			flags = append(flags, Flag{FlagSeparated, "the boundary layer separates well ahead of the trailing edge (one-way estimate): the wing would stall here and the downforce or lift shown, the inviscid one, is not reached"})
		}
		if v.PastClMax {
			flags = append(flags, Flag{FlagPastClMax, "past the viscous solution's maximum lift: the real wing gives less, not more, as the angle grows"})
		}
		if v.NotConverged {
			flags = append(flags, Flag{FlagNotConverged, "the viscous solution did not converge at this point: its numbers are not an answer"})
		}
		if v.TransitionHeld {
			flags = append(flags, Flag{FlagHeld, "the free-transition solution did not converge here: transition is held upstream of where the e^N criterion puts it, as if tripped there, and lift and drag are those of that earlier transition"})
		}
	}
	for _, re := range f.Reynolds {
		if re < ReynoldsMinChecked || re > ReynoldsMaxChecked {
			flags = append(flags, Flag{FlagReynolds, fmt.Sprintf("Reynolds number %s is outside %s to %s, where the boundary layers' closures and transition criterion are taken on trust: treat the viscous numbers as a rough guide", reynoldsWords(re), reynoldsWords(ReynoldsMinChecked), reynoldsWords(ReynoldsMaxChecked))})
			break
		}
	}
	if f.CpMin < CpMinPlausible {
		flags = append(flags, Flag{FlagSuction, fmt.Sprintf("suction peak Cp %s is beyond the about %s real flows sustain at these Reynolds numbers: the wing would separate and give far less force than shown", Minus(fmt.Sprintf("%.1f", f.CpMin)), Minus(fmt.Sprint(CpMinPlausible)))})
	}
	if !math.IsNaN(f.HOverC) && f.HOverC < GroundHOverCMin {
		flags = append(flags, GroundFlag(f.HOverC))
	}
	return flags
}

// Minus writes the signs of a formatted number s (its own and its
// exponent's) as true minus signs, U+2212, as every label and message
// does.
func Minus(s string) string { return strings.ReplaceAll(s, "-", "−") }

// FlagWords joins the kinds of flags for a status line or table cell.
func FlagWords(flags []Flag) string {
	s := ""
	for i, f := range flags {
		if i > 0 {
			s += "; "
		}
		s += string(f.Kind)
	}
	return s
}

// HOverC returns the ground clearance over the main element's chord (the
// h/c of GroundHOverCMin), NaN in free air or for a nil layout.
func (l *Layout) HOverC() float64 {
	if l == nil || !l.Ground || len(l.Elements) == 0 {
		return math.NaN()
	}
	return l.ClearanceM / l.Elements[0].Chord
}

// reynoldsWords writes a Reynolds number as a reader writes it: 3 × 10⁴.
func reynoldsWords(re float64) string {
	if !(re > 0) || math.IsInf(re, 0) {
		return Minus(fmt.Sprint(re))
	}
	e := math.Floor(math.Log10(re))
	m := re / math.Pow(10, e)
	if math.Round(m*100)/100 >= 10 { // 99 999 is 1 × 10⁵, not 10 × 10⁴
		e, m = e+1, m/10
	}
	sup := strings.NewReplacer("-", "⁻", "0", "⁰", "1", "¹", "2", "²", "3", "³", "4", "⁴", "5", "⁵", "6", "⁶", "7", "⁷", "8", "⁸", "9", "⁹").Replace(fmt.Sprint(int(e)))
	return fmt.Sprintf("%s × 10%s", strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.2f", m), "0"), "."), sup)
}
