package brief

import (
	"context"
	"testing"
	"time"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/projects"
)

// briefDate is the fixed date of test briefings.
var briefDate = time.Date(2026, 3, 14, 9, 30, 0, 0, time.UTC)

// demoInput plans the bundled demo site with the best available planner under m.
func demoInput(t testing.TB, m engine.Model) Input {
	t.Helper()
	s, err := engine.NewSite(projects.Demo())
	if err != nil {
		t.Fatal(err)
	}
	p, r, err := planners.BestPlan(context.Background(), s, m)
	if err != nil {
		t.Fatal(err)
	}
	return Input{Site: s, Plan: p, Report: r, Date: briefDate}
}
