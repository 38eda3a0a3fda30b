package engine

// Internal names that the external tests (package engine_test) check.
var LB3 = lb3

const (
	LB3MaxNodes = lb3MaxNodes
	LB3Above    = lb3Above
)

// LB2FinishFallback is the finish-aware pairwise bound's fallback above LB2PairCap.
func LB2FinishFallback(s *Site) float64 {
	return lb2FinishFallback(s, ComputeBounds(s), max(s.Speed[0], s.Speed[1]))
}
