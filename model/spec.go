package model

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"strings"
)

// Section spec prefixes, as on the command line and in study files.
const (
	SpecNACA = "naca:"
	SpecKT   = "kt:"
)

// ktPoints is the number of contour points a Kármán–Trefftz spec generates:
// dense enough that repanelling at up to MaxPanels follows the exact shape
// closely, since Repanel fits a spline through them.
const ktPoints = 801

// ErrSpec reports a section spec that names no known source.
var ErrSpec = errors.New("unknown section spec")

// SectionFromSpec returns the cleaned unit-chord section a spec names:
// "naca:DIGITS" (4 or 5 digits), "kt:CX,CY,TAU" (the Kármán–Trefftz family:
// circle centre and trailing-edge angle in degrees), or otherwise a
// coordinate-file path, which load reads. The designation as people write
// it, "NACA 0012", "naca0012" or "NACA-23012", names the NACA section too,
// unless a file of that name exists. Generated sections get a report
// saying so; files get the full cleaning report.
func SectionFromSpec(spec string, load func(path string) ([]byte, error)) (*Section, *CleanReport, error) {
	s := strings.TrimSpace(spec)
	switch low := strings.ToLower(s); {
	case strings.HasPrefix(low, SpecNACA):
		return nacaFromSpec(spec, s[len(SpecNACA):])
	case nacaDesignation(low) != "":
		if load != nil {
			b, err := load(s)
			if err == nil {
				return SectionFromFile(b, s)
			}
			if !errors.Is(err, fs.ErrNotExist) {
				return nil, nil, err
			}
		}
		return nacaFromSpec(spec, nacaDesignation(low))
	case strings.HasPrefix(low, SpecKT):
		kt, err := ParseKT(s[len(SpecKT):])
		if err != nil {
			return nil, nil, err
		}
		sec, err := kt.Section(ktPoints)
		if err != nil {
			return nil, nil, err
		}
		return sec, &CleanReport{Source: spec, Detected: []string{"generated from the Kármán–Trefftz conformal map: " + sec.Name()}, InputPoints: sec.Len(), OutputPoints: sec.Len()}, nil
	case s == "":
		return nil, nil, fmt.Errorf("empty section spec: %w", ErrSpec)
	}
	if load == nil {
		return nil, nil, fmt.Errorf("%q is neither naca:DIGITS nor kt:CX,CY,TAU: %w", spec, ErrSpec)
	}
	b, err := load(s)
	if err != nil {
		return nil, nil, err
	}
	return SectionFromFile(b, s)
}

// nacaFromSpec generates the NACA section of code for spec.
func nacaFromSpec(spec, code string) (*Section, *CleanReport, error) {
	sec, err := NACA(code, NACAOptions{})
	if err != nil {
		return nil, nil, err
	}
	return sec, &CleanReport{Source: spec, Detected: []string{"generated from the published NACA formulas: " + sec.Name()}, InputPoints: sec.Len(), OutputPoints: sec.Len()}, nil
}

// nacaDesignation returns the digits of a lower-case NACA designation
// written without the spec prefix, "naca 0012", "naca0012" or
// "naca-23012" (four or five digits), and "" for anything else.
func nacaDesignation(low string) string {
	rest, ok := strings.CutPrefix(low, "naca")
	if !ok {
		return ""
	}
	rest = strings.TrimLeft(rest, " -_")
	if len(rest) != 4 && len(rest) != 5 {
		return ""
	}
	for _, r := range rest {
		if r < '0' || r > '9' {
			return ""
		}
	}
	return rest
}

// SectionFromFile parses and cleans a coordinate file's content; source
// names it in messages.
func SectionFromFile(b []byte, source string) (*Section, *CleanReport, error) {
	p, err := ParseCoordinates(bytes.NewReader(b), source)
	if err != nil {
		return nil, nil, err
	}
	sec, rep, err := p.Clean(DefaultCleanOptions)
	if err != nil {
		return nil, nil, fmt.Errorf("%s: %w", source, err)
	}
	return sec, rep, nil
}

// SectionFromSource resolves a study element's section source: a spec, or
// embedded coordinates (cleaned again, which changes nothing for a section
// that was saved clean).
func SectionFromSource(src SectionSource, load func(path string) ([]byte, error)) (*Section, *CleanReport, error) {
	if em := src.Embedded; em != nil {
		pts := make([]Point, len(em.Points))
		for i, p := range em.Points {
			pts[i] = Point{p[0], p[1]}
		}
		sec, rep, err := Clean(em.Name, pts, DefaultCleanOptions)
		if err != nil {
			return nil, nil, err
		}
		rep.Source = "embedded in the study"
		return sec, rep, nil
	}
	return SectionFromSpec(src.Spec, load)
}
