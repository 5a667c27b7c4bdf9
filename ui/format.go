package ui

import (
	"strconv"
	"strings"

	"sectionbench/model"
	"sectionbench/ui/session"
)

// fixed formats x with prec decimals and a true minus sign.
func fixed(x float64, prec int) string {
	s := strconv.FormatFloat(x, 'f', prec, 64)
	if s == "-"+strconv.FormatFloat(0, 'f', prec, 64) {
		s = s[1:]
	}
	return model.Minus(s)
}

// parseNumber reads a number typed by the user, accepting a true minus
// sign and a decimal comma.
func parseNumber(s string) (float64, error) {
	s = strings.TrimSpace(s)
	s = strings.ReplaceAll(s, "−", "-")
	s = strings.ReplaceAll(s, ",", ".")
	return strconv.ParseFloat(s, 64)
}

// num formats a setting compactly (session.Number, as the pin labels do).
func num(x float64) string { return session.Number(x) }

// shortSource names a section source in a short form (session.SourceName).
func shortSource(src model.SectionSource) string { return session.SourceName(src) }
