package job

import "biasbin/solver"

// Node is a point of the stage a technician measures to ground.
type Node int

// The test points, in the order they are measured.
const (
	NodeB Node = iota + 1 // the base, VB
	NodeE                 // the emitter, VE
	NodeC                 // the collector, VC
)

// String returns the node's lower-case name: "vb", "ve" or "vc".
func (n Node) String() string {
	switch n {
	case NodeB:
		return "vb"
	case NodeE:
		return "ve"
	case NodeC:
		return "vc"
	}
	return "node?"
}

// TestPoint is a node voltage to ground at the nominal point with the band
// the worst-case corners span (signed, as a meter reads it).
type TestPoint struct {
	Node      Node
	Nominal_V float64
	// Min_V and Max_V are the band over the corners; both equal
	// Nominal_V when HaveBand is false (the corners were not solved).
	Min_V, Max_V float64
	HaveBand     bool
}

// TestPoints lists VB, VE and VC at op with their bands over the corners
// of wc (nil, or no corner solved: the nominal value alone).
func TestPoints(op solver.OperatingPoint, wc *solver.WorstCase) []TestPoint {
	tps := []TestPoint{
		{Node: NodeB, Nominal_V: op.VB_V, Min_V: op.VB_V, Max_V: op.VB_V},
		{Node: NodeE, Nominal_V: op.VE_V, Min_V: op.VE_V, Max_V: op.VE_V},
		{Node: NodeC, Nominal_V: op.VC_V, Min_V: op.VC_V, Max_V: op.VC_V},
	}
	if wc == nil || wc.Count == 0 {
		return tps
	}
	tps[0].Min_V, tps[0].Max_V = wc.VBMin_V, wc.VBMax_V
	tps[1].Min_V, tps[1].Max_V = wc.VEMin_V, wc.VEMax_V
	tps[2].Min_V, tps[2].Max_V = wc.VCMin_V, wc.VCMax_V
	for i := range tps {
		tps[i].HaveBand = true
	}
	return tps
}
