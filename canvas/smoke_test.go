package canvas

import (
	"testing"

	"fyne.io/fyne/v2"
)

func TestSmokeAddDragDraw(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	tapAt(e, e.NodeXY(3), 0)
	if got := e.Selection(); got != (Selection{SelNode, 3}) {
		t.Fatalf("selection %v", got)
	}
	p := e.NodeXY(3)
	i, err := e.AddNode(fyne.NewPos(p.X+50, p.Y))
	if err != nil || i != 4 {
		t.Fatalf("AddNode = %d, %v", i, err)
	}
	dragPtr(e, e.NodeXY(4), fyne.NewPos(p.X+80, p.Y+20), 0)
	if len(rc.changed) != 2 {
		t.Fatalf("changes %d", len(rc.changed))
	}
}
