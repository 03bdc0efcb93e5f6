package fault

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"biasbin/solver"
)

// benchTemp_C is the temperature the faulty stage is solved at: a unit on
// the bench at room temperature, the datasheet's 25 °C (self-heating is
// left out; it moves VBE by a few millivolts in a small-signal stage).
const benchTemp_C = 25.0

// Fit defaults (doc.go, "The fit").
const (
	// DefaultMaxDrift bounds a drifted value to marked/10..marked·10.
	DefaultMaxDrift = 10.0
	// DefaultExplainLimit is the fit up to which a fault explains the
	// readings: every predicted reading within the meter's accuracy.
	DefaultExplainLimit = 1.0
)

// Settings tune a diagnosis. The zero value of each field means its
// default.
type Settings struct {
	Meter        Meter
	VBESpread_V  float64 // 0 = solver.DefaultVBESpread_V
	MaxDrift     float64 // 0 = 10 (values fitted within marked/10..marked·10)
	ExplainLimit float64 // 0 = 1
}

// WithDefaults returns s with each zero field set to its default.
func (s Settings) WithDefaults() Settings {
	s.Meter = s.Meter.WithDefaults()
	if s.VBESpread_V == 0 {
		s.VBESpread_V = solver.DefaultVBESpread_V
	}
	if s.MaxDrift == 0 {
		s.MaxDrift = DefaultMaxDrift
	}
	if s.ExplainLimit == 0 {
		s.ExplainLimit = DefaultExplainLimit
	}
	return s
}

// Validate reports the first bad field of s as a *solver.InputError.
func (s Settings) Validate() error {
	if err := s.Meter.Validate(); err != nil {
		return err
	}
	for _, c := range []struct {
		field  string
		v      float64
		lo, hi float64
	}{{"vbe_spread", s.VBESpread_V, 0, 0.2}, {"max_drift", s.MaxDrift, 0, 1000}, {"explain_limit", s.ExplainLimit, 0, 100}} {
		if math.IsNaN(c.v) || c.v < c.lo || c.v > c.hi {
			return &solver.InputError{Field: c.field, Problem: fmt.Sprintf("%g: want 0 (default) up to %g", c.v, c.hi)}
		}
	}
	if s.MaxDrift != 0 && s.MaxDrift <= 1 {
		return &solver.InputError{Field: "max_drift", Problem: fmt.Sprintf("%g: want a factor above 1", s.MaxDrift)}
	}
	return nil
}

// Candidate is one fault fitted to the readings.
type Candidate struct {
	Rank  int // 1 = best
	Fault Fault
	// Fit is the worst reading's deviation in units of the meter accuracy
	// (doc.go); ≤ 1 means every reading is matched within the meter.
	Fit float64
	// RMS is the root-mean-square deviation in the same units.
	RMS float64
	// Predicted are the readings the fitted faulty stage gives, each with
	// the meter on its node.
	Predicted Readings
	// Point is the fitted faulty stage's operating point with no meter.
	Point Point
	// HFE and VBEShift_V are where the fit put the transistor's hFE and
	// its VBE(on) relative to the datasheet.
	HFE        float64
	VBEShift_V float64
}

// Diagnosis is the outcome of Diagnose.
type Diagnosis struct {
	// Faults are every single fault tried, best first.
	Faults []Candidate
	// Working is the stage with no fault, fitted the same way.
	Working Candidate
	// Healthy reports that the working stage matches the readings
	// (Working.Fit ≤ ExplainLimit).
	Healthy bool
	// Explained reports that the best single fault matches the readings
	// (Faults[0].Fit ≤ ExplainLimit).
	Explained bool
	// Next is the check that tells the top two faults apart; nil when
	// fewer than two faults were tried.
	Next *Next
	// The settings used, defaults applied.
	Settings Settings
}

// Diagnose ranks the single faults of stage s (marked resistor values,
// signed rails) with a transistor of datasheet d that explain readings r
// (doc.go). It returns an error wrapping *solver.InputError for a bad
// stage, datasheet or setting, and *ReadingError for a reading outside the
// rails.
func Diagnose(s solver.Stage, d solver.Datasheet, r Readings, set Settings) (Diagnosis, error) {
	if err := set.Validate(); err != nil {
		return Diagnosis{}, fmt.Errorf("diagnose: %w", err)
	}
	set = set.WithDefaults()
	if err := s.Validate(d.Polarity); err != nil {
		return Diagnosis{}, fmt.Errorf("diagnose: %w", err)
	}
	base, err := solver.ModelFor(d, solver.TypicalHFE(d))
	if err != nil {
		return Diagnosis{}, fmt.Errorf("diagnose: %w", err)
	}
	if err := CheckRails(s, r, set.Meter); err != nil {
		return Diagnosis{}, fmt.Errorf("diagnose: %w", err)
	}
	var faults []Fault
	for _, sl := range s.Topology.Slots() {
		if s.R_Ohm[sl] == 0 {
			continue
		}
		for _, k := range resistorKinds {
			faults = append(faults, Fault{Position: ResistorAt(sl), Kind: k})
		}
	}
	for _, k := range transistorKinds {
		faults = append(faults, Fault{Position: Transistor, Kind: k})
	}
	dg := Diagnosis{Settings: set}
	dg.Working = fitOne(s, base, d, r, set, Fault{Position: Transistor, Kind: None})
	dg.Healthy = dg.Working.Fit <= set.ExplainLimit
	for _, f := range faults {
		dg.Faults = append(dg.Faults, fitOne(s, base, d, r, set, f))
	}
	slices.SortStableFunc(dg.Faults, func(a, b Candidate) int {
		return cmp.Or(cmp.Compare(a.Fit, b.Fit), cmp.Compare(a.RMS, b.RMS))
	})
	for i := range dg.Faults {
		dg.Faults[i].Rank = i + 1
	}
	dg.Explained = len(dg.Faults) > 0 && dg.Faults[0].Fit <= set.ExplainLimit
	if len(dg.Faults) >= 2 {
		dg.Next = nextMeasurement(s, dg.Faults[0], dg.Faults[1])
	}
	return dg, nil
}

// fitOne fits fault f to the readings and scores it.
func fitOne(s solver.Stage, base solver.Model, d solver.Datasheet, r Readings, set Settings, f Fault) Candidate {
	ft := &fitter{
		s: s, base: base, fault: f, meas: r.values(), mt: set.Meter,
		hfe:   bounded{d.HFEMin, d.HFEMax, true},
		shift: bounded{-set.VBESpread_V, set.VBESpread_V, false},
	}
	if d.HFEMax == d.HFEMin {
		ft.hfe = bounded{d.HFEMin, d.HFEMin * (1 + 1e-9), true}
	}
	for i, v := range ft.meas {
		ft.acc[i] = set.Meter.Accuracy_V(v)
	}
	switch f.Kind {
	case Drift:
		sl, _ := f.Position.Slot()
		ft.own = &bounded{s.R_Ohm[sl] / set.MaxDrift, s.R_Ohm[sl] * set.MaxDrift, true}
	case Leak:
		ft.own = &bounded{minLeak_A, maxLeak_A, true}
	case LowHFE:
		ft.hfe = bounded{minLowHFE, d.HFEMin, true}
	}
	u := ft.run()
	c := Candidate{Fault: f, Fit: math.Inf(1), RMS: math.Inf(1)}
	flt, m, hfe, shift := ft.params(u)
	pred, ok := ft.predict(u)
	if !ok {
		return c
	}
	var worst, sum float64
	for i := range pred {
		z := math.Abs(pred[i]-ft.meas[i]) / ft.acc[i]
		worst = max(worst, z)
		sum += z * z
	}
	c.Fault, c.HFE, c.VBEShift_V = flt, hfe, shift
	c.Fit, c.RMS = worst, math.Sqrt(sum/3)
	c.Predicted = Readings{VB_V: pred[0], VE_V: pred[1], VC_V: pred[2]}
	nw := newNetwork(s, m, benchTemp_C, flt, 0, 0)
	if st, err := nw.solve(nil); err == nil {
		c.Point = nw.point(&st)
	}
	return c
}
