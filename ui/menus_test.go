package ui

import "testing"

func TestFileNameFor(t *testing.T) {
	for in, want := range map[string]string{
		"Demo — fictional student team, rear-wing main element": "demo-fictional-student-team-rear-wing-main-element.json",
		"":       "study.json",
		"Wing 2": "wing-2.json",
	} {
		if got := fileNameFor(in); got != want {
			t.Errorf("fileNameFor(%q) = %q, want %q", in, got, want)
		}
	}
}
