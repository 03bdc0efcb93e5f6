package report

import (
	"fmt"

	"biasbin/picker"
)

// RankingNote says in words how far the order of a pick's builds is
// proven (picker.Ranking).
func RankingNote(r picker.Ranking) string {
	if r.Stopped {
		return fmt.Sprintf("the search stopped at its %g s time limit: these are the best builds it found, not proven the best of the stock (--time-limit 0 searches to the end)", r.TimeLimit.Seconds())
	}
	if r.Proven {
		return fmt.Sprintf("proven: no build of the stock ranks above a listed one (%s ranked by their yield)", plural(r.Ranked, "build"))
	}
	return fmt.Sprintf("proven among the %s ranked by their yield, not against every build of the stock (--settle searches on until it is)", plural(r.Ranked, "build"))
}

// plural is n with the noun, in the plural unless n is 1.
func plural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
