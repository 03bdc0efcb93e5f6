package repair

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/fault"
)

// Substitution defaults.
const (
	// DefaultTolerance is the IC shift a substitute may bring, ±10 %.
	DefaultTolerance = 0.10
	// DefaultChanges is how many of the best substitutes get a resistor
	// change when none keeps IC within the tolerance.
	DefaultChanges = 3
)

// SubstituteRequest is a stage whose transistor is to be replaced from
// stock. At least one of Original and Twin must be given.
type SubstituteRequest struct {
	// Build is the stage as on the board: topology, signed rails, the
	// resistors with their tolerances, the supply tolerance, the ambient
	// range and the nominal ambient. Build.Device is ignored.
	Build    solver.Build
	Polarity solver.Polarity
	// Original is the original transistor's datasheet ranges; nil when
	// unknown.
	Original *solver.Datasheet
	// Twin are VB, VE, VC measured on a working twin; nil when none.
	Twin  *fault.Readings
	Meter fault.Meter
	// Tolerance is the IC shift allowed, a fraction; 0 = DefaultTolerance.
	Tolerance float64
	Stock     picker.Stock
	// Changes is how many substitute types get a resistor change (a type
	// stocked on several lines counts once); 0 = DefaultChanges.
	Changes int
	// Pairs lets the resistor change use series and parallel pairs.
	Pairs  bool
	Limits solver.Limits
}

// Source says where the original Q-point comes from.
type Source int

const (
	// SourceMeasured: inferred from a working twin's voltages.
	SourceMeasured Source = iota + 1
	// SourceRanges: solved from the original transistor's ranges.
	SourceRanges
)

// String returns "measured" or "ranges".
func (s Source) String() string {
	if s == SourceMeasured {
		return "measured"
	}
	return "ranges"
}

// MarshalText writes the source's name.
func (s Source) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// Original is the Q-point the substitute must keep.
type Original struct {
	Source      Source
	IC_A, VCE_V float64
	// Inference is the twin's reading of the Q-point; nil without a twin.
	Inference *Inference
	// Ranges is the stage solved with the original's ranges; nil when the
	// ranges are not given.
	Ranges *Point
}

// Point is a stage solved at its nominal point and over its worst case.
type Point struct {
	Build   solver.Build
	Model   solver.Model
	Nominal solver.OperatingPoint
	Worst   solver.WorstCase
}

// FailureKind is a reason a substitute (or a changed stage) breaks a
// limit.
type FailureKind int

// The failures.
const (
	// FailVCEO: VCEO Limit (V) derated by picker.VoltageDerating is below
	// the supply span Value (V) at its tolerance (a cut-off stage puts the
	// whole span across the transistor).
	FailVCEO FailureKind = iota + 1
	// FailICMax: IC max Limit (A) derated by picker.CurrentDerating is
	// below the worst-case IC Value (A).
	FailICMax
	// FailDissipation: a part dissipates beyond its derated, margined
	// allowance at some corner (Value = the largest utilization).
	FailDissipation
	// FailNotActive: some corner leaves the active region or the VCE
	// margin above VCE(sat) (Value = the corners that do).
	FailNotActive
	// FailSolve: the stage could not be solved with this part (Err).
	FailSolve
)

// Failure is one broken limit with its figures.
type Failure struct {
	Kind         FailureKind
	Value, Limit float64
	Err          error
}

// Margins are a candidate's distances to its limits (positive = inside).
type Margins struct {
	// Saturation_V is the worst-case VCE min less VCE(sat).
	Saturation_V float64
	// VCEO_V is VCEO less the supply span at its tolerance; HasVCEO is
	// false when the datasheet gives no VCEO.
	VCEO_V  float64
	HasVCEO bool
	// ICMax_A is IC max less the worst-case IC; HasICMax likewise.
	ICMax_A  float64
	HasICMax bool
	// Power is the transistor's worst-case dissipation as a share of its
	// derated, margined allowance at the stage's ambient; HasPower is false
	// for a part with no thermal data.
	Power    float64
	HasPower bool
}

// Candidate is one stocked transistor in the stage.
type Candidate struct {
	Rank       int
	Transistor picker.Transistor
	Point
	// ICShift is the nominal IC over the original's, less 1, VCEShift the
	// same for VCE; WorstShiftMin and WorstShiftMax are the IC shifts of
	// the worst-case extremes.
	ICShift, VCEShift            float64
	WorstShiftMin, WorstShiftMax float64
	// Within reports |ICShift| ≤ the tolerance with no failure.
	Within  bool
	Margins Margins
	Failing []Failure
	// Change is the one resistor change that re-centres the stage with
	// this part; nil when none was sought or none helps.
	Change *Change
}

// Skipped is a stock line of the polarity that was not tried.
type Skipped struct {
	Transistor picker.Transistor
	// Empty is true for a line with no parts on hand; otherwise Err is the
	// datasheet problem.
	Empty bool
	Err   error
}

// Substitution is the outcome of Substitute.
type Substitution struct {
	Original   Original
	Tolerance  float64
	Candidates []Candidate
	// NoneWithin reports that no candidate keeps IC within the tolerance
	// without a failure; the best Changes candidates then carry a Change.
	NoneWithin bool
	Skipped    []Skipped
	Cautions   []Caution
}

// ErrNoOriginal is returned when neither the original's ranges nor a
// twin's readings are given.
var ErrNoOriginal = errors.New("substitute: give the original transistor's ranges, a working twin's voltages, or both")

// Substitute ranks the stocked transistors of req.Polarity as
// replacements in req.Build's stage (doc.go).
func Substitute(req SubstituteRequest) (*Substitution, error) {
	if req.Original == nil && req.Twin == nil {
		return nil, ErrNoOriginal
	}
	tol := req.Tolerance
	if tol == 0 {
		tol = DefaultTolerance
	}
	if !(tol > 0 && tol <= 1) {
		return nil, fmt.Errorf("substitute: %w", &solver.InputError{Field: "tolerance", Problem: fmt.Sprintf("%g: want a fraction above 0 up to 1 (0 = %g)", req.Tolerance, DefaultTolerance)})
	}
	changes := req.Changes
	if changes == 0 {
		changes = DefaultChanges
	}
	lim := req.Limits.WithDefaults()
	b := req.Build
	if req.Original != nil {
		if req.Original.Polarity != req.Polarity {
			return nil, fmt.Errorf("substitute: %w", &solver.InputError{Field: "polarity", Problem: fmt.Sprintf("the original is %v but the stage is %v", req.Original.Polarity, req.Polarity)})
		}
	}
	if err := b.NominalStage().Validate(req.Polarity); err != nil {
		return nil, fmt.Errorf("substitute: %w", err)
	}
	out := &Substitution{Tolerance: tol, Cautions: benchCautions(b.NominalStage())}
	if req.Original != nil {
		p, err := solvePoint(b, *req.Original, lim)
		if err != nil {
			return nil, fmt.Errorf("substitute: the original %s in the stage: %w", req.Original.Label, err)
		}
		out.Original = Original{Source: SourceRanges, IC_A: p.Nominal.IC_A, VCE_V: p.Nominal.VCE_V, Ranges: &p}
	}
	if req.Twin != nil {
		hfeMin := 0.0
		if req.Original != nil {
			hfeMin = req.Original.HFEMin
		}
		in, err := InferQPoint(b, req.Polarity, *req.Twin, req.Meter, hfeMin)
		if err != nil {
			return nil, fmt.Errorf("substitute: twin readings: %w", err)
		}
		out.Original.Source, out.Original.IC_A, out.Original.VCE_V = SourceMeasured, in.IC_A, in.VCE_V
		out.Original.Inference = &in
	}
	ic0 := out.Original.IC_A
	for _, t := range req.Stock.Transistors {
		if t.Sheet.Polarity != req.Polarity {
			continue
		}
		if t.Qty < 1 {
			out.Skipped = append(out.Skipped, Skipped{Transistor: t, Empty: true})
			continue
		}
		if err := t.Sheet.Validate(); err != nil {
			out.Skipped = append(out.Skipped, Skipped{Transistor: t, Err: err})
			continue
		}
		out.Candidates = append(out.Candidates, evaluate(b, t, ic0, out.Original.VCE_V, tol, lim))
	}
	slices.SortStableFunc(out.Candidates, func(x, y Candidate) int {
		return cmp.Or(
			cmp.Compare(len(x.Failing), len(y.Failing)),
			cmp.Compare(math.Abs(x.ICShift), math.Abs(y.ICShift)),
			cmp.Compare(worstExcursion(x), worstExcursion(y)),
			-cmp.Compare(x.Transistor.Qty, y.Transistor.Qty),
			strings.Compare(strings.ToLower(x.Transistor.Sheet.Label), strings.ToLower(y.Transistor.Sheet.Label)),
			cmp.Compare(x.Transistor.ID, y.Transistor.ID),
		)
	})
	out.NoneWithin = true
	for i := range out.Candidates {
		out.Candidates[i].Rank = i + 1
		if out.Candidates[i].Within {
			out.NoneWithin = false
		}
	}
	if out.NoneWithin {
		fills := picker.Fillings(req.Stock.Resistors, 1, req.Pairs)
		// One change per type: a type stocked in two drawers gets the same
		// change on each line, counted once.
		done := map[solver.Datasheet]*Change{}
		for i := range out.Candidates {
			c := &out.Candidates[i]
			if failsRating(c.Failing) {
				continue
			}
			if ch, ok := done[c.Transistor.Sheet]; ok {
				c.Change = ch
				continue
			}
			if len(done) == changes {
				continue
			}
			c.Change = bestChange(c, fills, out.Original, tol, lim)
			done[c.Transistor.Sheet] = c.Change
		}
	}
	return out, nil
}

// solvePoint solves b with device d at its nominal point and worst case.
func solvePoint(b solver.Build, d solver.Datasheet, lim solver.Limits) (Point, error) {
	b.Device = d
	op, m, err := solver.Nominal(b)
	if err != nil {
		return Point{}, err
	}
	wc, err := solver.EvalWorstCaseWith(b, lim, solver.WorstCaseOptions{SkipCorners: true, SkipRSS: true})
	if err != nil {
		return Point{}, err
	}
	return Point{Build: b, Model: m, Nominal: op, Worst: wc}, nil
}

// evaluate puts stock line t into the stage.
func evaluate(b solver.Build, t picker.Transistor, ic0, vce0, tol float64, lim solver.Limits) Candidate {
	c := Candidate{Transistor: t}
	p, err := solvePoint(b, t.Sheet, lim)
	if err != nil {
		c.Failing = []Failure{{Kind: FailSolve, Err: err}}
		c.ICShift, c.WorstShiftMin, c.WorstShiftMax = math.Inf(1), math.Inf(-1), math.Inf(1)
		return c
	}
	c.Point = p
	c.ICShift, c.VCEShift = p.Nominal.IC_A/ic0-1, p.Nominal.VCE_V/vce0-1
	c.WorstShiftMin, c.WorstShiftMax = p.Worst.ICMin_A/ic0-1, p.Worst.ICMax_A/ic0-1
	c.Margins, c.Failing = limits(p, lim)
	c.Within = len(c.Failing) == 0 && math.Abs(c.ICShift) <= tol
	return c
}

// limits measures p against the transistor's ratings and the region.
func limits(p Point, lim solver.Limits) (Margins, []Failure) {
	d := p.Build.Device
	var m Margins
	var fails []Failure
	vceSat := d.VCESatOrDefault_V()
	m.Saturation_V = p.Worst.VCEMin_V - vceSat
	span := math.Abs(p.Build.VCC_V)
	if p.Build.Topology == solver.SplitSupply {
		span = math.Abs(p.Build.VCC_V - p.Build.VEE_V)
	}
	span *= 1 + p.Build.VCCTol
	if d.VCEO_V > 0 {
		m.VCEO_V, m.HasVCEO = d.VCEO_V-span, true
		if d.VCEO_V*picker.VoltageDerating < span {
			fails = append(fails, Failure{Kind: FailVCEO, Value: span, Limit: d.VCEO_V})
		}
	}
	if d.ICMax_A > 0 {
		m.ICMax_A, m.HasICMax = d.ICMax_A-p.Worst.ICMax_A, true
		if d.ICMax_A*picker.CurrentDerating < p.Worst.ICMax_A {
			fails = append(fails, Failure{Kind: FailICMax, Value: p.Worst.ICMax_A, Limit: d.ICMax_A})
		}
	}
	if tl := p.Worst.Dissipation.Transistor; tl.Rated {
		m.Power, m.HasPower = tl.Utilization, true
	}
	if !p.Worst.Dissipation.Ok {
		fails = append(fails, Failure{Kind: FailDissipation, Value: p.Worst.Dissipation.MaxUtilization, Limit: 1})
	}
	if !p.Worst.AllActive {
		fails = append(fails, Failure{Kind: FailNotActive, Value: float64(p.Worst.NotActive), Limit: float64(p.Worst.Count)})
	}
	return m, fails
}

// failsRating reports a failure no resistor change can mend here: a
// rating of the part itself or a stage that does not solve.
func failsRating(fs []Failure) bool {
	for _, f := range fs {
		if f.Kind == FailVCEO || f.Kind == FailSolve {
			return true
		}
	}
	return false
}

// worstExcursion is the larger worst-case IC shift.
func worstExcursion(c Candidate) float64 {
	return max(math.Abs(c.WorstShiftMin), math.Abs(c.WorstShiftMax))
}
