package ui

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
func PinLabel(prev, cur *model.Study) string {
	if prev == nil {
		return strings.Join([]string{sourceLabel(cur), panelsLabel(cur), string(cur.Panelling.Spacing)}, ", ")
	}
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
	add(prev.Panelling.Nose != cur.Panelling.Nose, "nose "+num(cur.Panelling.Nose))
	add(prev.Panelling.Tail != cur.Panelling.Tail, "tail "+num(cur.Panelling.Tail))
	add(prev.Flow.AlphaDeg != cur.Flow.AlphaDeg, "α="+num(cur.Flow.AlphaDeg)+"°")
	add(prev.Ground != cur.Ground, groundLabel(cur.Ground))
	add(prev.Inverted != cur.Inverted, map[bool]string{true: "inverted", false: "upright"}[cur.Inverted])
	if len(parts) == 0 {
		return panelsLabel(cur) + ", " + string(cur.Panelling.Spacing) + " (unchanged)"
	}
	return strings.Join(parts, ", ")
}

func panelsLabel(st *model.Study) string { return "N=" + strconv.Itoa(st.Panelling.Panels) }

// sourceLabel names the first element's section source in a short form:
// "NACA 4412", "KT …", a file's base name or an embedded section's name.
func sourceLabel(st *model.Study) string {
	if len(st.Elements) == 0 {
		return "no section"
	}
	return shortSource(st.Elements[0].Section)
}

func sourcesLabel(st *model.Study) string {
	var b strings.Builder
	for _, e := range st.Elements {
		b.WriteString(e.Section.String())
		b.WriteByte(';')
	}
	return b.String()
}

func shortSource(src model.SectionSource) string {
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
	return "ground " + num(g.ClearanceMM) + " mm"
}

// num formats a setting compactly: 0.5, 4, −2.5.
func num(x float64) string {
	return strings.Replace(strconv.FormatFloat(x, 'g', 4, 64), "-", "−", 1)
}
