// Package session is the study being edited in the workbench, without its
// widgets: the Controller that every control calls (one Edit per change,
// validated by the model, with undo and redo), the scheduler that solves
// each change on a worker goroutine (newest request wins, stale results
// dropped), the sweeps and pins kept with the study, and the counter of
// work in flight that tests wait on.
//
// It does not import Fyne (TestNoFyne checks), so it is tested without a
// driver. Its methods are called on the UI goroutine unless their comment
// says otherwise; it reaches the UI goroutine only through the function the
// window hands to NewController (fyne.Do). Units and conventions are the
// model's (millimetres and degrees in the study; see model/doc.go).
package session
