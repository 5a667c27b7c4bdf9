package ui

import (
	"errors"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
)

// viscousNote says what the boundary-layer estimate is and is not.
const viscousNote = "One-way estimate: the boundary layer grows on the inviscid pressures but does not displace the flow " +
	"(no displacement coupling), so Cl, Cm and Cp stay inviscid. Drag is a 2-D profile-drag estimate; validate by test."

// viscousControls switch the boundary-layer estimate and set its trips.
type viscousControls struct {
	c *controls

	enabled *widget.Check
	upper   *field
	lower   *field
	msg     *widget.Label
}

func newViscousControls(c *controls) *viscousControls {
	vc := &viscousControls{c: c}
	ctl := c.w.ctl
	vc.msg = message()
	vc.enabled = widget.NewCheck("Estimate the boundary layer and drag", func(on bool) {
		if c.syncing {
			return
		}
		v := ctl.state.study.Viscous
		v.Enabled = on
		if err := ctl.SetViscous("", v); err != nil {
			setMessage(vc.msg, err)
			c.syncing = true
			vc.enabled.SetChecked(!on) // the study did not change
			c.syncing = false
			return
		}
		setMessage(vc.msg, nil)
	})
	vc.upper, vc.lower = newField(c.w, vc.msg, vc.editTrips), newField(c.w, vc.msg, vc.editTrips)
	for _, e := range []*field{vc.upper, vc.lower} {
		e.SetPlaceHolder("free")
	}
	return vc
}

func (vc *viscousControls) box() fyne.CanvasObject {
	return container.NewVBox(
		vc.enabled,
		caption(viscousNote),
		container.NewGridWithColumns(2, labelled("trip, upper surface (x/c)", vc.upper), labelled("trip, lower surface (x/c)", vc.lower)),
		caption("Empty or 0: free transition (Michel). Surfaces as drawn: inverted, the lower surface is the suction side."),
		vc.msg,
	)
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
	v := ctl.state.study.Viscous
	v.TripUpper, v.TripLower = t[0], t[1]
	return ctl.SetViscous("", v)
}

func (vc *viscousControls) sync(st *model.Study) {
	v := st.Viscous
	vc.enabled.SetChecked(v.Enabled)
	setIfDiffers(vc.upper, optionalText(v.TripUpper), optionalIs(v.TripUpper))
	setIfDiffers(vc.lower, optionalText(v.TripLower), optionalIs(v.TripLower))
	setMessage(vc.msg, nil)
}
