package repair_test

import (
	"biasbin/picker"
	"biasbin/solver"
)

// Invented demo-style parts: labels and figures are made up for the tests
// (no product's data).
func npnSheet(label string, hmin, hmax, vbe float64) solver.Datasheet {
	return solver.Datasheet{Label: label, Polarity: solver.NPN, HFEMin: hmin, HFEMax: hmax, VBEOn_V: vbe,
		VCEO_V: 40, ICMax_A: 0.2, PD25_W: 0.5, ThetaJA_KPerW: 250, TjMax_C: 150}
}

func pnpSheet(label string, hmin, hmax, vbe float64) solver.Datasheet {
	d := npnSheet(label, hmin, hmax, vbe)
	d.Polarity = solver.PNP
	return d
}

// feedbackBuild is a collector-feedback stage with no emitter resistor:
// its IC follows hFE closely, so a substitute of another gain class moves
// it.
func feedbackBuild() solver.Build {
	b := solver.Build{Topology: solver.CollectorFeedback, VCC_V: 12, VCCTol: 0.02,
		AmbientMin_C: 15, AmbientMax_C: 35, NominalAmbient_C: 25}
	b.Resistors[solver.RF] = solver.ResistorSpec{Nominal_Ohm: 470e3, Tol: 0.05}
	b.Resistors[solver.RC] = solver.ResistorSpec{Nominal_Ohm: 4.7e3, Tol: 0.05}
	return b
}

// dividerBuild is a stiff divider stage with an emitter resistor.
func dividerBuild(vcc float64) solver.Build {
	b := solver.Build{Topology: solver.Divider, VCC_V: vcc, VCCTol: 0.02,
		AmbientMin_C: 15, AmbientMax_C: 35, NominalAmbient_C: 25}
	b.Resistors[solver.R1] = solver.ResistorSpec{Nominal_Ohm: 47e3, Tol: 0.05}
	b.Resistors[solver.R2] = solver.ResistorSpec{Nominal_Ohm: 10e3, Tol: 0.05}
	b.Resistors[solver.RC] = solver.ResistorSpec{Nominal_Ohm: 4.7e3, Tol: 0.05}
	b.Resistors[solver.RE] = solver.ResistorSpec{Nominal_Ohm: 1e3, Tol: 0.05}
	return b
}

// e12 returns 1 % resistors of the E12 values from 100 Ω to 820 kΩ, ten of
// each, as stock lines.
func e12Stock() []picker.Resistor {
	var out []picker.Resistor
	id := int64(100)
	for dec := 100.0; dec < 1e6; dec *= 10 {
		for _, m := range []float64{1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2} {
			id++
			out = append(out, picker.Resistor{ID: id, Ohm: m * dec, Tol: 0.01, Rated_W: 0.25, Qty: 10, Bin: "R" + string(rune('A'+id%26))})
		}
	}
	return out
}
