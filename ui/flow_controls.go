package ui

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// Speed units offered beside the speed field; the study keeps m/s.
const (
	unitKmh = "km/h"
	unitMPS = "m/s"
)

// flowControls are speed, air, span and Reynolds number, with the values
// derived from them.
type flowControls struct {
	c *controls

	speed    *field
	unit     *widget.Select
	temp     *field
	pressure *field
	isa      *widget.Button
	span     *field
	reynolds *field
	msg      *widget.Label
	derived  *widget.Label
}

func newFlowControls(c *controls) *flowControls {
	fc := &flowControls{c: c}
	ctl := c.w.ctl
	fc.msg = message()
	fc.derived = caption("")

	w := c.w
	fc.speed = newField(w, fc.msg, func(s string) error {
		v, err := fc.parseSpeed(s)
		if err != nil {
			return err
		}
		return ctl.SetSpeed("", v)
	})
	fc.speed.SetPlaceHolder("none")
	fc.unit = widget.NewSelect([]string{unitKmh, unitMPS}, func(string) {
		// A view setting: rewrite the field in the new unit.
		// The study keeps its speed: no edit.
		if !c.syncing {
			c.syncing = true
			fc.speed.show(fc.speedText(ctl.Current().Flow.SpeedMPS), nil)
			c.syncing = false
		}
	})
	fc.unit.Selected = unitKmh // the unit a car team thinks in (set before any study exists)
	fc.temp = newField(w, fc.msg, func(s string) error {
		v, err := parseNumber(s)
		if err != nil {
			return errors.New("air temperature must be a number of °C")
		}
		return ctl.SetAir("", v, ctl.Current().Flow.PressurePa)
	})
	fc.pressure = newField(w, fc.msg, func(s string) error {
		v, err := parseNumber(s)
		if err != nil {
			return errors.New("air pressure must be a number of pascals")
		}
		return ctl.SetAir("", ctl.Current().Flow.TemperatureC, v)
	})
	fc.isa = widget.NewButton("ISA sea level", func() { setMessage(fc.msg, ctl.ResetAir()) })

	fc.span = newField(w, fc.msg, func(s string) error {
		v, err := optionalNumber(s)
		if err != nil {
			return errors.New("span must be a number of metres, or empty for forces per metre")
		}
		return ctl.SetSpan("", v)
	})
	fc.span.SetPlaceHolder("per metre")
	fc.reynolds = newField(w, fc.msg, func(s string) error {
		v, err := optionalNumber(s)
		if err != nil {
			return &model.FieldError{Field: "flow.reynolds", Err: errors.New("not a number: enter one (e.g. 3e5), or leave it empty to take it from the speed")}
		}
		return ctl.SetReynolds("", v)
	})
	fc.reynolds.SetPlaceHolder("from the speed")
	return fc
}

// box lays the flow fields out.
func (fc *flowControls) box() fyne.CanvasObject {
	return container.NewVBox(
		labelled("speed (empty: none, coefficients only)", container.NewBorder(nil, nil, nil, sized(fc.unit, 96), fc.speed)),
		container.NewGridWithColumns(2,
			labelled("span (m)", fc.span),
			labelled("Re, first element", fc.reynolds)),
		container.NewGridWithColumns(2, labelled("air temperature (°C)", fc.temp), labelled("air pressure (Pa)", fc.pressure)),
		container.NewBorder(nil, nil, nil, fc.isa),
		fc.msg,
		fc.derived,
	)
}

// optionalNumber reads a field where empty means 0 (not set).
func optionalNumber(s string) (float64, error) {
	if strings.TrimSpace(s) == "" {
		return 0, nil
	}
	return parseNumber(s)
}

// parseSpeed reads the speed field in its unit and returns m/s.
func (fc *flowControls) parseSpeed(s string) (float64, error) {
	v, err := optionalNumber(s)
	if err != nil {
		return 0, fmt.Errorf("speed must be a number of %s, or empty for none", fc.unit.Selected)
	}
	if fc.unit.Selected == unitKmh {
		return model.KmhToMps(v), nil
	}
	return v, nil
}

// speedText formats a speed in m/s in the field's unit ("" for none).
func (fc *flowControls) speedText(mps float64) string {
	if mps == 0 {
		return ""
	}
	if fc.unit.Selected == unitKmh {
		return entryNum(model.MpsToKmh(mps))
	}
	return entryNum(mps)
}

func (fc *flowControls) sync(st *model.Study) {
	f := st.Flow
	setIfDiffers(fc.speed, fc.speedText(f.SpeedMPS), func(s string) bool {
		v, err := fc.parseSpeed(s)
		return err == nil && (v == f.SpeedMPS || entryNum(v) == entryNum(f.SpeedMPS))
	})
	setIfDiffers(fc.temp, entryNum(f.TemperatureC), numberIs(f.TemperatureC))
	setIfDiffers(fc.pressure, entryNum(f.PressurePa), numberIs(f.PressurePa))
	setIfDiffers(fc.span, optionalText(f.SpanM), optionalIs(f.SpanM))
	setIfDiffers(fc.reynolds, optionalText(f.Reynolds), optionalIs(f.Reynolds))
	setMessage(fc.msg, nil)
}

func optionalText(x float64) string {
	if x == 0 {
		return ""
	}
	return entryNum(x)
}

func optionalIs(x float64) func(string) bool {
	return func(s string) bool {
		v, err := optionalNumber(s)
		return err == nil && v == x
	}
}

// showResult shows the air, the dynamic pressure and the Reynolds numbers
// of a result.
func (fc *flowControls) showResult(st *model.Study, res *engine.Result) {
	var parts []string
	if f := res.Forces; f != nil {
		parts = append(parts, "ρ "+fixed(f.Density, 3)+" kg/m³", "μ "+sci(f.Viscosity, 3)+" Pa·s", "q "+num(f.DynamicPressurePa)+" Pa")
	} else if rho, mu, _, err := airProperties(st.Flow.TemperatureC, st.Flow.PressurePa); err == nil {
		parts = append(parts, "ρ "+fixed(rho, 3)+" kg/m³", "μ "+sci(mu, 3)+" Pa·s", "no speed: coefficients only")
	} else {
		parts = append(parts, friendly(err))
	}
	text := strings.Join(parts, " · ")
	if len(res.Reynolds) == len(st.Elements) {
		var re []string
		for i, r := range res.Reynolds {
			re = append(re, st.Elements[i].Name+" "+sci(r, 3))
		}
		text += "\nRe (own chord): " + strings.Join(re, " · ")
	} else {
		text += "\nRe: enter a speed or a Reynolds number"
	}
	fc.derived.SetText(text)
}

// sci formats x with prec significant digits as a power of ten
// ("2.86×10⁵"), plainly when the exponent is 0.
func sci(x float64, prec int) string {
	if x == 0 || math.IsNaN(x) || math.IsInf(x, 0) {
		return fixed(x, 0)
	}
	s := strconv.FormatFloat(x, 'e', prec-1, 64)
	mant, exp, _ := strings.Cut(s, "e")
	n, err := strconv.Atoi(exp)
	if err != nil || n == 0 {
		return model.Minus(mant)
	}
	return model.Minus(mant) + "×10" + superscript(n)
}

func superscript(n int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	d := []rune(digits)
	var b strings.Builder
	if n < 0 {
		b.WriteRune('⁻')
		n = -n
	}
	for _, r := range strconv.Itoa(n) {
		b.WriteRune(d[r-'0'])
	}
	return b.String()
}

// airProperties returns the density (kg/m³), dynamic viscosity (Pa·s) and
// kinematic viscosity (m²/s) of air at tc °C and p Pa.
func airProperties(tc, p float64) (rho, mu, nu float64, err error) {
	a, err := model.AirFromCelsius(tc, p)
	if err != nil {
		return 0, 0, 0, err
	}
	return a.Density(), a.Viscosity(), a.KinematicViscosity(), nil
}
