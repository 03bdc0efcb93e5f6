package solver

// TEMPORARY CONTRACT FILE (analyses). The helper implementing the analyses
// moves each declaration into its proper file (build.go, worstcase.go,
// yield.go, dissipation.go, swing.go, sensitivity.go, analyze.go) with a real
// body and deletes this file. Signatures and field names here are the agreed
// contract; extend, but do not rename.

// Sensitivity is the stability-factor set at a point.
type Sensitivity struct {
	SI         float64 // dIC/dICBO
	SV_S       float64 // dIC/dVBE (siemens, sign as computed)
	SBeta_A    float64 // dIC/dbeta
	BetaSpread float64 // (IC(hFEmax)-IC(hFEmin))/IC(nominal)
}

// EvalSensitivity returns stability factors and the beta spread of b.
func EvalSensitivity(b Build) (Sensitivity, error) {
	panic("solver: EvalSensitivity not implemented yet")
}
