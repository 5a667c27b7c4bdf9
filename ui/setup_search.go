package ui

import "fyne.io/fyne/v2"

type setupSearch struct {
	s       *setupWindow
	content fyne.CanvasObject
}

func newSetupSearch(s *setupWindow) *setupSearch {
	return &setupSearch{s: s, content: caption("")}
}
func (p *setupSearch) studyChanged() {}
func (p *setupSearch) redraw()       {}
func (p *setupSearch) stop()         {}
func (p *setupSearch) start()        {}
