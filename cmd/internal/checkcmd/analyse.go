package checkcmd

import (
	"fmt"

	"biasbin/cmd/internal/report"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/solver/safety"
)

// cautions words an analysis's hard limits and cautions (solver/safety,
// through the application layer), most severe first.
func cautions(a *job.Analysis) []string { return report.Words(a.Safety, report.Caution) }

// cautionMark leads a caution line: "FAILS:" for a hard limit, "caution:"
// for the rest.
func cautionMark(c safety.Caution) string {
	if c.Fails {
		return "FAILS:"
	}
	return "caution:"
}

// problems words the analyses that failed.
func problems(a *job.Analysis) []string {
	var out []string
	for _, p := range a.Problems {
		out = append(out, p.Err.Error())
	}
	return out
}

// netlist is the SPICE deck of the nominal point.
func netlist(a *job.Analysis) string {
	title := fmt.Sprintf("biasbin check: %v %v stage, nominal point at %s ambient, beta %.4g",
		a.Model.Polarity, a.Stage.Topology, notation.FormatTemperature(a.Request.Build.NominalAmbient_C), a.Model.BF)
	return solver.Netlist(a.Stage, a.Model, a.Nominal.Tj_C, title)
}
