package session

import (
	"reflect"

	"sectionbench/model"
)

// An edit that changes the elements is placed before it becomes the study:
// placing costs O(n²) in the panels of each pair of elements (tens of
// milliseconds for five elements of 160 panels), so it runs off the UI
// goroutine. Edit gathers the proposed study and its sections on the UI
// goroutine and returns; a worker places it (checkGeometry) and hands the
// verdict back through do. Until then the edit is pending: edits made
// meanwhile apply to the pending study and wait with it, and the newest
// wins: one placement runs at a time, and when it ends the newest pending
// study is taken if its elements are those just placed, else placed in its
// turn. A study that cannot be placed is refused (OnRefused) and the
// study stays as it was before the pending edits.

// proposal is the pending study: the newest edits waiting for placement.
type proposal struct {
	study *model.Study
	secs  []*model.Section
	reps  []*model.CleanReport
	key   string   // merge key of the newest edit
	after []func() // run on the UI goroutine when it becomes the study, in order
}

// edit is Edit with a function run when the change becomes the study
// (after may be nil): at once, or when its placement succeeds.
func (c *Controller) edit(key string, fn func(st *model.Study), after func()) error {
	base := c.editing()
	next := base.Clone()
	fn(next)
	if err := next.Validate(); err != nil {
		return err
	}
	if err := next.CheckFlow(); err != nil {
		return err
	}
	secs, reps, err := c.sectionsFor(next)
	if err != nil {
		return err
	}
	p := &proposal{study: next, secs: secs, reps: reps, key: key}
	if after != nil {
		p.after = []func(){after}
	}
	if c.pending == nil && samePlacement(c.state.study.Elements, next.Elements) {
		// A panelling change that leaves a gap narrower than its panels
		// is reported by the solve instead.
		c.take(p)
		return nil
	}
	if c.pending != nil {
		p.after = append(c.pending.after, p.after...)
	}
	c.pending = p
	if !c.placing {
		c.place(p)
	}
	return nil
}

// editing returns the study the next edit applies to: the pending one,
// else the study.
func (c *Controller) editing() *model.Study {
	if c.pending != nil {
		return c.pending.study
	}
	return c.state.study
}

// editingSections returns the sections of editing().
func (c *Controller) editingSections() []*model.Section {
	if c.pending != nil {
		return c.pending.secs
	}
	return c.state.sections
}

// sectionsFor returns the cleaned sections of st's elements, reusing the
// pending study's or the study's when the sources are theirs.
func (c *Controller) sectionsFor(st *model.Study) ([]*model.Section, []*model.CleanReport, error) {
	if p := c.pending; p != nil && reflect.DeepEqual(sourcesOf(st), sourcesOf(p.study)) {
		return p.secs, p.reps, nil
	}
	return c.state.sectionsFor(st)
}

// place starts placing p on a worker goroutine. UI goroutine.
func (c *Controller) place(p *proposal) {
	c.placing = true
	st, secs := p.study, p.secs // p's study is never changed: edits clone it
	c.act.Add()
	go func() {
		defer c.act.Done() // after posting the verdict, so WaitIdle sees it
		err := safePlace(c.placer, st, secs)
		c.do(func() { c.placed(p, err) })
	}()
}

// placed takes the verdict on p's placement. UI goroutine.
func (c *Controller) placed(p *proposal, err error) {
	c.placing = false
	newest := c.pending
	switch {
	case newest == nil:
		// Dropped (undo, a study opened) while it was placed.
	case newest != p && !(err == nil && samePlacement(p.study.Elements, newest.study.Elements)):
		c.place(newest) // newer elements: place those
	case err != nil:
		c.pending = nil
		c.refuse(err)
	default:
		c.pending = nil
		c.take(newest)
	}
}

// take makes p the study: one undo step, solved.
func (c *Controller) take(p *proposal) {
	geometry := !EqualGeometry(c.state.study, p.study)
	c.hist.Record(c.state.study, p.key)
	c.state.set(p.study, p.secs, p.reps)
	c.state.dirty = true
	for _, f := range p.after {
		f()
	}
	c.changed(geometry)
}

// dropPending forgets the pending edits (undo, redo, a study opened): the
// placement running, if any, is then ignored.
func (c *Controller) dropPending() { c.pending = nil }

// refuse reports a pending study that could not be placed.
func (c *Controller) refuse(err error) {
	if c.OnRefused != nil {
		c.OnRefused(err)
		return
	}
	c.reportError(err)
}

// Pending reports whether edits are waiting for their placement.
func (c *Controller) Pending() bool { return c.pending != nil }

// samePlacement reports whether two lists of elements place alike: they
// differ at most in their names.
func samePlacement(a, b []model.StudyElement) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		x, y := a[i], b[i]
		y.Name = x.Name
		if !reflect.DeepEqual(x, y) {
			return false
		}
	}
	return true
}

// checkGeometry places the configuration as the solver will and reports
// overlapping elements and gaps too small for the panels
// (*model.GeometryError), so that such an edit can be refused before it
// replaces a configuration that solves.
func checkGeometry(st *model.Study, secs []*model.Section) error {
	_, err := model.Place(st, secs)
	return err
}

// safePlace calls place (checkGeometry; tests hold it) and turns a panic
// into an error.
func safePlace(place func(*model.Study, []*model.Section) error, st *model.Study, secs []*model.Section) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = InternalError("placing the elements", r)
		}
	}()
	return place(st, secs)
}
