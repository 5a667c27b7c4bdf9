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

// FuzzParseLists: the density study's list arguments never panic, and
// what they accept is in range and increasing.
func FuzzParseLists(f *testing.F) {
	for _, s := range []string{"20,40,80", "16", "2000,2001", "40,20", "1e3", ",", "0.5,1", "-0,NaN"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if l, err := parseIntList("--panels", s); err == nil {
			for i, n := range l {
				if n < 16 || n > 2000 || (i > 0 && n <= l[i-1]) {
					t.Fatalf("accepted %q as %v", s, l)
				}
			}
		}
		if l, err := parseFloatList("--nose", s, 0, 1); err == nil {
			for _, x := range l {
				if !(x >= 0 && x <= 1) {
					t.Fatalf("accepted %q as %v", s, l)
				}
			}
		}
	})
}
