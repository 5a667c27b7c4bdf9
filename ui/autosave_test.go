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
	"sectionbench/model"
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

// autosaved returns the encoded study of the workbench's own autosave and
// the study path kept with it, ok false if there is none.
func autosaved(t *testing.T, w *Workbench) (study, path string, ok bool) {
	t.Helper()
	return autosavedAt(t, w.autosave.dataPath(w.autosave.id))
}

func autosavedAt(t *testing.T, file string) (study, path string, ok bool) {
	t.Helper()
	if _, err := os.Stat(file); errors.Is(err, os.ErrNotExist) {
		return "", "", false
	}
	st, p, err := readAutosave(file)
	if err != nil {
		t.Fatalf("autosave unreadable: %v", err)
	}
	return encoded(t, st), p, true
}

func TestAutosaveCrashAndRecover(t *testing.T) {
	dir := autosaveDirForTest(t)
	w1 := openAutosaveBench(t, dir, "")
	if w1.autosave == nil {
		t.Fatal("autosave is off with a folder given")
	}
	if _, _, ok := autosaved(t, w1); ok {
		t.Error("an unchanged study was autosaved")
	}
	w1.controls.panelEntry.submit("90")
	w1.controls.alphaEntry.submit("2.5")
	w1.WaitIdle()
	got, _, ok := autosaved(t, w1)
	if !ok {
		t.Fatal("a change wrote no autosave")
	}
	want := encoded(t, w1.ctl.Study())
	if got != want {
		t.Error("the autosave is not the current study")
	}

	// Crash: w1 ends without closing. The next start offers the autosave.
	w1.autosave.crash()
	w1file := w1.autosave.dataPath(w1.autosave.id)
	w2 := openAutosaveBench(t, dir, "")
	a := w2.autosave
	if a.offer == nil || a.recoverB == nil {
		t.Fatal("the next start offers no recovery")
	}
	if got, _, _ := autosavedAt(t, w1file); got != want {
		t.Error("the autosave changed before the user chose")
	}
	test.Tap(a.recoverB)
	res := current(t, w2)
	if got, _, ok := autosaved(t, w2); !ok || got != want {
		t.Error("the recovered study is not in the recovering window's autosave")
	}
	if _, _, ok := autosavedAt(t, w1file); ok {
		t.Error("the recovered backup stays beside the new autosave")
	}
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
	w1.autosave.crash()
	w1file := w1.autosave.dataPath(w1.autosave.id)
	demoStudy, err := model.DecodeStudy(assets.DemoStudy)
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
	if _, _, ok := autosavedAt(t, w1file); ok {
		t.Error("discarding left the autosave")
	}
	if _, err := os.Stat(w1.autosave.lockPath(w1.autosave.id)); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("discarding left the gone window's lock file (%v)", err)
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
	if _, _, ok := autosaved(t, w); !ok {
		t.Fatal("no autosave after a change")
	}
	if err := w.ctl.Save(filepath.Join(t.TempDir(), "wing.json")); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	if _, _, ok := autosaved(t, w); ok {
		t.Error("the autosave stays after saving the study")
	}
	w.controls.panelEntry.submit("110")
	w.WaitIdle()
	_, p, ok := autosaved(t, w)
	if !ok {
		t.Fatal("no autosave after a change of a saved study")
	}
	if !strings.HasSuffix(p, "wing.json") {
		t.Errorf("the autosave says its study is %q, want the study's file", p)
	}
	w.closeRequested()
	b := findButton(w.Window(), "Close without saving")
	if b == nil {
		t.Fatal("no unsaved-changes dialog on close")
	}
	test.Tap(b)
	w.WaitIdle()
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("a clean exit left %v", entries)
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
	before, _, ok := autosaved(t, w)
	if !ok {
		t.Fatal("no autosave after a change")
	}
	a.wrap = func(out io.Writer) io.Writer { return &failAfter{w: out, n: 40} }
	w.controls.panelEntry.submit("130")
	w.WaitIdle()
	if !errors.Is(a.lastErr, errDiskFull) {
		t.Errorf("the failed write reports %v", a.lastErr)
	}
	if got, _, ok := autosaved(t, w); !ok || got != before {
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
	if got, _, _ := autosaved(t, w); got != encoded(t, w.ctl.Study()) {
		t.Error("autosave did not recover after the failure")
	}
}

func TestAutosaveUnreadableIsKeptAside(t *testing.T) {
	dir := autosaveDirForTest(t)
	if err := os.WriteFile(filepath.Join(dir, autosavePrefix+"1-gone"+autosaveData), []byte("{not a study"), 0o600); err != nil {
		t.Fatal(err)
	}
	w := openAutosaveBench(t, dir, "")
	if w.autosave.offer != nil {
		t.Error("an unreadable autosave was offered")
	}
	if _, err := os.Stat(filepath.Join(dir, unreadablePrefix+"1-gone"+autosaveData)); err != nil {
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
	got, _, ok := autosaved(t, w)
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
	if got, _, _ := autosaved(t, w); got != encoded(t, w.ctl.Study()) {
		t.Error("a later subscriber detached the autosave")
	}
}

// crash ends autosave as a crash would (tests): the writer stops and every
// lock is dropped, but no file is removed.
func (a *autosaver) crash() {
	a.stop()
	a.lock.Release()
	for _, b := range a.found {
		b.lock.Release()
	}
	a.mu.Lock()
	for _, h := range a.held {
		h.b.lock.Release()
	}
	a.mu.Unlock()
}

// TestAutosaveTwoWindowsKeepTheirOwn: a second window started while the
// first runs offers nothing (the first did not crash), and each keeps its
// own autosave; the second's Discard can no longer delete the first's.
func TestAutosaveTwoWindowsKeepTheirOwn(t *testing.T) {
	dir := autosaveDirForTest(t)
	w1 := openAutosaveBench(t, dir, "")
	w1.controls.panelEntry.submit("88")
	w1.WaitIdle()
	want1 := encoded(t, w1.ctl.Study())
	w2 := openAutosaveBench(t, dir, "")
	if w2.autosave.offer != nil || len(w2.autosave.found) != 0 {
		t.Fatal("a second window offers the running first window's autosave")
	}
	w2.controls.panelEntry.submit("66")
	w2.WaitIdle()
	if got, _, ok := autosaved(t, w1); !ok || got != want1 {
		t.Error("the first window's autosave was changed by the second")
	}
	if got, _, ok := autosaved(t, w2); !ok || got != encoded(t, w2.ctl.Study()) {
		t.Error("the second window's changes were not autosaved")
	}
	// A third start while both run offers nothing either.
	w3 := openAutosaveBench(t, dir, "")
	if len(w3.autosave.found) != 0 {
		t.Error("a third window claims a running window's autosave")
	}
	// Once the first crashes, exactly one new window gets its backup.
	w1.autosave.crash()
	w4 := openAutosaveBench(t, dir, "")
	w5 := openAutosaveBench(t, dir, "")
	if len(w4.autosave.found) != 1 || len(w5.autosave.found) != 0 {
		t.Errorf("backups offered: %d and %d, want 1 to the first window to start and 0 to the next", len(w4.autosave.found), len(w5.autosave.found))
	}
}

// TestAutosaveIsOneFile: the study and its path are written together, in
// one file, so no crash can pair one study with another's path.
func TestAutosaveIsOneFile(t *testing.T) {
	dir := autosaveDirForTest(t)
	w := openAutosaveBench(t, dir, "")
	path := filepath.Join(t.TempDir(), "wing.json")
	if err := w.ctl.Save(path); err != nil {
		t.Fatal(err)
	}
	w.controls.panelEntry.submit("92")
	w.WaitIdle()
	entries, _ := os.ReadDir(dir)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	a := w.autosave
	wantNames := []string{autosavePrefix + a.id + autosaveData, autosavePrefix + a.id + autosaveLock}
	if strings.Join(names, " ") != strings.Join(wantNames, " ") {
		t.Errorf("autosave folder holds %v, want %v", names, wantNames)
	}
	st, p, ok := autosaved(t, w)
	if !ok || st != encoded(t, w.ctl.Study()) || p != path {
		t.Errorf("autosave holds path %q (ok %v), want %q with the study", p, ok, path)
	}
}

// TestAutosaveStaleTemporaryFilesCleaned: a temporary file left by a write
// that a crash interrupted is removed at the next start, unless its
// window still runs.
func TestAutosaveStaleTemporaryFilesCleaned(t *testing.T) {
	dir := autosaveDirForTest(t)
	w1 := openAutosaveBench(t, dir, "")
	live := filepath.Join(dir, "."+autosavePrefix+w1.autosave.id+autosaveData+".tmp-123")
	stale := filepath.Join(dir, "."+autosavePrefix+"77-gone"+autosaveData+".tmp-456")
	for _, p := range []string{live, stale} {
		if err := os.WriteFile(p, []byte(`{"format": "sectionb`), 0o600); err != nil {
			t.Fatal(err)
		}
	}
	openAutosaveBench(t, dir, "")
	if _, err := os.Stat(stale); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a crashed write's temporary file stays (%v)", err)
	}
	if _, err := os.Stat(live); err != nil {
		t.Errorf("a running window's temporary file was removed: %v", err)
	}
}

// TestAutosaveOfAnEarlierVersion: the two files an earlier version wrote
// are offered once and removed by the user's choice.
func TestAutosaveOfAnEarlierVersion(t *testing.T) {
	dir := autosaveDirForTest(t)
	st, err := model.DecodeStudy(assets.DemoStudy)
	if err != nil {
		t.Fatal(err)
	}
	st.Name = "left by an earlier version"
	b, _ := st.Encode()
	os.WriteFile(filepath.Join(dir, legacyAutosaveFile), b, 0o600)
	os.WriteFile(filepath.Join(dir, legacyAutosaveNote), []byte("/somewhere/wing.json"), 0o600)
	w := openAutosaveBench(t, dir, "")
	a := w.autosave
	if a.offer == nil || len(a.found) != 1 || a.found[0].studyPath != "/somewhere/wing.json" {
		t.Fatal("the earlier version's autosave is not offered with its path")
	}
	test.Tap(a.discardB)
	for _, n := range []string{legacyAutosaveFile, legacyAutosaveNote} {
		if _, err := os.Stat(filepath.Join(dir, n)); !errors.Is(err, os.ErrNotExist) {
			t.Errorf("%s stays after Discard", n)
		}
	}
}

// TestStartOnADamagedStudyOffersTheAutosave: a study path that cannot be
// opened (damaged, or a FIFO) no longer stops the app: it starts on the
// demo, says what is wrong with the file, and offers the crashed window's
// autosave.
func TestStartOnADamagedStudyOffersTheAutosave(t *testing.T) {
	dir := autosaveDirForTest(t)
	files := t.TempDir()
	damaged := filepath.Join(files, "damaged.json")
	os.WriteFile(damaged, []byte(`{"format": "sectionbench-study", "version": 1, "name": "cut off`), 0o644)
	paths := []string{damaged}
	if fifo := makeFIFO(t, files, "pipe.json"); fifo != "" {
		paths = append(paths, fifo)
	}
	for _, path := range paths {
		w1 := openAutosaveBench(t, dir, "")
		w1.controls.panelEntry.submit("84")
		w1.WaitIdle()
		w1.autosave.crash()
		w := openAutosaveBench(t, dir, path)
		if w.startupErr == nil || !strings.Contains(w.startupErr.Error(), filepath.Base(path)) {
			t.Errorf("%s: start says %v, want a message naming the file", filepath.Base(path), w.startupErr)
		}
		if w.autosave.offer == nil {
			t.Fatalf("%s: the autosave is not offered", filepath.Base(path))
		}
		test.Tap(w.autosave.recoverB)
		if got := encoded(t, w.ctl.Study()); got != encoded(t, w1.ctl.Study()) {
			t.Errorf("%s: the recovered study is not the crashed window's", filepath.Base(path))
		}
	}
}
