package solver

import "math"

// Swing is the load-line and swing analysis at a Q-point. Currents and
// voltages are forward-referenced magnitudes, as in OperatingPoint.
type Swing struct {
	RDC_Ohm      float64 // DC load: RC + RE
	RAC_Ohm      float64 // AC load: RC‖RL + unbypassed RE
	ICSatDC_A    float64 // DC load line end on the IC axis: rail span / RDC
	VCECutDC_V   float64 // DC load line end on the VCE axis: the rail span
	ICSatAC_A    float64 // AC load line end: ICQ + VCEQ/rac
	VCECutAC_V   float64 // AC load line end: VCEQ + ICQ·rac
	VPeak_V      float64 // maximum symmetrical peak swing at the collector
	ClipsFirst   string  // "cutoff" or "saturation"
	OptimumIC_A  float64 // Q-point that maximises symmetrical swing
	OptimumVCE_V float64
	// VPeakLoad_V is the peak the load sees: VPeak·(RC‖RL)/rac, less than
	// VPeak when part of RE is unbypassed.
	VPeakLoad_V float64
	// OptimumVPeak_V is the symmetrical peak swing at the optimum Q-point.
	OptimumVPeak_V float64
}

// Clipping sides named in Swing.ClipsFirst.
const (
	ClipCutoff     = "cutoff"
	ClipSaturation = "saturation"
)

// EvalSwing computes the load lines and symmetrical swing at op
// (REFERENCE.md §7):
//
//	rac = RC‖RL + (RE − RBypass)    (RL = 0: no load, rac = RC + unbypassed RE)
//	ic(sat) = ICQ + VCEQ/rac,  vce(cut) = VCEQ + ICQ·rac
//	Vpk = min(ICQ·rac, VCEQ − VCE(sat))
//
// Cutoff clips first when ICQ·rac is the smaller term (ties count as
// cutoff). The optimum Q-point centres Q on the AC load line within the DC
// one: ICQ = (Vspan − VCE(sat))/(RDC + rac), VCEQ = VCE(sat) + ICQ·rac,
// where Vspan is the rail span (|VCC|, or |VCC − VEE| for split supply).
// The DC load line treats RC as carrying IC only.
func EvalSwing(s Stage, op OperatingPoint, vceSat_V float64) Swing {
	rc, re := s.R_Ohm[RC], s.R_Ohm[RE]
	span := math.Abs(s.VCC_V)
	if s.Topology == SplitSupply {
		span = math.Abs(s.VCC_V - s.VEE_V)
	}
	rcl := rc
	if s.RL_Ohm > 0 {
		rcl = rc * s.RL_Ohm / (rc + s.RL_Ohm)
	}
	unbypassed := math.Max(0, re-s.RBypass_Ohm)
	sw := Swing{
		RDC_Ohm:    rc + re,
		RAC_Ohm:    rcl + unbypassed,
		VCECutDC_V: span,
	}
	if sw.RDC_Ohm > 0 {
		sw.ICSatDC_A = span / sw.RDC_Ohm
	}
	ic, vce := math.Max(op.IC_A, 0), op.VCE_V
	if sw.RAC_Ohm > 0 {
		sw.ICSatAC_A = ic + vce/sw.RAC_Ohm
	}
	sw.VCECutAC_V = vce + ic*sw.RAC_Ohm
	toCut := ic * sw.RAC_Ohm
	toSat := vce - vceSat_V
	sw.ClipsFirst = ClipCutoff
	if toSat < toCut {
		sw.ClipsFirst = ClipSaturation
	}
	sw.VPeak_V = math.Max(0, math.Min(toCut, toSat))
	if sw.RAC_Ohm > 0 {
		sw.VPeakLoad_V = sw.VPeak_V * rcl / sw.RAC_Ohm
	}
	if d := sw.RDC_Ohm + sw.RAC_Ohm; d > 0 && span > vceSat_V {
		sw.OptimumIC_A = (span - vceSat_V) / d
		sw.OptimumVCE_V = vceSat_V + sw.OptimumIC_A*sw.RAC_Ohm
		sw.OptimumVPeak_V = sw.OptimumIC_A * sw.RAC_Ohm
	}
	return sw
}
