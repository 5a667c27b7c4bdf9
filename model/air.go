package model

import (
	"fmt"
	"math"
)

// Constants of the U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF, U.S.
// Government Printing Office, 1976).
const (
	// GasConstantAir is the specific gas constant of dry air in J/(kg·K),
	// the value of the ICAO Standard Atmosphere (Doc 7488, from memory);
	// the 1976 standard's R*/M₀ = 8314.32/28.9644 agrees to five figures.
	GasConstantAir = 287.05287
	// SeaLevelTemperatureK is the standard sea-level temperature.
	SeaLevelTemperatureK = 288.15
	// SeaLevelPressurePa is the standard sea-level pressure.
	SeaLevelPressurePa = 101325.0
	// CelsiusZeroK is 0 °C in kelvin.
	CelsiusZeroK = 273.15
)

// Sutherland's law constants as tabulated in the U.S. Standard Atmosphere,
// 1976 (Sutherland, Phil. Mag. 36, 1893).
const (
	SutherlandBeta = 1.458e-6 // kg/(m·s·K^½)
	SutherlandS    = 110.4    // K
)

// Ranges of air state that AirFromCelsius accepts. They cover any outdoor
// test a car team will run, with margin, and keep Sutherland's law and the
// ideal-gas law well inside their range of validity; values outside them
// are almost certainly typing mistakes (kPa entered as Pa, °F as °C).
const (
	MinTemperatureC = -60.0
	MaxTemperatureC = 60.0
	MinPressurePa   = 50e3
	MaxPressurePa   = 120e3
)

// Air is a state of dry air at rest: absolute temperature and static
// pressure.
type Air struct {
	TemperatureK float64
	PressurePa   float64
}

// ISASeaLevel returns the standard sea-level air of the U.S. Standard
// Atmosphere, 1976: 288.15 K and 101325 Pa.
func ISASeaLevel() Air {
	return Air{TemperatureK: SeaLevelTemperatureK, PressurePa: SeaLevelPressurePa}
}

// AirFromCelsius returns the air at temperature tc in degrees Celsius and
// static pressure p in pascals. It returns a *FieldError naming
// "flow.temperature_c" or "flow.pressure_pa" when a value is not finite or
// lies outside MinTemperatureC..MaxTemperatureC or
// MinPressurePa..MaxPressurePa.
func AirFromCelsius(tc, p float64) (Air, error) {
	if !finite(tc) {
		return Air{}, &FieldError{Field: "flow.temperature_c", Err: errNotFinite}
	}
	if tc < MinTemperatureC || tc > MaxTemperatureC {
		return Air{}, &FieldError{Field: "flow.temperature_c",
			Err: fmt.Errorf("%g °C is outside %g..%g °C", tc, MinTemperatureC, MaxTemperatureC)}
	}
	if !finite(p) {
		return Air{}, &FieldError{Field: "flow.pressure_pa", Err: errNotFinite}
	}
	if p < MinPressurePa || p > MaxPressurePa {
		return Air{}, &FieldError{Field: "flow.pressure_pa",
			Err: fmt.Errorf("%g Pa is outside %g..%g Pa", p, MinPressurePa, MaxPressurePa)}
	}
	return Air{TemperatureK: tc + CelsiusZeroK, PressurePa: p}, nil
}

// TemperatureC returns the temperature in degrees Celsius.
func (a Air) TemperatureC() float64 { return a.TemperatureK - CelsiusZeroK }

// Density returns ρ = p/(R T) in kg/m³, the ideal-gas law with
// R = GasConstantAir.
func (a Air) Density() float64 {
	return a.PressurePa / (GasConstantAir * a.TemperatureK)
}

// Viscosity returns the dynamic viscosity in Pa·s from Sutherland's law,
//
//	μ = β T^(3/2) / (T + S),
//
// with β = SutherlandBeta and S = SutherlandS (U.S. Standard Atmosphere,
// 1976). It does not depend on pressure.
func (a Air) Viscosity() float64 {
	t := a.TemperatureK
	return SutherlandBeta * t * math.Sqrt(t) / (t + SutherlandS)
}

// KinematicViscosity returns ν = μ/ρ in m²/s.
func (a Air) KinematicViscosity() float64 {
	return a.Viscosity() / a.Density()
}

// Reynolds returns the chord Reynolds number Re = V c / ν for a speed in m/s
// and a chord in metres.
func Reynolds(speed, chord float64, a Air) float64 {
	return speed * chord / a.KinematicViscosity()
}

// DynamicPressure returns q = ½ ρ V² in pascals for a speed in m/s.
func DynamicPressure(speed float64, a Air) float64 {
	return 0.5 * a.Density() * speed * speed
}

// KmhToMps converts km/h to m/s.
func KmhToMps(v float64) float64 { return v / 3.6 }

// MpsToKmh converts m/s to km/h.
func MpsToKmh(v float64) float64 { return v * 3.6 }
