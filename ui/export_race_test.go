package ui

import (
	"fmt"
	"strings"
	"testing"

	"sectionbench/model"
)

// TestExportWhileEditing runs each File ▸ Export job off the test's
// goroutine, as exportTo does, while the study is edited on it: its name
// (the file stem), an element's name, the section source, the panelling
// and the angle. Under go test -race this shows that a job reads only what
// was gathered for it; without -race it checks that every job still
// finishes with what it gathered.
func TestExportWhileEditing(t *testing.T) {
	w := newTestBench(t)
	if err := w.ctl.SetViscous("viscous", model.Viscous{Enabled: true}); err != nil {
		t.Fatal(err)
	}
	if err := w.ctl.SetReynolds("reynolds", 3e5); err != nil {
		t.Fatal(err)
	}
	w.WaitIdle()
	for _, c := range []struct {
		name string
		job  func() exportJob
	}{
		{"Cp table", w.writeCpTable},
		{"sweep table", w.writeSweepTable},
		{"coordinates", w.writeCoordinates},
		{"boundary layer", w.writeBoundaryLayer},
		{"figures", func() exportJob { return w.writeFigures("svg") }},
		{"report", w.writeReport},
		{"outline", func() exportJob { return w.writeOutline(outlineSettings{skinMM: 1}) }},
	} {
		t.Run(c.name, func(t *testing.T) {
			// The previous case's edits made the sweep stale.
			if err := w.ctl.RunSweep(nil, nil); err != nil {
				t.Fatal(err)
			}
			w.WaitIdle()
			if len(w.ctl.Sweep()) == 0 {
				t.Fatal("no sweep to export")
			}
			job := c.job() // gathered here, on the editing goroutine
			base := w.exportBase()
			dir := t.TempDir()
			type outcome struct {
				files []string
				err   error
			}
			done := make(chan outcome)
			start := make(chan struct{})
			go func() {
				<-start
				files, err := job(dir)
				done <- outcome{files, err}
			}()
			started := false
			// Edits go on until the job is done. The race detector alone
			// can miss a job that reads the controller: file I/O on both
			// goroutines orders them for it. So the files are also checked
			// to carry the study's name as gathered, not as edited.
			for i := 0; ; i++ {
				select {
				case o := <-done:
					if o.err != nil || len(o.files) == 0 {
						t.Fatalf("wrote %v: %v", o.files, o.err)
					}
					for _, f := range o.files {
						if !strings.HasPrefix(f, base+"-") {
							t.Errorf("wrote %s: not named after the study as gathered (%s)", f, base)
						}
					}
					return
				default:
				}
				if err := w.ctl.SetElementName("name", 0, fmt.Sprintf("main %d", i)); err != nil {
					t.Fatal(err)
				}
				if err := w.ctl.SetNACA([]string{"2412", "4412"}[i%2]); err != nil {
					t.Fatal(err)
				}
				if err := w.ctl.SetAlpha("alpha", float64(i%8)); err != nil {
					t.Fatal(err)
				}
				if err := w.ctl.Edit("name", func(s *model.Study) { s.Name = fmt.Sprintf("edited %d", i) }); err != nil {
					t.Fatal(err)
				}
				if !started {
					started = true
					close(start)
				}
			}
		})
		w.WaitIdle()
	}
}
