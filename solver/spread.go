package solver

import (
	"fmt"
	"math"
)

// This file holds the part-to-part ranges of the transistor (VBE(on) and
// the Early voltage) and the list of every uncertain input of a build with
// the bounds and distribution the Monte Carlo yield draws it from. The
// worst-case corners and the RSS spread take the same bounds from here.

// isFor returns the transport saturation current at TNOM that gives
// VBE(on) = vbe_V at d's VBE(on) test current (see ModelFor).
func isFor(d Datasheet, vbe_V float64) float64 {
	return vbeAtOf(d) / math.Expm1(vbe_V/thermalVoltage(DefaultTNOM_C))
}

// vafOf returns the nominal Early voltage of d: VAF_V, else the middle of
// a stated range, else 0 (infinite).
func vafOf(d Datasheet) float64 {
	if d.VAF_V > 0 {
		return d.VAF_V
	}
	if d.VAFMin_V > 0 && d.VAFMax_V > 0 {
		return 0.5 * (d.VAFMin_V + d.VAFMax_V)
	}
	return 0
}

// VBEOnRange returns the part-to-part range of VBE(on) (magnitudes, at
// the VBE(on) test current and 25 °C) the analyses draw from: the stocked
// vbe_min..vbe_max, else the nominal VBE(on) ± DefaultVBESpread_V.
// stated is false for the default.
func VBEOnRange(d Datasheet) (lo_V, hi_V float64, stated bool) {
	if d.VBEMin_V > 0 && d.VBEMax_V > 0 {
		return d.VBEMin_V, d.VBEMax_V, true
	}
	v := vbeOnOf(d)
	return v - DefaultVBESpread_V, v + DefaultVBESpread_V, false
}

// VAFRange returns the part-to-part Early-voltage range the analyses draw
// from: the stocked vaf_min..vaf_max, else one value (lo = hi = the
// nominal, 0 = infinite).
func VAFRange(d Datasheet) (lo_V, hi_V float64) {
	if d.VAFMin_V > 0 && d.VAFMax_V > 0 {
		return d.VAFMin_V, d.VAFMax_V
	}
	v := vafOf(d)
	return v, v
}

// validateRanges checks the part-to-part ranges of d (after the sign and
// finiteness checks of Validate).
func (d Datasheet) validateRanges() error {
	pair := func(lo, hi float64, loName, hiName string) error {
		if (lo > 0) != (hi > 0) {
			return &InputError{Field: loName, Problem: fmt.Sprintf("%s and %s go together: give both or neither", loName, hiName)}
		}
		if hi < lo {
			return &InputError{Field: hiName, Problem: fmt.Sprintf("%g V is below %s %g V", hi, loName, lo)}
		}
		return nil
	}
	if err := pair(d.VBEMin_V, d.VBEMax_V, "vbe_min", "vbe_max"); err != nil {
		return err
	}
	if d.VBEMin_V > 0 {
		if !JunctionVoltageRange.Contains(d.VBEMin_V) || !JunctionVoltageRange.Contains(d.VBEMax_V) {
			return &InputError{Field: "vbe_min", Problem: fmt.Sprintf("%g..%g V is not a junction voltage range (want within %s: %s)",
				d.VBEMin_V, d.VBEMax_V, JunctionVoltageRange.Span(), JunctionVoltageRange.Why), Range: &JunctionVoltageRange}
		}
		if d.VBEOn_V > 0 && (d.VBEOn_V < d.VBEMin_V || d.VBEOn_V > d.VBEMax_V) {
			return &InputError{Field: "vbe_on", Problem: fmt.Sprintf("%g V is outside vbe_min..vbe_max %g..%g V", d.VBEOn_V, d.VBEMin_V, d.VBEMax_V)}
		}
	}
	if err := pair(d.VAFMin_V, d.VAFMax_V, "vaf_min", "vaf_max"); err != nil {
		return err
	}
	if d.VAFMin_V > 0 {
		if d.VAFMin_V < minVAF_V {
			return &InputError{Field: "vaf_min", Problem: fmt.Sprintf("%g V is not an Early voltage (want >= %g V)", d.VAFMin_V, minVAF_V)}
		}
		if d.VAF_V > 0 && (d.VAF_V < d.VAFMin_V || d.VAF_V > d.VAFMax_V) {
			return &InputError{Field: "vaf", Problem: fmt.Sprintf("%g V is outside vaf_min..vaf_max %g..%g V", d.VAF_V, d.VAFMin_V, d.VAFMax_V)}
		}
	}
	return nil
}

// Distribution names, as reported.
const (
	// DistRectangular is the uniform distribution between two limits.
	DistRectangular = "rectangular"
	// DistTruncatedNormal is a normal distribution with σ = a/3,
	// truncated at ±a.
	DistTruncatedNormal = "normal σ = a/3, truncated at ±a"
	// DistLogRectangular is uniform in the logarithm between two limits.
	DistLogRectangular = "log-rectangular"
	// DistSwept is an input that is not drawn but covered over its whole
	// range for every board.
	DistSwept = "swept"
)

// whyRectangular is the reason for a rectangular draw.
const whyRectangular = "only the limits are known: rectangular by maximum entropy (JCGM 101:2008 §6.4.2.1)"

// Uncertainty is one uncertain input of a build: its range, how the Monte
// Carlo yield draws it, and why. The worst-case corners take each input
// at both ends of the same range and the RSS spread uses its standard
// uncertainty.
type Uncertainty struct {
	Input        string  // "r1" .. "rb", "r1 tcr" .., "vcc", "hfe", "vbe_on", "vaf", "ambient"
	Unit         string  // "Ω", "ppm/K", "V", "1", "°C"
	Low, High    float64 // the range, in Unit (for a resistor: the marked value ± tolerance)
	Distribution string  // DistRectangular, ...
	Basis        string  // why this distribution and where the range comes from
}

// Uncertainties lists every uncertain input of b with the distribution
// opt draws it from, in the order the Monte Carlo draws them. An input
// without spread is left out.
func Uncertainties(b Build, opt YieldOptions) []Uncertainty {
	var out []Uncertainty
	for i := range NumSlots {
		if !b.usedSlot(i) || b.Resistors[i].Tol <= 0 {
			continue
		}
		r := b.Resistors[i]
		u := Uncertainty{Input: i.String(), Unit: "Ω", Low: r.Nominal_Ohm * (1 - r.Tol), High: r.Nominal_Ohm * (1 + r.Tol),
			Distribution: DistRectangular, Basis: "marked value ± tolerance; " + whyRectangular}
		if opt.Resistors == ResistorNormal {
			u.Distribution = DistTruncatedNormal
			u.Basis = "marked value ± tolerance taken as ±3σ (common practice, REFERENCE.md §9)"
		}
		out = append(out, u)
	}
	for i := range NumSlots {
		if !b.usedSlot(i) || b.Resistors[i].TCR_PPMPerK == 0 {
			continue
		}
		a := math.Abs(b.Resistors[i].TCR_PPMPerK)
		out = append(out, Uncertainty{Input: i.String() + " tcr", Unit: "ppm/K", Low: -a, High: a,
			Distribution: DistRectangular, Basis: "± the stated TCR bound; " + whyRectangular})
	}
	if b.VCCTol > 0 {
		v := math.Abs(b.VCC_V)
		out = append(out, Uncertainty{Input: "vcc", Unit: "V", Low: v * (1 - b.VCCTol), High: v * (1 + b.VCCTol),
			Distribution: DistRectangular, Basis: "nominal ± supply tolerance; " + whyRectangular})
	}
	d := b.Device
	if d.HFEMax > d.HFEMin {
		u := Uncertainty{Input: "hfe", Unit: "1", Low: d.HFEMin, High: d.HFEMax,
			Distribution: DistRectangular, Basis: "datasheet hFE min..max; " + whyRectangular}
		if opt.Beta == BetaLogUniform {
			u.Distribution = DistLogRectangular
			u.Basis = "datasheet hFE min..max, uniform in log hFE (REFERENCE.md §9)"
		}
		out = append(out, u)
	}
	lo, hi, stated := VBEOnRange(d)
	basis := "stocked vbe_min..vbe_max; " + whyRectangular
	if !stated {
		basis = fmt.Sprintf("VBE(on) ± %g mV part to part, none stocked (common practice, from memory, REFERENCE.md §21); %s", 1e3*DefaultVBESpread_V, whyRectangular)
	}
	out = append(out, Uncertainty{Input: "vbe_on", Unit: "V", Low: lo, High: hi, Distribution: DistRectangular, Basis: basis})
	if lo, hi := VAFRange(d); hi > lo {
		out = append(out, Uncertainty{Input: "vaf", Unit: "V", Low: lo, High: hi,
			Distribution: DistRectangular, Basis: "stocked vaf_min..vaf_max; " + whyRectangular})
	}
	if b.railsApart() {
		v, tol := math.Abs(b.VEE_V), b.EmitterRailTol()
		out = append(out, Uncertainty{Input: "vee", Unit: "V", Low: v * (1 - tol), High: v * (1 + tol),
			Distribution: DistRectangular, Basis: "nominal ± the emitter rail's tolerance, a supply of its own; " + whyRectangular})
	}
	if b.AmbientMax_C > b.AmbientMin_C {
		out = append(out, Uncertainty{Input: "ambient", Unit: "°C", Low: b.AmbientMin_C, High: b.AmbientMax_C,
			Distribution: DistSwept, Basis: "every board must work over the whole range, so it is solved at both ends (and at a turning point between), not sampled (common practice, REFERENCE.md §9)"})
	}
	return out
}
