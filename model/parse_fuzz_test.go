package model

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

// FuzzParseCoordinates checks that parsing and cleaning never panic, that
// every parse error is a *ParseError, every cleaning error a *ContourError
// (or *FieldError), and that every section that comes out has finite
// points, at least MinSectionPoints of them, starts and ends on the
// trailing edge with the leading edge at the origin. The seed corpus is in
// testdata/fuzz/FuzzParseCoordinates.
func FuzzParseCoordinates(f *testing.F) {
	// Small seeds keep minimisation quick; the layouts are in the corpus.
	f.Add([]byte("1 0\n0.5 0.1\n0 0\n0.5 -0.1\n1 0\n"))
	f.Add([]byte("x,y\n0,0\n0.5,0.1\n1,0\n0,0\n0.5,-0.1\n1,0\n"))
	// The small files of the malformed corpus.
	for _, data := range malformedCorpus() {
		if len(data) <= 512 {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := ParseCoordinates(bytes.NewReader(data), "fuzz.dat")
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("parse error %T is not a *ParseError: %v", err, err)
			}
			return
		}
		if len(p.Points) < MinSectionPoints || len(p.Notes) == 0 {
			t.Fatalf("parsed %d points with notes %q", len(p.Points), p.Notes)
		}
		for _, opt := range []CleanOptions{DefaultCleanOptions, {CloseTE: true}} {
			sec, rep, err := p.Clean(opt)
			if rep == nil {
				t.Fatal("no report")
			}
			if err != nil {
				var ce *ContourError
				var fe *FieldError
				if !errors.As(err, &ce) && !errors.As(err, &fe) {
					t.Fatalf("clean error %T is not typed: %v", err, err)
				}
				continue
			}
			if sec.Len() < MinSectionPoints || rep.OutputPoints != sec.Len() {
				t.Fatalf("%d points, report says %d", sec.Len(), rep.OutputPoints)
			}
			for i := range sec.Len() {
				if !sec.At(i).IsFinite() {
					t.Fatalf("point %d is %v", i, sec.At(i))
				}
			}
			checkLeadingEdge(t, sec, rep)
			_ = rep.String()
		}
	})
}

// checkLeadingEdge checks that a cleaned section lists the origin and that
// its farthest point from the trailing edge is the origin or, when the
// file's own chord was kept, that the spline's leading edge lies within
// FileChordTol of it (the rule Clean applies; on a sparse contour the
// farthest listed point may stand farther off than the spline's).
func checkLeadingEdge(t *testing.T, sec *Section, rep *CleanReport) {
	t.Helper()
	origin := false
	for i := range sec.Len() {
		origin = origin || sec.At(i).Norm() <= 1e-12
	}
	far := sec.At(sec.LeadingEdgeIndex()).Norm()
	own := strings.Contains(strings.Join(rep.Detected, "\n"), "the file's own chord line is kept")
	if own {
		if sp, err := NewContourSpline(sec.Points()); err == nil {
			_, le := sp.LeadingEdge()
			far = le.Norm()
		}
	}
	if !origin || far > 1e-9 && !(own && far <= FileChordTol*1.01) {
		t.Fatalf("origin listed %v, farthest point %g from it\n%s", origin, far, rep)
	}
}
