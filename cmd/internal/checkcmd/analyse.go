package checkcmd

import (
	"fmt"
	"math"
	"strings"

	"biasbin/solver"
	"biasbin/solver/notation"
)

// Caution thresholds.
const (
	// hotSupply_V is the supply span above which check prints its
	// hot-parts caution: 50 V is the usual extra-low-voltage boundary for
	// DC work (common practice; local rules differ).
	hotSupply_V = 50.0
	// nearRating is the utilization of the design limit above which a part
	// earns a caution (common practice).
	nearRating = 0.8
)

// result is everything check found about one build.
type result struct {
	in      input
	lim     solver.Limits
	vceSat  float64
	stage   solver.Stage // nominal stage (TCR at the nominal ambient)
	op      solver.OperatingPoint
	m       solver.Model
	nomDiss solver.Dissipation // at the nominal ambient
	wc      *solver.WorstCase  // nil when a corner failed (see problems)
	window  solver.Window
	yield   *solver.YieldResult // nil when the yield run failed
	swing   solver.Swing
	sens    *solver.Sensitivity // nil when it could not be computed
	// problems are analyses that failed; check reports them and exits 1.
	problems []string
}

// analyse runs every analysis of the build. Only a failure of the nominal
// point is an error; the others are recorded as problems.
func analyse(in input) (*result, error) {
	b := in.b
	r := &result{in: in, vceSat: b.Device.VCESat_V, stage: b.NominalStage()}
	if r.vceSat == 0 {
		r.vceSat = solver.DefaultVCESat_V
	}
	var err error
	if r.op, r.m, err = solver.Nominal(b); err != nil {
		return nil, err
	}
	r.nomDiss = solver.EvalDissipation(b, r.op, b.NominalAmbient_C, r.lim)
	if wc, err := solver.EvalWorstCase(b, r.lim); err != nil {
		r.problems = append(r.problems, err.Error())
	} else {
		r.wc = &wc
	}
	r.window = in.window.at(r.op)
	if y, err := solver.EvalYieldSeeded(b, r.window, in.boards, in.seed, solver.YieldOptions{}); err != nil {
		r.problems = append(r.problems, err.Error())
	} else {
		r.yield = &y
	}
	r.swing = solver.EvalSwing(r.stage, r.op, r.vceSat)
	if s, err := solver.EvalSensitivity(b); err != nil {
		r.problems = append(r.problems, err.Error())
	} else {
		r.sens = &s
	}
	return r, nil
}

// supplySpan is the largest voltage across the stage: |VCC| (+|VEE|) at
// the top of the supply tolerance.
func (r *result) supplySpan() float64 {
	b := r.in.b
	return (math.Abs(b.VCC_V) + math.Abs(b.VEE_V)) * (1 + b.VCCTol)
}

// worstDiss is the dissipation to judge by: the worst over the corners
// when they were solved, else the nominal.
func (r *result) worstDiss() solver.Dissipation {
	if r.wc != nil {
		return r.wc.Dissipation
	}
	return r.nomDiss
}

// cautions lists the hot-part warnings for stderr.
func (r *result) cautions() []string {
	var out []string
	const practice = "hot parts can burn; follow local codes and licensed practice for mains and high voltage"
	if s := r.supplySpan(); s > hotSupply_V {
		out = append(out, fmt.Sprintf("the supply reaches %s, above %s: touching the circuit can hurt",
			notation.FormatVoltage(s), notation.FormatVoltage(hotSupply_V)))
	}
	dev := r.in.b.Device
	vceMax, icMax := r.op.VCE_V, r.op.IC_A
	if r.wc != nil {
		vceMax, icMax = r.wc.VCEMax_V, r.wc.ICMax_A
	}
	switch {
	case dev.VCEO_V > 0 && vceMax > dev.VCEO_V:
		out = append(out, fmt.Sprintf("VCE reaches %s, above the transistor's VCEO %s: it can break down",
			notation.FormatVoltage(vceMax), notation.FormatVoltage(dev.VCEO_V)))
	case dev.VCEO_V > 0 && r.supplySpan() > dev.VCEO_V:
		out = append(out, fmt.Sprintf("the supply reaches %s, above the transistor's VCEO %s: it can break down when the stage cuts off",
			notation.FormatVoltage(r.supplySpan()), notation.FormatVoltage(dev.VCEO_V)))
	}
	if dev.ICMax_A > 0 && icMax > dev.ICMax_A {
		out = append(out, fmt.Sprintf("IC reaches %s, above the transistor's IC max %s",
			notation.FormatCurrent(icMax), notation.FormatCurrent(dev.ICMax_A)))
	}
	d := r.worstDiss()
	for _, p := range r.parts(d) {
		if p.load.Rated && p.load.Utilization > nearRating {
			what := "near"
			if p.load.Utilization > 1 {
				what = "beyond"
			}
			out = append(out, fmt.Sprintf("%s runs %s its design limit (%s of %s allowed, %.0f %%): it will be hot",
				strings.ToUpper(p.name), what, notation.FormatPower(p.load.Power_W), notation.FormatPower(p.load.Allowed_W), 100*math.Min(p.load.Utilization, 999)))
		}
	}
	if r.wc == nil && len(r.problems) > 0 {
		out = append(out, "the worst case could not be solved (see below): the figures above are for the nominal point only")
	}
	if len(out) > 0 {
		out = append(out, practice)
	}
	return out
}

// namedLoad is one part's load with its display name.
type namedLoad struct {
	name string
	slot solver.Slot // -1 for the transistor
	load solver.PartLoad
}

// parts lists the resistors of the topology, then the transistor.
func (r *result) parts(d solver.Dissipation) []namedLoad {
	var out []namedLoad
	for _, s := range r.in.b.Topology.Slots() {
		if r.in.b.Resistors[s].Nominal_Ohm == 0 {
			continue
		}
		out = append(out, namedLoad{s.String(), s, d.Resistor[s]})
	}
	return append(out, namedLoad{"q1", -1, d.Transistor})
}

// netlist is the SPICE deck of the nominal point.
func (r *result) netlist() string {
	title := fmt.Sprintf("biasbin check: %v %v stage, nominal point at %s ambient, beta %.4g",
		r.m.Polarity, r.stage.Topology, notation.FormatTemperature(r.in.b.NominalAmbient_C), r.m.BF)
	return solver.Netlist(r.stage, r.m, r.op.Tj_C, title)
}

// dcBeta is IC/IB at the nominal point (0 when no base current flows).
func (r *result) dcBeta() float64 {
	if r.op.IB_A <= 0 {
		return 0
	}
	return r.op.IC_A / r.op.IB_A
}

// vceFloor is the VCE every corner must keep: VCE(sat) plus the margin.
func (r *result) vceFloor() float64 { return r.vceSat + r.lim.WithDefaults().VCEMargin_V }

// testPoint is a node voltage a technician measures to ground, with the
// band the corners span.
type testPoint struct {
	name              string
	nominal, min, max float64
}

// testPoints lists VB, VE and VC with their worst-case bands (the nominal
// value alone when the corners could not be solved).
func (r *result) testPoints() []testPoint {
	op := r.op
	tps := []testPoint{{"vb", op.VB_V, op.VB_V, op.VB_V}, {"ve", op.VE_V, op.VE_V, op.VE_V}, {"vc", op.VC_V, op.VC_V, op.VC_V}}
	if wc := r.wc; wc != nil {
		tps[0].min, tps[0].max = wc.VBMin_V, wc.VBMax_V
		tps[1].min, tps[1].max = wc.VEMin_V, wc.VEMax_V
		tps[2].min, tps[2].max = wc.VCMin_V, wc.VCMax_V
	}
	return tps
}
