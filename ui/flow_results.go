package ui

import (
	"fmt"
	"math"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// resultsPanel is the table under the views: per element and for the
// configuration, the coefficients, forces and, with the boundary layer,
// drag, transition and separation.
type resultsPanel struct {
	table *widget.Label
	note  *widget.Label
	box   *fyne.Container
}

func newResultsPanel() *resultsPanel {
	r := &resultsPanel{}
	r.table = widget.NewLabel("")
	r.table.TextStyle = fyne.TextStyle{Monospace: true}
	r.table.SizeName = theme.SizeNameCaptionText
	r.note = widget.NewLabel("")
	r.note.SizeName = theme.SizeNameCaptionText
	r.note.Wrapping = fyne.TextWrapWord
	r.note.TextStyle = fyne.TextStyle{Italic: true}
	r.box = container.NewVBox(widget.NewSeparator(), r.table, r.note)
	return r
}

func (r *resultsPanel) show(res *engine.Result) {
	table, note := resultsText(res)
	r.table.SetText(table)
	r.note.SetText(note)
	r.note.Importance = widget.MediumImportance
	if len(resultFlags(res)) > 0 {
		r.note.Importance = widget.WarningImportance
	}
	r.note.Refresh()
}

// staleNote heads the note while the newest request failed.
const staleNote = "Not solved: the table shows the last configuration that solved. "

// stale marks the table as belonging to an earlier configuration.
func (r *resultsPanel) stale() {
	if r.table.Text == "" || strings.HasPrefix(r.note.Text, staleNote) {
		return
	}
	r.note.SetText(staleNote + r.note.Text)
	r.note.Importance = widget.WarningImportance
	r.note.Refresh()
}

// dash stands for a value that does not exist (no transition, no
// separation, no drag).
const dash = "—"

// xcText formats an x/c, or a dash for NaN (none).
func xcText(x float64) string {
	if math.IsNaN(x) {
		return dash
	}
	return fixed(x, 3)
}

// resultsText lays out the results table and the note on its signs.
func resultsText(res *engine.Result) (table, note string) {
	s := res.Solution
	if s == nil || res.Layout == nil {
		return "", ""
	}
	if res.Coupled != nil {
		return coupledResultsText(res)
	}
	inv := res.Layout.Inverted
	f, v := res.Forces, res.Viscous
	coef, force := "Cl", "lift N/m"
	if inv {
		coef, force = "−Cl", "downforce N/m"
	}
	cols := []string{"element", "chord mm", "Re", coef, "Cm"}
	if f != nil {
		cols = append(cols, force)
		if f.SpanM > 0 {
			cols = append(cols, fmt.Sprintf("N on %s m span", num(f.SpanM)))
		}
	}
	if v != nil {
		cols = append(cols, "Cd")
		if f != nil {
			cols = append(cols, "drag N/m")
		}
		cols = append(cols, transitionColumn, separationColumn)
	}
	sign := func(x float64) float64 {
		if inv {
			return engine.Downforce(x)
		}
		return x
	}
	var rows [][]string
	for i, e := range s.Elements {
		r := []string{fmt.Sprintf("%d %s", i+1, e.Name), num(elementChordMM(res, i)), reText(res, i), fixed(sign(e.Cl), 3), fixed(e.Cm, 3)}
		if f != nil && i < len(f.ElementLift) {
			r = append(r, fixed(sign(f.ElementLift[i]), 1))
			if f.SpanM > 0 {
				r = append(r, fixed(f.SpanTotal(sign(f.ElementLift[i])), 1))
			}
		}
		if v != nil && i < len(v.Elements) {
			b := v.Elements[i]
			r = append(r, cdText(b.Cd))
			if f != nil {
				r = append(r, orDash(f.ElementDrag[i], 2))
			}
			r = append(r, xcText(b.Upper.TransitionXC)+" / "+xcText(b.Lower.TransitionXC),
				xcText(b.Upper.TurbulentSeparationXC)+" / "+xcText(b.Lower.TurbulentSeparationXC))
		}
		rows = append(rows, r)
	}
	if len(s.Elements) > 1 || res.Layout.RefChordM != res.Layout.Elements[0].Chord {
		r := []string{"configuration", num(refChordMM(res)) + " ref", "", fixed(sign(s.Cl), 3), fixed(s.Cm, 3)}
		if f != nil {
			r = append(r, fixed(sign(f.LiftPerSpan), 1))
			if f.SpanM > 0 {
				r = append(r, fixed(f.SpanTotal(sign(f.LiftPerSpan)), 1))
			}
		}
		if v != nil {
			r = append(r, cdText(v.Cd))
			if f != nil {
				r = append(r, orDash(f.DragPerSpan, 2))
			}
			r = append(r, "", "")
		}
		rows = append(rows, r)
	}
	table = alignColumns(cols, rows)

	n := []string{signNote(inv)}
	n = append(n, "Elements on their own chord (Cm about their quarter chord), the configuration on the reference chord.")
	if f != nil && f.SpanM > 0 {
		n = append(n, "Span totals are 2-D values times the span (no end effects).")
	}
	if v != nil {
		n = append(n, xcNote+" Cd "+dash+": a surface separated, outside the method's range.")
	}
	n = append(n, fmt.Sprintf("Solved in %d ms.", res.Elapsed.Milliseconds()))
	return table, strings.Join(append(cautions(res), n...), " ")
}

func reText(res *engine.Result, i int) string {
	if i >= len(res.Reynolds) {
		return dash
	}
	return strings.Replace(fmt.Sprintf("%.3g", res.Reynolds[i]), "e+0", "e", 1)
}

func cdText(cd float64) string {
	if math.IsNaN(cd) {
		return dash
	}
	return fixed(cd, 4)
}

// alignColumns lays out a monospace table, the first column left-aligned
// and the others right-aligned.
func alignColumns(head []string, rows [][]string) string {
	width := make([]int, len(head))
	for _, r := range append([][]string{head}, rows...) {
		for j, c := range r {
			if j < len(width) {
				width[j] = max(width[j], len([]rune(c)))
			}
		}
	}
	var b strings.Builder
	for k, r := range append([][]string{head}, rows...) {
		if k > 0 {
			b.WriteByte('\n')
		}
		for j := range head {
			c := ""
			if j < len(r) {
				c = r[j]
			}
			pad := strings.Repeat(" ", width[j]-len([]rune(c)))
			if j == 0 {
				b.WriteString(c + pad)
			} else {
				b.WriteString("   " + pad + c)
			}
		}
	}
	return b.String()
}

// refChordMM returns the reference chord the result's coefficients are
// on, in millimetres.
func refChordMM(res *engine.Result) float64 { return res.Layout.RefChordM * mmPerM }

// elementChordMM returns a placed element's chord in millimetres.
func elementChordMM(res *engine.Result, i int) float64 { return res.Layout.Elements[i].Chord * mmPerM }

// The results tables' transition and separation columns, and what their
// figures mean.
const (
	transitionColumn = "transition upper/lower"
	separationColumn = "separation upper/lower"
	xcNote           = "Transition and separation in x/c from each element's leading edge, on its upper and lower surfaces as mounted; " + dash + " where there is none."
)

// resultFlags returns the plausibility flags of a result at the study's
// angle (engine.Result.Flags).
func resultFlags(res *engine.Result) []model.Flag {
	if res == nil {
		return nil
	}
	return res.Flags()
}
