package figure

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// MapCurve returns quantity q of a one-variable map's points (those solved
// so far, in any order) against the variable v of st: points without an
// answer marked failed, points whose suction side separates ahead of
// limit marked separated, points that are not a single solve's answer
// (engine.Point.NotSolve) marked so, points too near the ground
// (model.Study.NearGround of their clearance) marked so, the study's own
// value current and the separation onset marked. forces gives the load
// and drag in N/m.
//
// The onset is the first separated point next to an attached one, among
// the viscous points with an answer in order of the variable (the one
// nearest current when there are several): where, moving from attached
// settings, the suction side starts to separate. It is NaN when the map
// shows no such change.
func MapCurve(st *model.Study, v model.SetupVariable, points []engine.Point, q engine.Quantity, forces bool, limit, current float64) SetupCurve {
	label := q.Label(st.Inverted, forces)
	c := SetupCurve{
		Title:  strings.ToUpper(label[:1]) + label[1:],
		XLabel: v.Label(st), YLabel: label,
		Current: current, Onset: math.NaN(),
		AtMostOne: q == engine.QuantitySeparation,
	}
	type pt struct {
		x   float64
		sep bool
	}
	var known []pt
	c.Inviscid = len(points) > 0
	for i := range points {
		p := &points[i]
		failed := !p.Converged || p.Err != ""
		sep := !failed && p.Viscous && !p.AttachedTo(limit)
		c.Inviscid = c.Inviscid && !p.Viscous
		c.X = append(c.X, p.Values[0])
		c.Y = append(c.Y, q.Value(p, forces))
		c.Separated = append(c.Separated, sep)
		c.Failed = append(c.Failed, failed)
		c.NotSolve = append(c.NotSolve, !failed && p.NotSolve())
		near := p.NearGround(st)
		c.NearGround = append(c.NearGround, near)
		c.Held = append(c.Held, !failed && slices.ContainsFunc(p.Flags, func(f model.Flag) bool { return f.Kind == model.FlagHeld }))
		if near {
			c.NearGroundLabel = NearGroundWords(st)
		}
		if !failed && p.Viscous {
			known = append(known, pt{p.Values[0], sep})
		}
	}
	sort.Slice(known, func(i, j int) bool { return known[i].x < known[j].x })
	for i := 1; i < len(known); i++ {
		if known[i].sep == known[i-1].sep {
			continue
		}
		x := known[i].x
		if known[i-1].sep {
			x = known[i-1].x
		}
		if math.IsNaN(c.Onset) || math.Abs(x-current) < math.Abs(c.Onset-current) {
			c.Onset = x
		}
	}
	if !math.IsNaN(c.Onset) {
		c.OnsetLabel = fmt.Sprintf("separation ahead of x/c %s from %s %s", strconv.FormatFloat(limit, 'g', 3, 64), strconv.FormatFloat(c.Onset, 'g', 4, 64), v.Unit())
		c.OnsetShort = fmt.Sprintf("separation from %s %s", strconv.FormatFloat(c.Onset, 'g', 4, 64), v.Unit())
	}
	return c
}

// NearGroundWords says, for a caption or a note, what a map's triangles
// mark: points closer to the ground than model.GroundHOverCMin of st's
// main element's chord, where the workbench flags "very close to the
// ground".
func NearGroundWords(st *model.Study) string {
	return fmt.Sprintf("points closer to the ground than %s mm (%g of the main element's chord) are marked with a triangle: %s",
		strconv.FormatFloat(st.NearGroundMM(), 'g', 4, 64), model.GroundHOverCMin, model.GroundCaution())
}
