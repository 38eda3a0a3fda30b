package engine

// Internal names that the external tests (package engine_test) check.
var LB3 = lb3

const (
	LB3MaxNodes = lb3MaxNodes
	LB3Above    = lb3Above
)
