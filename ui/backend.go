package ui

// This file is the only place where package ui reaches into model, solver
// and export for work: every call the widgets make goes through one of the
// functions below, so that the wiring stays free of numerics.

import (
	"context"
	"errors"
	"fmt"
	"io"

	"sectionbench/export"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver"
)

type (
	engineRequest = solver.Request
	engineResult  = solver.Result
)

// engine is what the scheduler runs: one call per update. *solver.Engine
// is the real one; tests substitute their own.
type engine interface {
	Run(ctx context.Context, req engineRequest) (*engineResult, error)
}

func newEngine() engine { return solver.NewEngine() }

type (
	viewWindow = export.Window
	scene      = export.Scene
	figure     = export.Figure
)

// exportViews maps the workbench's views to export's.
var exportViews = [numViews]export.View{export.ViewPanels, export.ViewPressure, export.ViewStreamlines, export.ViewPolar}

func renderView(v viewKind, sc *scene, w, h int, dpi float64) (*figure, error) {
	return export.Render(exportViews[v], sc, w, h, dpi)
}

// figureWindow returns the data ranges of a figure's data area.
func figureWindow(f *figure) (viewWindow, bool) {
	w := viewWindow{XMin: min(f.X[0], f.X[1]), XMax: max(f.X[0], f.X[1]), YMin: min(f.Y[0], f.Y[1]), YMax: max(f.Y[0], f.Y[1])}
	return w, w.XMax > w.XMin && w.YMax > w.YMin
}

// leWindow returns the close-up window about an element's leading edge,
// sized in chords.
func leWindow(l *model.Layout, element int, chords float64) viewWindow {
	return export.LEWindow(l, element, chords*l.Elements[element].Chord*mmPerM)
}

// mmPerM converts the layout's metres to the figures' millimetres.
const mmPerM = 1000

// sceneOf gathers what the views draw from a result and the study solved.
func sceneOf(res *engineResult, st *model.Study, sweep []solver.Coefficients) *scene {
	cfg := res.Config
	return &scene{
		Layout:      res.Layout,
		Config:      &cfg,
		Solution:    res.Solution,
		Sweep:       sweep,
		Streamlines: res.Streamlines,
		Viscous:     res.Viscous,
		Pins:        st.Pins,
		AlphaDeg:    st.Flow.AlphaDeg,
		Element:     -1,
		GroundY:     cfg.GroundY,
		Ground:      cfg.Ground,
		Inverted:    st.Inverted,
	}
}

func newStudy() *model.Study { return model.NewStudy() }

func decodeStudy(b []byte) (*model.Study, error) { return model.DecodeStudy(b) }

func encodeStudy(st *model.Study) ([]byte, error) { return st.Encode() }

func cloneStudy(st *model.Study) *model.Study { return st.Clone() }

func validateStudy(st *model.Study) error { return st.Validate() }

type cleanReport = model.CleanReport

// loadSections returns the cleaned sections of a study's elements, with
// relative file paths resolved against baseDir.
func loadSections(st *model.Study, baseDir string) ([]*model.Section, []*cleanReport, error) {
	return export.LoadSections(st, baseDir)
}

// loadSectionFile reads and cleans a coordinate file.
func loadSectionFile(path string) (*model.Section, *cleanReport, error) {
	return export.LoadSectionFile(path)
}

// checkNACA reports why a designation is not a NACA section, or nil.
func checkNACA(designation string) error {
	_, err := model.ParseNACA(designation)
	return err
}

// safeRender renders a view, turning a panic into an error.
func safeRender(v viewKind, sc *scene, w, h int, dpi float64) (fig *figure, err error) {
	defer func() {
		if r := recover(); r != nil {
			fig, err = nil, fmt.Errorf("internal error drawing %s: %v", v, r)
		}
	}()
	return renderView(v, sc, w, h, dpi)
}

func loadStudy(path string) (*model.Study, error) { return export.LoadStudy(path) }

// saveStudy writes the study atomically.
func saveStudy(path string, st *model.Study) error { return export.SaveStudy(path, st) }

// writeFile writes a file atomically: it appears whole or not at all.
func writeFile(path string, write func(io.Writer) error) error {
	return export.WriteFileAtomic(path, write)
}

func writeFigure(w io.Writer, v viewKind, sc *scene, format string, widthIn, heightIn, dpi float64) error {
	c := *sc
	c.Dark = false // printed figures are light
	return export.WriteFigure(w, exportViews[v], &c, format, widthIn, heightIn, dpi)
}

func writeCpTable(w io.Writer, res *engineResult) error { return export.WriteCpTable(w, res.Solution) }

func writeSweepTable(w io.Writer, sweep []solver.Coefficients) error {
	return export.WriteSweepTable(w, sweep, nil)
}

func writeReport(w io.Writer, st *model.Study, res *engineResult, fileName, version string) error {
	return report.Write(w, report.Input{Study: st, Result: res, FileName: fileName, AppVersion: version})
}

// recovered runs f, turning a panic into an error.
func recovered(f func() error) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("internal error: %v", r)
		}
	}()
	return f()
}

// isNoData reports a view that lacks what it draws (as opposed to a
// failure).
func isNoData(err error) bool { return errors.Is(err, export.ErrNoData) }
