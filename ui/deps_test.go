package ui

import (
	"os/exec"
	"strings"
	"testing"
)

// TestNoAppImport keeps ui testable as pure Go: only cmd/duosweep may import fyne.io/fyne/v2/app (it pulls
// in the cgo GLFW driver).
func TestNoAppImport(t *testing.T) {
	out, err := exec.Command("go", "list", "-deps", "duosweep/ui").Output()
	if err != nil {
		t.Skipf("go list unavailable: %v", err)
	}
	for _, p := range strings.Fields(string(out)) {
		if p == "fyne.io/fyne/v2/app" || strings.HasPrefix(p, "fyne.io/fyne/v2/internal/driver/glfw") {
			t.Fatalf("ui depends on %s", p)
		}
	}
}
