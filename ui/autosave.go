package ui

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sync"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"

	"sectionbench/model"
)

// Where the autosave lives: autosaveFile in Options.AutosaveDir (by
// DefaultOptions, the folder named by autosaveDirEnv, else autosaveDirName
// under the user's configuration folder, os.UserConfigDir).
// autosaveNoteFile beside it holds the path of the study file the autosave
// belongs to ("" for a study never saved).
const (
	autosaveDirEnv   = "SECTIONBENCH_CONFIG_DIR"
	autosaveDirName  = "sectionbench"
	autosaveFile     = "autosave.json"
	autosaveNoteFile = "autosave-path.txt"
	// autosaveBadFile keeps an autosave that could not be read, so that
	// nothing is lost by starting again.
	autosaveBadFile = "autosave-unreadable.json"
)

// defaultAutosaveDir returns the autosave folder of the desktop app: the
// folder autosaveDirEnv names, else autosaveDirName in the user's
// configuration folder, "" (off) if there is none.
func defaultAutosaveDir() string {
	if d := os.Getenv(autosaveDirEnv); d != "" {
		return d
	}
	d, err := os.UserConfigDir()
	if err != nil {
		return ""
	}
	return filepath.Join(d, autosaveDirName)
}

// autosaver keeps the study with unsaved changes on disk so that a crash
// loses nothing: after every change it writes the study atomically (on a
// goroutine, the newest change winning); when the study has no unsaved
// changes, and on a clean exit, it removes the file. At start it offers to
// recover an autosave left by a session that did not end cleanly.
type autosaver struct {
	w   *Workbench
	dir string

	// UI goroutine only.
	found     *model.Study // left by an earlier session; nil once decided
	foundPath string
	offer     dialog.Dialog
	recoverB  *widget.Button
	discardB  *widget.Button
	last      string // encoding last queued for writing, "" if none is on disk
	failed    bool   // a failure was reported; quiet until the next success
	lastErr   error
	wrap      func(io.Writer) io.Writer // tests: stands between encoder and file

	mu      sync.Mutex
	pending *autosaveOp
	busy    bool
	closed  bool
	wg      sync.WaitGroup
}

// autosaveOp is one write (data and note) or removal.
type autosaveOp struct {
	data   []byte
	note   string
	remove bool
}

func (a *autosaver) path(name string) string { return filepath.Join(a.dir, name) }

// startAutosave turns autosave on for the workbench, reading what an
// earlier session left; the offer to recover it and the hook on study
// changes follow once the workbench is built and its study loaded.
//
// menu calls it while the workbench is built; a second call does nothing.
func (w *Workbench) startAutosave() {
	dir := w.opt.AutosaveDir
	if dir == "" || w.autosave != nil {
		return
	}
	a := &autosaver{w: w, dir: dir}
	st, err := readAutosave(a.path(autosaveFile))
	var unreadable, notKept error
	if err != nil {
		unreadable = err
		notKept = os.Rename(a.path(autosaveFile), a.path(autosaveBadFile))
	} else if st != nil {
		a.found = st
		if b, err := os.ReadFile(a.path(autosaveNoteFile)); err == nil {
			a.foundPath = string(b)
		}
	}
	w.autosave = a
	// Posted from a goroutine, the first check runs on the UI goroutine
	// after the workbench is built (fyne.Do queues it until the app runs).
	w.ctl.act.add()
	go func() {
		defer w.ctl.act.done()
		w.do(func() {
			switch {
			case unreadable != nil && notKept != nil:
				showError(fmt.Errorf("an autosaved study could not be read (%v), and moving it aside to %s failed: %v", friendly(unreadable), a.path(autosaveBadFile), notKept), w.win)
			case unreadable != nil:
				showError(fmt.Errorf("an autosaved study could not be read and was kept as %s: %v", a.path(autosaveBadFile), friendly(unreadable)), w.win)
			}
			a.first()
		})
	}()
}

// first hooks the study changes and offers the found autosave.
func (a *autosaver) first() {
	a.w.ctl.Subscribe(a.check)
	if a.found != nil {
		cur, err1 := encodeStudy(a.w.ctl.state.study)
		old, err2 := encodeStudy(a.found)
		if err1 == nil && err2 == nil && string(cur) == string(old) {
			a.found = nil
			a.queue(&autosaveOp{remove: true})
		} else {
			a.showOffer()
			return
		}
	}
	a.check()
}

func (a *autosaver) showOffer() {
	name := a.found.Name
	where := "a study that was never saved"
	if a.foundPath != "" {
		where = filepath.Base(a.foundPath)
	}
	msg := widget.NewLabel(fmt.Sprintf("Sectionbench did not close cleanly last time. Unsaved changes to “%s” (%s) were kept.\nRecover them, or discard them and keep the study now open?", name, where))
	msg.Wrapping = fyne.TextWrapWord
	a.recoverB = widget.NewButton("Recover", a.recover)
	a.recoverB.Importance = widget.HighImportance
	a.discardB = widget.NewButton("Discard", a.discard)
	a.offer = dialog.NewCustomWithoutButtons("Recover unsaved changes?",
		container.NewVBox(msg, container.NewHBox(layout.NewSpacer(), a.discardB, a.recoverB)), a.w.win)
	a.offer.Resize(fyne.NewSize(520, 180))
	a.offer.Show()
}

// recover makes the found study current, with unsaved changes.
func (a *autosaver) recover() {
	st, path := a.found, a.foundPath
	a.offer.Hide()
	a.offer, a.found = nil, nil
	if err := a.w.ctl.loadRecovered(st, path); err != nil {
		a.w.userError(fmt.Errorf("the autosaved study could not be opened: %w", err))
		return
	}
	a.check()
}

// discard removes the found autosave and keeps the study open.
func (a *autosaver) discard() {
	a.offer.Hide()
	a.offer, a.found = nil, nil
	a.queue(&autosaveOp{remove: true})
	a.check()
}

// check writes the study if it has unsaved changes not yet written, and
// removes the autosave if it has none.
func (a *autosaver) check() {
	if a.offer != nil {
		return // wait for the user's choice
	}
	ctl := a.w.ctl
	if ctl.state.study == nil {
		return
	}
	if !ctl.Dirty() {
		if a.last != "" {
			a.last = ""
			a.queue(&autosaveOp{remove: true})
		}
		return
	}
	b, err := encodeStudy(ctl.state.study)
	if err != nil || string(b) == a.last {
		return
	}
	a.last = string(b)
	a.queue(&autosaveOp{data: b, note: ctl.Path()})
}

// queue hands op to the writer goroutine, replacing one still waiting.
func (a *autosaver) queue(op *autosaveOp) {
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.closed {
		return
	}
	a.pending = op
	if a.busy {
		return
	}
	a.busy = true
	a.wg.Add(1)
	a.w.ctl.act.add()
	go a.loop()
}

func (a *autosaver) loop() {
	defer a.w.ctl.act.done()
	defer a.wg.Done()
	for {
		a.mu.Lock()
		op := a.pending
		a.pending = nil
		if op == nil {
			a.busy = false
			a.mu.Unlock()
			return
		}
		a.mu.Unlock()
		err := a.apply(op)
		a.w.do(func() { a.report(err) })
	}
}

// apply writes or removes the autosave.
func (a *autosaver) apply(op *autosaveOp) error {
	if op.remove {
		return a.removeFiles()
	}
	if err := os.MkdirAll(a.dir, 0o700); err != nil {
		return err
	}
	if err := writeAutosaveNote(a.path(autosaveNoteFile), op.note); err != nil {
		return err
	}
	return writeAutosave(a.path(autosaveFile), op.data, a.wrap)
}

func (a *autosaver) removeFiles() error {
	var errs []error
	for _, n := range []string{autosaveFile, autosaveNoteFile} {
		if err := os.Remove(a.path(n)); err != nil && !errors.Is(err, os.ErrNotExist) {
			errs = append(errs, err)
		}
	}
	return errors.Join(errs...)
}

// report tells the user once that autosave fails, and retries with the
// next change.
func (a *autosaver) report(err error) {
	a.lastErr = err
	if err == nil {
		a.failed = false
		return
	}
	a.last = ""
	if !a.failed {
		a.failed = true
		showError(fmt.Errorf("autosave failed, unsaved changes are not kept for recovery: %v", friendly(err)), a.w.win)
	}
}

// close ends autosave on a clean exit: it waits for a write in flight and
// removes the autosave.
func (a *autosaver) close() {
	a.mu.Lock()
	a.closed = true
	a.pending = nil
	a.mu.Unlock()
	a.wg.Wait()
	a.removeFiles()
}

// closeAutosave ends autosave and closes the density window: the main
// window is closing cleanly.
func (w *Workbench) closeAutosave() {
	if w.autosave != nil {
		w.autosave.close()
	}
	if w.density != nil {
		w.density.stop()
		w.density.win.Close()
	}
}
