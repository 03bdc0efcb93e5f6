package pickcmd

import (
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// writeHeader writes what was asked and how much was searched.
func writeHeader(w io.Writer, v *job.PickOutcome) {
	r := v.Request
	vce := "VCE by the swing rule"
	if r.VCE_V != 0 {
		vce = "VCE " + quantity(r.VCE_V, "V")
	}
	pairs := "singles only"
	if r.Pairs {
		pairs = "pairs allowed"
	}
	// each rail with its tolerance and the span it moves over (a supply
	// given as a range reads as that range)
	railOf := func(v, t float64) string {
		return quantity(v, "V") + " ±" + strings.TrimSuffix(percent(t), " %") + " % (" + report.SupplyBand(v, t) + ")"
	}
	rails := railOf(solver.GroundOf(r.Polarity, r.Topology, r.Rail).Supply_V(r.VCC_V), r.VCCTol)
	if r.VEE_V != 0 {
		rails += " and VEE " + railOf(r.VEE_V, r.EmitterRailTol())
	}
	stage := r.Topology.String() + " stage"
	if r.Topology == picker.AnyTopology {
		stage = "stage of any topology"
	}
	fmt.Fprintf(w, "%s %s on %s: IC %s, %s, ambient %s..%s °C, %d board%s, %s\n",
		strings.ToUpper(r.Polarity.String()), stage, rails,
		quantity(r.IC_A, "A"), vce, trimNum(r.AmbientMin_C), trimNum(r.AmbientMax_C), v.Boards, plural(v.Boards), pairs)
	rail := report.Rail(r.Polarity, r.Rail)
	if r.Topology == picker.AnyTopology && r.VEE_V != 0 {
		rail += "; split-supply builds read from the common of the two supplies"
	}
	fmt.Fprintf(w, "%s; every voltage against 0 V\n", rail)
	if r.RL_Ohm > 0 || r.Bypass {
		load := "no AC load"
		if r.RL_Ohm > 0 {
			load = "AC load " + notation.FormatResistance(r.RL_Ohm)
		}
		byp := "RE not bypassed"
		if r.Bypass {
			byp = "RE bypassed"
		}
		fmt.Fprintf(w, "%s, %s\n", load, byp)
	}
	if len(r.RequireTags) > 0 {
		fmt.Fprintf(w, "only parts tagged %s\n", strings.Join(r.RequireTags, ", "))
	}
	if len(r.Keep) > 0 {
		var kept []string
		given := true
		var hint picker.KeptPart // the first part with a figure assumed
		for _, k := range r.Keep {
			spec, assumed := k.Spec()
			kept = append(kept, fmt.Sprintf("%s %s (%s)", strings.ToUpper(k.Position), notation.FormatResistance(k.Ohm), keptNote(spec, assumed)))
			if given && (k.Tol == 0 || k.Rated_W == 0) {
				given, hint = false, k
			}
		}
		fmt.Fprintf(w, "keeps on the board, not from stock: %s\n", strings.Join(kept, ", "))
		tcr := fmt.Sprintf("every kept part is taken with TCR %g ppm/K", float64(picker.KeptTCR_PPMPerK))
		if given {
			fmt.Fprintf(w, "    (%s)\n", tcr)
		} else {
			fmt.Fprintf(w, "    (a figure not given is assumed, conservative for a part of unknown make and age: give what you know, e.g. --keep %s=%s/5%%/0.25W; %s)\n",
				hint.Position, notation.FormatResistance(hint.Ohm), tcr)
		}
	}
	mode := "pruned search"
	if r.Exhaustive {
		mode = "exhaustive search"
	}
	st := v.Shown() // the search whose builds are shown
	fmt.Fprintf(w, "%s: %d builds solved in full\n", mode, st.Evaluated)
	if len(st.Candidates) > 0 && !st.Ranking.Proven {
		fmt.Fprintf(w, "order: %s\n", report.RankingNote(st.Ranking))
	}
}

// writeCandidate writes one build as a block: what to pull, the Q-point,
// the worst-case band, the test points, yield and the score terms.
// With several topologies it names the build's.
func writeCandidate(w io.Writer, c job.Build, several bool, st Style) {
	topo := ""
	if several {
		topo = "  " + c.Build.Topology.String()
	}
	fmt.Fprintf(w, "\n#%d  %s%s  score %.3f  (id %s)\n", c.Rank, c.Transistor.Sheet.Label, topo, c.Score, c.ID)
	if c.Folded > 0 {
		fmt.Fprintf(w, "    + %s folded in (the same values with another tolerance grade, rating or drawer; --all lists them)\n",
			nearDuplicates(c.Folded))
	}
	for _, why := range c.Failing {
		fmt.Fprintf(w, "    %s %s\n", st.mark("FAILS:"), report.Failure(why))
	}
	if len(c.UnknownRatings) > 0 {
		fmt.Fprintf(w, "    NOT KNOWN SAFE: the transistor's %s not stated; nothing here says it survives\n", report.RatingList(c.UnknownRatings))
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "    part\tvalue\tjoins\tarrangement\tpull from (bin, stock line)\n")
	joins := map[string]string{}
	for _, j := range job.Joins(c.Build) {
		joins[j.Slot.String()] = report.Join(j)
	}
	for _, slot := range job.Slots(c.Candidate) {
		p := c.Positions[slot]
		var from []string
		for _, part := range p.Parts {
			from = append(from, fmt.Sprintf("bin %s #%d %s", binName(part.Bin), part.ID, notation.FormatResistanceExact(part.Ohm)))
		}
		note := specNote(p.Spec)
		if p.Arrangement == picker.Kept {
			from = []string{"on the board"}
		}
		fmt.Fprintf(tw, "    %s\t%s\t%s\t%s %s\t%s\n", strings.ToUpper(slot), positionCode(p), joins[slot], p.Arrangement, note, strings.Join(from, " + "))
	}
	fmt.Fprintf(tw, "    Q\t%s\t\t%s hFE %s..%s\tbin %s #%d\n", c.Transistor.Sheet.Label, c.Transistor.Sheet.Polarity,
		trimNum(c.Transistor.Sheet.HFEMin), trimNum(c.Transistor.Sheet.HFEMax), binName(c.Transistor.Bin), c.Transistor.ID)
	tw.Flush()

	n := c.Nominal
	fmt.Fprintf(w, "    Q-point   IC %s  VCE %s  IB %s  (β %.0f, Tj %s)\n",
		quantity(n.IC_A, "A"), quantity(n.VCE_V, "V"), quantity(n.IB_A, "A"), betaAt(n), notation.FormatTemperature(n.Tj_C))
	active := "every corner active"
	if !c.Worst.AllActive {
		active = st.mark("NOT every corner active")
	}
	fmt.Fprintf(w, "    worst     IC %s  VCE %s  (%s)\n",
		notation.FormatBand(c.Worst.ICMin_A, c.Worst.ICMax_A, "A"),
		notation.FormatBand(c.Worst.VCEMin_V, c.Worst.VCEMax_V, "V"), active)
	var tps []string
	for _, tp := range c.TestPoints {
		s := fmt.Sprintf("%s %s", strings.ToUpper(tp.Node.String()), quantity(tp.Nominal_V, "V"))
		if tp.HaveBand {
			s += " (" + notation.FormatBand(tp.Min_V, tp.Max_V, "V") + ")"
		}
		tps = append(tps, s)
	}
	fmt.Fprintf(w, "    measure   %s\n", strings.Join(tps, "   "))
	if c.Yield.Boards > 0 {
		fmt.Fprintf(w, "    yield     %s — %s\n", report.Yield(c.Yield), report.YieldBoards(c.Yield, c.Build.AmbientMin_C, c.Build.AmbientMax_C))
		fmt.Fprintf(w, "    window    %s\n", report.Window(c.Window))
	}
	if name, pl := hottest(c); name != "" {
		fmt.Fprintf(w, "    load      hottest %s at %s of its design limit at the worst corner (%s of %s); IC moves %s across the hFE spread\n",
			name, percent(pl.Utilization), quantity(pl.Power_W, "W"), quantity(pl.Allowed_W, "W"), percent(c.BetaSensitivity))
	} else {
		fmt.Fprintf(w, "    load      no part rated; IC moves %s across the hFE spread\n", percent(c.BetaSensitivity))
	}
	for _, k := range c.Safety {
		if !k.Fails {
			fmt.Fprintf(w, "    caution   %s\n", report.Caution(k))
		}
	}
	t := c.Terms
	fmt.Fprintf(w, "    terms     Q-point %.3f  emitter %.3f  beta %.3f  headroom %.3f  utilization %.3f  yield %.3f\n",
		t.QPoint, t.Emitter, t.Beta, t.Headroom, t.Utilization, t.Yield)
	if t.Parts > 0 {
		fmt.Fprintf(w, "              parts %.0f (each pair adds one placement)\n", t.Parts)
	}
}

// topologyName is a requested topology's name, "any" for every one.
func topologyName(t solver.Topology) string {
	if t == picker.AnyTopology {
		return "any"
	}
	return t.String()
}

// termWords names a score term (picker.Rival.Term) on screen.
var termWords = map[string]string{
	"qpoint": "Q-point error", "emitter": "emitter band", "beta": "hFE sensitivity",
	"headroom": "worst-case headroom", "utilization": "part loading", "yield": "yield loss", "parts": "extra parts",
}

// termOf returns the named term of t.
func termOf(t picker.Terms, name string) float64 {
	switch name {
	case "qpoint":
		return t.QPoint
	case "emitter":
		return t.Emitter
	case "beta":
		return t.Beta
	case "headroom":
		return t.Headroom
	case "utilization":
		return t.Utilization
	case "parts":
		return t.Parts
	}
	return t.Yield
}

// writeRivals writes, in one line, why the first build beats the best of
// each other topology searched.
func writeRivals(w io.Writer, first job.Build, rivals []picker.Rival) {
	var parts []string
	for _, r := range rivals {
		switch {
		case r.Best == nil:
			parts = append(parts, fmt.Sprintf("no %s build came out of the stock", r.Topology))
		case r.Failing:
			parts = append(parts, fmt.Sprintf("the best %s build (score %.3f) breaks a hard limit", r.Topology, r.Best.Score))
		case r.Term == "":
			parts = append(parts, fmt.Sprintf("the best %s build scores %.3f", r.Topology, r.Best.Score))
		default:
			parts = append(parts, fmt.Sprintf("the best %s build scores %.3f, mostly on %s (%.3f against %.3f)", r.Topology, r.Best.Score,
				termWords[r.Term], termOf(r.Best.Terms, r.Term), termOf(first.Terms, r.Term)))
		}
	}
	fmt.Fprintf(w, "\nwhy #%d (%s, score %.3f) leads: %s\n", first.Rank, first.Build.Topology, first.Score, strings.Join(parts, "; "))
}

// writePullList writes the best build's parts for the whole run, one line
// per stock line, with what each bin holds.
func writePullList(w io.Writer, v *job.PickOutcome, c job.Build, st Style) {
	fmt.Fprintf(w, "\nPull list for #%d, %d board%s:\n", c.Rank, v.Boards, plural(v.Boards))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "    bin\tline\tpart\ttake\ton hand\n")
	for _, p := range c.Pull {
		short := ""
		if p.Missing() > 0 {
			short = "  " + st.mark(fmt.Sprintf("SHORT by %d", p.Missing()))
		}
		fmt.Fprintf(tw, "    %s\t#%d\t%s\t%d\t%d%s\n", binName(p.Bin), p.ID, pullValue(p), p.Qty, p.OnHand, short)
	}
	tw.Flush()
}

// specNote writes a position's tolerance and rating, e.g. "1 % 0.25 W".
func specNote(s solver.ResistorSpec) string {
	if s.Tol == 0 && s.Rated_W == 0 {
		return ""
	}
	return fmt.Sprintf("%s %s", percent(s.Tol), quantity(s.Rated_W, "W"))
}

// keptNote writes a kept part's tolerance and rating, saying which were
// assumed: "±10 %, 125 mW assumed", "±5 % assumed, 250 mW".
func keptNote(s solver.ResistorSpec, assumed []string) string {
	tol, rating := slices.Contains(assumed, picker.AssumedTol), slices.Contains(assumed, picker.AssumedRating)
	t, p := "±"+percent(s.Tol), quantity(s.Rated_W, "W")
	switch {
	case tol && rating:
		return t + ", " + p + " assumed"
	case tol:
		return t + " assumed, " + p
	case rating:
		return t + ", " + p + " assumed"
	}
	return t + ", " + p
}

// binName shows an empty bin as "-".
func binName(b string) string {
	if b == "" {
		return "-"
	}
	return b
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// Style says how the text output may mark what a technician must not
// miss (a broken limit, a short stock line): in bold on a terminal, plain
// when the output goes to a pipe or a file.
type Style struct {
	// Bold is true only when the output is a terminal.
	Bold bool
}

// StyleFor is the style for streams: bold only when stdout is a terminal.
func StyleFor(io *cmdutil.IOStreams) Style { return Style{Bold: io.IsStdoutTTY()} }

// mark returns text in bold (ECMA-48 SGR 1, then SGR 0) when the style
// allows it, else as it is.
func (s Style) mark(text string) string {
	if !s.Bold {
		return text
	}
	return "\x1b[1m" + text + "\x1b[0m"
}

// nearDuplicates counts folded builds: "1 near-duplicate", "3 near-duplicates".
func nearDuplicates(n int) string {
	if n == 1 {
		return "1 near-duplicate"
	}
	return fmt.Sprintf("%d near-duplicates", n)
}
