package picture

import (
	"fmt"
	"math"

	"biasbin/solver"
)

// HistogramBins is the number of equal bins of the IC histogram: about
// √n for a few thousand boards, fine enough to show the shape of the
// spread and coarse enough that every bin holds several boards.
const HistogramBins = 40

// Bin is one bar of the IC histogram: the boards' Q-points with IC in
// [ICMin_A, ICMax_A) (the last bin includes its upper edge), counted by
// the ambient they were solved at.
type Bin struct {
	ICMin_A, ICMax_A   float64
	Cold, Hot, Between int
}

// HistogramChart is the data of the IC histogram of one build.
type HistogramChart struct {
	Title string
	Name  string
	// Bins cover every board's IC, cold and hot ends counted apart.
	Bins []Bin
	// Points is the number of Q-points counted (boards × ambients solved).
	Points int
	// Boards and Passed are the Monte Carlo run's boards and passes.
	Boards, Passed int
	// WindowICMin_A and WindowICMax_A are the yield window's IC bounds
	// (+Inf for no upper bound).
	WindowICMin_A, WindowICMax_A float64
	// WorstICMin_A and WorstICMax_A are the worst-case band of IC over the
	// corners; HasWorst is false when the corners were not solved.
	WorstICMin_A, WorstICMax_A float64
	HasWorst                   bool
	// Nominal_A is the nominal IC.
	Nominal_A float64
	// AmbientMin_C and AmbientMax_C are the ambient range.
	AmbientMin_C, AmbientMax_C float64
	// PNP is set for a PNP build: IC is then a magnitude.
	PNP bool
}

// Histogram builds the IC histogram of s over all its Monte Carlo boards.
func Histogram(s Subject) (HistogramChart, error) {
	y := s.Yield
	if y == nil || len(y.Samples) == 0 {
		return HistogramChart{}, fmt.Errorf("picture: %s: no Monte Carlo boards to count", s.Name)
	}
	w := WindowBox(s.Window)
	h := HistogramChart{
		Title: "IC over the Monte Carlo boards\n" + s.Name, Name: s.Name,
		Boards: y.Boards, Passed: y.Pass,
		WindowICMin_A: w.ICMin_A, WindowICMax_A: w.ICMax_A,
		Nominal_A:    s.Nominal.IC_A,
		AmbientMin_C: s.Build.AmbientMin_C, AmbientMax_C: s.Build.AmbientMax_C,
		PNP: s.Build.Device.Polarity == solver.PNP,
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, b := range y.Samples {
		for _, p := range b.Points {
			lo, hi = math.Min(lo, p.IC_A), math.Max(hi, p.IC_A)
		}
	}
	if len(s.Corners) > 0 {
		h.HasWorst = true
		h.WorstICMin_A, h.WorstICMax_A = math.Inf(1), math.Inf(-1)
		for _, k := range s.Corners {
			h.WorstICMin_A = math.Min(h.WorstICMin_A, k.OP.IC_A)
			h.WorstICMax_A = math.Max(h.WorstICMax_A, k.OP.IC_A)
		}
	}
	if math.IsInf(lo, 1) {
		return HistogramChart{}, fmt.Errorf("picture: %s: no board was solved", s.Name)
	}
	if hi <= lo { // every board at one IC: give the bar a width
		d := math.Max(1e-3*math.Abs(lo), 1e-9)
		lo, hi = lo-d, hi+d
	}
	width := (hi - lo) / HistogramBins
	h.Bins = make([]Bin, HistogramBins)
	for i := range h.Bins {
		h.Bins[i].ICMin_A = lo + float64(i)*width
		h.Bins[i].ICMax_A = lo + float64(i+1)*width
	}
	h.Bins[HistogramBins-1].ICMax_A = hi
	for _, b := range y.Samples {
		for _, p := range b.Points {
			i := min(int((p.IC_A-lo)/width), HistogramBins-1)
			switch ambientEnd(p.Ambient_C, s.Build) {
			case coldEnd:
				h.Bins[i].Cold++
			case hotEnd:
				h.Bins[i].Hot++
			default:
				h.Bins[i].Between++
			}
			h.Points++
		}
	}
	return h, nil
}

// Ends of the ambient range a Q-point can sit at.
const (
	betweenEnds = iota
	coldEnd
	hotEnd
)

// ambientEnd tells which end of b's ambient range t_C is, if either.
func ambientEnd(t_C float64, b solver.Build) int {
	switch {
	case b.AmbientMax_C <= b.AmbientMin_C:
		return betweenEnds
	case t_C == b.AmbientMin_C:
		return coldEnd
	case t_C == b.AmbientMax_C:
		return hotEnd
	}
	return betweenEnds
}
