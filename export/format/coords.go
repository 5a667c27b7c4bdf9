package format

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"sectionbench/model"
)

// Default decimals of coordinate files: a millionth of the chord in unit
// coordinates (finer than any section is made), a thousandth of a
// millimetre at real chord (finer than any cutter).
const (
	DefaultUnitDecimals = 6
	DefaultMMDecimals   = 3
)

// CoordOptions say how to write a section's coordinates.
type CoordOptions struct {
	// ChordMM scales the section to a real chord in millimetres; 0 writes
	// unit-chord coordinates.
	ChordMM float64
	// Panelling, when set, repanels the section first (model.Repanel):
	// Panelling.Panels panels, so Panels + 1 points for a closed trailing
	// edge, placed by its spacing law.
	Panelling *model.Panelling
	// Decimals after the point; 0 means DefaultUnitDecimals or
	// DefaultMMDecimals.
	Decimals int
	// Element and Study name where the section comes from, written in the
	// name line and the CSV metadata; empty for a section on its own.
	Element, Study string
	// Program names the program and its version in the CSV metadata.
	Program string
}

func (o CoordOptions) validate() error {
	if o.ChordMM < 0 || math.IsNaN(o.ChordMM) || math.IsInf(o.ChordMM, 0) {
		return &model.FieldError{Field: "coords.chord_mm", Err: fmt.Errorf("%g is not a positive length", o.ChordMM)}
	}
	if o.Decimals < 0 || o.Decimals > 12 {
		return &model.FieldError{Field: "coords.decimals", Err: fmt.Errorf("%d is outside 0..12", o.Decimals)}
	}
	if o.Panelling != nil {
		if err := o.Panelling.Validate(); err != nil {
			return err
		}
	}
	return nil
}

func (o CoordOptions) decimals() int {
	switch {
	case o.Decimals > 0:
		return o.Decimals
	case o.ChordMM > 0:
		return DefaultMMDecimals
	}
	return DefaultUnitDecimals
}

// coordPoints returns the section's points, repanelled and scaled as o
// says, in the package order: trailing edge, upper surface, leading edge,
// lower surface, trailing edge.
func coordPoints(sec *model.Section, o CoordOptions) ([]model.Point, error) {
	if sec == nil {
		panic("format: nil section")
	}
	if err := o.validate(); err != nil {
		return nil, err
	}
	if o.Panelling != nil {
		r, err := model.Repanel(sec, *o.Panelling)
		if err != nil {
			return nil, err
		}
		sec = r
	}
	pts := sec.Points()
	if o.ChordMM > 0 {
		for i := range pts {
			pts[i] = pts[i].Scale(o.ChordMM)
		}
	}
	return pts, nil
}

// coordName is the name line: the section's name, with the chord when the
// coordinates are in millimetres.
func coordName(sec *model.Section, o CoordOptions) string {
	name, about := splitNameNote(oneLine(sec.Name()))
	if name == "" {
		name = "section"
	}
	if o.Element != "" && !slices.Contains(about, "element "+oneLine(o.Element)) {
		about = append(about, "element "+oneLine(o.Element))
	}
	if o.ChordMM > 0 {
		about = append(about, fmt.Sprintf("chord %s mm, coordinates in mm", strconv.FormatFloat(o.ChordMM, 'f', -1, 64)))
	}
	if len(about) > 0 {
		name += " (" + strings.Join(about, ", ") + ")"
	}
	return name
}

// splitNameNote splits a name line this package wrote, "NAME (element E,
// chord C mm, coordinates in mm)", into the name and the notes that still
// hold whatever the coordinates' scale: the chord and units are dropped,
// so that a file read back and written at another scale (a cleaned mm
// file is at unit chord) never states the old units.
func splitNameNote(line string) (string, []string) {
	if !strings.HasSuffix(line, ")") {
		return line, nil
	}
	open := strings.LastIndex(line, " (")
	if open < 0 {
		return line, nil
	}
	var keep []string
	ours := false
	for _, part := range strings.Split(line[open+2:len(line)-1], ", ") {
		switch {
		case strings.HasPrefix(part, "chord ") && strings.HasSuffix(part, " mm"), part == "coordinates in mm":
			ours = true
		default:
			keep = append(keep, part)
		}
	}
	if !ours && !(len(keep) == 1 && strings.HasPrefix(keep[0], "element ")) {
		return line, nil // someone else's parentheses
	}
	return line[:open], keep
}

// formatCoord formats v with dec decimals and no negative zero.
func formatCoord(v float64, dec int) string {
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(s, "-0.") == "" {
		return strings.TrimPrefix(s, "-")
	}
	return s
}

// WriteCoordinates writes a cleaned section as plain text: a name line,
// then one "x y" pair per line, one loop from the trailing edge over the
// upper surface to the leading edge and back along the lower surface (the
// project's order), in unit chord or in millimetres. It returns a
// *model.FieldError for bad options and Repanel's errors.
func WriteCoordinates(w io.Writer, sec *model.Section, o CoordOptions) error {
	pts, err := coordPoints(sec, o)
	if err != nil {
		return err
	}
	dec := o.decimals()
	// Right-align the columns: width of the widest formatted number.
	wd := 0
	for _, p := range pts {
		wd = max(wd, len(formatCoord(p.X, dec)), len(formatCoord(p.Y, dec)))
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintln(bw, coordName(sec, o))
	for _, p := range pts {
		fmt.Fprintf(bw, "%*s %*s\n", wd, formatCoord(p.X, dec), wd, formatCoord(p.Y, dec))
	}
	return bw.Flush()
}

// WriteCoordinatesCSV writes the same points as CSV: metadata comment
// lines (section, element, study, units, chord), then a header row, "x,y"
// in unit chord or "x_mm,y_mm" at real chord.
func WriteCoordinatesCSV(w io.Writer, sec *model.Section, o CoordOptions) error {
	pts, err := coordPoints(sec, o)
	if err != nil {
		return err
	}
	units := "fractions of the chord (unit chord)"
	if o.ChordMM > 0 {
		units = fmt.Sprintf("millimetres at a chord of %s mm", strconv.FormatFloat(o.ChordMM, 'f', -1, 64))
	}
	m := Metadata{Study: o.Study, Element: o.Element, AlphaDeg: NoAngle, Program: o.Program,
		Extra: []string{"section: " + sec.Name(), "order: trailing edge, upper surface, leading edge, lower surface, trailing edge"}}
	if err := m.write(w, units, "x runs along the element's own chord from its leading edge at (0, 0)"); err != nil {
		return err
	}
	dec := o.decimals()
	cw := csv.NewWriter(w)
	head := []string{"x", "y"}
	if o.ChordMM > 0 {
		head = []string{"x_mm", "y_mm"}
	}
	if err := cw.Write(head); err != nil {
		return err
	}
	for _, p := range pts {
		if err := cw.Write([]string{formatCoord(p.X, dec), formatCoord(p.Y, dec)}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
