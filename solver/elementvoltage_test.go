package solver

import (
	"math"
	"testing"
)

func TestDefaultLEV(t *testing.T) {
	// source: REFERENCE.md §16, typical limiting element voltage by size
	// (maker practice, common practice): 0402 (1/16 W) 50 V, 0603 (0.1 W)
	// 50–75 V, 0805 (0.125 W) 150 V, 1206 (0.25 W) 200 V; axial ¼ W
	// 250–300 V, so ¼ W and up take the lower 200 V.
	tests := []struct {
		rated_W, want_V float64
	}{
		{0, 0},       // unrated: nothing to check
		{0.0625, 50}, // 0402: 50 V
		{0.1, 50},    // 0603: lower end of 50–75 V
		{0.125, 150}, // 0805: 150 V
		{0.25, 200},  // 1206: 200 V (axial ¼ W 250–300 V)
		{1, 200},     // 2512 chip: 200 V (from memory)
		{0.11, 150},  // between 0603 and 0805: the 0805 figure
		{0.2, 200},   // between 0805 and 1206: the 1206 figure
		{0.06, 50},   // below 0402: the smallest figure
		{-1, 0},      // not a rating
		{math.NaN(), 0},
	}
	for _, tt := range tests {
		if got := DefaultLEV_V(tt.rated_W); got != tt.want_V {
			t.Errorf("DefaultLEV_V(%g W) = %g V, want %g V", tt.rated_W, got, tt.want_V)
		}
	}
	if got := (ResistorSpec{Rated_W: 0.25, LEV_V: 350}).LimitingVoltage_V(); got != 350 {
		t.Errorf("a stated LEV of 350 V reads back as %g V", got)
	}
}

// TestElementVoltageBindsAboveCriticalResistance checks the voltage limit
// against the critical resistance R_crit = U_max²/P₇₀ (REFERENCE.md §16,
// formula derived from the IEC 60115-1 terms): a 1206-class part (0.25 W,
// 200 V) has R_crit = 160 kΩ. Above it a voltage near U_max is within the
// power rating yet beyond the voltage limit; below it the power rating
// binds before the voltage does.
func TestElementVoltageBindsAboveCriticalResistance(t *testing.T) {
	const rated, lev = 0.25, 200.0
	if rc := lev * lev / rated; math.Abs(rc-160e3) > 1e-6 {
		t.Fatalf("critical resistance %g Ω, want 160 kΩ (REFERENCE.md §16)", rc)
	}
	tests := []struct {
		name      string
		ohm, v    float64
		powerOk   bool // within 50 % of the rating (DefaultResistorMaxFraction)
		voltageOk bool // within 80 % of U_max (DefaultVoltageMaxFraction)
	}{
		// 1 MΩ at 170 V: 28.9 mW is 12 % of 0.25 W, but 170 V > 0.8·200 V.
		{"above R_crit: voltage binds", 1e6, 170, true, false},
		// 1 MΩ at 150 V: 22.5 mW and 150 V ≤ 160 V.
		{"above R_crit: both within", 1e6, 150, true, true},
		// 10 kΩ at 40 V: 160 mW > 125 mW, while 40 V is far below 160 V.
		{"below R_crit: power binds", 10e3, 40, false, true},
	}
	for _, tt := range tests {
		b := Build{Topology: Divider, Device: Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 100}}
		b.Resistors[R1] = ResistorSpec{Nominal_Ohm: tt.ohm, Tol: 0.05, Rated_W: rated}
		var op OperatingPoint
		op.V_V[R1] = tt.v
		op.P_W[R1] = tt.v * tt.v / tt.ohm
		d := EvalDissipation(b, op, 25, Limits{})
		pl := d.Resistor[R1]
		if gotP := pl.Utilization <= 1; gotP != tt.powerOk {
			t.Errorf("%s: power utilization %.3f, want ok=%v", tt.name, pl.Utilization, tt.powerOk)
		}
		if gotV := pl.VoltageUtilization <= 1; gotV != tt.voltageOk {
			t.Errorf("%s: voltage utilization %.3f, want ok=%v", tt.name, pl.VoltageUtilization, tt.voltageOk)
		}
		if pl.VoltageAllowed_V != 160 {
			t.Errorf("%s: voltage allowed %g V, want 160 V (80 %% of 200 V, REFERENCE.md §3)", tt.name, pl.VoltageAllowed_V)
		}
		if d.Ok != (tt.powerOk && tt.voltageOk) {
			t.Errorf("%s: Ok = %v", tt.name, d.Ok)
		}
	}
}

// TestVoltageAcrossResistors checks the solved voltage across each
// resistor by Kirchhoff's voltage law (common practice): around the
// divider, V(R1) + V(R2) = VCC and V(RC) + VCE + V(RE) = VCC.
func TestVoltageAcrossResistors(t *testing.T) {
	for _, pol := range []Polarity{NPN, PNP} {
		sg := pol.sign()
		s := Stage{Topology: Divider, VCC_V: 15 * sg}
		s.R_Ohm[R1], s.R_Ohm[R2], s.R_Ohm[RC], s.R_Ohm[RE] = 39e3, 8.2e3, 3.3e3, 1e3
		m, err := ModelFor(Datasheet{Polarity: pol, HFEMin: 100, HFEMax: 300}, 170)
		if err != nil {
			t.Fatal(err)
		}
		op, err := Solve(s, m, 25)
		if err != nil {
			t.Fatal(err)
		}
		if got := op.V_V[R1] + op.V_V[R2]; math.Abs(got-15) > 1e-9 {
			t.Errorf("%v: V(R1)+V(R2) = %g V, want 15 V", pol, got)
		}
		if got := op.V_V[RC] + op.VCE_V + op.V_V[RE]; math.Abs(got-15) > 1e-9 {
			t.Errorf("%v: V(RC)+VCE+V(RE) = %g V, want 15 V", pol, got)
		}
		if got := op.V_V[RC] * op.V_V[RC] / s.R_Ohm[RC]; math.Abs(got-op.P_W[RC]) > 1e-12 {
			t.Errorf("%v: V(RC)²/RC = %g W, P(RC) = %g W", pol, got, op.P_W[RC])
		}
	}
}
