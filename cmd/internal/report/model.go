// Package report holds the output pieces the commands share: the JSON
// shape of a transistor model and the words for the picker's typed
// reasons. It prints nothing itself.
package report

import "biasbin/solver"

// Model is the JSON shape of a SPICE BJT model card, the same in
// `biasbin check --json` and `biasbin pick --json`, so a script can paste
// either into a simulator. Units are SI; VAF_V = 0 means infinite.
type Model struct {
	Polarity string  `json:"polarity"`
	IS_A     float64 `json:"is_a"`
	BF       float64 `json:"bf"`
	BR       float64 `json:"br"`
	NF       float64 `json:"nf"`
	VAF_V    float64 `json:"vaf_v"`
	XTI      float64 `json:"xti"`
	XTB      float64 `json:"xtb"`
	EG_eV    float64 `json:"eg_ev"`
	TNOM_C   float64 `json:"tnom_c"`
	ICBO_A   float64 `json:"icbo_a"`
}

// ModelOf converts a solver model to its JSON shape.
func ModelOf(m solver.Model) Model {
	return Model{
		Polarity: m.Polarity.String(),
		IS_A:     m.IS_A,
		BF:       m.BF,
		BR:       m.BR,
		NF:       m.NF,
		VAF_V:    m.VAF_V,
		XTI:      m.XTI,
		XTB:      m.XTB,
		EG_eV:    m.EG_eV,
		TNOM_C:   m.TNOM_C,
		ICBO_A:   m.ICBO_A,
	}
}
