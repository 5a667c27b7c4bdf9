//go:build unix

package main

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestOutputPaths: -o never replaces what is at the path with something
// else, never writes over the command's own inputs or a read-only file,
// and "-" is standard output where the format is text.
func TestOutputPaths(t *testing.T) {
	dir := t.TempDir()
	study := filepath.Join(dir, "s.json")
	code, _, stderr := runCLI(t, "export", "--section", "naca:0012", "--what", "coords", "-o", filepath.Join(dir, "sec.dat"))
	if code != exitOK {
		t.Fatal(stderr)
	}
	studyJSON := `{"format": "sectionbench-study", "version": 1, "name": "test", "elements": [{"name": "main", "section": "sec.dat", "chord_mm": 250}]}`
	must(t, os.WriteFile(study, []byte(studyJSON), 0o644))
	readOnly := filepath.Join(dir, "locked.pdf")
	must(t, os.WriteFile(readOnly, []byte("keep"), 0o444))
	for _, tc := range []struct {
		name     string
		args     []string
		code     int
		contains string // in stderr
		intact   string // a file that must keep its content
	}{
		{"report over its own study", []string{"report", "--study", study, "-o", study}, exitInput, "inputs", study},
		{"export over the study's section file", []string{"export", "--study", study, "--what", "coords", "-o", filepath.Join(dir, "sec.dat")}, exitInput, "inputs", filepath.Join(dir, "sec.dat")},
		{"clean over its input", []string{"clean", filepath.Join(dir, "sec.dat"), "-o", filepath.Join(dir, "sec.dat")}, exitInput, "inputs", filepath.Join(dir, "sec.dat")},
		{"read-only target", []string{"report", "--section", "naca:0012", "-o", readOnly}, exitInput, "read-only", readOnly},
		{"binary to standard output", []string{"report", "--section", "naca:0012", "-o", "-"}, exitUsage, "binary", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var before []byte
			if tc.intact != "" {
				before, _ = os.ReadFile(tc.intact)
			}
			code, _, stderr := runCLI(t, tc.args...)
			if code != tc.code || !strings.Contains(stderr, tc.contains) {
				t.Errorf("exit %d, stderr %q; want exit %d mentioning %q", code, stderr, tc.code, tc.contains)
			}
			if tc.intact != "" {
				if after, _ := os.ReadFile(tc.intact); string(after) != string(before) {
					t.Errorf("%s was changed", tc.intact)
				}
			}
		})
	}
}

// TestOutputToDevNull: -o /dev/null writes through and leaves the device
// in place (as root, replacing it would break the machine).
func TestOutputToDevNull(t *testing.T) {
	fi, err := os.Lstat("/dev/null")
	if err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Skip("no /dev/null character device here")
	}
	for _, args := range [][]string{
		{"export", "--section", "naca:0012", "--what", "coords", "-o", "/dev/null"},
		{"export", "--section", "naca:0012", "--what", "figure", "--dpi", "20", "-o", "/dev/null"},
	} {
		if code, _, stderr := runCLI(t, args...); code != exitOK {
			t.Errorf("%v: exit %d: %s", args, code, stderr)
		}
	}
	if fi, err := os.Lstat("/dev/null"); err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Fatalf("/dev/null is no longer a character device: %v %v", fi.Mode(), err)
	}
}

// TestFIFOInputsDoNotHang: a FIFO given as a section or study is refused
// by its type at once.
func TestFIFOInputsDoNotHang(t *testing.T) {
	fifo := filepath.Join(t.TempDir(), "wing.dat")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skipf("mkfifo: %v", err)
	}
	for _, args := range [][]string{
		{"solve", "--section", fifo},
		{"solve", "--study", fifo},
		{"clean", fifo},
	} {
		done := make(chan struct{})
		var code int
		var stderr string
		go func() { defer close(done); code, _, stderr = runCLI(t, args...) }()
		select {
		case <-done:
		case <-time.After(5 * time.Second):
			t.Fatalf("%v hangs on a FIFO", args)
		}
		if code != exitInput || !strings.Contains(stderr, "not a regular file") {
			t.Errorf("%v: exit %d, %q; want exit %d saying it is not a regular file", args, code, stderr, exitInput)
		}
	}
}

func must(t *testing.T, err error) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
}
