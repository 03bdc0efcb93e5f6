package job

import (
	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/safety"
)

// CheckRequest is one build to analyse and how to run its yield.
type CheckRequest struct {
	Build solver.Build
	// Label is the stock label of the transistor, or "" for one given
	// inline.
	Label string
	// Window is the yield window's rule (zero = picker.DefaultWindowRule)
	// and TargetIC_A, TargetVCE_V the design point its relative bands sit
	// around; a target of 0 means the build's nominal point
	// (picker.CentreOf), so check and pick follow one rule.
	Window      picker.WindowRule
	TargetIC_A  float64
	TargetVCE_V float64
	// Boards and Seed size and seed the Monte Carlo yield.
	Boards int
	Seed   uint64
	// Limits are the design limits; the zero value means the solver's
	// documented defaults.
	Limits solver.Limits
	// KeepBoards keeps every Monte Carlo board's Q-points in
	// Analysis.Yield.Samples (for pictures); it changes no figure.
	KeepBoards bool
}

// Validate reports the first thing the analysis would refuse in req (an
// *solver.InputError naming the input and its accepted range): the build
// (solver.Build.Validate) and the yield's boards (solver.YieldBoardsRange).
// Check makes the same check; a front end calls this to refuse bad input
// before any work.
func (req CheckRequest) Validate() error {
	if err := req.Build.Validate(); err != nil {
		return err
	}
	return solver.YieldBoardsRange.Check(float64(req.Boards))
}

// Analysis is everything known about one build.
type Analysis struct {
	Request CheckRequest
	// Limits are the design limits used, defaults filled in.
	Limits solver.Limits
	// VCESat_V is the transistor's VCE(sat), the default when the
	// datasheet gives none.
	VCESat_V float64
	// Stage is the nominal stage (TCR at the nominal ambient), Model the
	// transistor model of the nominal point and Nominal the point itself.
	Stage   solver.Stage
	Model   solver.Model
	Nominal solver.OperatingPoint
	// NominalDissipation is each part's load at the nominal point.
	NominalDissipation solver.Dissipation
	// Worst is the worst case over every corner; nil when a corner could
	// not be solved (see Problems).
	Worst *solver.WorstCase
	// Window is the yield window with its rule and design point, and Yield
	// the Monte Carlo run (nil when it failed).
	Window picker.YieldWindow
	Yield  *solver.YieldResult
	Swing  solver.Swing
	// Sensitivity is nil when it could not be computed.
	Sensitivity *solver.Sensitivity
	// TestPoints are VB, VE and VC with their worst-case bands.
	TestPoints []TestPoint
	// Joins are the fitted resistors with what each joins.
	Joins []Join
	// Safety lists the build's hard limits and cautions in the order of
	// severity (solver/safety): what the front ends show. Verdict reads
	// them: the build fails when any is a hard limit.
	Safety  []safety.Caution
	Verdict safety.Verdict
	// Cautions are the hazards a technician must hear about, in the short
	// form kept with a build plan (derived from Safety).
	Cautions []Caution
	// Problems are the analyses that failed; the job is then not done.
	Problems []Problem
}

// Analysis names one of the analyses of a build.
type AnalysisKind int

// The analyses that can fail without failing the nominal point.
const (
	AnalysisWorstCase AnalysisKind = iota + 1
	AnalysisYield
	AnalysisSensitivity
)

// Problem is an analysis of a build that failed, with the solver's error.
type Problem struct {
	Analysis AnalysisKind
	Err      error
}

// Check analyses one build: the nominal point, the worst case over every
// corner, the yield, the swing, the dissipation, the sensitivity, the test
// points and the cautions. Only a failure of the nominal point (or input
// the solver refuses, a *solver.InputError) is an error; the other
// analyses that fail are recorded in Problems.
func Check(req CheckRequest) (*Analysis, error) {
	if err := req.Validate(); err != nil {
		return nil, err
	}
	b := req.Build
	a := &Analysis{Request: req, Limits: req.Limits.WithDefaults(), VCESat_V: b.Device.VCESatOrDefault_V()}
	var err error
	if a.Nominal, a.Model, err = solver.Nominal(b); err != nil {
		return nil, err
	}
	a.Stage = b.NominalStage()
	a.NominalDissipation = solver.EvalDissipation(b, a.Nominal, b.NominalAmbient_C, a.Limits)
	if wc, err := solver.EvalWorstCase(b, a.Limits); err != nil {
		a.Problems = append(a.Problems, Problem{AnalysisWorstCase, err})
	} else {
		a.Worst = &wc
	}
	a.Window = YieldWindowOf(req, a.Nominal)
	if y, err := solver.EvalYieldSeeded(b, a.Window.Window, req.Boards, req.Seed, solver.YieldOptions{KeepBoards: req.KeepBoards}); err != nil {
		a.Problems = append(a.Problems, Problem{AnalysisYield, err})
	} else {
		a.Yield = &y
	}
	a.Swing = solver.EvalSwing(a.Stage, a.Nominal, a.VCESat_V)
	if s, err := solver.EvalSensitivity(b); err != nil {
		a.Problems = append(a.Problems, Problem{AnalysisSensitivity, err})
	} else {
		a.Sensitivity = &s
	}
	a.TestPoints = TestPoints(a.Nominal, a.Worst)
	a.Joins = Joins(b)
	a.Safety = safety.Assess(safety.Input{Build: b, Nominal: a.Nominal, Worst: a.Worst, Limits: a.Limits})
	a.Verdict = safety.VerdictOf(a.Safety)
	a.Cautions = a.cautions()
	return a, nil
}

// WorstDissipation is the dissipation to judge by: the worst over the
// corners when they were solved, else the nominal.
func (a *Analysis) WorstDissipation() solver.Dissipation {
	if a.Worst != nil {
		return a.Worst.Dissipation
	}
	return a.NominalDissipation
}

// PartLoad is one part's load with the part it belongs to.
type PartLoad struct {
	// Part is the resistor's slot name ("r1" ...) or PartQ1.
	Part string
	// Slot is the resistor's slot; meaningless for the transistor.
	Slot solver.Slot
	Load solver.PartLoad
}

// PartQ1 is PartLoad.Part for the transistor (its schematic reference).
const PartQ1 = "q1"

// Loads lists the fitted resistors of the topology in its order, then the
// transistor, each with its load in d.
func (a *Analysis) Loads(d solver.Dissipation) []PartLoad {
	b := a.Request.Build
	var out []PartLoad
	for _, s := range b.Topology.Slots() {
		if b.Resistors[s].Nominal_Ohm == 0 {
			continue
		}
		out = append(out, PartLoad{s.String(), s, d.Resistor[s]})
	}
	return append(out, PartLoad{Part: PartQ1, Slot: -1, Load: d.Transistor})
}

// DCBeta is IC/IB at the nominal point (0 when no base current flows).
func (a *Analysis) DCBeta() float64 {
	if a.Nominal.IB_A <= 0 {
		return 0
	}
	return a.Nominal.IC_A / a.Nominal.IB_A
}

// VCEFloor_V is the VCE every corner must keep: VCE(sat) plus the margin.
func (a *Analysis) VCEFloor_V() float64 { return a.VCESat_V + a.Limits.VCEMargin_V }

// YieldWindowOf is the yield window of a check request whose build has the
// nominal point op: the request's rule around its design point.
func YieldWindowOf(req CheckRequest, op solver.OperatingPoint) picker.YieldWindow {
	c := picker.CentreOf(req.TargetIC_A, req.TargetVCE_V, op)
	r := req.Window.WithDefault()
	return picker.YieldWindow{Window: r.At(c), Rule: r, Centre: c}
}
