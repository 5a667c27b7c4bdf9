package engine_test

import (
	"context"
	"fmt"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// A study with the coupled viscous solution: NACA 0012 on a 1 m chord at
// Re 6e6, tripped at 5 % chord on both surfaces, at 4°. The result holds
// the viscous point beside the inviscid solution; read its numbers only
// when it converged.
func ExampleEngine_Run_coupled() {
	st := model.NewStudy()
	st.Elements[0].Section = model.SectionSource{Spec: "naca:0012"}
	st.Elements[0].ChordMM = 1000
	st.Flow.AlphaDeg, st.Flow.Reynolds = 4, 6e6
	st.Viscous = model.Viscous{Enabled: true, Mode: model.ViscousCoupled, TripUpper: 0.05, TripLower: 0.05}
	sec, _, err := model.SectionFromSpec("naca:0012", nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: []*model.Section{sec}})
	if err != nil {
		fmt.Println(err)
		return
	}
	c := res.Coupled
	if !c.Converged {
		fmt.Printf("not converged after %d iterations: no viscous numbers\n", c.Iterations)
		return
	}
	fmt.Println("converged:", c.Converged)
	fmt.Println("viscous lift below inviscid:", c.Cl < c.ClInviscid)
	fmt.Printf("transition x/c upper %.2f, lower %.2f (the trips)\n", c.Elements[0].TransitionUpper, c.Elements[0].TransitionLower)
	// Output:
	// converged: true
	// viscous lift below inviscid: true
	// transition x/c upper 0.05, lower 0.05 (the trips)
}
