package export

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

var errInterrupted = errors.New("interrupted")

func TestWriteFileAtomicKeepsOldFileOnFailure(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "study.json")
	old := []byte(`{"old": true}`)
	if err := os.WriteFile(path, old, 0o600); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name  string
		write func(io.Writer) error
	}{
		{"fails before writing", func(w io.Writer) error { return errInterrupted }},
		{"fails midway", func(w io.Writer) error {
			if _, err := w.Write([]byte(`{"new": `)); err != nil {
				return err
			}
			return errInterrupted
		}},
		{"panics midway", nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.write == nil {
				func() {
					defer func() { recover() }()
					WriteFileAtomic(path, func(w io.Writer) error {
						w.Write([]byte("partial"))
						panic("writer crashed")
					})
				}()
			} else if err := WriteFileAtomic(path, tc.write); !errors.Is(err, errInterrupted) {
				t.Fatalf("error = %v, want %v", err, errInterrupted)
			}
			got, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			if string(got) != string(old) {
				t.Errorf("file = %q, want the old %q", got, old)
			}
			fi, _ := os.Stat(path)
			if fi.Mode().Perm() != 0o600 {
				t.Errorf("mode = %v, want 0600 kept", fi.Mode().Perm())
			}
		})
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if e.Name() != "study.json" {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

func TestWriteFileAtomicReplaces(t *testing.T) {
	path := filepath.Join(t.TempDir(), "out.txt")
	for _, content := range []string{"first", "second, longer", "3"} {
		if err := WriteFileAtomic(path, func(w io.Writer) error {
			_, err := io.WriteString(w, content)
			return err
		}); err != nil {
			t.Fatal(err)
		}
		got, _ := os.ReadFile(path)
		if string(got) != content {
			t.Errorf("got %q, want %q", got, content)
		}
	}
}
