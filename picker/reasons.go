package picker

import "biasbin/solver"

// FailureKind says which hard limit a build breaks (see doc.go).
type FailureKind int

// The hard limits a build can break.
const (
	// FailCorners: worst-case corners leave the active region or come
	// within the VCE margin of VCE(sat).
	FailCorners FailureKind = iota + 1
	// FailAllowance: a part runs over its derated, margined allowance at
	// the worst corner.
	FailAllowance
	// FailICMax: the collector current at some corner is over IC max.
	FailICMax
	// FailWorstCase: the worst-case corners could not be solved.
	FailWorstCase
	// FailBench: the board on the bench at NominalAmbient_C, at hFE min,
	// typical or max, leaves the active region or the VCE margin.
	FailBench
	// FailVoltage: a resistor's voltage at some corner is over its
	// limiting element voltage times the margin fraction.
	FailVoltage
)

// HFEPoint names one of the three hFE values a bench point is solved at.
type HFEPoint int

// The bench points' hFE values.
const (
	HFEAtMin HFEPoint = iota + 1
	HFEAtTyp
	HFEAtMax
)

// Failure is one hard limit a build breaks, as figures; the front end
// words it. Which fields are set depends on Kind.
type Failure struct {
	Kind FailureKind

	// FailCorners: how many of how many corners fail, and the worst one
	// (lowest VCE): its region, VCE, hFE, ambient and supply magnitude.
	// FailBench: the bench point's region, VCE and hFE point, with
	// Ambient_C the bench temperature.
	NotActive int
	Corners   int
	Region    solver.Region
	VCE_V     float64
	HFE       float64
	Ambient_C float64
	VCC_V     float64
	HFEPoint  HFEPoint
	// VCESat_V and Margin_V make up the VCE floor every point must keep
	// (FailCorners, FailBench).
	VCESat_V float64
	Margin_V float64

	// FailAllowance: the part (a slot name such as "rc", or PartTransistor)
	// and its utilization of the allowance.
	// FailVoltage: the resistor (slot name), its highest voltage over the
	// corners and the margined limiting element voltage.
	Part             string
	Utilization      float64
	Voltage_V        float64
	VoltageAllowed_V float64

	// FailICMax: the highest corner IC and the transistor's IC max.
	IC_A    float64
	ICMax_A float64

	// FailWorstCase: why the corners could not be solved.
	Err error
}

// PartTransistor is Failure.Part when the transistor is the part.
const PartTransistor = "transistor"

// ReasonKind says why a search came up short (Shortfall.Reasons).
type ReasonKind int

// Why a search comes up short.
const (
	// NoTransistor: no transistor of the polarity is stocked in the
	// numbers and with the ratings the request needs (Polarity, Boards,
	// VCC_V the highest supply, IC_A the target).
	NoTransistor ReasonKind = iota + 1
	// NoResistorLine: no resistor line holds the Boards parts the run needs.
	NoResistorLine
	// NoOperatingPoint: every solve of the stocked values failed.
	NoOperatingPoint
	// OffTarget: the nearest passing build misses the target (IC_A, VCE_V
	// of the build against TargetIC_A, TargetVCE_V).
	OffTarget
	// NearestFail: Count of the Of nearest builds break the limit Limit
	// (Count == Of: every build found).
	NearestFail
	// NotStiff: the stiffest of the nearest builds still moves IC by
	// BetaSpread over the hFE range.
	NotStiff
	// NoPurchase: no purchase of one or two resistor values gives a build
	// that fits.
	NoPurchase
	// NoApprovedPurchase: with RequireTags (Tags), no line on the approved
	// list, topped up to the Boards the run needs, gives a build that fits.
	NoApprovedPurchase
	// KeptStay: the kept parts (Kept) stay as they are; a build that fits
	// may need one of them replaced (nothing is bought for them).
	KeptStay
)

// Reason is one cause of a shortfall, as figures; which fields are set
// depends on Kind.
type Reason struct {
	Kind ReasonKind

	Polarity solver.Polarity
	Boards   int
	VCC_V    float64
	IC_A     float64

	VCE_V       float64
	TargetIC_A  float64
	TargetVCE_V float64

	Limit FailureKind
	Count int
	Of    int

	BetaSpread float64

	Tags []string

	Kept []KeptPart
}

// RejectKind says why a stocked transistor line was left out of a search.
type RejectKind int

// Why a transistor line is left out.
const (
	// RejectQty: the line holds Qty parts, fewer than the Boards the run needs.
	RejectQty RejectKind = iota + 1
	// RejectVCEO: VCEO_V times VoltageDerating is below the highest supply VCC_V.
	RejectVCEO
	// RejectICMax: ICMax_A times CurrentDerating is below the target IC_A.
	RejectICMax
	// RejectPower: the dissipation Power_W at the target current and
	// mid-supply VCE is over the Allowed_W allowance at Ambient_C.
	RejectPower
	// RejectDatasheet: the line's datasheet cannot be modelled (Err).
	RejectDatasheet
	// RejectUnrated: the line does not state the ratings Unknown, which
	// matter for the request (solver.UnknownRatings), and the request does
	// not allow unrated parts.
	RejectUnrated
)

// Rejection is one transistor line of the polarity left out, with why.
type Rejection struct {
	Kind RejectKind
	// Line is the stock line left out.
	Line Transistor

	Qty    int
	Boards int

	VCEO_V float64
	VCC_V  float64

	ICMax_A float64
	IC_A    float64

	Power_W   float64
	Allowed_W float64
	Ambient_C float64

	Unknown []solver.Rating

	Err error
}
