package picker

import (
	"time"

	"biasbin/solver"
)

// Resistor is one stocked resistor line as the picker sees it.
type Resistor struct {
	ID          int64
	Ohm         float64
	Tol         float64 // fraction
	TCR_PPMPerK float64
	Rated_W     float64
	Knee_C      float64
	Max_C       float64
	// LEV_V is the limiting element voltage the line states; 0 = the
	// default by power rating (solver.DefaultLEV_V).
	LEV_V float64
	Qty   int
	Bin   string
	Tags  []string
}

// Transistor is one stocked transistor line.
type Transistor struct {
	ID    int64
	Qty   int
	Bin   string
	Tags  []string
	Sheet solver.Datasheet
}

// Stock is everything the search may draw on.
type Stock struct {
	Resistors   []Resistor
	Transistors []Transistor
}

// Weights are the ranking weights; the zero value means the documented
// defaults (a negative weight is an error).
type Weights struct {
	QPoint      float64
	Emitter     float64
	Beta        float64
	Headroom    float64
	Utilization float64
	Yield       float64
	// Parts weighs the extra placement each pair costs (Terms.Parts).
	Parts float64
}

// Request is what the technician asks for. The zero value of each optional
// field means its documented default.
type Request struct {
	Topology solver.Topology // 0 = divider; AnyTopology = every topology on one scale
	Polarity solver.Polarity
	VCC_V    float64 // signed (negative for PNP)
	// VEE_V is the emitter rail of the split-supply stage, signed opposite
	// to VCC_V (negative for NPN, positive for PNP), with the tolerance
	// VEETol. Required for split supply; with AnyTopology, split-supply builds
	// are searched only when it is given.
	VEE_V float64
	// Rail is how a single-supply stage is built against its 0 V: the
	// zero value and solver.PositiveRail are the usual build (a PNP stage
	// with its emitter side to +V and its collector side to 0 V),
	// solver.NegativeRail puts a PNP stage's emitter side on 0 V. Each
	// build's Ground follows from it (solver.GroundOf); a split-supply
	// build is measured from the common of its two supplies.
	Rail   solver.RailSign
	VCCTol float64
	// VEETol is the emitter rail's own tolerance (split supply), a
	// fraction; 0 = VCCTol. The rails are two supplies: the worst case and
	// the yield vary each on its own.
	VEETol float64
	IC_A   float64 // target collector current
	VCE_V  float64 // target VCE magnitude; 0 = the maximum-symmetrical-swing rule
	// VEMin_V and VEMax_V bound the emitter voltage magnitude the emitter
	// term aims at; both 0 = DefaultVEMinFrac..DefaultVEMaxFrac of |VCC|.
	VEMin_V      float64
	VEMax_V      float64
	AmbientMin_C float64
	AmbientMax_C float64 // both 0 = 0..50 °C
	Boards       int     // 0 = 1
	RL_Ohm       float64
	Bypass       bool       // RE fully bypassed for AC
	Window       WindowRule // yield window rule; zero = DefaultWindowRule (±10 % IC, ±20 % VCE around the target)
	Weights      Weights
	Pairs        bool
	RequireTags  []string
	// Transistor, when not "", is the one transistor label the builds may
	// use (letter case aside, ASCII only, as the stock matches labels).
	Transistor string
	// Keep are the resistors on the board the builds keep (a repair), at
	// most one per position; with AnyTopology only the topologies having
	// every kept position are searched.
	Keep       []KeptPart
	Top        int // 0 = 5
	Exhaustive bool
	// Settle searches on until the order of the first Top builds is
	// proven, however many rounds it takes (Result.Ranking); without it
	// the search stops after settleRounds further rounds.
	Settle bool
	// TimeLimit stops the search once it has run this long (0: none): the
	// builds found by then are ranked as usual, and Result.Ranking says
	// the search stopped, so they are not proven the best of the stock.
	TimeLimit   time.Duration
	ShowFailing bool // also list builds that fail a hard limit, with the reason
	// ShowAll lists near-duplicate builds each in its own place; without
	// it only the best of each group of near-duplicates is listed, with
	// the others counted in Candidate.Folded (see fold.go).
	ShowAll bool
	// AllowUnrated lets transistor lines whose ratings that matter for the
	// request are not stated (solver.UnknownRatings) into the search;
	// without it they are left out with the reason. Each build on such a
	// line lists them in Candidate.UnknownRatings.
	AllowUnrated bool
	Seed         uint64 // mixed with each build's key to seed its Monte Carlo yield
	Limits       solver.Limits
	Progress     func(done, total int64) `json:"-"` // optional; called from the search goroutines one call at a time, may be nil
	// Finalists is how many of the best builds by the pre-yield score get
	// a Monte Carlo yield before the final ranking; 0 = 2·Top + 5.
	Finalists int
	// YieldBoards is the Monte Carlo size per finalist; 0 = DefaultYieldBoards.
	YieldBoards int
}

// Part is one physical part drawn from a stock line.
type Part struct {
	ID  int64
	Ohm float64
	Bin string
}

// Position is what fills one resistor position: a single part or a pair.
type Position struct {
	Ohm         float64 // nominal value of the arrangement
	Arrangement string  // "single", "series", "parallel" or "kept" (Kept: on the board, no parts)
	Parts       []Part
	Spec        solver.ResistorSpec
	// Assumed names the figures of a kept part taken at their defaults
	// (AssumedTol, AssumedRating, AssumedTCR); empty for stocked parts.
	Assumed []string
}

// Terms are the score terms of one candidate (each >= 0, lower is better).
type Terms struct {
	QPoint      float64
	Emitter     float64 // VE outside the emitter band, as a share of |VCC|
	Beta        float64
	Headroom    float64
	Utilization float64
	Yield       float64
	// Parts is the number of extra parts the build's pairs add (one per
	// pair): each is one more placement and one more joint.
	Parts float64
}

// Candidate is one ranked build.
type Candidate struct {
	ID         string // stable for the same stock and request
	Topology   solver.Topology
	Rank       int
	Score      float64
	Terms      Terms
	Transistor Transistor
	Positions  map[string]Position // keyed by position name: "r1", "r2", "rc", "re" (divider), "rf", "rc", "re", "rb"
	Build      solver.Build
	Model      solver.Model
	Nominal    solver.OperatingPoint
	Worst      solver.WorstCase
	Yield      solver.YieldResult
	// Window is the yield window the build's Monte Carlo ran against,
	// with its rule and design point (the target IC and the build's VCE
	// target).
	Window          YieldWindow
	BetaSensitivity float64
	MaxUtilization  float64
	Failing         []Failure // the hard limits the build breaks; empty for a good build
	// VCETarget_V is the VCE the Q-point term aimed at: the request's, or
	// this build's maximum-symmetrical-swing VCE.
	VCETarget_V float64
	// UnknownRatings are the transistor's ratings that matter for the
	// request but its line does not state (solver.UnknownRatings); only
	// with Request.AllowUnrated can they be non-empty. Such a build is
	// not known to be safe.
	UnknownRatings []solver.Rating
	// OnTarget is true when the nominal point lies inside the yield window
	// around the target: a build that passes every hard limit and is on
	// target fits the request.
	OnTarget bool
	// Folded counts the near-duplicates of this build left out of the
	// list: the other builds of the stock with the same topology,
	// transistor type and values, differing only in tolerance grade,
	// rating, TCR or stock line (fold.go), whether they pass or not.
	// Always 0 with Request.ShowAll.
	Folded int
}

// Shortfall explains why nothing (or too little) fits, with a suggestion.
type Shortfall struct {
	Reasons []Reason
	// Purchases are the parts to buy for a build that fits (all of them).
	// With RequireTags they are top-ups of approved lines only (each
	// Purchase.Line set).
	Purchases []Purchase
	// Unapproved, with RequireTags only, are parts outside the approved
	// list that would give a build that fits once approved; never to be
	// read as parts to buy for the run.
	Unapproved []Purchase
	// Rejected lists the transistor lines of the polarity left out, each
	// with its reason.
	Rejected []Rejection
}

// Result is the outcome of a search.
type Result struct {
	Candidates []Candidate
	Evaluated  int64 // builds fully evaluated
	Considered int64 // combinations covered (evaluated or pruned); math.MaxInt64 = at least that many
	// Solved counts the nominal level tuples solved (each one exact
	// self-heated operating point), the search's main cost.
	Solved    int64
	Shortfall *Shortfall
	// Rivals, when several topologies were searched, hold the best build
	// of each topology other than the first candidate's.
	Rivals []Rival
	// Ranking says whether the order of the candidates is proven.
	Ranking Ranking
}

// Ranking says how far the order of a pick's candidates is proven. The
// yield term is worked out only for the builds best by the score without
// it, in rounds (doc.go, "Order"); the order is proven once no build left
// out can overtake the last candidate.
type Ranking struct {
	// Proven: no build of the stock can rank above any listed build
	// that it is listed below or not listed at all: the list is the true
	// head of the ranking, whatever Top is.
	Proven bool
	// Ranked counts the builds whose yield was run or bounded.
	Ranked int
	// Rounds counts the searches run (1 when the first settled it).
	Rounds int
	// Stopped: the search stopped at Request.TimeLimit (kept here as
	// TimeLimit) before it had covered the stock, so the listed builds are
	// the best it found, not proven the best of the stock (Proven is
	// false).
	Stopped   bool
	TimeLimit time.Duration
}

// Rival is the best build of one topology set against the first
// candidate of another.
type Rival struct {
	Topology solver.Topology
	// Best is nil when the topology has no build at all.
	Best *Candidate
	// Term is the score term (a Weights field name in lower case:
	// "qpoint", "emitter", "beta", "headroom", "utilization", "yield",
	// "parts") in which Best, weighted, trails the first candidate the
	// most; "" when Best does not trail at all or is missing. Failing is
	// true when Best fails a hard limit (it then ranks below every passing
	// build whatever its score).
	Term    string
	Failing bool
}
