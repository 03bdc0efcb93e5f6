package solver

import "fmt"

// Nominal solves b at its nominal point: every resistor at its marked value
// with its TCR applied at NominalAmbient_C, the nominal supply, forward
// beta NominalBeta (0 = TypicalHFE of the device: the datasheet typical,
// else the geometric mean of min and max) and the transistor self-heated
// through ThermalResistance(b.Device) from NominalAmbient_C.
func Nominal(b Build) (OperatingPoint, Model, error) {
	if err := b.Validate(); err != nil {
		return OperatingPoint{}, Model{}, fmt.Errorf("nominal point: %w", err)
	}
	m, err := ModelFor(b.Device, b.nominalBeta())
	if err != nil {
		return OperatingPoint{}, Model{}, fmt.Errorf("nominal point: %w", err)
	}
	s := b.NominalStage()
	op, err := SolveSelfHeated(s, m, b.NominalAmbient_C, ThermalResistance(b.Device), tjMaxOf(b.Device))
	if err != nil {
		return op, m, fmt.Errorf("nominal point: %w", err)
	}
	return op, m, nil
}

// NominalStage returns b's stage at the nominal point: marked values with
// the TCR applied at NominalAmbient_C, nominal supply.
func (b Build) NominalStage() Stage {
	return b.Resolve([NumSlots]float64{}, 1, b.NominalAmbient_C)
}
