package session

import (
	"sectionbench/model"
)

// Flow editing: the controller's side.

// SetSpeed sets the freestream speed in m/s (0: none, results stay
// non-dimensional). A study that gains its first speed turns the viscous
// solution on (model.Study.FollowFlow).
func (c *Controller) SetSpeed(key string, mps float64) error {
	return c.Edit(key, func(s *model.Study) {
		prev := s.Flow
		s.Flow.SpeedMPS = mps
		s.FollowFlow(prev)
	})
}

// SetAir sets the air temperature (°C) and static pressure (Pa).
func (c *Controller) SetAir(key string, tempC, pressurePa float64) error {
	return c.Edit(key, func(s *model.Study) { s.Flow.TemperatureC, s.Flow.PressurePa = tempC, pressurePa })
}

// ResetAir sets the air to the standard sea-level atmosphere.
func (c *Controller) ResetAir() error {
	a := model.ISASeaLevel()
	return c.SetAir("", a.TemperatureC(), a.PressurePa)
}

// SetSpan sets the span for total forces in m (0: per metre only).
func (c *Controller) SetSpan(key string, m float64) error {
	return c.Edit(key, func(s *model.Study) { s.Flow.SpanM = m })
}

// SetEndPlateHeight sets the end plates' height in mm for the
// finite-span estimate (0: none).
func (c *Controller) SetEndPlateHeight(key string, mm float64) error {
	return c.Edit(key, func(s *model.Study) { s.Flow.EndPlateHeightMM = mm })
}

// SetReynolds sets a Reynolds number on the first element's chord that
// overrides the one from the speed (0: from the speed).
// Like a speed, a first Reynolds number turns the viscous solution on.
func (c *Controller) SetReynolds(key string, re float64) error {
	return c.Edit(key, func(s *model.Study) {
		prev := s.Flow
		s.Flow.Reynolds = re
		s.FollowFlow(prev)
	})
}

// SetViscous sets the boundary-layer estimate's settings.
func (c *Controller) SetViscous(key string, v model.Viscous) error {
	return c.Edit(key, func(s *model.Study) { s.Viscous = v })
}
