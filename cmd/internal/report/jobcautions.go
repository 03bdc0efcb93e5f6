package report

import (
	"fmt"

	"biasbin/picker/job"
	"biasbin/solver/safety"
)

// Practice closes a list of a build's cautions: the usual practice for a
// bench build.
const Practice = "hot parts can burn; keep them clear of other parts, and follow your local codes and licensed practice"

// JobCaution words a caution in the application layer's short form (a
// pick's summary, a kept or reserved build). Every kind that solver/safety
// also has is worded by Caution, so a caution reads the same in check,
// pick and build; the hot part is worded here, with the build's rank when
// it names one.
func JobCaution(c job.Caution) string {
	switch c.Kind {
	case job.CautionSupply:
		kind := safety.AboveTouchVoltage
		if c.Limit >= safety.ELVTop_V {
			kind = safety.AboveELV
		}
		return Caution(safety.Caution{Kind: kind, Supply_V: c.Value, Limit_V: c.Limit})
	case job.CautionVCEO:
		return Caution(safety.Caution{Kind: safety.OverVCEO, VCE_V: c.Value, VCEO_V: c.Limit})
	case job.CautionVCEOCutoff:
		return Caution(safety.Caution{Kind: safety.SupplyOverVCEO, Supply_V: c.Value, VCEO_V: c.Limit})
	case job.CautionICMax:
		return Caution(safety.Caution{Kind: safety.OverICMax, IC_A: c.Value, ICMax_A: c.Limit})
	case job.CautionNominalOnly:
		return Caution(safety.Caution{Kind: safety.NominalOnly})
	case job.CautionHotPart:
		part := "a part"
		if c.Part != "" {
			part = partName(c.Part)
		}
		lead := part + " runs"
		if c.Build > 0 {
			lead = fmt.Sprintf("build #%d runs %s", c.Build, part)
		}
		return fmt.Sprintf("%s at %s of its design limit: it will be hot and can burn; keep it clear of other parts", lead, pctOf(c.Utilization))
	}
	return fmt.Sprintf("caution %d", c.Kind)
}
