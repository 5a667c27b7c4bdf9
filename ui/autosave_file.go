package ui

// The autosave's file: its format, written and read in one piece, and
// the file an earlier version wrote.

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"

	"sectionbench/export"
	"sectionbench/model"
)

// autosaveFormat names the autosave file's format.
const autosaveFormat = "sectionbench-autosave"

// autosaveEnvelope is one autosave file: the study and the path of the
// study file it belongs to ("" for a study never saved), together, so one
// atomic write keeps them paired.
type autosaveEnvelope struct {
	Format    string          `json:"format"`
	StudyPath string          `json:"study_path"`
	Study     json.RawMessage `json:"study"`
}

// encodeAutosave returns the autosave file's content.
func encodeAutosave(study []byte, studyPath string) ([]byte, error) {
	return json.MarshalIndent(autosaveEnvelope{Format: autosaveFormat, StudyPath: studyPath, Study: study}, "", "  ")
}

// writeAutosave writes an autosave file atomically; wrap, if not nil,
// stands between the encoder and the file (tests make it fail midway).
func writeAutosave(path string, b []byte, wrap func(io.Writer) io.Writer) error {
	return export.WriteFileAtomic(path, func(w io.Writer) error {
		if wrap != nil {
			w = wrap(w)
		}
		_, err := w.Write(b)
		return err
	})
}

// readAutosave reads an autosave file: the study and the path it belongs
// to.
func readAutosave(path string) (*model.Study, string, error) {
	b, err := export.ReadRegular(path, 2*model.MaxStudyBytes)
	if err != nil {
		return nil, "", err
	}
	var env autosaveEnvelope
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&env); err != nil || env.Format != autosaveFormat {
		return nil, "", errors.New("not an autosave file")
	}
	st, err := model.DecodeStudy(env.Study)
	if err != nil {
		return nil, "", fmt.Errorf("the study inside: %w", err)
	}
	return st, env.StudyPath, nil
}

// readLegacyAutosave reads the two files an earlier version wrote: the
// study, and beside it a note with its path.
func readLegacyAutosave(studyFile, noteFile string) (*model.Study, string, error) {
	st, err := export.LoadStudy(studyFile)
	if err != nil {
		return nil, "", err
	}
	note, _ := export.ReadRegular(noteFile, 1<<16)
	return st, string(note), nil
}
