package main

import (
	"errors"
	"testing"
)

// FuzzParseRange: the sweep range argument never panics, and what it
// accepts is a valid range.
func FuzzParseRange(f *testing.F) {
	for _, s := range []string{"-4:12:1", "0:0:1", "1e308:1e308:1", "NaN:1:1", "::", "0:10:-1", "0:45:0.0001"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := parseRange("--alpha", s)
		if err != nil {
			var ue *usageError
			if !errors.As(err, &ue) {
				t.Fatalf("error %v is not a usage error", err)
			}
			return
		}
		if _, err := r.Angles(); err != nil {
			t.Fatalf("accepted %q but Angles fails: %v", s, err)
		}
	})
}
