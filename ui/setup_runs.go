package ui

import (
	"context"
	"math"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"sectionbench/ui/session"
)

// runControls is a set-up tab's Run and Cancel buttons and progress bar
// and the run they control: one at a time, a newer run superseding an
// older one, whose results are then dropped (current, end). UI goroutine
// only, except the work launch starts.
type runControls struct {
	run, cancel *widget.Button
	progress    *widget.ProgressBar
	row         fyne.CanvasObject // Run with Cancel beside it

	running context.CancelFunc
	gen     int // runs started
}

func newRunControls(label string, start func()) *runControls {
	c := &runControls{}
	c.run = widget.NewButton(label, start)
	c.run.Importance = widget.HighImportance
	c.cancel = widget.NewButton("Cancel", c.stop)
	c.cancel.Hide()
	c.progress = widget.NewProgressBar()
	c.progress.Hide()
	c.row = container.NewBorder(nil, nil, nil, c.cancel, c.run)
	return c
}

// launch stops a running run and runs work on a goroutine of its own,
// counted in act, with the new run's context and generation; work posts
// what it finds back to the UI goroutine, where current and end tell
// whether it still belongs to the newest run.
func (c *runControls) launch(act *session.Activity, work func(ctx context.Context, gen int)) {
	c.stop()
	c.gen++
	gen := c.gen
	ctx, cancel := context.WithCancel(context.Background())
	c.running = cancel
	c.run.Disable()
	c.cancel.Show()
	c.progress.SetValue(0)
	c.progress.Show()
	act.Add()
	go func() {
		defer act.Done()
		defer cancel()
		work(ctx, gen)
	}()
}

// current reports whether run gen is the newest.
func (c *runControls) current(gen int) bool { return gen == c.gen }

// progressed shows the newest run's progress, a fraction.
func (c *runControls) progressed(gen int, frac float64) {
	if c.current(gen) {
		c.progress.SetValue(math.Min(1, frac))
	}
}

// end marks run gen finished and gives the buttons back; it reports false,
// doing nothing, for a run a newer one superseded.
func (c *runControls) end(gen int) bool {
	if !c.current(gen) {
		return false
	}
	c.running = nil
	c.run.Enable()
	c.cancel.Hide()
	c.progress.Hide()
	return true
}

// stop cancels the running run; what it found so far stays.
func (c *runControls) stop() {
	if c.running != nil {
		c.running()
		c.running = nil
	}
}

// busy reports whether a run is going on.
func (c *runControls) busy() bool { return c.running != nil }
