package ui

import (
	"testing"
	"time"

	"fyne.io/fyne/v2/test"
)

// TestBusyMark: a result slower than busyDelay shows the indicator with
// the stale note until it arrives; a fast one never shows it.
func TestBusyMark(t *testing.T) {
	test.NewTempApp(t)
	queue := make(chan func(), 4)
	do := func(f func()) { queue <- f }

	b := newBusyMark()
	b.waitFor(1, do)
	(<-queue)() // the delay has passed and the result is not in
	if !b.Visible() || b.label.Text != busyText {
		t.Fatal("a slow solve shows no busy indicator")
	}
	b.shown(1)
	if b.Visible() {
		t.Error("the indicator stays after the result was shown")
	}

	b.waitFor(2, do)
	b.shown(2) // in before the delay
	select {
	case f := <-queue:
		f()
	case <-time.After(2 * busyDelay):
		t.Fatal("the delay never ended")
	}
	if b.Visible() {
		t.Error("a fast solve showed the busy indicator")
	}
}
