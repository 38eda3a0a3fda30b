package testtrees

import (
	"reflect"
	"testing"

	"duosweep/engine"
)

func TestRandomDeterministicAndValid(t *testing.T) {
	seen := map[string]int{}
	for i := 0; i < 500; i++ {
		a := Random(NewRand(uint64(i)), Options{})
		b := Random(NewRand(uint64(i)), Options{})
		if !reflect.DeepEqual(a, b) {
			t.Fatalf("seed %d: two different scenarios", i)
		}
		s, err := engine.NewSite(a)
		if err != nil {
			t.Fatalf("seed %d: %v", i, err)
		}
		if s.N < 2 || s.N > 60 || len(s.Candidates()) == 0 {
			t.Errorf("seed %d: %d nodes, %d candidates", i, s.N, len(s.Candidates()))
		}
		if s.Start != 0 {
			seen["start not node 0"]++
		}
		if s.Speed[0] != s.Speed[1] {
			seen["unequal speeds"]++
		}
		if s.HasProb {
			seen["probabilities"]++
		}
		if s.Candidate[s.Start] {
			seen["start is a candidate"]++
		}
		if len(s.Candidates()) < s.N-1 {
			seen["some non-candidates"]++
		}
		frac := false
		for _, w := range s.EW {
			if w != float64(int(w)) {
				frac = true
			}
		}
		if frac {
			seen["real lengths"]++
		} else {
			seen["integer lengths"]++
		}
	}
	for _, k := range []string{"start not node 0", "unequal speeds", "probabilities", "start is a candidate", "some non-candidates", "real lengths", "integer lengths"} {
		if seen[k] == 0 {
			t.Errorf("500 seeds never gave %s", k)
		}
	}
	t.Logf("%v", seen)
	big := Random(NewRand(1), Options{MinNodes: 150, MaxNodes: 200})
	if n := len(big.Nodes); n < 150 || n > 200 {
		t.Errorf("MinNodes/MaxNodes: %d nodes", n)
	}
	eq := Random(NewRand(3), Options{EqualSpeeds: true, NoProbabilities: true})
	if eq.Agents[0].Speed != eq.Agents[1].Speed {
		t.Error("EqualSpeeds ignored")
	}
}

func TestShapesValid(t *testing.T) {
	for _, nm := range Shapes() {
		s, err := engine.NewSite(nm.Scenario)
		if err != nil {
			t.Errorf("%s: %v", nm.Name, err)
			continue
		}
		if len(s.Candidates()) != s.N-1 {
			t.Errorf("%s: %d candidates of %d nodes", nm.Name, len(s.Candidates()), s.N)
		}
	}
	if n := len(Binary(3, 1).Nodes); n != 15 {
		t.Errorf("binary depth 3: %d nodes, want 15", n)
	}
}
