package model

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

func airRelErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// TestISASeaLevel checks the sea-level values of the U.S. Standard
// Atmosphere, 1976 (NOAA/NASA/USAF): ρ = 1.2250 kg/m³,
// μ = 1.7894e-5 Pa·s, ν = 1.4607e-5 m²/s (docs/validation.md §6).
func TestISASeaLevel(t *testing.T) {
	a := ISASeaLevel()
	for _, c := range []struct {
		name      string
		got, want float64
		tol       float64 // relative; half a unit in the last tabulated digit
	}{
		{"density", a.Density(), 1.2250, 0.5e-4 / 1.2250},
		{"viscosity", a.Viscosity(), 1.7894e-5, 0.5e-9 / 1.7894e-5},
		{"kinematic viscosity", a.KinematicViscosity(), 1.4607e-5, 0.5e-9 / 1.4607e-5},
		{"temperature °C", a.TemperatureC(), 15, 1e-12},
	} {
		if e := airRelErr(c.got, c.want); e > c.tol {
			t.Errorf("%s = %.6g, want %.6g (rel. error %.2g > %.2g)", c.name, c.got, c.want, e, c.tol)
		}
	}
}

// TestReynoldsRaceCar checks Re = V c / ν for a 250 mm chord at 60 km/h in
// sea-level air against the closed form with the tabulated ν of the U.S.
// Standard Atmosphere, 1976: (60/3.6)(0.25)/1.4607e-5.
func TestReynoldsRaceCar(t *testing.T) {
	a := ISASeaLevel()
	v := KmhToMps(60)
	if e := airRelErr(v, 60.0/3.6); e > 1e-15 {
		t.Fatalf("KmhToMps(60) = %g", v)
	}
	want := (60.0 / 3.6) * 0.25 / 1.4607e-5
	got := Reynolds(v, 0.25, a)
	if e := airRelErr(got, want); e > 1e-4 { // ν is tabulated to 5 figures
		t.Errorf("Re = %.1f, want %.1f", got, want)
	}
	// q = ½ ρ V² with the tabulated ρ.
	if e := airRelErr(DynamicPressure(v, a), 0.5*1.2250*v*v); e > 1e-4 {
		t.Errorf("q = %g, want %g", DynamicPressure(v, a), 0.5*1.2250*v*v)
	}
	if e := airRelErr(MpsToKmh(v), 60); e > 1e-15 {
		t.Errorf("MpsToKmh round trip = %g", MpsToKmh(v))
	}
}

// TestAirProperties checks physical trends: density follows p/T (ideal gas,
// exact ratio), viscosity rises with temperature and does not depend on
// pressure (Sutherland's law).
func TestAirProperties(t *testing.T) {
	cold, err := AirFromCelsius(0, 101325)
	if err != nil {
		t.Fatal(err)
	}
	hot, err := AirFromCelsius(35, 90000)
	if err != nil {
		t.Fatal(err)
	}
	wantRatio := (101325 / 273.15) / (90000 / 308.15)
	if e := airRelErr(cold.Density()/hot.Density(), wantRatio); e > 1e-12 {
		t.Errorf("density ratio %g, want %g", cold.Density()/hot.Density(), wantRatio)
	}
	if !(hot.Viscosity() > cold.Viscosity()) {
		t.Errorf("viscosity did not rise with temperature: %g at 0 °C, %g at 35 °C", cold.Viscosity(), hot.Viscosity())
	}
	lowP := Air{TemperatureK: 273.15, PressurePa: 60000}
	if lowP.Viscosity() != cold.Viscosity() {
		t.Errorf("viscosity depends on pressure")
	}
}

func TestAirFromCelsiusErrors(t *testing.T) {
	for _, c := range []struct {
		name  string
		tc, p float64
		field string // "" means valid
	}{
		{"sea level", 15, 101325, ""},
		{"limits", MinTemperatureC, MaxPressurePa, ""},
		{"too hot", 61, 101325, "flow.temperature_c"},
		{"fahrenheit by mistake", -80, 101325, "flow.temperature_c"},
		{"NaN temperature", math.NaN(), 101325, "flow.temperature_c"},
		{"kPa by mistake", 20, 101.325, "flow.pressure_pa"},
		{"too high", 20, 130e3, "flow.pressure_pa"},
		{"infinite pressure", 20, math.Inf(1), "flow.pressure_pa"},
	} {
		a, err := AirFromCelsius(c.tc, c.p)
		if c.field == "" {
			if err != nil {
				t.Errorf("%s: unexpected error %v", c.name, err)
			} else if a.TemperatureK != c.tc+273.15 || a.PressurePa != c.p {
				t.Errorf("%s: got %+v", c.name, a)
			}
			continue
		}
		var fe *FieldError
		if !errors.As(err, &fe) {
			t.Errorf("%s: error %v is not a *FieldError", c.name, err)
			continue
		}
		if fe.Field != c.field {
			t.Errorf("%s: field %q, want %q", c.name, fe.Field, c.field)
		}
		if math.IsNaN(c.tc) || math.IsInf(c.p, 0) {
			if !errors.Is(err, ErrNonFinite) {
				t.Errorf("%s: error %v does not wrap ErrNonFinite", c.name, err)
			}
		}
	}
}

// ExampleReynolds shows the chord Reynolds number of a 250 mm wing element
// at 60 km/h in standard sea-level air.
func ExampleReynolds() {
	a := ISASeaLevel()
	v := KmhToMps(60)
	fmt.Printf("ρ = %.4f kg/m³, ν = %.4e m²/s\n", a.Density(), a.KinematicViscosity())
	fmt.Printf("Re = %.3g, q = %.0f Pa\n", Reynolds(v, 0.25, a), DynamicPressure(v, a))
	// Output:
	// ρ = 1.2250 kg/m³, ν = 1.4607e-05 m²/s
	// Re = 2.85e+05, q = 170 Pa
}
