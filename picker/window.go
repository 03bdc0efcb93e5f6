package picker

import (
	"math"

	"biasbin/solver"
)

// Band is one side of a yield window: a share of the design point either
// side (Relative, ±Frac), or an absolute range Min..Max.
type Band struct {
	Relative bool
	Frac     float64
	Min, Max float64
}

// Around returns the band around a centre value: ±Frac of it (not below
// 0), or the absolute range.
func (b Band) Around(centre float64) (lo, hi float64) {
	if b.Relative {
		return math.Max(0, centre*(1-b.Frac)), centre * (1 + b.Frac)
	}
	return b.Min, b.Max
}

// WindowRule is the one rule of the yield window, for every job that runs
// a yield (pick and check alike): IC and VCE each a share either side of
// the design point (WindowCentre) or an absolute range. The zero value
// means DefaultWindowRule.
type WindowRule struct {
	IC  Band
	VCE Band
}

// DefaultWindowRule is the window when none is asked for: IC within
// ±DefaultICWindow and VCE within ±DefaultVCEWindow of the design point.
func DefaultWindowRule() WindowRule {
	return WindowRule{IC: Band{Relative: true, Frac: DefaultICWindow}, VCE: Band{Relative: true, Frac: DefaultVCEWindow}}
}

// WithDefault returns r, or DefaultWindowRule when r is the zero value.
func (r WindowRule) WithDefault() WindowRule {
	if r == (WindowRule{}) {
		return DefaultWindowRule()
	}
	return r
}

// Check refuses a band that is no window: a share outside 0..100 %, or a
// range that is empty, negative or open above.
func (r WindowRule) Check() error {
	for _, b := range []struct {
		name string
		Band
	}{{"ic-window", r.IC}, {"vce-window", r.VCE}} {
		switch {
		case b.Relative && !(b.Frac > 0 && b.Frac < 1):
			return inputErr(b.name, "give a share between 0 and 100 %, e.g. 10%", "±%g %% is not a window", 100*b.Frac)
		case !b.Relative && !(b.Min >= 0 && b.Max > b.Min && !math.IsInf(b.Max, 0)):
			return inputErr(b.name, "give the band as MIN..MAX magnitudes with MIN below MAX", "%g..%g is not a window", b.Min, b.Max)
		}
	}
	return nil
}

// CentreKind says what the design point a window sits around is.
type CentreKind int

const (
	// CentreTarget: the job's target (pick's IC and VCE target).
	CentreTarget CentreKind = iota + 1
	// CentreNominal: the build's nominal operating point, when the job
	// has no target (check without --ic/--vce).
	CentreNominal
)

// WindowCentre is the design point a relative band sits around: IC and
// VCE each the target when the job has one, else the nominal point.
type WindowCentre struct {
	IC_A  float64
	ICOf  CentreKind
	VCE_V float64
	VCEOf CentreKind
}

// CentreOf is the design point of a job: each of IC and VCE the target
// when given (above 0), else the nominal point's.
func CentreOf(targetIC_A, targetVCE_V float64, nominal solver.OperatingPoint) WindowCentre {
	c := WindowCentre{IC_A: targetIC_A, ICOf: CentreTarget, VCE_V: targetVCE_V, VCEOf: CentreTarget}
	if targetIC_A <= 0 {
		c.IC_A, c.ICOf = nominal.IC_A, CentreNominal
	}
	if targetVCE_V <= 0 {
		c.VCE_V, c.VCEOf = nominal.VCE_V, CentreNominal
	}
	return c
}

// At returns the window the rule gives around the design point c (the
// default rule when r is zero).
func (r WindowRule) At(c WindowCentre) solver.Window {
	r = r.WithDefault()
	var w solver.Window
	w.ICMin_A, w.ICMax_A = r.IC.Around(c.IC_A)
	w.VCEMin_V, w.VCEMax_V = r.VCE.Around(c.VCE_V)
	return w
}

// YieldWindow is the window a yield ran against, with the rule and the
// design point it came from, so a front end can say which window it used.
type YieldWindow struct {
	solver.Window
	Rule   WindowRule
	Centre WindowCentre
}

// String names the kind of design point: "target" or "nominal".
func (k CentreKind) String() string {
	switch k {
	case CentreTarget:
		return "target"
	case CentreNominal:
		return "nominal"
	}
	return "unknown"
}

// MarshalText writes the kind's name (JSON).
func (k CentreKind) MarshalText() ([]byte, error) { return []byte(k.String()), nil }

// UnmarshalText reads a kind's name, as kept plans store it.
func (k *CentreKind) UnmarshalText(b []byte) error {
	switch string(b) {
	case "target":
		*k = CentreTarget
	case "nominal":
		*k = CentreNominal
	default:
		*k = 0
	}
	return nil
}
