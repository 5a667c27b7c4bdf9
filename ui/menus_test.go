package ui

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2"

	"sectionbench/model"
	"sectionbench/ui/session"
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

// TestUndoItemNamesChange: Edit ▸ Undo and Redo name what they would set
// (they said only "Undo"), with the value they go back to; a change of
// the study's name is named too, and with nothing to undo the item is
// plain "Undo", greyed out.
func TestUndoItemNamesChange(t *testing.T) {
	w := newTestBench(t)
	current(t, w)
	if w.undoItem.Label != "Undo" || !w.undoItem.Disabled {
		t.Errorf("fresh study: %q, disabled %v", w.undoItem.Label, w.undoItem.Disabled)
	}
	was := w.ctl.Study().Flow.AlphaDeg
	if err := w.ctl.SetAlpha("", was+3); err != nil {
		t.Fatal(err)
	}
	current(t, w)
	if want := "Undo (back to α=" + session.Number(was) + "°)"; w.undoItem.Label != want || w.undoItem.Disabled {
		t.Errorf("after a change of angle: %q (disabled %v), want %q", w.undoItem.Label, w.undoItem.Disabled, want)
	}
	if err := w.ctl.SetStudyName("renamed"); err != nil {
		t.Fatal(err)
	}
	current(t, w)
	if !strings.Contains(w.undoItem.Label, "name “") {
		t.Errorf("after a rename: %q", w.undoItem.Label)
	}
	w.ctl.Undo()
	current(t, w)
	if want := "Redo (name “renamed”)"; w.redoItem.Label != want {
		t.Errorf("redo after undoing the rename: %q, want %q", w.redoItem.Label, want)
	}
}
