package engine_test

import (
	"os/exec"
	"strings"
	"testing"
)

// TestLayers enforces the engine's one-way imports (DESIGN.md §13): the
// model room knows no planner, the published planners know only the model,
// the search planners know the model and the published planners, and only
// the registry (planners) sees them all.
func TestLayers(t *testing.T) {
	goBin, err := exec.LookPath("go")
	if err != nil {
		t.Skip("the go command is not on PATH")
	}
	forbidden := map[string][]string{
		"duosweep/engine":           {"duosweep/engine/published", "duosweep/engine/search", "duosweep/engine/planners"},
		"duosweep/engine/published": {"duosweep/engine/search", "duosweep/engine/planners"},
		"duosweep/engine/search":    {"duosweep/engine/planners"},
		"duosweep/engine/gen":       {"duosweep/engine/published", "duosweep/engine/search", "duosweep/engine/planners"},
	}
	for pkg, bad := range forbidden {
		out, err := exec.Command(goBin, "list", "-deps", pkg).CombinedOutput()
		if err != nil {
			t.Fatalf("go list %s: %v\n%s", pkg, err, out)
		}
		deps := strings.Fields(string(out))
		if len(deps) < 3 {
			t.Fatalf("go list -deps %s returned too little: %q", pkg, deps)
		}
		for _, d := range deps {
			for _, b := range bad {
				if d == b {
					t.Errorf("%s depends on %s", pkg, b)
				}
			}
		}
	}
}
