package solver

// Dissipation compares each part's power with its derated rating, and
// each resistor's voltage with its limiting element voltage.
type Dissipation struct {
	Resistor       [NumSlots]PartLoad
	Transistor     PartLoad
	MaxUtilization float64 // largest power utilization of any part (1 = at the design limit)
	// MaxVoltageUtilization is the largest voltage utilization of any
	// resistor (1 = at the design limit).
	MaxVoltageUtilization float64
	Ok                    bool // every part within its power and voltage limits
}

// PartLoad is one part's dissipation against its derated, margined limit.
type PartLoad struct {
	Power_W     float64
	Allowed_W   float64 // derated rating at the ambient, times the margin fraction
	Utilization float64 // Power_W / Allowed_W
	// Rated is false when the part has no rating to check against (an
	// unused slot, a resistor with Rated_W = 0, a transistor with neither
	// θJA nor PD25); Allowed_W and Utilization are then 0.
	Rated bool
	// Voltage_V is the voltage across a resistor (a magnitude; 0 for the
	// transistor, whose VCE is judged against its VCEO elsewhere).
	Voltage_V float64
	// VoltageAllowed_V is the resistor's limiting element voltage times
	// the margin fraction; 0 when not checked (an unrated resistor that
	// states no LEV, the transistor).
	VoltageAllowed_V float64
	// VoltageUtilization is Voltage_V / VoltageAllowed_V (0 when not
	// checked).
	VoltageUtilization float64
}

// OverloadUtilization is the utilization reported for a part that
// dissipates power where its derated allowance is zero (at or above its
// zero-power temperature): a finite stand-in for "infinitely over", so
// results stay free of Inf.
const OverloadUtilization = 1e9

// ResistorAllowed_W returns the power a resistor rated ratedW at the knee
// temperature may dissipate at ambient_C, derated linearly from the knee to
// zero at max_C (IEC 60115-1 style derating curve, REFERENCE.md §3):
//
//	P(T) = P_rated                          T ≤ knee
//	     = P_rated·(max − T)/(max − knee)   knee < T < max
//	     = 0                                T ≥ max
func ResistorAllowed_W(ratedW, knee_C, max_C, ambient_C float64) float64 {
	switch {
	case ambient_C <= knee_C:
		return ratedW
	case ambient_C >= max_C:
		return 0
	}
	return ratedW * (max_C - ambient_C) / (max_C - knee_C)
}

// TransistorAllowed_W returns the transistor's maximum dissipation at
// ambient_C: (TjMax − Ta)/θJA (REFERENCE.md §8), with θJA as
// ThermalResistance gives it, never more than PD25 when that is given
// (the rating holds at and below 25 °C). It returns 0 and false when the
// datasheet has neither θJA nor PD25.
func TransistorAllowed_W(d Datasheet, ambient_C float64) (float64, bool) {
	theta := ThermalResistance(d)
	if theta <= 0 {
		return 0, false
	}
	p := max(0, (tjMaxOf(d)-ambient_C)/theta)
	if d.PD25_W > 0 && p > d.PD25_W {
		p = d.PD25_W
	}
	return p, true
}

// EvalDissipation checks op's powers against the parts' ratings derated
// at ambient_C. Each resistor is taken to be at ambient_C; its allowance
// is ResistorAllowed_W times lim.ResistorMaxFraction. The transistor's
// allowance is TransistorAllowed_W times lim.TransistorMaxFraction.
func EvalDissipation(b Build, op OperatingPoint, ambient_C float64, lim Limits) Dissipation {
	a := newAllowances(&b, ambient_C, lim.WithDefaults())
	return a.eval(&b, &op)
}

// allowances are the margined power limits of a build's parts at one
// ambient, computed once for many operating points.
type allowances struct {
	r      [NumSlots]float64
	rRated [NumSlots]bool
	v      [NumSlots]float64 // margined limiting element voltages; 0 = not checked
	q      float64
	qRated bool
}

// newAllowances derates every rated part of b to ambient_C (lim with its
// defaults filled).
func newAllowances(b *Build, ambient_C float64, lim Limits) allowances {
	var a allowances
	for i := range NumSlots {
		if r := b.Resistors[i]; b.usedSlot(i) && r.Rated_W > 0 {
			knee, top := r.derating()
			a.r[i] = ResistorAllowed_W(r.Rated_W, knee, top, ambient_C) * lim.ResistorMaxFraction
			a.rRated[i] = true
		}
		if b.usedSlot(i) {
			a.v[i] = b.Resistors[i].LimitingVoltage_V() * lim.VoltageMaxFraction
		}
	}
	if p, ok := TransistorAllowed_W(b.Device, ambient_C); ok {
		a.q, a.qRated = p*lim.TransistorMaxFraction, true
	}
	return a
}

// eval checks op's powers against the allowances.
func (a *allowances) eval(b *Build, op *OperatingPoint) Dissipation {
	d := Dissipation{Ok: true}
	for i := range NumSlots {
		if !b.usedSlot(i) {
			continue
		}
		pl := PartLoad{Power_W: op.P_W[i]}
		if a.rRated[i] {
			pl.rate(a.r[i])
		}
		pl.Voltage_V = op.V_V[i]
		if a.v[i] > 0 {
			pl.VoltageAllowed_V = a.v[i]
			pl.VoltageUtilization = op.V_V[i] / a.v[i]
		}
		d.Resistor[i] = pl
		d.note(pl)
	}
	d.Transistor = PartLoad{Power_W: op.PTransistor_W}
	if a.qRated {
		d.Transistor.rate(a.q)
	}
	d.note(d.Transistor)
	return d
}

// rate sets the allowance and utilization of a rated part.
func (pl *PartLoad) rate(allowed_W float64) {
	pl.Rated = true
	pl.Allowed_W = allowed_W
	switch {
	case allowed_W > 0:
		pl.Utilization = pl.Power_W / allowed_W
	case pl.Power_W > 0:
		pl.Utilization = OverloadUtilization
	}
}

// note folds one part's load into the totals.
func (d *Dissipation) note(pl PartLoad) {
	if pl.VoltageUtilization > 0 {
		d.MaxVoltageUtilization = max(d.MaxVoltageUtilization, pl.VoltageUtilization)
		if pl.VoltageUtilization > 1 {
			d.Ok = false
		}
	}
	if !pl.Rated {
		return
	}
	d.MaxUtilization = max(d.MaxUtilization, pl.Utilization)
	if pl.Utilization > 1 {
		d.Ok = false
	}
}

// worse folds another evaluation of the same build into d, keeping each
// part's highest utilization (used to collect the worst over corners).
func (d *Dissipation) worse(o Dissipation) {
	for i := range NumSlots {
		v := d.Resistor[i].Voltage_V
		if o.Resistor[i].Utilization > d.Resistor[i].Utilization || (!d.Resistor[i].Rated && o.Resistor[i].Power_W > d.Resistor[i].Power_W) {
			d.Resistor[i] = o.Resistor[i]
		}
		// The highest voltage over the corners is kept beside the
		// hottest corner's power: the two may come from different corners.
		if hv := max(v, o.Resistor[i].Voltage_V); hv > d.Resistor[i].Voltage_V {
			pl := &d.Resistor[i]
			pl.Voltage_V = hv
			if pl.VoltageAllowed_V == 0 {
				pl.VoltageAllowed_V = o.Resistor[i].VoltageAllowed_V
			}
			if pl.VoltageAllowed_V > 0 {
				pl.VoltageUtilization = hv / pl.VoltageAllowed_V
			}
		}
	}
	if o.Transistor.Utilization > d.Transistor.Utilization || (!d.Transistor.Rated && o.Transistor.Power_W > d.Transistor.Power_W) {
		d.Transistor = o.Transistor
	}
	d.MaxUtilization = max(d.MaxUtilization, o.MaxUtilization)
	d.MaxVoltageUtilization = max(d.MaxVoltageUtilization, o.MaxVoltageUtilization)
	d.Ok = d.Ok && o.Ok
}
