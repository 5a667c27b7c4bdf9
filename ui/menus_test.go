package ui

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2"

	"sectionbench/model"
)

func TestFileNameFor(t *testing.T) {
	for in, want := range map[string]string{
		"Demo — fictional student team, rear-wing main element": "demo-fictional-student-team-rear-wing-main-element.json",
		"":       "study.json",
		"Wing 2": "wing-2.json",
		// Team and name together: cut at the last word within 60 characters.
		"Fictional student team (invented demo data) Demo — fictional student team, rear-wing main element": "fictional-student-team-invented-demo-data-demo-fictional.json",
		strings.Repeat("x", 70): strings.Repeat("x", 60) + ".json",
	} {
		if got := fileNameFor(in); got != want {
			t.Errorf("fileNameFor(%q) = %q, want %q", in, got, want)
		}
	}
}

// menuItem returns the item labelled label in the window's menu.
func menuItem(t *testing.T, w *Workbench, menu, label string) *fyne.MenuItem {
	t.Helper()
	for _, m := range w.Window().MainMenu().Items {
		if m.Label != menu {
			continue
		}
		for _, it := range m.Items {
			if it.Label == label {
				return it
			}
		}
	}
	t.Fatalf("no %s ▸ %s", menu, label)
	return nil
}

// TestUndoRedoGreyedOut follows Edit ▸ Undo and Redo through edits,
// undo, redo, a new edit and a study loaded afresh.
func TestUndoRedoGreyedOut(t *testing.T) {
	w := newTestBench(t)
	undo, redo := menuItem(t, w, "Edit", "Undo"), menuItem(t, w, "Edit", "Redo")
	check := func(step string, canUndo, canRedo bool) {
		t.Helper()
		if undo.Disabled == canUndo || redo.Disabled == canRedo {
			t.Errorf("%s: Undo enabled %v, Redo enabled %v; want %v, %v", step, !undo.Disabled, !redo.Disabled, canUndo, canRedo)
		}
	}
	check("fresh demo", false, false)
	w.controls.panelEntry.submit("90")
	check("edit", true, false)
	w.ctl.Undo()
	check("undo", false, true)
	w.ctl.Redo()
	check("redo", true, false)
	w.ctl.Undo()
	w.controls.alphaEntry.submit("2")
	check("new edit after undo", true, false)
	if err := w.ctl.Load(model.NewStudy(), ""); err != nil {
		t.Fatal(err)
	}
	check("new study", false, false)
	w.WaitIdle()
}
