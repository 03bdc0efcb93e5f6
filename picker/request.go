package picker

import (
	"fmt"
	"math"
	"slices"
	"sync/atomic"
	"time"

	"biasbin/solver"
)

// Request defaults (documented in doc.go).
const (
	// DefaultTop is the number of builds shown when Request.Top is 0.
	DefaultTop = 5
	// DefaultAmbientMin_C and DefaultAmbientMax_C are the ambient range
	// used when both Request.AmbientMin_C and AmbientMax_C are 0.
	DefaultAmbientMin_C = 0.0
	DefaultAmbientMax_C = 50.0
	// NominalAmbient_C is the ambient of the nominal point every score
	// term except Headroom is taken at: the temperature resistors are
	// marked at, so their TCR does not move the nominal point.
	NominalAmbient_C = 25.0
	// DefaultICWindow is the yield window's IC band around the target
	// (±10 %) when Request.Window is zero.
	DefaultICWindow = 0.10
	// DefaultVCEWindow is the yield window's VCE band around the build's
	// VCE target (±20 %) when Request.Window is zero.
	DefaultVCEWindow = 0.20
	// DefaultTimeLimit is the search time limit a front end offers by
	// default (Request.TimeLimit; the zero Request has none): over ten
	// times the slowest benchmark case (about 2 s on a shared two-core
	// machine), short enough that a technician is never left waiting for
	// minutes.
	DefaultTimeLimit = 30 * time.Second
	// DefaultYieldBoards is the Monte Carlo size per finalist when
	// Request.YieldBoards is 0.
	DefaultYieldBoards = 400
	// DefaultVEMinFrac and DefaultVEMaxFrac are the emitter band as shares
	// of |VCC| when the request gives none: the emitter resistor takes a
	// slice of the supply, about a tenth (common practice), enough for
	// the emitter feedback to swamp VBE's drift, small enough to leave the
	// supply to the collector swing.
	DefaultVEMinFrac = 0.05
	DefaultVEMaxFrac = 0.20
	// VoltageDerating is the share of VCEO a transistor may see at the
	// highest supply (80 %, common practice, REFERENCE.md §3).
	VoltageDerating = 0.8
	// CurrentDerating is the share of IC max the target current may use
	// (50 %, common practice), leaving room for the worst-case spread.
	CurrentDerating = 0.5
)

// DefaultPartsWeight is the default weight of the parts term, per pair:
// 0.05 prices a pair's extra placement at what a 2.5 % IC error costs at
// the default Q-point weight (a quarter of the default ±10 % IC window),
// so a pair ranks first only where it buys a real improvement, and
// 22K‖22K does not displace a stocked 11K on a hair's difference (its
// higher rating). Every bound of the search counts the term (bound P,
// doc.go). pick --weights parts=W changes it; 0 makes pairs free.
const DefaultPartsWeight = 0.05

// DefaultWeights returns the ranking weights used when Request.Weights is
// the zero value (see doc.go for what each term measures).
func DefaultWeights() Weights {
	return Weights{QPoint: 2, Emitter: 2, Beta: 1, Headroom: 1, Utilization: 0.25, Yield: 1, Parts: DefaultPartsWeight}
}

// AnyTopology as Request.Topology searches every topology and ranks their
// builds on one scale (split supply only when Request.VEE_V is given).
const AnyTopology solver.Topology = -1

// Validate reports the first problem of r as an *InputError, by the rules
// Pick applies: the one home of a pick request's rules (a front end calls
// it to refuse a request before it reads the stock).
func (r Request) Validate() error {
	_, err := normalize(r)
	return err
}

// settings is a validated request with every default filled in.
type settings struct {
	req         Request
	topo        solver.Topology
	topos       []solver.Topology // the topologies searched (several for AnyTopology)
	vee         float64           // emitter rail magnitude (split supply), 0 = none
	spanMax     float64           // the largest supply span of the topologies searched
	keep        []KeptPart        // the kept parts, positions in lower case
	pol         solver.Polarity
	vcc         float64         // magnitude
	sign        float64         // +1 NPN, -1 PNP
	rail        solver.RailSign // settled (solver.SettleRail)
	vccTol      float64
	veeTol      float64 // the emitter rail's tolerance (VEETol, else vccTol)
	icT         float64
	vceT        float64 // 0 = maximum-symmetrical-swing rule per build
	veLo, veHi  float64 // emitter band (magnitudes)
	ambMin      float64
	ambMax      float64
	boards      int
	top         int
	pool        int // finalists that get a Monte Carlo yield
	yieldBoards int
	w           Weights
	lim         solver.Limits // with defaults filled
	bypass      bool
	rl          float64
	// stop is set when Request.TimeLimit has run out; hit once a search
	// has seen it and left work undone (evaluator.stopped)
	stop, hit *atomic.Bool
	// values shares the value sets of one Pick between its topologies
	// and passes (nil: each evaluator builds its own)
	values *valueMemo
	// progress gathers the progress of the topologies searched at once
	// (nil: Request.Progress is called directly)
	progress *progressSum
}

// SettledRail is the rail req's single-supply builds are built on
// (solver.SettleRail: the zero value becomes the positive rail): what a
// front end shows beside the builds.
func (req Request) SettledRail() (solver.RailSign, error) {
	s, err := normalize(req)
	return s.rail, err
}

// normalize validates req and fills its defaults.
func normalize(req Request) (settings, error) {
	s := settings{req: req}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	switch req.Topology {
	case 0, solver.Divider:
		s.topo = solver.Divider
	case solver.CollectorFeedback, solver.SplitSupply, AnyTopology:
		s.topo = req.Topology
	default:
		return s, inputErr("topology", "use divider, collector-feedback, split-supply or any", "%v is not a topology", req.Topology)
	}
	if !finite(req.VCC_V) || req.VCC_V == 0 {
		return s, inputErr("vcc", "give the supply, e.g. --vcc 12V", "%g V is not a supply voltage", req.VCC_V)
	}
	switch req.Polarity {
	case 0, solver.NPN, solver.PNP:
		s.pol = req.polarity()
	default:
		return s, inputErr("polarity", "use npn or pnp", "%v is not a polarity", req.Polarity)
	}
	s.sign = 1
	if s.pol == solver.PNP {
		s.sign = -1
	}
	if req.VCC_V*s.sign < 0 {
		return s, inputErr("vcc", "give the rail with the sign of the stage (positive for npn, negative for pnp)",
			"%g V is the wrong sign for a %v stage", req.VCC_V, s.pol)
	}
	s.vcc = math.Abs(req.VCC_V)
	if err := solver.SupplyRange.Check(s.vcc); err != nil {
		return s, err
	}
	var err error // AnyTopology: its single-supply builds settle the rail
	if s.rail, err = solver.SettleRail(s.vcc, s.pol, s.topo, req.Rail); err != nil {
		return s, err
	}
	if !finite(req.VEE_V) || req.VEE_V*s.sign > 0 {
		return s, inputErr("vee", "give the emitter rail with the sign opposite to the collector rail",
			"%g V is not an emitter rail for a %v stage", req.VEE_V, s.pol)
	}
	s.vee = math.Abs(req.VEE_V)
	if s.vee > 0 {
		r := solver.SupplyRange
		r.Field = "vee"
		if err := r.Check(s.vee); err != nil {
			return s, err
		}
	}
	switch {
	case s.topo == solver.SplitSupply && s.vee == 0:
		return s, inputErr("vee", "give the emitter rail, e.g. --vee 12V", "the split-supply stage needs an emitter rail")
	case s.vee > 0 && s.topo != solver.SplitSupply && s.topo != AnyTopology:
		return s, inputErr("vee", "leave --vee out, or ask for --topology split-supply", "only the split-supply stage has an emitter rail")
	}
	switch s.topo {
	case AnyTopology:
		s.topos = []solver.Topology{solver.Divider, solver.CollectorFeedback}
		if s.vee > 0 {
			s.topos = append(s.topos, solver.SplitSupply)
		}
	default:
		s.topos = []solver.Topology{s.topo}
	}
	if err := s.checkKeep(req.Keep); err != nil {
		return s, err
	}
	s.spanMax = s.vcc
	if slices.Contains(s.topos, solver.SplitSupply) {
		s.spanMax += s.vee
	}
	if err := solver.CheckTolerance("vcc_tol", req.VCCTol); err != nil {
		return s, withFix(err, "a supply is typically ±5 %")
	}
	s.vccTol = req.VCCTol
	if err := solver.CheckTolerance("vee_tol", req.VEETol); err != nil {
		return s, withFix(err, "a supply is typically ±5 %")
	}
	if req.VEETol > 0 && s.vee == 0 {
		return s, inputErr("vee_tol", "give the emitter rail with --vee, or leave its tolerance out", "a tolerance for an emitter rail not given")
	}
	s.veeTol = req.EmitterRailTol()
	if !finite(req.IC_A) || req.IC_A <= 0 {
		return s, inputErr("ic", "give the target collector current, e.g. --ic 1mA", "%g A is not a collector current", req.IC_A)
	}
	if err := ICRange.Check(req.IC_A); err != nil {
		return s, err
	}
	s.icT = req.IC_A
	vceLow := s.spanAt(slices.Contains(s.topos, solver.SplitSupply), -1)
	if !finite(req.VCE_V) || req.VCE_V < 0 {
		return s, inputErr("vce", "give a VCE magnitude, or leave it out for the maximum-swing rule", "%g V is not a VCE target", req.VCE_V)
	}
	if req.VCE_V >= vceLow {
		return s, inputErr("vce", fmt.Sprintf("choose a VCE below %.3g V or raise --vcc", vceLow),
			"%g V cannot exist with a %g V supply at its low end (%.3g V)", req.VCE_V, s.spanMax, vceLow)
	}
	s.vceT = req.VCE_V
	if !finite(req.VEMin_V) || !finite(req.VEMax_V) || req.VEMin_V < 0 || req.VEMax_V < req.VEMin_V {
		return s, inputErr("ve", "give the emitter band as MIN..MAX volts with 0 <= MIN <= MAX",
			"%g..%g V is not an emitter band", req.VEMin_V, req.VEMax_V)
	}
	s.veLo, s.veHi = req.VEMin_V, req.VEMax_V
	if s.veLo == 0 && s.veHi == 0 {
		s.veLo, s.veHi = DefaultVEMinFrac*s.vcc, DefaultVEMaxFrac*s.vcc
	}
	if s.veLo >= vceLow-s.vceT {
		return s, inputErr("ve", fmt.Sprintf("lower the VCE target, or give an emitter band (--ve) below %.3g V", vceLow-s.vceT),
			"an emitter at %.3g V or more leaves no room for VCE %.3g V on a %.3g V supply at -%.3g %%", s.veLo, s.vceT, s.vcc, 100*s.vccTol)
	}
	s.ambMin, s.ambMax = req.AmbientMin_C, req.AmbientMax_C
	if s.ambMin == 0 && s.ambMax == 0 {
		s.ambMin, s.ambMax = DefaultAmbientMin_C, DefaultAmbientMax_C
	}
	if err := solver.CheckAmbient(s.ambMin, s.ambMax); err != nil {
		return s, withFix(err, "give MIN..MAX in °C, e.g. 0..50")
	}
	s.boards = req.Boards
	if s.boards < 0 {
		return s, inputErr("boards", "give a positive number of boards", "%d boards", s.boards)
	}
	if s.boards == 0 {
		s.boards = 1
	}
	if err := BoardsRange.Check(float64(s.boards)); err != nil {
		return s, err
	}
	s.top = req.Top
	if s.top < 0 {
		return s, inputErr("top", "give a positive number of builds to show", "%d builds", s.top)
	}
	if s.top == 0 {
		s.top = DefaultTop
	}
	if err := TopRange.Check(float64(s.top)); err != nil {
		return s, err
	}
	if req.TimeLimit < 0 {
		return s, inputErr("time-limit", "give a positive duration, or 0 to search to the end", "%v", req.TimeLimit)
	}
	s.pool = req.Finalists
	if s.pool < 0 {
		return s, inputErr("finalists", "give a positive pool size or 0 for the default", "%d finalists", s.pool)
	}
	if s.pool == 0 {
		s.pool = defaultPool(s.top)
	}
	if err := FinalistsRange.Check(float64(s.pool)); err != nil {
		return s, err
	}
	s.pool = max(s.pool, s.top)
	s.yieldBoards = req.YieldBoards
	if s.yieldBoards < 0 {
		return s, inputErr("yield_boards", "give a positive number of Monte Carlo boards", "%d boards", s.yieldBoards)
	}
	if s.yieldBoards == 0 {
		s.yieldBoards = DefaultYieldBoards
	}
	if err := solver.YieldBoardsRange.Check(float64(s.yieldBoards)); err != nil {
		return s, err
	}
	s.w = req.Weights
	if s.w == (Weights{}) {
		s.w = DefaultWeights()
	}
	for _, t := range []struct {
		name string
		v    float64
	}{{"qpoint", s.w.QPoint}, {"emitter", s.w.Emitter}, {"beta", s.w.Beta}, {"headroom", s.w.Headroom}, {"utilization", s.w.Utilization}, {"yield", s.w.Yield}, {"parts", s.w.Parts}} {
		if !finite(t.v) || t.v < 0 {
			return s, inputErr("weights."+t.name, "use 0 to ignore the term or a positive number to stress it",
				"%g: a weight cannot be negative", t.v)
		}
	}
	if !finite(req.RL_Ohm) || req.RL_Ohm < 0 {
		return s, inputErr("load", "give the AC load in ohms, or 0 for none", "%g ohm is not a load", req.RL_Ohm)
	}
	s.rl, s.bypass = req.RL_Ohm, req.Bypass
	if l := req.Limits; l.ResistorMaxFraction < 0 || l.TransistorMaxFraction < 0 || l.VCEMargin_V < 0 {
		return s, inputErr("limits", "use 0 for the defaults or positive values", "negative design margin %+v", req.Limits)
	}
	s.lim = req.Limits.WithDefaults()
	if err := req.Window.WithDefault().Check(); err != nil {
		return s, err
	}
	return s, nil
}

// EmitterRailTol is the tolerance the emitter rail is taken with: VEETol,
// else VCCTol (0 without an emitter rail).
func (r Request) EmitterRailTol() float64 {
	switch {
	case r.VEE_V == 0:
		return 0
	case r.VEETol > 0:
		return r.VEETol
	}
	return r.VCCTol
}

// spanAt is the supply span at one end of the rails' tolerances (end +1
// the highest, −1 the lowest): |VCC|, plus |VEE| with split (each rail at
// the same end of its own tolerance).
func (s *settings) spanAt(split bool, end float64) float64 {
	v := s.vcc * (1 + end*s.vccTol)
	if split {
		v += s.vee * (1 + end*s.veeTol)
	}
	return v
}

// defaultPool is the number of finalists that may get a Monte Carlo
// yield before the final ranking: twice the default shown builds plus
// five, or twice the shown builds plus five when more are shown. It does
// not change for Top up to DefaultTop, so neither does the ranking.
func defaultPool(top int) int { return 2*max(top, DefaultTop) + 5 }

// checkStock refuses a stock missing a kind of part (CheckStock) and a
// target current no stocked RC and RE can carry.
func (s settings) checkStock(st Stock) error {
	if err := CheckStock(st, s.req); err != nil {
		return err
	}
	if s.req.Transistor != "" && !slices.ContainsFunc(st.Transistors, func(t Transistor) bool { return LabelMatches(t.Sheet.Label, s.req.Transistor) }) {
		return inputErr("transistor", "give a label the stock holds (biasbin stock list)", "no transistor line is labelled %q", s.req.Transistor)
	}
	rmin := math.Inf(1)
	for _, r := range st.Resistors {
		if r.Ohm > 0 {
			rmin = min(rmin, r.Ohm)
		}
	}
	// RC and RE are at least the smallest stocked value each, so no build
	// can carry more than this collector current.
	if icMax := s.spanAt(slices.Contains(s.topos, solver.SplitSupply), 1) / (2 * rmin); s.icT > icMax {
		return inputErr("ic", fmt.Sprintf("lower --ic below %.3g A or raise --vcc", icMax),
			"%g A cannot flow from a %g V supply through the smallest stocked RC and RE (%g ohm each)", s.icT, s.vcc, rmin)
	}
	return nil
}
