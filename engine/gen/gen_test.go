package gen

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

func TestGenerateValid(t *testing.T) {
	for _, fam := range Families {
		for _, n := range []int{1, 2, 3, 10, 101, 1000} {
			sc, err := Generate(fam, n, 7)
			require.NoError(t, err, "%s %d", fam, n)
			s, err := engine.NewSite(sc)
			require.NoError(t, err, "%s %d", fam, n)
			assert.Equal(t, n, s.N)
			assert.Equal(t, "n0", sc.Start)
			assert.Len(t, sc.Corridors, n-1)
			for i, nd := range sc.Nodes {
				assert.Equal(t, i != 0, nd.Candidate)
				assert.False(t, nd.HasXY)
				assert.False(t, nd.HasProbability)
			}
			for _, c := range sc.Corridors {
				assert.True(t, c.Length >= 1 && c.Length <= 100 && c.Length == math.Trunc(c.Length), "length %g", c.Length)
			}
		}
	}
}

// TestGenerateShapes checks each family's shape by counting degrees, derived by hand
// from the definitions in Generate's comment.
func TestGenerateShapes(t *testing.T) {
	deg := func(sc engine.Scenario) map[string]int {
		d := map[string]int{}
		for _, c := range sc.Corridors {
			d[c.From]++
			d[c.To]++
		}
		return d
	}
	sc, _ := Generate("star", 9, 1)
	assert.Equal(t, 8, deg(sc)["n0"])
	sc, _ = Generate("path", 9, 1)
	for i, nd := range sc.Nodes {
		want := 2
		if i == 0 || i == 8 {
			want = 1
		}
		assert.Equal(t, want, deg(sc)[nd.ID], nd.ID)
	}
	sc, _ = Generate("binary", 7, 1) // complete: root 2, inner 3, leaves 1
	d := deg(sc)
	assert.Equal(t, []int{2, 3, 3, 1, 1, 1, 1}, []int{d["n0"], d["n1"], d["n2"], d["n3"], d["n4"], d["n5"], d["n6"]})
	sc, _ = Generate("spider", 17, 1) // 4 legs of 4 nodes
	s, err := engine.NewSite(sc)
	require.NoError(t, err)
	assert.Len(t, s.Children(0), 4)
	for _, c := range s.Children(0) {
		depth := 0
		for v := int(c); ; depth++ {
			ch := s.Children(v)
			if len(ch) == 0 {
				break
			}
			assert.Len(t, ch, 1)
			v = int(ch[0])
		}
		assert.Equal(t, 3, depth)
	}
	sc, _ = Generate("caterpillar", 10, 3) // spine n0..n4, leaves n5..n9 hang from the spine
	for _, c := range sc.Corridors[4:] {
		s, _ := engine.NewSite(sc)
		v, _ := s.Index(c.To)
		assert.Less(t, int(s.Parent[v]), 5)
		assert.Empty(t, s.Children(v))
	}
}

func TestGenerateDeterministic(t *testing.T) {
	for _, fam := range Families {
		a, err := Generate(fam, 500, 42)
		require.NoError(t, err)
		b, _ := Generate(fam, 500, 42)
		assert.Equal(t, a, b, fam)
	}
	a, _ := Generate("random", 500, 1)
	b, _ := Generate("random", 500, 2)
	assert.NotEqual(t, a.Corridors, b.Corridors)
	assert.Equal(t, "random tree, 500 nodes, seed 1", a.Name)
}

func TestGenerateErrors(t *testing.T) {
	_, err := Generate("bush", 10, 1)
	assert.ErrorContains(t, err, `gen: family: "bush"`)
	_, err = Generate("path", 0, 1)
	assert.ErrorContains(t, err, "gen: nodes: 0")
}

func BenchmarkGenerateRandomMillion(b *testing.B) {
	for b.Loop() {
		if _, err := Generate("random", 1_000_000, 1); err != nil {
			b.Fatal(err)
		}
	}
}
