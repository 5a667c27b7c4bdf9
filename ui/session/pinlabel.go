package session

import (
	"fmt"
	"strconv"
	"strings"

	"sectionbench/model"
)

// PinLabel names a pin by what sets the current study apart from the one
// pinned before it, for example "N=80, cosine". With no earlier pin (prev
// nil) it names the section, the panel count and the spacing law. If nothing
// differs the label says so, so that no two pins look alike by accident.
func PinLabel(prev, cur *model.Study) string { return pinLabel(prev, cur, nil, nil) }

// pinLabel is PinLabel with the studies' sections, which give a flap's
// gap (model.Slot); without them a changed gap is named without its value.
func pinLabel(prev, cur *model.Study, prevSecs, curSecs []*model.Section) string {
	if prev == nil {
		return strings.Join([]string{sourceLabel(cur), panelsLabel(cur), string(cur.Panelling.Spacing)}, ", ")
	}
	parts := settingDiffs(prev, cur, prevSecs, curSecs)
	if len(parts) == 0 {
		return panelsLabel(cur) + ", " + string(cur.Panelling.Spacing) + " (unchanged)"
	}
	return strings.Join(parts, ", ")
}

// settingDiffs names the settings of cur that differ from prev's, those
// that change the solution, with cur's values.
func settingDiffs(prev, cur *model.Study, prevSecs, curSecs []*model.Section) []string {
	var parts []string
	add := func(differs bool, s string) {
		if differs {
			parts = append(parts, s)
		}
	}
	add(sourcesLabel(prev) != sourcesLabel(cur), sourceLabel(cur))
	add(len(prev.Elements) != len(cur.Elements), fmt.Sprintf("%d elements", len(cur.Elements)))
	add(prev.Panelling.Panels != cur.Panelling.Panels, panelsLabel(cur))
	add(prev.Panelling.Spacing != cur.Panelling.Spacing, string(cur.Panelling.Spacing))
	add(prev.Panelling.Nose != cur.Panelling.Nose, "nose "+Number(cur.Panelling.Nose))
	add(prev.Panelling.Tail != cur.Panelling.Tail, "tail "+Number(cur.Panelling.Tail))
	add(prev.Flow.AlphaDeg != cur.Flow.AlphaDeg, "α="+Number(cur.Flow.AlphaDeg)+"°")
	if len(prev.Elements) == len(cur.Elements) {
		parts = append(parts, elementDiffs(prev, cur, prevSecs, curSecs)...)
	}
	add(prev.Ground != cur.Ground, groundLabel(cur.Ground))
	add(prev.Inverted != cur.Inverted, map[bool]string{true: "inverted", false: "upright"}[cur.Inverted])
	add(prev.Flow.SpeedMPS != cur.Flow.SpeedMPS, speedLabel(cur.Flow.SpeedMPS))
	add(prev.Flow.Reynolds != cur.Flow.Reynolds, "Re "+Number(cur.Flow.Reynolds))
	add(prev.Flow.TemperatureC != cur.Flow.TemperatureC || prev.Flow.PressurePa != cur.Flow.PressurePa,
		"air "+Number(cur.Flow.TemperatureC)+" °C, "+Number(cur.Flow.PressurePa)+" Pa")
	add(prev.Viscous.Enabled != cur.Viscous.Enabled, map[bool]string{true: "boundary layer on", false: "boundary layer off"}[cur.Viscous.Enabled])
	add(prev.Viscous.TripUpper != cur.Viscous.TripUpper || prev.Viscous.TripLower != cur.Viscous.TripLower,
		"trips "+Number(cur.Viscous.TripUpper)+"/"+Number(cur.Viscous.TripLower))
	add(prev.Viscous.SeparationH != cur.Viscous.SeparationH, "separation H "+Number(cur.Viscous.SeparationH))
	return parts
}

// elementDiffs names what differs element by element: section (beyond
// the first element, which the label names already), chord, the main
// element's setting angle and position, and each flap's gap, overlap and
// deflection.
func elementDiffs(prev, cur *model.Study, prevSecs, curSecs []*model.Section) []string {
	var parts []string
	for i, e := range cur.Elements {
		p := prev.Elements[i]
		if i > 0 && p.Section.String() != e.Section.String() {
			parts = append(parts, e.Name+" "+SourceName(e.Section))
		}
		if p.ChordMM != e.ChordMM {
			parts = append(parts, e.Name+" chord "+Number(e.ChordMM)+" mm")
		}
		if i == 0 {
			if p.AngleDeg != e.AngleDeg {
				parts = append(parts, e.Name+" "+Number(e.AngleDeg)+"°")
			}
			if p.XMM != e.XMM || p.YMM != e.YMM {
				parts = append(parts, e.Name+" at "+Number(e.XMM)+", "+Number(e.YMM)+" mm")
			}
			continue
		}
		// A slot quantity named only where it differs as the label writes
		// it: applying a searched deflection keeps the gap to within
		// 2e-5 mm, and "Undo (back to flap deflection 15°, flap gap
		// 2.231 mm)" named a gap that had not changed.
		fp, fc := prev.FlapPlacementOf(i), cur.FlapPlacementOf(i)
		if Number(fp.DeflectionDeg) != Number(fc.DeflectionDeg) {
			parts = append(parts, e.Name+" deflection "+Number(fc.DeflectionDeg)+"°")
		}
		if Number(fp.OverlapMM) != Number(fc.OverlapMM) {
			parts = append(parts, e.Name+" overlap "+Number(fc.OverlapMM)+" mm")
		}
		if Number(fp.GapMM) != Number(fc.GapMM) {
			if i < len(curSecs) && i < len(prevSecs) && curSecs[i] != nil {
				parts = append(parts, e.Name+" gap "+Number(cur.SlotOf(i, curSecs[i]).GapMM)+" mm")
			} else {
				parts = append(parts, e.Name+" gap")
			}
		}
	}
	return parts
}

// speedLabel names a speed in km/h, the unit a car team thinks in.
func speedLabel(mps float64) string {
	if mps == 0 {
		return "no speed"
	}
	return Number(mps*3.6) + " km/h"
}

func panelsLabel(st *model.Study) string { return "N=" + strconv.Itoa(st.Panelling.Panels) }

// sourceLabel names the first element's section source in a short form:
// "NACA 4412", "KT …", a file's base name or an embedded section's name.
func sourceLabel(st *model.Study) string {
	if len(st.Elements) == 0 {
		return "no section"
	}
	return SourceName(st.Elements[0].Section)
}

func sourcesLabel(st *model.Study) string {
	var b strings.Builder
	for _, e := range st.Elements {
		b.WriteString(e.Section.String())
		b.WriteByte(';')
	}
	return b.String()
}

// SourceName names a section source in a short form: "NACA 4412",
// "Kármán–Trefftz …", a file's base name or an embedded section's name.
func SourceName(src model.SectionSource) string {
	if src.Embedded != nil {
		return src.Embedded.Name
	}
	s := src.Spec
	switch {
	case strings.HasPrefix(s, "naca:"):
		return "NACA " + strings.ToUpper(strings.TrimPrefix(s, "naca:"))
	case strings.HasPrefix(s, "kt:"):
		return "Kármán–Trefftz " + strings.TrimPrefix(s, "kt:")
	}
	if i := strings.LastIndexAny(s, `/\`); i >= 0 {
		return s[i+1:]
	}
	return s
}

func groundLabel(g model.Ground) string {
	if !g.Enabled {
		return "no ground"
	}
	return "ground " + Number(g.ClearanceMM) + " mm"
}

// Number formats a setting compactly, as the workbench shows it: 0.5, 4,
// −2.5.
func Number(x float64) string {
	return model.Minus(strconv.FormatFloat(x, 'g', 4, 64))
}
