package ui

import (
	"sync"

	"sectionbench/ui/session"
)

// renderLoop is the one way the workbench renders off the UI goroutine:
// at most one render runs at a time, and requests made while it runs
// coalesce into a single further run, which reads the newest inputs. A
// burst of requests (a window being resized, keystrokes) therefore costs
// at most two renders, never a goroutine each. The views (plotCanvas) and
// the density window's figures (figureBox) both use it.
type renderLoop struct {
	act *session.Activity // counts the loop's goroutine as work in flight

	mu      sync.Mutex
	running bool
	pending bool
}

// request runs render on the loop's goroutine, now if none runs, else
// once more after the current run. render reads its inputs when it runs
// (under its owner's lock) and posts its result to the UI goroutine.
func (l *renderLoop) request(render func()) {
	l.mu.Lock()
	if l.running {
		l.pending = true
		l.mu.Unlock()
		return
	}
	l.running = true
	l.mu.Unlock()
	l.act.Add()
	go func() {
		defer l.act.Done()
		for {
			render()
			l.mu.Lock()
			if !l.pending {
				l.running = false
				l.mu.Unlock()
				return
			}
			l.pending = false
			l.mu.Unlock()
		}
	}()
}
