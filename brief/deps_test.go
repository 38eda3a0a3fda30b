package brief

import (
	"os/exec"
	"strings"
	"testing"
)

// TestNoFyne enforces the layering rule: brief is pure Go and imports
// nothing from fyne.io (the CLI and the app both use it).
func TestNoFyne(t *testing.T) {
	goBin, err := exec.LookPath("go")
	if err != nil {
		t.Skip("the go command is not on PATH")
	}
	out, err := exec.Command(goBin, "list", "-deps", "duosweep/brief").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	pkgs := strings.Fields(string(out))
	if len(pkgs) < 5 {
		t.Fatalf("go list returned too little: %q", pkgs)
	}
	for _, p := range pkgs {
		if strings.HasPrefix(p, "fyne.io/") {
			t.Errorf("brief depends on %s", p)
		}
	}
}
