package job

import "biasbin/picker"

// CandidateRequest is the analysis request that reproduces a picked
// build's own figures: its build, the yield window it was judged against,
// and its Monte Carlo's size and seed, so Check on it counts the same
// boards passing as the pick did.
func CandidateRequest(c picker.Candidate) CheckRequest {
	w := c.Window
	return CheckRequest{
		Build: c.Build,
		Label: c.Transistor.Sheet.Label,
		Window: WindowSpec{
			IC:  Band{Min: w.ICMin_A, Max: w.ICMax_A},
			VCE: Band{Min: w.VCEMin_V, Max: w.VCEMax_V},
		},
		Boards: c.Yield.Boards,
		Seed:   c.Yield.Seed,
	}
}
