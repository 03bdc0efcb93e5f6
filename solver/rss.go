package solver

import (
	"fmt"
	"math"
)

// RSSTerm is one input's share of the linearised spread.
type RSSTerm struct {
	Input     string  // as Uncertainty.Input: "r1" .. "rb", "r1 tcr" .., "vcc", "hfe", "vbe_on", "vaf", "ambient"
	HalfWidth float64 // a: half the input's range, in its unit (Ω, ppm/K, V, 1, °C)
	U         float64 // standard uncertainty a/√3 (uniform over ±a)
	DIC       float64 // ∂IC/∂x at the midpoint, A per unit
	DVCE      float64 // ∂VCE/∂x at the midpoint, V per unit
}

// RSS is the linearised root-sum-square analysis of a build.
type RSS struct {
	Terms [2*NumSlots + 5]RSSTerm
	N     int // terms in use
	// IC_A and VCE_V are the midpoint values the linearisation is taken at.
	IC_A, VCE_V float64
	// UIC_A and UVCE_V are the combined standard uncertainties
	// √Σ(∂Y/∂x·u)² (one-sided, coverage factor 1).
	UIC_A, UVCE_V float64
	// LinIC_A and LinVCE_V are the linearised extreme-value spreads
	// Σ|∂Y/∂x·a| (REFERENCE.md §9, EVA linear form), for comparison.
	LinIC_A, LinVCE_V float64
}

// rssStep is the finite-difference step as a fraction of each input's
// half-width: small against the curvature, large against the solver's
// self-heating tolerance.
const rssStep = 0.01

// EvalRSS linearises IC and VCE of b about the midpoint of every input
// range of Uncertainties (resistors at nominal, each TCR at 0, the middle
// of its ± bound, supply at nominal, hFE, VBE(on) and VAF at the middle
// of their ranges, ambient at (min+max)/2) by central finite differences
// of the self-heated solve, and combines the inputs by the GUM law of
// propagation (JCGM 100:2008 §5.1.2, eq. (10); from memory for the clause)
// with each input uniform over its range, u = a/√3 (GUM §4.3.7; from
// memory for the clause). Being a linearisation at the midpoint, a TCR
// term is zero when the ambient range is centred on 25 °C.
func EvalRSS(b Build) (RSS, error) {
	if err := b.Validate(); err != nil {
		return RSS{}, fmt.Errorf("rss: %w", err)
	}
	return evalRSS(b, ThermalResistance(b.Device), tjMaxOf(b.Device))
}

// rssSpread returns the combined standard uncertainties of IC and VCE.
func rssSpread(b Build, theta, tjMax float64) (uIC, uVCE float64, err error) {
	r, err := evalRSS(b, theta, tjMax)
	return r.UIC_A, r.UVCE_V, err
}

// rssPoint is one evaluation point of the linearisation.
type rssPoint struct {
	dev       [NumSlots]float64
	tcr       [NumSlots]float64
	vccFactor float64
	veeFactor float64
	beta      float64
	vbe, vaf  float64
	ambient   float64
}

func evalRSS(b Build, theta, tjMax float64) (RSS, error) {
	d := b.Device
	m, err := ModelFor(d, 0.5*(d.HFEMin+d.HFEMax))
	if err != nil {
		return RSS{}, fmt.Errorf("rss: %w", err)
	}
	vbeLo, vbeHi, _ := VBEOnRange(d)
	vafLo, vafHi := VAFRange(d)
	mid := rssPoint{vccFactor: 1, veeFactor: 1, beta: m.BF, vbe: 0.5 * (vbeLo + vbeHi), vaf: 0.5 * (vafLo + vafHi), ambient: 0.5 * (b.AmbientMin_C + b.AmbientMax_C)}
	eval := func(p rssPoint) (ic, vce float64, err error) {
		mm := m
		mm.BF = p.beta // ModelFor depends on bf only through BF
		mm.IS_A = isFor(d, p.vbe)
		mm.VAF_V = p.vaf
		op, err := SolveSelfHeated(b.resolveTCR(&p.dev, &p.tcr, p.vccFactor, p.veeFactor, p.ambient), mm, p.ambient, theta, tjMax)
		if err != nil {
			return 0, 0, fmt.Errorf("rss: hFE %.4g, ambient %.4g °C: %w", p.beta, p.ambient, err)
		}
		return op.IC_A, op.VCE_V, nil
	}
	var r RSS
	if r.IC_A, r.VCE_V, err = eval(mid); err != nil {
		return r, err
	}
	// term differentiates along one input: a is its half-width in its own
	// unit, set moves the point by a relative step s (in units of a).
	term := func(name string, a float64, set func(p *rssPoint, s float64)) error {
		if a <= 0 {
			return nil
		}
		lo, hi := mid, mid
		set(&lo, -rssStep)
		set(&hi, rssStep)
		icLo, vceLo, err := eval(lo)
		if err != nil {
			return err
		}
		icHi, vceHi, err := eval(hi)
		if err != nil {
			return err
		}
		h := 2 * rssStep * a
		t := RSSTerm{Input: name, HalfWidth: a, U: a / math.Sqrt(3), DIC: (icHi - icLo) / h, DVCE: (vceHi - vceLo) / h}
		r.Terms[r.N] = t
		r.N++
		r.UIC_A = math.Hypot(r.UIC_A, t.DIC*t.U)
		r.UVCE_V = math.Hypot(r.UVCE_V, t.DVCE*t.U)
		r.LinIC_A += math.Abs(t.DIC * a)
		r.LinVCE_V += math.Abs(t.DVCE * a)
		return nil
	}
	for i := range NumSlots {
		if !b.usedSlot(i) {
			continue
		}
		tol := b.Resistors[i].Tol
		if err := term(i.String(), b.Resistors[i].Nominal_Ohm*tol, func(p *rssPoint, s float64) { p.dev[i] = s * tol }); err != nil {
			return r, err
		}
	}
	for i := range NumSlots {
		if !b.usedSlot(i) {
			continue
		}
		a := math.Abs(b.Resistors[i].TCR_PPMPerK)
		if err := term(i.String()+" tcr", a, func(p *rssPoint, s float64) { p.tcr[i] = s * a }); err != nil {
			return r, err
		}
	}
	apart := b.railsApart()
	if err := term("vcc", math.Abs(b.VCC_V)*b.VCCTol, func(p *rssPoint, s float64) {
		p.vccFactor = 1 + s*b.VCCTol
		if !apart {
			p.veeFactor = p.vccFactor
		}
	}); err != nil {
		return r, err
	}
	if apart {
		tol := b.EmitterRailTol()
		if err := term("vee", math.Abs(b.VEE_V)*tol, func(p *rssPoint, s float64) { p.veeFactor = 1 + s*tol }); err != nil {
			return r, err
		}
	}
	halfBeta := 0.5 * (d.HFEMax - d.HFEMin)
	if err := term("hfe", halfBeta, func(p *rssPoint, s float64) { p.beta = mid.beta + s*halfBeta }); err != nil {
		return r, err
	}
	halfVBE := 0.5 * (vbeHi - vbeLo)
	if err := term("vbe_on", halfVBE, func(p *rssPoint, s float64) { p.vbe = mid.vbe + s*halfVBE }); err != nil {
		return r, err
	}
	halfVAF := 0.5 * (vafHi - vafLo)
	if err := term("vaf", halfVAF, func(p *rssPoint, s float64) { p.vaf = mid.vaf + s*halfVAF }); err != nil {
		return r, err
	}
	halfT := 0.5 * (b.AmbientMax_C - b.AmbientMin_C)
	if err := term("ambient", halfT, func(p *rssPoint, s float64) { p.ambient = mid.ambient + s*halfT }); err != nil {
		return r, err
	}
	return r, nil
}
