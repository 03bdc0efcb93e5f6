package picker

import (
	"math"

	"biasbin/solver"
)

// device is one usable transistor line with its models prepared.
type device struct {
	line   Transistor
	typ    solver.Model // at the typical hFE
	lo, hi solver.Model // at hFE min and max
	// vceLow and icLow are the models of the two worst-case corners
	// headroomFloor solves: hFE max with VBE(on) and VAF at the low end
	// of their ranges (the most IC, the least VCE), hFE min with both
	// at the high end (the least IC)
	vceLow, icLow solver.Model
	thetaJA       float64 // K/W; 0 = no self-heating
	tjMax_C       float64
	vceSat        float64
	hfeMin        float64
	allowHot      float64 // transistor allowance at the hottest ambient (W), +Inf when unrated
	at25          nominalDevice
	// betaNomMin bounds IC/IB from below at every nominal point of a
	// passing build (evaluator.nominalBetaMin).
	betaNomMin float64
	// betaTypMin bounds IC/IB from below at every nominal point of a
	// passing build: the nominal point is the typical model's, so
	// nominalBetaMin's floor taken with hFE typical (at least betaNomMin).
	betaTypMin float64
	// hotCap is what hotVBECap takes of the device whatever RE is
	// (evaluator.newHotCap).
	hotCap hotCap
	// isNominal is IS at the nominal ambient (vbeHi).
	isNominal float64
	// xtb tabulates the temperature factor for betaFloor (newXTBTable).
	xtb xtbTable
	// labelGroup is the index of the first device with this label
	// (near-duplicates, fold.go).
	labelGroup int
}

// nominalDevice holds the model's figures just below the nominal ambient
// that betaFloor takes again and again (betaModel.tLo_C).
type nominalDevice struct {
	is     float64 // IS
	factor float64 // BF's temperature factor (T/TNOM)^XTB
}

// transistorCandidates returns the lines of the requested polarity that
// carry the required tags, hold at least `boards` parts and whose ratings
// hold with margin, and a reason for each line of that polarity left out.
//
// Margins (common practice): VCEO at least the highest supply over
// VoltageDerating (a transistor in cut-off sees the whole rail); IC max at
// least the target over CurrentDerating; the dissipation at the target
// current and the mid-supply VCE within the derated, margined allowance at
// the hottest ambient. The worst-case corners check each build again.
func (s settings) transistorCandidates(ts []Transistor, split bool) (devs []device, rejected []Rejection) {
	vccHi := s.spanAt(split, 1)
	for _, t := range ts {
		d := t.Sheet
		if d.Polarity != s.pol || !HasTags(t.Tags, s.req.RequireTags) || !LabelMatches(d.Label, s.req.Transistor) {
			continue
		}
		reject := func(r Rejection) {
			r.Line = t
			rejected = append(rejected, r)
		}
		if unknown := solver.UnknownRatings(d, s.icT); len(unknown) > 0 && !s.req.AllowUnrated {
			reject(Rejection{Kind: RejectUnrated, Unknown: unknown})
			continue
		}
		if t.Qty < s.boards {
			reject(Rejection{Kind: RejectQty, Qty: t.Qty, Boards: s.boards})
			continue
		}
		if d.VCEO_V > 0 && d.VCEO_V*VoltageDerating < vccHi {
			reject(Rejection{Kind: RejectVCEO, VCEO_V: d.VCEO_V, VCC_V: vccHi})
			continue
		}
		if d.ICMax_A > 0 && d.ICMax_A*CurrentDerating < s.icT {
			reject(Rejection{Kind: RejectICMax, ICMax_A: d.ICMax_A, IC_A: s.icT})
			continue
		}
		allowHot := math.Inf(1)
		if p, ok := solver.TransistorAllowed_W(d, s.ambMax); ok {
			allowHot = p * s.lim.TransistorMaxFraction
			if pd := s.icT * vccHi / 2; pd > allowHot {
				reject(Rejection{Kind: RejectPower, Power_W: pd, Allowed_W: allowHot, Ambient_C: s.ambMax})
				continue
			}
		}
		dv, err := withModels(d)
		if err != nil {
			reject(Rejection{Kind: RejectDatasheet, Err: err})
			continue
		}
		dv.line, dv.thetaJA, dv.tjMax_C = t, solver.ThermalResistance(d), d.TjMaxOrDefault_C()
		dv.vceSat, dv.hfeMin, dv.allowHot = d.VCESatOrDefault_V(), d.HFEMin, allowHot
		dv.at25 = newNominalDevice(dv.typ)
		devs = append(devs, dv)
	}
	return devs, rejected
}

// withModels returns a device holding d's models: at the typical hFE, at
// hFE min and max, and the two corners headroomFloor solves.
func withModels(d solver.Datasheet) (device, error) {
	var dv device
	var err error
	for _, m := range []struct {
		to *solver.Model
		mk func() (solver.Model, error)
	}{
		{&dv.typ, func() (solver.Model, error) { return solver.ModelFor(d, solver.TypicalHFE(d)) }},
		{&dv.lo, func() (solver.Model, error) { return solver.ModelFor(d, d.HFEMin) }},
		{&dv.hi, func() (solver.Model, error) { return solver.ModelFor(d, d.HFEMax) }},
		{&dv.vceLow, func() (solver.Model, error) { return solver.CornerModel(d, true, false, false) }},
		{&dv.icLow, func() (solver.Model, error) { return solver.CornerModel(d, false, true, true) }},
	} {
		if *m.to, err = m.mk(); err != nil {
			return dv, err
		}
	}
	return dv, nil
}
