package checkcmd

import (
	"fmt"
	"math"
	"strings"

	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// practice is the line that closes the cautions.
const practice = "hot parts can burn; follow local codes and licensed practice for mains and high voltage"

// cautions words an analysis's cautions for stderr, closed by the usual
// practice when there is any.
func cautions(a *job.Analysis) []string {
	var out []string
	for _, c := range a.Cautions {
		out = append(out, cautionText(c))
	}
	if len(out) > 0 {
		out = append(out, practice)
	}
	return out
}

// cautionText words one caution of an analysis.
func cautionText(c job.Caution) string {
	switch c.Kind {
	case job.CautionSupply:
		return fmt.Sprintf("the supply reaches %s, above %s: touching the circuit can hurt",
			notation.FormatVoltage(c.Value), notation.FormatVoltage(c.Limit))
	case job.CautionVCEO:
		return fmt.Sprintf("VCE reaches %s, above the transistor's VCEO %s: it can break down",
			notation.FormatVoltage(c.Value), notation.FormatVoltage(c.Limit))
	case job.CautionVCEOCutoff:
		return fmt.Sprintf("the supply reaches %s, above the transistor's VCEO %s: it can break down when the stage cuts off",
			notation.FormatVoltage(c.Value), notation.FormatVoltage(c.Limit))
	case job.CautionICMax:
		return fmt.Sprintf("IC reaches %s, above the transistor's IC max %s",
			notation.FormatCurrent(c.Value), notation.FormatCurrent(c.Limit))
	case job.CautionHotPart:
		what := "near"
		if c.Utilization > 1 {
			what = "beyond"
		}
		return fmt.Sprintf("%s runs %s its design limit (%s of %s allowed, %.0f %%): it will be hot",
			strings.ToUpper(c.Part), what, notation.FormatPower(c.Power_W), notation.FormatPower(c.Allowed_W), 100*math.Min(c.Utilization, 999))
	case job.CautionNominalOnly:
		return "the worst case could not be solved (see below): the figures above are for the nominal point only"
	}
	return fmt.Sprintf("caution %d", c.Kind)
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
