package job

// Caution thresholds.
const (
	// HotSupply_V is the supply span above which a build earns the
	// hot-parts caution: 50 V is the usual extra-low-voltage boundary for
	// DC work (common practice; local rules differ).
	HotSupply_V = 50.0
	// NearRating is the utilization of the design limit above which a part
	// earns a caution (common practice).
	NearRating = 0.8
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

// cautions lists the hazards of an analysed build.
func (a *Analysis) cautions() []Caution {
	var out []Caution
	if s := a.SupplySpan_V(); s > HotSupply_V {
		out = append(out, Caution{Kind: CautionSupply, Value: s, Limit: HotSupply_V})
	}
	dev := a.Request.Build.Device
	vceMax, icMax := a.Nominal.VCE_V, a.Nominal.IC_A
	if a.Worst != nil {
		vceMax, icMax = a.Worst.VCEMax_V, a.Worst.ICMax_A
	}
	switch {
	case dev.VCEO_V > 0 && vceMax > dev.VCEO_V:
		out = append(out, Caution{Kind: CautionVCEO, Value: vceMax, Limit: dev.VCEO_V})
	case dev.VCEO_V > 0 && a.SupplySpan_V() > dev.VCEO_V:
		out = append(out, Caution{Kind: CautionVCEOCutoff, Value: a.SupplySpan_V(), Limit: dev.VCEO_V})
	}
	if dev.ICMax_A > 0 && icMax > dev.ICMax_A {
		out = append(out, Caution{Kind: CautionICMax, Value: icMax, Limit: dev.ICMax_A})
	}
	for _, p := range a.Loads(a.WorstDissipation()) {
		if p.Load.Rated && p.Load.Utilization > NearRating {
			out = append(out, Caution{Kind: CautionHotPart, Part: p.Part, Power_W: p.Load.Power_W, Allowed_W: p.Load.Allowed_W, Utilization: p.Load.Utilization})
		}
	}
	if a.Worst == nil && len(a.Problems) > 0 {
		out = append(out, Caution{Kind: CautionNominalOnly})
	}
	return out
}
