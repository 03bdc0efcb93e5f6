package picker

import (
	"math"
	"slices"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// Purchase is one part the shortfall suggests buying.
type Purchase struct {
	Slot    string  // "r1", "r2", "rc", "re", or PartTransistor
	Ohm     float64 // resistors: the E-series value
	Series  string  // "E24"
	Tol     float64 // fraction
	Rated_W float64
	Qty     int // parts for the requested boards
	// Polarity, VCEO_V and ICMax_A describe a transistor to buy: the
	// polarity and the least VCEO and IC max that hold with the margins.
	Polarity solver.Polarity
	VCEO_V   float64
	ICMax_A  float64
	// Line, when not 0, is the stocked line of the approved list (the
	// lines carrying the request's RequireTags) this purchase tops up:
	// buy Qty more of exactly that part. Bin, OnHand and Label (a
	// transistor's) describe the line. Line 0: any part of the
	// description will do.
	Line   int64
	Bin    string
	OnHand int
	Label  string
}

// Purchase defaults: E24 at ±5 % (the customary pairing, IEC 60063:2015
// Table 1 and REFERENCE.md §1), the smallest common rating that keeps the
// part within the design margin at every worst-case corner.
var buyRatings_W = []float64{0.125, 0.25, 0.5, 1, 2}

const (
	buySeries = eseries.E24
	buyTol    = 0.05
)

// shortfall explains why no build passes and what to buy. nearest are the
// best failing builds found.
func (e *evaluator) shortfall(rejected []Rejection, nearest []Candidate) *Shortfall {
	s := e.s
	sf := &Shortfall{Rejected: rejected}
	switch {
	case len(e.devs) == 0:
		sf.Reasons = append(sf.Reasons, Reason{Kind: NoTransistor, Polarity: s.pol, Boards: s.boards, VCC_V: s.vcc * (1 + s.vccTol), IC_A: s.icT})
		sf.Purchases = append(sf.Purchases, e.buyTransistor())
	case len(e.vs.levels) == 0:
		sf.Reasons = append(sf.Reasons, Reason{Kind: NoResistorLine, Boards: s.boards})
	case len(nearest) == 0:
		sf.Reasons = append(sf.Reasons, Reason{Kind: NoOperatingPoint})
	case len(nearest[0].Failing) == 0:
		c := nearest[0]
		sf.Reasons = append(sf.Reasons, Reason{Kind: OffTarget, IC_A: c.Nominal.IC_A, VCE_V: c.Nominal.VCE_V, TargetIC_A: s.icT, TargetVCE_V: c.VCETarget_V})
	default:
		sf.Reasons = append(sf.Reasons, failureSummary(nearest)...)
		bestBeta := math.Inf(1)
		for _, c := range nearest {
			bestBeta = math.Min(bestBeta, c.BetaSensitivity)
		}
		if bestBeta > stiffBeta {
			sf.Reasons = append(sf.Reasons, Reason{Kind: NotStiff, BetaSpread: bestBeta})
		}
	}
	if len(e.devs) > 0 {
		sf.Purchases = append(sf.Purchases, e.buyResistors(nearest)...)
	}
	if len(sf.Purchases) == 0 && len(e.devs) > 0 {
		sf.Reasons = append(sf.Reasons, Reason{Kind: NoPurchase})
	}
	if len(s.keep) > 0 {
		sf.Reasons = append(sf.Reasons, Reason{Kind: KeptStay, Kept: s.keep})
	}
	return sf
}

// stiffBeta is the beta term above which the shortfall calls the divider
// not stiff enough: IC moving 20 % over the hFE range.
const stiffBeta = 0.2

// failureSummary condenses the nearest builds' failures into one reason
// per limit that some of them break (the bench limit is left to each
// build's own reasons).
func failureSummary(nearest []Candidate) []Reason {
	var out []Reason
	for _, k := range []FailureKind{FailCorners, FailAllowance, FailVoltage, FailICMax, FailWorstCase} {
		n := 0
		for _, c := range nearest {
			if slices.ContainsFunc(c.Failing, func(f Failure) bool { return f.Kind == k }) {
				n++
			}
		}
		if n > 0 {
			out = append(out, Reason{Kind: NearestFail, Limit: k, Count: n, Of: len(nearest)})
		}
	}
	return out
}

// buyTransistor describes the transistor that would do.
func (e *evaluator) buyTransistor() Purchase {
	s := e.s
	return Purchase{Slot: PartTransistor, Qty: s.boards, Polarity: s.pol,
		VCEO_V: math.Ceil(s.vcc * (1 + s.vccTol) / VoltageDerating), ICMax_A: s.icT / CurrentDerating}
}

// buyResistors tries hand-method values (for the transistor of the
// nearest build): one slot's value at a time, then two, and returns the
// first purchase that gives a build that fits (nil when none does).
func (e *evaluator) buyResistors(nearest []Candidate) []Purchase {
	s := e.s
	d := &e.devs[0]
	if len(nearest) > 0 {
		for i := range e.devs {
			if e.devs[i].line.ID == nearest[0].Transistor.ID {
				d = &e.devs[i]
			}
		}
	}
	id := e.ideal(d)
	var parts [maxPos]Purchase
	np := e.lay.n
	for i, r := range id[:np] {
		if e.kept[i] {
			id[i] = e.vs.levels[e.keepLv[i]].ohm // on the board: never bought
			continue
		}
		ohm := eseries.Nearest(buySeries, r)
		p := Purchase{Slot: e.lay.names[i], Ohm: ohm, Series: buySeries.String(), Tol: buyTol, Qty: 2 * s.boards}
		est := e.idealPower_W(d, id, i, ohm)
		p.Rated_W = buyRatings_W[len(buyRatings_W)-1]
		for _, w := range buyRatings_W {
			if est <= w*s.lim.ResistorMaxFraction*derateAt(s.ambMax) {
				p.Rated_W = w
				break
			}
		}
		parts[i] = p
	}
	// try checks a purchase without a new search: the hand-method build
	// with the bought values in their slots and, in the others, each of
	// the two stocked levels nearest the ideal value (on a log scale), on
	// the transistor of the hand method; the purchase counts when one of
	// these builds fits (passes every hard limit with its nominal point
	// inside the yield window). The rating estimated above is the nominal
	// point's: when a bought part is what runs over its allowance at the
	// worst corner, it is tried again at the next rating up.
	try := func(slots ...int) []Purchase {
		bought := map[int]Purchase{}
		for _, i := range slots {
			bought[i] = parts[i]
		}
		for {
			fits, hot := e.fitsWith(d, id, bought)
			if fits {
				out := make([]Purchase, len(slots))
				for k, i := range slots {
					out[k] = bought[i]
				}
				return out
			}
			p, ok := bought[hot]
			if !ok {
				return nil
			}
			up := slices.IndexFunc(buyRatings_W, func(w float64) bool { return w > p.Rated_W })
			if up < 0 {
				return nil
			}
			p.Rated_W = buyRatings_W[up]
			bought[hot] = p
		}
	}
	for i := range np {
		if e.kept[i] {
			continue
		}
		if ps := try(i); ps != nil {
			return ps
		}
	}
	for i := range np {
		for j := i + 1; j < np; j++ {
			if e.kept[i] || e.kept[j] {
				continue
			}
			if ps := try(i, j); ps != nil {
				return ps
			}
		}
	}
	return nil
}

// fitsWith reports whether some build made of the bought values (in their
// slots) and the stocked levels nearest the ideal values (two per other
// slot) fits, on device d. When none does, hot is a bought slot that is
// the one limit some of these builds break (its part over its allowance),
// else -1.
func (e *evaluator) fitsWith(d *device, ideal [maxPos]float64, bought map[int]Purchase) (fits bool, hot int) {
	lines := append([]Resistor(nil), e.vs.lines...)
	for k, p := range bought {
		lines = append(lines, Resistor{ID: -1 - int64(k), Ohm: p.Ohm, Tol: p.Tol, TCR_PPMPerK: buyTCR_PPMPerK, Rated_W: p.Rated_W,
			Qty: p.Qty, Bin: "to buy", Tags: e.s.req.RequireTags})
	}
	kept, at := e.s.keptSpecs(e.lay)
	vs := buildValues(lines, e.s.boards, false, e.s.ambMax, e.s.lim, kept...)
	hot = -1
	if len(vs.levels) == 0 {
		return false, hot
	}
	ev := &evaluator{s: e.s, lay: e.lay, vs: &vs, devs: []device{*d}, span: e.span}
	ev.pinKept(at)
	ev.devs[0].betaNomMin, ev.devs[0].betaTypMin = ev.nominalBetaMin(&ev.devs[0]) // over these values
	open := newPool(math.MaxInt, false)                                           // never fills: its threshold stays +Inf
	var choices [maxPos][]int
	np := e.lay.n
	for i := range np {
		if ev.kept[i] {
			choices[i] = []int{ev.keepLv[i]}
			continue
		}
		if p, ok := bought[i]; ok {
			choices[i] = []int{vs.levelAtOrAbove(p.Ohm * (1 - 1e-9))}
			continue
		}
		choices[i] = nearestLevels(&vs, ideal[i])
		if len(choices[i]) == 0 {
			return false, hot
		}
	}
	// k walks every choice combination
	var k [maxPos]int
	for {
		var lv [maxPos]int
		for i := range np {
			lv[i] = choices[i][k[i]]
		}
		t := ev.newTuple(0, lv)
		found := false
		ev.scoreVariants(t, open, func(x *evaluated) {
			if f := x.failing; len(f) == 1 && f[0].Kind == FailAllowance && hot < 0 {
				if i := slices.Index(e.lay.names[:np], f[0].Part); i >= 0 {
					if _, ok := bought[i]; ok {
						hot = i
					}
				}
			}
			if found || len(x.failing) > 0 {
				return
			}
			cand := Candidate{Failing: x.failing, Nominal: x.op, VCETarget_V: ev.vceTarget(d, t.r)}
			found = ev.fits(cand)
		}, &counters{})
		if found {
			return true, -1
		}
		i := np - 1
		for ; i >= 0; i-- {
			if k[i]++; k[i] < len(choices[i]) {
				break
			}
			k[i] = 0
		}
		if i < 0 {
			return false, hot
		}
	}
}

// buyTCR_PPMPerK is the TCR assumed for a bought part: thick film's
// ±200 ppm/K worst case (REFERENCE.md §3, from memory).
const buyTCR_PPMPerK = 200

// nearestLevels returns the (up to) two levels around ohm.
func nearestLevels(vs *valueSet, ohm float64) []int {
	i := vs.levelAtOrAbove(ohm)
	var out []int
	if i > 0 {
		out = append(out, i-1)
	}
	if i < len(vs.levels) {
		out = append(out, i)
	}
	return out
}

// derateAt is the derating factor of a default-rated resistor at
// ambient_C (70 °C knee, 155 °C zero-power temperature).
func derateAt(ambient_C float64) float64 {
	return solver.ResistorAllowed_W(1, solver.DefaultResistorKnee_C, solver.DefaultResistorMax_C, ambient_C)
}
