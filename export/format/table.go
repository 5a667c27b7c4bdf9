package format

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"

	"sectionbench/model"
	"sectionbench/solver"
	bl "sectionbench/solver/boundarylayer"
	"sectionbench/solver/engine"
)

// mmPerM converts the Layout's metres to the tables' millimetres.
const mmPerM = 1000

// TableDigits is the number of significant digits of numbers in the CSV
// tables: more than any of the results deserves, so that rounding in the
// file never shows in a comparison.
const TableDigits = 7

// cell formats v for a table: TableDigits significant digits, an empty
// cell for a value that is not available (NaN) and no negative zero.
func cell(v float64) string {
	if math.IsNaN(v) {
		return ""
	}
	if v == 0 {
		return "0"
	}
	return strconv.FormatFloat(v, 'g', TableDigits, 64)
}

// table writes rows of cells as CSV.
type table struct {
	cw *csv.Writer
}

func newTable(w io.Writer, head ...string) (*table, error) {
	t := &table{cw: csv.NewWriter(w)}
	return t, t.cw.Write(head)
}

func (t *table) row(cells ...string) error { return t.cw.Write(cells) }

func (t *table) close() error {
	t.cw.Flush()
	return t.cw.Error()
}

// WriteCpTable writes the surface pressure of every element as CSV after
// the metadata m, one row per panel in node order: element, side (upper or
// lower), x_mm and y_mm (panel midpoint in the study frame, the solution's
// metres × 1000), xc (along the element's own chord), cp and
// tangential_velocity (over the freestream speed, positive along the node
// ordering), both inviscid, which the metadata says (the workbench shows
// the coupled viscous Cp beside them; the bl table has it).
func WriteCpTable(w io.Writer, m Metadata, sol *solver.Solution) error {
	if sol == nil {
		panic("format: nil solution")
	}
	if math.IsNaN(m.AlphaDeg) {
		m.AlphaDeg = sol.AlphaDeg
	}
	if err := m.write(w, "x_mm and y_mm in millimetres in the study frame as mounted (x downstream, y up); cp and tangential_velocity without units (tangential_velocity over the freestream speed, positive along the node order); both are the panel method's, inviscid: with the coupled viscous solution the bl table gives its cp at each station",
		"along each element's own chord from its leading edge"); err != nil {
		return err
	}
	t, err := newTable(w, "element", "side", "x_mm", "y_mm", "xc", "cp", "tangential_velocity")
	if err != nil {
		return err
	}
	for _, e := range sol.Elements {
		for _, p := range e.Panels {
			if err := t.row(e.Name, p.Side.String(), cell(p.X*mmPerM), cell(p.Y*mmPerM), cell(p.XC), cell(p.Cp), cell(p.Vt)); err != nil {
				return err
			}
		}
	}
	return t.close()
}

// WriteSweepTable writes a sweep as CSV after the metadata m, one row per
// angle: alpha_deg, cl (from circulation), cl_pressure, cm, cp_min and
// cp_min_xc; when viscous is not nil, also cd, transition_upper_xc,
// transition_lower_xc, separation_upper_xc and separation_lower_xc (on the
// main element) from the boundary-layer estimate, empty where there is
// none or it is not available; last, flags: the row's plausibility
// cautions in words (flagsCell). viscous must be nil or as long as sweep.
func WriteSweepTable(w io.Writer, m Metadata, sweep []solver.Coefficients, viscous []engine.ViscousPoint) error {
	if viscous != nil && len(viscous) != len(sweep) {
		panic(fmt.Sprintf("format: %d boundary-layer points for %d sweep angles", len(viscous), len(sweep)))
	}
	m.AlphaDeg = NoAngle
	if err := m.write(w, "alpha_deg in degrees; coefficients without units on the reference chord, cl positive away from the ground (standard sense), cm nose-up positive; "+flagsUnits,
		"along the main element's own chord from its leading edge; empty: none found or outside the method's range"); err != nil {
		return err
	}
	head := []string{"alpha_deg", "cl", "cl_pressure", "cm", "cp_min", "cp_min_xc"}
	if viscous != nil {
		head = append(head, "cd", "transition_upper_xc", "transition_lower_xc", "separation_upper_xc", "separation_lower_xc")
	}
	t, err := newTable(w, append(head, "flags")...)
	if err != nil {
		return err
	}
	for i, c := range sweep {
		r := []string{cell(c.AlphaDeg), cell(c.Cl), cell(c.ClPressure), cell(c.Cm), cell(c.CpMin), cell(c.XCpMin)}
		if viscous != nil {
			v := viscous[i]
			r = append(r, cell(v.Cd), cell(v.TransitionUpper), cell(v.TransitionLower), cell(v.SeparationUpper), cell(v.SeparationLower))
		}
		var v *engine.ViscousPoint
		if viscous != nil {
			v = &viscous[i]
		}
		r = append(r, flagsCell(engine.RowFlags(c, m.hOverC(), v, nil)))
		if err := t.row(r...); err != nil {
			return err
		}
	}
	return t.close()
}

// WriteCoupledSweepTable writes a sweep with the coupled viscous solution
// as CSV after the metadata m, one row per angle: alpha_deg; cl, cd and
// cm from the coupled solution (empty where the row did not converge);
// cl_inviscid (from circulation) and cm_inviscid; converged and
// past_cl_max (yes or no), iterations and residual; transition and
// separation x/c per surface of the main element (empty: none, or not
// converged); flags, the row's plausibility cautions in words
// (flagsCell). coupled must be as long as sweep.
func WriteCoupledSweepTable(w io.Writer, m Metadata, sweep []solver.Coefficients, coupled []engine.CoupledPoint) error {
	if len(coupled) != len(sweep) {
		panic(fmt.Sprintf("format: %d coupled points for %d sweep angles", len(coupled), len(sweep)))
	}
	m.AlphaDeg = NoAngle
	if err := m.write(w, "alpha_deg in degrees; coefficients without units on the reference chord, cl positive away from the ground (standard sense), cm nose-up positive; cl, cd and cm from the coupled viscous solution, empty where it did not converge; "+flagsUnits,
		"along the main element's own chord from its leading edge; empty: none found, or the row did not converge"); err != nil {
		return err
	}
	t, err := newTable(w, "alpha_deg", "cl", "cd", "cm", "cl_inviscid", "cm_inviscid", "converged", "past_cl_max", "iterations", "residual",
		"transition_upper_xc", "transition_lower_xc", "separation_upper_xc", "separation_lower_xc", "flags")
	if err != nil {
		return err
	}
	yes := map[bool]string{true: "yes", false: "no"}
	for i, c := range sweep {
		p := coupled[i]
		e := p.Elements[0]
		if err := t.row(cell(c.AlphaDeg), cell(p.Cl), cell(p.Cd), cell(p.Cm), cell(c.Cl), cell(c.Cm), yes[p.Converged], yes[p.PastClMax],
			strconv.Itoa(p.Iterations), cell(p.Residual),
			cell(e.TransitionUpper), cell(e.TransitionLower), cell(e.SeparationUpper), cell(e.SeparationLower),
			flagsCell(engine.RowFlags(c, m.hOverC(), nil, &p))); err != nil {
			return err
		}
	}
	return t.close()
}

// WriteBoundaryLayerTable writes the boundary-layer estimate as CSV after
// the metadata m, one row per station from the stagnation point to the
// trailing edge, upper surface then lower for each element: element, side,
// arc_length_over_chord (from the stagnation point), xc, edge_velocity
// (over the freestream speed), momentum_thickness_over_chord,
// displacement_thickness_over_chord, shape_factor, skin_friction (on the
// freestream dynamic pressure) and turbulent (yes or no). Values past a
// turbulent separation are empty.
func WriteBoundaryLayerTable(w io.Writer, m Metadata, vr *solver.ViscousResult) error {
	if vr == nil {
		panic("format: nil boundary-layer result")
	}
	if err := m.write(w, "lengths over each element's own chord; velocities over the freestream speed; skin_friction on the freestream dynamic pressure",
		"along each element's own chord from its leading edge"); err != nil {
		return err
	}
	t, err := newTable(w, "element", "side", "arc_length_over_chord", "xc", "edge_velocity", "momentum_thickness_over_chord",
		"displacement_thickness_over_chord", "shape_factor", "skin_friction", "turbulent")
	if err != nil {
		return err
	}
	at := func(v []float64, i int) float64 {
		if i < len(v) {
			return v[i]
		}
		return math.NaN()
	}
	for _, e := range vr.Elements {
		for _, side := range []struct {
			name string
			s    solver.SurfaceBL
		}{{solver.Upper.String(), e.Upper}, {solver.Lower.String(), e.Lower}} {
			s := side.s
			for i := range s.XC {
				turb := "no"
				if i < len(s.Turbulent) && s.Turbulent[i] {
					turb = "yes"
				}
				err := t.row(e.Name, side.name, cell(at(s.S, i)), cell(s.XC[i]), cell(at(s.Ue, i)), cell(at(s.Theta, i)),
					cell(at(s.DeltaStar, i)), cell(at(s.H, i)), cell(at(s.Cf, i)), turb)
				if err != nil {
					return err
				}
			}
		}
	}
	return t.close()
}

// WriteCoupledBoundaryLayerTable writes a converged coupled viscous
// solution's boundary layers and wakes as CSV after the metadata m, one
// row per station: element, side (upper, lower or wake; surfaces from the
// stagnation point to the trailing edge, the wake from the trailing edge
// downstream), arc_length_over_chord (from the stagnation point, or from
// the trailing edge on a wake), xc (1 + distance over chord on a wake),
// edge_velocity (over the freestream speed), cp,
// momentum_thickness_over_chord, displacement_thickness_over_chord,
// shape_factor, skin_friction (on the local edge velocity), amplification
// (the e^N exponent; the critical value from transition on),
// shear_stress_coefficient (turbulent and wake stations, empty on laminar
// ones) and regime
// (laminar, turbulent or wake).
func WriteCoupledBoundaryLayerTable(w io.Writer, m Metadata, cs *solver.CoupledSolution) error {
	if cs == nil {
		panic("format: nil coupled solution")
	}
	if err := m.write(w, "lengths over each element's own chord; velocities over the freestream speed; skin_friction on the local edge dynamic pressure",
		"along each element's own chord from its leading edge; on a wake 1 + the distance behind the trailing edge over the chord"); err != nil {
		return err
	}
	t, err := newTable(w, "element", "side", "arc_length_over_chord", "xc", "edge_velocity", "cp", "momentum_thickness_over_chord",
		"displacement_thickness_over_chord", "shape_factor", "skin_friction", "amplification", "shear_stress_coefficient", "regime")
	if err != nil {
		return err
	}
	for _, e := range cs.Elements {
		for _, side := range []struct {
			name string
			s    solver.CoupledSurface
		}{{solver.Upper.String(), e.Upper}, {solver.Lower.String(), e.Lower}, {"wake", e.Wake}} {
			for _, p := range side.s.Stations {
				ctau := p.CTau
				if p.Regime == bl.Laminar {
					ctau = math.NaN() // no turbulent shear stress: an empty cell
				}
				err := t.row(e.Name, side.name, cell(p.Xi), cell(p.XC), cell(p.Ue), cell(p.Cp), cell(p.Theta), cell(p.DStar),
					cell(p.H), cell(p.Cf), cell(p.N), cell(ctau), p.Regime.String())
				if err != nil {
					return err
				}
			}
		}
	}
	return t.close()
}

// flagsUnits says what the sweep tables' flags column holds.
const flagsUnits = "flags: the row's plausibility cautions in words, separated by semicolons, none when there is none"

// flagsCell writes a row's plausibility flags (engine.RowFlags) as their
// kinds in words, "none" for none.
func flagsCell(flags []model.Flag) string {
	if len(flags) == 0 {
		return "none"
	}
	return model.FlagWords(flags)
}

// hOverC is m's clearance over chord as the flags take it: NaN in free air.
func (m Metadata) hOverC() float64 {
	if m.ClearanceOverChord > 0 {
		return m.ClearanceOverChord
	}
	return math.NaN()
}
