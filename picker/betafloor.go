package picker

import (
	"math"

	"biasbin/solver"
)

// betaWindow is the set of builds betaFloor bounds: R_TH in [RTH,
// RTHMax], RE in [RE, REMax] (REMax 0: RE alone), RC in [RCMin, RCMax]
// and the typical-hFE nominal IC in [ICLo, ICHi].
type betaWindow struct {
	RTH, RTHMax  float64
	RE, REMax    float64
	RCMin, RCMax float64
	ICLo, ICHi   float64
}

// betaFloor is a lower bound on the beta term (IC2 − IC1)/IC of every
// passing build of dv in the window w (doc.go, bound B).
// IC1, IC2 and IC are the self-heated nominal points (25 °C ambient,
// marked values) at hFE min, max and typical. It is 0 where its model does
// not hold: a leakage current in the model, NF ≠ 1, no RE.
//
// Premise: the three points of a passing build are forward-active (the
// base-emitter injection at least solver.ConductingCurrent_A) with VCE at
// least VCE(sat) + margin. That is a hard limit of its own (the bench
// points, doc.go), so it holds by definition.
//
// Every step is an inequality of the transport model the solver uses
// (IC = Ibe·k, k = (1 − c)·q − c/BR, IB = Ibe·(1 + c·BF/BR)/BF, c =
// Ibc/Ibe, q = 1 − VBC/VAF); nothing is linearised or left to a margin.
// Writing β = IC/IB = b·φ (b the hFE at TNOM, φ = f(T)·k/(1 + c·b/BR),
// f the XTB factor) and g(β) = (R_TH + RE)/β + RE, the base loop of each
// point is exactly V_TH − VBE = IC·g(β), so for points A and B
//
//	IC_A/IC_B = (V_TH − VBE_A)/(V_TH − VBE_B) · g(β_B)/g(β_A).
//
// betaModel bounds what holds at every point (junction between 25 °C and
// Th, c, q, k, VBE, |∂VBE/∂T| ≤ κ); betaModel.point what follows from a
// point's IC range; betaModel.ratio what two points share: φ_A/φ_B ≥ ρ
// from their temperature difference (θ times the power difference), their
// VCE difference and their VBE difference, and k_B/k_A ≤ Q. Then:
//
//   - g(β_B)/g(β_A) is monotonic in w = (R_TH + RE)/φ_B, so it is at least
//     the smaller of its bounds at the two ends of w's range (gRatio);
//   - VBE_A − VBE_B at one temperature is at most NF·VT·ln(Ibe_A/Ibe_B)
//     plus IS/Ibe_A, and κ per kelvin apart (vbeRise);
//   - so y = IC1/IC and z = IC2/IC satisfy y ≥ H(1 − (vbeRise(y·Q) +
//     κΔT)/A), A = icLo·g(βt,max) ≤ V_TH − VBE at the typical point, whose
//     right side falls with y: y is at least its fixed point;
//   - likewise 1 + X = IC2/IC1 ≥ G(1 − (vbeRise((1 + X)·Q) + κΔT)/A1) with
//     A1 = IC1,min·g(β1,max);
//   - the term is X·y and also X/(1 + X)·z; the larger bound is returned.
//
// Over a range of RE every step takes RE at the end that keeps it an
// inequality: the least RE where a quantity is bounded from above and RE
// enters it falling (power, base drive, the Early factor) or from below
// and RE enters it rising (V_TH − VBE's lower end), the largest in the
// other cases, and g's ratios at whichever end is worse (each is
// monotonic in RE).
//
// TestBoundsHoldOnRandomBuilds checks it against the exact beta term of
// random builds.
func (e *evaluator) betaFloor(dv *device, w betaWindow) float64 {
	m := dv.typ
	rth, rthMax, reOhm, rcMin, rcMax, icLo, icHi := w.RTH, w.RTHMax, w.RE, w.RCMin, w.RCMax, w.ICLo, w.ICHi
	reMax := max(reOhm, w.REMax)
	if m.ICBO_A > 0 || m.NF != 1 || icLo <= 0 || icHi < icLo || reOhm <= 0 || rth < 0 || rthMax < rth || !(rcMin >= 0) || rcMax < rcMin ||
		m.XTI < 0 || m.EG_eV < 0 || math.IsInf(reMax, 0) {
		return 0
	}
	// A first junction bound for every point, from the circuit alone:
	// VCE·IC ≤ IC(VCC − IC(RC + RE)) ≤ VCC²/(4(RC + RE)), and the base
	// loop V_TH = IB(R_TH + RE) + IC·RE + VBE ≤ VCC gives IB ≤ VCC/(R_TH +
	// RE), so VBE·IB ≤ VBEcap·VCC/(R_TH + RE) (VBEcap of the widest range).
	vcc := e.span
	th := NominalAmbient_C + thermalSlack_K // no self-heating
	if dv.thetaJA > 0 {
		th = dv.tjMax_C + thermalSlack_K
		p0 := vcc*vcc/(4*(rcMin+reOhm)) + e.hotVBECap(dv, reOhm)*vcc/(rth+reOhm)
		th = min(dv.tjMax_C, NominalAmbient_C+dv.thetaJA*p0) + thermalSlack_K
	}
	var bm betaModel
	var p1, pt, p2 betaPoint
	for iter := 0; ; iter++ {
		var ok bool
		if bm, ok = e.newBetaModel(dv, th, reOhm, reMax, rth, rthMax, rcMin, rcMax, icLo); !ok {
			return 0
		}
		pt = bm.point(bm.bt, bm.cnAt(icLo), icLo, icHi)
		// Nothing shared yet: each point against the typical one's extremes.
		y := bm.lowRatio(bm.b1, bm.cnOn, bm.kMaxFor(pt.cn)/bm.kMin, bm.dT, bm.betaMin(bm.b1)/bm.b1/pt.phiMax, pt)
		z := bm.lowRatio(bm.b2, bm.cnOn, bm.kMaxFor(pt.cn)/bm.kMin, bm.dT, bm.betaMin(bm.b2)/bm.b2/pt.phiMax, pt)
		if !(y > 0) {
			return 0
		}
		cn1, cn2 := bm.cnAt(y*icLo), bm.cnAt(z*icLo)
		p1 = bm.point(bm.b1, cn1, y*icLo, bm.upRatio(bm.b1, cn1, pt)*icHi)
		p2 = bm.point(bm.b2, cn2, z*icLo, bm.upRatio(bm.b2, cn2, pt)*icHi)
		if iter == 2 {
			break
		}
		again := false
		// Bound B-RTH (rthCap): a window open to the largest level is
		// no wider than the builds in it can be.
		if c := bm.rthCap(pt); c < rthMax*(1-1e-9) {
			rthMax, again = max(rth, c), true
		}
		if next := min(th, NominalAmbient_C+dv.thetaJA*max(max(p1.pUp, p2.pUp), pt.pUp)+thermalSlack_K); next < th-0.5 {
			th, again = next, true // at least half a kelvin to gain
		}
		if !again {
			break
		}
	}
	if math.IsInf(p1.phiMax, 1) || math.IsInf(p2.phiMax, 1) {
		return 0
	}
	// Sharpen the lower ends of IC1 and IC2 with what each point shares
	// with the typical one.
	rho, qk, dT := bm.ratio(p1, pt)
	y := max(p1.icLo/icLo, bm.lowRatio(bm.b1, p1.cn, qk, dT, rho, pt))
	rho, qk, dT = bm.ratio(p2, pt)
	z := max(p2.icLo/icLo, bm.lowRatio(bm.b2, p2.cn, qk, dT, rho, pt))
	p1, p2 = bm.withLow(p1, y*icLo), bm.withLow(p2, z*icLo)
	rho, qk, dT = bm.ratio(p2, p1)
	gr := bm.gRatio(bm.b2, bm.b1, bm.betaMin(bm.b1)/bm.b1, p1.phiMax, rho)
	a1Lo, a1Hi := bm.loopDrop(p1)
	xm := fixedMap{bm: &bm, h: gr, qk: qk, cn: p2.cn, kdT: bm.kappa * dT, aLo: a1Lo, aHi: a1Hi}
	x := leastFixedPoint(xm.at, gr) - 1
	if !(x > 0) {
		return 0
	}
	return max(x*y, z*x/(1+x))
}

// nominalBetaMin bounds IC/IB from below at every nominal point of a
// passing build of dv (premise of betaFloor: forward-active, VCE at least
// VCE(sat) + margin), at any hFE of the datasheet range and any stocked
// RE: betaModel.betaMin of hFE min with the junction anywhere up to Tj max
// and the least RE (which gives the largest VBE bound and so the least Early
// factor). The search takes IE ≤ (1 + 1/betaNomMin)·IC from it. Where the
// model gives no bound (an Early voltage below the supply, a model with
// NF ≠ 1) it is 0.01, which leaves the cuts that use it all but off.
// atTyp is the same floor with hFE typical, the nominal point's own model
// (device.betaTypMin).
func (e *evaluator) nominalBetaMin(dv *device) (atMin, atTyp float64) {
	const none = 0.01
	if len(e.vs.levels) == 0 || dv.typ.NF != 1 || dv.typ.XTI < 0 || dv.typ.EG_eV < 0 {
		return none, none
	}
	bm, ok := e.newBetaModel(dv, dv.tjMax_C+thermalSlack_K, e.vs.levels[0].ohm, e.vs.levels[0].ohm, 0, math.Inf(1), 0, math.Inf(1), 0)
	if !ok {
		return none, none
	}
	atMin = max(none, bm.betaMin(bm.b1))
	return atMin, max(atMin, bm.betaMin(bm.bt))
}

// thermalSlack_K widens junction-temperature bounds past the self-heated
// solve's tolerance on its heat balance (1e-6 K), a thousandfold.
const thermalSlack_K = 1e-3

// betaModel holds what betaFloor knows of every point of a build: the
// device at junction temperatures in [25 °C − slack, th] and the circuit.
type betaModel struct {
	m          solver.Model
	b1, bt, b2 float64 // BF at TNOM: hFE min, typical, max
	br, brLo   float64 // BR at TNOM and its least over the range
	fLo, fHi   float64 // the XTB factor over the range
	f25        float64 // the XTB factor at tLo_C
	tLo_C      float64 // 25 °C − slack
	tLoK       float64
	th         float64 // the junction is at most this, °C
	dT         float64 // th − tLo_C
	isHi       float64 // IS at th (IS rises with temperature)
	cnOn       float64 // IS/Ibe at any point (Ibe ≥ the conducting current)
	cp         float64 // c = Ibc/Ibe is at most this
	qMin, qMax float64 // q = 1 − VBC/VAF of any point
	kMin       float64 // IC/Ibe of any point is at least this
	nvt, nvtLo float64 // NF·VT at th and at tLo_C
	vbeCap     float64 // VBE of any point is at most this
	kappa      float64 // |∂VBE/∂T| at a fixed current, V/K
	vceFloor   float64
	vcc        float64
	re, reMax  float64 // RE's range
	rcMin      float64
	rcMax      float64
	a, aMax    float64 // R_TH + RE at its least and at its largest
	icLo       float64 // the typical point's IC is at least this
	theta      float64 // K/W
	xtb        *xtbTable
}

// newBetaModel computes the bounds for junctions in [25 °C, th] and RE in
// [reOhm, reMax] (see betaFloor); ok is false where they give nothing.
func (e *evaluator) newBetaModel(dv *device, th, reOhm, reMax, rth, rthMax, rcMin, rcMax, icLo float64) (betaModel, bool) {
	m := dv.typ
	bm := betaModel{m: m, b1: dv.lo.BF, bt: m.BF, b2: dv.hi.BF, br: m.BR, th: th,
		vcc: e.span, re: reOhm, reMax: reMax, rcMin: rcMin, rcMax: rcMax, a: rth + reOhm, aMax: rthMax + reMax, icLo: icLo, theta: dv.thetaJA, xtb: &dv.xtb}
	bm.tLo_C = NominalAmbient_C - thermalSlack_K
	bm.tLoK = bm.tLo_C + 273.15
	bm.dT = th - bm.tLo_C
	at := dv.nominal()
	bm.f25 = at.factor
	// IS and the factor at th, or on the device's table at the next
	// point hotter than th: IS rises with T, so that is at least IS(th);
	// the factor is monotonic in T, so it is beyond factor(th) on the
	// side away from f25, and the range [fLo, fHi] still holds it
	isHi, fTh, ok := dv.xtb.hotter(th)
	if !ok {
		var bfHi float64
		isHi, bfHi, _, _ = m.At(th)
		fTh = bfHi / m.BF // the solver's own factor at th
	}
	bm.isHi = isHi
	bm.fLo, bm.fHi = bm.f25, fTh
	if bm.fLo > bm.fHi {
		bm.fLo, bm.fHi = bm.fHi, bm.fLo
	}
	bm.brLo = bm.br * bm.fLo
	vtHi := solver.ThermalVoltage_V(th)
	bm.nvt = m.NF * vtHi
	bm.nvtLo = m.NF * solver.ThermalVoltage_V(bm.tLo_C)
	isLo := at.is
	bm.cnOn = bm.isHi / solver.ConductingCurrent_A
	bm.vceFloor = dv.vceSat + e.s.lim.VCEMargin_V
	// c ≤ e^(VBC/VT)/(e^(VBE/VT) − 1) with VBC = VBE − VCE ≤ VBE − floor
	// and 1/(1 − e^(−VBE/VT)) = 1 + IS/Ibe ≤ 1 + cnOn.
	bm.cp = math.Exp(-bm.vceFloor/vtHi) * (1 + bm.cnOn)
	if bm.cp >= 1 {
		return bm, false
	}
	// VBC ≤ VBE ≤ V_TH ≤ VCC gives a first q floor; VE = IE·RE ≤ VCC and
	// IE ≥ Ibe·(1 − cp)·q then cap Ibe, and VBE at a fixed current is at
	// most its 25 °C value times T/T(25 °C) (IS rises with T). VBC ≥ −VCC.
	q0 := 1.0
	bm.qMax = 1
	if m.VAF_V > 0 {
		q0, bm.qMax = 1-bm.vcc/m.VAF_V, 1+bm.vcc/m.VAF_V
	}
	if q0 <= 0 {
		return bm, false
	}
	ibeMax := bm.vcc / reOhm / ((1 - bm.cp) * q0)
	vCapLo := m.NF * bm.nvtLo / m.NF * math.Log(ibeMax/isLo+1)
	bm.vbeCap = vCapLo * (th + 273.15) / bm.tLoK
	bm.qMin = 1
	if m.VAF_V > 0 {
		bm.qMin = 1 - max(0, bm.vbeCap-bm.vceFloor)/m.VAF_V
	}
	bm.kMin = (1-bm.cp)*bm.qMin - bm.cp/bm.brLo
	if bm.kMin <= 0 {
		return bm, false
	}
	// ∂VBE/∂T = VBE/T − NF(EG + XTI·VT)/T·Ibe/(Ibe + IS), and VBE/T at a
	// fixed current is largest at the coolest junction.
	bm.kappa = max(m.NF*(m.EG_eV+m.XTI*vtHi), vCapLo) / bm.tLoK
	return bm, true
}

// newNominalDevice computes m's figures at betaModel's lowest junction
// temperature.
func newNominalDevice(m solver.Model) nominalDevice {
	t := NominalAmbient_C - thermalSlack_K
	is, bf, _, _ := m.At(t)
	return nominalDevice{is: is, factor: bf / m.BF} // the solver's own factor
}

// hotVBECap is newBetaModel's VBE bound for junctions up to Tj max with
// this RE (at most VCC), without the rest of the model; what does not
// depend on RE is dv.hotCap (newHotCap).
func (e *evaluator) hotVBECap(dv *device, reOhm float64) float64 {
	vcc := e.span
	hc := &dv.hotCap
	if !hc.ok {
		return vcc
	}
	ibeMax := vcc / reOhm / hc.den
	vCapLo := hc.nvtLo * math.Log(ibeMax/hc.is+1)
	return min(vcc, vCapLo*hc.heat)
}

// hotCap is what hotVBECap takes of a device whatever RE is.
type hotCap struct {
	ok    bool    // false: the bound is VCC
	den   float64 // (1 − c)·q0: Ibe ≤ VCC/RE/den
	is    float64 // IS just below the nominal ambient
	nvtLo float64 // NF·VT there
	heat  float64 // (Tj max + slack)/(that temperature), in kelvin
}

// newHotCap computes dv's hotCap for this evaluator's span: c bounds
// Ibc/Ibe with VCE at least VCE(sat) + margin at Tj max, q0 the Early
// factor's floor (1 − span/VAF).
func (e *evaluator) newHotCap(dv *device) hotCap {
	vcc := e.span
	m := dv.typ
	at := dv.nominal()
	th := dv.tjMax_C + thermalSlack_K
	isHot, _, _, _ := m.At(th)
	cp := math.Exp(-(dv.vceSat+e.s.lim.VCEMargin_V)/solver.ThermalVoltage_V(th)) * (1 + isHot/solver.ConductingCurrent_A)
	q0 := 1.0
	if m.VAF_V > 0 {
		q0 = 1 - vcc/m.VAF_V
	}
	if cp >= 1 || q0 <= 0 {
		return hotCap{}
	}
	tLo := NominalAmbient_C - thermalSlack_K
	return hotCap{ok: true, den: (1 - cp) * q0, is: at.is, nvtLo: m.NF * solver.ThermalVoltage_V(tLo), heat: (th + 273.15) / (tLo + 273.15)}
}

// nominal returns d.at25, computed here for a device built without it.
func (d *device) nominal() nominalDevice {
	if d.at25 == (nominalDevice{}) {
		return newNominalDevice(d.typ)
	}
	return d.at25
}

// factor is BF's (and BR's) temperature factor (T/TNOM)^XTB, the
// solver's own.
func (bm *betaModel) factor(t_C float64) float64 {
	_, bf, _, _ := bm.m.At(t_C)
	return bf / bm.m.BF
}

// factorUp is at least factor(t_C): the factor at the next point of the
// device's table (xtbTable) on the side where the factor is larger (it is
// monotonic in T), or factor itself off the table.
func (bm *betaModel) factorUp(t_C float64) float64 {
	tab := bm.xtb
	x := (t_C - tab.t0) / xtbStep_K
	if !(x >= 0) || x >= float64(len(tab.f)-1) {
		return bm.factor(t_C)
	}
	if bm.m.XTB >= 0 {
		return tab.f[int(math.Ceil(x))]
	}
	return tab.f[int(x)]
}

// xtbTable holds a device's temperature factor and IS every xtbStep_K
// from t0 (betaModel's lowest junction temperature) past Tj max.
type xtbTable struct {
	t0    float64
	f, is []float64
}

// hotter returns IS and the factor at the table's first point at or above
// t_C; ok is false off the table.
func (tab *xtbTable) hotter(t_C float64) (is, f float64, ok bool) {
	x := (t_C - tab.t0) / xtbStep_K
	if !(x >= 0) || x >= float64(len(tab.f)-1) {
		return 0, 0, false
	}
	i := int(math.Ceil(x))
	return tab.is[i], tab.f[i], true
}

// xtbStep_K is xtbTable's step: the factor it gives for a temperature is
// at most that of one step hotter, a few parts in 10⁵ for the XTB of a
// silicon transistor.
const xtbStep_K = 0.05

// newXTBTable tabulates dv's temperature factor.
func newXTBTable(dv *device) xtbTable {
	t0 := NominalAmbient_C - thermalSlack_K
	n := int(math.Ceil((dv.tjMax_C+2*thermalSlack_K-t0)/xtbStep_K)) + 2
	tab := xtbTable{t0: t0, f: make([]float64, n), is: make([]float64, n)}
	for i := range tab.f {
		var bf float64
		tab.is[i], bf, _, _ = dv.typ.At(t0 + float64(i)*xtbStep_K)
		tab.f[i] = bf / dv.typ.BF // factor's value
	}
	return tab
}

// cnAt bounds IS/Ibe (−c when the collector junction is reverse biased:
// Ibc ≥ −IS) at a point whose IC is at least icLo: Ibe ≥ IC/k and k ≤
// (1 + cn)·qMax + cn/BR give cn = IS·qMax/(icLo − IS(qMax + 1/BR)).
func (bm *betaModel) cnAt(icLo float64) float64 {
	d := icLo - bm.isHi*(bm.qMax+1/bm.brLo)
	if !(d > 0) {
		return bm.cnOn
	}
	return min(bm.cnOn, bm.isHi*bm.qMax/d)
}

// kMaxFor bounds IC/Ibe from above at a point whose IS/Ibe is at most cn.
func (bm *betaModel) kMaxFor(cn float64) float64 {
	return (1+cn)*bm.qMax + cn/bm.brLo
}

// betaMin bounds IC/IB from below at any point whose BF at TNOM is b.
func (bm *betaModel) betaMin(b float64) float64 {
	return b * bm.fLo * bm.kMin / (1 + bm.cp*b/bm.br)
}

// betaMax bounds IC/IB from above at a point whose BF at TNOM is b and
// IS/Ibe at most cn (+Inf when the bound gives nothing).
func (bm *betaModel) betaMax(b, cn float64) float64 {
	d := 1 - cn*b/bm.br
	if !(d > 0) {
		return math.Inf(1)
	}
	return b * bm.fHi * bm.kMaxFor(cn) / d
}

// gRatio bounds g(β_B)/g(β_A) from below over every R_TH and RE in the
// ranges, for points whose hFE at TNOM are bA and bB, φ_B in [phiBMin,
// phiBMax] and φ_A/φ_B at least rho: with w = (R_TH + RE)/φ_B the ratio
// is at least h(w, RE) = (w/bB + RE)/(w/(bA·rho) + RE), monotonic in w
// and in RE, so at least the least of h at the corners of their ranges.
func (bm *betaModel) gRatio(bA, bB, phiBMin, phiBMax, rho float64) float64 {
	lim := bA * rho / bB // the limit of h as w grows
	least := math.Inf(1)
	for _, re := range [2]float64{bm.re, bm.reMax} {
		h := func(w float64) float64 { return (w/bB + re) / (w/(bA*rho) + re) }
		hi := lim
		if wHi := bm.aMax / phiBMin; !math.IsInf(wHi, 1) {
			hi = h(wHi)
		}
		least = min(least, h(bm.a/phiBMax), hi)
		if bm.reMax == bm.re {
			break
		}
	}
	return least
}

// vbeRise bounds VBE_A − VBE_B from above for two points at one junction
// temperature whose base-emitter currents have Ibe_A/Ibe_B ≤ u, IS/Ibe_A
// ≤ cnA: NF·VT(T)·ln((Ibe_A + IS)/(Ibe_B + IS)) ≤ NF·VT(T)·(ln u + cnA),
// taken with the largest VT when positive and the least when not. slope is
// its derivative with respect to ln u.
func (bm *betaModel) vbeRise(u, cnA float64) (rise, slope float64) {
	l := math.Log(u) + cnA
	if l >= 0 {
		return bm.nvt * l, bm.nvt
	}
	return bm.nvtLo * l, bm.nvtLo
}

// lowRatio bounds IC_A/IC (the typical point pt) from below for the point
// whose hFE at TNOM is b and IS/Ibe at most cnA, given k_t/k_A ≤ qk,
// |T_A − T_t| ≤ dT and φ_A/φ_t ≥ rho: a lower bound on the fixed point of
// lowRatioMap.
func (bm *betaModel) lowRatio(b, cnA, qk, dT, rho float64, pt betaPoint) float64 {
	m := bm.lowRatioMap(b, cnA, qk, dT, rho, pt)
	return leastFixedPoint(m.at, m.h)
}

// lowRatioMap is lowRatio's map y ↦ H(1 − (vbeRise(y·qk) + κ·dT)/A), with
// H the g ratio against the typical point and A its loop drop.
func (bm *betaModel) lowRatioMap(b, cnA, qk, dT, rho float64, pt betaPoint) fixedMap {
	h := bm.gRatio(b, bm.bt, bm.betaMin(bm.bt)/bm.bt, pt.phiMax, rho)
	aLo, aHi := bm.loopDrop(pt)
	return fixedMap{bm: bm, h: h, qk: qk, cn: cnA, kdT: bm.kappa * dT, aLo: aLo, aHi: aHi}
}

// fixedMap is the map y ↦ h·(1 − (vbeRise(y·qk) + κ·ΔT)/A) whose fixed
// point bounds a current ratio (lowRatio, betaFloor's 1 + X), with A =
// V_TH − VBE in [aLo, aHi] taken as headroom does: nonincreasing in y, so
// any y with at(y) ≥ y is at most the fixed point.
type fixedMap struct {
	bm             *betaModel
	h, qk, cn, kdT float64 // kdT is κ·ΔT
	aLo, aHi       float64
}

// at is the map at y and its derivative.
func (m fixedMap) at(y float64) (float64, float64) {
	rise, slope := m.bm.vbeRise(y*m.qk, m.cn)
	return m.bm.headroom(m.h, rise+m.kdT, slope, y, m.aLo, m.aHi)
}

// loopDrop bounds V_TH − VBE = IC·g(β) at point p: IC in [p.icLo,
// p.icUp], β = b·φ between betaMin(b) and b·p.phiMax, R_TH + RE in [a,
// aMax] and RE in [re, reMax].
func (bm *betaModel) loopDrop(p betaPoint) (lo, hi float64) {
	return p.icLo * (bm.a/(p.b*p.phiMax) + bm.re), p.icUp * (bm.aMax/bm.betaMin(p.b) + bm.reMax)
}

// headroom is h·(1 − n/A) and its derivative in x, for a rise n ≥ or < 0
// of VBE over A = V_TH − VBE ∈ [aLo, aHi] (so taken with aLo when n ≥ 0
// and aHi when not, which keeps it a lower bound), where n rises with ln x
// at the rate slope.
func (bm *betaModel) headroom(h, n, slope, x, aLo, aHi float64) (float64, float64) {
	a := aLo
	if n < 0 {
		a = aHi
	}
	return h * (1 - n/a), -h * slope / (a * x)
}

// upRatio bounds IC_A/IC (the typical point pt) from above for the point
// whose hFE at TNOM is b and IS/Ibe at most cnA: g(βt)/g(β_A) is at most
// its bound with βt,min and β_A,max at either end of R_TH's range (with
// the least RE: the ratio is over 1 and falls as RE rises), and
// once IC_A ≥ IC, VBEt − VBE_A ≤ vbeRise(k_A,max/k_min) + κ·ΔT.
func (bm *betaModel) upRatio(b, cnA float64, pt betaPoint) float64 {
	btMin, bMax := bm.betaMin(bm.bt), bm.betaMax(b, cnA)
	if math.IsInf(bMax, 1) {
		return math.Inf(1)
	}
	h := func(a float64) float64 { return (a/btMin + bm.re) / (a/bMax + bm.re) }
	hr := max(h(bm.a), bMax/btMin)
	if !math.IsInf(bm.aMax, 1) {
		hr = max(h(bm.a), h(bm.aMax))
	}
	aT := bm.icLo * (bm.a/(bm.bt*pt.phiMax) + bm.re)
	rise, _ := bm.vbeRise(bm.kMaxFor(cnA)/bm.kMin, pt.cn)
	spread := max(0, rise) + bm.kappa*bm.dT
	return max(1, hr*(1+spread/aT))
}

// leastFixedPoint returns a lower bound on the fixed point v* = f(v*) of
// a nonincreasing f on (0, ∞): a quantity known to satisfy v ≥ f(v) is at
// least v*, since f(v) > v for every v < v*, so any x with f(x) ≥ x is
// such a bound. Newton's method on f(x) − x (fdf returns f and its
// derivative) from guess finds v*; the largest iterate that passes the
// test is returned, with bisection as the fallback. It returns 0 when v*
// is not positive.
func leastFixedPoint(fdf func(float64) (float64, float64), guess float64) float64 {
	f := func(x float64) float64 { v, _ := fdf(x); return v }
	best := 0.0
	x := max(guess, 1e-12)
	for range 12 {
		fx, dfx := fdf(x)
		if fx >= x {
			best = max(best, x)
		}
		d := dfx - 1
		if !(d < 0) || math.IsInf(d, 0) {
			break
		}
		next := x - (fx-x)/d
		if !(next > 0) {
			next = 0.5 * x
		}
		if math.Abs(next-x) <= 1e-6*x {
			if f(next) >= next {
				best = max(best, next)
			}
			break
		}
		x = next
	}
	if best > 0 {
		return best
	}
	hi := max(guess, 1e-12)
	for i := 0; f(hi) > hi; i++ {
		if i == 200 {
			return 0
		}
		hi *= 2
	}
	lo := 0.0
	for range 100 {
		mid := 0.5 * (lo + hi)
		if f(mid) >= mid {
			lo = mid
		} else {
			hi = mid
		}
		if hi-lo <= 1e-7*hi {
			break
		}
	}
	return lo
}

// betaPoint is what is known of one point: its hFE at TNOM, its IC range
// and what follows from it.
type betaPoint struct {
	b          float64
	cn         float64 // IS/Ibe at most this
	icLo, icUp float64
	ibUp       float64 // IB ≤ IC/β_min
	pUp        float64 // device power, W
	fHi        float64 // the XTB factor at the hottest this point can be
	phiMax     float64 // φ = β/b at most this
}

// point bounds a point of hFE b and IS/Ibe at most cn whose IC lies in
// [icLo, icUp]: power VCE·IC + VBE·IB ≤ min(VCC·IC, VCC²/(4(RC + RE))) +
// VBEcap·IB (VC ≤ VCC, IE ≥ IC) with IB ≤ min(IC/β_min, VCC/(R_TH +
// RE)), the junction at most 25 °C + θ·P, q at most 1 + (VCC −
// IC·RE)/VAF.
func (bm *betaModel) point(b, cn, icLo, icUp float64) betaPoint {
	p := betaPoint{b: b, cn: cn, icLo: icLo, icUp: icUp}
	p.ibUp = min(icUp/bm.betaMin(b), bm.vcc/bm.a)
	p.pUp = min(bm.vcc*icUp, bm.vcc*bm.vcc/(4*(bm.rcMin+bm.re))) + bm.vbeCap*p.ibUp
	tHi := min(bm.th, NominalAmbient_C+bm.theta*p.pUp+thermalSlack_K)
	p.fHi = max(bm.f25, bm.factorUp(tHi))
	return bm.withLow(p, icLo)
}

// withLow is p with the lower end of its IC range raised to icLo (the
// power, and so the temperature, bounds stay).
func (bm *betaModel) withLow(p betaPoint, icLo float64) betaPoint {
	p.icLo = icLo
	q := 1.0
	if bm.m.VAF_V > 0 {
		q = 1 + max(0, bm.vcc-icLo*bm.re)/bm.m.VAF_V
	}
	p.phiMax = math.Inf(1)
	if d := 1 - p.cn*p.b/bm.br; d > 0 {
		p.phiMax = p.fHi * ((1+p.cn)*q + p.cn/bm.brLo) / d
	}
	return p
}

// ratio bounds what points A and B share: rho ≤ φ_A/φ_B, qk ≥ k_B/k_A
// and dT ≥ |T_A − T_B|.
//
//   - |P_A − P_B| ≤ s·|ΔIC| + (IB_A + IB_B)·max(VBEcap, VCC): P =
//     IC·VCC − IC²(RC + RE) − IC·IB·RE + VBE·IB and the first part has
//     the slope VCC − 2·IC(RC + RE), within ±VCC while VCE ≥ 0 and, with
//     IC between the two points' extremes and RC + RE in the window's
//     range, at most s in size (powerSlope: near mid-supply the power
//     barely moves with IC); so |T_A − T_B| ≤ θ|ΔP| + 2·slack,
//     and the ratio of the XTB factors is at least (1 − ΔT/T)^|XTB|, at
//     least 1 − max(1, |XTB|)·ΔT/T (Bernoulli's inequality);
//   - q_A/q_B = 1 − (VCE_B − VCE_A + VBE_A − VBE_B)/(VAF + VCE_B − VBE_B),
//     with VCE_B − VCE_A = (IC_A − IC_B)(RC + RE) + (IB_A − IB_B)·RE and
//     VBE_A − VBE_B ≤ vbeRise(Ibe_A/Ibe_B) + κ·ΔT;
//   - the c parts of k and of 1 + c·b/BR within their extremes.
func (bm *betaModel) ratio(pa, pb betaPoint) (rho, qk, dT float64) {
	dIC := max(0, max(pa.icUp-pb.icLo, pb.icUp-pa.icLo))
	dT = min(bm.dT, bm.theta*(bm.powerSlope(pa, pb)*dIC+(pa.ibUp+pb.ibUp)*max(bm.vbeCap, bm.vcc))+2*thermalSlack_K)
	// (1 − y)^a with y = ΔT/T ≤ 1 is at least 1 − a·y for a ≥ 1
	// (Bernoulli) and at least 1 − y for a < 1: within a(a − 1)y²/2 of
	// it, without a power
	fRatio := max(0, 1-max(1, math.Abs(bm.m.XTB))*min(1, dT/bm.tLoK))
	qRatio := 1.0
	if vaf := bm.m.VAF_V; vaf > 0 {
		n := pa.ibUp * bm.reMax
		if up := pa.icUp - pb.icLo; up > 0 {
			n += up * (bm.rcMax + bm.reMax)
		}
		rise, _ := bm.vbeRise(pa.icUp/pb.icLo*bm.kMaxFor(pb.cn)/bm.kMin, pa.cn)
		n += max(0, rise) + bm.kappa*dT
		den := vaf + bm.vceFloor - bm.vbeCap
		if !(den > 0) || !(n < den) {
			return 0, math.Inf(1), dT
		}
		qRatio = 1 - n/den
	}
	// k_A/k_B ≥ qRatio·kc with the c parts at their extremes.
	kc := ((1 - bm.cp) - bm.cp/(bm.brLo*bm.qMin)) / ((1 + pb.cn) + pb.cn/(bm.brLo*bm.qMin))
	cRatio := (1 - pb.cn*pb.b/bm.br) / (1 + bm.cp*pa.b/bm.br)
	rho = fRatio * qRatio * kc * cRatio
	qk = 1 / (qRatio * kc)
	return rho, qk, dT
}

// powerSlope bounds |VCC − 2·IC(RC + RE)|, the slope of IC·VCC −
// IC²(RC + RE) in IC, for IC within both points' ranges and RC + RE
// within the model's: the slope falls with IC and with RC + RE, so its
// size is largest at a corner; and it is at most VCC while VCE ≥ 0.
func (bm *betaModel) powerSlope(pa, pb betaPoint) float64 {
	icLo, icUp := min(pa.icLo, pb.icLo), max(pa.icUp, pb.icUp)
	rLo, rUp := bm.rcMin+bm.re, bm.rcMax+bm.reMax
	s := max(math.Abs(bm.vcc-2*icUp*rUp), math.Abs(bm.vcc-2*icLo*rLo))
	if math.IsNaN(s) {
		return bm.vcc
	}
	return min(bm.vcc, s)
}

// rthCap is bound B-RTH: the largest R_TH of a build whose typical point
// is pt. Its base loop is V_TH − VBE = IB·R_TH + IE·RE with V_TH at most
// the span, VBE > 0, IE ≥ IC ≥ pt.icLo, RE at least the model's least
// and IB ≥ IC/(b_t·φ_max), so R_TH ≤ b_t·φ_max·(span − IC·RE)/IC, which
// falls with IC.
func (bm *betaModel) rthCap(pt betaPoint) float64 {
	return bm.bt * pt.phiMax * (bm.vcc - pt.icLo*bm.re) / pt.icLo
}
