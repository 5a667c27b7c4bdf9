package export

import (
	"os"
	"path/filepath"
	"regexp"
	"testing"
)

// TestVersionMatchesFyneApp: the version the files carry is
// FyneApp.toml's, which packaging reads.
func TestVersionMatchesFyneApp(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "FyneApp.toml"))
	if err != nil {
		t.Fatal(err)
	}
	m := regexp.MustCompile(`(?m)^\s*Version\s*=\s*"([^"]*)"`).FindSubmatch(b)
	if m == nil {
		t.Fatal("FyneApp.toml has no Version")
	}
	if got := string(m[1]); got != Version {
		t.Errorf("FyneApp.toml says version %q, export.Version %q", got, Version)
	}
}
