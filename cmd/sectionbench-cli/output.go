package main

import (
	"io"
	"path/filepath"
	"strings"

	"sectionbench/export"
	"sectionbench/model"
)

// writeOutput writes a command's output to out: "-" is standard output
// for text (binary output there is refused as bad usage, it would garble
// a terminal); anything else goes through export.WriteOutput, which writes
// through devices and FIFOs, follows symbolic links, refuses read-only
// files and any of inputs. It reports whether a file was written (for the
// "wrote" line).
func writeOutput(out string, binary bool, stdout io.Writer, write func(io.Writer) error, inputs []string) (bool, error) {
	if out == "-" {
		if binary {
			return false, usagef("-o -: this output is binary; give a file name")
		}
		return false, write(stdout)
	}
	return true, export.WriteOutput(out, write, inputs...)
}

// files lists the files a command read for its study and sections: the
// study, a --section file, and the coordinate files the study's elements
// name (relative to the study's folder). Writing over any of them is
// refused.
func (in *inputs) files(st *model.Study) []string {
	var fs []string
	baseDir := "."
	if in.study != "" {
		fs = append(fs, in.study)
		baseDir = filepath.Dir(in.study)
	}
	if in.section != "" && isFileSpec(in.section) {
		fs = append(fs, in.section)
	}
	if st != nil && in.study != "" {
		for _, e := range st.Elements {
			if e.Section.Embedded == nil && isFileSpec(e.Section.Spec) {
				p := strings.TrimSpace(e.Section.Spec)
				if !filepath.IsAbs(p) {
					p = filepath.Join(baseDir, p)
				}
				fs = append(fs, p)
			}
		}
	}
	return fs
}

// isFileSpec reports whether a section spec names a coordinate file
// rather than a generated section.
func isFileSpec(spec string) bool {
	low := strings.ToLower(strings.TrimSpace(spec))
	return low != "" && !strings.HasPrefix(low, model.SpecNACA) && !strings.HasPrefix(low, model.SpecKT)
}
