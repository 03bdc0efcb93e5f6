package repair

import (
	"fmt"
	"math"

	"biasbin/solver"
	"biasbin/solver/fault"
)

// Inference limits (doc.go, "Inferring the original Q-point").
const (
	// MaxVBE_V is the largest base-emitter voltage a working silicon
	// small-signal stage shows (common practice: 0.55–0.8 V at the
	// currents of a bias stage; more means the junction is not what
	// carries the emitter current).
	MaxVBE_V = 1.0
	// DefaultMinHFE bounds the base current when the original's ranges
	// are not given: IB ≤ IE/(1 + 10) (common practice; a conservative
	// floor for small-signal parts).
	DefaultMinHFE = 10.0
)

// Estimate is one inferred current with its worst-case bounds.
type Estimate struct {
	Value_A, Min_A, Max_A float64
}

// Inference is the original Q-point read from a working twin.
type Inference struct {
	// FromRC and FromRE are IC from the collector and the emitter
	// resistor; Has* is false when the position is 0 Ω.
	FromRC, FromRE       Estimate
	HasFromRC, HasFromRE bool
	// IB is the base current, Value_A its central figure.
	IB Estimate
	// IC_A is the inferred collector current, VCE_V = VC − VE (magnitudes,
	// forward-referenced as in package solver).
	IC_A, VCE_V float64
}

// InferQPoint infers the original Q-point of build b's stage (marked
// values, tolerances, supply tolerance; Device is ignored) of polarity pol
// from readings r of a working twin taken with meter mt (defaults applied
// here). hfeMin bounds the base current (0 = DefaultMinHFE). An
// inconsistent reading is a *fault.ReadingError.
func InferQPoint(b solver.Build, pol solver.Polarity, r fault.Readings, mt fault.Meter, hfeMin float64) (Inference, error) {
	if err := mt.Validate(); err != nil {
		return Inference{}, err
	}
	mt = mt.WithDefaults()
	s := b.NominalStage()
	if err := s.Validate(pol); err != nil {
		return Inference{}, err
	}
	if err := fault.CheckRails(s, r, mt); err != nil {
		return Inference{}, err
	}
	if !(hfeMin > 0) {
		hfeMin = DefaultMinHFE
	}
	sg := 1.0
	if pol == solver.PNP {
		sg = -1
	}
	acc := func(v float64) float64 { return mt.Accuracy_V(v) }
	// The readings are against the stage's ground; the network below is
	// written in the mirrored frame with 0 V on the emitter-side rail.
	node := func(v float64) float64 { return sg * s.Ground.Node(v, s.VCC_V) }
	vb, ve, vc := node(r.VB_V), node(r.VE_V), node(r.VC_V)
	vcc, vee := sg*b.VCC_V, 0.0
	if b.Topology == solver.SplitSupply {
		vee = sg * b.VEE_V
	}
	dvb, dve, dvc := acc(r.VB_V), acc(r.VE_V), acc(r.VC_V)
	if ve-vb > dvb+dve {
		rel, want := "above", "below"
		if pol == solver.PNP {
			rel, want = "below", "above"
		}
		return Inference{}, &fault.ReadingError{Reading: "ve", Problem: fmt.Sprintf("%g V is %s vb %g V, but in a working %v stage the base-emitter junction conducts and the emitter sits about 0.6 V %s the base; check the probe points", r.VE_V, rel, r.VB_V, pol, want)}
	}
	if vb-ve > MaxVBE_V+dvb+dve {
		return Inference{}, &fault.ReadingError{Reading: "vb", Problem: fmt.Sprintf("vb − ve = %.3g V is more than a silicon junction drops (%g V): the emitter current does not flow through the base-emitter junction, so the twin is not a working stage", math.Abs(r.VB_V-r.VE_V), MaxVBE_V)}
	}
	dvcc := math.Abs(b.VCC_V) * b.VCCTol
	dvee := math.Abs(b.VEE_V) * b.VCCTol
	// The supply tolerance sits on the rail that is not 0 V: dcr on the
	// collector-side rail, der on the emitter-side rail (a PNP stage on
	// a positive supply, whose readings are taken from the collector side).
	dcr, der := dvcc, 0.0
	if s.Ground == solver.CollectorRailGround {
		dcr, der = 0, dvcc
	}
	spec := func(sl solver.Slot) (float64, float64) {
		return b.Resistors[sl].Nominal_Ohm, b.Resistors[sl].Tol
	}
	// i = dv/R with |dv| bounded by ddv and R by its tolerance.
	current := func(dv, ddv float64, sl solver.Slot) Estimate {
		rr, tol := spec(sl)
		i := dv / rr
		lo := (dv - ddv) / (rr * (1 + tol))
		hi := (dv + ddv) / (rr * (1 - tol))
		if dv-ddv < 0 {
			lo = (dv - ddv) / (rr * (1 - tol))
		}
		if dv+ddv < 0 {
			hi = (dv + ddv) / (rr * (1 + tol))
		}
		return Estimate{Value_A: i, Min_A: lo, Max_A: hi}
	}
	sub := func(a, c Estimate) Estimate {
		return Estimate{Value_A: a.Value_A - c.Value_A, Min_A: a.Min_A - c.Max_A, Max_A: a.Max_A - c.Min_A}
	}
	var in Inference
	var ib Estimate
	ibKnown := true
	switch b.Topology {
	case solver.Divider:
		ib = sub(current(vcc-vb, dcr+dvb, solver.R1), current(vb, dvb+der, solver.R2))
	case solver.CollectorFeedback:
		ib = current(vc-vb, dvc+dvb, solver.RF)
	case solver.SplitSupply:
		if b.Resistors[solver.RB].Nominal_Ohm > 0 {
			ib = current(-vb, dvb, solver.RB)
		} else {
			ibKnown = false
		}
	}
	if rc, _ := spec(solver.RC); rc > 0 {
		in.FromRC, in.HasFromRC = current(vcc-vc, dcr+dvc, solver.RC), true
		if b.Topology == solver.CollectorFeedback {
			in.FromRC = sub(in.FromRC, ib)
		}
	}
	var ie Estimate
	if re, _ := spec(solver.RE); re > 0 {
		ie = current(ve-vee, dve+dvee+der, solver.RE)
		in.HasFromRE = true
	}
	// The base current lies within 0..IE/(1 + hFE min) whatever the
	// network says.
	if in.HasFromRE {
		bound := Estimate{Value_A: 0, Min_A: 0, Max_A: max(ie.Max_A, 0) / (1 + hfeMin)}
		if !ibKnown || ib.Min_A > bound.Max_A || ib.Max_A < bound.Min_A {
			ib = Estimate{Value_A: ie.Value_A / (1 + hfeMin) / 2, Min_A: bound.Min_A, Max_A: bound.Max_A}
		} else {
			ib.Min_A, ib.Max_A = max(ib.Min_A, bound.Min_A), min(ib.Max_A, bound.Max_A)
			ib.Value_A = min(max(ib.Value_A, ib.Min_A), ib.Max_A)
		}
		in.FromRE = sub(ie, ib)
	}
	in.IB = ib
	switch {
	case in.HasFromRC && in.HasFromRE:
		a, c := in.FromRC, in.FromRE
		if a.Max_A < c.Min_A || c.Max_A < a.Min_A {
			return Inference{}, &fault.ReadingError{Reading: "ve/vc", Problem: fmt.Sprintf(
				"IC from the drop on RE is %.4g A (%.4g..%.4g) but from the drop on RC %.4g A (%.4g..%.4g): they disagree by more than the meter accuracy and the resistor and supply tolerances allow; check the resistor values, the supply and the readings",
				c.Value_A, c.Min_A, c.Max_A, a.Value_A, a.Min_A, a.Max_A)}
		}
		wa := 1 / sq((a.Max_A-a.Min_A)/2)
		wc := 1 / sq((c.Max_A-c.Min_A)/2)
		in.IC_A = (wa*a.Value_A + wc*c.Value_A) / (wa + wc)
	case in.HasFromRC:
		in.IC_A = in.FromRC.Value_A
	case in.HasFromRE:
		in.IC_A = in.FromRE.Value_A
	}
	if !(in.IC_A > 0) {
		return Inference{}, &fault.ReadingError{Reading: "ve/vc", Problem: fmt.Sprintf("the readings give no collector current (%.3g A): the twin is not conducting, so it is no working reference", in.IC_A)}
	}
	in.VCE_V = vc - ve
	return in, nil
}

func sq(x float64) float64 {
	if x == 0 {
		return 1e-300
	}
	return x * x
}
