package job

import (
	"slices"

	"biasbin/picker"
	"biasbin/solver/safety"
)

// Search runs one search of the stock (picker.Pick outside tests).
type Search func(picker.Stock, picker.Request) (picker.Result, error)

// Build is one build shown to the technician: the ranked candidate with
// its test points and its pull list for the run.
type Build struct {
	picker.Candidate
	// TestPoints are VB, VE and VC with their worst-case bands.
	TestPoints []TestPoint
	// Pull is what the run takes from each stock line.
	Pull []PullLine
	// Safety lists the build's hard limits and cautions, as Check lists
	// them for one build (solver/safety).
	Safety []safety.Caution
}

// Fits reports whether the build passes every hard limit.
func (b Build) Fits() bool { return len(b.Failing) == 0 }

// FitsTarget reports whether the build passes every hard limit with its
// nominal point on target: a build to make.
func (b Build) FitsTarget() bool { return b.Fits() && b.OnTarget }

// PickOutcome is one pick: the builds to show and what explains them.
type PickOutcome struct {
	// Request is the request as asked, its Rail settled
	// (picker.Request.SettledRail).
	Request picker.Request
	// Boards is the number of boards the request builds (at least one).
	Boards int
	// Result is the search as asked.
	Result picker.Result
	// Fits reports whether at least one build passes every hard limit
	// with its nominal point on target, for Boards.
	Fits bool
	// Buildable is, when nothing fits and the stock runs short for the
	// run, the most boards it does supply (0 when not even one, or when
	// quantities are not the problem); Fewer is the search for that many.
	Buildable int
	Fewer     picker.Result
	// Builds are the builds to show: the search's own, or, when the stock
	// runs short, the best builds for the Buildable boards, each with the
	// pull list for all Boards.
	Builds []Build
	// TopUp is, when the stock runs short, what the first shown build
	// takes beyond the stock on hand for all Boards, most missing first.
	TopUp []PullLine
	// Cautions are the hazards of the request and the shown builds.
	Cautions []Caution
}

// Short reports whether the stock runs short for the run but builds a
// smaller one.
func (o *PickOutcome) Short() bool { return !o.Fits && o.Buildable > 0 }

// StoppedUnfit reports that no listed build fits and the search stopped
// at its time limit: none was found in the time, which does not show that
// none exists.
func (o *PickOutcome) StoppedUnfit() bool { return !o.Fits && o.Result.Ranking.Stopped }

// Shown is the search whose builds are shown: Fewer when the stock runs
// short, else Result.
func (o *PickOutcome) Shown() picker.Result {
	if o.Short() {
		return o.Fewer
	}
	return o.Result
}

// Pick searches stock for req with search and assembles what a front end
// shows. When nothing fits a run of several boards, it also finds how many
// boards the stock does build and shows the builds for that many. Errors
// are the search's own (picker.Pick: a *picker.StockGapError when a kind
// of part is missing altogether, a *picker.InputError for a request it
// refuses).
func Pick(stock picker.Stock, req picker.Request, search Search) (*PickOutcome, error) {
	if err := picker.CheckStock(stock, req); err != nil {
		return nil, err // before any search (and any progress shown)
	}
	res, err := search(stock, req)
	if err != nil {
		return nil, err
	}
	if req.Rail, err = req.SettledRail(); err != nil {
		return nil, err
	}
	o := &PickOutcome{Request: req, Boards: max(1, req.Boards), Result: res, Fits: fits(res)}
	if !o.Fits && req.Boards > 1 {
		// Perhaps the run is too large for the stock: find how many
		// boards the parts on hand do build, and show those builds as
		// the nearest.
		if o.Buildable, o.Fewer, err = fewerBoards(search, stock, req); err != nil {
			return nil, err
		}
	}
	for _, c := range o.Shown().Candidates {
		wc := c.Worst
		o.Builds = append(o.Builds, Build{Candidate: c, TestPoints: TestPoints(c.Nominal, &wc), Pull: PullList(c, stock, o.Boards),
			Safety: safety.Assess(safety.Input{Build: c.Build, Nominal: c.Nominal, Worst: &wc, Limits: req.Limits})})
	}
	if o.Short() && len(o.Builds) > 0 {
		o.TopUp = ShortLines(o.Builds[0].Pull)
	}
	o.Cautions = o.cautions()
	return o, nil
}

// fits reports whether at least one build of res passes every hard limit
// with its nominal point on target.
func fits(res picker.Result) bool {
	return slices.ContainsFunc(res.Candidates, func(c picker.Candidate) bool { return len(c.Failing) == 0 && c.OnTarget })
}

// Passing reports whether some shown build passes every hard limit, on
// target or not: when nothing fits, the nearest builds are then off target.
func (o *PickOutcome) Passing() bool {
	return slices.ContainsFunc(o.Builds, func(b Build) bool { return b.Fits() })
}

// fewerBoards finds the largest number of boards below req.Boards that the
// stock builds (fewer boards only loosen the quantity limits, so a binary
// search is exact) and returns it with that search's result; 0 when not
// even one board can be built.
func fewerBoards(search Search, st picker.Stock, req picker.Request) (int, picker.Result, error) {
	try := func(boards int) (picker.Result, bool, error) {
		r := req
		r.Boards = boards
		res, err := search(st, r)
		return res, fits(res), err
	}
	// One board first: when even that fails, quantities are not the
	// problem and one search settles it.
	best, ok, err := try(1)
	if err != nil || !ok {
		return 0, picker.Result{}, err
	}
	lo, hi := 1, req.Boards-1 // lo builds, hi+1 does not
	for lo < hi {
		mid := (lo + hi + 1) / 2
		res, ok, err := try(mid)
		if err != nil {
			return 0, picker.Result{}, err
		}
		if ok {
			lo, best = mid, res
		} else {
			hi = mid - 1
		}
	}
	return lo, best, nil
}

// cautions lists the hazards of a pick: a supply above the
// extra-low-voltage boundary, or a shown passing build running a part
// near its design limit.
func (o *PickOutcome) cautions() []Caution {
	var out []Caution
	supply := false
	for _, b := range o.Builds {
		hot := 0.0
		for _, c := range b.Safety {
			switch c.Kind {
			case safety.AboveTouchVoltage, safety.AboveELV:
				if !supply {
					supply = true
					out = append([]Caution{{Kind: CautionSupply, Value: c.Supply_V, Limit: c.Limit_V}}, out...)
				}
			case safety.NearDesignLimit:
				hot = max(hot, c.Use)
			}
		}
		if hot > 0 && b.Fits() {
			out = append(out, Caution{Kind: CautionHotPart, Build: b.Rank, Utilization: hot})
		}
	}
	return out
}
