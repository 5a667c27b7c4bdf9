package format

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strings"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// Metadata heads every CSV the package writes with comment lines, "# key:
// value", so that a file read months later still says what it holds: the
// study, the element, the angle of attack and Reynolds number, the units
// and which chord x/c is measured along. CSV readers skip them when told
// that "#" starts a comment.
type Metadata struct {
	Study    string
	Element  string  // the element the rows belong to; "" when an element column names it
	AlphaDeg float64 // NaN when the rows span several angles
	Reynolds float64 // 0 when not known
	Program  string  // program and version
	// ClearanceOverChord is the ground clearance over the main element's
	// chord, which the sweep tables' flags need; 0 in free air or when
	// not known.
	ClearanceOverChord float64
	// Extra lines, each "key: value", after the standard ones.
	Extra []string
}

// NoAngle marks Metadata.AlphaDeg of a table that spans several angles.
var NoAngle = math.NaN()

// write writes the comment lines: the given fields, then units and the
// columns' meaning (what) for this table.
func (m Metadata) write(w io.Writer, units, chord string) error {
	bw := bufio.NewWriter(w)
	line := func(k, v string) {
		if v != "" {
			fmt.Fprintf(bw, "# %s: %s\n", k, oneLine(v))
		}
	}
	line("study", m.Study)
	line("element", m.Element)
	if !math.IsNaN(m.AlphaDeg) {
		line("angle of attack", fmt.Sprintf("%g deg", m.AlphaDeg))
	}
	if m.Reynolds > 0 {
		line("reynolds number", fmt.Sprintf("%.4g on the element's own chord", m.Reynolds))
	}
	line("units", units)
	line("x/c", chord)
	for _, e := range m.Extra {
		fmt.Fprintf(bw, "# %s\n", oneLine(e))
	}
	line("program", m.Program)
	return bw.Flush()
}

// oneLine keeps a value on its comment line.
func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

// StudyMetadata is the metadata of a table of study st solved as res: the
// study's name, the angle of attack, the main element's Reynolds number
// and how it was set, the ground clearance over chord, and the program.
func StudyMetadata(st *model.Study, res *engine.Result, program string) Metadata {
	m := Metadata{Study: st.Name, AlphaDeg: st.Flow.AlphaDeg, Program: program}
	if res != nil && res.Solution != nil {
		m.AlphaDeg = res.Solution.AlphaDeg
	}
	if res != nil {
		if hc := res.Layout.HOverC(); hc > 0 {
			m.ClearanceOverChord = hc
		}
	}
	if res != nil && len(res.Reynolds) > 0 {
		m.Reynolds = res.Reynolds[0]
		if st.Flow.Reynolds > 0 {
			m.Extra = append(m.Extra, "reynolds number set directly in the study, not from speed and air")
		}
	}
	return m
}
