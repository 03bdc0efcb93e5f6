package repair

import (
	"biasbin/solver"
	"biasbin/solver/fault"
)

// DiagnoseRequest is a faulty stage and the voltages measured on it.
type DiagnoseRequest struct {
	// Stage holds the marked resistor values and the signed rails.
	Stage solver.Stage
	// Device is the fitted transistor's datasheet (the stock line's, or
	// given inline); Label names it for the front end.
	Device   solver.Datasheet
	Readings fault.Readings
	Settings fault.Settings
}

// Diagnosis is the outcome of Diagnose: the fault engine's ranking and
// the bench cautions.
type Diagnosis struct {
	fault.Diagnosis
	Cautions []Caution
}

// Diagnose ranks the single faults that explain req.Readings (package
// solver/fault). A reading outside the rails is a *fault.ReadingError; a
// bad stage, datasheet or setting a *solver.InputError.
func Diagnose(req DiagnoseRequest) (*Diagnosis, error) {
	dg, err := fault.Diagnose(req.Stage, req.Device, req.Readings, req.Settings)
	if err != nil {
		return nil, err
	}
	return &Diagnosis{Diagnosis: dg, Cautions: benchCautions(req.Stage)}, nil
}
