package ui

// submit types s into the field and presses Enter, as a user would.
func (f *field) submit(s string) {
	f.SetText(s)
	f.OnSubmitted(s)
}
