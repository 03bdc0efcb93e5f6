package solver

import "math/rand/v2"

// TEMPORARY CONTRACT FILE (analyses). The helper implementing the analyses
// moves each declaration into its proper file (build.go, worstcase.go,
// yield.go, dissipation.go, swing.go, sensitivity.go, analyze.go) with a real
// body and deletes this file. Signatures and field names here are the agreed
// contract; extend, but do not rename.

// ResistorSpec is one fitted resistor (or series/parallel pair treated as
// one part) with its tolerance, temperature coefficient and rating.
type ResistorSpec struct {
	Nominal_Ohm float64 // marked value; 0 in an unused slot (RE: 0 = emitter tied to its rail)
	Tol         float64 // tolerance as a fraction (0.05 = ±5 %)
	TCR_PPMPerK float64 // temperature coefficient, ppm/K, referred to 25 °C
	Rated_W     float64 // rated power at the knee temperature
	Knee_C      float64 // derating knee (rated ambient); 0 = 70 °C
	Max_C       float64 // zero-power temperature; 0 = 155 °C
}

// Build is a complete stage to analyse: nominal circuit, parts with their
// tolerances and ratings, the supply tolerance and the ambient range.
type Build struct {
	Topology         Topology
	VCC_V            float64 // signed collector rail
	VEE_V            float64 // signed emitter rail (split supply)
	VCCTol           float64 // supply tolerance as a fraction, applied to both rails
	Resistors        [NumSlots]ResistorSpec
	RBypass_Ohm      float64
	RL_Ohm           float64
	Device           Datasheet
	AmbientMin_C     float64
	AmbientMax_C     float64
	NominalAmbient_C float64 // nominal point ambient (the CLI default is 25 °C)
	NominalBeta      float64 // 0 = Device's typical hFE
}

// Limits are the design margins an analysis checks against. The zero value
// means the documented defaults.
type Limits struct {
	ResistorMaxFraction   float64 // of the derated rating; 0 = 0.5 (common practice)
	TransistorMaxFraction float64 // of (TjMax-Ta)/thetaJA; 0 = 0.75 (common practice)
	VCEMargin_V           float64 // required above VCE(sat) at every corner; 0 = 0.5 V
}

// Corner is one worst-case corner solved.
type Corner struct {
	BF     float64           // forward-gain parameter at TNOM
	Temp_C float64           // ambient
	Tj_C   float64           // device temperature after self-heating
	VCC_V  float64           // collector rail at this corner
	VEE_V  float64           // emitter rail at this corner
	R_Ohm  [NumSlots]float64 // effective values (tolerance and TCR applied)
	OP     OperatingPoint
}

// WorstCase is the extreme-value analysis over all corners plus the
// linearised root-sum-square spread.
type WorstCase struct {
	Corners      []Corner
	ICMin_A      float64
	ICMax_A      float64
	VCEMin_V     float64
	VCEMax_V     float64
	ICMinCorner  int // index into Corners
	ICMaxCorner  int
	VCEMinCorner int
	VCEMaxCorner int
	AllActive    bool    // every corner active with VCE >= VCE(sat) + margin
	RSSIC_A      float64 // linearised RSS spread (one-sided) of IC, JCGM 100 style
	RSSVCE_V     float64
}

// Window is the acceptance band for yield.
type Window struct {
	ICMin_A, ICMax_A   float64
	VCEMin_V, VCEMax_V float64
}

// YieldResult is a Monte Carlo yield estimate.
type YieldResult struct {
	Boards int
	Pass   int
	Yield  float64
	StdErr float64
	Seed   uint64
	Failed int // boards whose solve returned an error (counted as failures)
}

// Dissipation compares each part's power with its derated rating.
type Dissipation struct {
	Resistor       [NumSlots]PartLoad
	Transistor     PartLoad
	MaxUtilization float64 // largest utilization of any part (1 = at the design limit)
	Ok             bool    // every part within its limit
}

// PartLoad is one part's dissipation against its derated, margined limit.
type PartLoad struct {
	Power_W     float64
	Allowed_W   float64 // derated rating at the ambient, times the margin fraction
	Utilization float64 // Power_W / Allowed_W
}

// Swing is the load-line and swing analysis at a Q-point.
type Swing struct {
	RDC_Ohm      float64
	RAC_Ohm      float64
	ICSatDC_A    float64
	VCECutDC_V   float64
	ICSatAC_A    float64
	VCECutAC_V   float64
	VPeak_V      float64 // maximum symmetrical peak swing at the collector
	ClipsFirst   string  // "cutoff" or "saturation"
	OptimumIC_A  float64 // Q-point that maximises symmetrical swing
	OptimumVCE_V float64
}

// Sensitivity is the stability-factor set at a point.
type Sensitivity struct {
	SI         float64 // dIC/dICBO
	SV_S       float64 // dIC/dVBE (siemens, sign as computed)
	SBeta_A    float64 // dIC/dbeta
	BetaSpread float64 // (IC(hFEmax)-IC(hFEmin))/IC(nominal)
}

// Resolve returns the Stage of b at resistor deviations dev (fractions of
// nominal, before TCR), supply factor vccFactor and resistor temperature
// temp_C (TCR applied from 25 °C).
func (b Build) Resolve(dev [NumSlots]float64, vccFactor, temp_C float64) Stage {
	panic("solver: Build.Resolve not implemented yet")
}

// Validate reports the first bad input of b as an *InputError.
func (b Build) Validate() error { panic("solver: Build.Validate not implemented yet") }

// Nominal solves b at its nominal ambient and beta (self-heated).
func Nominal(b Build) (OperatingPoint, Model, error) { panic("solver: Nominal not implemented yet") }

// EvalWorstCase solves every corner of b.
func EvalWorstCase(b Build, lim Limits) (WorstCase, error) {
	panic("solver: EvalWorstCase not implemented yet")
}

// EvalYield runs a seeded Monte Carlo over n boards.
func EvalYield(b Build, w Window, n int, rng *rand.Rand) (YieldResult, error) {
	panic("solver: EvalYield not implemented yet")
}

// EvalDissipation checks op's powers against the parts' ratings derated
// at ambient_C.
func EvalDissipation(b Build, op OperatingPoint, ambient_C float64, lim Limits) Dissipation {
	panic("solver: EvalDissipation not implemented yet")
}

// EvalSwing computes the load lines and symmetrical swing at op.
func EvalSwing(s Stage, op OperatingPoint, vceSat_V float64) Swing {
	panic("solver: EvalSwing not implemented yet")
}

// EvalSensitivity returns stability factors and the beta spread of b.
func EvalSensitivity(b Build) (Sensitivity, error) {
	panic("solver: EvalSensitivity not implemented yet")
}
