package ui

import (
	"errors"
	"io"
	"path/filepath"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"
)

// Size of exported figures: 6 × 4 in at 200 dpi reads well on a printed
// page (common practice for report figures).
const (
	figureWidthIn  = 6
	figureHeightIn = 4
	figureDPI      = 200
)

// exportItems lists what File ▸ Export offers: each item writes files into
// a folder the user picks, through one export call per file.
func (w *Workbench) exportItems() []*fyne.MenuItem {
	return []*fyne.MenuItem{
		fyne.NewMenuItem("Team report (PDF)…", func() { w.exportTo(w.writeReport) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Figures (PNG)…", func() { w.exportTo(w.writeFigures("png")) }),
		fyne.NewMenuItem("Figures (SVG)…", func() { w.exportTo(w.writeFigures("svg")) }),
		fyne.NewMenuItem("Figures (PDF)…", func() { w.exportTo(w.writeFigures("pdf")) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Surface Cp table (CSV)…", func() { w.exportTo(w.writeCpTable) }),
		fyne.NewMenuItem("Sweep table (CSV)…", func() { w.exportTo(w.writeSweepTable) }),
	}
}

// exportTo asks for a folder and runs write in it, reporting the files
// written or the error.
func (w *Workbench) exportTo(write func(dir string) ([]string, error)) {
	d := dialog.NewFolderOpen(func(u fyne.ListableURI, err error) {
		if err != nil {
			w.userError(err)
			return
		}
		if u == nil {
			return
		}
		// Writing can take a few seconds (print-resolution figures): do it
		// off the UI goroutine behind a busy dialog.
		busy := dialog.NewCustomWithoutButtons("Exporting…", widget.NewProgressBarInfinite(), w.win)
		busy.Show()
		dir := u.Path()
		w.ctl.act.add()
		go func() {
			defer w.ctl.act.done()
			var files []string
			err := recovered(func() error {
				var err error
				files, err = write(dir)
				return err
			})
			w.do(func() {
				busy.Hide()
				if err != nil {
					w.userError(err)
					return
				}
				dialog.ShowInformation("Exported", "Wrote "+strings.Join(files, ", ")+"\nto "+dir, w.win)
			})
		}()
	}, w.win)
	d.SetLocation(w.startDir())
	d.Resize(fyne.NewSize(900, 600))
	d.Show()
}

// errNoResult is returned by an export with nothing solved yet.
var errNoResult = errors.New("nothing to export yet: the study has not been solved")

// exportBase is the stem of exported file names.
func (w *Workbench) exportBase() string {
	return strings.TrimSuffix(fileNameFor(w.ctl.state.study.Name), ".json")
}

func (w *Workbench) writeFigures(format string) func(dir string) ([]string, error) {
	return func(dir string) ([]string, error) {
		sc := w.lastScene()
		if sc == nil {
			return nil, errNoResult
		}
		var files []string
		for k := range numViews {
			name := w.exportBase() + "-" + exportViews[k].String() + "." + format
			err := writeFile(filepath.Join(dir, name), func(out io.Writer) error {
				return writeFigure(out, k, sc, format, figureWidthIn, figureHeightIn, figureDPI)
			})
			if err != nil {
				return files, err
			}
			files = append(files, name)
		}
		return files, nil
	}
}

func (w *Workbench) writeReport(dir string) ([]string, error) {
	res, _, _ := w.ctl.Result()
	if res == nil {
		return nil, errNoResult
	}
	r := *res
	r.Sweep = w.ctl.Sweep()
	name := w.exportBase() + "-report.pdf"
	st := w.ctl.Study()
	file := filepath.Base(w.ctl.Path())
	if w.ctl.Path() == "" {
		file = "unsaved study"
	}
	return []string{name}, writeFile(filepath.Join(dir, name), func(out io.Writer) error {
		return writeReport(out, st, &r, file, w.app.Metadata().Version)
	})
}

func (w *Workbench) writeCpTable(dir string) ([]string, error) {
	res, _, _ := w.ctl.Result()
	if res == nil {
		return nil, errNoResult
	}
	name := w.exportBase() + "-cp.csv"
	return []string{name}, writeFile(filepath.Join(dir, name), func(out io.Writer) error {
		return writeCpTable(out, res)
	})
}

func (w *Workbench) writeSweepTable(dir string) ([]string, error) {
	sw := w.ctl.Sweep()
	if len(sw) == 0 {
		return nil, errors.New("no sweep to export: run the sweep first")
	}
	name := w.exportBase() + "-sweep.csv"
	return []string{name}, writeFile(filepath.Join(dir, name), func(out io.Writer) error {
		return writeSweepTable(out, sw)
	})
}
