package solver

import (
	"math"
	"testing"
)

func TestResistorAllowed(t *testing.T) {
	// source: REFERENCE.md §3, derating curve of IEC 60115-1 style (rated
	// ambient 70 °C, upper category temperature 155 °C; from memory for the
	// clause), check values for P70 = 0.25 W to 4 digits.
	tests := []struct {
		ambient_C, want_W float64
	}{
		{25, 0.25},    // below the knee: full rating
		{70, 0.25},    // at the knee
		{85, 0.2059},  // source: REFERENCE.md §3
		{100, 0.1618}, // source: REFERENCE.md §3
		{125, 0.0882}, // source: REFERENCE.md §3
		{155, 0},      // at the upper category temperature
		{170, 0},      // beyond it
	}
	for _, tt := range tests {
		got := ResistorAllowed_W(0.25, DefaultResistorKnee_C, DefaultResistorMax_C, tt.ambient_C)
		if math.Abs(got-tt.want_W) > 0.00006 {
			t.Errorf("ResistorAllowed_W(0.25 W, %g °C) = %.5f W, want %.4f W", tt.ambient_C, got, tt.want_W)
		}
	}
}

func TestTransistorAllowed(t *testing.T) {
	// source: Malvino & Bates, Electronic Principles, 7th ed., Ex. 12-14,
	// p. 414: 625 mW at 25 °C derated 5 mW/°C gives 500 mW at 50 °C
	// (θJA = 200 °C/W, TjMax 150 °C); 325 mW at 85 °C is derived from the
	// same numbers (REFERENCE.md §8).
	tests := []struct {
		name      string
		d         Datasheet
		ambient_C float64
		want_W    float64
		rated     bool
	}{
		{"PD25 only, 50 °C", Datasheet{PD25_W: 0.625, TjMax_C: 150}, 50, 0.500, true},
		{"PD25 only, 85 °C", Datasheet{PD25_W: 0.625, TjMax_C: 150}, 85, 0.325, true},
		{"PD25 only, default TjMax, 50 °C", Datasheet{PD25_W: 0.625}, 50, 0.500, true},
		{"thetaJA 200, 50 °C", Datasheet{ThetaJA_KPerW: 200, TjMax_C: 150}, 50, 0.500, true},
		{"PD25 caps below 25 °C", Datasheet{PD25_W: 0.625, ThetaJA_KPerW: 200, TjMax_C: 150}, 0, 0.625, true},
		{"at TjMax nothing is allowed", Datasheet{ThetaJA_KPerW: 200, TjMax_C: 150}, 150, 0, true},
		{"no rating", Datasheet{}, 50, 0, false},
	}
	for _, tt := range tests {
		got, rated := TransistorAllowed_W(tt.d, tt.ambient_C)
		if rated != tt.rated || math.Abs(got-tt.want_W) > 1e-9 {
			t.Errorf("%s: TransistorAllowed_W = %g W, %v; want %g W, %v", tt.name, got, rated, tt.want_W, tt.rated)
		}
	}
}

func TestEvalDissipation(t *testing.T) {
	b := Build{
		Topology: Divider,
		VCC_V:    12,
		Device:   Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 300, PD25_W: 0.625, TjMax_C: 150},
	}
	for _, s := range []Slot{R1, R2, RC, RE} {
		b.Resistors[s] = ResistorSpec{Nominal_Ohm: 1000, Tol: 0.05, Rated_W: 0.25}
	}
	b.Resistors[R2].Rated_W = 0 // unrated: not checked
	tests := []struct {
		name      string
		ambient_C float64
		pRC, pRE  float64
		pQ        float64
		lim       Limits
		// expected utilizations, from the check values: 0.1618 W allowed at
		// 100 °C (REFERENCE.md §3) times the 50 % margin (common practice);
		// 500 mW at 50 °C (Malvino & Bates 7th ed. Ex. 12-14; θJA 200 K/W,
		// TjMax 150 °C at other ambients) times 75 % (common practice).
		wantRC, wantQ float64
		wantOk        bool
	}{
		{"near the resistor limit, 100 °C", 100, 0.0800, 0.01, 0.1, Limits{}, 0.0800 / (0.1618 * 0.5), 0.1 / ((150 - 100) / 200.0 * 0.75), true},
		{"transistor over its margin at 50 °C", 50, 0.01, 0.01, 0.45, Limits{}, 0.01 / 0.125, 0.45 / (0.5 * 0.75), false},
		{"custom margins at 50 °C", 50, 0.1, 0.01, 0.25, Limits{ResistorMaxFraction: 0.8, TransistorMaxFraction: 0.5}, 0.1 / 0.2, 1.0, true},
		{"beyond the resistor's zero-power temperature", 160, 0.001, 0, 0, Limits{}, OverloadUtilization, 0, false},
	}
	for _, tt := range tests {
		op := OperatingPoint{PTransistor_W: tt.pQ}
		op.P_W[RC], op.P_W[RE], op.P_W[R2] = tt.pRC, tt.pRE, 1
		d := EvalDissipation(b, op, tt.ambient_C, tt.lim)
		if got := d.Resistor[RC].Utilization; math.Abs(got-tt.wantRC) > 1e-3*tt.wantRC {
			t.Errorf("%s: RC utilization = %g, want %g", tt.name, got, tt.wantRC)
		}
		if got := d.Transistor.Utilization; math.Abs(got-tt.wantQ) > 1e-3*tt.wantQ+1e-12 {
			t.Errorf("%s: transistor utilization = %g, want %g", tt.name, got, tt.wantQ)
		}
		if d.Ok != tt.wantOk {
			t.Errorf("%s: Ok = %v, want %v", tt.name, d.Ok, tt.wantOk)
		}
		if d.Resistor[R2].Rated || d.Resistor[R2].Utilization != 0 {
			t.Errorf("%s: unrated R2 was checked: %+v", tt.name, d.Resistor[R2])
		}
		if d.Resistor[RF].Power_W != 0 || d.Resistor[RF].Rated {
			t.Errorf("%s: unused slot RF reported: %+v", tt.name, d.Resistor[RF])
		}
		max := math.Max(d.Transistor.Utilization, math.Max(d.Resistor[RC].Utilization, d.Resistor[RE].Utilization))
		max = math.Max(max, d.Resistor[R1].Utilization)
		if d.MaxUtilization != max {
			t.Errorf("%s: MaxUtilization = %g, want the largest part's %g", tt.name, d.MaxUtilization, max)
		}
	}
}
