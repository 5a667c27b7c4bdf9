package model

import (
	"math"
	"os"
	"testing"
)

// TestDecodeVersion1Inverted: a version-1 study kept an inverted wing's
// positions in the upright design frame; read now, its positions are as
// mounted and place the same wing.
func TestDecodeVersion1Inverted(t *testing.T) {
	b, err := os.ReadFile("testdata/studies/v1-inverted-two-element.json")
	if err != nil {
		t.Fatal(err)
	}
	st, err := DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	if st.Version != StudyVersion {
		t.Errorf("version %d after reading, want %d", st.Version, StudyVersion)
	}
	if got := st.Elements[1].YMM; got != 5 {
		t.Errorf("flap y %g mm as mounted, want 5 (was −5 in the upright design frame)", got)
	}
	// The same wing: the version-1 placement was the upright wing with
	// the flap at y = −5 mm, mirrored about y = 0.
	sec := mustNACA(t, "4412")
	l, err := Place(st, []*Section{sec, sec})
	if err != nil {
		t.Fatal(err)
	}
	up := st.Clone()
	up.Inverted = false
	up.Elements[1].YMM = -5
	lu, err := Place(up, []*Section{sec, sec})
	if err != nil {
		t.Fatal(err)
	}
	for i := range l.Elements {
		n := len(l.Elements[i].Nodes)
		for k, p := range l.Elements[i].Nodes {
			q := lu.Elements[i].Nodes[n-1-k] // mirrored contours run the other way
			if math.Abs(p.X-q.X) > 1e-12 || math.Abs(p.Y+q.Y) > 1e-12 {
				t.Fatalf("element %d node %d at %v, the mirrored version-1 wing has %v", i, k, p, q)
			}
		}
	}
	// Saved again it is version 2 and reads back unchanged.
	out, err := st.Encode()
	if err != nil {
		t.Fatal(err)
	}
	back, err := DecodeStudy(out)
	if err != nil {
		t.Fatal(err)
	}
	if back.Elements[1].YMM != 5 || back.Version != StudyVersion {
		t.Errorf("read back: version %d, flap y %g", back.Version, back.Elements[1].YMM)
	}
}

// TestDecodeVersion1Upright: an upright version-1 study means the same.
func TestDecodeVersion1Upright(t *testing.T) {
	st := NewStudy()
	st.Version = 1
	st.Elements[0].YMM = -7
	b, err := st.Encode()
	if err != nil {
		t.Fatal(err)
	}
	back, err := DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	if back.Elements[0].YMM != -7 {
		t.Errorf("upright y %g, want −7", back.Elements[0].YMM)
	}
}
