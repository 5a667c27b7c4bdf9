package model

import (
	"fmt"
	"math"
)

// Agreement of the two lifts a panel solution gives: from the circulation
// (Kutta–Joukowski) and from integrating the surface pressure. Both
// converge to the same value as panels shrink (second order for this
// method; observed order 1.97–2.05, README); on a resolved section they
// agree to about 1 % at 160 panels and 7 % at 40 (NACA 0012 at 4°,
// uniform spacing: 0.4777 against 0.4463). A gap wider than
// LiftAgreementRel of the larger, plus LiftAgreementAbs for lifts near
// zero, is more than the discretisation explains: a panelling that does
// not resolve the geometry (35.97 against −5863 was seen).
const (
	LiftAgreementRel = 0.1
	LiftAgreementAbs = 0.02
)

// LiftDisagreement returns a warning when the circulation lift cl and the
// pressure lift clPressure differ by more than the discretisation allows,
// or "" when they agree.
func LiftDisagreement(cl, clPressure float64) string {
	d := math.Abs(cl - clPressure)
	if d <= LiftAgreementRel*math.Max(math.Abs(cl), math.Abs(clPressure))+LiftAgreementAbs {
		return ""
	}
	return fmt.Sprintf("the lift from circulation (Cl %.4g) and from the surface pressure (Cl %.4g) disagree by more than the panelling explains: the panels do not resolve the geometry; do not use these numbers — check the section and raise the panel count or change the spacing", cl, clPressure)
}
