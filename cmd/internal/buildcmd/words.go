package buildcmd

import (
	"fmt"
	"io"
	"strings"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/report"
	"biasbin/picker/job"
	"biasbin/solver/notation"
)

// causeWords names a fitted fault the way a technician says it.
func causeWords(c buildjob.Cause) string {
	part := strings.ToUpper(c.Part)
	switch c.Fault {
	case "open":
		return part + " open"
	case "short":
		return part + " shorted"
	case "drift":
		return fmt.Sprintf("%s off its value (acts like %s)", part, notation.FormatResistance(c.Ohm))
	case "be-open":
		return "transistor emitter lead open inside"
	case "bc-open":
		return "transistor collector lead open inside"
	case "be-short":
		return "transistor base-emitter junction shorted"
	case "bc-short":
		return "transistor base-collector junction shorted"
	case "ce-short":
		return "transistor collector-emitter shorted"
	case "leak":
		return fmt.Sprintf("transistor collector-base leakage (about %s)", notation.FormatCurrent(c.Leak_A))
	case "low-hfe":
		return fmt.Sprintf("transistor hFE too low (about %.0f)", c.HFE)
	}
	return part + " " + c.Fault
}

// readingWords says where one reading lies against its band.
func readingWords(name string, v float64, b buildjob.Band) string {
	switch {
	case v < b.Min_V:
		return fmt.Sprintf("%s %s LOW (band %s)", name, notation.FormatVoltage(v), bandWords(b))
	case v > b.Max_V:
		return fmt.Sprintf("%s %s HIGH (band %s)", name, notation.FormatVoltage(v), bandWords(b))
	}
	return fmt.Sprintf("%s %s ok", name, notation.FormatVoltage(v))
}

// bandWords writes a band as MIN..MAX with the unit.
func bandWords(b buildjob.Band) string {
	return notation.FormatVoltage(b.Min_V) + " .. " + notation.FormatVoltage(b.Max_V)
}

// writeReading writes one board's readings, verdict and likely causes.
func writeReading(w io.Writer, indent string, rd buildjob.Reading, bands buildjob.Bands) {
	fmt.Fprintf(w, "%sboard %d: %s, %s, %s: %s\n", indent, rd.Board, readingWords("VB", rd.VB_V, bands.VB),
		readingWords("VE", rd.VE_V, bands.VE), readingWords("VC", rd.VC_V, bands.VC), verdictWords(rd.Verdict))
	if rd.Verdict != buildjob.VerdictOut || len(rd.Causes) == 0 {
		return
	}
	first := rd.Causes[0]
	if rd.Explained {
		fmt.Fprintf(w, "%s  most likely: %s (matches every reading within the meter's accuracy)\n", indent, causeWords(first))
	} else {
		fmt.Fprintf(w, "%s  no single fault matches every reading within the meter's accuracy; nearest: %s (off by %s× the meter accuracy)\n",
			indent, causeWords(first), fitWords(first.Fit))
	}
	var then []string
	for _, c := range rd.Causes[1:] {
		then = append(then, fmt.Sprintf("%s (off by %s× the meter accuracy)", causeWords(c), fitWords(c.Fit)))
	}
	if len(then) > 0 {
		fmt.Fprintf(w, "%s  then: %s\n", indent, strings.Join(then, "; "))
	}
	if rd.Explained {
		fmt.Fprintf(w, "%s  check %s first (power off)\n", indent, checkFirst(rd.Causes))
		return
	}
	fmt.Fprintf(w, "%s  check the supply, the ground lead and the readings first; then %s (power off)\n", indent, checkFirst(rd.Causes))
}

// fitWords writes a fit: one decimal below 10, whole above.
func fitWords(f float64) string {
	if f < 10 {
		return fmt.Sprintf("%.1f", f)
	}
	return fmt.Sprintf("%.0f", f)
}

// checkFirst names the parts of the top two causes.
func checkFirst(cs []buildjob.Cause) string {
	var parts []string
	seen := map[string]bool{}
	for _, c := range cs[:min(2, len(cs))] {
		p := strings.ToUpper(c.Part)
		if c.Part == "q" {
			p = "the transistor"
		}
		if !seen[p] {
			seen[p] = true
			parts = append(parts, p)
		}
	}
	return strings.Join(parts, " and ")
}

// writeCautions writes a build's cautions, one a line, with prefix.
func writeCautions(w io.Writer, prefix string, cs []job.Caution) {
	for _, c := range cs {
		fmt.Fprintf(w, "%scaution: %s\n", prefix, report.JobCaution(c))
	}
	if len(cs) > 0 {
		fmt.Fprintf(w, "%scaution: %s\n", prefix, report.Practice)
	}
}

// verdictWords says a verdict.
func verdictWords(v buildjob.Verdict) string {
	switch v {
	case buildjob.VerdictPass:
		return "pass"
	case buildjob.VerdictOut:
		return "OUT OF BAND"
	}
	return "not measured"
}
