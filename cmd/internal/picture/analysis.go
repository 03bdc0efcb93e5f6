package picture

import "biasbin/picker/job"

// FromAnalysis is the picture subject of one analysed build (job.Check,
// run with KeepBoards for the Monte Carlo cloud).
func FromAnalysis(a *job.Analysis) Subject {
	b := a.Request.Build
	s := Subject{
		Name:     BuildName(b, a.Request.Label),
		Build:    b,
		Nominal:  a.Nominal,
		VCESat_V: a.VCESat_V,
		Swing:    a.Swing,
		Window:   a.Window.Window,
		Yield:    a.Yield,
	}
	if a.Worst != nil {
		s.Corners = a.Worst.Corners
	}
	return s
}
