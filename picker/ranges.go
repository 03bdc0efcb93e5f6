package picker

import "biasbin/solver"

// The accepted ranges of a pick request's own quantities; the stage's and
// parts' quantities (supply, resistances, hFE ...) are the solver's
// (solver.Ranges). normalize checks each, so every front end gets the same
// refusal with the range and its reason.
var (
	// ICRange bounds the target collector current.
	ICRange = solver.Range{Field: "ic", Quantity: "target IC", Unit: "A", Min: 100e-9, Max: 10,
		Why: "below 100 nA the leakage ICBO (nanoamperes at 25 °C, doubling every 10 K) is a sizeable part " +
			"of the bias and datasheets give no hFE there; above 10 A is no small-signal bias (common practice)"}
	// BoardsRange bounds the boards to build.
	BoardsRange = solver.Range{Field: "boards", Quantity: "boards", Min: 1, Max: 1_000_000,
		Why: "a million boards is past any parts wall, and keeps every count of parts exact"}
	// TopRange bounds the builds shown.
	TopRange = solver.Range{Field: "top", Quantity: "builds shown", Min: 1, Max: 256,
		Why: "enough to rank every build of four stocked values (4⁴); each shown build gets its own " +
			"Monte Carlo yield, so time and memory grow with it"}
	// FinalistsRange bounds the pool given a Monte Carlo yield.
	FinalistsRange = solver.Range{Field: "finalists", Quantity: "finalists", Min: 1, Max: 2*256 + 5,
		Why: "the default pool for the most builds shown (2·top + 5)"}
)

// RequestRanges lists the pick request's accepted ranges in the order the
// README's table and --help show them.
func RequestRanges() []solver.Range {
	return []solver.Range{ICRange, BoardsRange, TopRange, FinalistsRange, solver.YieldBoardsRange}
}
