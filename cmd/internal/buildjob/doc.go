// Package buildjob holds the jobs of a build — keep a pick's builds,
// reserve the parts of one for a run, show it, record a board's bring-up
// readings with the likely cause of a reading out of band — computed once
// below every front end and handed back as typed data, never English or
// formatting. It sits beside the commands because it needs the stock
// file; the math it uses is the picker's (the re-solve when the stock
// changed since the pick) and solver/fault's (the causes).
//
// A build's plan is kept as JSON in the stock file with the pick (for
// store.PickKeep) and with the build for good: the request, the stage as
// picked, which stock line fills which position, each line's values as
// picked, and the figures and test-point bands it was picked with.
package buildjob
