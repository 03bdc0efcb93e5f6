// Package safety judges one analysed build as the person who builds it
// must read it: the hard limits it breaks (a build that breaks one fails,
// whatever else it does well) and the cautions about heat and voltage
// that hold even when it passes. Results are typed figures; the front end
// words them. It knows no database and no search.
//
// Sources of the thresholds are beside each constant: touch temperature
// (REFERENCE.md §15), extra-low voltage (REFERENCE.md §17), resistor
// derating and element voltage (REFERENCE.md §3, §16).
package safety

import (
	"math"
	"slices"

	"biasbin/solver"
)

// Kind says what a caution is about.
type Kind int

// The cautions. Those for which Fails is true are hard limits.
const (
	// CornersNotActive: NotActive of Corners worst-case corners leave the
	// active region or come within the VCE margin of VCE(sat).
	CornersNotActive Kind = iota + 1
	// OverRating: a part dissipates more than its rating derated to the
	// hottest ambient (RatingUse > 1): a resistor will overheat and can
	// burn or fail open; the transistor's junction passes its limit.
	// NeedRated_W is the resistor rating that would keep the power within
	// the design limit at the hottest ambient (0 when none can).
	OverRating
	// OverDesignLimit: a part runs above its design limit (Use > 1, the
	// derated rating times the design margin) but within its rating.
	OverDesignLimit
	// OverElementVoltage: a resistor carries Voltage_V, above
	// VoltageAllowed_V (its limiting element voltage LEV_V times the
	// margin). LEVDefaulted is true when LEV_V is the default by rating.
	OverElementVoltage
	// OverVCEO: the collector-emitter voltage reaches VCE_V at a corner,
	// beyond the transistor's VCEO_V: it can break down.
	OverVCEO
	// OverICMax: the collector current reaches IC_A, beyond ICMax_A.
	OverICMax
	// SupplyOverVCEO: the supply span Supply_V is above VCEO_V: the
	// transistor can break down if the stage is ever cut off (no base
	// drive, a fault, power-up).
	SupplyOverVCEO
	// NearDesignLimit: a part runs at Use (above NearUse) of its design
	// limit: it will be warm, with little margin left.
	NearDesignLimit
	// HotSurface: a part's surface can reach Surface_C, above the touch
	// limit Limit_C, even within its rating (Part empty: the ambient
	// Ambient_C itself is past the limit, so every part is).
	HotSurface
	// UnknownRatings: the transistor states none of Ratings, which matter
	// for this build; nothing here says it survives.
	UnknownRatings
	// AboveTouchVoltage: the supply span Supply_V is above Limit_V, the
	// d.c. voltage generally taken as safe to touch in dry conditions.
	AboveTouchVoltage
	// AboveELV: the supply span Supply_V is above Limit_V, the top of the
	// extra-low-voltage band for d.c.: work to local codes and licensed
	// practice.
	AboveELV
	// NominalOnly: the worst case could not be solved, so every figure is
	// the nominal point's only.
	NominalOnly
)

// Fails reports whether the caution is a hard limit: a build with one
// fails.
func (k Kind) Fails() bool {
	switch k {
	case CornersNotActive, OverRating, OverDesignLimit, OverElementVoltage, OverVCEO, OverICMax:
		return true
	}
	return false
}

// String names the kind for JSON ("over_rating", "hot_surface" ...).
func (k Kind) String() string {
	if n, ok := kindNames[k]; ok {
		return n
	}
	return "unknown"
}

// MarshalText writes the kind's name.
func (k Kind) MarshalText() ([]byte, error) { return []byte(k.String()), nil }

var kindNames = map[Kind]string{
	CornersNotActive: "corners_not_active", OverRating: "over_rating", OverDesignLimit: "over_design_limit",
	OverElementVoltage: "over_element_voltage", OverVCEO: "over_vceo", OverICMax: "over_ic_max",
	SupplyOverVCEO: "supply_over_vceo", NearDesignLimit: "near_design_limit", HotSurface: "hot_surface",
	UnknownRatings: "unknown_ratings", AboveTouchVoltage: "above_touch_voltage", AboveELV: "above_elv",
	NominalOnly: "nominal_only",
}

// PartTransistor is Caution.Part when the transistor is the part.
const PartTransistor = "transistor"

// Caution is one finding, as figures; which fields are set depends on
// Kind.
type Caution struct {
	Kind Kind `json:"kind"`
	// Fails repeats Kind.Fails() for readers of the JSON.
	Fails bool `json:"fails"`
	// Part is a resistor position ("r1", "rc" ...) or PartTransistor.
	Part string `json:"part,omitempty"`

	Power_W      float64 `json:"power_w,omitempty"`
	Allowed_W    float64 `json:"allowed_w,omitempty"`  // the design limit
	Use          float64 `json:"use,omitempty"`        // of the design limit
	RatingUse    float64 `json:"rating_use,omitempty"` // of the derated rating
	NeedRated_W  float64 `json:"need_rated_w,omitempty"`
	Voltage_V    float64 `json:"voltage_v,omitempty"`
	VoltageAllow float64 `json:"voltage_allowed_v,omitempty"`
	LEV_V        float64 `json:"lev_v,omitempty"`
	LEVDefaulted bool    `json:"lev_defaulted,omitempty"`
	VCE_V        float64 `json:"vce_v,omitempty"`
	VCEO_V       float64 `json:"vceo_v,omitempty"`
	IC_A         float64 `json:"ic_a,omitempty"`
	ICMax_A      float64 `json:"ic_max_a,omitempty"`
	Supply_V     float64 `json:"supply_v,omitempty"`
	Surface_C    float64 `json:"surface_c,omitempty"`
	Limit_C      float64 `json:"limit_c,omitempty"`
	Limit_V      float64 `json:"limit_v,omitempty"`
	Ambient_C    float64 `json:"ambient_c,omitempty"`
	NotActive    int     `json:"not_active,omitempty"`
	Corners      int     `json:"corners,omitempty"`

	Ratings []solver.Rating `json:"ratings,omitempty"`
}

// Thresholds.
const (
	// TouchLimit_C is the surface temperature above which a part can burn
	// a finger that rests on it: 60 °C, the burn threshold for about one
	// minute's contact with plastic or coated surfaces (ISO 13732-1:2006
	// Table 2, from memory) and the IEC 62368-1 Table 38 limit for plastic
	// touched 10 s to 1 min (from memory; REFERENCE.md §15). Resistor
	// bodies and plastic transistor packages are coated or plastic; bare
	// metal (a tab, a heatsink) burns from 51 °C.
	TouchLimit_C = 60.0
	// TouchVoltage_V is the d.c. supply above which touching the circuit
	// can give a shock: 60 V ripple-free d.c., the IEC 62368-1 ES1 limit
	// and the IEC 60364-4-41 §414.4.5 limit for SELV without basic
	// protection in dry conditions (REFERENCE.md §17; from memory for the
	// table and clause).
	TouchVoltage_V = 60.0
	// ELVTop_V is the top of the extra-low-voltage band for ripple-free
	// d.c., 120 V (IEC 61140, REFERENCE.md §17).
	ELVTop_V = 120.0
	// NearUse is the share of the design limit above which a part earns a
	// caution (common practice).
	NearUse = 0.8
)

// Input is one analysed build.
type Input struct {
	Build   solver.Build
	Nominal solver.OperatingPoint
	// Worst is the worst case over the corners; nil when it could not be
	// solved (the nominal point is judged alone, NominalOnly says so).
	Worst  *solver.WorstCase
	Limits solver.Limits
}

// severity orders the cautions, most severe first: what destroys a part,
// then what breaks the design, then what to take care of.
var severity = map[Kind]int{
	OverVCEO: 1, OverRating: 2, OverElementVoltage: 3, OverICMax: 4, OverDesignLimit: 5, CornersNotActive: 6,
	AboveELV: 7, AboveTouchVoltage: 8, SupplyOverVCEO: 9, UnknownRatings: 10, HotSurface: 11, NearDesignLimit: 12,
	NominalOnly: 13,
}

// Assess lists every caution of the build, most severe first: the hard
// limits it breaks (transistor breakdown, parts over their ratings or
// element voltage, IC max, design limits, corners), then the supply's
// shock hazard, unknown ratings, hot surfaces and parts near their limit.
func Assess(in Input) []Caution {
	out := findAll(in)
	slices.SortStableFunc(out, func(a, b Caution) int { return severity[a.Kind] - severity[b.Kind] })
	return out
}

// findAll lists the cautions in the order they are found.
func findAll(in Input) []Caution {
	b := in.Build
	lim := in.Limits.WithDefaults()
	d := b.Device
	var out []Caution
	add := func(c Caution) {
		c.Fails = c.Kind.Fails()
		out = append(out, c)
	}

	// Figures over the corners, or the nominal point's alone.
	diss := solver.EvalDissipation(b, in.Nominal, b.NominalAmbient_C, in.Limits)
	vceMax, icMax, tjMax := in.Nominal.VCE_V, in.Nominal.IC_A, in.Nominal.Tj_C
	hot := max(b.AmbientMax_C, b.NominalAmbient_C)
	if w := in.Worst; w != nil {
		diss = w.Dissipation
		vceMax, icMax, tjMax = w.VCEMax_V, w.ICMax_A, w.TjMax_C
		if !w.AllActive {
			add(Caution{Kind: CornersNotActive, NotActive: w.NotActive, Corners: w.Count})
		}
	} else {
		add(Caution{Kind: NominalOnly})
	}
	supply := (math.Abs(b.VCC_V) + math.Abs(b.VEE_V)) * (1 + b.VCCTol)

	for _, s := range b.Topology.Slots() {
		spec := b.Resistors[s]
		if spec.Nominal_Ohm == 0 {
			continue
		}
		pl := diss.Resistor[s]
		name := s.String()
		if pl.Rated {
			ratingUse := pl.Utilization * lim.ResistorMaxFraction
			switch {
			case ratingUse > 1:
				c := Caution{Kind: OverRating, Part: name, Power_W: pl.Power_W, Allowed_W: pl.Allowed_W, Use: pl.Utilization, RatingUse: ratingUse, Ambient_C: hot}
				knee, top := spec.Knee_C, spec.Max_C
				if knee == 0 {
					knee = solver.DefaultResistorKnee_C
				}
				if top == 0 {
					top = solver.DefaultResistorMax_C
				}
				if f := solver.ResistorAllowed_W(1, knee, top, hot) * lim.ResistorMaxFraction; f > 0 {
					c.NeedRated_W = pl.Power_W / f
				}
				add(c)
			case pl.Utilization > 1:
				add(Caution{Kind: OverDesignLimit, Part: name, Power_W: pl.Power_W, Allowed_W: pl.Allowed_W, Use: pl.Utilization, RatingUse: ratingUse})
			}
		}
		if pl.VoltageUtilization > 1 {
			add(Caution{Kind: OverElementVoltage, Part: name, Voltage_V: pl.Voltage_V, VoltageAllow: pl.VoltageAllowed_V,
				LEV_V: spec.LimitingVoltage_V(), LEVDefaulted: spec.LEVDefaulted()})
		}
	}
	if q := diss.Transistor; q.Rated {
		ratingUse := q.Utilization * lim.TransistorMaxFraction
		switch {
		case ratingUse > 1:
			add(Caution{Kind: OverRating, Part: PartTransistor, Power_W: q.Power_W, Allowed_W: q.Allowed_W, Use: q.Utilization, RatingUse: ratingUse, Ambient_C: hot})
		case q.Utilization > 1:
			add(Caution{Kind: OverDesignLimit, Part: PartTransistor, Power_W: q.Power_W, Allowed_W: q.Allowed_W, Use: q.Utilization, RatingUse: ratingUse})
		}
	}
	if d.VCEO_V > 0 && vceMax > d.VCEO_V {
		add(Caution{Kind: OverVCEO, VCE_V: vceMax, VCEO_V: d.VCEO_V})
	}
	if d.ICMax_A > 0 && icMax > d.ICMax_A {
		add(Caution{Kind: OverICMax, IC_A: icMax, ICMax_A: d.ICMax_A})
	}

	// Cautions that do not fail the build.
	if d.VCEO_V > 0 && vceMax <= d.VCEO_V && supply > d.VCEO_V {
		add(Caution{Kind: SupplyOverVCEO, Supply_V: supply, VCEO_V: d.VCEO_V})
	}
	for _, s := range b.Topology.Slots() {
		pl := diss.Resistor[s]
		if b.Resistors[s].Nominal_Ohm > 0 && pl.Rated && pl.Utilization > NearUse && pl.Utilization <= 1 {
			add(Caution{Kind: NearDesignLimit, Part: s.String(), Power_W: pl.Power_W, Allowed_W: pl.Allowed_W, Use: pl.Utilization})
		}
	}
	if q := diss.Transistor; q.Rated && q.Utilization > NearUse && q.Utilization <= 1 {
		add(Caution{Kind: NearDesignLimit, Part: PartTransistor, Power_W: q.Power_W, Allowed_W: q.Allowed_W, Use: q.Utilization})
	}
	out = append(out, hotSurfaces(b, diss, hot, tjMax, lim)...)
	if r := solver.UnknownRatings(d, icMax); len(r) > 0 {
		add(Caution{Kind: UnknownRatings, Ratings: r})
	}
	switch {
	case supply > ELVTop_V:
		add(Caution{Kind: AboveELV, Supply_V: supply, Limit_V: ELVTop_V})
	case supply > TouchVoltage_V:
		add(Caution{Kind: AboveTouchVoltage, Supply_V: supply, Limit_V: TouchVoltage_V})
	}
	return out
}

// Verdict is the build's standing: it fails when any caution is a hard
// limit; First is then the first of them.
type Verdict struct {
	Fails bool     `json:"fails"`
	First *Caution `json:"first,omitempty"`
	// Cautions counts the cautions that do not fail the build.
	Cautions int `json:"cautions"`
}

// VerdictOf reads the verdict off a list from Assess.
func VerdictOf(cs []Caution) Verdict {
	var v Verdict
	for i := range cs {
		switch {
		case cs[i].Fails && v.First == nil:
			v.Fails, v.First = true, &cs[i]
		case !cs[i].Fails && cs[i].Kind != NominalOnly:
			v.Cautions++
		}
	}
	return v
}

// hotSurfaces lists the parts whose surface can pass TouchLimit_C at the
// hottest ambient, within their rating. A resistor's hot spot is bounded
// by the derating curve: at its full rating at the knee ambient the
// element reaches the zero-power temperature, so it rises by
// P/P_rated·(max − knee) above the ambient (derived from the IEC 60115-1
// derating curve, REFERENCE.md §3); the surface is no hotter than that.
// The transistor's case is no hotter than its junction.
func hotSurfaces(b solver.Build, diss solver.Dissipation, hot, tj float64, lim solver.Limits) []Caution {
	if hot > TouchLimit_C {
		// The air itself is past the limit: one caution for the whole board.
		return []Caution{{Kind: HotSurface, Surface_C: hot, Limit_C: TouchLimit_C, Ambient_C: hot}}
	}
	var out []Caution
	for _, s := range b.Topology.Slots() {
		spec := b.Resistors[s]
		pl := diss.Resistor[s]
		if spec.Nominal_Ohm == 0 || !(spec.Rated_W > 0) || pl.Utilization*lim.ResistorMaxFraction > 1 {
			continue
		}
		knee, top := spec.Knee_C, spec.Max_C
		if knee == 0 {
			knee = solver.DefaultResistorKnee_C
		}
		if top == 0 {
			top = solver.DefaultResistorMax_C
		}
		if t := hot + pl.Power_W/spec.Rated_W*(top-knee); t > TouchLimit_C {
			out = append(out, Caution{Kind: HotSurface, Part: s.String(), Power_W: pl.Power_W, Surface_C: t, Limit_C: TouchLimit_C, Ambient_C: hot})
		}
	}
	if q := diss.Transistor; solver.ThermalResistance(b.Device) > 0 && q.Utilization*lim.TransistorMaxFraction <= 1 && tj > TouchLimit_C {
		out = append(out, Caution{Kind: HotSurface, Part: PartTransistor, Power_W: q.Power_W, Surface_C: tj, Limit_C: TouchLimit_C, Ambient_C: hot})
	}
	return out
}
