package solver

import (
	"fmt"
	"math"
)

// Corner is one worst-case corner solved.
type Corner struct {
	// BF is the forward-gain parameter at TNOM: the datasheet hFE bound
	// itself. hFE is specified at 25 °C, which is the model's TNOM, so the
	// bound is what a simulator's .model line takes; the model's XTB then
	// moves beta with the junction temperature.
	BF float64
	// VBEOn_V is the VBE(on) of the corner's transistor (an end of
	// VBEOnRange) and VAF_V its Early voltage (an end of VAFRange; 0 =
	// infinite).
	VBEOn_V float64
	VAF_V   float64
	// IS_A is the corner's transport saturation current at TNOM: the one
	// that gives VBEOn_V at the VBE(on) test current (ModelFor).
	IS_A   float64
	Temp_C float64           // ambient (and resistor) temperature
	Tj_C   float64           // device temperature after self-heating
	VCC_V  float64           // collector rail at this corner
	VEE_V  float64           // emitter rail at this corner
	R_Ohm  [NumSlots]float64 // effective values (tolerance and TCR applied)
	OP     OperatingPoint
}

// WorstCase is the extreme-value analysis over all corners plus the
// linearised root-sum-square spread.
type WorstCase struct {
	Corners      []Corner // nil when WorstCaseOptions.SkipCorners is set
	ICMin_A      float64
	ICMax_A      float64
	VCEMin_V     float64
	VCEMax_V     float64
	ICMinCorner  int // index into Corners (the corner number, see CornerCount)
	ICMaxCorner  int
	VCEMinCorner int
	VCEMaxCorner int
	AllActive    bool    // every corner active with VCE >= VCE(sat) + margin
	RSSIC_A      float64 // linearised RSS spread (one-sided) of IC, JCGM 100 style
	RSSVCE_V     float64

	// Count is the number of corners solved.
	Count int
	// ICMinAt, ICMaxAt, VCEMinAt and VCEMaxAt are the extreme corners
	// themselves (filled also when Corners is not kept).
	ICMinAt, ICMaxAt, VCEMinAt, VCEMaxAt Corner
	// VBMin_V .. VEMax_V are the extremes of the test-point voltages over
	// the corners (signed node voltages, as measured against ground).
	VBMin_V, VBMax_V float64
	VCMin_V, VCMax_V float64
	VEMin_V, VEMax_V float64
	// TjMax_C is the hottest junction over the corners.
	TjMax_C float64
	// Dissipation holds each part's highest utilization over the corners,
	// each corner's powers checked against the ratings derated at that
	// corner's ambient.
	Dissipation Dissipation
	// NotActive counts corners that fail the AllActive condition.
	NotActive int
}

// WorstCaseOptions tunes EvalWorstCaseWith. The zero value is what
// EvalWorstCase does.
type WorstCaseOptions struct {
	// SkipCorners leaves WorstCase.Corners nil (no allocation): the
	// extremes, their corners and the RSS figures are still filled. For
	// search loops.
	SkipCorners bool
	// SkipRSS leaves the RSS figures zero (saves about 15 solves).
	SkipRSS bool
}

// EvalWorstCase solves every corner of b over the same input bounds as
// the Monte Carlo yield (Uncertainties): each combination of {hFE min,
// max} × {VBE(on) low, high} × {VAF low, high, when a range is stocked} ×
// {each used resistor low, high} × {supply −tol, +tol} × {ambient min,
// max} × {the emitter rail −tol, +tol, a supply of its own, split supply
// only} (an input without spread contributes one level, so a divider with
// four toleranced resistors has 2⁸ = 256 corners). A resistor's low level
// at an ambient Ta is R·(1 − tol)·(1 − |TCR|·|Ta − 25 °C|) and its high
// level R·(1 + tol)·(1 + |TCR|·|Ta − 25 °C|): the ends of what its
// tolerance and ± its TCR bound allow at that ambient (resistors are
// taken to be at the ambient temperature); the transistor is self-heated
// through ThermalResistance(b.Device). The corner evaluation is exact
// only where IC and VCE are monotonic in each input (REFERENCE.md §9).
//
// The RSS figures are the GUM law of propagation of uncertainty (JCGM
// 100:2008 §5.1.2, eq. (10); from memory for the clause) for uncorrelated
// inputs, u_c(Y) = √Σ(∂Y/∂x_i·u_i)², with every input taken as uniform
// (rectangular) over its range, u_i = a_i/√3 for the half-width a_i (GUM
// §4.3.7; from memory for the clause), over the ranges of Uncertainties
// (see EvalRSS). The sensitivity
// coefficients are central finite differences of the self-heated solve at
// the midpoint of every range. The figure is one standard uncertainty
// (coverage factor 1), one-sided.
//
// A corner whose solve fails (no convergence, thermal runaway) makes the
// whole evaluation fail with an error naming the corner.
func EvalWorstCase(b Build, lim Limits) (WorstCase, error) {
	return EvalWorstCaseWith(b, lim, WorstCaseOptions{})
}

// WorstCaseExtremes is EvalWorstCase without keeping the corner list: the
// fast path for search loops.
func WorstCaseExtremes(b Build, lim Limits) (WorstCase, error) {
	return EvalWorstCaseWith(b, lim, WorstCaseOptions{SkipCorners: true})
}

// axis kinds of the corner enumeration.
const (
	axisBeta = iota
	axisSupply
	axisAmbient
	axisResistor
	axisVBE
	axisVAF
	axisEmitterRail
)

// cornerAxis is one input with two levels.
type cornerAxis struct {
	kind int
	slot Slot
}

// cornerPlan is the corner enumeration of one build: its axes and the two
// device models.
type cornerPlan struct {
	b     Build
	axes  [NumSlots + 6]cornerAxis
	n     int
	theta float64
	tjMax float64
	allow [2]allowances // the parts' limits at the low and high ambient
	// models[i] is the transistor with bit 0 of i picking hFE max, bit 1
	// the high VBE(on) and bit 2 the high VAF; vbe and vaf hold the two
	// ends of those ranges.
	models [8]Model
	vbe    [2]float64
	vaf    [2]float64
	// dev[i][j] is models[i] at ambient j (0 min, 1 max); check[i][j] is
	// SolveSelfHeated's input check of that pair.
	dev   [8][2]device
	check [8][2]error
}

// newCornerPlan lists the axes of b (resistors first, ambient last), builds
// the two models and the parts' limits at both ambients.
func newCornerPlan(b Build, lim Limits) (cornerPlan, error) {
	p := cornerPlan{b: b, theta: ThermalResistance(b.Device), tjMax: tjMaxOf(b.Device)}
	p.allow[0] = newAllowances(&b, b.AmbientMin_C, lim)
	p.allow[1] = newAllowances(&b, b.AmbientMax_C, lim)
	add := func(kind int, slot Slot) { p.axes[p.n] = cornerAxis{kind, slot}; p.n++ }
	for i := range NumSlots {
		if b.usedSlot(i) && b.Resistors[i].Tol > 0 {
			add(axisResistor, i)
		}
	}
	if b.VCCTol > 0 {
		add(axisSupply, 0)
	}
	if b.railsApart() {
		add(axisEmitterRail, 0)
	}
	if b.Device.HFEMax > b.Device.HFEMin {
		add(axisBeta, 0)
	}
	p.vbe[0], p.vbe[1], _ = VBEOnRange(b.Device)
	if p.vbe[1] > p.vbe[0] {
		add(axisVBE, 0)
	}
	p.vaf[0], p.vaf[1] = VAFRange(b.Device)
	if p.vaf[1] > p.vaf[0] {
		add(axisVAF, 0)
	}
	if b.AmbientMax_C > b.AmbientMin_C {
		add(axisAmbient, 0)
	}
	base, err := ModelFor(b.Device, b.Device.HFEMin)
	if err != nil {
		return p, err
	}
	for i := range p.models {
		p.models[i] = cornerModel(base, b.Device, i&1 != 0, i>>1&1 != 0, i>>2&1 != 0)
		for j, amb := range [2]float64{b.AmbientMin_C, b.AmbientMax_C} {
			if p.check[i][j] = checkSelfHeated(&p.models[i], amb, p.theta, p.tjMax); p.check[i][j] == nil {
				p.dev[i][j] = p.models[i].at(amb)
			}
		}
	}
	return p, nil
}

// CornerModel returns the transistor model of d at one worst-case corner
// (EvalWorstCase): hFE at its max when hfeHigh (else its min), VBE(on) and
// VAF at the high end of their ranges when vbeHigh and vafHigh (else the
// low end; VBEOnRange, VAFRange).
func CornerModel(d Datasheet, hfeHigh, vbeHigh, vafHigh bool) (Model, error) {
	base, err := ModelFor(d, d.HFEMin)
	if err != nil {
		return Model{}, err
	}
	return cornerModel(base, d, hfeHigh, vbeHigh, vafHigh), nil
}

// cornerModel is CornerModel from base = ModelFor(d, d.HFEMin).
func cornerModel(base Model, d Datasheet, hfeHigh, vbeHigh, vafHigh bool) Model {
	m := base
	if hfeHigh {
		m.BF = d.HFEMax // ModelFor depends on bf only through BF
	}
	vbeLo, vbeHi, _ := VBEOnRange(d)
	m.IS_A = isFor(d, vbeLo)
	if vbeHigh {
		m.IS_A = isFor(d, vbeHi)
	}
	vafLo, vafHi := VAFRange(d)
	m.VAF_V = vafLo
	if vafHigh {
		m.VAF_V = vafHi
	}
	return m
}

// CornerCount returns the number of corners EvalWorstCase solves for b.
func CornerCount(b Build) int {
	n := 0
	for i := range NumSlots {
		if b.usedSlot(i) && b.Resistors[i].Tol > 0 {
			n++
		}
	}
	vbeLo, vbeHi, _ := VBEOnRange(b.Device)
	vafLo, vafHi := VAFRange(b.Device)
	for _, spread := range []bool{b.VCCTol > 0, b.railsApart(), b.Device.HFEMax > b.Device.HFEMin, vbeHi > vbeLo, vafHi > vafLo, b.AmbientMax_C > b.AmbientMin_C} {
		if spread {
			n++
		}
	}
	return 1 << n
}

// solve solves corner k: bit j of k picks the high level of axis j. It
// gives what SolveSelfHeated gives at the corner, with the models, their
// devices at the two ambients and the input checks shared by all corners.
func (p *cornerPlan) solve(k int) (Corner, error) {
	var high [NumSlots]bool
	vccFactor, veeFactor, ambient := 1.0, 0.0, p.b.AmbientMin_C
	mi, ai := 0, 0
	for j := 0; j < p.n; j++ {
		hi := k>>j&1 == 1
		ax := p.axes[j]
		switch ax.kind {
		case axisResistor:
			high[ax.slot] = hi
		case axisAmbient:
			if hi {
				ambient, ai = p.b.AmbientMax_C, 1
			}
		case axisSupply:
			if hi {
				vccFactor = 1 + p.b.VCCTol
			} else {
				vccFactor = 1 - p.b.VCCTol
			}
		case axisEmitterRail:
			if hi {
				veeFactor = 1 + p.b.EmitterRailTol()
			} else {
				veeFactor = 1 - p.b.EmitterRailTol()
			}
		case axisBeta:
			if hi {
				mi |= 1
			}
		case axisVBE:
			if hi {
				mi |= 2
			}
		case axisVAF:
			if hi {
				mi |= 4
			}
		}
	}
	m := &p.models[mi]
	if veeFactor == 0 { // no rail of its own: it moves with VCC
		veeFactor = vccFactor
	}
	s := p.b.cornerStage(&high, vccFactor, veeFactor, ambient)
	c := Corner{BF: m.BF, VBEOn_V: p.vbe[mi>>1&1], VAF_V: m.VAF_V, IS_A: m.IS_A, Temp_C: ambient, VCC_V: s.VCC_V, VEE_V: s.VEE_V, R_Ohm: s.R_Ohm}
	err := p.check[mi][ai]
	var op OperatingPoint
	if err == nil {
		op, err = solveSelfHeated(s, m, &p.dev[mi][ai], ambient, p.theta, p.tjMax, nil)
	}
	if err != nil {
		return c, fmt.Errorf("worst case: corner %d (hFE %g, ambient %g °C, vcc %.4g V): %w", k, m.BF, ambient, s.VCC_V, err)
	}
	c.OP = op
	c.Tj_C = op.Tj_C
	return c, nil
}

// CornerStage returns the stage of b at one worst-case corner
// (EvalWorstCase): each used resistor with a tolerance at the high end of
// it where high says so, else at the low end, its TCR bound moving it the
// same way at the corner's ambient, and one without tolerance at the end
// its TCR bound moves it up; the supply at VCC·(1 ± VCCTol), high when
// vccHigh; the emitter rail of a split supply at its own tolerance's high
// end when veeHigh (a rail without a tolerance of its own moves with the
// supply); the ambient at AmbientMax_C when ambHigh, else AmbientMin_C.
func (b Build) CornerStage(high [NumSlots]bool, vccHigh, veeHigh, ambHigh bool) Stage {
	vcc := 1 - b.VCCTol
	if vccHigh {
		vcc = 1 + b.VCCTol
	}
	vee := vcc
	if b.railsApart() {
		vee = 1 - b.EmitterRailTol()
		if veeHigh {
			vee = 1 + b.EmitterRailTol()
		}
	}
	amb := b.AmbientMin_C
	if ambHigh {
		amb = b.AmbientMax_C
	}
	return b.cornerStage(&high, vcc, vee, amb)
}

// cornerStage is the stage of b at a corner (CornerStage) with the
// supply and rail factors and the ambient given.
func (b *Build) cornerStage(high *[NumSlots]bool, vccFactor, veeFactor, ambient float64) Stage {
	var dev, tcr [NumSlots]float64
	for i := range NumSlots {
		if b.usedSlot(i) {
			dev[i], tcr[i] = b.Resistors[i].cornerEnds(high[i], ambient)
		}
	}
	return b.resolveTCR(&dev, &tcr, vccFactor, veeFactor, ambient)
}

// cornerEnds is where a worst-case corner puts resistor r: its relative
// deviation dev and the TCR tcr (ppm/K) that moves it from there at the
// corner's ambient. With a tolerance it sits at the high end when high
// says so, else at the low end, its TCR bound moving it the same way at
// that ambient; without one it has no axis, and its TCR bound still
// spreads it: it takes the end that moves it up.
func (r ResistorSpec) cornerEnds(high bool, ambient float64) (dev, tcr float64) {
	// The TCR sign that moves R the way of the level at this ambient.
	a := math.Abs(r.TCR_PPMPerK)
	if ambient < TCRReference_C {
		a = -a
	}
	switch {
	case r.Tol <= 0:
		return 0, a
	case high:
		return r.Tol, a
	}
	return -r.Tol, -a
}

// CornerFactor is what a worst-case corner at the ambient multiplies r's
// marked value by (CornerStage): its tolerance's end, high when high says
// so, moved by its TCR bound the same way (without a tolerance, up).
func (r ResistorSpec) CornerFactor(high bool, ambient float64) float64 {
	dev, tcr := r.cornerEnds(high, ambient)
	return (1 + dev) * (1 + tcr*1e-6*(ambient-TCRReference_C))
}

// EvalWorstCaseWith is EvalWorstCase with options.
func EvalWorstCaseWith(b Build, lim Limits, opt WorstCaseOptions) (WorstCase, error) {
	if err := b.Validate(); err != nil {
		return WorstCase{}, fmt.Errorf("worst case: %w", err)
	}
	lim = lim.WithDefaults()
	p, err := newCornerPlan(b, lim)
	if err != nil {
		return WorstCase{}, fmt.Errorf("worst case: %w", err)
	}
	n := 1 << p.n
	wc := WorstCase{Count: n, AllActive: true, Dissipation: Dissipation{Ok: true}}
	if !opt.SkipCorners {
		wc.Corners = make([]Corner, n)
	}
	vceFloor := vceSatOf(b.Device) + lim.VCEMargin_V
	for k := range n {
		c, err := p.solve(k)
		if err != nil {
			return WorstCase{}, err
		}
		if !opt.SkipCorners {
			wc.Corners[k] = c
		}
		wc.fold(k, &c)
		if c.OP.Region != Active || c.OP.VCE_V < vceFloor {
			wc.AllActive = false
			wc.NotActive++
		}
		allow := &p.allow[0]
		if c.Temp_C != b.AmbientMin_C {
			allow = &p.allow[1]
		}
		wc.Dissipation.worse(allow.eval(&b, &c.OP))
	}
	if !opt.SkipRSS {
		if wc.RSSIC_A, wc.RSSVCE_V, err = rssSpread(b, p.theta, p.tjMax); err != nil {
			return WorstCase{}, err
		}
	}
	return wc, nil
}

// fold takes corner k into the running extremes.
func (wc *WorstCase) fold(k int, c *Corner) {
	op := &c.OP
	if k == 0 {
		wc.ICMin_A, wc.ICMax_A, wc.VCEMin_V, wc.VCEMax_V = op.IC_A, op.IC_A, op.VCE_V, op.VCE_V
		wc.ICMinAt, wc.ICMaxAt, wc.VCEMinAt, wc.VCEMaxAt = *c, *c, *c, *c
		wc.VBMin_V, wc.VBMax_V = op.VB_V, op.VB_V
		wc.VCMin_V, wc.VCMax_V = op.VC_V, op.VC_V
		wc.VEMin_V, wc.VEMax_V = op.VE_V, op.VE_V
		wc.TjMax_C = op.Tj_C
		return
	}
	if op.IC_A < wc.ICMin_A {
		wc.ICMin_A, wc.ICMinCorner, wc.ICMinAt = op.IC_A, k, *c
	}
	if op.IC_A > wc.ICMax_A {
		wc.ICMax_A, wc.ICMaxCorner, wc.ICMaxAt = op.IC_A, k, *c
	}
	if op.VCE_V < wc.VCEMin_V {
		wc.VCEMin_V, wc.VCEMinCorner, wc.VCEMinAt = op.VCE_V, k, *c
	}
	if op.VCE_V > wc.VCEMax_V {
		wc.VCEMax_V, wc.VCEMaxCorner, wc.VCEMaxAt = op.VCE_V, k, *c
	}
	wc.VBMin_V, wc.VBMax_V = min(wc.VBMin_V, op.VB_V), max(wc.VBMax_V, op.VB_V)
	wc.VCMin_V, wc.VCMax_V = min(wc.VCMin_V, op.VC_V), max(wc.VCMax_V, op.VC_V)
	wc.VEMin_V, wc.VEMax_V = min(wc.VEMin_V, op.VE_V), max(wc.VEMax_V, op.VE_V)
	wc.TjMax_C = max(wc.TjMax_C, op.Tj_C)
}
