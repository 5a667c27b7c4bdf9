package ui

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/storage"
	"fyne.io/fyne/v2/widget"

	"sectionbench/assets"
	"sectionbench/export"
	"sectionbench/model"
)

// Extensions offered in the file dialogs.
var (
	studyExtensions   = []string{".json"}
	sectionExtensions = []string{".dat", ".txt", ".csv", ".xy"}
)

// shortcut returns the platform's primary modifier (Ctrl, or Cmd on macOS)
// with key, plus Shift if shift is set.
func shortcut(key fyne.KeyName, shift bool) fyne.Shortcut {
	m := fyne.KeyModifierShortcutDefault
	if shift {
		m |= fyne.KeyModifierShift
	}
	return &desktop.CustomShortcut{KeyName: key, Modifier: m}
}

// item returns a menu item with a shortcut, and registers the shortcut on
// the window's canvas so it works without opening the menu.
func (w *Workbench) item(label string, sc fyne.Shortcut, action func()) *fyne.MenuItem {
	it := fyne.NewMenuItem(label, action)
	if sc != nil {
		it.Shortcut = sc
		w.win.Canvas().AddShortcut(sc, func(fyne.Shortcut) { action() })
	}
	return it
}

func (w *Workbench) menu() *fyne.MainMenu {
	exportMenu := fyne.NewMenuItem("Export", nil)
	exportMenu.ChildMenu = fyne.NewMenu("", w.exportItems()...)

	quit := w.item("Quit", shortcut(fyne.KeyQ, false), w.closeRequested)
	quit.IsQuit = true
	examples := fyne.NewMenuItem("Examples", nil)
	var exItems []*fyne.MenuItem
	for _, ex := range assets.Examples {
		exItems = append(exItems, fyne.NewMenuItem(ex.Title+" (invented data)", func() { w.openExample(ex) }))
	}
	examples.ChildMenu = fyne.NewMenu("", exItems...)
	file := fyne.NewMenu("File",
		w.item("New study", shortcut(fyne.KeyN, false), w.newStudy),
		examples,
		w.item("Open section…", shortcut(fyne.KeyO, true), w.openSection),
		w.item("Open study…", shortcut(fyne.KeyO, false), w.openStudy),
		fyne.NewMenuItemSeparator(),
		w.item("Save study", shortcut(fyne.KeyS, false), func() { w.save(false) }),
		w.item("Save study as…", shortcut(fyne.KeyS, true), func() { w.save(true) }),
		fyne.NewMenuItemSeparator(),
		exportMenu,
		fyne.NewMenuItemSeparator(),
		quit,
	)
	w.undoItem = w.item("Undo", shortcut(fyne.KeyZ, false), func() { w.ctl.Undo() })
	w.redoItem = w.item("Redo", shortcut(fyne.KeyZ, true), func() { w.ctl.Redo() })
	w.undoItem.Disabled, w.redoItem.Disabled = true, true
	// The window's driver reports Ctrl+Z and Ctrl+Y as the toolkit's own
	// undo and redo shortcuts, not as the menu's key combinations: both
	// forms go to the study's history, and Ctrl+Y redoes too. Fields pass
	// them on likewise (field.TypedShortcut).
	cv := w.win.Canvas()
	cv.AddShortcut(&fyne.ShortcutUndo{}, func(fyne.Shortcut) { w.ctl.Undo() })
	cv.AddShortcut(&fyne.ShortcutRedo{}, func(fyne.Shortcut) { w.ctl.Redo() })
	cv.AddShortcut(shortcut(fyne.KeyY, false), func(fyne.Shortcut) { w.ctl.Redo() })
	edit := fyne.NewMenu("Edit", w.undoItem, w.redoItem)
	var viewItems []*fyne.MenuItem
	keys := [numViews]fyne.KeyName{fyne.Key1, fyne.Key2, fyne.Key3, fyne.Key4}
	for k := range numViews {
		viewItems = append(viewItems, w.item("Enlarge "+k.String(), shortcut(keys[k], false), func() { w.toggleEnlarge(k) }))
	}
	viewItems = append(viewItems,
		w.item("Show all views", shortcut(fyne.Key0, false), func() { w.toggleEnlarge(numViews) }),
		fyne.NewMenuItemSeparator(),
		w.item("Leading-edge close-up", shortcut(fyne.KeyL, false), func() { w.views[viewPanels].canvas.CloseUpLE(w.ctl.Element()) }),
		w.item("Reset zoom", shortcut(fyne.KeyR, false), func() {
			w.views[viewPanels].canvas.ResetZoom()
			w.views[viewStreamlines].canvas.ResetZoom()
		}),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Density study…", func() { w.openDensity(densityTabConvergence) }),
		fyne.NewMenuItem("Panel sizes…", func() { w.openDensity(densityTabSizes) }),
		fyne.NewMenuItem("Set-up explorer: maps, setting search, finite span…", func() { w.openSetup(setupTabMaps) }),
	)
	w.startExtras()
	help := fyne.NewMenu("Help",
		fyne.NewMenuItem("Methods and cautions", w.showMethods),
		fyne.NewMenuItem("About", w.showAbout),
	)
	return fyne.NewMainMenu(file, edit, fyne.NewMenu("View", viewItems...), help)
}

// syncUndoItems greys out Undo and Redo when there is no step to take and
// names what each would set ("Undo (back to flap deflection 17.7°)"). The
// menu bar is rebuilt only when one of them changes (a native menu bar is
// rebuilt whole); during a slider's drag the step and its label stay the
// same.
func (w *Workbench) syncUndoItems() {
	undo, redo := !w.ctl.CanUndo(), !w.ctl.CanRedo()
	undoLabel, redoLabel := stepItemLabel("Undo", "back to ", w.ctl.UndoLabel()), stepItemLabel("Redo", "", w.ctl.RedoLabel())
	if w.undoItem.Disabled == undo && w.redoItem.Disabled == redo && w.undoItem.Label == undoLabel && w.redoItem.Label == redoLabel {
		return
	}
	w.undoItem.Disabled, w.redoItem.Disabled = undo, redo
	w.undoItem.Label, w.redoItem.Label = undoLabel, redoLabel
	if m := w.win.MainMenu(); m != nil {
		w.win.SetMainMenu(m)
	}
}

// stepItemLabel is the Undo or Redo menu item's text: verb alone when
// there is nothing to name.
func stepItemLabel(verb, lead, change string) string {
	if change == "" {
		return verb
	}
	return verb + " (" + lead + change + ")"
}

// confirmDiscard runs then at once if the study has no unsaved changes,
// otherwise after the user chose to save or discard them.
func (w *Workbench) confirmDiscard(action string, then func()) {
	if !w.ctl.Dirty() {
		then()
		return
	}
	msg := widget.NewLabel("The study “" + w.ctl.Current().Name + "” has unsaved changes.")
	var d dialog.Dialog
	save := widget.NewButton("Save", func() {
		d.Hide()
		w.saveThen(false, then)
	})
	save.Importance = widget.HighImportance
	discard := widget.NewButton(action+" without saving", func() { d.Hide(); then() })
	cancel := widget.NewButton("Cancel", func() { d.Hide() })
	d = dialog.NewCustomWithoutButtons("Unsaved changes",
		container.NewVBox(msg, container.NewHBox(layout.NewSpacer(), cancel, discard, save)), w.win)
	d.Show()
}

func (w *Workbench) closeRequested() {
	w.confirmDiscard("Close", func() {
		w.ctl.CancelSweep()
		w.closeAutosave()
		w.win.Close()
	})
}

func (w *Workbench) newStudy() {
	w.confirmDiscard("Continue", func() {
		w.userError(w.ctl.Load(model.NewStudy(), ""))
	})
}

// openExample opens an example study as a new, unsaved study.
func (w *Workbench) openExample(ex assets.Example) {
	w.confirmDiscard("Continue", func() {
		st, err := model.DecodeStudy(ex.Study)
		if err == nil {
			err = w.ctl.Load(st, "")
		}
		if err == nil {
			w.sweepOnOpen()
		}
		w.userError(err)
	})
}

func (w *Workbench) openStudy() {
	w.confirmDiscard("Continue", func() {
		w.openFile(studyExtensions, w.loadStudyFile)
	})
}

func (w *Workbench) openSection() { w.openFile(sectionExtensions, w.loadSectionFile) }

// loadStudyFile opens a study from disk; on error the current one stays.
func (w *Workbench) loadStudyFile(path string) {
	o, err := export.OpenStudy(path)
	if err != nil {
		w.userError(err)
		return
	}
	w.ctl.Open(o, path)
	w.sweepOnOpen()
}

// loadSectionFile makes a coordinate file the current element's section.
func (w *Workbench) loadSectionFile(path string) {
	w.editFrom(w.controls.sourceMsg)
	if err := w.ctl.SetSectionFile(path); err != nil {
		w.controls.sourceError(err)
		w.userError(err)
		return
	}
	w.controls.sourceError(nil)
}

// openFile asks for a file with one of exts and passes its path on.
func (w *Workbench) openFile(exts []string, then func(path string)) {
	d := dialog.NewFileOpen(func(r fyne.URIReadCloser, err error) {
		if err != nil {
			w.userError(err)
			return
		}
		if r == nil {
			return // cancelled
		}
		path := r.URI().Path()
		r.Close()
		then(path)
	}, w.win)
	d.SetFilter(regularFileFilter{storage.NewExtensionFileFilter(exts)})
	d.SetLocation(w.startDir())
	d.Resize(fyne.NewSize(900, 600))
	d.Show()
}

// startDir is where file dialogs open: the study's folder, else the
// working directory (nil: the dialog's own default).
func (w *Workbench) startDir() fyne.ListableURI {
	l, err := listerFor(w.startFolder())
	if err != nil {
		return nil
	}
	return l
}

// startFolder is the study's folder, else the working directory, else "".
func (w *Workbench) startFolder() string {
	if p := w.ctl.Path(); p != "" {
		return filepath.Dir(p)
	}
	if wd, err := os.Getwd(); err == nil {
		return wd
	}
	return ""
}

// listerFor returns a folder as the file dialogs take it.
func listerFor(dir string) (fyne.ListableURI, error) {
	if dir == "" {
		return nil, errors.New("no folder")
	}
	return storage.ListerForURI(storage.NewFileURI(dir))
}

// save writes the study to its file, asking for one if it has none or as
// is set.
func (w *Workbench) save(as bool) { w.saveThen(as, nil) }

func (w *Workbench) saveThen(as bool, then func()) {
	if p := w.ctl.Path(); p != "" && !as {
		w.saveTo(p, then)
		return
	}
	w.saveDlg = newSaveDialog(w.win, w.startFolder(), fileNameFor(w.ctl.Current().Name), func(p string) { w.saveTo(p, then) })
	w.saveDlg.show()
}

// saveTo writes the study atomically to path; on failure it says that the
// file on disk was left as it was.
func (w *Workbench) saveTo(path string, then func()) {
	if err := w.ctl.Save(path); err != nil {
		w.userError(fmt.Errorf("the study was not saved, %s is as it was before: %s", filepath.Base(path), friendly(err)))
		return
	}
	if then != nil {
		then()
	}
}

// maxFileStem bounds the length of a suggested file name before its
// extension: a study's team and name together made 100-character report
// names; the cut falls at the last word boundary before it.
const maxFileStem = 60

// fileNameFor suggests a file name for a study name.
func fileNameFor(name string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(name) {
		switch {
		case r >= 'a' && r <= 'z', r >= '0' && r <= '9':
			b.WriteRune(r)
		case b.Len() > 0 && !strings.HasSuffix(b.String(), "-"):
			b.WriteByte('-')
		}
	}
	s := strings.Trim(b.String(), "-")
	if len(s) > maxFileStem {
		cut := strings.LastIndexByte(s[:maxFileStem+1], '-')
		if cut <= 0 {
			cut = maxFileStem
		}
		s = s[:cut]
	}
	if s == "" {
		s = "study"
	}
	return s + ".json"
}

// dropped opens a study (.json) or a coordinate file dropped on the window.
func (w *Workbench) dropped(_ fyne.Position, uris []fyne.URI) {
	if len(uris) == 0 {
		return
	}
	u := uris[0]
	if u.Scheme() != "file" {
		w.userError(errors.New("only local files can be dropped here"))
		return
	}
	if strings.EqualFold(u.Extension(), ".json") {
		w.confirmDiscard("Continue", func() { w.loadStudyFile(u.Path()) })
		return
	}
	w.loadSectionFile(u.Path())
}

// showReport shows the cleaning reports of the current sections and the
// solver's warnings.
func (w *Workbench) showReport() {
	var b strings.Builder
	if res, _, _ := w.ctl.Result(); res != nil && res.Solution != nil && len(res.Solution.Warnings) > 0 {
		b.WriteString("Solver\n")
		for _, m := range res.Solution.Warnings {
			b.WriteString("  " + m + "\n")
		}
		b.WriteString("\n")
	}
	for i, r := range w.ctl.Reports() {
		name := w.ctl.Current().Elements[i].Name
		b.WriteString(name + ": " + shortSource(w.ctl.Current().Elements[i].Section) + "\n")
		if r == nil || r.String() == "" {
			b.WriteString("  no changes were needed\n\n")
			continue
		}
		b.WriteString(r.String() + "\n\n")
	}
	text := widget.NewLabel(strings.TrimSpace(b.String()))
	text.Wrapping = fyne.TextWrapWord
	scroll := container.NewVScroll(text)
	scroll.SetMinSize(fyne.NewSize(560, 360))
	dialog.ShowCustom("Cleaning report and warnings", "Close", scroll, w.win)
}

// methodsText explains what the numbers are and how far to trust them.
const methodsText = `Sectionbench solves the two-dimensional, inviscid, incompressible flow about one or more wing sections with a linear-strength vortex panel method and the Kutta condition at each trailing edge (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., ch. 11). Lift comes from the circulation (Kutta–Joukowski); Cm is about the quarter chord, nose-up positive; Cp = 1 − (V/U∞)². A ground plane is modelled by an image system.

With a speed or Reynolds number, the viscous solution couples integral boundary layers and wakes to that flow (Flow tab): laminar closures fitted to the Falkner–Skan family, a turbulent shear-stress lag equation, e^N transition or trips, wakes along streamlines with drag from their far end (Squire–Young), all solved together with the panel method by Newton's method (Drela & Giles, AIAA J. 25(10), 1987). It gives drag, transition, trailing-edge separation and the section's maximum lift; a point that did not converge is shown as such, without numbers.

Cautions
• These are 2-D estimates. Real wings have finite span, tip vortices and interaction with the car. The viscous lift runs a few percent above wind-tunnel data (NACA 0012 at Re 6e6), up to a fifth on sections with laminar bubbles at Re 2e5 (E387); leading-edge stall and large separated regions are beyond it.
• Check panel-count convergence: results should not change when the panel count is doubled (pin both and compare).
• Validate by test (wind tunnel, coast-down or on-track measurements) before relying on any number.
• Structural design and mounting of wings follow the competition's rules and qualified engineering review; nothing here sizes a structure.`

func (w *Workbench) showMethods() {
	text := widget.NewLabel(methodsText)
	text.Wrapping = fyne.TextWrapWord
	scroll := container.NewVScroll(text)
	scroll.SetMinSize(fyne.NewSize(620, 380))
	dialog.ShowCustom("Methods and cautions", "Close", scroll, w.win)
}

func (w *Workbench) showAbout() {
	v := w.app.Metadata().Version
	if v == "" {
		v = "development build"
	}
	text := widget.NewLabel("Sectionbench " + v + "\nA workbench for two-dimensional wing sections: panelling, surface pressure, streamlines and polars.\n\n" + caution)
	text.Wrapping = fyne.TextWrapWord
	c := container.NewVBox(text)
	d := dialog.NewCustom("About Sectionbench", "Close", c, w.win)
	d.Resize(fyne.NewSize(480, 240))
	d.Show()
}

func showError(err error, win fyne.Window) { dialog.ShowError(err, win) }

// regularFileFilter lists only regular files (after links) that the inner
// filter accepts. The open dialog shows each listed file with an icon; for
// an extension without a known type the toolkit reads the file's first
// line to choose it, and reading a FIFO waits for ever on the UI
// goroutine. os.Stat never opens the file.
type regularFileFilter struct{ storage.FileFilter }

func (f regularFileFilter) Matches(u fyne.URI) bool {
	if u.Scheme() != "file" {
		return false
	}
	fi, err := os.Stat(u.Path())
	return err == nil && fi.Mode().IsRegular() && f.FileFilter.Matches(u)
}
