package model

import (
	"errors"
	"os"
	"path/filepath"
	"testing"
)

// FuzzDecodeStudy: the study loader never panics, never half-loads (a nil
// study with every error), and what it accepts validates and encodes back
// to a study that decodes to the same encoding.
func FuzzDecodeStudy(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "studies", "*.json"))
	for _, p := range seeds {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	b, _ := NewStudy().Encode()
	f.Add(b)
	f.Add([]byte(`{"format": "sectionbench-study", "version": 2}`))
	f.Add([]byte(`{"format": "sectionbench-study", "version": 1, "elements": [{"section": {"name": "x", "points": [[0,0],[1,0],[0.5,1e308],[0.2,-1],[0,0]]}, "chord_mm": 1}]}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		st, err := DecodeStudy(b)
		if err != nil {
			if st != nil {
				t.Fatal("study returned with an error")
			}
			var fe *FieldError
			_ = errors.As(err, &fe)
			return
		}
		if err := st.Validate(); err != nil {
			t.Fatalf("decoded study does not validate: %v", err)
		}
		enc, err := st.Encode()
		if err != nil {
			t.Fatalf("decoded study does not encode: %v", err)
		}
		again, err := DecodeStudy(enc)
		if err != nil {
			t.Fatalf("encoded study does not decode: %v\n%s", err, enc)
		}
		if enc2, _ := again.Encode(); string(enc2) != string(enc) {
			t.Fatalf("round trip changed the study:\n%s\n%s", enc, enc2)
		}
	})
}
