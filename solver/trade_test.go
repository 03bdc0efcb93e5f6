package solver_test

import (
	"math"
	"testing"

	"biasbin/solver"
)

// TestVBETempco: VBE falls about 2 mV/°C at constant current (common
// practice; Horowitz & Hill give −2.1 mV/°C, Millman & Halkias −2.5 mV/°C,
// from memory; accepted band −1.5..−2.5 mV/K). The stage is fed from a
// near-ideal current source (−1000 V through 1 MΩ) so IE stays at 1 mA
// within 0.002 %. The slope must also match the derived form
// dVBE/dT = (VBE − XTI·VT − EG)/T (REFERENCE.md §4 [D], which agreed with
// an ngspice sweep: −1.65 vs −1.66 mV/K) within 3 %.
func TestVBETempco(t *testing.T) {
	s := stage(solver.SplitSupply, 10, -1000, R{solver.RC: 1e3, solver.RE: 1e6})
	for _, d := range []solver.Datasheet{
		{Label: "default", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300},
		{Label: "0.72 V at 10 mA", Polarity: solver.NPN, HFEMin: 50, HFEMax: 150, VBEOn_V: 0.72, VBEAt_A: 10e-3},
		{Label: "pnp 0.6 V at 0.1 mA", Polarity: solver.PNP, HFEMin: 100, HFEMax: 300, VBEOn_V: 0.6, VBEAt_A: 0.1e-3},
	} {
		m, err := solver.ModelFor(d, 150)
		if err != nil {
			t.Fatal(err)
		}
		ss := s
		if d.Polarity == solver.PNP {
			ss, _ = mirror(s, m)
		}
		lo, err := solver.Solve(ss, m, 15)
		if err != nil {
			t.Fatal(err)
		}
		hi, err := solver.Solve(ss, m, 35)
		if err != nil {
			t.Fatal(err)
		}
		slope := (hi.VBE_V - lo.VBE_V) / 20
		if slope < -2.5e-3 || slope > -1.5e-3 {
			t.Errorf("%s: dVBE/dT = %.3f mV/K, want about -2 mV/K (common practice)", d.Label, slope*1e3)
		}
		mid, err := solver.Solve(ss, m, 25)
		if err != nil {
			t.Fatal(err)
		}
		tk := 25 + 273.15
		derived := (mid.VBE_V - m.XTI*solver.ThermalVoltage_V(25) - m.EG_eV) / tk
		if math.Abs(slope/derived-1) > 0.03 {
			t.Errorf("%s: dVBE/dT = %.4f mV/K, derived (VBE−XTI·VT−EG)/T = %.4f mV/K", d.Label, slope*1e3, derived*1e3)
		}
	}
}

// TestBetaSpreadFirmDivider: with R_TH ≤ 0.1(β+1)R_E a 3:1 beta spread
// moves IC by only a few percent (common practice, β = hFE min). Derived
// bound [D]: IC(300)/IC(100) − 1 = 3(R_TH+101R_E)/(R_TH+301R_E) − 1, which is
// 2.3 % at a quarter of the limit, 2.9 % at a third (Hambley's Ex. 12.7
// circuit), 4.0 % at half and 7.1 % at the limit itself; so the test asks < 5 % up to half the
// limit and < 7.5 % at the limit, with the exact solver (VBE follows IC).
func TestBetaSpreadFirmDivider(t *testing.T) {
	const re = 1e3
	for _, c := range []struct {
		share, maxSpread float64
	}{{0.33, 0.05}, {0.25, 0.05}, {0.5, 0.05}, {1, 0.075}} {
		rth := c.share * 0.1 * 101 * re
		// Divider with V_TH = 3 V from 15 V: R1 = R_TH·15/3, R2 = R_TH·15/12.
		s := stage(solver.Divider, 15, 0, R{solver.R1: rth * 5, solver.R2: rth * 1.25, solver.RC: 1e3, solver.RE: re})
		ic := map[float64]float64{}
		for _, bf := range []float64{100, 300} {
			op, err := solver.Solve(s, npnModel(1e-14, bf, 0, 0), 25)
			if err != nil {
				t.Fatal(err)
			}
			ic[bf] = op.IC_A
		}
		if spread := ic[300]/ic[100] - 1; spread <= 0 || spread > c.maxSpread {
			t.Errorf("R_TH = %.2f·0.1(β+1)R_E: IC moves %.2f %% for hFE 100→300, want < %.1f %% (common practice)", c.share, 100*spread, 100*c.maxSpread)
		}
	}
}

// TestICBODoubling: collector-base leakage doubles every 10 °C (common
// practice; Millman & Halkias ch. 9, from memory).
func TestICBODoubling(t *testing.T) {
	m := npnModel(1e-14, 100, 0, 10e-9)
	for _, c := range []struct{ tj, want float64 }{{25, 10e-9}, {35, 20e-9}, {15, 5e-9}, {85, 640e-9}} {
		if _, _, _, got := m.At(c.tj); math.Abs(got/c.want-1) > 1e-12 {
			t.Errorf("ICBO at %g °C = %g A, want %g A", c.tj, got, c.want)
		}
	}
}

// TestTemperatureLaw checks IS(T) and BF(T) against the SPICE equations
// as printed in the ngspice manual §1.3.1 eqs. (1)–(2) (REFERENCE.md §4
// [C]): IS(T) = IS·(T/T0)^XTI·exp((EG·q/k)(1/T0 − 1/T)), BF(T) = BF(T/T0)^XTB.
func TestTemperatureLaw(t *testing.T) {
	const k, q = 1.380649e-23, 1.602176634e-19 // SI exact
	m := npnModel(3e-15, 200, 0, 0)
	m.XTI, m.XTB, m.EG_eV = 3.5, 1.7, 1.16
	for _, tc := range []float64{-55, -20, 25, 60, 125, 175} {
		tk, t0 := tc+273.15, m.TNOM_C+273.15
		wantIS := m.IS_A * math.Pow(tk/t0, m.XTI) * math.Exp(m.EG_eV*q/k*(1/t0-1/tk))
		wantBF := m.BF * math.Pow(tk/t0, m.XTB)
		is, bf, br, _ := m.At(tc)
		if math.Abs(is/wantIS-1) > 1e-12 || math.Abs(bf/wantBF-1) > 1e-12 || math.Abs(br/(m.BR*wantBF/m.BF)-1) > 1e-12 {
			t.Errorf("%g °C: IS %g BF %g BR %g, want %g %g %g", tc, is, bf, br, wantIS, wantBF, m.BR*wantBF/m.BF)
		}
	}
}
