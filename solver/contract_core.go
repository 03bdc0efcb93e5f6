package solver

// TEMPORARY CONTRACT FILE (core solver). The helper implementing the core
// moves each declaration into its proper file (device.go, solve.go,
// thermal.go ...) with a real body and deletes this file. Signatures and
// field names here are the agreed contract; extend, but do not rename.

// Datasheet is what a parts drawer knows about a transistor type: the
// datasheet ranges the solver builds its model from. Zero optional fields
// take the documented defaults (see doc.go).
type Datasheet struct {
	Label         string
	Polarity      Polarity
	HFEMin        float64 // minimum hFE at HFEAt_A
	HFEMax        float64 // maximum hFE at HFEAt_A
	HFETyp        float64 // typical hFE; 0 means the geometric mean of min and max
	HFEAt_A       float64 // collector current of the hFE test; 0 = unknown
	VBEOn_V       float64 // VBE(on) magnitude at VBEAt_A; 0 = 0.65 V (common practice)
	VBEAt_A       float64 // test current of VBE(on); 0 = 1 mA
	VCESat_V      float64 // VCE(sat) max magnitude; 0 = 0.2 V (common practice)
	VCEO_V        float64 // VCEO max magnitude; 0 = unknown
	ICMax_A       float64 // IC max; 0 = unknown
	PD25_W        float64 // total dissipation at 25 °C ambient; 0 = unknown
	ThetaJA_KPerW float64 // junction-to-ambient thermal resistance; 0 = no self-heating
	TjMax_C       float64 // maximum junction temperature; 0 = 150 °C
	VAF_V         float64 // Early voltage magnitude; 0 = infinite
	ICBO_A        float64 // collector-base leakage at 25 °C; 0 = none
}

// Model is the SPICE BJT parameter set (the Gummel-Poon model reduced to
// Ebers-Moll transport form) at the nominal temperature TNOM_C. Field names
// follow the SPICE .model card.
type Model struct {
	Polarity Polarity
	IS_A     float64 // transport saturation current at TNOM
	BF       float64 // ideal forward beta at TNOM
	BR       float64 // ideal reverse beta
	NF       float64 // forward emission coefficient
	VAF_V    float64 // forward Early voltage; 0 = infinite
	XTI      float64 // IS temperature exponent
	XTB      float64 // beta temperature exponent
	EG_eV    float64 // energy gap for IS(T)
	TNOM_C   float64 // parameter measurement temperature
	ICBO_A   float64 // extra collector-base leakage at TNOM (doubles per 10 K); 0 = none
}

// OperatingPoint is a solved DC operating point. Node voltages are signed,
// relative to ground. Currents, VCE_V and VBE_V are forward-referenced: for
// an NPN IC flows into the collector and VCE = VC-VE; for a PNP IC flows out
// of the collector and VCE = VE-VC. So both are positive in the active
// region for either polarity.
type OperatingPoint struct {
	Region        Region
	IB_A          float64
	IC_A          float64
	IE_A          float64
	VB_V          float64
	VC_V          float64
	VE_V          float64
	VCE_V         float64
	VBE_V         float64
	IDivider_A    float64           // current in R2 (divider) or RB (split supply); 0 otherwise
	P_W           [NumSlots]float64 // each resistor's dissipation
	PTransistor_W float64           // VCE*IC + VBE*IB
	Tj_C          float64           // device temperature the model was evaluated at
}

// Stage is one bias circuit with effective resistor values (after any
// tolerance and TCR). Rails are signed: VCC_V > 0 for NPN and < 0 for PNP;
// VEE_V (split supply only) < 0 for NPN and > 0 for PNP.
type Stage struct {
	Topology    Topology
	VCC_V       float64
	VEE_V       float64
	R_Ohm       [NumSlots]float64 // unused slots are ignored
	RBypass_Ohm float64           // part of RE bypassed for AC (0..RE)
	RL_Ohm      float64           // AC load on the collector; 0 = none
}

// ModelFor builds the SPICE model for a datasheet at forward beta bf
// (the hFE under analysis, at TNOM).
func ModelFor(d Datasheet, bf float64) (Model, error) { panic("solver: ModelFor not implemented yet") }

// Solve returns the exact DC operating point of s with the transistor m at
// device temperature tj_C (no self-heating).
func Solve(s Stage, m Model, tj_C float64) (OperatingPoint, error) {
	panic("solver: Solve not implemented yet")
}

// SolveSelfHeated iterates Tj = ambient + PTransistor*thetaJA to
// equilibrium; thetaJA_KPerW = 0 means no self-heating. Returns an error
// wrapping ErrThermalRunaway when there is no stable equilibrium below
// tjMax_C.
func SolveSelfHeated(s Stage, m Model, ambient_C, thetaJA_KPerW, tjMax_C float64) (OperatingPoint, error) {
	panic("solver: SolveSelfHeated not implemented yet")
}
