package ui

import (
	"errors"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"testing"

	"fyne.io/fyne/v2/storage"
	"fyne.io/fyne/v2/test"
)

// saveAs drives the "Save study as" dialog: folder, name, Save, and Yes
// to replace an existing file.
func saveAs(t *testing.T, w *Workbench, dir, name string) {
	t.Helper()
	w.save(true)
	d := w.saveDlg
	if d == nil {
		t.Fatal("no save dialog")
	}
	d.folder = dir
	d.name.SetText(name)
	test.Tap(d.saveB)
	if b := findButton(w.Window(), "Yes"); b != nil {
		test.Tap(b)
	}
	w.WaitIdle()
}

// TestSaveAsOnAFullDiskLosesNothing: a save that fails midway (a disk
// that fills up, simulated by a failing writer) leaves an existing study
// exactly as it was, and no empty file at a new name; the study stays
// marked unsaved.
func TestSaveAsOnAFullDiskLosesNothing(t *testing.T) {
	w := newTestBench(t)
	dir := t.TempDir()
	old := filepath.Join(dir, "wing.json")
	const previous = `{"previous": "study"}`
	if err := os.WriteFile(old, []byte(previous), 0o644); err != nil {
		t.Fatal(err)
	}
	w.controls.panelEntry.submit("90")
	w.WaitIdle()
	w.ctl.SaveWrap = func(out io.Writer) io.Writer { return &failAfter{w: out, n: 40} }

	saveAs(t, w, dir, "wing.json")
	if b, _ := os.ReadFile(old); string(b) != previous {
		t.Errorf("a failed save over an existing study left %q", b)
	}
	saveAs(t, w, dir, "fresh")
	if _, err := os.Lstat(filepath.Join(dir, "fresh.json")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a failed save to a new name left a file behind (%v)", err)
	}
	if !w.ctl.Dirty() || w.ctl.Path() != "" {
		t.Errorf("after failed saves the study is dirty=%v with path %q", w.ctl.Dirty(), w.ctl.Path())
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if e.Name() != "wing.json" {
			t.Errorf("left behind: %s", e.Name())
		}
	}

	// With room on the disk the same dialog saves, by path.
	w.ctl.SaveWrap = nil
	saveAs(t, w, dir, "wing.json")
	if b, _ := os.ReadFile(old); string(b) != encoded(t, w.ctl.Study()) {
		t.Error("the study was not saved once the disk had room")
	}
	if w.ctl.Dirty() || w.ctl.Path() != old {
		t.Errorf("after saving: dirty=%v, path %q", w.ctl.Dirty(), w.ctl.Path())
	}
}

// TestSaveAsRefusesBadNames: a folder or a name with a separator is not
// saved to.
func TestSaveAsRefusesBadNames(t *testing.T) {
	w := newTestBench(t)
	dir := t.TempDir()
	if err := os.Mkdir(filepath.Join(dir, "sub.json"), 0o755); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"", "sub.json", "a/b.json", ".."} {
		saveAs(t, w, dir, name)
		if w.ctl.Path() != "" {
			t.Errorf("name %q: saved to %s", name, w.ctl.Path())
		}
	}
}

// TestOpenDialogListsOnlyRegularFiles: the open dialog's filter shows
// regular files with a section extension and nothing else, deciding
// without opening the file (opening a FIFO would freeze the window).
func TestOpenDialogListsOnlyRegularFiles(t *testing.T) {
	dir := t.TempDir()
	reg := filepath.Join(dir, "wing.dat")
	if err := os.WriteFile(reg, []byte("1 0\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	other := filepath.Join(dir, "notes.pdf")
	os.WriteFile(other, nil, 0o644)
	f := regularFileFilter{storage.NewExtensionFileFilter(sectionExtensions)}
	for _, tc := range []struct {
		path string
		want bool
	}{{reg, true}, {other, false}, {dir, false}, {filepath.Join(dir, "missing.dat"), false}} {
		if got := f.Matches(storage.NewFileURI(tc.path)); got != tc.want {
			t.Errorf("%s: listed %v, want %v", filepath.Base(tc.path), got, tc.want)
		}
	}
	if fifo := makeFIFO(t, dir, "pipe.dat"); fifo != "" {
		if f.Matches(storage.NewFileURI(fifo)) {
			t.Error("a FIFO is listed in the open dialog")
		}
	}
}

// TestCaptureSaveDialog paints the window with the save dialog open (the
// test driver's painter panics on a malformed widget tree).
func TestCaptureSaveDialog(t *testing.T) {
	w := newTestBench(t)
	w.save(true)
	w.saveDlg.folder = t.TempDir()
	w.saveDlg.where.SetText(w.saveDlg.folder)
	img := w.Window().Canvas().Capture()
	if !varied(img) {
		t.Error("the window with the save dialog is a single colour")
	}
	if p := os.Getenv("SAVE_DIALOG_PNG"); p != "" {
		f, err := os.Create(p)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		png.Encode(f, img)
	}
}
