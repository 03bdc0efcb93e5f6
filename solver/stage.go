package solver

import (
	"fmt"
	"math"
)

// Stage is one bias circuit with effective resistor values (after any
// tolerance and TCR). Rails are signed: VCC_V > 0 for NPN and < 0 for PNP;
// VEE_V (split supply only) < 0 for NPN and > 0 for PNP. Ground says
// which rail is the circuit's 0 V; node voltages in results are given
// against it (ground.go).
type Stage struct {
	Topology    Topology
	VCC_V       float64
	VEE_V       float64
	Ground      Ground
	R_Ohm       [NumSlots]float64 // unused slots are ignored
	RBypass_Ohm float64           // part of RE bypassed for AC (0..RE)
	RL_Ohm      float64           // AC load on the collector; 0 = none
}

// OperatingPoint is a solved DC operating point. Node voltages are signed,
// relative to the stage's ground (Stage.Ground): what a meter shows. Currents, VCE_V and VBE_V are forward-referenced: for
// an NPN IC flows into the collector and VCE = VC-VE; for a PNP IC flows out
// of the collector and VCE = VE-VC. So both are positive in the active
// region for either polarity.
type OperatingPoint struct {
	Region        Region
	IB_A          float64
	IC_A          float64
	IE_A          float64
	VB_V          float64
	VC_V          float64
	VE_V          float64
	VCE_V         float64
	VBE_V         float64
	IDivider_A    float64           // current in R2 (divider) or RB (split supply); 0 otherwise
	P_W           [NumSlots]float64 // each resistor's dissipation
	V_V           [NumSlots]float64 // the voltage across each resistor, a magnitude
	PTransistor_W float64           // VCE*IC + VBE*IB
	Tj_C          float64           // device temperature the model was evaluated at
}

// Validate reports the first bad field of s for a transistor of polarity p
// as an *InputError: a rail of the wrong sign, a missing or negative
// resistor, a junction left directly across a supply.
func (s Stage) Validate(p Polarity) error {
	if p != NPN && p != PNP {
		return &InputError{Field: "polarity", Problem: "want npn or pnp"}
	}
	sg := p.sign()
	if !finite(s.VCC_V) || s.VCC_V*sg <= 0 {
		want := "> 0"
		if p == PNP {
			want = "< 0"
		}
		return &InputError{Field: "vcc", Problem: fmt.Sprintf("%g V: a %s stage needs vcc %s", s.VCC_V, p, want)}
	}
	switch {
	case s.Ground != EmitterRailGround && s.Ground != CollectorRailGround:
		return &InputError{Field: "ground", Problem: fmt.Sprintf("%v: want emitter-rail or collector-rail", s.Ground)}
	case s.Ground == CollectorRailGround && s.Topology == SplitSupply:
		return &InputError{Field: "ground", Problem: "a split-supply stage is measured from the common of its two supplies, not from its collector rail"}
	}
	nonNeg := func(sl Slot) error {
		v := s.R_Ohm[sl]
		if !finite(v) || v < 0 {
			return &InputError{Field: sl.String(), Problem: fmt.Sprintf("%g ohm: want a finite resistance >= 0", v)}
		}
		return nil
	}
	positive := func(sl Slot) error {
		v := s.R_Ohm[sl]
		if !finite(v) || v <= 0 {
			return &InputError{Field: sl.String(), Problem: fmt.Sprintf("%g ohm: want a finite resistance > 0", v)}
		}
		return nil
	}
	var errs []error
	switch s.Topology {
	case Divider:
		errs = []error{positive(R1), positive(R2), nonNeg(RC), nonNeg(RE)}
	case CollectorFeedback:
		errs = []error{positive(RF), positive(RC), nonNeg(RE)}
	case SplitSupply:
		errs = []error{nonNeg(RB), nonNeg(RC), nonNeg(RE)}
		if !finite(s.VEE_V) || s.VEE_V*sg >= 0 {
			want := "< 0"
			if p == PNP {
				want = "> 0"
			}
			return &InputError{Field: "vee", Problem: fmt.Sprintf("%g V: a %s split-supply stage needs vee %s", s.VEE_V, p, want)}
		}
	default:
		return &InputError{Field: "topology", Problem: fmt.Sprintf("%v: want divider, collector-feedback or split-supply", s.Topology)}
	}
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	if s.Topology == SplitSupply && s.R_Ohm[RB] == 0 && s.R_Ohm[RE] == 0 {
		return &InputError{Field: "re", Problem: "with rb and re both 0 the base-emitter junction sits directly across vee"}
	}
	if !finite(s.RBypass_Ohm) || s.RBypass_Ohm < 0 || s.RBypass_Ohm > s.R_Ohm[RE] {
		return &InputError{Field: "re_bypass", Problem: fmt.Sprintf("%g ohm: want 0..re (%g ohm)", s.RBypass_Ohm, s.R_Ohm[RE])}
	}
	if !finite(s.RL_Ohm) || s.RL_Ohm < 0 {
		return &InputError{Field: "rl", Problem: fmt.Sprintf("%g ohm: want a finite resistance >= 0 (0 = no load)", s.RL_Ohm)}
	}
	return nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
