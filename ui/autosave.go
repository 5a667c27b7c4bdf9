package ui

import (
	"errors"
	"fmt"
	"io"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"

	"sectionbench/export"
	"sectionbench/model"
)

// Where the autosave lives: in Options.AutosaveDir (by DefaultOptions,
// the folder named by autosaveDirEnv, else autosaveDirName under the
// user's configuration folder, os.UserConfigDir), each window keeps its
// own file autosave-ID.json, beside a lock file autosave-ID.lock that it
// holds while it runs (ID: process and start time). A backup is offered
// for recovery only when its lock can be taken, that is when the window
// that wrote it is gone; a running window's backup is never touched.
const (
	autosaveDirEnv  = "SECTIONBENCH_CONFIG_DIR"
	autosaveDirName = "sectionbench"
	autosavePrefix  = "autosave-"
	autosaveData    = ".json"
	autosaveLock    = ".lock"
	// unreadablePrefix names an autosave that could not be read, kept so
	// that nothing is lost by starting again.
	unreadablePrefix = "unreadable-autosave-"
	// The two files of earlier versions: one autosave for every window,
	// and its study's path beside it.
	legacyAutosaveFile = "autosave.json"
	legacyAutosaveNote = "autosave-path.txt"
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
// loses nothing: after every change it writes the study and its path in
// one file, atomically (on a goroutine, the newest change winning); when
// the study has no unsaved changes, and on a clean exit, it removes the
// file. At start it offers to recover the backups of windows that did not
// end cleanly, one after the other.
type autosaver struct {
	w    *Workbench
	dir  string
	id   string       // this window's
	lock *export.Lock // held while this window runs

	// UI goroutine only.
	found    []*backup // left by windows that are gone; the first is offered
	offer    dialog.Dialog
	recoverB *widget.Button
	discardB *widget.Button
	last     string // encoding last queued for writing, "" if none is on disk
	failed   bool   // a failure was reported; quiet until the next success
	lastErr  error
	wrap     func(io.Writer) io.Writer // tests: stands between encoder and file

	mu      sync.Mutex
	held    []heldBackup // recovered; see afterOwnWrite
	seq     uint64       // of the last operation queued
	pending *autosaveOp
	busy    bool
	closed  bool
	wg      sync.WaitGroup
}

// backup is an autosave whose window is gone, claimed by this window (its
// lock held) until the user recovers or discards it.
type backup struct {
	id        string
	study     *model.Study
	studyPath string
	saved     time.Time
	lock      *export.Lock // nil for an earlier version's autosave
}

// autosaveOp is one write (study and its path) or removal.
type autosaveOp struct {
	data   []byte
	note   string
	remove bool
	seq    uint64 // order of queueing
}

// heldBackup is a recovered backup kept until an operation queued after
// the recovery (number after) has put the study on disk.
type heldBackup struct {
	b     *backup
	after uint64
}

func (a *autosaver) path(name string) string { return filepath.Join(a.dir, name) }

func (a *autosaver) dataPath(id string) string {
	return a.path(autosavePrefix + id + autosaveData)
}

func (a *autosaver) lockPath(id string) string {
	return a.path(autosavePrefix + id + autosaveLock)
}

// startAutosave turns autosave on for the workbench: it takes this
// window's lock, claims the backups of windows that are gone, cleans
// their temporary files; the offer to recover and the hook on study
// changes follow once the workbench is built and its study loaded.
//
// menu calls it while the workbench is built; a second call does nothing.
func (w *Workbench) startAutosave() {
	dir := w.opt.AutosaveDir
	if dir == "" || w.autosave != nil {
		return
	}
	a := &autosaver{w: w, dir: dir}
	var problems []string
	if err := a.lockOwn(); err != nil {
		problems = append(problems, fmt.Sprintf("autosave is off, unsaved changes are not kept for recovery: %s", friendly(err)))
	} else {
		w.autosave = a
		problems = append(problems, a.collect()...)
	}
	// Posted from a goroutine, the first check runs on the UI goroutine
	// after the workbench is built (fyne.Do queues it until the app runs).
	w.ctl.Activity().Add()
	go func() {
		defer w.ctl.Activity().Done()
		w.do(func() {
			for _, p := range problems {
				showError(errors.New(p), w.win)
			}
			if w.autosave != nil {
				a.first()
			}
		})
	}()
}

// lockOwn makes the autosave folder and takes this window's lock under a
// new ID (a few tries, should another window start at the same moment).
func (a *autosaver) lockOwn() error {
	if err := os.MkdirAll(a.dir, 0o700); err != nil {
		return err
	}
	var err error
	for try := range 3 {
		a.id = fmt.Sprintf("%d-%x-%d", os.Getpid(), time.Now().UnixNano(), try)
		if a.lock, err = export.TryLock(a.lockPath(a.id)); err == nil {
			return nil
		}
	}
	return err
}

// collect claims the backups of windows that are gone (whose lock it can
// take), sets aside unreadable ones, removes what gone windows left with
// nothing to recover (lock files, temporary files of an interrupted
// write), and returns the problems to tell the user.
func (a *autosaver) collect() []string {
	entries, err := os.ReadDir(a.dir)
	if err != nil {
		return []string{fmt.Sprintf("the autosave folder could not be read: %v", err)}
	}
	var problems []string
	ids := map[string]bool{}
	for _, e := range entries {
		n := e.Name()
		if !strings.HasPrefix(n, autosavePrefix) {
			continue
		}
		if id, ok := strings.CutSuffix(n[len(autosavePrefix):], autosaveData); ok {
			ids[id] = true
		} else if id, ok := strings.CutSuffix(n[len(autosavePrefix):], autosaveLock); ok {
			ids[id] = true
		}
	}
	alive := map[string]bool{a.id: true}
	for _, id := range slices.Sorted(maps.Keys(ids)) {
		if id == a.id || strings.ContainsAny(id, `/\`) {
			continue
		}
		l, err := export.TryLock(a.lockPath(id))
		if err != nil {
			alive[id] = true // running, or not ours to judge
			continue
		}
		data := a.dataPath(id)
		fi, statErr := os.Stat(data)
		st, studyPath, err := readAutosave(data)
		switch {
		case errors.Is(statErr, os.ErrNotExist):
			l.Remove() // gone, with nothing unsaved
		case err != nil:
			bad := a.path(unreadablePrefix + id + autosaveData)
			if mvErr := os.Rename(data, bad); mvErr != nil {
				// Left where it is, claimed by nobody: offered again next time.
				l.Release()
				problems = append(problems, fmt.Sprintf("an autosaved study could not be read (%s), and moving it aside to %s failed: %v", friendly(err), bad, mvErr))
				continue
			}
			l.Remove()
			problems = append(problems, fmt.Sprintf("an autosaved study could not be read and was kept as %s: %s", bad, friendly(err)))
		default:
			a.found = append(a.found, &backup{id: id, study: st, studyPath: studyPath, saved: fi.ModTime(), lock: l})
		}
	}
	// A write interrupted by a crash leaves WriteFileAtomic's temporary
	// file, ".autosave-ID.json.tmp-…".
	for _, e := range entries {
		n := e.Name()
		rest, ok := strings.CutPrefix(n, "."+autosavePrefix)
		if !ok || !strings.Contains(rest, autosaveData+".tmp-") {
			continue
		}
		if id, _, _ := strings.Cut(rest, autosaveData+".tmp-"); !alive[id] {
			os.Remove(a.path(n))
		}
	}
	if fi, err := os.Stat(a.path(legacyAutosaveFile)); err == nil {
		st, studyPath, err := readLegacyAutosave(a.path(legacyAutosaveFile), a.path(legacyAutosaveNote))
		if err != nil {
			bad := a.path(unreadablePrefix + "earlier" + autosaveData)
			if mvErr := os.Rename(a.path(legacyAutosaveFile), bad); mvErr != nil {
				problems = append(problems, fmt.Sprintf("an autosaved study could not be read (%s), and moving it aside to %s failed: %v", friendly(err), bad, mvErr))
			} else {
				os.Remove(a.path(legacyAutosaveNote))
				problems = append(problems, fmt.Sprintf("an autosaved study could not be read and was kept as %s: %s", bad, friendly(err)))
			}
		} else {
			a.found = append(a.found, &backup{study: st, studyPath: studyPath, saved: fi.ModTime()})
		}
	}
	slices.SortFunc(a.found, func(x, y *backup) int { return y.saved.Compare(x.saved) })
	return problems
}

// first hooks the study changes and offers the found backups; one equal
// to the study just opened is dropped without asking.
func (a *autosaver) first() {
	a.w.ctl.Subscribe(a.check)
	cur, err := a.w.ctl.Current().Encode()
	for len(a.found) > 0 {
		old, err2 := a.found[0].study.Encode()
		if err != nil || err2 != nil || string(cur) != string(old) {
			a.showOffer()
			return
		}
		a.drop(a.found[0])
		a.found = a.found[1:]
	}
	a.check()
}

func (a *autosaver) showOffer() {
	b := a.found[0]
	where := "a study that was never saved"
	if b.studyPath != "" {
		where = filepath.Base(b.studyPath)
	}
	msg := widget.NewLabel(fmt.Sprintf("A Sectionbench window did not close cleanly. Unsaved changes to “%s” (%s), kept at %s, can be recovered.\nRecover them, or discard them and keep the study now open?",
		b.study.Name, where, b.saved.Format("2006-01-02 15:04")))
	msg.Wrapping = fyne.TextWrapWord
	a.recoverB = widget.NewButton("Recover", a.recover)
	a.recoverB.Importance = widget.HighImportance
	a.discardB = widget.NewButton("Discard", a.discard)
	a.offer = dialog.NewCustomWithoutButtons("Recover unsaved changes?",
		container.NewVBox(msg, container.NewHBox(layout.NewSpacer(), a.discardB, a.recoverB)), a.w.win)
	a.offer.Resize(fyne.NewSize(520, 180))
	a.offer.Show()
}

// decided closes the offer of the first backup and offers the next, if
// any; otherwise it writes or removes this window's autosave.
func (a *autosaver) decided() {
	a.offer.Hide()
	a.offer = nil
	a.found = a.found[1:]
	if len(a.found) > 0 {
		a.showOffer()
		return
	}
	a.check()
}

// drop removes a backup the user has dealt with.
func (a *autosaver) drop(b *backup) {
	if b.lock == nil {
		os.Remove(a.path(legacyAutosaveFile))
		os.Remove(a.path(legacyAutosaveNote))
		return
	}
	os.Remove(a.dataPath(b.id))
	b.lock.Remove()
}

// recover makes the first backup's study current, with unsaved changes,
// and removes the backup once this window's own autosave holds it. If
// the study cannot be opened, the backup stays for a later start.
func (a *autosaver) recover() {
	b := a.found[0]
	if err := a.w.ctl.LoadRecovered(b.study, b.studyPath); err != nil {
		b.lock.Release()
		b.lock = nil
		a.w.userError(fmt.Errorf("the autosaved study could not be opened and was kept: %w", err))
		a.decided()
		return
	}
	a.afterOwnWrite(b)
	a.decided()
}

// discard removes the first backup and keeps the study open.
func (a *autosaver) discard() {
	a.drop(a.found[0])
	a.decided()
}

// check writes the study if it has unsaved changes not yet written, and
// removes the autosave if it has none.
func (a *autosaver) check() {
	if a.offer != nil {
		return // wait for the user's choice
	}
	ctl := a.w.ctl
	if ctl.Current() == nil {
		return
	}
	if !ctl.Dirty() {
		if a.last != "" {
			a.last = ""
			a.queue(&autosaveOp{remove: true})
		}
		return
	}
	b, err := ctl.Current().Encode()
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
	a.seq++
	op.seq = a.seq
	a.pending = op
	if a.busy {
		return
	}
	a.busy = true
	a.wg.Add(1)
	a.w.ctl.Activity().Add()
	go a.loop()
}

func (a *autosaver) loop() {
	defer a.w.ctl.Activity().Done()
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

// apply writes or removes this window's autosave (a removal: the study
// was saved, or its changes undone); then the recovered backups that the
// study on disk now covers are removed.
func (a *autosaver) apply(op *autosaveOp) error {
	if op.remove {
		if err := os.Remove(a.dataPath(a.id)); err != nil && !errors.Is(err, os.ErrNotExist) {
			return err
		}
	} else {
		b, err := encodeAutosave(op.data, op.note)
		if err != nil {
			return err
		}
		if err := writeAutosave(a.dataPath(a.id), b, a.wrap); err != nil {
			return err
		}
	}
	a.dropHeld(op.seq)
	return nil
}

// afterOwnWrite removes backup b once an autosave write or removal queued
// after this call has succeeded: until then b is the only copy of the
// recovered study on disk.
func (a *autosaver) afterOwnWrite(b *backup) {
	a.mu.Lock()
	a.held = append(a.held, heldBackup{b, a.seq})
	a.mu.Unlock()
}

// dropHeld removes the held backups that operation seq covers.
func (a *autosaver) dropHeld(seq uint64) {
	a.mu.Lock()
	var drop []*backup
	keep := a.held[:0]
	for _, h := range a.held {
		if seq > h.after {
			drop = append(drop, h.b)
		} else {
			keep = append(keep, h)
		}
	}
	a.held = keep
	a.mu.Unlock()
	for _, b := range drop {
		a.drop(b)
	}
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
// removes this window's autosave and lock, and the recovered backups whose
// study the user has now saved or discarded. Backups still waiting for a
// decision stay for the next start.
func (a *autosaver) close() {
	a.stop()
	os.Remove(a.dataPath(a.id))
	a.dropHeld(^uint64(0))
	for _, b := range a.found {
		b.lock.Release()
	}
	a.found = nil
	a.lock.Remove()
}

// stop ends the writer goroutine, waiting for a write in flight.
func (a *autosaver) stop() {
	a.mu.Lock()
	a.closed = true
	a.pending = nil
	a.mu.Unlock()
	a.wg.Wait()
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
