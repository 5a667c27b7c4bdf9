package modeltest

import "sectionbench/model"

// KTCase is a Kármán–Trefftz section at an angle of attack, with the exact
// solution available from Exact.
type KTCase struct {
	Name string
	KT   model.KarmanTrefftz
	// MappingAlphaDeg is the freestream angle in the mapping plane; the
	// normalised section sees AlphaDeg().
	MappingAlphaDeg float64
	// RefCl is a lift coefficient quoted from outside the project for
	// this case, or 0 if there is none (then use Exact().Cl).
	RefCl float64
	// Source names where RefCl or the case comes from.
	Source string
}

// AlphaDeg returns the angle of attack relative to the normalised
// section's chord: MappingAlphaDeg − KT.ChordAngleDeg().
func (c KTCase) AlphaDeg() float64 { return c.MappingAlphaDeg - c.KT.ChordAngleDeg() }

// Exact returns the exact solution at AlphaDeg.
func (c KTCase) Exact() *model.KTExact { return c.KT.Exact(c.AlphaDeg()) }

// KTCases are finite-trailing-edge-angle Kármán–Trefftz cases (τ ≥ 5°, so
// that panel methods converge cleanly at the trailing edge; docs/validation.md
// §2 and §7). The exact solution is that of Milne-Thomson, Theoretical
// Hydrodynamics, and Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., ch.
// 6, computed by model.KarmanTrefftz.Exact.
var KTCases = []KTCase{
	{
		Name:            "reference",
		KT:              model.KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 10},
		MappingAlphaDeg: 5,
		RefCl:           1.2514,
		Source:          "docs/validation.md §2: μ = (−0.1, 0.1), b = 1, τ = 10°, α = 5° in the mapping plane, chord = largest distance from the TE [derived]",
	},
	{
		Name:            "thin",
		KT:              model.KarmanTrefftz{CenterX: -0.04, CenterY: 0.05, TEAngleDeg: 5},
		MappingAlphaDeg: 3,
		Source:          "project case: about 7% thick, moderate camber",
	},
	{
		Name:            "inverted",
		KT:              model.KarmanTrefftz{CenterX: -0.12, CenterY: -0.12, TEAngleDeg: 15},
		MappingAlphaDeg: -4,
		Source:          "project case: negative camber at negative incidence, as a wing element mounted upside down",
	},
}
