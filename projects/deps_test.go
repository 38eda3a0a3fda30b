package projects

import (
	"os/exec"
	"strings"
	"testing"
)

// TestNoFyneInEngineOrProjects enforces the layering rule: engine/ and
// projects/ are pure Go and import nothing from fyne.io.
func TestNoFyneInEngineOrProjects(t *testing.T) {
	goBin, err := exec.LookPath("go")
	if err != nil {
		t.Skip("the go command is not on PATH")
	}
	out, err := exec.Command(goBin, "list", "-deps", "duosweep/engine/...", "duosweep/projects/...").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	pkgs := strings.Fields(string(out))
	if len(pkgs) < 5 {
		t.Fatalf("go list returned too little: %q", pkgs)
	}
	// every room of the engine is covered
	for _, want := range []string{"duosweep/engine", "duosweep/engine/published", "duosweep/engine/search", "duosweep/engine/planners", "duosweep/engine/gen"} {
		found := false
		for _, p := range pkgs {
			found = found || p == want
		}
		if !found {
			t.Errorf("go list -deps does not list %s", want)
		}
	}
	for _, p := range pkgs {
		if strings.HasPrefix(p, "fyne.io/") {
			t.Errorf("engine or projects depends on %s", p)
		}
	}
}
