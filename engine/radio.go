package engine

// radio is global communication (MODEL.md §3): the moment the finder reaches
// x, the partner learns it and walks the shortest path from where it is.
type radio struct{}

func (radio) rendezvous() bool { return false }

func (radio) instant() bool { return true }

// tell: evac(x) = t + d(π(t), x)/sp. With a hint the partner's position is
// found by a forward scan from the previous answer (times never go down);
// without one by binary search.
func (radio) tell(s *Site, partner *Trajectory, x int, t, _, sp float64, hint *int) telling {
	var pos Point
	if hint != nil {
		pos, *hint = partner.positionFrom(t, *hint)
	} else {
		pos = partner.PositionAt(t)
	}
	return telling{at: t, where: pos, evac: t + s.NodeDist(pos, x)/sp}
}
