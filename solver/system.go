package solver

// System is a configuration's assembled and factorised influence system.
// Filled in by the panel-method implementation.
type System struct{}

// NewSystem assembles and factorises the influence matrix of cfg.
func NewSystem(cfg Config) (*System, error) { panic("solver: NewSystem not implemented yet") }

// Solve returns the flow at freestream angle alphaDeg by superposing the two
// unit solutions.
func (s *System) Solve(alphaDeg float64) *Solution { panic("solver: Solve not implemented yet") }

// Sweep returns the integrated coefficients at each angle.
func (s *System) Sweep(alphaDeg []float64) []Coefficients { panic("solver: Sweep not implemented yet") }
