package pickcmd

import (
	"fmt"
	"strings"

	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver/notation"
)

// positionCode writes a position's value: a single part as its code, a
// series pair as 4K7+330R and a parallel pair as 10K‖10K.
func positionCode(p picker.Position) string {
	if len(p.Parts) < 2 {
		return notation.FormatResistanceExact(p.Ohm)
	}
	codes := make([]string, len(p.Parts))
	for i, part := range p.Parts {
		codes[i] = notation.FormatResistanceExact(part.Ohm)
	}
	sep := "+"
	if p.Arrangement == "parallel" {
		sep = "‖"
	}
	return strings.Join(codes, sep)
}

// pullValue writes what a pull line holds: a resistor's code or a
// transistor's label.
func pullValue(p job.PullLine) string {
	if p.Kind == job.Resistor {
		return notation.FormatResistanceExact(p.Ohm)
	}
	return p.Label
}

// pullKind names what a pull line holds, as the JSON says it.
func pullKind(p job.PullLine) string {
	if p.Kind == job.Resistor {
		return "resistor"
	}
	return "transistor"
}

// cautionText words a pick's caution.
func cautionText(c job.Caution) string {
	switch c.Kind {
	case job.CautionSupply:
		return fmt.Sprintf("the supply reaches %s, above %s: parts run hot and can burn, and touching the circuit can hurt; follow your local codes and licensed practice",
			trimV(c.Value), trimV(c.Limit))
	case job.CautionHotPart:
		return fmt.Sprintf("build %d runs a part at %.0f %% of its design limit: it will be hot and can burn; keep it clear of other parts and follow local codes and licensed practice",
			c.Build, c.Utilization*100)
	}
	return fmt.Sprintf("caution %d", c.Kind)
}
