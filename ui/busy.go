package ui

import (
	"sync"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"
)

// busyDelay is how long a solve may take before the window says it is
// working: below about 200 ms a change feels immediate and a flashing
// indicator would only distract (common practice in interface design).
const busyDelay = 200 * time.Millisecond

// busyText marks the views as showing the result before the change.
const busyText = "Solving… the views show the previous result"

// busyMark is the status line's busy indicator: shown when the result of
// the latest change has not been shown busyDelay after the change, with a
// note that what is on screen is stale; hidden when it arrives.
type busyMark struct {
	box   *fyne.Container
	spin  *widget.Activity
	label *widget.Label

	// onShow and onHide run on the UI goroutine as the mark appears and
	// goes: the views mark themselves out of date.
	onShow, onHide func()

	mu     sync.Mutex
	want   uint64 // generation of the latest request
	showed uint64 // generation of the result on screen
}

func newBusyMark() *busyMark {
	b := &busyMark{spin: widget.NewActivity(), label: widget.NewLabel(busyText)}
	b.label.Importance = widget.WarningImportance
	b.box = container.NewHBox(b.spin, b.label)
	b.box.Hide()
	return b
}

// waitFor notes that request gen was made and arms the indicator; do runs
// a function on the UI goroutine. UI goroutine.
func (b *busyMark) waitFor(gen uint64, do func(func())) {
	b.mu.Lock()
	if gen <= b.want {
		b.mu.Unlock()
		return
	}
	b.want = gen
	b.mu.Unlock()
	time.AfterFunc(busyDelay, func() {
		do(func() {
			if b.pending() && b.box.Hidden {
				b.box.Show()
				b.spin.Start()
				if b.onShow != nil {
					b.onShow()
				}
			}
		})
	})
}

// shown notes that the result of request gen is on screen. UI goroutine.
func (b *busyMark) shown(gen uint64) {
	b.mu.Lock()
	b.showed = max(b.showed, gen)
	b.mu.Unlock()
	if !b.pending() && !b.box.Hidden {
		b.spin.Stop()
		b.box.Hide()
		if b.onHide != nil {
			b.onHide()
		}
	}
}

// pending reports whether the latest request's result is not yet shown.
func (b *busyMark) pending() bool {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.showed < b.want
}

// Visible reports whether the indicator is on screen.
func (b *busyMark) Visible() bool { return !b.box.Hidden }
