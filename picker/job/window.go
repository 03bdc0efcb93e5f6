package job

import (
	"math"

	"biasbin/solver"
)

// Band is one part of a yield window: a share of the nominal value either
// side (Relative, ±Frac), or an absolute range Min..Max.
type Band struct {
	Relative bool
	Frac     float64
	Min, Max float64
}

// Around returns the band around a nominal value: ±Frac of it (not below
// 0), or the absolute range.
func (b Band) Around(nominal float64) (lo, hi float64) {
	if b.Relative {
		return math.Max(0, nominal*(1-b.Frac)), nominal * (1 + b.Frac)
	}
	return b.Min, b.Max
}

// WindowSpec is a yield window given before the nominal point is known:
// each of IC and VCE a share of the nominal value or an absolute range.
type WindowSpec struct {
	IC  Band
	VCE Band
}

// At returns the yield window around the nominal operating point op.
func (w WindowSpec) At(op solver.OperatingPoint) solver.Window {
	var out solver.Window
	out.ICMin_A, out.ICMax_A = w.IC.Around(op.IC_A)
	out.VCEMin_V, out.VCEMax_V = w.VCE.Around(op.VCE_V)
	return out
}
