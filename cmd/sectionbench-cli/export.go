package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"strings"
	"time"

	"sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/export/geometry"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// exportKinds lists --what values with what each writes.
var exportKinds = []struct{ name, help string }{
	{"coords", "cleaned coordinates of one element, plain text (name line, then x y)"},
	{"csv", "a CSV table: --table coords, cp, sweep or bl"},
	{"outline-dxf", "manufacturing outline, ASCII DXF in millimetres"},
	{"outline-svg", "manufacturing outline, SVG at true scale with a scale bar"},
	{"figure", "one view as PNG, SVG or PDF (the format from the file name): --view " + strings.Join(figureViewNames(), ", ")},
}

func cmdExport(args []string, stdout, stderr io.Writer) error {
	var names []string
	for _, k := range exportKinds {
		names = append(names, k.name)
	}
	fs := newFlags("export", "export (--study FILE | --section SPEC) --what "+strings.Join(names, "|")+" [options] -o OUT", stdout)
	in := addInputs(fs, false, "text")
	what := fs.String("what", "", "what to write: "+strings.Join(names, ", "))
	out := fs.String("o", "", "output `file` (- for standard output, text formats only)")
	table := fs.String("table", "coords", "with --what csv: coords, cp (surface Cp per element), sweep, or bl (boundary layer)")
	element := fs.Int("element", 1, "element `number` for coords (1 = main)")
	chordMM := fs.Float64("chord-mm", -1, "chord in `mm` of coordinates; 0: unit chord; -1: the element's own chord with --study, unit chord with --section; for an outline of --section, its chord (1000 when not given)")
	points := fs.Int("points", 0, "repanel the coordinates to this many `panels` first (with --spacing)")
	skin := fs.Float64("skin-mm", 0, "outline: also draw the inward offset by this skin thickness in `mm` (rib template)")
	placed := fs.Bool("placed", false, "outline: keep the elements where the study puts them (assembly) instead of one rib template per element")
	chordLine := fs.Bool("chord-line", false, "outline: draw each element's chord line")
	spar := fs.String("spar", "", "outline: spar hole `XC,DIAMETER_MM` in every element, e.g. 0.3,8")
	sparOn := fs.String("spar-on", "mean-line", "outline: the spar hole's centre on the `mean-line` (the usual choice for cambered ribs) or the chord-line")
	minLigament := fs.Float64("min-ligament-mm", geometry.DefaultMinLigamentMM, "outline: least material in `mm` a spar hole must leave to the rib's edge (the skin offset); a hole that leaves less is refused")
	material := fs.Float64("material-mm", 0, "outline: sheet thickness in `mm` for the title block (0: not given)")
	view := fs.String("view", "pressure", "figure: the `view` to draw: "+strings.Join(figureViewNames(), ", "))
	width := fs.Float64("width-in", 8, "figure width in `inches`")
	height := fs.Float64("height-in", 5, "figure height in `inches`")
	dpi := fs.Float64("dpi", 150, "figure resolution for PNG, `dots per inch`")
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	if *what == "" {
		return usagef("give --what: %s", strings.Join(names, ", "))
	}
	if err := checkFigureSize(*width, *height, *dpi); err != nil {
		return err
	}
	if *chordMM != -1 && !(*chordMM >= 0 && *chordMM <= model.MaxChordMM) {
		return usagef("--chord-mm %g: want 0 (unit chord) to %g mm", *chordMM, float64(model.MaxChordMM))
	}
	if !(*skin >= 0 && *skin <= model.MaxSkinMM) {
		return usagef("--skin-mm %g: want 0 (no offset) to %d mm", *skin, model.MaxSkinMM)
	}
	if *out == "" {
		return usagef("give -o OUT (or -o - for standard output)")
	}
	st, secs, _, err := in.load(fs)
	if err != nil {
		return err
	}
	var write func(io.Writer) error
	binary := false
	switch *what {
	case "coords", "csv":
		if *what == "csv" && *table != "coords" {
			write, err = tableWriter(*table, st, secs)
			if err != nil {
				return err
			}
			break
		}
		if *element < 1 || *element > len(secs) {
			return usagef("--element %d: the study has %d element(s)", *element, len(secs))
		}
		o := format.CoordOptions{ChordMM: max(*chordMM, 0), Program: "Sectionbench " + version}
		if in.study != "" {
			o.Element, o.Study = st.Elements[*element-1].Name, st.Name
			if *chordMM < 0 {
				o.ChordMM = st.Elements[*element-1].ChordMM
			}
		}
		if *points > 0 {
			p := st.Panelling
			p.Panels = *points
			if err := p.Validate(); err != nil {
				return usagef("--points: %v", err)
			}
			o.Panelling = &p
		}
		sec := secs[*element-1]
		if *what == "coords" {
			write = func(w io.Writer) error { return format.WriteCoordinates(w, sec, o) }
		} else {
			write = func(w io.Writer) error { return format.WriteCoordinatesCSV(w, sec, o) }
		}
	case "outline-dxf", "outline-svg":
		if in.section != "" && *chordMM > 0 {
			st.Elements[0].ChordMM = *chordMM
		}
		l, err := model.Place(st, secs)
		if err != nil {
			return err
		}
		if *sparOn != "mean-line" && *sparOn != "chord-line" {
			return usagef("--spar-on %q: want mean-line or chord-line", *sparOn)
		}
		if !(*minLigament >= 0 && *minLigament < 1000) {
			return usagef("--min-ligament-mm %g: want a length in mm, 0 or more", *minLigament)
		}
		if !(*material >= 0 && *material < 1000) {
			return usagef("--material-mm %g: want a thickness in mm, 0 or more", *material)
		}
		opt := geometry.OutlineOptions{Placed: *placed, SkinMM: *skin, ChordLine: *chordLine, MinLigamentMM: *minLigament,
			Title: geometry.TitleBlock{Team: st.Team, MaterialMM: *material, Version: version, Date: time.Now().UTC().Format("2006-01-02"),
				AlphaDeg: st.Flow.AlphaDeg, Solved: true}}
		if *spar != "" {
			v, err := parseFloatList("--spar", *spar, 0, model.MaxHoleMM)
			if err != nil || len(v) != 2 || v[0] > 1 {
				return usagef("--spar %q: want XC,DIAMETER_MM with XC in [0, 1] and the diameter up to %d mm", *spar, model.MaxHoleMM)
			}
			for i := range st.Elements {
				opt.Marks = append(opt.Marks, geometry.Mark{Element: i, Label: "spar", XC: v[0], DiameterMM: v[1], OnMeanLine: *sparOn == "mean-line"})
			}
		}
		o, err := geometry.NewOutline(st.Name, l, opt)
		if err != nil {
			return err
		}
		if *what == "outline-dxf" {
			write = func(w io.Writer) error { return format.WriteDXF(w, o) }
		} else {
			write = func(w io.Writer) error { return format.WriteSVG(w, o) }
		}
	case "figure":
		v, format, err := figureKind(*view, *out)
		if err != nil {
			return err
		}
		res, err := engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true, Streamlines: v == figure.ViewStreamlines, CoupledMaxIterations: coupledMaxIterations})
		if err != nil {
			return err
		}
		sc := figure.NewScene(res, st)
		binary = format != "svg"
		write = func(w io.Writer) error { return figure.WriteFigure(w, v, sc, format, *width, *height, *dpi) }
	default:
		return usagef("--what %q: want one of %s", *what, strings.Join(names, ", "))
	}
	wrote, err := writeOutput(*out, binary, stdout, write, in.files(st))
	if err != nil {
		return err
	}
	if wrote {
		fmt.Fprintf(stderr, "wrote %s\n", *out)
	}
	return nil
}

// Figure size limits: a poster is under 50 inches a side, 10 dpi is the
// coarsest useful raster and 1200 dpi the finest a printer resolves; a
// raster side over 20 000 pixels would take gigabytes.
const (
	maxFigureIn   = 50
	minFigureDPI  = 10
	maxFigureDPI  = 1200
	maxFigureSide = 20000
	// minFigureSide: below about 32 pixels a side no label or curve can be
	// told apart (and an image of 0 pixels cannot be written at all).
	minFigureSide = 32
)

// checkFigureSize refuses sizes the renderer cannot or should not draw.
func checkFigureSize(w, h, dpi float64) error {
	for _, v := range []struct {
		flag      string
		x, lo, hi float64
	}{{"--width-in", w, 0, maxFigureIn}, {"--height-in", h, 0, maxFigureIn}, {"--dpi", dpi, minFigureDPI, maxFigureDPI}} {
		if !(v.x > v.lo && v.x <= v.hi) && !(v.flag == "--dpi" && v.x == v.lo) {
			return usagef("%s %g: want a number in (%g, %g]", v.flag, v.x, v.lo, v.hi)
		}
	}
	if w*dpi < minFigureSide || h*dpi < minFigureSide {
		return usagef("--width-in × --height-in at --dpi: %.3g × %.3g pixels, less than %d a side, draws nothing legible", w*dpi, h*dpi, minFigureSide)
	}
	if w*dpi > maxFigureSide || h*dpi > maxFigureSide {
		return usagef("--width-in × --dpi: %.0f × %.0f pixels is more than %d a side", w*dpi, h*dpi, maxFigureSide)
	}
	return nil
}

// figureViewNames lists the views a figure can show.
func figureViewNames() []string {
	var names []string
	for _, v := range figure.Views {
		if v != figure.ViewDensity {
			names = append(names, v.String())
		}
	}
	return names
}

// figureKind finds the view by name and the format from the file name.
func figureKind(name, out string) (figure.View, string, error) {
	var view figure.View = -1
	for _, v := range figure.Views {
		if v.String() == name {
			view = v
		}
	}
	if view < 0 || view == figure.ViewDensity {
		return 0, "", usagef("--view %q: want one of %s", name, strings.Join(figureViewNames(), ", "))
	}
	format := "png"
	for _, f := range []string{"png", "svg", "pdf"} {
		if strings.HasSuffix(strings.ToLower(out), "."+f) {
			format = f
		}
	}
	return view, format, nil
}

// tableWriter returns the writer of a results table as CSV.
func tableWriter(table string, st *model.Study, secs []*model.Section) (func(io.Writer) error, error) {
	req := engine.Request{Study: st, Sections: secs, Sweep: table == "sweep", CoupledMaxIterations: coupledMaxIterations}
	switch table {
	case "cp", "sweep":
	case "bl":
		if !st.Viscous.Enabled {
			return nil, usagef("--table bl needs the boundary layer: give --re or a study with viscous.enabled")
		}
	default:
		return nil, usagef("--table %q: want coords, cp, sweep or bl", table)
	}
	res, err := engine.NewEngine().Run(context.Background(), req)
	if err != nil {
		return nil, err
	}
	switch table {
	case "cp":
		return func(w io.Writer) error {
			return format.WriteCpTable(w, format.StudyMetadata(st, res, "Sectionbench "+version), res.Solution)
		}, nil
	case "sweep":
		return func(w io.Writer) error { return sweepCSV(w, st, res) }, nil
	}
	if c := res.Coupled; c != nil {
		if !c.Converged {
			return nil, fmt.Errorf("--table bl: %s", notConverged(c))
		}
		return func(w io.Writer) error {
			return format.WriteCoupledBoundaryLayerTable(w, format.StudyMetadata(st, res, "Sectionbench "+version), c.Detail)
		}, nil
	}
	return func(w io.Writer) error {
		return format.WriteBoundaryLayerTable(w, format.StudyMetadata(st, res, "Sectionbench "+version), res.Viscous)
	}, nil
}

func cmdReport(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("report", "report (--study FILE | --section SPEC [--alpha DEG]) -o OUT.pdf [--page A4|Letter] [--author NAME] [--no-density] [--map NAME=FROM:TO:STEP [--map-inviscid] [--separation-limit XC]] [--search NAME=LO:HI [--search …] [--search-objective downforce|lift-to-drag|drag] [--search-inviscid] [--search-max-evaluations N]] [--finite-span]", stdout)
	in := addInputs(fs, false, "pdf")
	out := fs.String("o", "", "output PDF `file`")
	page := fs.String("page", report.PageA4, "page size: A4 or Letter")
	author := fs.String("author", "", "who prepared the report (default: the study's team)")
	noDensity := fs.Bool("no-density", false, "leave out the panel density study (run by default: the study's panel counts, or 20 to 640)")
	setupFlags := addReportSetupFlags(fs)
	if _, err := fs.parse(args, 0); err != nil {
		return err
	}
	if *out == "" {
		return usagef("give -o OUT.pdf")
	}
	if !strings.EqualFold(*page, report.PageA4) && !strings.EqualFold(*page, report.PageLetter) {
		return usagef("--page %q: want A4 or Letter", *page)
	}
	pageSize := report.PageA4
	if strings.EqualFold(*page, report.PageLetter) {
		pageSize = report.PageLetter
	}
	st, secs, reps, err := in.load(fs)
	if err != nil {
		return err
	}
	e := engine.NewEngine()
	res, err := e.Run(context.Background(), engine.Request{Study: st, Sections: secs, Sweep: true, Streamlines: true, CoupledMaxIterations: coupledMaxIterations})
	if err != nil {
		return err
	}
	input := report.Input{Study: st, Result: res, FileName: reportSource(in), AppVersion: version, PageSize: pageSize, Author: *author,
		Sections: secs, CleanReports: reps, Inputs: reportInputs(in, st), CommandLine: commandLine(append([]string{"report"}, args...))}
	if !*noDensity {
		if input.Density, err = e.Density(context.Background(), st, secs, nil); err != nil {
			return err
		}
		input.ViscousDensity = report.ViscousDensity(context.Background(), st, secs, input.Density)
	}
	if input.Setup, err = setupFlags.setup(st, secs); err != nil {
		return err
	}
	wrote, err := writeOutput(*out, true, stdout, func(w io.Writer) error { return report.Write(w, input) }, in.files(st))
	if err != nil {
		return err
	}
	if wrote {
		fmt.Fprintf(stderr, "wrote %s\n", *out)
	}
	return nil
}

// reportInputs lists the files the report was made from (inputs.files)
// with their SHA-256.
func reportInputs(in *inputs, st *model.Study) []report.InputFile {
	var files []report.InputFile
	for _, path := range in.files(st) {
		if b, err := os.ReadFile(path); err == nil {
			files = append(files, report.InputFile{Path: path, SHA256: report.Hash(b)})
		}
	}
	return files
}

// commandLine is the command as typed, each argument quoted when a shell
// would need it.
func commandLine(args []string) string {
	q := []string{"sectionbench-cli"}
	for _, a := range args {
		if a == "" || strings.ContainsAny(a, " \t'\"$\\;&|<>()*?[]{}~`!#") {
			a = "'" + strings.ReplaceAll(a, "'", `'\''`) + "'"
		}
		q = append(q, a)
	}
	return strings.Join(q, " ")
}

func reportSource(in *inputs) string {
	if in.study != "" {
		return in.study
	}
	return in.section
}
