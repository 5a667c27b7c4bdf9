package ui

import (
	"errors"
	"fmt"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
)

// The viscous modes offered on the Flow tab, in full words.
const (
	modeCoupled  = "Coupled viscous solution"
	modeEstimate = "One-way boundary-layer estimate"
	modeOff      = "Off (inviscid panel method only)"
)

// What each mode is and is not, under the choice.
const (
	coupledNote = "Coupled: each element's boundary layers and wake displace the flow, iterated with the panel solution until both agree. " +
		"Cl, Cd, Cm and Cp are viscous, the inviscid Cl is given beside them; a point that does not converge gives no numbers. " +
		"A 2-D estimate: validate by test. It takes from a tenth of a second to a few seconds a point."
	viscousNote = "One-way estimate: the boundary layer grows on the inviscid pressures but does not displace the flow " +
		"(no displacement coupling), so Cl, Cm and Cp stay inviscid. Drag is a 2-D profile-drag estimate; validate by test."
	inviscidNote = "Inviscid: lift and moment of the panel method, no drag, no stall."
)

// viscousControls choose the viscous solution and set its transition: the
// critical amplification exponent N (coupled) and the trips.
type viscousControls struct {
	c *controls

	mode  *widget.RadioGroup
	note  *widget.Label
	ncrit *field
	tu    *widget.Label // the turbulence level N stands for
	upper *field
	lower *field
	msg   *widget.Label
}

func newViscousControls(c *controls) *viscousControls {
	vc := &viscousControls{c: c}
	ctl := c.w.ctl
	vc.msg = message()
	vc.note = caption("")
	vc.tu = caption("")
	vc.mode = widget.NewRadioGroup([]string{modeCoupled, modeEstimate, modeOff}, func(s string) {
		if c.syncing {
			return
		}
		prev := ctl.Current().Viscous
		if s == "" || s == modeName(prev) {
			vc.showMode(prev)
			return
		}
		if err := ctl.SetViscous("", withMode(prev, s)); err != nil {
			setMessage(vc.msg, err)
			c.syncing = true
			vc.mode.SetSelected(modeName(prev)) // the study did not change
			c.syncing = false
			return
		}
		setMessage(vc.msg, nil)
	})
	vc.mode.Required = true
	vc.ncrit = newField(c.w, vc.msg, vc.editN)
	vc.ncrit.SetPlaceHolder(fmt.Sprintf("%d", model.DefaultTransitionN))
	vc.upper, vc.lower = newField(c.w, vc.msg, vc.editTrips), newField(c.w, vc.msg, vc.editTrips)
	for _, e := range []*field{vc.upper, vc.lower} {
		e.SetPlaceHolder("free")
	}
	return vc
}

// modeName is the choice that shows v.
func modeName(v model.Viscous) string {
	switch {
	case !v.Enabled:
		return modeOff
	case v.IsCoupled():
		return modeCoupled
	}
	return modeEstimate
}

// withMode returns v switched to the named mode; the transition settings
// are kept for when the mode comes back.
func withMode(v model.Viscous, name string) model.Viscous {
	switch name {
	case modeCoupled:
		v.Enabled, v.Mode = true, model.ViscousCoupled
	case modeEstimate:
		v.Enabled, v.Mode = true, model.ViscousEstimate
	default:
		v.Enabled = false
	}
	return v
}

func (vc *viscousControls) box() fyne.CanvasObject {
	return container.NewVBox(
		vc.mode,
		vc.note,
		labelled("critical amplification exponent N (e^N transition)", vc.ncrit),
		vc.tu,
		container.NewGridWithColumns(2, labelled("trip, upper surface (x/c)", vc.upper), labelled("trip, lower surface (x/c)", vc.lower)),
		caption("Empty or 0: free transition (e^N in the coupled solution, Michel in the estimate). Surfaces as drawn: inverted, the lower surface is the suction side."),
		vc.msg,
	)
}

// editN applies the critical amplification exponent.
func (vc *viscousControls) editN(s string) error {
	n, err := optionalNumber(s)
	if err != nil {
		return &model.FieldError{Field: "viscous.transition_n", Err: fmt.Errorf("not a number: enter one from %d to %d, or leave it empty for %d", model.MinTransitionN, model.MaxTransitionN, model.DefaultTransitionN)}
	}
	ctl := vc.c.w.ctl
	v := ctl.Current().Viscous
	v.TransitionN = n
	return ctl.SetViscous("", v)
}

// editTrips applies both trip fields as they read.
func (vc *viscousControls) editTrips(string) error {
	var t [2]float64
	for i, e := range []*field{vc.upper, vc.lower} {
		v, err := optionalNumber(e.Text)
		if err != nil {
			return errors.New("a trip position must be a number in x/c from 0 to 1, or empty for free transition")
		}
		t[i] = v
	}
	ctl := vc.c.w.ctl
	v := ctl.Current().Viscous
	v.TripUpper, v.TripLower = t[0], t[1]
	return ctl.SetViscous("", v)
}

// showMode sets the note and what the mode uses.
func (vc *viscousControls) showMode(v model.Viscous) {
	switch modeName(v) {
	case modeCoupled:
		vc.note.SetText(coupledNote)
		vc.ncrit.Enable()
	case modeEstimate:
		vc.note.SetText(viscousNote)
		vc.ncrit.Disable()
	default:
		vc.note.SetText(inviscidNote)
		vc.ncrit.Disable()
	}
	vc.tu.SetText(turbulenceText(v.CriticalN()))
}

// turbulenceText says what N means: by Mack's correlation, the
// free-stream turbulence level it stands for.
func turbulenceText(n float64) string {
	return fmt.Sprintf("Transition where disturbances have grown e^N times. N %s stands for a free-stream turbulence of about %s %% "+
		"(Mack 1977: N = −8.43 − 2.4 ln Tu); 9 is a quiet wind tunnel, a lower N a more turbulent stream (coupled solution only).",
		entryNum(n), sig2(100*model.TurbulenceForN(n)))
}

// sig2 formats x with two significant digits in plain decimals.
func sig2(x float64) string { return fmt.Sprintf("%.2g", x) }

func (vc *viscousControls) sync(st *model.Study) {
	v := st.Viscous
	vc.mode.SetSelected(modeName(v))
	vc.showMode(v)
	setIfDiffers(vc.ncrit, optionalText(v.TransitionN), optionalIs(v.TransitionN))
	setIfDiffers(vc.upper, optionalText(v.TripUpper), optionalIs(v.TripUpper))
	setIfDiffers(vc.lower, optionalText(v.TripLower), optionalIs(v.TripLower))
	setMessage(vc.msg, nil)
}
