package ui

// This file is the only place where package ui reaches into model, solver
// and export for work: every call the widgets make goes through one of the
// functions below, so that the wiring stays free of numerics.

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"

	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver"
)

// TODO(stub): the types and functions below stand in for solver.Engine,
// export.Render and the model study functions until those land; they are
// replaced by aliases and direct calls before the deadline.

type engineRequest struct {
	Study       *model.Study
	Sections    []*model.Section
	Sweep       bool
	Streamlines bool
}

type engineResult struct {
	Layout      *model.Layout
	Config      solver.Config
	Solution    *solver.Solution
	Sweep       []solver.Coefficients
	Streamlines []struct{}
	Viscous     *struct{}
	Elapsed     time.Duration
}

// engine is what the scheduler runs: one call per update.
type engine interface {
	Run(ctx context.Context, req engineRequest) (*engineResult, error)
}

type stubEngine struct{}

func (stubEngine) Run(ctx context.Context, req engineRequest) (*engineResult, error) {
	return nil, errors.New("solver engine not available yet")
}

func newEngine() engine { return stubEngine{} }

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
		Layout:   res.Layout,
		Config:   &cfg,
		Solution: res.Solution,
		Sweep:    sweep,
		Pins:     st.Pins,
		AlphaDeg: st.Flow.AlphaDeg,
		Element:  -1,
		GroundY:  cfg.GroundY,
		Ground:   cfg.Ground,
		Inverted: st.Inverted,
	}
}

func newStudy() *model.Study { return model.NewStudy() }

func decodeStudy(b []byte) (*model.Study, error) { return model.DecodeStudy(b) }

func encodeStudy(st *model.Study) ([]byte, error) { return st.Encode() }

func cloneStudy(st *model.Study) *model.Study { return st.Clone() }

func validateStudy(st *model.Study) error { return st.Validate() }

type cleanReport = model.CleanReport

// ktPoints is how many points an analytic Kármán–Trefftz contour gets
// before repanelling: dense enough that the spline through them is exact to
// plotting accuracy.
const ktPoints = 401

// loadSections returns the cleaned sections of a study's elements.
func loadSections(st *model.Study, baseDir string) ([]*model.Section, []*cleanReport, error) {
	secs := make([]*model.Section, len(st.Elements))
	reps := make([]*cleanReport, len(st.Elements))
	for i, e := range st.Elements {
		s, r, err := sectionFromSource(e.Section, baseDir)
		if err != nil {
			return nil, nil, fmt.Errorf("element %q: %w", e.Name, err)
		}
		secs[i], reps[i] = s, r
	}
	return secs, reps, nil
}

func sectionFromSource(src model.SectionSource, baseDir string) (*model.Section, *cleanReport, error) {
	if src.Embedded != nil {
		pts := make([]model.Point, len(src.Embedded.Points))
		for i, p := range src.Embedded.Points {
			pts[i] = model.Point{X: p[0], Y: p[1]}
		}
		s, err := model.NewSection(src.Embedded.Name, pts)
		return s, nil, err
	}
	if d, ok := strings.CutPrefix(src.Spec, "naca:"); ok {
		s, err := model.NACA(d, model.NACAOptions{})
		return s, nil, err
	}
	if d, ok := strings.CutPrefix(src.Spec, "kt:"); ok {
		k, err := model.ParseKT(d)
		if err != nil {
			return nil, nil, err
		}
		s, err := k.Section(ktPoints)
		return s, nil, err
	}
	return nil, nil, errors.New("section generators not available yet: " + src.Spec)
}

func loadSectionFile(path string) (*model.Section, *cleanReport, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	p, err := model.ParseCoordinates(f, filepath.Base(path))
	if err != nil {
		return nil, nil, err
	}
	return p.Clean(model.DefaultCleanOptions)
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

// TODO(stub): export.LoadStudy and export.SaveStudy.
func loadStudy(path string) (*model.Study, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return decodeStudy(b)
}

func saveStudy(path string, st *model.Study) error {
	b, err := encodeStudy(st)
	if err != nil {
		return err
	}
	return export.WriteFileAtomic(path, func(w io.Writer) error {
		_, err := w.Write(b)
		return err
	})
}

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
