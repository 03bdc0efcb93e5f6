package solver

import (
	"math"
	"testing"
)

func TestEvalSwing(t *testing.T) {
	near := func(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }
	tests := []struct {
		name    string
		source  string
		s       Stage
		op      OperatingPoint
		vceSat  float64
		rac     float64
		icSatAC float64
		vceCut  float64
		vpk     float64
		clips   string
		optIC   float64
		optVCE  float64
		rel     float64
	}{
		{
			// Book: ICQ 147 mA, VCEQ 9 V, rc 72 Ω, ic(sat) 273 mA,
			// vce(cut) 19.7 V, MPP 18 V with VCE(sat) taken as 0; book
			// values are rounded, so 2 %.
			name:   "RE fully bypassed, loaded",
			source: "source: Malvino & Bates, Electronic Principles, 7th ed., Ex. 12-1/12-2/12-4, pp. 384-387",
			s: Stage{Topology: Divider, VCC_V: 30, R_Ohm: [NumSlots]float64{R1: 490, R2: 68, RC: 120, RE: 20},
				RBypass_Ohm: 20, RL_Ohm: 180},
			op:      OperatingPoint{Region: Active, IC_A: 0.147, VCE_V: 9},
			vceSat:  0,
			rac:     72,
			icSatAC: 0.273,
			vceCut:  19.7,
			vpk:     9, // MPP 18 V
			clips:   ClipSaturation,
			optIC:   -1,
			rel:     0.02,
		},
		{
			// Derived check values, REFERENCE.md §7 [D]: rac 1803.3 Ω,
			// optimum ICQ 2.638 mA, VCEQ 4.957 V, Vpk 4.757 V.
			name:   "optimum Q, RE bypassed, 10k load",
			source: "source: REFERENCE.md §7 derived check (12 V, 2.2k, 470 Ω bypassed, 10k load, VCE(sat) 0.2 V)",
			s: Stage{Topology: Divider, VCC_V: 12, R_Ohm: [NumSlots]float64{R1: 10e3, R2: 2.2e3, RC: 2200, RE: 470},
				RBypass_Ohm: 470, RL_Ohm: 10e3},
			op:      OperatingPoint{Region: Active, IC_A: 2.638e-3, VCE_V: 4.957},
			vceSat:  0.2,
			rac:     1803.3,
			icSatAC: 2.638e-3 + 4.957/1803.3,
			vceCut:  4.957 + 2.638e-3*1803.3,
			vpk:     4.757,
			clips:   "",
			optIC:   2.638e-3,
			optVCE:  4.957,
			rel:     0.0005,
		},
		{
			// PNP mirror of the first case: signed rails, magnitudes out.
			name:   "PNP mirror",
			source: "source: Malvino & Bates, Electronic Principles, 7th ed., Ex. 12-2 (mirrored for PNP)",
			s: Stage{Topology: Divider, VCC_V: -30, R_Ohm: [NumSlots]float64{R1: 490, R2: 68, RC: 120, RE: 20},
				RBypass_Ohm: 20, RL_Ohm: 180},
			op:      OperatingPoint{Region: Active, IC_A: 0.147, VCE_V: 9},
			rac:     72,
			icSatAC: 0.273,
			vceCut:  19.7,
			vpk:     9,
			clips:   ClipSaturation,
			optIC:   -1,
			rel:     0.02,
		},
		{
			// Part of RE unbypassed: the collector sees rac = RC‖RL + RE1
			// (REFERENCE.md §19, the standard textbook treatment of the
			// swamped amplifier, from memory), here 2.2k‖4.7k + 220 Ω =
			// 1718.551 Ω. Q from the exact Thevenin solution at β = 100,
			// VBE 0.7 V: ICQ 1.24050 mA, VCEQ 7.96801 V; the book
			// formulas then give ic(sat) 5.8770 mA, vce(cut) 10.0998 V,
			// MPP 4.2636 V, cutoff first (REFERENCE.md §19 worked numbers).
			name:   "RE partly bypassed, loaded",
			source: "source: REFERENCE.md §19 partly-bypassed example (12 V, 47k/10k, 2.2k, 220 Ω + 820 Ω bypassed, 4.7k load)",
			s: Stage{Topology: Divider, VCC_V: 12, R_Ohm: [NumSlots]float64{R1: 47e3, R2: 10e3, RC: 2200, RE: 1040},
				RBypass_Ohm: 820, RL_Ohm: 4700},
			op:      OperatingPoint{Region: Active, IC_A: 1.24050e-3, VCE_V: 7.96801},
			rac:     1718.551,
			icSatAC: 5.8770e-3,
			vceCut:  10.0998,
			vpk:     4.2636 / 2,
			clips:   ClipCutoff,
			optIC:   -1,
			rel:     2e-4,
		},
		{
			// Q low on the load line: ICQ·rac = 1 mA × 1 k = 1 V < VCEQ − VCE(sat).
			name:   "cutoff clips first",
			source: "source: REFERENCE.md §7 clipping rule (Malvino & Bates 7th ed. Ex. 12-2 form)",
			s:      Stage{Topology: Divider, VCC_V: 12, R_Ohm: [NumSlots]float64{R1: 10e3, R2: 2.2e3, RC: 1000, RE: 1000}, RBypass_Ohm: 1000},
			op:     OperatingPoint{Region: Active, IC_A: 1e-3, VCE_V: 10},
			vceSat: 0.2,
			rac:    1000, icSatAC: 11e-3, vceCut: 11, vpk: 1, clips: ClipCutoff,
			optIC: (12 - 0.2) / 3000, optVCE: 0.2 + (12-0.2)/3, rel: 1e-9,
		},
	}
	for _, tt := range tests {
		sw := EvalSwing(tt.s, tt.op, tt.vceSat)
		if !near(sw.RAC_Ohm, tt.rac, tt.rel) || !near(sw.ICSatAC_A, tt.icSatAC, tt.rel) ||
			!near(sw.VCECutAC_V, tt.vceCut, tt.rel) || !near(sw.VPeak_V, tt.vpk, tt.rel) {
			t.Errorf("%s (%s): rac %g ic(sat) %g vce(cut) %g Vpk %g; want %g %g %g %g",
				tt.name, tt.source, sw.RAC_Ohm, sw.ICSatAC_A, sw.VCECutAC_V, sw.VPeak_V, tt.rac, tt.icSatAC, tt.vceCut, tt.vpk)
		}
		if tt.clips != "" && sw.ClipsFirst != tt.clips {
			t.Errorf("%s (%s): clips first on %s, want %s", tt.name, tt.source, sw.ClipsFirst, tt.clips)
		}
		if tt.optIC > 0 && (!near(sw.OptimumIC_A, tt.optIC, tt.rel) || !near(sw.OptimumVCE_V, tt.optVCE, tt.rel)) {
			t.Errorf("%s (%s): optimum Q %g A %g V, want %g A %g V", tt.name, tt.source, sw.OptimumIC_A, sw.OptimumVCE_V, tt.optIC, tt.optVCE)
		}
	}
	// At the optimum both sides clip together (REFERENCE.md §7 centring
	// condition): evaluating at the optimum Q gives its own Vpk.
	s := tests[1].s
	sw := EvalSwing(s, OperatingPoint{IC_A: 2.638e-3, VCE_V: 4.957}, 0.2)
	at := EvalSwing(s, OperatingPoint{IC_A: sw.OptimumIC_A, VCE_V: sw.OptimumVCE_V}, 0.2)
	if !near(at.VPeak_V, sw.OptimumVPeak_V, 1e-9) || !near(at.OptimumVPeak_V, 4.757, 0.0005) {
		t.Errorf("swing at the optimum Q = %g V, want %g V (4.757 V, REFERENCE.md §7)", at.VPeak_V, sw.OptimumVPeak_V)
	}
}

func TestEvalSwingDCLoadLine(t *testing.T) {
	// source: REFERENCE.md §7 DC load line, IC(sat) = VCC/(RC+RE),
	// VCE(cut) = VCC (Malvino & Bates 7th ed. ch. 8; from memory); split
	// supply spans both rails (REFERENCE.md §6, VCE = VCC + VEE − ...).
	tests := []struct {
		name          string
		s             Stage
		icSat, vceCut float64
	}{
		{"divider 30 V, 120+20 Ω", Stage{Topology: Divider, VCC_V: 30, R_Ohm: [NumSlots]float64{RC: 120, RE: 20}}, 30.0 / 140, 30},
		{"split supply ±15 V, 10k+20k", Stage{Topology: SplitSupply, VCC_V: 15, VEE_V: -15, R_Ohm: [NumSlots]float64{RC: 10e3, RE: 20e3}}, 30.0 / 30e3, 30},
		{"pnp split supply", Stage{Topology: SplitSupply, VCC_V: -15, VEE_V: 15, R_Ohm: [NumSlots]float64{RC: 10e3, RE: 20e3}}, 30.0 / 30e3, 30},
	}
	for _, tt := range tests {
		sw := EvalSwing(tt.s, OperatingPoint{IC_A: 1e-3, VCE_V: 5}, 0.2)
		if math.Abs(sw.ICSatDC_A-tt.icSat) > 1e-12 || math.Abs(sw.VCECutDC_V-tt.vceCut) > 1e-12 {
			t.Errorf("%s: DC load line %g A / %g V, want %g A / %g V", tt.name, sw.ICSatDC_A, sw.VCECutDC_V, tt.icSat, tt.vceCut)
		}
	}
}
