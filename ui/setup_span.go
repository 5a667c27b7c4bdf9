package ui

import (
	"context"
	"errors"
	"fmt"
	"math"
	"reflect"
	"slices"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// setupSpan is the Finite span tab: the span and end plates (study
// fields, undoable like any other), the estimate run off the UI
// goroutine, its totals beside the two-dimensional figures and the
// spanwise load.
type setupSpan struct {
	s       *setupWindow
	content fyne.CanvasObject

	span, plates *field
	fieldMsg     *widget.Label
	msg          *widget.Label
	status       *widget.Label
	totals       *widget.Label
	method       *widget.Label
	load         *figureBox
	readout      *widget.Label

	*runControls
	out    *engine.FiniteSpan // the estimate shown
	outFor *model.Study
}

func newSetupSpan(s *setupWindow) *setupSpan {
	p := &setupSpan{s: s}
	w := s.w
	ctl := w.ctl
	p.fieldMsg = message()
	p.span = newField(w, p.fieldMsg, func(t string) error {
		v, err := optionalNumber(t)
		if err != nil {
			return errors.New("span must be a number of metres")
		}
		return ctl.SetSpan("", v)
	})
	p.span.SetPlaceHolder("needed")
	p.plates = newField(w, p.fieldMsg, func(t string) error {
		v, err := optionalNumber(t)
		if err != nil {
			return &model.FieldError{Field: "flow.end_plate_height_mm", Err: errors.New("not a number: enter the plates' height in mm, or leave it empty for none")}
		}
		return ctl.SetEndPlateHeight("", v)
	})
	p.plates.SetPlaceHolder("none")
	p.msg = message()
	p.runControls = newRunControls("Estimate the finite wing", p.start)
	p.status = caption("Not run yet. The estimate solves the configuration over the angles its stations need (a polar, with the study's viscous setting), then the lifting line.")
	p.totals = widget.NewLabel("")
	p.totals.Wrapping = fyne.TextWrapWord
	p.method = caption("Method: " + engine.FiniteSpanMethod + ".")
	caution := widget.NewLabelWithStyle(engine.FiniteSpanCaution, fyne.TextAlignLeading, fyne.TextStyle{Italic: true})
	caution.Wrapping = fyne.TextWrapWord
	p.load = newFigureBox(w.ctl.Activity(), w.do, fyne.NewSize(520, 360))
	p.readout = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	side := setupColumn(
		heading("Wing"),
		row("Span (m)", p.span),
		row("End-plate height (mm)", p.plates),
		caption("A rectangular wing of this span and the study's reference chord; the plates' height at both tips."),
		p.fieldMsg,
		p.msg,
		p.row,
		p.progress, p.status,
		widget.NewSeparator(),
		heading("Estimate"),
		p.totals,
		p.method,
		caution,
	)
	p.content = container.NewBorder(nil, p.readout, side, nil, newReadoutBox(p.load, p.hover))
	p.show()
	return p
}

// studyChanged shows the study's span and plates.
func (p *setupSpan) studyChanged() {
	f := p.s.w.ctl.Current().Flow
	setIfDiffers(p.span, optionalText(f.SpanM), optionalIs(f.SpanM))
	setIfDiffers(p.plates, optionalText(f.EndPlateHeightMM), optionalIs(f.EndPlateHeightMM))
	p.show()
}

// start runs the estimate of the study as it is now.
func (p *setupSpan) start() {
	ctl := p.s.w.ctl
	st, secs := ctl.Study(), slices.Clone(ctl.Sections())
	if !(st.Flow.SpanM > 0) {
		setMessage(p.msg, errors.New("enter the wing's span first"))
		p.s.relayout()
		return
	}
	setMessage(p.msg, nil)
	do := p.s.w.do
	p.launch(ctl.Activity(), func(ctx context.Context, gen int) {
		out, err := runFiniteSpan(ctx, st, secs, func(done, total int) {
			do(func() { p.progressed(gen, float64(done)/float64(total)) })
		})
		do(func() { p.finish(gen, st, out, err) })
	})
	p.status.SetText("Solving the polar…")
	p.s.relayout()
}

func (p *setupSpan) finish(gen int, st *model.Study, out *engine.FiniteSpan, err error) {
	if !p.end(gen) {
		return
	}
	switch {
	case errors.Is(err, context.Canceled):
		p.status.SetText("Cancelled.")
	case err != nil:
		p.status.SetText("")
		setMessage(p.msg, err)
	default:
		p.out, p.outFor = out, st
		p.status.SetText(strings.TrimSpace(fmt.Sprintf("Polar from %s° to %s°, %d of %d angles with a usable %s. %s",
			num(out.PolarFromDeg), num(out.PolarToDeg), out.PolarRowsUsed, out.PolarRows, map[bool]string{true: "viscous answer", false: "answer"}[out.ViscousPolar], out.ExtensionNote())))
	}
	p.show()
	p.s.relayout()
}

// show writes the totals and draws the spanwise load of the estimate
// shown, saying when the study has changed since.
func (p *setupSpan) show() {
	fs := p.out
	if fs == nil {
		p.totals.SetText("")
		p.load.setDrawing(nil, spanEmptyNote)
		return
	}
	p.totals.SetText(finiteSpanText(fs, p.stale()))
	sl := figures.SpanLoadOf(fs)
	p.load.setDrawing(func(dark bool, w, h int, dpi float64) (*figures.Figure, error) {
		return renderSpanLoad(sl, dark, w, h, dpi)
	}, "")
}

// stale reports whether the study changed since the estimate shown was
// run.
func (p *setupSpan) stale() bool {
	cur := p.s.w.ctl.Current()
	return p.outFor != nil && cur != nil && !studiesEqual(p.outFor, cur)
}

// redraw draws the figure again.
func (p *setupSpan) redraw() { p.load.redraw() }

// hover reads the load under the pointer.
func (p *setupSpan) hover(x, y float64, ok bool) {
	if !ok || p.out == nil {
		p.readout.SetText("")
		return
	}
	unit := map[bool]string{true: " N/m", false: ""}[!math.IsNaN(p.out.DynamicPressurePa)]
	p.readout.SetText(fmt.Sprintf("%s m from the centre: %s%s", fixed(x, 3), sig(y), unit))
}

// finiteSpanText is the estimate's totals in words, the two-dimensional
// figures beside them.
func finiteSpanText(fs *engine.FiniteSpan, stale bool) string {
	name := map[bool]string{true: "Downforce", false: "Lift"}[fs.Inverted]
	t := ""
	if stale {
		t = "(Of the study before its last change: run again.)\n"
	}
	t += fmt.Sprintf("Span %s m, chord %s m: aspect ratio %s", num(fs.SpanM), num(fs.ChordM), fixed(fs.AspectRatio, 2))
	if fs.EndPlateHeightM > 0 {
		t += fmt.Sprintf(", with %s mm end plates effectively %s", num(fs.EndPlateHeightM*1000), fixed(fs.EffectiveAspectRatio, 2))
	}
	t += "."
	if fs.GroundHeightM > 0 {
		t += fmt.Sprintf(" Lifting line %s mm above the ground (its trailing vortices mirrored).", num(math.Round(fs.GroundHeightM*1000)))
	}
	t += fmt.Sprintf("\nSpan efficiency %s", fixed(fs.Efficiency, 3))
	if fs.GroundHeightM > 0 {
		t += " (above 1 in ground effect: the ground lessens the induced drag)"
	}
	t += ".\n"
	if math.IsNaN(fs.DynamicPressurePa) {
		t += fmt.Sprintf("%s coefficient %s (2-D %s); induced drag coefficient %s; profile %s. Give a speed for newtons.",
			name, fixed(fs.Load, 3), orDash(fs.Load2DPerSpan, 3), fixed(fs.CDi, 4), orDash(fs.CDp, 4))
		return t
	}
	t += fmt.Sprintf("%s %s N (2-D over the span: %s N, %s N/m).\n", name, fixed(fs.LoadN, 1), orDash(fs.Load2DN, 1), orDash(fs.Load2DPerSpan, 1))
	if math.IsNaN(fs.ProfileDragN) {
		t += fmt.Sprintf("Induced drag %s N; no profile drag without the viscous solution (Flow tab).\n", fixed(fs.InducedDragN, 1))
	} else {
		t += fmt.Sprintf("Induced drag %s N; profile drag %s N; total %s N (2-D over the span: %s N).\n",
			fixed(fs.InducedDragN, 1), fixed(fs.ProfileDragN, 1), fixed(fs.InducedDragN+fs.ProfileDragN, 1), orDash(fs.Drag2DN, 1))
	}
	if fs.PastMaxLoad {
		t += "Some stations work past the polar's maximum load: at or beyond stall, the estimate is not unique.\n"
	}
	if fs.LowAspectRatio {
		t += fmt.Sprintf("An aspect ratio below about %d: a lifting line is a rough guide here (a lifting-surface method is the usual choice).\n", engine.LowAspectRatioLimit)
	}
	return t
}

// studiesEqual reports whether two studies solve the same (their pins,
// name and team aside).
func studiesEqual(a, b *model.Study) bool {
	x, y := *a, *b
	x.Pins, y.Pins = nil, nil
	x.Name, y.Name, x.Team, y.Team = "", "", "", ""
	return reflect.DeepEqual(x, y)
}
