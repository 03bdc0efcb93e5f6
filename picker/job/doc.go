// Package job is biasbin's application layer: the jobs a technician runs
// — analyse one build, pick builds from the stock — computed once, below
// every front end (the command line today; a builds ledger, plots, repair
// and a local web page next), and handed back as typed data: figures,
// kinds and stock lines, never English or formatting.
//
// A front end turns its input (flags, a form) into a request, calls one
// function of this package, and renders what comes back:
//
//	Check(CheckRequest) → *Analysis: the nominal point, the worst case
//	    with its corners, the yield, the swing, the dissipation, the
//	    sensitivity, the test points with their bands and the cautions.
//	Pick(Stock, Request, Search) → *PickOutcome: the ranked builds with
//	    their typed failure reasons, each with its test points and its
//	    pull list by stock line for the run, the most boards the stock
//	    supplies when it runs short, the shortfall (what to buy) and the
//	    cautions.
//
// The package knows no database (it sits under picker, which never
// imports store): a front end reads the stock and converts it to
// picker.Stock first (cmd/internal/stockparts on the command line).
package job
