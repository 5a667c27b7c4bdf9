package ui

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"sectionbench/assets"
)

// findButton returns the button labelled text in the window's content or
// overlays (dialogs), or nil.
func findButton(win fyne.Window, text string) *widget.Button {
	var walk func(o fyne.CanvasObject) *widget.Button
	walk = func(o fyne.CanvasObject) *widget.Button {
		switch v := o.(type) {
		case *widget.Button:
			if v.Text == text {
				return v
			}
			return nil
		case *fyne.Container:
			for _, c := range v.Objects {
				if b := walk(c); b != nil {
					return b
				}
			}
			return nil
		case *container.Scroll:
			return walk(v.Content)
		case fyne.Widget:
			for _, c := range test.WidgetRenderer(v).Objects() {
				if b := walk(c); b != nil {
					return b
				}
			}
		}
		return nil
	}
	for _, o := range win.Canvas().Overlays().List() {
		if b := walk(o); b != nil {
			return b
		}
	}
	return walk(win.Content())
}

// autosaveDirForTest makes a temporary folder for the autosave of
// workbenches opened by openAutosaveBench.
func autosaveDirForTest(t *testing.T) string {
	t.Helper()
	test.NewTempApp(t)
	return t.TempDir()
}

// openAutosaveBench opens a headless workbench that autosaves in dir.
func openAutosaveBench(t *testing.T, dir, path string) *Workbench {
	t.Helper()
	return openTestBenchWith(t, path, Options{AutosaveDir: dir})
}

func autosaved(t *testing.T, dir string) (string, bool) {
	t.Helper()
	st, err := readAutosave(filepath.Join(dir, autosaveFile))
	if err != nil {
		t.Fatalf("autosave unreadable: %v", err)
	}
	if st == nil {
		return "", false
	}
	return encoded(t, st), true
}

func TestAutosaveCrashAndRecover(t *testing.T) {
	dir := autosaveDirForTest(t)
	w1 := openAutosaveBench(t, dir, "")
	if w1.autosave == nil {
		t.Fatal("autosave is off with a folder given")
	}
	if _, ok := autosaved(t, dir); ok {
		t.Error("an unchanged study was autosaved")
	}
	w1.controls.panelEntry.submit("90")
	w1.controls.alphaEntry.submit("2.5")
	w1.WaitIdle()
	got, ok := autosaved(t, dir)
	if !ok {
		t.Fatal("a change wrote no autosave")
	}
	want := encoded(t, w1.ctl.Study())
	if got != want {
		t.Error("the autosave is not the current study")
	}

	// Crash: w1 never closes. The next start offers the autosave.
	w2 := openAutosaveBench(t, dir, "")
	a := w2.autosave
	if a.offer == nil || a.recoverB == nil {
		t.Fatal("the next start offers no recovery")
	}
	if got, _ := autosaved(t, dir); got != want {
		t.Error("the autosave changed before the user chose")
	}
	test.Tap(a.recoverB)
	res := current(t, w2)
	if got := encoded(t, w2.ctl.Study()); got != want {
		t.Errorf("recovered study differs:\n%s\nwant\n%s", got, want)
	}
	if !w2.ctl.Dirty() || !strings.Contains(w2.Window().Title(), "•") {
		t.Errorf("a recovered study is not marked unsaved (title %q)", w2.Window().Title())
	}
	if panelCount(res) != 90 || res.Solution.AlphaDeg != 2.5 {
		t.Errorf("result of the recovered study has %d panels at %g°, want 90 at 2.5°", panelCount(res), res.Solution.AlphaDeg)
	}
}

func TestAutosaveDiscard(t *testing.T) {
	dir := autosaveDirForTest(t)
	w1 := openAutosaveBench(t, dir, "")
	w1.controls.panelEntry.submit("70")
	w1.WaitIdle()
	demoStudy, err := decodeStudy(assets.DemoStudy)
	if err != nil {
		t.Fatal(err)
	}
	demo := encoded(t, demoStudy)
	w2 := openAutosaveBench(t, dir, "")
	a := w2.autosave
	if a.offer == nil {
		t.Fatal("no offer")
	}
	test.Tap(a.discardB)
	w2.WaitIdle()
	if _, ok := autosaved(t, dir); ok {
		t.Error("discarding left the autosave")
	}
	if got := encoded(t, w2.ctl.Study()); got != demo || w2.ctl.Dirty() {
		t.Error("discarding changed the open study")
	}
}

func TestAutosaveRemovedWhenSavedAndOnCleanExit(t *testing.T) {
	dir := autosaveDirForTest(t)
	w := openAutosaveBench(t, dir, "")
	w.controls.panelEntry.submit("100")
	w.WaitIdle()
	if _, ok := autosaved(t, dir); !ok {
		t.Fatal("no autosave after a change")
	}
	if err := w.ctl.Save(filepath.Join(t.TempDir(), "wing.json")); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	if _, ok := autosaved(t, dir); ok {
		t.Error("the autosave stays after saving the study")
	}
	w.controls.panelEntry.submit("110")
	w.WaitIdle()
	if _, ok := autosaved(t, dir); !ok {
		t.Fatal("no autosave after a change of a saved study")
	}
	if b, err := os.ReadFile(filepath.Join(dir, autosaveNoteFile)); err != nil || !strings.HasSuffix(string(b), "wing.json") {
		t.Errorf("the autosave note says %q (%v), want the study's file", b, err)
	}
	w.closeRequested()
	b := findButton(w.Window(), "Close without saving")
	if b == nil {
		t.Fatal("no unsaved-changes dialog on close")
	}
	test.Tap(b)
	w.WaitIdle()
	if _, ok := autosaved(t, dir); ok {
		t.Error("a clean exit left the autosave")
	}
	w2 := openAutosaveBench(t, dir, "")
	if w2.autosave.offer != nil {
		t.Error("a start after a clean exit offers a recovery")
	}
}

// failAfter is a writer that fails once n bytes have been written: a
// disk that fills up in the middle of a save.
type failAfter struct {
	w io.Writer
	n int
}

var errDiskFull = errors.New("no space left on device (simulated)")

func (f *failAfter) Write(p []byte) (int, error) {
	if len(p) <= f.n {
		f.n -= len(p)
		return f.w.Write(p)
	}
	k, _ := f.w.Write(p[:f.n])
	f.n = 0
	return k, errDiskFull
}

func TestAutosaveInterruptedWriteKeepsPrevious(t *testing.T) {
	dir := autosaveDirForTest(t)
	w := openAutosaveBench(t, dir, "")
	a := w.autosave
	w.controls.panelEntry.submit("120")
	w.WaitIdle()
	before, ok := autosaved(t, dir)
	if !ok {
		t.Fatal("no autosave after a change")
	}
	a.wrap = func(out io.Writer) io.Writer { return &failAfter{w: out, n: 40} }
	w.controls.panelEntry.submit("130")
	w.WaitIdle()
	if !errors.Is(a.lastErr, errDiskFull) {
		t.Errorf("the failed write reports %v", a.lastErr)
	}
	if got, ok := autosaved(t, dir); !ok || got != before {
		t.Error("an interrupted autosave damaged the previous one")
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
	// The next change is written again once the disk has room.
	a.wrap = nil
	w.controls.panelEntry.submit("140")
	w.WaitIdle()
	if got, _ := autosaved(t, dir); got != encoded(t, w.ctl.Study()) {
		t.Error("autosave did not recover after the failure")
	}
}

func TestAutosaveUnreadableIsKeptAside(t *testing.T) {
	dir := autosaveDirForTest(t)
	if err := os.WriteFile(filepath.Join(dir, autosaveFile), []byte("{not a study"), 0o600); err != nil {
		t.Fatal(err)
	}
	w := openAutosaveBench(t, dir, "")
	if w.autosave.offer != nil {
		t.Error("an unreadable autosave was offered")
	}
	if _, err := os.Stat(filepath.Join(dir, autosaveBadFile)); err != nil {
		t.Errorf("the unreadable autosave was not kept aside: %v", err)
	}
}

// TestAutosaveOptions: a workbench without an autosave folder writes
// none; DefaultOptions takes the folder from the environment.
func TestAutosaveOptions(t *testing.T) {
	w := newTestBench(t)
	w.controls.panelEntry.submit("90")
	w.WaitIdle()
	if w.autosave != nil {
		t.Error("autosave is on without a folder")
	}
	dir := t.TempDir()
	t.Setenv(autosaveDirEnv, dir)
	if got := DefaultOptions().AutosaveDir; got != dir {
		t.Errorf("DefaultOptions().AutosaveDir = %q, want %q", got, dir)
	}
}

// TestAutosaveFollowsWithDensityWindow: opening the density window (which
// follows the study too) leaves the autosave following it, and both see
// every change.
func TestAutosaveFollowsWithDensityWindow(t *testing.T) {
	dir := autosaveDirForTest(t)
	w := openAutosaveBench(t, dir, "")
	w.openDensity(densityTabConvergence)
	w.WaitIdle()
	w.controls.panelEntry.submit("96")
	w.WaitIdle()
	got, ok := autosaved(t, dir)
	if !ok || got != encoded(t, w.ctl.Study()) {
		t.Fatal("with the density window open, a change was not autosaved")
	}
	if w.density.sizes == nil || !strings.Contains(w.density.panels.PlaceHolder, "20") {
		t.Error("density window not built")
	}
	calls := 0
	w.ctl.Subscribe(func() { calls++ })
	w.controls.alphaEntry.submit("1.5")
	w.WaitIdle()
	if calls != 1 {
		t.Errorf("a subscriber added last was called %d times for one change", calls)
	}
	if got, _ := autosaved(t, dir); got != encoded(t, w.ctl.Study()) {
		t.Error("a later subscriber detached the autosave")
	}
}
