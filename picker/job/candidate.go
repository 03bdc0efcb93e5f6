package job

import "biasbin/picker"

// CandidateRequest is the analysis request that reproduces a picked
// build's own figures: its build, the yield window it was judged against
// (the pick's rule around the pick's design point), and its Monte Carlo's
// size and seed, so Check on it counts the same boards passing as the
// pick did.
func CandidateRequest(c picker.Candidate) CheckRequest {
	w := c.Window
	return CheckRequest{
		Build:       c.Build,
		Label:       c.Transistor.Sheet.Label,
		Window:      w.Rule,
		TargetIC_A:  w.Centre.IC_A,
		TargetVCE_V: w.Centre.VCE_V,
		Boards:      c.Yield.Boards,
		Seed:        c.Yield.Seed,
	}
}
