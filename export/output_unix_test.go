//go:build unix

package export

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"sectionbench/model"
)

// withTimeout fails the test if f has not returned after a few seconds:
// the cases here are ones that used to hang for ever.
func withTimeout(t *testing.T, what string, f func()) {
	t.Helper()
	done := make(chan struct{})
	go func() { defer close(done); f() }()
	select {
	case <-done:
	case <-time.After(5 * time.Second):
		t.Fatalf("%s did not return (hangs)", what)
	}
}

func mkfifo(t *testing.T, path string) {
	t.Helper()
	if err := syscall.Mkfifo(path, 0o600); err != nil {
		t.Skipf("no FIFO on this system: %v", err)
	}
}

// TestReadingAFIFOIsRefused: a FIFO given as a study or section file is
// refused at once by its type instead of waiting for a writer for ever.
func TestReadingAFIFOIsRefused(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "wing.json")
	mkfifo(t, fifo)
	for _, tc := range []struct {
		name string
		load func() error
	}{
		{"study", func() error { _, err := LoadStudy(fifo); return err }},
		{"section file", func() error { _, _, err := LoadSectionFile(fifo); return err }},
		{"section in a study", func() error { _, err := SectionLoader(dir)("wing.json"); return err }},
		{"folder", func() error { _, err := LoadStudy(dir); return err }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var err error
			withTimeout(t, "loading a FIFO", func() { err = tc.load() })
			if !errors.Is(err, ErrNotRegular) {
				t.Fatalf("error = %v, want %v", err, ErrNotRegular)
			}
			if !strings.Contains(err.Error(), "wing.json") && tc.name != "folder" {
				t.Errorf("message %q does not name the file", err)
			}
		})
	}
}

func writeString(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

// TestWriteOutput: what an output path holds decides how it is written;
// nothing at the path is ever replaced by something of another kind.
func TestWriteOutput(t *testing.T) {
	const old, out = "old content", "new content"
	for _, tc := range []struct {
		name string
		// setup makes the path (and maybe an input) in dir; it returns the
		// output path, the inputs, and the file whose content is checked.
		setup   func(t *testing.T, dir string) (path string, inputs []string, check string)
		wantErr error
		want    string // content of check afterwards
	}{
		{"new file", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "new.dat")
			return p, nil, p
		}, nil, out},
		{"existing file replaced", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "old.dat")
			must(t, os.WriteFile(p, []byte(old), 0o644))
			return p, nil, p
		}, nil, out},
		{"read-only file refused", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "locked.dat")
			must(t, os.WriteFile(p, []byte(old), 0o444))
			return p, nil, p
		}, ErrReadOnly, old},
		{"the command's input refused", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "s.json")
			must(t, os.WriteFile(p, []byte(old), 0o644))
			return p, []string{"", p}, p
		}, ErrOwnInput, old},
		{"the input under another name refused", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "s.json")
			must(t, os.WriteFile(p, []byte(old), 0o644))
			return filepath.Join(dir, ".", "sub", "..", "s.json"), []string{p}, p
		}, ErrOwnInput, old},
		{"a link to the input refused", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "s.json")
			must(t, os.WriteFile(p, []byte(old), 0o644))
			l := filepath.Join(dir, "link.pdf")
			must(t, os.Symlink(p, l))
			return l, []string{p}, p
		}, ErrOwnInput, old},
		{"symbolic link followed, link kept", func(t *testing.T, dir string) (string, []string, string) {
			p := filepath.Join(dir, "target.dat")
			must(t, os.WriteFile(p, []byte(old), 0o644))
			l := filepath.Join(dir, "link.dat")
			must(t, os.Symlink("target.dat", l))
			return l, nil, p
		}, nil, out},
		{"link to nothing refused", func(t *testing.T, dir string) (string, []string, string) {
			l := filepath.Join(dir, "link.dat")
			must(t, os.Symlink("missing.dat", l))
			return l, nil, ""
		}, ErrOutputKind, ""},
		{"folder refused", func(t *testing.T, dir string) (string, []string, string) {
			return dir, nil, ""
		}, ErrOutputKind, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			must(t, os.Mkdir(filepath.Join(dir, "sub"), 0o755))
			path, inputs, check := tc.setup(t, dir)
			before, _ := os.Lstat(path)
			err := WriteOutput(path, writeString(out), inputs...)
			if !errors.Is(err, tc.wantErr) {
				t.Fatalf("error = %v, want %v", err, tc.wantErr)
			}
			if err != nil && !strings.Contains(err.Error(), path) {
				t.Errorf("message %q does not name %s", err, path)
			}
			if check != "" {
				b, _ := os.ReadFile(check)
				if string(b) != tc.want {
					t.Errorf("%s holds %q, want %q", check, b, tc.want)
				}
			}
			if before != nil {
				after, err := os.Lstat(path)
				if err != nil || after.Mode().Type() != before.Mode().Type() {
					t.Errorf("the path's kind changed from %v to %v (%v)", before.Mode().Type(), after.Mode().Type(), err)
				}
			}
			entries, _ := os.ReadDir(dir)
			for _, e := range entries {
				if strings.Contains(e.Name(), ".tmp-") {
					t.Errorf("temporary file %s left behind", e.Name())
				}
			}
		})
	}
}

func must(t *testing.T, err error) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
}

// TestWriteOutputWritesThroughAFIFO: a FIFO at the output path gets the
// data and stays a FIFO.
func TestWriteOutputWritesThroughAFIFO(t *testing.T) {
	fifo := filepath.Join(t.TempDir(), "pipe")
	mkfifo(t, fifo)
	got := make(chan string, 1)
	go func() {
		b, _ := os.ReadFile(fifo)
		got <- string(b)
	}()
	withTimeout(t, "writing to a FIFO with a reader", func() {
		if err := WriteOutput(fifo, writeString("through the pipe")); err != nil {
			t.Error(err)
		}
	})
	if s := <-got; s != "through the pipe" {
		t.Errorf("the reader got %q", s)
	}
	if fi, err := os.Lstat(fifo); err != nil || fi.Mode()&os.ModeNamedPipe == 0 {
		t.Errorf("the FIFO was replaced: %v, %v", fi.Mode(), err)
	}
}

// TestWriteOutputWritesThroughADevice: a character device (here a null
// device made with mknod, as /dev/null is) is written through, never
// replaced by a regular file. Making a device node needs root.
func TestWriteOutputWritesThroughADevice(t *testing.T) {
	if os.Geteuid() != 0 {
		t.Skip("making a device node with mknod needs root")
	}
	dev := filepath.Join(t.TempDir(), "null")
	// Major 1, minor 3: the null device on Linux (common practice).
	if err := syscall.Mknod(dev, syscall.S_IFCHR|0o666, 1<<8|3); err != nil {
		t.Skipf("mknod: %v", err)
	}
	if err := WriteOutput(dev, writeString("into the void")); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Lstat(dev)
	if err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Errorf("the device was replaced: %v, %v", fi.Mode(), err)
	}
}

// TestSaveStudyOnlyToRegularFiles: saving a study over a FIFO or a device
// is refused at once (never written through, never replaced), and a save
// that fails midway (a full disk) leaves an existing file as it was and no
// file at a new name.
func TestSaveStudyOnlyToRegularFiles(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.json")
	mkfifo(t, fifo)
	st := model.NewStudy()
	var err error
	withTimeout(t, "saving over a FIFO", func() { err = SaveStudy(fifo, st) })
	if !errors.Is(err, ErrOutputKind) {
		t.Errorf("saving over a FIFO: %v, want %v", err, ErrOutputKind)
	}
	full := func(w io.Writer) io.Writer { return &failingAfter{w: w, n: 10} }
	old := filepath.Join(dir, "old.json")
	must(t, os.WriteFile(old, []byte("previous study"), 0o644))
	if err := SaveStudyThrough(old, st, full); !errors.Is(err, errInterrupted) {
		t.Errorf("a full disk gave %v", err)
	}
	if b, _ := os.ReadFile(old); string(b) != "previous study" {
		t.Errorf("a failed save left %q", b)
	}
	fresh := filepath.Join(dir, "new.json")
	SaveStudyThrough(fresh, st, full)
	if _, err := os.Lstat(fresh); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a failed save to a new name left a file (%v)", err)
	}
}

// failingAfter passes n bytes through, then fails as a full disk would.
type failingAfter struct {
	w io.Writer
	n int
}

func (f *failingAfter) Write(p []byte) (int, error) {
	if len(p) <= f.n {
		f.n -= len(p)
		return f.w.Write(p)
	}
	k, _ := f.w.Write(p[:f.n])
	f.n = 0
	return k, errInterrupted
}
