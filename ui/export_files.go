package ui

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"sectionbench/export"
	"sectionbench/export/format"
	"sectionbench/export/geometry"
	"sectionbench/model"
)

// This file holds File ▸ Export's manufacturing items: cleaned coordinates
// and the outlines a laser cutter or CNC takes, one call into export per
// file.

// outlineSettings are the choices of the outline dialog.
type outlineSettings struct {
	skinMM    float64 // inward offset for rib templates; 0: none
	sparXC    float64 // spar hole position on the chord; 0: none
	sparDiaMM float64
	chordLine bool
	placed    bool // the assembly as the study places it, else one template per element
	// minLigamentMM is the least material a spar hole leaves to the rib's
	// edge (geometry.DefaultMinLigamentMM when the field is empty);
	// materialMM the sheet thickness for the title block, 0 when not given.
	minLigamentMM, materialMM float64
	sparOnChord               bool // the spar on the chord line, else on the mean line
}

// manufacturingItems are appended to File ▸ Export.
func (w *Workbench) manufacturingItems() []*fyne.MenuItem {
	return []*fyne.MenuItem{
		fyne.NewMenuItem("Coordinates (text and CSV, mm and unit chord)…", func() { w.exportTo(w.writeCoordinates()) }),
		fyne.NewMenuItem("Outline for manufacturing (DXF and SVG)…", w.askOutline),
		fyne.NewMenuItem("Boundary-layer table (CSV)…", func() { w.exportTo(w.writeBoundaryLayer()) }),
	}
}

// writeCoordinates gathers the study and its cleaned sections (UI
// goroutine); the job writes each element's section four ways: plain text
// and CSV, at unit chord and at its chord in millimetres.
func (w *Workbench) writeCoordinates() exportJob {
	st, secs, base := w.ctl.Study(), slices.Clone(w.ctl.Sections()), w.exportBase()
	program := "Sectionbench " + w.app.Metadata().Version
	return func(dir string) ([]string, error) {
		return writeCoordinateFiles(dir, base, program, st, secs)
	}
}

// writeCoordinateFiles writes the coordinate files of writeCoordinates.
func writeCoordinateFiles(dir, base, program string, st *model.Study, secs []*model.Section) ([]string, error) {
	if len(secs) != len(st.Elements) {
		return nil, errNoResult
	}
	var files []string
	for i, e := range st.Elements {
		stem := fmt.Sprintf("%s-%d-%s", base, i+1, fileStem(e.Name))
		for _, f := range []struct {
			suffix string
			opt    format.CoordOptions
			csv    bool
		}{
			{".dat", format.CoordOptions{Element: e.Name, Study: st.Name}, false},
			{"-mm.dat", format.CoordOptions{ChordMM: e.ChordMM, Element: e.Name, Study: st.Name}, false},
			{".csv", format.CoordOptions{Element: e.Name, Study: st.Name, Program: program}, true},
			{"-mm.csv", format.CoordOptions{ChordMM: e.ChordMM, Element: e.Name, Study: st.Name, Program: program}, true},
		} {
			name := stem + f.suffix
			sec, opt, csv := secs[i], f.opt, f.csv
			err := export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error {
				if csv {
					return format.WriteCoordinatesCSV(out, sec, opt)
				}
				return format.WriteCoordinates(out, sec, opt)
			})
			if err != nil {
				return files, err
			}
			files = append(files, name)
		}
	}
	return files, nil
}

// askOutline asks for the outline's options, then for the folder.
func (w *Workbench) askOutline() {
	o := newOutlineForm()
	dialog.ShowForm("Outline for manufacturing", "Choose folder…", "Cancel", o.items, func(ok bool) {
		if !ok {
			return
		}
		s, err := o.settings()
		if err != nil {
			w.userError(err)
			return
		}
		w.exportTo(w.writeOutline(s))
	}, w.win)
}

// outlineForm is the outline dialog's content. Its number fields apply as
// the control column's do: each is checked on Enter or leaving, a bad
// value explained beside it and the field returned to the value in use
// when left.
type outlineForm struct {
	items                                     []*widget.FormItem
	skin, sparXC, sparDia, ligament, material *field
	onChord, chord                            *widget.Check
	placed                                    *widget.RadioGroup
}

func newOutlineForm() *outlineForm {
	o := &outlineForm{}
	num := func(name string, lo, hi float64, placeholder string) (*field, fyne.CanvasObject) {
		msg := message()
		f := newField(nil, msg, func(text string) error {
			_, err := outlineNumber(name, text, lo, hi)
			return err
		})
		f.SetPlaceHolder(placeholder)
		return f, container.NewVBox(f, msg)
	}
	var skin, sparXC, sparDia, ligament, material fyne.CanvasObject
	o.skin, skin = num("skin thickness", 0, model.MaxSkinMM, "0: outline only")
	o.sparXC, sparXC = num("spar hole position", 0, 1, "e.g. 0.3; empty: none")
	o.sparDia, sparDia = num("spar hole diameter", 0, model.MaxHoleMM, "e.g. 8")
	o.ligament, ligament = num("minimum ligament", 0, 100, fmt.Sprintf("%g (default)", float64(geometry.DefaultMinLigamentMM)))
	o.material, material = num("sheet thickness", 0, 100, "for the title block; empty: not given")
	o.onChord = widget.NewCheck("spar on the chord line (default: on the mean line)", nil)
	o.chord = widget.NewCheck("draw each chord line", nil)
	o.placed = widget.NewRadioGroup([]string{"one rib template per element", "the assembly as placed"}, nil)
	o.placed.SetSelected("one rib template per element")
	o.items = []*widget.FormItem{
		widget.NewFormItem("skin thickness (mm)", skin),
		widget.NewFormItem("spar hole at x/c", sparXC),
		widget.NewFormItem("spar hole diameter (mm)", sparDia),
		widget.NewFormItem("", o.onChord),
		widget.NewFormItem("minimum ligament (mm)", ligament),
		widget.NewFormItem("sheet thickness (mm)", material),
		widget.NewFormItem("", o.chord),
		widget.NewFormItem("layout", o.placed),
	}
	return o
}

// settings returns the options in use. A text typed and not yet left is
// applied, or refused and replaced by the value in use, first: what the
// fields show is what is used.
func (o *outlineForm) settings() (outlineSettings, error) {
	for _, f := range []*field{o.skin, o.sparXC, o.sparDia, o.ligament, o.material} {
		f.commit(true)
	}
	s, err := parseOutlineSettings(o.skin.inUse, o.sparXC.inUse, o.sparDia.inUse, o.ligament.inUse, o.material.inUse)
	s.chordLine, s.placed, s.sparOnChord = o.chord.Checked, o.placed.Selected == "the assembly as placed", o.onChord.Checked
	return s, err
}

// outlineNumber reads one number of the outline dialog, empty as 0; an
// error names the field and the range.
func outlineNumber(field, text string, lo, hi float64) (float64, error) {
	text = strings.TrimSpace(text)
	if text == "" {
		return 0, nil
	}
	v, err := strconv.ParseFloat(strings.ReplaceAll(text, ",", "."), 64)
	if err != nil || !(v >= lo && v <= hi) {
		return 0, fmt.Errorf("%s: %q is not a number from %g to %g", field, text, lo, hi)
	}
	return v, nil
}

// parseOutlineSettings reads the outline dialog's fields; an error names
// the field.
func parseOutlineSettings(skin, sparXC, sparDia, ligament, material string) (outlineSettings, error) {
	s := outlineSettings{minLigamentMM: geometry.DefaultMinLigamentMM}
	var err error
	if s.skinMM, err = outlineNumber("skin thickness", skin, 0, model.MaxSkinMM); err != nil {
		return s, err
	}
	if s.sparXC, err = outlineNumber("spar hole position", sparXC, 0, 1); err != nil {
		return s, err
	}
	if s.sparDiaMM, err = outlineNumber("spar hole diameter", sparDia, 0, model.MaxHoleMM); err != nil {
		return s, err
	}
	if strings.TrimSpace(ligament) != "" {
		if s.minLigamentMM, err = outlineNumber("minimum ligament", ligament, 0, 100); err != nil {
			return s, err
		}
	}
	if s.materialMM, err = outlineNumber("sheet thickness", material, 0, 100); err != nil {
		return s, err
	}
	if (s.sparXC > 0) != (s.sparDiaMM > 0) {
		return s, errors.New("spar hole: give both its position and its diameter, or neither")
	}
	return s, nil
}

// writeOutline returns the writer of the outline as DXF and SVG.
func (w *Workbench) writeOutline(s outlineSettings) exportJob {
	st, secs := w.ctl.Study(), slices.Clone(w.ctl.Sections())
	base, version := w.exportBase(), w.app.Metadata().Version
	return func(dir string) ([]string, error) {
		if len(secs) != len(st.Elements) {
			return nil, errNoResult
		}
		l, err := model.Place(st, secs)
		if err != nil {
			return nil, err
		}
		opt := geometry.OutlineOptions{Placed: s.placed, SkinMM: s.skinMM, ChordLine: s.chordLine, MinLigamentMM: s.minLigamentMM,
			Title: geometry.TitleBlock{Team: st.Team, MaterialMM: s.materialMM, Version: version, Date: time.Now().UTC().Format("2006-01-02"), AlphaDeg: st.Flow.AlphaDeg, Solved: true}}
		if s.sparDiaMM > 0 {
			for i := range st.Elements {
				opt.Marks = append(opt.Marks, geometry.Mark{Element: i, Label: "spar", XC: s.sparXC, DiameterMM: s.sparDiaMM, OnMeanLine: !s.sparOnChord})
			}
		}
		o, err := geometry.NewOutline(st.Name, l, opt)
		if err != nil {
			return nil, err
		}
		var files []string
		for _, f := range []struct {
			ext   string
			write func(io.Writer, *geometry.Outline) error
		}{{".dxf", format.WriteDXF}, {".svg", format.WriteSVG}} {
			name := base + "-outline" + f.ext
			write := f.write
			if err := export.WriteFileAtomic(filepath.Join(dir, name), func(out io.Writer) error { return write(out, o) }); err != nil {
				return files, err
			}
			files = append(files, name)
		}
		return files, nil
	}
}

// writeBoundaryLayer gathers the current solution (UI goroutine); the job
// writes its boundary-layer quantities: the coupled viscous solution's
// stations when it is on, the one-way estimate's otherwise.
func (w *Workbench) writeBoundaryLayer() exportJob {
	res, _, _ := w.ctl.Result()
	meta := tableMetadata(w.ctl.Study(), res, w.app.Metadata().Version)
	name := w.exportBase() + "-boundary-layer.csv"
	return func(dir string) ([]string, error) {
		if res == nil {
			return nil, errNoResult
		}
		write := func(out io.Writer) error { return format.WriteBoundaryLayerTable(out, meta, res.Viscous) }
		switch c := res.Coupled; {
		case c != nil && (!c.Converged || c.Detail == nil):
			return nil, errors.New("no boundary layer to export: the viscous solution did not converge at this angle of attack")
		case c != nil:
			write = func(out io.Writer) error { return format.WriteCoupledBoundaryLayerTable(out, meta, c.Detail) }
		case res.Viscous == nil:
			return nil, errors.New("no boundary layer to export: turn on the viscous solution in the Flow tab")
		}
		return []string{name}, export.WriteFileAtomic(filepath.Join(dir, name), write)
	}
}

// fileStem makes an element name safe in a file name.
func fileStem(name string) string {
	s := strings.Map(func(r rune) rune {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_':
			return r
		}
		return '-'
	}, strings.TrimSpace(name))
	if strings.Trim(s, "-") == "" {
		return "element"
	}
	return s
}
