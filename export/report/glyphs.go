package report

import (
	"fmt"
	"strings"
	"sync"

	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"golang.org/x/image/font/sfnt"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// missingGlyph stands, visibly, for a character the report's font cannot
// draw (an emoji, CJK ideographs): fpdf aborts on characters outside the
// Basic Multilingual Plane and prints empty boxes for ones the font lacks.
// The report says which characters were replaced.
const missingGlyph = "?"

var (
	fontOnce sync.Once
	fontErr  error
	font     *sfnt.Font
	fontMu   sync.Mutex // sfnt.Buffer use is not safe for concurrent calls
)

// drawable reports whether the report's text font has a glyph for r.
func drawable(r rune) bool {
	if r < 0x20 || r > 0xFFFF {
		return r == '\n' || r == '\t'
	}
	fontOnce.Do(func() { font, fontErr = sfnt.Parse(liberationsansregular.TTF) })
	if fontErr != nil {
		return r < 0x80
	}
	fontMu.Lock()
	defer fontMu.Unlock()
	var b sfnt.Buffer
	i, err := font.GlyphIndex(&b, r)
	return err == nil && i != 0
}

// glyphMap replaces the characters the font cannot draw, remembering them.
type glyphMap struct {
	missing []rune
	seen    map[rune]bool
}

func (g *glyphMap) text(s string) string {
	ok := true
	for _, r := range s {
		ok = ok && drawable(r)
	}
	if ok {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if drawable(r) {
			b.WriteRune(r)
			continue
		}
		b.WriteString(missingGlyph)
		if !g.seen[r] {
			if g.seen == nil {
				g.seen = map[rune]bool{}
			}
			g.seen[r] = true
			g.missing = append(g.missing, r)
		}
	}
	return b.String()
}

func (g *glyphMap) texts(ss []string) []string {
	out := make([]string, len(ss))
	for i, s := range ss {
		out[i] = g.text(s)
	}
	return out
}

// note says what was replaced, "" if nothing.
func (g *glyphMap) note() string {
	if len(g.missing) == 0 {
		return ""
	}
	var codes []string
	for _, r := range g.missing {
		codes = append(codes, fmt.Sprintf("U+%04X", r))
	}
	return fmt.Sprintf("%d %s in names or notes cannot be printed in the report's font and %s shown as %q: %s (the study file keeps them)",
		len(g.missing), plural(len(g.missing), "character", "characters"), plural(len(g.missing), "is", "are"), missingGlyph, strings.Join(codes, ", "))
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// printable returns in with every text the report prints made drawable
// (copies; in's study and result are not changed), and the note saying
// what was replaced.
func printable(in Input) (Input, string) {
	var g glyphMap
	st := in.Study.Clone()
	st.Name, st.Team = g.text(st.Name), g.text(st.Team)
	for i := range st.Elements {
		e := &st.Elements[i]
		e.Name = g.text(e.Name)
		e.Section.Spec = g.text(e.Section.Spec)
		if em := e.Section.Embedded; em != nil {
			c := *em
			c.Name = g.text(c.Name)
			e.Section.Embedded = &c
		}
	}
	for i := range st.Pins {
		st.Pins[i].Label = g.text(st.Pins[i].Label)
	}
	in.Study = st
	in.Author, in.FileName, in.CommandLine = g.text(in.Author), g.text(in.FileName), g.text(in.CommandLine)
	in.Inputs = append([]InputFile(nil), in.Inputs...)
	for i := range in.Inputs {
		in.Inputs[i].Path = g.text(in.Inputs[i].Path)
	}
	reps := make([]*model.CleanReport, len(in.CleanReports))
	for i, rep := range in.CleanReports {
		if rep == nil {
			continue
		}
		c := *rep
		c.Source, c.Name = g.text(c.Source), g.text(c.Name)
		c.Detected, c.Changes = g.texts(c.Detected), g.texts(c.Changes)
		c.Warnings = append([]model.CleanWarning(nil), c.Warnings...)
		for j := range c.Warnings {
			c.Warnings[j].Message = g.text(c.Warnings[j].Message)
		}
		reps[i] = &c
	}
	in.CleanReports = reps
	res := *in.Result
	sol := *res.Solution
	sol.Warnings = g.texts(sol.Warnings)
	sol.Elements = append([]solver.ElementSolution(nil), sol.Elements...)
	for i := range sol.Elements {
		sol.Elements[i].Name = g.text(sol.Elements[i].Name)
	}
	res.Solution = &sol
	if res.Layout != nil {
		l := *res.Layout
		l.Elements = append([]model.PlacedElement(nil), l.Elements...)
		for i := range l.Elements {
			l.Elements[i].Name = g.text(l.Elements[i].Name)
		}
		res.Layout = &l
	}
	if v := res.Viscous; v != nil {
		c := *v
		c.Notes = g.texts(c.Notes)
		res.Viscous = &c
	}
	res.SweepViscous = append([]engine.ViscousPoint(nil), res.SweepViscous...)
	for i := range res.SweepViscous {
		res.SweepViscous[i].Note = g.text(res.SweepViscous[i].Note)
	}
	in.Result = &res
	return in, g.note()
}
