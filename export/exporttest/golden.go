package exporttest

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// GoldenText compares got with the golden file at path, or, with update,
// rewrites the file (creating its folder). A difference fails the test
// naming the first line that differs and how to rewrite the file (update
// names the test's -update command, e.g. "go test ./export/format -run
// Golden -update").
func GoldenText(t testing.TB, path string, got []byte, update bool, updateCommand string) {
	t.Helper()
	if update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run %s to create it)", err, updateCommand)
	}
	if string(got) == string(want) {
		return
	}
	gl, wl := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
	for i := range max(len(gl), len(wl)) {
		var g, w string
		if i < len(gl) {
			g = gl[i]
		}
		if i < len(wl) {
			w = wl[i]
		}
		if g != w {
			t.Fatalf("%s differs from the golden file at line %d:\n got: %q\nwant: %q\n(run %s if the change is deliberate)", path, i+1, g, w, updateCommand)
		}
	}
}
