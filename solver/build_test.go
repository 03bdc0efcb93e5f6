package solver

import (
	"errors"
	"math"
	"testing"
)

func TestResolve(t *testing.T) {
	// source: ngspice manual eq. (6), §1.3.1 (REFERENCE.md §3):
	// R(T) = R0[1 + TC1(T − T0)], here with T0 = 25 °C and the tolerance
	// deviation applied to the marked value first.
	b := dividerBuild()
	b.Resistors[RE].TCR_PPMPerK = -500 // carbon film (common practice)
	b.RBypass_Ohm = 500
	var dev [NumSlots]float64
	dev[R1], dev[RE] = 0.05, -0.05
	s := b.Resolve(dev, 0.95, 85)
	tests := []struct {
		name      string
		got, want float64
	}{
		{"R1 +5 % at 85 °C, +100 ppm/K", s.R_Ohm[R1], 10e3 * 1.05 * (1 + 100e-6*60)},
		{"R2 nominal at 85 °C", s.R_Ohm[R2], 5e3 * (1 + 100e-6*60)},
		{"RE −5 % at 85 °C, −500 ppm/K", s.R_Ohm[RE], 1e3 * 0.95 * (1 - 500e-6*60)},
		{"bypass keeps its half of RE", s.RBypass_Ohm, 0.5 * 1e3 * 0.95 * (1 - 500e-6*60)},
		{"VCC −5 %", s.VCC_V, 15 * 0.95},
		{"unused RF stays 0", s.R_Ohm[RF], 0},
	}
	for _, tt := range tests {
		if math.Abs(tt.got-tt.want) > 1e-12*math.Max(1, tt.want) {
			t.Errorf("%s: %g, want %g", tt.name, tt.got, tt.want)
		}
	}
	if n := b.NominalStage(); n.R_Ohm[RC] != 1e3 {
		t.Errorf("nominal stage at 25 °C: RC %g, want the marked 1000", n.R_Ohm[RC])
	}
}

func TestBuildValidate(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(b *Build)
		field string // "" = valid
	}{
		{"valid divider", func(*Build) {}, ""},
		{"RE 0: emitter to ground", func(b *Build) { b.Resistors[RE] = ResistorSpec{} }, ""},
		{"negative resistance", func(b *Build) { b.Resistors[RC].Nominal_Ohm = -1e3 }, "rc"},
		{"missing R1", func(b *Build) { b.Resistors[R1].Nominal_Ohm = 0 }, "r1"},
		{"NaN resistance", func(b *Build) { b.Resistors[R2].Nominal_Ohm = math.NaN() }, "r2"},
		{"tolerance 60 %", func(b *Build) { b.Resistors[R2].Tol = 0.6 }, "r2 tolerance"},
		{"negative rating", func(b *Build) { b.Resistors[RC].Rated_W = -0.25 }, "rc power"},
		{"knee above zero-power temperature", func(b *Build) { b.Resistors[RC].Knee_C = 160 }, "rc derating"},
		{"hFE min above max", func(b *Build) { b.Device.HFEMin, b.Device.HFEMax = 300, 100 }, "hfe_max"},
		{"negative rail for npn", func(b *Build) { b.VCC_V = -15 }, "vcc"},
		{"positive rail for pnp", func(b *Build) { b.Device.Polarity = PNP }, "vcc"},
		{"split supply rail on the wrong side", func(b *Build) {
			b.Topology, b.VEE_V = SplitSupply, 15
			b.Resistors[RB] = ResistorSpec{Nominal_Ohm: 10e3, Tol: 0.05}
		}, "vee"},
		{"ambient below -55 °C", func(b *Build) { b.AmbientMin_C = -60 }, "ambient"},
		{"ambient above 150 °C", func(b *Build) { b.AmbientMax_C = 151 }, "ambient"},
		{"ambient range reversed", func(b *Build) { b.AmbientMin_C, b.AmbientMax_C = 60, -10 }, "ambient"},
		{"ambient at the junction limit", func(b *Build) { b.Device.TjMax_C, b.AmbientMax_C = 120, 130 }, "ambient"},
		// Physically absurd values, each refused against its range in
		// ranges.go (the reasons stand beside each range there).
		{"supply 1e-300 V", func(b *Build) { b.VCC_V = 1e-300 }, "vcc"},
		{"supply 1 GV", func(b *Build) { b.VCC_V = 1e9 }, "vcc"},
		{"beta 1e12", func(b *Build) { b.NominalBeta = 1e12 }, "beta"},
		{"ICBO 1 A", func(b *Build) { b.Device.ICBO_A = 1 }, "icbo"},
		{"VCE(sat) above the supply", func(b *Build) { b.VCC_V, b.Device.VCESat_V = 3, 4.9 }, "vce_sat"},
		{"hFE 1e-30", func(b *Build) { b.Device.HFEMin, b.Device.HFEMax, b.Device.HFETyp = 1e-30, 1e-30, 0 }, "hfe_min"},
		{"Tj max 20 °C", func(b *Build) { b.Device.TjMax_C = 20 }, "tj_max"},
		{"a 1e-30 Ω resistor", func(b *Build) { b.Resistors[RC].Nominal_Ohm = 1e-30 }, "rc"},
		{"nominal ambient out of range", func(b *Build) { b.NominalAmbient_C = 200 }, "temp"},
		{"negative nominal beta", func(b *Build) { b.NominalBeta = -1 }, "beta"},
		{"supply tolerance 50 %", func(b *Build) { b.VCCTol = 0.5 }, "vcc_tol"},
		{"bypass more than RE", func(b *Build) { b.RBypass_Ohm = 2e3 }, "bypass"},
		{"negative load", func(b *Build) { b.RL_Ohm = -1 }, "load"},
		{"unknown topology", func(b *Build) { b.Topology = 0 }, "topology"},
	}
	for _, tt := range tests {
		b := dividerBuild()
		tt.edit(&b)
		err := b.Validate()
		var ie *InputError
		switch {
		case tt.field == "" && err != nil:
			t.Errorf("%s: unexpected error %v", tt.name, err)
		case tt.field != "" && !errors.As(err, &ie):
			t.Errorf("%s: error %v, want an *InputError on %s", tt.name, err, tt.field)
		case tt.field != "" && ie.Field != tt.field:
			t.Errorf("%s: error on %q (%v), want %q", tt.name, ie.Field, err, tt.field)
		}
		if tt.field == "" {
			continue
		}
		// The evaluations refuse the build the same way, never NaN.
		if _, err := EvalWorstCase(b, Limits{}); !errors.As(err, &ie) {
			t.Errorf("%s: EvalWorstCase error %v, want an *InputError", tt.name, err)
		}
		if _, _, err := Nominal(b); !errors.As(err, &ie) {
			t.Errorf("%s: Nominal error %v, want an *InputError", tt.name, err)
		}
	}
}
