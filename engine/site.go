package engine

import (
	"fmt"
	"math"
	"sync"
)

// FieldError is a validation error that names the offending field and value.
type FieldError struct {
	Field string // e.g. "corridors[3].length"
	Value string // the offending value as text
	Msg   string
}

func (e *FieldError) Error() string {
	if e.Value == "" {
		return fmt.Sprintf("engine: %s: %s", e.Field, e.Msg)
	}
	return fmt.Sprintf("engine: %s: %s: %s", e.Field, e.Value, e.Msg)
}

func fieldErr(field, value, format string, args ...any) error {
	return &FieldError{Field: field, Value: value, Msg: fmt.Sprintf(format, args...)}
}

// ProbabilityTolerance is how far the candidate probabilities may sum away from 1.
const ProbabilityTolerance = 1e-6

// Site is a validated scenario: a tree rooted at the start node with
// precomputed structures for O(log n) distances. A Site is immutable and
// safe for concurrent use.
type Site struct {
	Scenario Scenario // the validated input (a private copy)

	N     int      // number of nodes
	Start int      // index of the start node
	IDs   []string // node ids by index
	Speed [2]float64
	Names [2]string

	Candidate []bool    // candidate nodes
	Prob      []float64 // probabilities (0 where absent)
	HasProb   bool      // some node has a probability: expected times are reported

	// Corridors, by corridor index e: end nodes EU[e] ("u", the From end
	// as given) and EV[e] ("v", the To end), and length EW[e] ("weight").
	// Offsets along corridor e are measured from EU[e].
	EU, EV []int32
	EW     []float64

	// Rooted at Start.
	Parent     []int32   // -1 at the root
	ParentEdge []int32   // corridor to the parent, -1 at the root
	Depth      []float64 // distance from the start
	Level      []int32   // number of corridors from the start
	Order      []int32   // a preorder (parents before children)

	// Children in CSR form: children of v are ChildList[ChildStart[v]:ChildStart[v+1]],
	// in corridor order.
	ChildStart []int32
	ChildList  []int32

	// InSearch marks nodes of the smallest subtree holding the start and every candidate.
	InSearch []bool

	index map[string]int
	hld   hld

	boundsOnce sync.Once
	bounds     Bounds
	statsOnce  sync.Once
	st         *subtreeStats
	kidsOnce   [4]sync.Once
	kidCache   [4]*kids
}

// NewSite validates sc and builds a Site. It is O(n log n) in the worst case
// (O(n) expected). Errors are *FieldError values naming the field and value.
func NewSite(sc Scenario) (*Site, error) {
	sc = sc.Clone()
	if sc.Unit == "" {
		sc.Unit = "m"
	}
	if len(sc.Agents) == 0 {
		sc.Agents = DefaultAgents()
	}
	if len(sc.Agents) != 2 {
		return nil, fieldErr("agents", fmt.Sprint(len(sc.Agents)), "a crew has exactly 2 agents")
	}
	s := &Site{Scenario: sc, N: len(sc.Nodes)}
	for i, a := range sc.Agents {
		if !(a.Speed > 0) || math.IsInf(a.Speed, 0) {
			return nil, fieldErr(fmt.Sprintf("agents[%d].speed", i), fmtNum(a.Speed), "speed must be a finite number > 0")
		}
		s.Speed[i] = a.Speed
		s.Names[i] = a.Name
		if s.Names[i] == "" {
			s.Names[i] = string(rune('A' + i))
		}
	}
	if s.Names[0] == s.Names[1] {
		return nil, fieldErr("agents[1].name", s.Names[1], "the two agents need different names")
	}
	if s.N == 0 {
		return nil, fieldErr("nodes", "", "a site needs at least one node")
	}
	s.index = make(map[string]int, s.N)
	s.IDs = make([]string, s.N)
	for i, n := range sc.Nodes {
		field := fmt.Sprintf("nodes[%d].id", i)
		if n.ID == "" {
			return nil, fieldErr(field, `""`, "node id must not be empty")
		}
		if j, dup := s.index[n.ID]; dup {
			return nil, fieldErr(field, n.ID, "duplicate id (also nodes[%d])", j)
		}
		if n.HasXY && (!finite(n.X) || !finite(n.Y)) {
			return nil, fieldErr(fmt.Sprintf("nodes[%d].x", i), fmtNum(n.X)+","+fmtNum(n.Y), "coordinates must be finite")
		}
		s.index[n.ID] = i
		s.IDs[i] = n.ID
	}
	start, ok := s.index[sc.Start]
	if !ok {
		return nil, fieldErr("start", sc.Start, "no node has this id")
	}
	s.Start = start
	if err := checkDrawing(sc); err != nil {
		return nil, err
	}

	if err := s.buildEdges(); err != nil {
		return nil, err
	}
	if err := s.buildRooted(); err != nil {
		return nil, err
	}
	if err := s.buildCandidates(); err != nil {
		return nil, err
	}
	s.hld = newHLD(s)
	return s, nil
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func fmtNum(x float64) string { return fmt.Sprintf("%g", x) }

// Index returns the index of the node with id, and whether it exists. O(1).
func (s *Site) Index(id string) (int, bool) {
	i, ok := s.index[id]
	return i, ok
}

// Unit returns the length unit.
func (s *Site) Unit() string { return s.Scenario.Unit }

// Label returns the node's label, or its id when it has none.
func (s *Site) Label(v int) string {
	if l := s.Scenario.Nodes[v].Label; l != "" {
		return l
	}
	return s.IDs[v]
}

// Candidates returns the candidate node indices in index order.
func (s *Site) Candidates() []int {
	var out []int
	for v, c := range s.Candidate {
		if c {
			out = append(out, v)
		}
	}
	return out
}

// candidateCount returns the number of candidates.
func (s *Site) candidateCount() int {
	n := 0
	for _, c := range s.Candidate {
		if c {
			n++
		}
	}
	return n
}

// Children returns the children of v in corridor order (the slice is shared; do not modify).
func (s *Site) Children(v int) []int32 { return s.ChildList[s.ChildStart[v]:s.ChildStart[v+1]] }

// Edge returns the index of the corridor joining u and v (adjacent nodes), or -1.
func (s *Site) Edge(u, v int) int {
	if u < 0 || v < 0 || u >= s.N || v >= s.N {
		return -1
	}
	if int(s.Parent[u]) == v {
		return int(s.ParentEdge[u])
	}
	if int(s.Parent[v]) == u {
		return int(s.ParentEdge[v])
	}
	return -1
}

func (s *Site) buildEdges() error {
	m := len(s.Scenario.Corridors)
	s.EU = make([]int32, m)
	s.EV = make([]int32, m)
	s.EW = make([]float64, m)
	uf := newUnionFind(s.N)
	for i, c := range s.Scenario.Corridors {
		u, ok := s.index[c.From]
		if !ok {
			return fieldErr(fmt.Sprintf("corridors[%d].from", i), c.From, "no node has this id")
		}
		v, ok := s.index[c.To]
		if !ok {
			return fieldErr(fmt.Sprintf("corridors[%d].to", i), c.To, "no node has this id")
		}
		if u == v {
			return fieldErr(fmt.Sprintf("corridors[%d]", i), c.From+"-"+c.To, "a corridor cannot join a node to itself")
		}
		if !(c.Length > 0) || math.IsInf(c.Length, 0) {
			return fieldErr(fmt.Sprintf("corridors[%d].length", i), fmtNum(c.Length), "length must be a finite number > 0")
		}
		s.EU[i], s.EV[i], s.EW[i] = int32(u), int32(v), c.Length
		if !c.Closed && !uf.union(u, v) {
			return s.loopErr(i) // closed corridors may close loops (closed.go)
		}
	}
	return nil
}

func (s *Site) buildRooted() error {
	n := s.N
	// adjacency in CSR, corridor order
	deg := make([]int32, n+1)
	closed := func(i int) bool { return s.Scenario.Corridors[i].Closed } // never walked (closed.go)
	for i := range s.EU {
		if closed(i) {
			continue
		}
		deg[s.EU[i]+1]++
		deg[s.EV[i]+1]++
	}
	for i := 1; i <= n; i++ {
		deg[i] += deg[i-1]
	}
	adj := make([]int32, deg[n])
	adjE := make([]int32, deg[n])
	fill := append([]int32(nil), deg[:n]...)
	for i := range s.EU {
		if closed(i) {
			continue
		}
		u, v := s.EU[i], s.EV[i]
		adj[fill[u]], adjE[fill[u]] = v, int32(i)
		fill[u]++
		adj[fill[v]], adjE[fill[v]] = u, int32(i)
		fill[v]++
	}
	s.Parent = make([]int32, n)
	s.ParentEdge = make([]int32, n)
	s.Depth = make([]float64, n)
	s.Level = make([]int32, n)
	s.Order = make([]int32, 0, n)
	seen := make([]bool, n)
	for i := range s.Parent {
		s.Parent[i] = -1
		s.ParentEdge[i] = -1
	}
	stack := []int32{int32(s.Start)}
	seen[s.Start] = true
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		s.Order = append(s.Order, v)
		for k := deg[v]; k < deg[v+1]; k++ {
			w := adj[k]
			if seen[w] {
				continue
			}
			seen[w] = true
			e := adjE[k]
			s.Parent[w] = v
			s.ParentEdge[w] = e
			s.Depth[w] = s.Depth[v] + s.EW[e]
			s.Level[w] = s.Level[v] + 1
			stack = append(stack, w)
		}
	}
	if len(s.Order) != n {
		for v := 0; v < n; v++ {
			if !seen[v] {
				return s.disconnectedErr(v)
			}
		}
	}
	// children CSR in corridor order
	s.ChildStart = make([]int32, n+1)
	for v := 0; v < n; v++ {
		if p := s.Parent[v]; p >= 0 {
			s.ChildStart[p+1]++
		}
	}
	for i := 1; i <= n; i++ {
		s.ChildStart[i] += s.ChildStart[i-1]
	}
	s.ChildList = make([]int32, n-1+boolInt(n == 0))
	cf := append([]int32(nil), s.ChildStart[:n]...)
	for i := range s.EU {
		if closed(i) {
			continue
		}
		u, v := s.EU[i], s.EV[i]
		c := v
		if s.Parent[u] == v {
			c = u
		}
		p := s.Parent[c]
		s.ChildList[cf[p]] = c
		cf[p]++
	}
	return nil
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

func (s *Site) buildCandidates() error {
	n := s.N
	s.Candidate = make([]bool, n)
	s.Prob = make([]float64, n)
	sum := 0.0
	for i, nd := range s.Scenario.Nodes {
		s.Candidate[i] = nd.Candidate
		if nd.HasProbability {
			p := nd.Probability
			if !(p >= 0) || math.IsInf(p, 0) {
				return fieldErr(fmt.Sprintf("nodes[%d].probability", i), fmtNum(p), "probability must be a finite number >= 0")
			}
			if p > 0 && !nd.Candidate {
				return fieldErr(fmt.Sprintf("nodes[%d].probability", i), fmtNum(p), "node %q is not a candidate, so it cannot hold the exit", nd.ID)
			}
			s.HasProb = true
			s.Prob[i] = p
			sum += p
		}
	}
	if s.HasProb && math.Abs(sum-1) > ProbabilityTolerance {
		return fieldErr("nodes[].probability", fmtNum(sum), "probabilities must sum to 1 (within %g)", ProbabilityTolerance)
	}
	// smallest subtree holding start and candidates: a node is in it iff its
	// subtree holds a candidate, or it is the start.
	s.InSearch = make([]bool, n)
	for i := n - 1; i >= 0; i-- {
		v := s.Order[i]
		if s.Candidate[v] {
			s.InSearch[v] = true
		}
		if s.InSearch[v] {
			if p := s.Parent[v]; p >= 0 {
				s.InSearch[p] = true
			}
		}
	}
	s.InSearch[s.Start] = true
	return nil
}

type unionFind struct{ p []int32 }

func newUnionFind(n int) *unionFind {
	u := &unionFind{p: make([]int32, n)}
	for i := range u.p {
		u.p[i] = int32(i)
	}
	return u
}

func (u *unionFind) find(x int) int {
	for int(u.p[x]) != x {
		u.p[x] = u.p[u.p[x]]
		x = int(u.p[x])
	}
	return x
}

func (u *unionFind) union(a, b int) bool {
	a, b = u.find(a), u.find(b)
	if a == b {
		return false
	}
	u.p[a] = int32(b)
	return true
}
