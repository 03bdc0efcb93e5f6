package solver

import (
	"fmt"
	"math"
)

// Physical constants (SI, exact since the 2019 redefinition of the base
// units) and the Celsius offset.
const (
	boltzmann_JPerK = 1.380649e-23
	charge_C        = 1.602176634e-19
	kelvinOffset    = 273.15
)

// Model defaults. See doc.go for the sources.
const (
	// DefaultTNOM_C is the model's nominal temperature: datasheet figures
	// are given at 25 °C, so the model is extracted there (SPICE's own
	// default is 27 °C; the netlist writer always states TNOM).
	DefaultTNOM_C = 25.0
	// DefaultXTI is SPICE's IS temperature exponent (ngspice manual §8.2).
	DefaultXTI = 3.0
	// DefaultEG_eV is SPICE's silicon energy gap for IS(T) (ngspice manual §8.2).
	DefaultEG_eV = 1.11
	// DefaultXTB is the beta temperature exponent used for silicon
	// small-signal parts (common practice; SPICE's default 0 keeps beta
	// constant, which real parts do not).
	DefaultXTB = 1.5
	// DefaultBR is SPICE's reverse beta default (ngspice manual §8.2).
	DefaultBR = 1.0
)

// minVAF_V is the smallest Early voltage accepted: below a few volts the
// Early factor 1 − VBC/VAF would change sign inside saturation.
const minVAF_V = 2.0

// Temperature limits accepted by the solver.
const (
	// MinTemp_C and MaxTemp_C bound every ambient temperature.
	MinTemp_C = -55.0
	MaxTemp_C = 150.0
	// MaxTj_C bounds the junction temperature a model is evaluated at
	// (metal-can parts are rated to 200 °C).
	MaxTj_C = 200.0
)

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
	// VBEMin_V and VBEMax_V are the part-to-part VBE(on) range of the
	// line at VBEAt_A and 25 °C; both 0 = VBE(on) ± DefaultVBESpread_V.
	VBEMin_V, VBEMax_V float64
	// VAFMin_V and VAFMax_V are the part-to-part Early-voltage range;
	// both 0 = every part has VAF_V.
	VAFMin_V, VAFMax_V float64
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

// Validate reports the first non-physical field of d as an *InputError.
// Zero optional fields are fine (they take the documented defaults).
func (d Datasheet) Validate() error {
	if d.Polarity != NPN && d.Polarity != PNP {
		return &InputError{Field: "polarity", Problem: "want npn or pnp"}
	}
	checks := []struct {
		field string
		v     float64
	}{
		{"hfe_min", d.HFEMin}, {"hfe_max", d.HFEMax}, {"hfe_typ", d.HFETyp},
		{"hfe_at", d.HFEAt_A}, {"vbe_on", d.VBEOn_V}, {"vbe_at", d.VBEAt_A},
		{"vce_sat", d.VCESat_V}, {"vceo", d.VCEO_V}, {"ic_max", d.ICMax_A},
		{"pd", d.PD25_W}, {"theta_ja", d.ThetaJA_KPerW}, {"tj_max", d.TjMax_C},
		{"vaf", d.VAF_V}, {"icbo", d.ICBO_A},
		{"vbe_min", d.VBEMin_V}, {"vbe_max", d.VBEMax_V}, {"vaf_min", d.VAFMin_V}, {"vaf_max", d.VAFMax_V},
	}
	for _, c := range checks {
		if math.IsNaN(c.v) || math.IsInf(c.v, 0) {
			return &InputError{Field: c.field, Problem: "not a finite number"}
		}
		if c.v < 0 {
			return &InputError{Field: c.field, Problem: fmt.Sprintf("%g is negative; give the magnitude", c.v)}
		}
	}
	for _, c := range []struct {
		r Range
		v float64
	}{
		{HFERange.named("hfe_min"), d.HFEMin}, {HFERange.named("hfe_max"), d.HFEMax},
		{ICBORange, d.ICBO_A}, {VCESatRange, d.VCESat_V},
	} {
		if err := c.r.Check(c.v); err != nil {
			return err
		}
	}
	if d.HFETyp != 0 {
		if err := HFERange.named("hfe_typ").Check(d.HFETyp); err != nil {
			return err
		}
	}
	if d.TjMax_C != 0 {
		if err := TjMaxRange.Check(d.TjMax_C); err != nil {
			return err
		}
	}
	if d.VBEOn_V != 0 {
		if err := JunctionVoltageRange.Check(d.VBEOn_V); err != nil {
			return err
		}
	}
	if d.HFEMax < d.HFEMin {
		return &InputError{Field: "hfe_max", Problem: fmt.Sprintf("%g is below hfe_min %g", d.HFEMax, d.HFEMin)}
	}
	if d.HFETyp != 0 && (d.HFETyp < d.HFEMin || d.HFETyp > d.HFEMax) {
		return &InputError{Field: "hfe_typ", Problem: fmt.Sprintf("%g is outside hfe_min..hfe_max %g..%g", d.HFETyp, d.HFEMin, d.HFEMax)}
	}
	if d.VAF_V > 0 && d.VAF_V < minVAF_V {
		return &InputError{Field: "vaf", Problem: fmt.Sprintf("%g V is not an Early voltage (want >= %g V, 0 = infinite)", d.VAF_V, minVAF_V)}
	}
	if err := d.validateRanges(); err != nil {
		return err
	}
	return nil
}

// ModelFor builds the SPICE model for a datasheet at forward beta bf
// (the hFE under analysis, at TNOM).
//
// IS is fitted so that the transport collector current
// IS·(exp(VBE(on)/(NF·VT))−1) equals the VBE(on) test current at TNOM.
// Datasheets state VBE(on) against IC, and in the forward-active region the
// Ebers–Moll collector current is exactly that transport term (the
// base-collector terms vanish and, with the Early factor taken at VCB = 0,
// so does VAF), so no base-current correction is applied.
func ModelFor(d Datasheet, bf float64) (Model, error) {
	if err := d.Validate(); err != nil {
		return Model{}, fmt.Errorf("model for %q: %w", d.Label, err)
	}
	if !(bf > 0) || math.IsInf(bf, 0) {
		return Model{}, fmt.Errorf("model for %q: %w", d.Label, &InputError{Field: "bf", Problem: fmt.Sprintf("%g: want a finite forward beta > 0", bf)})
	}
	m := Model{
		Polarity: d.Polarity,
		IS_A:     isFor(d, vbeOnOf(d)),
		BF:       bf,
		BR:       DefaultBR,
		NF:       1,
		VAF_V:    vafOf(d),
		XTI:      DefaultXTI,
		XTB:      DefaultXTB,
		EG_eV:    DefaultEG_eV,
		TNOM_C:   DefaultTNOM_C,
		ICBO_A:   d.ICBO_A,
	}
	if err := m.Validate(); err != nil {
		return Model{}, fmt.Errorf("model for %q: %w", d.Label, err)
	}
	return m, nil
}

// Validate reports the first non-physical parameter of m as an *InputError.
func (m Model) Validate() error {
	if m.Polarity != NPN && m.Polarity != PNP {
		return &InputError{Field: "model polarity", Problem: "want npn or pnp"}
	}
	pos := []struct {
		field string
		v     float64
	}{{"is", m.IS_A}, {"bf", m.BF}, {"br", m.BR}, {"nf", m.NF}, {"eg", m.EG_eV}}
	for _, c := range pos {
		if !(c.v > 0) || math.IsInf(c.v, 0) {
			return &InputError{Field: c.field, Problem: fmt.Sprintf("%g: want a finite value > 0", c.v)}
		}
	}
	if m.IS_A > 1e-6 {
		return &InputError{Field: "is", Problem: fmt.Sprintf("%g A is not a transistor saturation current", m.IS_A)}
	}
	fin := []struct {
		field string
		v     float64
	}{{"vaf", m.VAF_V}, {"xti", m.XTI}, {"xtb", m.XTB}, {"tnom", m.TNOM_C}, {"icbo", m.ICBO_A}}
	for _, c := range fin {
		if math.IsNaN(c.v) || math.IsInf(c.v, 0) {
			return &InputError{Field: c.field, Problem: "not a finite number"}
		}
	}
	if m.VAF_V < 0 {
		return &InputError{Field: "vaf", Problem: fmt.Sprintf("%g V is negative; give the magnitude (0 = infinite)", m.VAF_V)}
	}
	if m.VAF_V > 0 && m.VAF_V < minVAF_V {
		return &InputError{Field: "vaf", Problem: fmt.Sprintf("%g V is not an Early voltage (want >= %g V, 0 = infinite)", m.VAF_V, minVAF_V)}
	}
	if m.ICBO_A < 0 {
		return &InputError{Field: "icbo", Problem: fmt.Sprintf("%g A is negative; give the magnitude", m.ICBO_A)}
	}
	if m.TNOM_C < MinTemp_C || m.TNOM_C > MaxTemp_C {
		return &InputError{Field: "tnom", Problem: fmt.Sprintf("%g °C is outside %g..%g °C", m.TNOM_C, MinTemp_C, MaxTemp_C)}
	}
	return nil
}

// thermalVoltage is kT/q at temp_C.
func thermalVoltage(temp_C float64) float64 {
	return boltzmann_JPerK * (temp_C + kelvinOffset) / charge_C
}

// ThermalVoltage_V returns VT = kT/q at temp_C (°C) with the SI constants.
func ThermalVoltage_V(temp_C float64) float64 { return thermalVoltage(temp_C) }

// device is a Model evaluated at one junction temperature, in the
// mirrored-NPN frame (all quantities forward-referenced).
type device struct {
	is     float64 // IS(T)
	bf, br float64 // BF(T), BR(T)
	nvt    float64 // NF·VT, forward emission
	vt     float64 // VT (reverse junction, NR = 1)
	invVAF float64 // 1/VAF, 0 when infinite
	ileak  float64 // ICBO(T), collector to base
	// critBE, critBC are SPICE's critical junction voltages
	// VT·ln(VT/(√2·IS)), above which pnjlim limits a step.
	critBE, critBC float64
	// lnCrit0 holds ln(N·VT/(√2·IS)) at TNOM for the base-emitter (N =
	// NF) and base-collector (N = 1) junctions: model constants from
	// which reheat finds the critical voltages at another temperature
	// without a logarithm of their own.
	lnCrit0 [2]float64
}

// At returns the temperature-dependent parameters of m at tj_C exactly as
// SPICE computes them (ngspice bjttemp.c, TLEV = 0): IS(T), BF(T), BR(T),
// and the leakage ICBO(T) doubled every 10 K.
func (m Model) At(tj_C float64) (is_A, bf, br, icbo_A float64) {
	d := m.at(tj_C)
	return d.is, d.bf, d.br, d.ileak
}

func (m Model) at(tj_C float64) device {
	t0 := m.TNOM_C + kelvinOffset
	vt0 := boltzmann_JPerK * t0 / charge_C
	lnBC := math.Log(vt0 / (math.Sqrt2 * m.IS_A))
	lnBE := lnBC
	if m.NF != 1 {
		lnBE += math.Log(m.NF)
	}
	d := device{lnCrit0: [2]float64{lnBE, lnBC}}
	m.reheat(&d, tj_C)
	return d
}

// reheat sets d to m at tj_C, keeping d's model constants lnCrit0 (see
// device).
func (m *Model) reheat(d *device, tj_C float64) {
	lnCrit0 := d.lnCrit0
	t := tj_C + kelvinOffset
	t0 := m.TNOM_C + kelvinOffset
	vt := boltzmann_JPerK * t / charge_C
	ratlog := math.Log(t / t0)
	factlog := (t/t0-1)*m.EG_eV/vt + m.XTI*ratlog
	bfactor := math.Exp(ratlog * m.XTB)
	*d = device{
		is:      m.IS_A * math.Exp(factlog),
		bf:      m.BF * bfactor,
		br:      m.BR * bfactor,
		nvt:     m.NF * vt,
		vt:      vt,
		ileak:   0,
		lnCrit0: lnCrit0,
	}
	if m.VAF_V > 0 {
		d.invVAF = 1 / m.VAF_V
	}
	// ln(N·VT/(√2·IS(T))) = ln(N·VT0/(√2·IS)) + ln(T/T0) − factlog, as
	// VT ∝ T and IS(T) = IS·exp(factlog).
	d.critBE = d.nvt * (lnCrit0[0] + ratlog - factlog)
	d.critBC = d.vt * (lnCrit0[1] + ratlog - factlog)
	if m.ICBO_A > 0 {
		d.ileak = m.ICBO_A * math.Exp2((tj_C-m.TNOM_C)/10)
	}
}
