package pickcmd

import (
	"fmt"
	"io"
	"slices"
	"strings"

	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver/notation"
)

// WriteText writes the readable result: the request, each build, and the
// pull list of the best build that fits. When nothing fits the builds shown
// are the nearest ones: each with the limit it breaks, or, when the stock
// runs short for the run, the best builds for the boards it does supply.
func WriteText(w io.Writer, v *job.PickOutcome, st Style) {
	switch {
	case v.StoppedUnfit():
		fmt.Fprintf(w, "%s the search stopped at its %g s time limit before it found one; the nearest builds it found are listed below (--time-limit 0 searches to the end).\n",
			st.mark("NO FITTING BUILD FOUND:"), v.Result.Ranking.TimeLimit.Seconds())
	case v.Short():
		fmt.Fprintf(w, "%s the stock on hand builds at most %d.\n", st.mark(fmt.Sprintf("NOTHING FITS %d BOARDS:", v.Boards)), v.Buildable)
	case !v.Fits && v.Passing():
		fmt.Fprintf(w, "%s the nearest are listed below, off target, with no pull list.\n",
			st.mark(fmt.Sprintf("NO BUILD REACHES THE TARGET (IC %s):", notation.FormatCurrent(v.Request.IC_A))))
	case !v.Fits && len(v.Builds) > 0:
		fmt.Fprintf(w, "%s the nearest builds are listed below, each with the limit it breaks.\n", st.mark("NOTHING FITS:"))
	case !v.Fits:
		fmt.Fprintln(w, st.mark("NOTHING FITS."))
	}
	writeHeader(w, v)
	if len(v.Builds) == 0 {
		fmt.Fprintln(w, "\nno build to show")
		return
	}
	if v.Short() {
		fmt.Fprintf(w, "\nThe best builds for %d boards (the pull list counts what all %d take):\n", v.Buildable, v.Boards)
	}
	several := v.Request.Topology == picker.AnyTopology
	for _, b := range v.Builds {
		writeCandidate(w, b, several, st)
	}
	if len(v.Result.Rivals) > 0 {
		writeRivals(w, v.Builds[0], v.Result.Rivals)
	}
	for _, b := range v.Builds {
		if b.FitsTarget() || (v.Short() && b.Fits()) {
			writePullList(w, v, b, st)
			break
		}
	}
}

// WriteNotes writes the shortfall explanation, the parts to buy and the
// hot-part cautions on stderr.
func WriteNotes(w io.Writer, v *job.PickOutcome) {
	var reasons, buy, rejected []string
	if s := v.Result.Shortfall; s != nil {
		reasons = report.Words(s.Reasons, report.Reason)
		if !sameTopUp(s.Purchases, v.TopUp) {
			buy = report.Words(s.Purchases, report.Purchase)
		}
		rejected = report.Words(s.Rejected, report.Rejection)
	}
	switch {
	case v.StoppedUnfit():
		fmt.Fprintf(w, "no fitting build found before the %g s time limit (not proven that none exists):\n", v.Result.Ranking.TimeLimit.Seconds())
		if len(reasons)+len(rejected) == 0 {
			fmt.Fprintln(w, "  - no build found passes every limit")
		}
	case !v.Fits:
		fmt.Fprintln(w, "nothing fits this request:")
		if len(reasons)+len(rejected) == 0 {
			fmt.Fprintln(w, "  - no build passes every limit")
		}
	case len(reasons)+len(buy) > 0:
		fmt.Fprintln(w, "note: the stock limits this search:")
	}
	for _, r := range reasons {
		fmt.Fprintf(w, "  - %s\n", r)
	}
	if !v.Fits || len(reasons)+len(buy) > 0 {
		for _, r := range rejected {
			fmt.Fprintf(w, "  - left out: %s\n", r)
		}
	}
	topUp := v.TopUp
	if len(buy)+len(topUp) > 0 {
		// The purchase and the top-up are two ways to a good build: buy
		// the one or the other, not both.
		either := len(buy) > 0 && len(topUp) > 0
		if either {
			fmt.Fprintln(w, "parts to buy for a good build, either these (all of them):")
		} else {
			fmt.Fprintln(w, "parts to buy for a good build (all of them):")
		}
		for _, b := range buy {
			fmt.Fprintf(w, "  - %s\n", b)
		}
		if either {
			fmt.Fprintln(w, "or these, to make build #1 on all the boards:")
		}
		for _, p := range topUp {
			fmt.Fprintf(w, "  - %d × %s for build #1 on all %d boards (bin %s #%d holds %d of the %d it takes)\n",
				p.Missing(), pullValue(p), v.Boards, binName(p.Bin), p.ID, p.OnHand, p.Qty)
		}
	}
	if s := v.Result.Shortfall; s != nil && len(s.Unapproved) > 0 {
		fmt.Fprintf(w, "not on the approved list (parts tagged %s), so not to buy for this run; these would give a good build once added to it (all of them):\n",
			strings.Join(v.Request.RequireTags, " and "))
		for _, b := range report.Words(s.Unapproved, report.Purchase) {
			fmt.Fprintf(w, "  - %s\n", b)
		}
	}
	if !v.Fits {
		if v.Short() {
			fmt.Fprintf(w, "the stock on hand builds %d of the %d boards; the best builds for %d are listed on stdout\n",
				v.Buildable, v.Boards, v.Buildable)
		} else if v.Passing() {
			fmt.Fprintln(w, "the nearest builds are listed on stdout: they keep every limit but miss the target")
		} else if len(v.Result.Candidates) > 0 {
			fmt.Fprintln(w, "the nearest builds are listed on stdout, each with the limit it breaks")
		} else {
			fmt.Fprintln(w, "no build came near enough to show")
		}
	}
	for _, c := range v.Cautions {
		fmt.Fprintf(w, "caution: %s\n", report.JobCaution(c))
	}
}

// sameTopUp reports whether the purchases are top-ups of exactly the lines
// and counts the first build's top-up lists, so that the notes say it once.
func sameTopUp(buy []picker.Purchase, topUp []job.PullLine) bool {
	if len(buy) == 0 || len(buy) != len(topUp) {
		return false
	}
	for _, b := range buy {
		if b.Line == 0 || !slices.ContainsFunc(topUp, func(p job.PullLine) bool { return p.ID == b.Line && p.Missing() == b.Qty }) {
			return false
		}
	}
	return true
}
