package session

import (
	"context"
	"errors"
	"fmt"
	"io"
	"reflect"
	"strings"
	"sync"

	"sectionbench/export"
	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// LiveSweepMaxAngles is the longest sweep that runs with every live update;
// a longer one (or one with the boundary-layer estimate on) waits for the
// Run button. With the factorised system cached, 41 angles cost a few
// superpositions each.
const LiveSweepMaxAngles = 41

// maxPins bounds the pins a study keeps; more would make the views unreadable.
const maxPins = 6

// Controller runs every change of the study through one engine call on a
// worker goroutine and keeps the undo history. Its methods are called from
// the UI goroutine; OnResult is called on the worker goroutine.
type Controller struct {
	state studyState
	hist  history
	act   *Activity
	sched *scheduler
	// newEngine makes the engine of a sweep run.
	newEngine func() Runner
	// do runs a function on the UI goroutine (fyne.Do in the window; tests
	// queue).
	do func(func())

	// studyListeners are called in order on the UI goroutine after the
	// study changed (edit, undo, open, save); see Subscribe.
	studyListeners []func()
	// OnResult is called on the worker goroutine with the scene of each
	// result that is still current, or with the error of the current
	// request.
	OnResult func(gen uint64, sc *figure.Scene, res *engine.Result, err error)
	// OnError is called on the UI goroutine when a change could not be
	// made outside an edit (which returns its error instead).
	OnError func(err error)
	// OnRefused is called on the UI goroutine when pending edits are
	// refused because their elements cannot be placed (OnError when nil).
	OnRefused func(err error)
	// pending holds the edits waiting for their placement, nil when none;
	// placing is true while a placement runs. UI goroutine only.
	pending *proposal
	placing bool
	placer  func(*model.Study, []*model.Section) error // checkGeometry; tests hold it

	mu          sync.Mutex
	result      *engine.Result
	resErr      error
	resGen      uint64
	sweep       []solver.Coefficients // shown in the polar; nil when out of date
	sweepVis    []engine.ViscousPoint // boundary-layer estimate of sweep, nil when it has none
	sweepCpl    *coupledSweep         // coupled viscous solution of sweep, nil when it has none
	pinBase     *model.Study          // study of the last pin, for its label
	pinBaseSecs []*model.Section      // its sections
	elem        int                   // element the section controls edit
	sweepRun    context.CancelFunc
	sweepKey    string     // sweepKey of the study c.sweep was run for by RunSweep, "" for a live sweep
	sweeps      sweepCache // sweeps run by RunSweep for configurations left behind, by sweepKey
	pinGen      uint64     // generation a pin waits for; 0 when none (PinCurrent)
	errGen      uint64     // generation whose request failed with resErr

	// SaveWrap, when not nil, stands between Save's encoder and the file
	// (tests: a full disk).
	SaveWrap func(io.Writer) io.Writer
}

// NewController returns a controller with no study: set its hooks and
// subscribe to its changes, then Load one before anything else. do runs a
// function on the UI goroutine (fyne.Do in the window).
func NewController(do func(func())) *Controller {
	if do == nil {
		panic("session: NewController(nil)")
	}
	c := &Controller{act: NewActivity(), newEngine: newEngine, do: do, placer: checkGeometry}
	c.sched = newScheduler(newEngine(), c.act, c.deliver)
	return c
}

// Runner is what the scheduler runs: one call per update. *engine.Engine
// is the real one; tests substitute their own.
type Runner interface {
	Run(ctx context.Context, req engine.Request) (*engine.Result, error)
}

func newEngine() Runner { return engine.NewEngine() }

// SetRunner replaces the engine the live solves run on (tests: one that
// holds or limits its runs). Call it while no solve is in flight
// (WaitIdle).
func (c *Controller) SetRunner(r Runner) {
	c.sched.mu.Lock()
	defer c.sched.mu.Unlock()
	if c.sched.busy {
		panic("session: SetRunner while a solve is in flight")
	}
	c.sched.eng = r
}

// Current returns the study itself, not a copy: read it on the UI
// goroutine and never change it (Edit does).
func (c *Controller) Current() *model.Study { return c.state.study }

// Activity returns the counter of work in flight that WaitIdle waits for;
// renders and other background work of the window count themselves on it.
func (c *Controller) Activity() *Activity { return c.act }

// Latest returns the generation of the newest solve requested; a result
// of an older one is stale.
func (c *Controller) Latest() uint64 { return c.sched.Latest() }

// Study returns a copy of the current study.
func (c *Controller) Study() *model.Study { return c.state.study.Clone() }

// Path returns the study's file, "" if it was never saved.
func (c *Controller) Path() string { return c.state.path }

// Dirty reports unsaved changes.
func (c *Controller) Dirty() bool { return c.state.dirty }

// Reports returns the cleaning reports of the current sections.
func (c *Controller) Reports() []*model.CleanReport { return c.state.reports }

// Sections returns the current cleaned sections.
func (c *Controller) Sections() []*model.Section { return c.state.sections }

// Result returns the newest result shown, its generation and the error of
// the newest request (nil if it succeeded).
func (c *Controller) Result() (*engine.Result, uint64, error) {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.result, c.resGen, c.resErr
}

// Sweep returns the polar data that matches the current study, or nil.
func (c *Controller) Sweep() []solver.Coefficients {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.sweep
}

// SweepViscous returns the boundary-layer estimate at each angle of
// Sweep, or nil when the sweep ran without it.
func (c *Controller) SweepViscous() []engine.ViscousPoint {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.sweepVis
}

// WaitIdle blocks until no solve or render is in flight.
func (c *Controller) WaitIdle() { c.act.Wait() }

// Load replaces the study (New, Open) and forgets the undo history.
func (c *Controller) Load(st *model.Study, path string) error {
	if err := st.Validate(); err != nil {
		return err
	}
	c.state.path = path
	secs, reps, err := export.LoadSections(st, c.state.baseDir())
	if err != nil {
		return err
	}
	c.use(st, secs, reps)
	return nil
}

// Open makes a study file opened with openStudy (the call the command
// line shares) the study of the window.
func (c *Controller) Open(o *export.OpenedStudy, path string) {
	c.state.path = path
	c.use(o.Study, o.Sections, o.Reports)
}

// use makes st, with its loaded sections, the study, with a fresh history.
func (c *Controller) use(st *model.Study, secs []*model.Section, reps []*model.CleanReport) {
	c.CancelSweep()
	c.dropPending()
	c.state.set(st.Clone(), secs, reps)
	c.state.dirty = false
	c.hist.Reset()
	c.elem = 0
	c.mu.Lock()
	c.pinBase, c.sweep, c.sweepVis = nil, nil, nil
	c.sweepKey, c.sweeps = "", nil
	c.sweepCpl = nil
	c.mu.Unlock()
	c.changed(true)
}

// Save writes the study to path and makes it the study's file.
func (c *Controller) Save(path string) error {
	if err := export.SaveStudyThrough(path, c.state.study, c.SaveWrap); err != nil {
		return err
	}
	c.state.path = path
	c.state.dirty = false
	c.notify()
	return nil
}

// Edit applies fn to a copy of the study. If the result is valid and its
// sections load, it becomes the study (one undo step; edits with the same
// non-empty key in a row merge into one) and is solved; otherwise the
// study stays as it was and the error says why. An edit that changes the
// elements is placed first, off the UI goroutine (see placement.go): Edit
// then returns nil at once, and the study changes when the elements can be
// placed without overlapping or touching, or stays as it was, with the
// reason through OnRefused.
func (c *Controller) Edit(key string, fn func(st *model.Study)) error {
	return c.edit(key, fn, nil)
}

// BreakMerge ends a run of merged edits (a slider drag has ended).
func (c *Controller) BreakMerge() { c.hist.Break() }

// Undo goes back one study change; false if there was none.
func (c *Controller) Undo() bool { return c.step(c.hist.Undo) }

// Redo re-applies the change undone last; false if there was none.
func (c *Controller) Redo() bool { return c.step(c.hist.Redo) }

// CanUndo and CanRedo report whether Undo and Redo have a step to take.
func (c *Controller) CanUndo() bool { return c.hist.CanUndo() }
func (c *Controller) CanRedo() bool { return c.hist.CanRedo() }

func (c *Controller) step(f func(*model.Study) (*model.Study, bool)) bool {
	c.dropPending()
	st, ok := f(c.state.study)
	if !ok {
		return false
	}
	secs, reps, err := c.state.sectionsFor(st)
	if err != nil {
		// The snapshot was valid when taken; a section that no longer
		// loads leaves the current study in place.
		c.reportError(err)
		return false
	}
	geometry := !EqualGeometry(c.state.study, st)
	c.state.set(st, secs, reps)
	c.state.dirty = true
	c.changed(geometry)
	return true
}

// changed submits the study for solving and tells the UI.
func (c *Controller) changed(geometry bool) {
	c.dropWaitingPin()
	st := c.state.study
	live := liveSweep(st)
	if geometry || live {
		c.mu.Lock()
		if c.sweep != nil && c.sweepKey != "" {
			c.sweeps.put(c.sweepKey, c.sweep, c.sweepVis, c.sweepCpl)
		}
		c.sweep, c.sweepVis, c.sweepKey = nil, nil, ""
		c.sweepCpl = nil
		if !live {
			// Back to a configuration whose sweep ran (an undo, say): show it again.
			k := sweepKey(st)
			if e, ok := c.sweeps[k]; ok {
				c.sweep, c.sweepVis, c.sweepKey = e.rows, e.vis, k
				c.sweepCpl = e.cpl
			}
		}
		c.mu.Unlock()
	}
	c.sched.Submit(engine.Request{
		Study:       st.Clone(),
		Sections:    c.state.sections,
		Sweep:       live,
		Streamlines: true,
	})
	c.notify()
}

// Subscribe adds f to the functions called on the UI goroutine after
// every change of the study (an edit, undo or redo, a study opened or
// saved, the element chosen), after those subscribed before it. Each part
// of the workbench that follows the study (the window, the autosave, the
// density window) subscribes on its own, so none can detach another. UI
// goroutine only.
func (c *Controller) Subscribe(f func()) {
	if f == nil {
		panic("session: Subscribe(nil)")
	}
	c.studyListeners = append(c.studyListeners, f)
}

func (c *Controller) notify() {
	for _, f := range c.studyListeners {
		f()
	}
}

func (c *Controller) reportError(err error) {
	if c.OnError != nil {
		c.OnError(err)
	}
}

// deliver runs on the worker goroutine with a result that was current when
// its solve ended.
func (c *Controller) deliver(u update, res *engine.Result, err error) {
	var sc *figure.Scene
	c.mu.Lock()
	c.resErr = err
	if err != nil {
		c.errGen = u.gen
	}
	if err == nil {
		c.result, c.resGen = res, u.gen
		if u.req.Sweep {
			c.sweep, c.sweepVis, c.sweepKey = res.Sweep, res.SweepViscous, ""
			c.sweepCpl = coupledSweepOf(res)
		}
		sc = sceneOf(res, u.req.Study, c.sweep, c.sweepVis, c.sweepCpl)
	}
	c.mu.Unlock()
	if c.OnResult != nil {
		c.OnResult(u.gen, sc, res, err)
	}
	c.pinArrived(u.gen, err)
}

// liveSweep reports whether the study's sweep runs with every update.
// Only a free-air inviscid sweep is cheap: in ground effect or with the
// boundary layer every angle is a solve of its own.
func liveSweep(st *model.Study) bool {
	a, err := st.Sweep.Angles()
	return err == nil && len(a) <= LiveSweepMaxAngles && !st.Viscous.Enabled && !st.Ground.Enabled
}

// equalGeometry reports whether a sweep of one study holds for the other:
// they solve the same placed configuration in the same flow. What the
// sweep does not depend on may differ: the angle of attack (the sweep
// sets its own), the sweep range, pins, names, the density plan and the
// span (which only scales forces). The air and speed matter only to the
// boundary-layer estimate, so they may differ when it is off in both.
func EqualGeometry(a, b *model.Study) bool {
	// Shallow copies: only their own top-level fields are overwritten, and
	// reflect.DeepEqual follows the rest, with no encoding per keystroke.
	x, y := *a, *b
	y.Flow.AlphaDeg, y.Flow.SpanM, y.Flow.EndPlateHeightMM = x.Flow.AlphaDeg, x.Flow.SpanM, x.Flow.EndPlateHeightMM
	y.Pins, y.Name, y.Team, y.Sweep, y.Density = x.Pins, x.Name, x.Team, x.Sweep, x.Density
	if !x.Viscous.Enabled && !y.Viscous.Enabled {
		y.Flow.SpeedMPS, y.Flow.TemperatureC, y.Flow.PressurePa, y.Flow.Reynolds = x.Flow.SpeedMPS, x.Flow.TemperatureC, x.Flow.PressurePa, x.Flow.Reynolds
		y.Viscous = x.Viscous
	}
	return reflect.DeepEqual(x, y)
}

// sweepKey identifies what a sweep depends on (see equalGeometry) and its
// range.
func sweepKey(st *model.Study) string {
	x := st.Clone()
	x.Flow.AlphaDeg, x.Flow.SpanM, x.Flow.EndPlateHeightMM = 0, 0, 0
	x.Pins, x.Name, x.Team, x.Density = nil, "", "", model.DensityPlan{}
	if !x.Viscous.Enabled {
		x.Flow.SpeedMPS, x.Flow.TemperatureC, x.Flow.PressurePa, x.Flow.Reynolds = 0, 0, 0, 0
		x.Viscous = model.Viscous{}
	}
	b, err := x.Encode()
	if err != nil {
		return ""
	}
	return string(b)
}

// maxCachedSweeps bounds the sweeps kept for configurations left behind.
const maxCachedSweeps = 8

// sweepCache keeps the sweeps of configurations the study has left, so
// that going back (an undo) shows its sweep without running it again.
type sweepCache map[string]cachedSweep

type cachedSweep struct {
	rows []solver.Coefficients
	vis  []engine.ViscousPoint
	cpl  *coupledSweep
}

// put keeps a sweep, forgetting another when full.
func (m *sweepCache) put(key string, rows []solver.Coefficients, vis []engine.ViscousPoint, cpl *coupledSweep) {
	if *m == nil {
		*m = sweepCache{}
	}
	if _, ok := (*m)[key]; !ok && len(*m) >= maxCachedSweeps {
		for k := range *m {
			delete(*m, k)
			break
		}
	}
	(*m)[key] = cachedSweep{rows, vis, cpl}
}

// RunSweep runs the study's sweep on its own goroutine with an engine of
// its own (an engine serves one goroutine at a time). progress is called on
// the sweep goroutine after each angle that needs its own solve; done on
// the UI goroutine at the end, with context.Canceled if cancelled. A sweep
// whose configuration changed meanwhile (other than the angle of attack) is
// dropped with an error.
func (c *Controller) RunSweep(progress func(done, total int), done func(err error)) error {
	st := c.state.study.Clone()
	if _, err := st.Sweep.Angles(); err != nil {
		return err
	}
	secs := c.state.sections
	ctx, cancel := context.WithCancel(context.Background())
	c.mu.Lock()
	if c.sweepRun != nil {
		c.sweepRun()
	}
	c.sweepRun = cancel
	c.mu.Unlock()
	c.act.Add()
	go func() {
		defer c.act.Done()
		defer cancel()
		res, err := safeRun(c.newEngine(), ctx, engine.Request{Study: st, Sections: secs, Sweep: true, Progress: progress})
		c.do(func() {
			if err == nil && !EqualGeometry(st, c.state.study) {
				err = errors.New("the configuration changed while the sweep ran; run it again")
			}
			if err == nil {
				c.mu.Lock()
				c.sweep, c.sweepVis, c.sweepKey = res.Sweep, res.SweepViscous, sweepKey(st)
				c.sweepCpl = coupledSweepOf(res)
				c.mu.Unlock()
				c.showSweep()
			}
			if done != nil {
				done(err)
			}
		})
	}()
	return nil
}

// showSweep shows the sweep just run. When the result on hand is the
// newest request's, it is presented again with the sweep, off the UI
// goroutine as a solve's result is: solving the study's point again (as
// every change does) took seconds with the coupled solution, and the
// polar stayed empty, or showed the previous sweep, until it ended. Else
// the study is solved as after a change. UI goroutine.
func (c *Controller) showSweep() {
	c.mu.Lock()
	res, gen := c.result, c.resGen
	ready := res != nil && gen == c.sched.Latest() && !(c.resErr != nil && c.errGen == gen)
	var sc *figure.Scene
	if ready {
		sc = sceneOf(res, c.state.study.Clone(), c.sweep, c.sweepVis, c.sweepCpl)
	}
	c.mu.Unlock()
	if !ready || c.OnResult == nil {
		c.changed(false)
		return
	}
	c.act.Add()
	go func() {
		defer c.act.Done()
		c.OnResult(gen, sc, res, nil)
	}()
}

// CancelSweep stops a running sweep.
func (c *Controller) CancelSweep() {
	c.mu.Lock()
	if c.sweepRun != nil {
		c.sweepRun()
		c.sweepRun = nil
	}
	c.mu.Unlock()
}

// PinCurrent freezes the current result as a pin of the study. It never
// waits for a solve: when the newest request is still being solved, the
// pin is taken on the UI goroutine as soon as its result arrives (tests:
// WaitIdle), and an error that prevents it then goes to OnError. A change
// of the study before that result arrives drops the waiting pin, with an
// error through OnError. UI goroutine only.
func (c *Controller) PinCurrent() error {
	if c.pending != nil {
		return errPlacing
	}
	if len(c.state.study.Pins) >= maxPins {
		return fmt.Errorf("at most %d pins; clear them first", maxPins)
	}
	latest := c.sched.Latest()
	c.mu.Lock()
	ready := c.result != nil && c.resGen == latest
	var failed error
	if c.resErr != nil && c.errGen == latest {
		failed = c.resErr
	}
	if !ready && failed == nil {
		c.pinGen = latest
	}
	c.mu.Unlock()
	switch {
	case ready:
		return c.pin()
	case failed != nil:
		return failed
	}
	return nil
}

// pinArrived is called by deliver (worker goroutine) with each result: it
// takes the pin waiting for generation gen on the UI goroutine.
func (c *Controller) pinArrived(gen uint64, err error) {
	c.mu.Lock()
	waiting := c.pinGen != 0 && c.pinGen == gen
	if waiting {
		c.pinGen = 0
	}
	c.mu.Unlock()
	if !waiting {
		return
	}
	c.do(func() {
		if err == nil && gen != c.sched.Latest() {
			err = errors.New("the study changed before its solve finished")
		}
		if err == nil {
			err = c.pin()
		}
		if err != nil && c.OnError != nil {
			c.OnError(fmt.Errorf("the pin was not taken: %w", err))
		}
	})
}

// dropWaitingPin forgets a pin waiting for a solve the study has moved
// past, and says so. UI goroutine.
func (c *Controller) dropWaitingPin() {
	c.mu.Lock()
	waiting := c.pinGen != 0
	c.pinGen = 0
	c.mu.Unlock()
	if waiting && c.OnError != nil {
		c.OnError(errors.New("the pin was not taken: the study changed before its solve finished"))
	}
}

// pin adds the current result, which must be the newest, as a pin. UI
// goroutine.
func (c *Controller) pin() error {
	res, _, _ := c.Result()
	if res == nil {
		return errors.New("no current result to pin yet")
	}
	if c.pending != nil {
		return errPlacing
	}
	label := pinLabel(c.pinBase, c.state.study, c.pinBaseSecs, c.state.sections)
	p := engine.PinOf(label, res, c.Sweep())
	base := c.state.study.Clone()
	if err := c.Edit("", func(st *model.Study) { st.Pins = append(st.Pins, p) }); err != nil {
		return err
	}
	c.pinBase, c.pinBaseSecs = base, c.state.sections
	return nil
}

// RenamePin gives pin i a label of the user's choosing; names must not be
// empty and no two pins may share one.
func (c *Controller) RenamePin(i int, label string) error {
	pins := c.state.study.Pins
	if c.pending != nil {
		return errPlacing
	}
	if i < 0 || i >= len(pins) {
		panic(fmt.Sprintf("session: pin %d out of range", i))
	}
	label = strings.TrimSpace(label)
	if label == "" {
		return errors.New("a pin needs a name")
	}
	for j, p := range pins {
		if j != i && p.Label == label {
			return fmt.Errorf("pin %d is already named %q", j+1, label)
		}
	}
	return c.Edit("", func(st *model.Study) { st.Pins[i].Label = label })
}

// ClearPins removes all pins.
func (c *Controller) ClearPins() error {
	c.pinBase = nil
	return c.Edit("", func(st *model.Study) { st.Pins = nil })
}

// Element returns the element the section controls edit.
func (c *Controller) Element() int {
	if c.elem >= len(c.state.study.Elements) {
		return 0
	}
	return c.elem
}

// SetElement chooses the element the section controls edit. It is a view
// setting, not a change of the study.
func (c *Controller) SetElement(i int) {
	if i < 0 || i >= len(c.state.study.Elements) {
		panic(fmt.Sprintf("session: element %d out of range", i))
	}
	c.elem = i
	c.notify()
}

// SetNACA makes a NACA designation the current element's section. An
// invalid designation returns the reason and leaves the study as it was.
func (c *Controller) SetNACA(designation string) error {
	d := strings.TrimSpace(designation)
	if _, err := model.ParseNACA(d); err != nil {
		return err
	}
	i := c.Element()
	if err := c.editIndex(i); err != nil {
		return err
	}
	return c.Edit("naca", func(st *model.Study) {
		st.Elements[i].Section = model.SectionSource{Spec: "naca:" + d}
	})
}

// SetSectionFile reads, cleans and embeds a coordinate file as the current
// element's section, so the study keeps working if the file moves.
func (c *Controller) SetSectionFile(path string) error {
	sec, rep, err := export.LoadSectionFile(path)
	if err != nil {
		return err
	}
	i := c.Element()
	if err := c.editIndex(i); err != nil {
		return err
	}
	return c.edit("", func(st *model.Study) {
		st.Elements[i].Section = model.EmbedSection(sec)
	}, func() {
		if rep != nil {
			c.state.reports[i] = rep
		}
	})
}

// SetPanelling replaces the panelling; key merges a run of slider ticks.
func (c *Controller) SetPanelling(key string, p model.Panelling) error {
	return c.Edit(key, func(st *model.Study) { st.Panelling = p })
}

// SetAlpha sets the angle of attack in degrees.
func (c *Controller) SetAlpha(key string, deg float64) error {
	return c.Edit(key, func(st *model.Study) { st.Flow.AlphaDeg = deg })
}

// SetSweep sets the sweep range.
func (c *Controller) SetSweep(r model.SweepRange) error {
	if err := r.Validate(); err != nil {
		return err
	}
	return c.Edit("sweep", func(st *model.Study) { st.Sweep = r })
}

// SetKT makes a Kármán–Trefftz section the current element's section.
func (c *Controller) SetKT(k model.KarmanTrefftz) error {
	if err := k.Validate(); err != nil {
		return err
	}
	i := c.Element()
	if err := c.editIndex(i); err != nil {
		return err
	}
	return c.Edit("", func(st *model.Study) {
		st.Elements[i].Section = model.SectionSource{Spec: "kt:" + k.String()}
	})
}

// SetInverted mounts the configuration upside down (suction side down).
func (c *Controller) SetInverted(on bool) error {
	return c.Edit("", func(st *model.Study) { st.SetInverted(on) })
}

// SetGround sets the ground plane.
func (c *Controller) SetGround(key string, g model.Ground) error {
	return c.Edit(key, func(st *model.Study) { st.Ground = g })
}
