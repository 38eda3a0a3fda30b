package canvas

// ShortcutHelp is one line of the editor's help: a key or gesture and what it does.
type ShortcutHelp struct {
	Key    string
	Action string
}

// Shortcuts returns every keyboard shortcut and pointer gesture of the editor,
// in the order the help overlay lists them.
func Shortcuts() []ShortcutHelp {
	return []ShortcutHelp{
		{"Tap", "select a junction or corridor (tap empty space: deselect)"},
		{"Double-tap / Shift-tap", "add a junction (joined to the selected one)"},
		{"Drag a junction", "move it"},
		{"Alt- or Ctrl-drag", "from a junction to another: add a corridor"},
		{"Drag empty space", "pan"},
		{"Wheel / trackpad", "zoom around the pointer"},
		{"Right-click", "menu for the junction, corridor or empty space"},
		{"+  /  -", "zoom in / out"},
		{"Arrow keys", "pan"},
		{"F", "fit the site in view"},
		{"Delete / Backspace", "delete the selection"},
		{"S", "make the selected junction the start"},
		{"C", "toggle: the selected junction may hold the exit"},
		{"T", "tidy layout of the whole tree"},
		{"Ctrl+Z", "undo"},
		{"Ctrl+Shift+Z / Ctrl+Y", "redo"},
		{"Esc", "cancel a drag, close help, deselect"},
		{"? / F1", "show or hide this help"},
	}
}

// Shortcuts returns the editor's keyboard shortcuts and gestures (see the
// package function Shortcuts).
func (e *Editor) Shortcuts() []ShortcutHelp { return Shortcuts() }
