package report

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"codeberg.org/go-fonts/liberation/liberationmonoregular"
	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansitalic"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-pdf/fpdf"

	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// FigureDPI is the resolution figures are rendered at: print quality.
const FigureDPI = 300

// Page sizes Write accepts.
const (
	PageA4     = "A4"
	PageLetter = "Letter"
)

// Input is everything a report shows.
type Input struct {
	Study  *model.Study
	Result *engine.Result // at the study's angle of attack, with sweep, streamlines and boundary layer as run
	// Density is a density study to report; nil leaves its page out.
	Density *engine.DensityResult
	// FileName is the study file's name, printed in every page's footer.
	FileName string
	// AppVersion is printed in the title block and the footer.
	AppVersion string
	// PageSize is PageA4 (the default when empty) or PageLetter.
	PageSize string
	// Author names who prepared the report; empty means the study's team.
	Author string
	// Date is the report's date; the zero value means now.
	Date time.Time
	// Sections are the elements' cleaned sections, parallel to
	// Study.Elements; nil leaves out the gaps and geometry descriptors.
	Sections []*model.Section
	// CleanReports are the cleaning reports of the sections, parallel to
	// Study.Elements (nil for a generated section); their warnings and
	// changes are reported.
	CleanReports []*model.CleanReport
	// Inputs are the files read to make the report, each with its SHA-256.
	Inputs []InputFile
	// CommandLine is the command that made the report, when run from the
	// command line.
	CommandLine string
	// Coupled is the coupled viscous solution's answer; nil until it runs.
	Coupled *Coupled
	// ViscousDensity is the density study of the drag and transition
	// (ViscousDensity); nil leaves it out.
	ViscousDensity []ViscousDensityRow
	// Setup is the set-up explorer's page (maps, best setting, finite
	// span); nil leaves it out.
	Setup *Setup
}

// InputFile is a file the report was made from and its SHA-256, in hex.
type InputFile struct {
	Path, SHA256 string
}

// ErrInput is wrapped by Write's errors for input it cannot report.
var ErrInput = errors.New("report: incomplete input")

// Layout of the page, in millimetres.
const (
	marginMM          = 18
	footerMM          = 12  // space kept for the footer
	figureHMM         = 95  // height of a full-width figure
	rowHMM            = 5.2 // table row height
	bodyPt            = 9.5
	tablePt           = 8.5
	headingPt         = 12.5
	titlePt           = 19
	minSpaceMM        = 40 // a heading needs this much space below it on the page
	maxUnsplitMM      = 90 // tables shorter than this are not split across pages
	fontFamily        = "sans"
	monoFamily        = "mono"
	cautionText       = "These are two-dimensional estimates: a panel method for the flow, with boundary layers and wakes coupled to it (or a one-way boundary-layer estimate) where shown. They do not include three-dimensional effects (finite span, end plates, wheels and body), leading-edge stall, large separated regions, unsteady flow or a moving ground; the viscous lift runs above wind-tunnel data, by up to 0.13 in Cl (4–32 %, the most at small lift and on sections with laminar bubbles). Validate by test before relying on them. Structural design, mounting and the wing's attachment to the car follow the competition's rules and qualified engineering review."
	caveatCirculation = "With the ground or other elements present, the circulation lift of an element is its vortex force: its vortex sheet in the velocity induced by the other elements and the ground's images (Lagally's theorem), not 2Γ/(Uc) alone. It and the lift from surface pressure agree to the discretisation error."
)

// Write writes the report of in as a PDF to w. It returns an error
// wrapping ErrInput when the study or its solution is missing, and the
// errors of drawing the figures or writing the PDF.
func Write(w io.Writer, in Input) error {
	if in.Study == nil || in.Result == nil || in.Result.Solution == nil || in.Result.Layout == nil {
		return fmt.Errorf("%w: a study with its solution and layout is needed", ErrInput)
	}
	size := in.PageSize
	switch strings.ToLower(size) {
	case "", "a4":
		size = PageA4
	case "letter":
		size = PageLetter
	default:
		return fmt.Errorf("%w: page size %q (want A4 or Letter)", ErrInput, in.PageSize)
	}
	if in.Date.IsZero() {
		in.Date = time.Now()
	}
	if in.Author == "" {
		in.Author = in.Study.Team
	}
	if in.Coupled == nil {
		in.Coupled = CoupledFrom(in.Study, in.Result)
	}
	in, glyphNote := printable(in)
	r := &writer{in: in, pdf: fpdf.New("P", "mm", size, ""), glyphNote: glyphNote}
	r.setup()
	r.summaryPage()
	r.inputsSection()
	r.resultsSection()
	r.warningsSection()
	r.figurePages()
	r.sweepPage()
	r.setupPage()
	r.viscousPage()
	r.densityPage()
	r.methodsPage()
	r.appendix()
	if err := r.err(); err != nil {
		return err
	}
	return r.pdf.Output(w)
}

// writer builds one report.
type writer struct {
	in        Input
	glyphNote string // characters the font cannot draw, replaced (printable)
	pdf       *fpdf.Fpdf
	figErr    error
	figN      int
}

func (r *writer) err() error {
	if r.figErr != nil {
		return r.figErr
	}
	return r.pdf.Error()
}

func (r *writer) setup() {
	p := r.pdf
	p.AddUTF8FontFromBytes(fontFamily, "", liberationsansregular.TTF)
	p.AddUTF8FontFromBytes(fontFamily, "B", liberationsansbold.TTF)
	p.AddUTF8FontFromBytes(fontFamily, "I", liberationsansitalic.TTF)
	p.AddUTF8FontFromBytes(monoFamily, "", liberationmonoregular.TTF)
	p.SetMargins(marginMM, marginMM, marginMM)
	p.SetAutoPageBreak(true, marginMM+footerMM)
	p.AliasNbPages("{nb}")
	p.SetTitle(r.in.Study.Name+": section study report", true)
	p.SetAuthor(r.in.Author, true)
	p.SetCreator("Sectionbench "+r.in.AppVersion, true)
	p.SetSubject("Two-dimensional wing-section study", true)
	p.SetCreationDate(r.in.Date)
	p.SetModificationDate(r.in.Date)
	p.SetFooterFunc(func() {
		_, ph := p.GetPageSize()
		y := ph - marginMM - footerMM/2
		p.SetDrawColor(160, 166, 173)
		p.SetLineWidth(0.2)
		p.Line(marginMM, y, r.width()+marginMM, y)
		p.SetY(y + 1.5)
		p.SetFont(fontFamily, "", 7.5)
		p.SetTextColor(90, 96, 104)
		name := r.in.FileName
		if name == "" {
			name = "(study not saved)"
		}
		third := r.width() / 3
		p.CellFormat(third, 4, name, "", 0, "L", false, 0, "")
		p.CellFormat(third, 4, "Sectionbench "+r.in.AppVersion, "", 0, "C", false, 0, "")
		p.CellFormat(third, 4, fmt.Sprintf("Page %d of {nb}", p.PageNo()), "", 0, "R", false, 0, "")
		p.SetTextColor(0, 0, 0)
	})
}

// width is the text width of the page.
func (r *writer) width() float64 {
	w, _ := r.pdf.GetPageSize()
	return w - 2*marginMM
}

// space is what is left above the footer on the current page.
func (r *writer) space() float64 {
	_, h := r.pdf.GetPageSize()
	return h - marginMM - footerMM - r.pdf.GetY()
}

// pageBody is the height a page offers between its margins and footer.
func (r *writer) pageBody() float64 {
	_, h := r.pdf.GetPageSize()
	return h - 2*marginMM - footerMM
}

func (r *writer) need(mm float64) {
	if r.space() < mm {
		r.pdf.AddPage()
	}
}

func (r *writer) heading(s string) {
	r.need(minSpaceMM)
	p := r.pdf
	p.Ln(3)
	p.SetFont(fontFamily, "B", headingPt)
	p.CellFormat(0, 7, s, "", 1, "L", false, 0, "")
	p.SetDrawColor(29, 79, 145)
	p.SetLineWidth(0.4)
	y := p.GetY()
	p.Line(marginMM, y, marginMM+r.width(), y)
	p.Ln(2)
}

func (r *writer) subheading(s string) {
	r.need(20)
	p := r.pdf
	p.Ln(1)
	p.SetFont(fontFamily, "B", bodyPt+0.5)
	p.CellFormat(0, 5.5, s, "", 1, "L", false, 0, "")
}

func (r *writer) para(s string) {
	p := r.pdf
	p.SetFont(fontFamily, "", bodyPt)
	p.MultiCell(0, 4.6, s, "", "L", false)
	p.Ln(1)
}

// table writes a table with a shaded header row; align is one of "L", "R",
// "C" per column. It breaks across pages, repeating the header.
func (r *writer) table(head []string, widths []float64, align []string, rows [][]string) {
	p := r.pdf
	total := 0.0
	for _, w := range widths {
		total += w
	}
	scale := r.width() / total
	header := func() {
		// Header cells wrap onto as many lines as the longest needs.
		p.SetFont(fontFamily, "B", tablePt)
		p.SetFillColor(228, 232, 237)
		p.SetDrawColor(190, 196, 204)
		p.SetLineWidth(0.2)
		lines := make([][]string, len(head))
		n := 1
		for i, h := range head {
			lines[i] = p.SplitText(h, widths[i]*scale-2)
			n = max(n, len(lines[i]))
		}
		const lineH = 3.8
		hh := float64(n)*lineH + 1.4
		x, y := float64(marginMM), p.GetY()
		for i := range head {
			w := widths[i] * scale
			p.Rect(x, y, w, hh, "FD")
			for k, l := range lines[i] {
				p.SetXY(x, y+0.7+float64(k)*lineH)
				p.CellFormat(w, lineH, l, "", 0, align[i], false, 0, "")
			}
			x += w
		}
		p.SetXY(marginMM, y+hh)
		p.SetFont(fontFamily, "", tablePt)
	}
	// A short table is kept on one page; a long one needs room for its
	// header and a few rows.
	r.need(tableHeight(len(rows)) + 2)
	header()
	for k, row := range rows {
		if r.space() < rowHMM {
			p.AddPage()
			header()
		}
		fill := k%2 == 1
		p.SetFillColor(246, 247, 249)
		for i, c := range row {
			w := widths[i] * scale
			p.CellFormat(w, rowHMM, r.fit(c, w-2*p.GetCellMargin()), "1", 0, align[i], fill, 0, "")
		}
		p.Ln(-1)
	}
	p.Ln(2)
}

// fit shortens s with an ellipsis to at most w millimetres in the current
// font, so that a long name never runs into the next cell.
func (r *writer) fit(s string, w float64) string {
	p := r.pdf
	if p.GetStringWidth(s) <= w {
		return s
	}
	rs := []rune(s)
	for len(rs) > 0 && p.GetStringWidth(string(rs)+"…") > w {
		rs = rs[:len(rs)-1]
	}
	return string(rs) + "…"
}

// tableHeight is the space a table of n rows must find on a page before it
// starts: all of it when short (short tables are not split), else room
// for its header and a few rows.
func tableHeight(n int) float64 {
	if h := rowHMM * float64(n+1); h < maxUnsplitMM {
		return h
	}
	return 4 * rowHMM
}

// keyValues writes a two-column table of names and values; long values
// wrap within their cell.
func (r *writer) keyValues(rows [][2]string) {
	p := r.pdf
	w := r.width()
	wk, wv := w*0.36, w*0.64
	const lineH = 4.0
	p.SetFont(fontFamily, "", tablePt)
	p.SetDrawColor(190, 196, 204)
	p.SetLineWidth(0.2)
	cm := p.GetCellMargin()
	for k, kv := range rows {
		kl := p.SplitText(kv[0], wk-2*cm)
		vl := p.SplitText(kv[1], wv-2*cm)
		h := float64(max(len(kl), len(vl), 1))*lineH + 1.2
		r.need(h)
		x, y := float64(marginMM), p.GetY()
		if k%2 == 1 {
			p.SetFillColor(246, 247, 249)
			p.Rect(x, y, w, h, "F")
		}
		p.Rect(x, y, wk, h, "D")
		p.Rect(x+wk, y, wv, h, "D")
		for i, l := range kl {
			p.SetXY(x, y+0.6+float64(i)*lineH)
			p.CellFormat(wk, lineH, l, "", 0, "L", false, 0, "")
		}
		for i, l := range vl {
			p.SetXY(x+wk, y+0.6+float64(i)*lineH)
			p.CellFormat(wv, lineH, l, "", 0, "L", false, 0, "")
		}
		p.SetXY(x, y+h)
	}
	p.Ln(2)
}

// box writes text in a framed, tinted box.
func (r *writer) box(title, text string, tint [3]int) {
	p := r.pdf
	p.SetFont(fontFamily, "", bodyPt)
	lines := p.SplitText(text, r.width()-6)
	h := 7 + 4.6*float64(len(lines)) + 3
	r.need(h + 2)
	x, y := p.GetX(), p.GetY()
	p.SetFillColor(tint[0], tint[1], tint[2])
	p.SetDrawColor(tint[0]*2/3, tint[1]*2/3, tint[2]*2/3)
	p.SetLineWidth(0.4)
	p.Rect(x, y, r.width(), h, "FD")
	p.SetXY(x+3, y+2)
	p.SetFont(fontFamily, "B", bodyPt+0.5)
	p.CellFormat(r.width()-6, 5, title, "", 2, "L", false, 0, "")
	p.SetX(x + 3)
	p.SetFont(fontFamily, "", bodyPt)
	p.MultiCell(r.width()-6, 4.6, text, "", "L", false)
	p.SetXY(x, y+h+2)
}

// figure renders view v of sc and places it full width with a caption.
func (r *writer) figure(v figure.View, sc *figure.Scene, caption string, heightMM float64) {
	r.image(func(w io.Writer, win, hin float64) error {
		return figure.WriteFigure(w, v, sc, figure.FormatPNG, win, hin, FigureDPI)
	}, fmt.Sprint(v), caption, heightMM)
}

// image renders a figure with draw (width and height in inches) and
// places it full width with a caption; a figure with nothing to draw is
// left out.
func (r *writer) image(draw func(w io.Writer, widthIn, heightIn float64) error, what, caption string, heightMM float64) {
	if r.figErr != nil {
		return
	}
	const mmPerIn = 25.4
	wmm := r.width()
	var b bytes.Buffer
	if err := draw(&b, wmm/mmPerIn, heightMM/mmPerIn); err != nil {
		if errors.Is(err, figure.ErrNoData) {
			return
		}
		r.figErr = fmt.Errorf("report: figure %s: %w", what, err)
		return
	}
	r.need(heightMM + 10)
	p := r.pdf
	r.figN++
	name := fmt.Sprintf("figure-%d", r.figN)
	opt := fpdf.ImageOptions{ImageType: "PNG"}
	p.RegisterImageOptionsReader(name, opt, &b)
	p.ImageOptions(name, marginMM, p.GetY(), wmm, heightMM, false, opt, 0, "")
	p.SetY(p.GetY() + heightMM + 1)
	p.SetFont(fontFamily, "I", tablePt)
	p.MultiCell(0, 4, fmt.Sprintf("Figure %d. %s", r.figN, caption), "", "L", false)
	p.Ln(3)
}

// scene is the export scene of the report's result.
func (r *writer) scene() *figure.Scene {
	sc := figure.NewScene(r.in.Result, r.in.Study)
	sc.Density = r.in.Density
	return sc
}
