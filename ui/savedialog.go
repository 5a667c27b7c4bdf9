package ui

import (
	"errors"
	"os"
	"path/filepath"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"
)

// saveDialog asks where to save a study and hands over only the path. The
// toolkit's own save dialog opens the chosen file for writing, emptying it
// before the study is written; if that write then failed (a full disk) the
// study was left at 0 bytes. Here nothing touches the file until the
// atomic save, so a failed save leaves the previous file, or no file.
type saveDialog struct {
	win    fyne.Window
	dlg    dialog.Dialog
	folder string
	where  *widget.Label
	name   *widget.Entry
	saveB  *widget.Button
	then   func(path string)
}

// newSaveDialog prepares a dialog that proposes file name in folder and
// calls then with the chosen path once the user confirms (and, for an
// existing file, agrees to replace it).
func newSaveDialog(win fyne.Window, folder, name string, then func(path string)) *saveDialog {
	d := &saveDialog{win: win, folder: folder, then: then}
	d.where = widget.NewLabel(folder)
	d.where.Truncation = fyne.TextTruncateEllipsis
	choose := widget.NewButton("Choose folder…", d.chooseFolder)
	d.name = widget.NewEntry()
	d.name.SetText(name)
	d.name.OnSubmitted = func(string) { d.confirm() }
	d.saveB = widget.NewButton("Save", d.confirm)
	d.saveB.Importance = widget.HighImportance
	cancel := widget.NewButton("Cancel", func() { d.dlg.Hide() })
	form := widget.NewForm(
		widget.NewFormItem("Folder", container.NewBorder(nil, nil, nil, choose, d.where)),
		widget.NewFormItem("File name", d.name),
	)
	d.dlg = dialog.NewCustomWithoutButtons("Save study as",
		container.NewVBox(form, container.NewHBox(layout.NewSpacer(), cancel, d.saveB)), win)
	d.dlg.Resize(fyne.NewSize(560, 200))
	return d
}

func (d *saveDialog) show() { d.dlg.Show() }

func (d *saveDialog) chooseFolder() {
	fd := dialog.NewFolderOpen(func(u fyne.ListableURI, err error) {
		if err != nil || u == nil {
			return
		}
		d.folder = u.Path()
		d.where.SetText(d.folder)
	}, d.win)
	if l, err := listerFor(d.folder); err == nil {
		fd.SetLocation(l)
	}
	fd.Resize(fyne.NewSize(900, 600))
	fd.Show()
}

// errSaveName is the message for a file name that is no file name.
var errSaveName = errors.New("give a file name (without a folder) to save the study as")

// path returns the chosen path, with ".json" added to a name without an
// extension.
func (d *saveDialog) path() (string, error) {
	name := strings.TrimSpace(d.name.Text)
	if name == "" || name == "." || name == ".." || strings.ContainsAny(name, `/\`) {
		return "", errSaveName
	}
	if filepath.Ext(name) == "" {
		name += ".json"
	}
	return filepath.Join(d.folder, name), nil
}

// confirm checks the path without opening it: a folder or other
// non-regular file is refused here, an existing file needs the user's
// agreement; then the dialog closes and then runs.
func (d *saveDialog) confirm() {
	p, err := d.path()
	if err != nil {
		dialog.ShowError(err, d.win)
		return
	}
	fi, err := os.Stat(p) // Stat never opens: safe on a FIFO
	switch {
	case err == nil && !fi.Mode().IsRegular():
		dialog.ShowError(errors.New(filepath.Base(p)+" is not a regular file: choose another name"), d.win)
		return
	case err == nil:
		dialog.ShowConfirm("Replace the file?", "“"+filepath.Base(p)+"” already exists in this folder. Replace it with this study?",
			func(ok bool) {
				if ok {
					d.dlg.Hide()
					d.then(p)
				}
			}, d.win)
		return
	}
	d.dlg.Hide()
	d.then(p)
}
