package report

import (
	"slices"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
)

// Ranges writes accepted ranges for --help: one line per quantity with its
// span, and its reason indented below.
func Ranges(rs []solver.Range) string {
	var b strings.Builder
	b.WriteString("Accepted ranges (anything outside is refused, exit 2):")
	for _, r := range rs {
		b.WriteString("\n  " + r.Quantity + ": " + r.Span())
		line := "     "
		for _, w := range strings.Fields(r.Why) {
			if len(line)+1+len(w) > 78 {
				b.WriteString("\n" + line)
				line = "     "
			}
			line += " " + w
		}
		b.WriteString("\n" + line)
	}
	return b.String()
}

// RangesMarkdown writes accepted ranges as the README's table.
func RangesMarkdown(rs []solver.Range) string {
	var b strings.Builder
	b.WriteString("| input | quantity | accepted | why |\n|---|---|---|---|\n")
	for _, r := range rs {
		b.WriteString("| `" + r.Field + "` | " + r.Quantity + " | " + r.Span() + " | " + r.Why + " |\n")
	}
	return b.String()
}

// AllRanges lists every accepted range of the program: the solver's for a
// stage and its parts, then the picker's for a pick request.
func AllRanges() []solver.Range {
	out := solver.Ranges()
	for _, r := range picker.RequestRanges() {
		if !slices.ContainsFunc(out, func(o solver.Range) bool { return o.Field == r.Field }) {
			out = append(out, r)
		}
	}
	return out
}
