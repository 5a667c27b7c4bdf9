package ui

import (
	"context"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"sectionbench/export"
	"sectionbench/export/format"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
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
	items := []*fyne.MenuItem{
		fyne.NewMenuItem("Team report (PDF)…", func() { w.exportWith(w.writeReportCtx(), true) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Figures (PNG)…", func() { w.exportTo(w.writeFigures("png")) }),
		fyne.NewMenuItem("Figures (SVG)…", func() { w.exportTo(w.writeFigures("svg")) }),
		fyne.NewMenuItem("Figures (PDF)…", func() { w.exportTo(w.writeFigures("pdf")) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Surface Cp table (CSV)…", func() { w.exportTo(w.writeCpTable()) }),
		fyne.NewMenuItem("Sweep table (CSV)…", func() { w.exportTo(w.writeSweepTable()) }),
		fyne.NewMenuItemSeparator(),
	}
	return append(items, w.manufacturingItems()...)
}

// exportTo asks for a folder and runs write in it, reporting the files
// written or the error.
func (w *Workbench) exportTo(write exportJob) {
	w.exportWith(func(_ context.Context, dir string) ([]string, error) { return write(dir) }, false)
}

// cancellableJob is an exportJob that stops, writing nothing, when ctx is
// cancelled.
type cancellableJob func(ctx context.Context, dir string) ([]string, error)

// exportWith asks for a folder and runs write in it, reporting the files
// written or the error; with cancellable the busy dialog has a Cancel
// button (the team report runs a density study first, which takes
// minutes with the coupled solution on two elements, and the dialog
// had no way out).
func (w *Workbench) exportWith(write cancellableJob, cancellable bool) {
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
		ctx, cancel := context.WithCancel(context.Background())
		var busy dialog.Dialog
		if cancellable {
			busy = dialog.NewCustom("Exporting…", "Cancel", widget.NewProgressBarInfinite(), w.win)
			busy.SetOnClosed(cancel)
		} else {
			busy = dialog.NewCustomWithoutButtons("Exporting…", widget.NewProgressBarInfinite(), w.win)
		}
		busy.Show()
		dir := u.Path()
		w.ctl.Activity().Add()
		go func() {
			defer w.ctl.Activity().Done()
			defer cancel()
			var files []string
			err := recovered(func() error {
				var err error
				files, err = write(ctx, dir)
				return err
			})
			w.do(func() {
				busy.Hide()
				if errors.Is(err, context.Canceled) {
					return // cancelled by the user: nothing was written
				}
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

// exportJob writes one File ▸ Export item into the folder dir and returns
// the names of the files written. Every export has the same shape: a
// method of Workbench, called on the UI goroutine, gathers what the export
// needs (the study, sections, results: copies or values never changed
// after they are made) and returns the job, which exportTo runs off the
// UI goroutine. A job must not read the workbench or its controller.
type exportJob func(dir string) ([]string, error)

// errNoResult is returned by an export with nothing solved yet.
var errNoResult = errors.New("nothing to export yet: the study has not been solved")

// exportBase is the stem of exported file names: the team, when the study
// names one, then the study's name.
func (w *Workbench) exportBase() string {
	st := w.ctl.Current()
	return strings.TrimSuffix(fileNameFor(strings.TrimSpace(st.Team+" "+st.Name)), ".json")
}

// writeFigures gathers, on the UI goroutine, what the figures draw: the
// four views of the scene on screen, the density study when one has been
// run for the current configuration, and the panel sizes of every
// element. The returned function writes them, one file each.
func (w *Workbench) writeFigures(format string) exportJob {
	sc := w.lastScene()
	density := w.currentDensity()
	st, secs := w.ctl.Study(), slices.Clone(w.ctl.Sections())
	maxRatio := defaultMaxRatio
	if d := w.density; d != nil {
		maxRatio = d.sizes.maxRatio
	}
	base := w.exportBase()
	return func(dir string) ([]string, error) {
		if sc == nil {
			return nil, errNoResult
		}
		var files []string
		write := func(name string, f func(io.Writer) error) error {
			if err := export.WriteFileAtomic(filepath.Join(dir, name), f); err != nil {
				return err
			}
			files = append(files, name)
			return nil
		}
		for k := range numViews {
			name := base + "-" + exportViews[k].String() + "." + format
			if err := write(name, func(out io.Writer) error {
				return writeFigure(out, k, sc, format, figureWidthIn, figureHeightIn, figureDPI)
			}); err != nil {
				return files, err
			}
		}
		if density != nil {
			if err := write(base+"-density."+format, func(out io.Writer) error {
				return writeDensityFigure(out, density, format, figureWidthIn, figureHeightIn, figureDPI)
			}); err != nil {
				return files, err
			}
		}
		sizes, err := placedPanelSizes(st, secs)
		if err != nil {
			return files, err
		}
		for i, ps := range sizes {
			name := fmt.Sprintf("%s-panel-sizes-%d.%s", base, i+1, format)
			if err := write(name, func(out io.Writer) error {
				return writePanelSizeFigure(out, ps, maxRatio, format, figureWidthIn, figureHeightIn, figureDPI)
			}); err != nil {
				return files, err
			}
		}
		return files, nil
	}
}

// currentDensity returns the density study of the density window when it
// holds for the current study, else nil. UI goroutine only.
func (w *Workbench) currentDensity() *engine.DensityResult {
	if d := w.density; d != nil && d.fresh() {
		return d.out.res
	}
	return nil
}

// reportJob is what the team report is made of, gathered on the UI
// goroutine.
type reportJob struct {
	study    *model.Study
	result   *engine.Result // with the sweep and its boundary-layer estimate
	sections []*model.Section
	reports  []*model.CleanReport
	density  *engine.DensityResult
	file     string
	version  string
	setup    *report.Setup // the set-up window's maps, search and finite span; nil for none
}

// newReportJob gathers the report's input: the current result with the
// sweep shown in the polar (and its drag and transition, when the sweep
// ran with the boundary layer, or its coupled solution with maximum lift),
// and the density study when it holds for the current study.
func (w *Workbench) newReportJob() (*reportJob, error) {
	res, _, _ := w.ctl.Result()
	if res == nil {
		return nil, errNoResult
	}
	r := *res
	w.ctl.AddSweepTo(&r)
	file := filepath.Base(w.ctl.Path())
	if w.ctl.Path() == "" {
		file = "unsaved study"
	}
	return &reportJob{study: w.ctl.Study(), result: &r, sections: w.ctl.Sections(), reports: w.ctl.Reports(), density: w.currentDensity(), file: file, version: w.app.Metadata().Version, setup: w.setup.reportPart()}, nil
}

// writeReport gathers the report's input on the UI goroutine; the returned
// function writes it.
func (w *Workbench) writeReport() exportJob {
	job := w.writeReportCtx()
	return func(dir string) ([]string, error) { return job(context.Background(), dir) }
}

// writeReportCtx is writeReport, stopped (nothing written) when its
// context is cancelled.
func (w *Workbench) writeReportCtx() cancellableJob {
	job, err := w.newReportJob()
	name := w.exportBase() + "-report.pdf"
	return func(ctx context.Context, dir string) ([]string, error) {
		if err != nil {
			return nil, err
		}
		return []string{name}, export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error {
			return writeReport(ctx, out, job.study, job.result, job.sections, job.reports, job.density, job.file, job.version, job.setup)
		})
	}
}

// writeCpTable gathers the current solution (UI goroutine); the job
// writes its surface Cp table.
func (w *Workbench) writeCpTable() exportJob {
	res, _, _ := w.ctl.Result()
	meta := tableMetadata(w.ctl.Study(), res, w.app.Metadata().Version)
	name := w.exportBase() + "-cp.csv"
	return func(dir string) ([]string, error) {
		if res == nil {
			return nil, errNoResult
		}
		return []string{name}, export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error {
			return format.WriteCpTable(out, meta, res.Solution)
		})
	}
}

// writeSweepTable gathers the sweep shown in the polar (UI goroutine); the
// job writes it.
func (w *Workbench) writeSweepTable() exportJob {
	sw, vis := w.ctl.Sweep(), w.ctl.SweepViscous()
	if len(vis) != len(sw) {
		vis = nil
	}
	meta := tableMetadata(w.ctl.Study(), nil, w.app.Metadata().Version)
	name := w.exportBase() + "-sweep.csv"
	return func(dir string) ([]string, error) {
		if len(sw) == 0 {
			return nil, errors.New("no sweep to export: run the sweep first")
		}
		return []string{name}, export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error {
			return format.WriteSweepTable(out, meta, sw, vis)
		})
	}
}

// tableMetadata heads a CSV of study st solved as res (nil when unknown).
func tableMetadata(st *model.Study, res *engine.Result, version string) format.Metadata {
	return format.StudyMetadata(st, res, "Sectionbench "+version)
}

// writeReport writes the team report of st solved as res from its sections
// and their cleaning reports. Without a density study the report runs one
// (a report always carries its convergence evidence); it takes tens of
// milliseconds inviscid, and this runs off the UI goroutine.
func writeReport(ctx context.Context, w io.Writer, st *model.Study, res *engine.Result, secs []*model.Section, reps []*model.CleanReport, density *engine.DensityResult, fileName, version string, setup *report.Setup) error {
	if density == nil && len(secs) == len(st.Elements) {
		if d, err := engine.NewEngine().Density(ctx, st, secs, nil); err == nil {
			density = d
		}
	}
	var vd []report.ViscousDensityRow
	if len(secs) == len(st.Elements) {
		vd = report.ViscousDensity(ctx, st, secs, density) // nil with the boundary layer off; from the density study's rows when it solved the coupled solution
	}
	if err := ctx.Err(); err != nil {
		return err // cancelled: no report without its density study
	}
	return report.Write(w, report.Input{Study: st, Result: res, Density: density, FileName: fileName, AppVersion: version, Sections: secs, CleanReports: reps, ViscousDensity: vd, Setup: setup})
}
