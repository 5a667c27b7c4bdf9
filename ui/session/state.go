package session

import (
	"path/filepath"
	"reflect"

	"sectionbench/export"
	"sectionbench/model"
)

// studyState is the study being edited, where it lives on disk, whether it
// has unsaved changes, and the cleaned sections of its elements (kept so
// that an edit that leaves the section sources alone does not reload them).
type studyState struct {
	study *model.Study
	path  string // "" until saved or opened
	dirty bool

	sources  []model.SectionSource // sources the cached sections came from
	sections []*model.Section
	reports  []*model.CleanReport
}

// baseDir is where relative section paths in the study are resolved.
func (s *studyState) baseDir() string {
	if s.path == "" {
		return "."
	}
	return filepath.Dir(s.path)
}

// sectionsFor returns the cleaned sections of st's elements, reusing the
// cache when the sources are those of the cached sections.
func (s *studyState) sectionsFor(st *model.Study) ([]*model.Section, []*model.CleanReport, error) {
	src := sourcesOf(st)
	if s.sections != nil && reflect.DeepEqual(src, s.sources) {
		return s.sections, s.reports, nil
	}
	return export.LoadSections(st, s.baseDir())
}

// set makes st the current study with its sections.
func (s *studyState) set(st *model.Study, secs []*model.Section, reps []*model.CleanReport) {
	s.study = st
	s.sources = sourcesOf(st)
	s.sections = secs
	s.reports = reps
}

func sourcesOf(st *model.Study) []model.SectionSource {
	src := make([]model.SectionSource, len(st.Elements))
	for i, e := range st.Elements {
		src[i] = e.Section
		if e.Section.Embedded != nil {
			c := *e.Section.Embedded
			src[i].Embedded = &c
		}
	}
	return src
}
