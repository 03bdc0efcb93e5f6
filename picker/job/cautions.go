package job

import "biasbin/solver/safety"

// Caution thresholds.
const (
	// HotSupply_V is the supply span above which a build earns the
	// supply caution: the d.c. voltage generally safe to touch
	// (safety.TouchVoltage_V, REFERENCE.md §17).
	HotSupply_V = safety.TouchVoltage_V
	// NearRating is the utilization of the design limit above which a part
	// earns a caution (safety.NearUse, common practice).
	NearRating = safety.NearUse
)

// CautionKind says what a caution warns of.
type CautionKind int

// The cautions.
const (
	// CautionSupply: the supply reaches Value (V), above the
	// extra-low-voltage boundary Limit (V): touching the circuit can hurt.
	CautionSupply CautionKind = iota + 1
	// CautionVCEO: VCE reaches Value (V), above the transistor's VCEO
	// Limit (V): it can break down.
	CautionVCEO
	// CautionVCEOCutoff: the supply reaches Value (V), above the
	// transistor's VCEO Limit (V): it can break down when the stage cuts
	// off.
	CautionVCEOCutoff
	// CautionICMax: IC reaches Value (A), above the transistor's IC max
	// Limit (A).
	CautionICMax
	// CautionHotPart: a part runs at Utilization of its design limit (above
	// NearRating): it will be hot. Part names it in an analysis (with
	// Power_W of Allowed_W); Build is the build's rank in a pick.
	CautionHotPart
	// CautionNominalOnly: the worst case could not be solved, so the
	// figures are for the nominal point only.
	CautionNominalOnly
)

// Caution is one hazard of a build, as figures; which fields are set
// depends on Kind. Whenever there is any caution, the usual practice
// applies: hot parts can burn; follow local codes and licensed practice.
type Caution struct {
	Kind        CautionKind
	Value       float64
	Limit       float64
	Part        string
	Build       int
	Power_W     float64
	Allowed_W   float64
	Utilization float64
}

// cautions lists the hazards of an analysed build in the short form,
// read off a.Safety (the one place the rules live, solver/safety).
func (a *Analysis) cautions() []Caution {
	var out []Caution
	for _, c := range a.Safety {
		switch c.Kind {
		case safety.AboveTouchVoltage, safety.AboveELV:
			out = append(out, Caution{Kind: CautionSupply, Value: c.Supply_V, Limit: c.Limit_V})
		case safety.OverVCEO:
			out = append(out, Caution{Kind: CautionVCEO, Value: c.VCE_V, Limit: c.VCEO_V})
		case safety.SupplyOverVCEO:
			out = append(out, Caution{Kind: CautionVCEOCutoff, Value: c.Supply_V, Limit: c.VCEO_V})
		case safety.OverICMax:
			out = append(out, Caution{Kind: CautionICMax, Value: c.IC_A, Limit: c.ICMax_A})
		case safety.NearDesignLimit, safety.OverDesignLimit, safety.OverRating:
			out = append(out, Caution{Kind: CautionHotPart, Part: c.Part, Power_W: c.Power_W, Allowed_W: c.Allowed_W, Utilization: c.Use})
		case safety.NominalOnly:
			out = append(out, Caution{Kind: CautionNominalOnly})
		}
	}
	return out
}
