package export

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"

	"sectionbench/model"
)

// FileError reports a problem with a named file.
type FileError struct {
	Path string
	Err  error
}

func (e *FileError) Error() string { return e.Path + ": " + e.Err.Error() }

func (e *FileError) Unwrap() error { return e.Err }

// ErrFileTooLarge reports a file larger than its kind may be.
var ErrFileTooLarge = errors.New("file too large")

// readLimited reads at most limit bytes of a regular file and refuses
// larger files, and files that are not regular (a FIFO would hang the
// read), without reading them.
func readLimited(path string, limit int64) ([]byte, error) {
	f, err := OpenRegular(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	if fi, err := f.Stat(); err == nil && fi.Size() > limit {
		return nil, &FileError{Path: path, Err: fmt.Errorf("%w: %d bytes, at most %d", ErrFileTooLarge, fi.Size(), limit)}
	}
	b, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err != nil {
		return nil, &FileError{Path: path, Err: err}
	}
	if int64(len(b)) > limit {
		return nil, &FileError{Path: path, Err: fmt.Errorf("%w: more than %d bytes", ErrFileTooLarge, limit)}
	}
	return b, nil
}

// LoadStudy reads and validates a study file. Errors name the file and,
// where known, the field (*model.FieldError inside a *FileError).
func LoadStudy(path string) (*model.Study, error) {
	b, err := readLimited(path, model.MaxStudyBytes)
	if err != nil {
		return nil, err
	}
	st, err := model.DecodeStudy(b)
	if err != nil {
		return nil, &FileError{Path: path, Err: err}
	}
	return st, nil
}

// OpenedStudy is a study file opened for work: the study, validated, and
// its sections loaded and cleaned.
type OpenedStudy struct {
	Study    *model.Study
	Sections []*model.Section     // one per element, cleaned, unit chord
	Reports  []*model.CleanReport // what cleaning each section did
	Dir      string               // the file's folder: coordinate files in the study are relative to it
}

// OpenStudy reads, decodes and validates a study file and loads and cleans
// its sections: the one way the window and the command line open a study.
// A bad file is a *FileError naming it (with the *model.FieldError inside
// where a field is at fault); a section that cannot be loaded is the
// *model.FieldError of LoadSections.
func OpenStudy(path string) (*OpenedStudy, error) {
	st, err := LoadStudy(path)
	if err != nil {
		return nil, err
	}
	dir := filepath.Dir(path)
	secs, reps, err := LoadSections(st, dir)
	if err != nil {
		return nil, err
	}
	return &OpenedStudy{Study: st, Sections: secs, Reports: reps, Dir: dir}, nil
}

// SaveStudy writes the study atomically: the previous file stays intact if
// anything fails. Only a regular file (or a link to one) is written; a
// read-only file, a FIFO, a device or a folder at path is refused.
func SaveStudy(path string, st *model.Study) error {
	return SaveStudyThrough(path, st, nil)
}

// SaveStudyThrough is SaveStudy with a writer standing between the encoder
// and the file (nil: none); tests use it to fill the disk midway.
func SaveStudyThrough(path string, st *model.Study, wrap func(io.Writer) io.Writer) error {
	b, err := st.Encode()
	if err != nil {
		return err
	}
	return WriteRegularFile(path, func(w io.Writer) error {
		if wrap != nil {
			w = wrap(w)
		}
		_, err := w.Write(b)
		return err
	})
}

// SectionLoader returns a loader for model.SectionFromSpec that reads
// coordinate files relative to baseDir, refusing files over the parser's
// size limit without reading them.
func SectionLoader(baseDir string) func(string) ([]byte, error) {
	return func(p string) ([]byte, error) {
		if !filepath.IsAbs(p) && baseDir != "" {
			p = filepath.Join(baseDir, p)
		}
		return readLimited(p, model.MaxInputBytes)
	}
}

// LoadSections resolves every element's section source; coordinate-file
// paths are relative to baseDir (the study file's folder).
func LoadSections(st *model.Study, baseDir string) ([]*model.Section, []*model.CleanReport, error) {
	secs := make([]*model.Section, len(st.Elements))
	reps := make([]*model.CleanReport, len(st.Elements))
	for i, e := range st.Elements {
		sec, rep, err := model.SectionFromSource(e.Section, SectionLoader(baseDir))
		if err != nil {
			return nil, nil, &model.FieldError{Field: fmt.Sprintf("elements[%d].section", i), Err: err}
		}
		secs[i], reps[i] = sec, rep
	}
	return secs, reps, nil
}

// LoadSectionFile reads, parses and cleans one coordinate file.
func LoadSectionFile(path string) (*model.Section, *model.CleanReport, error) {
	b, err := readLimited(path, model.MaxInputBytes)
	if err != nil {
		return nil, nil, err
	}
	return model.SectionFromFile(b, path)
}
