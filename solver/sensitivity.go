package solver

import "fmt"

// Sensitivity is the stability-factor set at a point.
type Sensitivity struct {
	SI         float64 // dIC/dICBO
	SV_S       float64 // dIC/dVBE (siemens, sign as computed)
	SBeta_A    float64 // dIC/dbeta
	BetaSpread float64 // (IC(hFEmax)-IC(hFEmin))/IC(nominal)

	// ICAtHFEMin_A and ICAtHFEMax_A are the collector currents at the
	// nominal point with the forward beta at the hFE bounds.
	ICAtHFEMin_A, ICAtHFEMax_A float64
	// Tj_C is the junction temperature the factors were taken at.
	Tj_C float64
}

// EvalSensitivity returns stability factors and the beta spread of b.
// The factors are StabilityNumeric's finite differences of the exact
// solver at the nominal point (Nominal: its stage, model and self-heated
// junction temperature). BetaSpread solves the nominal stage self-heated
// at the nominal ambient with BF at hFE min and at hFE max and divides
// the difference by the nominal IC.
func EvalSensitivity(b Build) (Sensitivity, error) {
	op, m, err := Nominal(b)
	if err != nil {
		return Sensitivity{}, fmt.Errorf("sensitivity: %w", err)
	}
	s := b.NominalStage()
	out, err := StabilityNumeric(s, m, op.Tj_C)
	if err != nil {
		return Sensitivity{}, fmt.Errorf("sensitivity: %w", err)
	}
	out.Tj_C = op.Tj_C
	theta, tjMax := ThermalResistance(b.Device), tjMaxOf(b.Device)
	for _, v := range []struct {
		bf  float64
		dst *float64
	}{{b.Device.HFEMin, &out.ICAtHFEMin_A}, {b.Device.HFEMax, &out.ICAtHFEMax_A}} {
		mm := m
		mm.BF = v.bf // ModelFor depends on bf only through BF
		o, err := SolveSelfHeated(s, mm, b.NominalAmbient_C, theta, tjMax)
		if err != nil {
			return Sensitivity{}, fmt.Errorf("sensitivity: hFE %g: %w", v.bf, err)
		}
		*v.dst = o.IC_A
	}
	if op.IC_A > 0 {
		out.BetaSpread = (out.ICAtHFEMax_A - out.ICAtHFEMin_A) / op.IC_A
	}
	return out, nil
}
