package pickcmd

import (
	"strings"

	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
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

// hottest is the part nearest its design limit over the worst-case
// corners: its name ("RC", "the transistor") and load.
func hottest(c job.Build) (string, solver.PartLoad) {
	name, load := "", solver.PartLoad{}
	for _, slot := range job.Slots(c.Candidate) {
		sl, err := solver.ParseSlot(slot)
		if err != nil {
			continue
		}
		if pl := c.Worst.Dissipation.Resistor[sl]; pl.Rated && pl.Utilization > load.Utilization {
			name, load = strings.ToUpper(slot), pl
		}
	}
	if pl := c.Worst.Dissipation.Transistor; pl.Rated && pl.Utilization > load.Utilization {
		name, load = "the transistor", pl
	}
	return name, load
}
