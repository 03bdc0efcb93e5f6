package solver

import (
	"fmt"
	"math"
)

// ResistorSpec is one fitted resistor (or series/parallel pair treated as
// one part) with its tolerance, temperature coefficient and rating.
type ResistorSpec struct {
	Nominal_Ohm float64 // marked value; 0 in an unused slot (RE: 0 = emitter tied to its rail)
	Tol         float64 // tolerance as a fraction (0.05 = ±5 %)
	TCR_PPMPerK float64 // temperature coefficient, ppm/K, referred to 25 °C
	Rated_W     float64 // rated power at the knee temperature; 0 = not rated (not checked)
	Knee_C      float64 // derating knee (rated ambient); 0 = 70 °C
	Max_C       float64 // zero-power temperature; 0 = 155 °C
	// LEV_V is the limiting element voltage (IEC 60115-1); 0 = the
	// default by power rating (DefaultLEV_V).
	LEV_V float64
}

// TCRReference_C is the temperature resistor values are marked at and TCR
// is referred to.
const TCRReference_C = 25.0

// Build is a complete stage to analyse: nominal circuit, parts with their
// tolerances and ratings, the supply tolerance and the ambient range.
//
// Temperatures are taken literally: a zero NominalAmbient_C means 0 °C
// (callers wanting the usual 25 °C set it). Resistors are assumed to sit at
// the ambient temperature (their own heating is not added to their TCR
// shift); the transistor is self-heated through its θJA.
type Build struct {
	Topology         Topology
	VCC_V            float64 // signed collector rail
	VEE_V            float64 // signed emitter rail (split supply)
	Ground           Ground  // the rail that is 0 V; node voltages are given against it
	VCCTol           float64 // supply tolerance as a fraction (the emitter rail's too unless VEETol)
	VEETol           float64 // the emitter rail's own tolerance (split supply); 0 = VCCTol; each rail varies on its own
	Resistors        [NumSlots]ResistorSpec
	RBypass_Ohm      float64 // part of RE bypassed for AC (0..RE nominal); scales with RE
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
	VoltageMaxFraction    float64 // of a resistor's limiting element voltage; 0 = 0.8 (common practice)
}

// WithDefaults returns l with the documented default in place of every
// field that is zero, negative or NaN.
func (l Limits) WithDefaults() Limits {
	if !(l.ResistorMaxFraction > 0) {
		l.ResistorMaxFraction = DefaultResistorMaxFraction
	}
	if !(l.TransistorMaxFraction > 0) {
		l.TransistorMaxFraction = DefaultTransistorMaxFraction
	}
	if !(l.VCEMargin_V > 0) {
		l.VCEMargin_V = DefaultVCEMargin_V
	}
	if !(l.VoltageMaxFraction > 0) {
		l.VoltageMaxFraction = DefaultVoltageMaxFraction
	}
	return l
}

// ThermalResistance returns the junction-to-ambient thermal resistance the
// analyses use: the datasheet θJA, else the one implied by a PD25 rating
// derated linearly to zero at TjMax, θJA = (TjMax − 25 °C)/PD25
// (REFERENCE.md §8), else 0 (no self-heating, dissipation not checked).
func ThermalResistance(d Datasheet) float64 {
	if d.ThetaJA_KPerW > 0 {
		return d.ThetaJA_KPerW
	}
	if d.PD25_W > 0 {
		return (tjMaxOf(d) - 25) / d.PD25_W
	}
	return 0
}

// TypicalHFE returns the datasheet's typical hFE, or the geometric mean of
// its minimum and maximum when no typical is given.
func TypicalHFE(d Datasheet) float64 {
	if d.HFETyp > 0 {
		return d.HFETyp
	}
	return math.Sqrt(d.HFEMin * d.HFEMax)
}

// nominalBeta returns the beta of b's nominal point.
func (b Build) nominalBeta() float64 {
	if b.NominalBeta > 0 {
		return b.NominalBeta
	}
	return TypicalHFE(b.Device)
}

// usedSlot reports whether slot i carries a part in b: a slot of the
// topology with a non-zero value.
func (b *Build) usedSlot(i Slot) bool {
	return b.Topology.uses(i) && b.Resistors[i].Nominal_Ohm > 0
}

// uses reports whether the topology has a position i.
func (t Topology) uses(i Slot) bool {
	switch t {
	case Divider:
		return i == R1 || i == R2 || i == RC || i == RE
	case CollectorFeedback:
		return i == RF || i == RC || i == RE
	case SplitSupply:
		return i == RB || i == RC || i == RE
	}
	return false
}

// Resolve returns the Stage of b at resistor deviations dev (fractions of
// nominal, before TCR), supply factor vccFactor and resistor temperature
// temp_C (TCR applied from 25 °C):
//
//	R = R_nominal·(1 + dev)·(1 + TCR·10⁻⁶·(temp_C − 25))
//
// which is the first-order form of R(T) = R₀[1 + TC1(T−T₀)] (ngspice manual
// eq. (6), §1.3.1). Both rails are multiplied by vccFactor. The bypassed
// part of RE keeps its share of RE. Unused slots stay 0.
func (b Build) Resolve(dev [NumSlots]float64, vccFactor, temp_C float64) Stage {
	return b.resolve(&dev, vccFactor, temp_C)
}

// resolve is Resolve without copying the build.
func (b *Build) resolve(dev *[NumSlots]float64, vccFactor, temp_C float64) Stage {
	return b.resolveTCR(dev, nil, vccFactor, vccFactor, temp_C)
}

// EmitterRailTol is the emitter rail's tolerance: VEETol, else VCCTol.
func (b *Build) EmitterRailTol() float64 {
	if b.VEETol > 0 {
		return b.VEETol
	}
	return b.VCCTol
}

// railsApart reports whether the build has an emitter rail that varies on
// its own (split supply with a tolerance).
func (b *Build) railsApart() bool {
	return b.Topology == SplitSupply && b.EmitterRailTol() > 0
}

// resolveTCR is resolve with each resistor's TCR taken from tcr (ppm/K)
// instead of its stated value (tcr nil means the stated values) and the
// emitter rail multiplied by veeFactor.
func (b *Build) resolveTCR(dev, tcr *[NumSlots]float64, vccFactor, veeFactor, temp_C float64) Stage {
	s := Stage{
		Topology: b.Topology,
		VCC_V:    b.VCC_V * vccFactor,
		Ground:   b.Ground,
		RL_Ohm:   b.RL_Ohm,
	}
	if b.Topology == SplitSupply {
		s.VEE_V = b.VEE_V * veeFactor
	}
	dt := temp_C - TCRReference_C
	for i := range NumSlots {
		if !b.usedSlot(i) {
			continue
		}
		r := b.Resistors[i]
		a := r.TCR_PPMPerK
		if tcr != nil {
			a = tcr[i]
		}
		s.R_Ohm[i] = r.Nominal_Ohm * (1 + dev[i]) * (1 + a*1e-6*dt)
	}
	if re := b.Resistors[RE].Nominal_Ohm; re > 0 && b.RBypass_Ohm > 0 {
		s.RBypass_Ohm = s.R_Ohm[RE] * math.Min(b.RBypass_Ohm/re, 1)
	}
	return s
}

// Input ranges the analyses accept.
const (
	// maxTCR_PPMPerK bounds |TCR|.
	maxTCR_PPMPerK = 10000.0
)

// Validate reports the first bad input of b as an *InputError naming the
// field as the user knows it ("r1", "vcc", "hfe", "ambient" ...).
func (b Build) Validate() error {
	bad := func(field, format string, a ...any) error {
		return &InputError{Field: field, Problem: fmt.Sprintf(format, a...)}
	}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	switch b.Topology {
	case Divider, CollectorFeedback, SplitSupply:
	default:
		return bad("topology", "unknown topology %d", int(b.Topology))
	}
	d := b.Device
	if d.Polarity != NPN && d.Polarity != PNP {
		return bad("polarity", "want npn or pnp")
	}
	sign := d.Polarity.sign()
	if !finite(b.VCC_V) || b.VCC_V*sign <= 0 {
		return bad("vcc", "%g V: an %s stage needs a %s collector rail", b.VCC_V, d.Polarity, signWord(sign))
	}
	if b.Topology == SplitSupply {
		if !finite(b.VEE_V) || b.VEE_V*sign >= 0 {
			return bad("vee", "%g V: an %s split-supply stage needs a %s emitter rail", b.VEE_V, d.Polarity, signWord(-sign))
		}
	}
	if err := SupplyRange.Check(math.Abs(b.VCC_V)); err != nil {
		return err
	}
	if b.Topology == SplitSupply {
		if err := SupplyRange.named("vee").Check(math.Abs(b.VEE_V)); err != nil {
			return err
		}
	}
	if err := CheckTolerance("vcc_tol", b.VCCTol); err != nil {
		return err
	}
	if err := CheckTolerance("vee_tol", b.VEETol); err != nil {
		return err
	}
	for _, i := range b.Topology.Slots() {
		r := b.Resistors[i]
		name := i.String()
		if !finite(r.Nominal_Ohm) || r.Nominal_Ohm < 0 {
			return bad(name, "%g Ω: want a positive resistance", r.Nominal_Ohm)
		}
		if r.Nominal_Ohm == 0 && (i == R1 || i == R2 || i == RF) {
			return bad(name, "missing: the %s stage needs %s > 0", b.Topology, name)
		}
		if r.Nominal_Ohm == 0 {
			continue
		}
		if err := ResistanceRange.named(name).Check(r.Nominal_Ohm); err != nil {
			return err
		}
		if err := r.validateRatings(); err != nil {
			err.Field = name + " " + err.Field
			return err
		}
	}
	if !finite(b.RBypass_Ohm) || b.RBypass_Ohm < 0 || b.RBypass_Ohm > b.Resistors[RE].Nominal_Ohm*(1+1e-12) {
		return bad("bypass", "%g Ω: want 0 up to re (%g Ω)", b.RBypass_Ohm, b.Resistors[RE].Nominal_Ohm)
	}
	if !finite(b.RL_Ohm) || b.RL_Ohm < 0 {
		return bad("load", "%g Ω: want a positive load (or 0 for none)", b.RL_Ohm)
	}
	if err := d.Validate(); err != nil {
		return err
	}
	if b.NominalBeta != 0 {
		if err := HFERange.named("beta").Check(b.NominalBeta); err != nil {
			return err
		}
	}
	if low := math.Abs(b.VCC_V) * (1 - b.VCCTol); d.VCESat_V >= low {
		return &InputError{Field: "vce_sat", Problem: fmt.Sprintf("VCE(sat) %.4g V is not below the lowest supply %.4g V: "+
			"the transistor could never leave saturation", d.VCESat_V, low)}
	}
	if tjMax := tjMaxOf(d); tjMax <= TCRReference_C {
		return bad("tj_max", "%g °C: want above 25 °C", tjMax)
	}
	if err := b.Resolve([NumSlots]float64{}, 1, TCRReference_C).Validate(d.Polarity); err != nil {
		return err
	}
	if err := CheckAmbient(b.AmbientMin_C, b.AmbientMax_C); err != nil {
		return err
	}
	if err := AmbientRange.named("temp").Check(b.NominalAmbient_C); err != nil {
		return err
	}
	if tjMax := tjMaxOf(d); b.AmbientMax_C >= tjMax || b.NominalAmbient_C >= tjMax {
		return bad("ambient", "%g °C reaches the junction limit %g °C", math.Max(b.AmbientMax_C, b.NominalAmbient_C), tjMax)
	}
	return nil
}

// signWord names the sign of a rail.
func signWord(sign float64) string {
	if sign > 0 {
		return "positive"
	}
	return "negative"
}

// derating returns the resistor's knee and zero-power temperatures with
// the defaults applied.
// Validate reports the first bad figure of a resistor as an *InputError
// naming the field ("ohms", "tolerance", "tcr", "power", "derating"): the
// rules a resistor must meet in any build.
func (r ResistorSpec) Validate() error {
	if math.IsNaN(r.Nominal_Ohm) || math.IsInf(r.Nominal_Ohm, 0) || r.Nominal_Ohm <= 0 {
		return &InputError{Field: "ohms", Problem: fmt.Sprintf("%g Ω: want a positive resistance", r.Nominal_Ohm)}
	}
	if err := ResistanceRange.named("ohms").Check(r.Nominal_Ohm); err != nil {
		return err
	}
	if err := r.validateRatings(); err != nil {
		return err
	}
	return nil
}

// validateRatings checks everything of a resistor but its value.
func (r ResistorSpec) validateRatings() *InputError {
	bad := func(field, format string, a ...any) *InputError {
		return &InputError{Field: field, Problem: fmt.Sprintf(format, a...)}
	}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	if err := checkTolerance("tolerance", r.Tol); err != nil {
		return err
	}
	if !finite(r.TCR_PPMPerK) || math.Abs(r.TCR_PPMPerK) > maxTCR_PPMPerK {
		return bad("tcr", "%g ppm/K: want at most ±%g", r.TCR_PPMPerK, maxTCR_PPMPerK)
	}
	if !finite(r.Rated_W) || r.Rated_W < 0 {
		return bad("power", "%g W: want a positive rating (or 0 for unrated)", r.Rated_W)
	}
	if !finite(r.LEV_V) || r.LEV_V < 0 {
		return bad("lev", "%g V: want a positive limiting element voltage (or 0 for the default by rating)", r.LEV_V)
	}
	knee, top := r.derating()
	if !finite(knee) || !finite(top) || knee >= top {
		return bad("derating", "knee %g °C must be below the zero-power temperature %g °C", knee, top)
	}
	return nil
}
