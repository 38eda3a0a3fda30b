package importer

import (
	"container/heap"
	"errors"
	"fmt"
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"duosweep/engine"
)

// DefaultSnap is the default snap tolerance: line ends closer than half a
// metre become one junction.
const DefaultSnap = 0.5

// Options control an import.
type Options struct {
	// Start is the id (or Point name) of the start node. When empty, a Point
	// with "start": true is the start, else StartNear, else the first
	// junction of the first line (and a message says so).
	Start string
	// StartNear, when set, makes the junction nearest to this source
	// position (longitude, latitude or plane x, y) the start.
	StartNear *[2]float64
	// Snap: line ends (and Points) within this distance (metres for
	// longitude/latitude input, plane units for projected input) become one
	// junction. Zero joins only identical positions. DefaultOptions sets
	// DefaultSnap.
	Snap float64
	// Planar treats coordinates as plane coordinates even when they fall in
	// the longitude/latitude range.
	Planar bool
	// Largest keeps the largest connected piece (by total corridor length)
	// and drops the others, instead of refusing a network in several pieces.
	Largest bool
}

// DefaultOptions returns the options of the command line's defaults.
func DefaultOptions() Options { return Options{Snap: DefaultSnap} }

// Result is an imported site.
type Result struct {
	Scenario engine.Scenario
	Site     *engine.Site // Scenario validated by engine.NewSite
	// Messages say what the import decided: coordinate system, start,
	// corridors closed to break loops, pieces dropped.
	Messages []string
	// Closed lists the corridors (indices into Scenario.Corridors) that the
	// import closed to break loops (not those closed in the source).
	Closed []int
	// DroppedNodes and DroppedCorridors count what Options.Largest dropped.
	DroppedNodes, DroppedCorridors int
}

// Error is an import error: Where names the feature, line or column, Msg the
// reason. Err is the engine's *engine.FieldError when engine.NewSite refused
// the built scenario, or ErrSeveralPieces.
type Error struct {
	Where string
	Msg   string
	Err   error
}

func (e *Error) Error() string {
	if e.Where == "" {
		return "import: " + e.Msg
	}
	return "import: " + e.Where + ": " + e.Msg
}

// Unwrap returns the engine error, if any.
func (e *Error) Unwrap() error { return e.Err }

// ErrSeveralPieces is wrapped by the error for a network in several
// unconnected pieces (errors.Is), so that a caller can offer
// Options.Largest.
var ErrSeveralPieces = errors.New("the network is in several unconnected pieces")

func errAt(where, format string, args ...any) error {
	return &Error{Where: where, Msg: fmt.Sprintf(format, args...)}
}

// jnode is a junction of the network under construction.
type jnode struct {
	id, label string
	named     bool
	src       [2]float64 // source position (when hasXY)
	xy        [2]float64 // drawing position (when hasXY)
	hasXY     bool
	candidate *bool
	prob      *float64
	start     bool
	where     string // the feature or line that named it
}

// jedge is a corridor of the network under construction.
type jedge struct {
	from, to int
	length   float64
	closed   bool         // closed in the source
	path     [][2]float64 // interior drawing vertices
	where    string       // the feature or line it came from
}

// network is what a reader hands to finish.
type network struct {
	nodes  []jnode
	edges  []jedge
	geo    *engine.GeoRef
	unit   string
	name   string
	agents []engine.Agent
	msgs   []string
	// firstWhere says where the first junction came from, for the default-start message.
	firstWhere string
	// layout: lay out the nodes without coordinates (CSV input).
	layout bool
	// corrCol, nodeCol: CSV column index by name, to name the column of a
	// value engine.NewSite refuses.
	corrCol, nodeCol map[string]int
}

// finish turns a network into a validated scenario: ids for unnamed
// junctions, the start, the pieces (refused, or all but the largest
// dropped), loops broken along a shortest-path tree from the start, then
// engine.NewSite. O(m log n).
func finish(net *network, opt Options) (*Result, error) {
	if len(net.edges) == 0 {
		return nil, errAt("", "empty result: no corridor to import")
	}
	nameNodes(net)
	start, err := pickStart(net, opt)
	if err != nil {
		return nil, err
	}
	res := &Result{}
	if start, err = keepPieces(net, start, opt, res); err != nil {
		return nil, err
	}
	res.Closed = breakLoops(net, start)
	if k := len(res.Closed); k > 0 {
		var b strings.Builder
		fmt.Fprintf(&b, "%d corridor%s closed to break loops (a shortest-path tree from %q stays open):", k, plural(k), net.nodes[start].id)
		for i, e := range res.Closed {
			if i == 100 {
				fmt.Fprintf(&b, " … and %d more (all marked closed in the file)", k-i)
				break
			}
			ed := net.edges[e]
			fmt.Fprintf(&b, " %s-%s (%s)", net.nodes[ed.from].id, net.nodes[ed.to].id, ed.where)
			if i < k-1 && i < 99 {
				b.WriteByte(',')
			}
		}
		net.msgs = append(net.msgs, b.String())
	}
	if net.layout {
		layoutMissing(net, start)
	}
	sc := net.scenario(start)
	site, err := engine.NewSite(sc)
	if err != nil {
		return nil, net.explain(err)
	}
	res.Scenario, res.Site = sc, site
	res.Messages = net.msgs
	return res, nil
}

func plural(k int) string {
	if k == 1 {
		return ""
	}
	return "s"
}

// nameNodes gives unnamed junctions the ids j1, j2, … in junction order,
// skipping ids that Points or tables use.
func nameNodes(net *network) {
	used := make(map[string]bool, len(net.nodes))
	for _, n := range net.nodes {
		if n.named {
			used[n.id] = true
		}
	}
	k := 0
	for i := range net.nodes {
		if net.nodes[i].named {
			continue
		}
		for {
			k++
			id := "j" + strconv.Itoa(k)
			if !used[id] {
				net.nodes[i].id = id
				break
			}
		}
	}
}

func pickStart(net *network, opt Options) (int, error) {
	switch {
	case opt.Start != "":
		for i, n := range net.nodes {
			if n.id == opt.Start {
				return i, nil
			}
		}
		byLabel := -1
		for i, n := range net.nodes {
			if n.label == opt.Start {
				if byLabel >= 0 {
					return -1, errAt("start", "%q: two nodes have this label (%q and %q): name the start by id", opt.Start, net.nodes[byLabel].id, n.id)
				}
				byLabel = i
			}
		}
		if byLabel >= 0 {
			return byLabel, nil
		}
		return -1, errAt("start", "%q: unknown start name: no Point, table row or junction has this id or label", opt.Start)
	case opt.StartNear != nil:
		p := *opt.StartNear
		if !finite(p[0]) || !finite(p[1]) {
			return -1, errAt("start-near", "%g,%g: not finite", p[0], p[1])
		}
		x, y := p[0], p[1]
		if net.geo != nil {
			x, y = net.geo.ToDrawing(p[0], p[1])
		}
		best, bd := -1, math.Inf(1)
		for i, n := range net.nodes {
			if !n.hasXY {
				continue
			}
			if d := math.Hypot(n.xy[0]-x, n.xy[1]-y); d < bd {
				best, bd = i, d
			}
		}
		if best < 0 {
			return -1, errAt("start-near", "no junction has coordinates")
		}
		net.msgs = append(net.msgs, fmt.Sprintf("start: %q, the junction nearest to %g,%g (%.3g %s away)", net.nodes[best].id, p[0], p[1], bd, net.unitName()))
		return best, nil
	}
	for i, n := range net.nodes {
		if n.start {
			return i, nil
		}
	}
	net.msgs = append(net.msgs, fmt.Sprintf("start: %q, the first junction of %s (choose another with --start NAME or --start-near X,Y)", net.nodes[0].id, net.firstWhere))
	return 0, nil
}

func (net *network) unitName() string {
	if net.unit == "" {
		return "m"
	}
	return net.unit
}

// piece is a connected part of the network over the open corridors.
type piece struct {
	nodes, edges int
	length       float64
	first        int // lowest node index
}

// keepPieces refuses a network in several pieces (over corridors not closed
// in the source), or with opt.Largest keeps the largest by total length. It
// returns the start's new index.
func keepPieces(net *network, start int, opt Options, res *Result) (int, error) {
	n := len(net.nodes)
	uf := newUF(n)
	for _, e := range net.edges {
		if !e.closed {
			uf.union(e.from, e.to)
		}
	}
	byRoot := map[int]int{}
	var pieces []piece
	comp := make([]int, n)
	for v := 0; v < n; v++ {
		r := uf.find(v)
		k, ok := byRoot[r]
		if !ok {
			k = len(pieces)
			byRoot[r] = k
			pieces = append(pieces, piece{first: v})
		}
		comp[v] = k
		pieces[k].nodes++
	}
	if len(pieces) == 1 {
		return start, nil
	}
	for _, e := range net.edges {
		if !e.closed {
			pieces[comp[e.from]].edges++
			pieces[comp[e.from]].length += e.length
		}
	}
	order := make([]int, len(pieces))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool {
		pa, pb := pieces[order[a]], pieces[order[b]]
		if pa.length != pb.length {
			return pa.length > pb.length
		}
		return pa.nodes > pb.nodes
	})
	describe := func(k int) string {
		p := pieces[k]
		nd := net.nodes[p.first]
		s := fmt.Sprintf("%d junction%s, %d corridor%s, %.6g %s (has %q", p.nodes, plural(p.nodes), p.edges, plural(p.edges), p.length, net.unitName(), nd.id)
		if nd.where != "" {
			s += " of " + nd.where
		}
		if p.edges == 0 {
			s += ", reached only through closed corridors or none"
		}
		return s + ")"
	}
	list := func(ks []int) string {
		parts := make([]string, 0, len(ks))
		for i, k := range ks {
			if i == 20 {
				parts = append(parts, fmt.Sprintf("… and %d more", len(ks)-i))
				break
			}
			parts = append(parts, describe(k))
		}
		return strings.Join(parts, "; ")
	}
	if !opt.Largest {
		hint := ""
		if net.geo != nil {
			hint = " (a larger --snap may)"
		}
		return -1, &Error{Msg: fmt.Sprintf("the network is in %d unconnected pieces: %s. Join them%s, or keep the largest with --largest", len(pieces), list(order), hint), Err: ErrSeveralPieces}
	}
	keep := order[0]
	if comp[start] != keep {
		if opt.Start != "" || opt.StartNear != nil || net.nodes[start].start {
			return -1, errAt("start", "%q is not in the largest piece (%s), which --largest keeps", net.nodes[start].id, describe(keep))
		}
		start = pieces[keep].first
		net.msgs = append(net.msgs, fmt.Sprintf("start: %q, the first junction of the largest piece", net.nodes[start].id))
	}
	// drop the other pieces
	newIdx := make([]int, n)
	var nodes []jnode
	for v := 0; v < n; v++ {
		if comp[v] == keep {
			newIdx[v] = len(nodes)
			nodes = append(nodes, net.nodes[v])
		} else {
			newIdx[v] = -1
		}
	}
	var edges []jedge
	for _, e := range net.edges {
		if comp[e.from] == keep && comp[e.to] == keep {
			e.from, e.to = newIdx[e.from], newIdx[e.to]
			edges = append(edges, e)
		}
	}
	res.DroppedNodes = n - len(nodes)
	res.DroppedCorridors = len(net.edges) - len(edges)
	net.msgs = append(net.msgs, fmt.Sprintf("kept the largest of %d pieces (%s); dropped %d junctions and %d corridors: %s",
		len(pieces), describe(keep), res.DroppedNodes, res.DroppedCorridors, list(order[1:])))
	net.nodes, net.edges = nodes, edges
	return newIdx[start], nil
}

// breakLoops keeps a shortest-path tree from start over the corridors not
// closed in the source (Dijkstra; ties go to the corridor met first) and
// closes every other corridor. It returns the closed corridors' indices.
// O(m log n).
func breakLoops(net *network, start int) []int {
	n := len(net.nodes)
	type arc struct{ to, e int }
	adj := make([][]arc, n)
	for i, e := range net.edges {
		if e.closed {
			continue
		}
		adj[e.from] = append(adj[e.from], arc{e.to, i})
		adj[e.to] = append(adj[e.to], arc{e.from, i})
	}
	dist := make([]float64, n)
	via := make([]int, n)
	for i := range dist {
		dist[i], via[i] = math.Inf(1), -1
	}
	dist[start] = 0
	pq := &distHeap{{start, 0}}
	done := make([]bool, n)
	for pq.Len() > 0 {
		it := heap.Pop(pq).(distItem)
		if done[it.v] {
			continue
		}
		done[it.v] = true
		for _, a := range adj[it.v] {
			if d := it.d + net.edges[a.e].length; d < dist[a.to] {
				dist[a.to], via[a.to] = d, a.e
				heap.Push(pq, distItem{a.to, d})
			}
		}
	}
	inTree := make([]bool, len(net.edges))
	for _, e := range via {
		if e >= 0 {
			inTree[e] = true
		}
	}
	var closed []int
	for i := range net.edges {
		if !net.edges[i].closed && !inTree[i] {
			net.edges[i].closed = true
			closed = append(closed, i)
		}
	}
	return closed
}

type distItem struct {
	v int
	d float64
}

type distHeap []distItem

func (h distHeap) Len() int           { return len(h) }
func (h distHeap) Less(i, j int) bool { return h[i].d < h[j].d }
func (h distHeap) Swap(i, j int)      { h[i], h[j] = h[j], h[i] }
func (h *distHeap) Push(x any)        { *h = append(*h, x.(distItem)) }
func (h *distHeap) Pop() any {
	old := *h
	it := old[len(old)-1]
	*h = old[:len(old)-1]
	return it
}

// scenario builds the engine scenario: candidates default to every node but
// the start (FORMATS.md), unless a Point or table row says otherwise.
func (net *network) scenario(start int) engine.Scenario {
	sc := engine.Scenario{
		Name: net.name, Unit: net.unitName(), Start: net.nodes[start].id,
		Agents: net.agents, GeoRef: net.geo,
		Nodes:     make([]engine.Node, len(net.nodes)),
		Corridors: make([]engine.Corridor, len(net.edges)),
	}
	if len(sc.Agents) == 0 {
		sc.Agents = engine.DefaultAgents()
	}
	for i, n := range net.nodes {
		nd := engine.Node{ID: n.id, Label: n.label, Candidate: i != start}
		if n.hasXY {
			nd.X, nd.Y, nd.HasXY = n.xy[0], n.xy[1], true
		}
		if n.candidate != nil {
			nd.Candidate = *n.candidate
		}
		if n.prob != nil {
			nd.Probability, nd.HasProbability = *n.prob, true
		}
		sc.Nodes[i] = nd
	}
	for i, e := range net.edges {
		sc.Corridors[i] = engine.Corridor{From: net.nodes[e.from].id, To: net.nodes[e.to].id, Length: e.length, Closed: e.closed, Path: e.path}
	}
	return sc
}

var fieldIndex = regexp.MustCompile(`^(nodes|corridors)\[(\d+)\]`)

// explain wraps an engine error, saying which feature or line the named
// node or corridor came from.
func (net *network) explain(err error) error {
	var fe *engine.FieldError
	if !errors.As(err, &fe) {
		return &Error{Msg: err.Error(), Err: err}
	}
	msg := fe.Field + ": "
	if fe.Value != "" {
		msg += fe.Value + ": "
	}
	msg += fe.Msg
	where := ""
	if m := fieldIndex.FindStringSubmatch(fe.Field); m != nil {
		k, _ := strconv.Atoi(m[2])
		cols := net.corrCol
		if m[1] == "nodes" && k < len(net.nodes) {
			where, cols = net.nodes[k].where, net.nodeCol
		} else if m[1] == "corridors" && k < len(net.edges) {
			where = net.edges[k].where
		}
		name := strings.TrimPrefix(fe.Field[len(m[0]):], ".")
		if c, ok := cols[name]; ok && where != "" {
			where += fmt.Sprintf(", column %d (%s)", c+1, name)
		}
	}
	return &Error{Where: where, Msg: "the built site is invalid: " + msg, Err: err}
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

type uf struct{ p []int }

func newUF(n int) *uf {
	u := &uf{p: make([]int, n)}
	for i := range u.p {
		u.p[i] = i
	}
	return u
}

func (u *uf) find(x int) int {
	for u.p[x] != x {
		u.p[x] = u.p[u.p[x]]
		x = u.p[x]
	}
	return x
}

func (u *uf) union(a, b int) bool {
	a, b = u.find(a), u.find(b)
	if a == b {
		return false
	}
	if a < b {
		a, b = b, a
	}
	u.p[a] = b
	return true
}
