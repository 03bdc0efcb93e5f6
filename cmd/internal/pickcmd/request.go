package pickcmd

import (
	"errors"
	"math"
	"slices"
	"strconv"
	"strings"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stageflags"
	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// request turns the flags into a picker request. Every mistake comes back
// as a *cmdutil.UsageError naming the flag, what is wrong and how to fix it.
func (o *Options) request() (picker.Request, error) {
	var req picker.Request
	top, err := parseTopology(o.Topology)
	if err != nil {
		return req, err
	}
	req.Topology = top

	pol, err := solver.ParsePolarity(strings.TrimSpace(o.Polarity))
	if err != nil {
		return req, cmdutil.Usagef("--polarity %q: want npn or pnp", o.Polarity)
	}
	req.Polarity = pol

	if o.VCC == "" {
		return req, cmdutil.Usagef("--vcc is required: the supply voltage, e.g. --vcc 12V")
	}
	vcc, vccTol, vccRange, err := notation.ParseSupply(o.VCC)
	if err != nil {
		return req, cmdutil.Usagef("--vcc: %v", err)
	}
	if req.Rail, err = stageflags.SettleRail(o.Rail, vcc, pol, top); err != nil {
		return req, err
	}
	if req.VCC_V, err = solver.Rail(vcc, pol, solver.Collector); err != nil {
		return req, requestError(err)
	}
	if err := o.emitterRail(&req, pol); err != nil {
		return req, err
	}

	switch {
	case vccRange && o.changed("vcc-tol"):
		return req, cmdutil.Usagef("--vcc %s is already a range; give either the range or --vcc-tol, not both", o.VCC)
	case vccRange:
		req.VCCTol = vccTol
	default:
		if req.VCCTol, err = notation.ParseTolerance(o.VCCTol); err != nil {
			return req, cmdutil.Usagef("--vcc-tol: %v", err)
		}
	}
	// The picker checks the tolerance with the rest; asked here only to
	// name the flag the user typed it with.
	if err := solver.CheckTolerance("vcc_tol", req.VCCTol); err != nil && vccRange {
		return req, cmdutil.Usagef("--vcc %s: %s", o.VCC, err.(*solver.InputError).Problem)
	}

	if o.IC == "" {
		return req, cmdutil.Usagef("--ic is required: the target collector current, e.g. --ic 2mA")
	}
	if req.IC_A, err = notation.ParseCurrent(o.IC); err != nil {
		return req, cmdutil.Usagef("--ic: %v", err)
	}

	if o.VCE != "" {
		if req.VCE_V, err = notation.ParseVoltage(o.VCE); err != nil {
			return req, cmdutil.Usagef("--vce: %v", err)
		}
		req.VCE_V = math.Abs(req.VCE_V)
		if req.VCE_V == 0 {
			return req, cmdutil.Usagef("--vce 0: the transistor would sit in saturation; give a VCE between 1 V and the supply, or leave --vce out for the swing rule")
		}
	}

	if o.VE != "" {
		lo, hi, err := notation.ParseRange(o.VE, notation.ParseVoltage)
		if err != nil {
			return req, cmdutil.Usagef("--ve: %v", err)
		}
		lo, hi = math.Abs(lo), math.Abs(hi)
		if lo > hi {
			lo, hi = hi, lo
		}
		if hi <= 0 {
			return req, cmdutil.Usagef("--ve %s: the emitter band must be above 0 V, e.g. --ve 1V..2V", o.VE)
		}
		req.VEMin_V, req.VEMax_V = lo, hi
	}

	if req.AmbientMin_C, req.AmbientMax_C, err = parseAmbient(o.Ambient); err != nil {
		return req, err
	}

	if o.Boards < 1 {
		return req, cmdutil.Usagef("--boards %d: build at least one board", o.Boards)
	}
	req.Boards = o.Boards

	if o.Load != "" {
		if req.RL_Ohm, err = notation.ParseOhms(o.Load); err != nil {
			return req, cmdutil.Usagef("--load: %v", err)
		}
		if req.RL_Ohm <= 0 {
			return req, cmdutil.Usagef("--load %s: the AC load must be a positive resistance, e.g. --load 10K", o.Load)
		}
	}
	req.Bypass = o.Bypass

	if req.Window, err = o.window(); err != nil {
		return req, err
	}
	if req.Weights, err = parseWeights(o.Weights); err != nil {
		return req, err
	}
	if o.Top < 1 {
		return req, cmdutil.Usagef("--top %d: show at least one build", o.Top)
	}
	req.Top = o.Top
	req.Pairs = o.Pairs
	req.Exhaustive = o.Exhaustive
	req.Settle = o.Settle
	if o.TimeLimit < 0 {
		return req, cmdutil.Usagef("--time-limit %v: give a positive duration, or 0 to search to the end", o.TimeLimit)
	}
	req.TimeLimit = o.TimeLimit
	req.ShowFailing = o.ShowFailing
	req.ShowAll = o.All
	req.AllowUnrated = o.AllowUnrated
	req.Seed = o.Seed
	if err := solver.YieldBoardsRange.Check(float64(o.SimBoards)); err != nil {
		return req, requestError(err)
	}
	req.YieldBoards = o.SimBoards
	for _, t := range o.RequireTags {
		t = strings.ToLower(strings.TrimSpace(t))
		if t == "" {
			return req, cmdutil.Usagef("--require-tag: empty tag; give a word such as approved")
		}
		if !slices.Contains(req.RequireTags, t) {
			req.RequireTags = append(req.RequireTags, t)
		}
	}
	req.Transistor = strings.TrimSpace(o.Transistor)
	if req.Keep, err = parseKeep(o.Keep); err != nil {
		return req, err
	}
	if err := req.Validate(); err != nil {
		return req, requestError(err)
	}
	return req, nil
}

// emitterRail reads --vee (a voltage, or the range a battery moves over)
// and --vee-tol into the request; without either tolerance the picker
// takes --vcc-tol's.
func (o *Options) emitterRail(req *picker.Request, pol solver.Polarity) error {
	if o.VEE == "" {
		if o.VEETol != "" {
			return cmdutil.Usagef("--vee-tol %s: there is no --vee; give the emitter rail too, e.g. --vee 12V --vee-tol %s", o.VEETol, o.VEETol)
		}
		return nil
	}
	vee, tol, isRange, err := notation.ParseSupply(o.VEE)
	if err != nil {
		return cmdutil.Usagef("--vee: %v", err)
	}
	if req.VEE_V, err = solver.Rail(vee, pol, solver.Emitter); err != nil {
		return requestError(err)
	}
	switch {
	case isRange && o.VEETol != "":
		return cmdutil.Usagef("--vee %s is already a range; give either the range or --vee-tol, not both", o.VEE)
	case isRange:
		req.VEETol = tol
		// the picker checks it; asked here only to name --vee
		if err := solver.CheckTolerance("vee_tol", tol); err != nil {
			return cmdutil.Usagef("--vee %s: %s", o.VEE, err.(*solver.InputError).Problem)
		}
	case o.VEETol != "":
		if req.VEETol, err = notation.ParseTolerance(o.VEETol); err != nil {
			return cmdutil.Usagef("--vee-tol: %v", err)
		}
		if req.VEETol == 0 {
			return cmdutil.Usagef("--vee-tol %s: no supply is exact; give its regulation, e.g. --vee-tol 1%%", o.VEETol)
		}
	}
	return nil
}

// parseKeep reads --keep POSITION=VALUE[,...]: the resistors on the board
// the build keeps, each value with its tolerance and rating if known
// (47K, 47K/5%/0.25W, as check takes a resistor). Which positions the
// topology has, and the accepted values, are the picker's rules.
func parseKeep(flags []string) ([]picker.KeptPart, error) {
	var out []picker.KeptPart
	for _, f := range flags {
		for item := range strings.SplitSeq(f, ",") {
			name, val, ok := strings.Cut(strings.TrimSpace(item), "=")
			if !ok || strings.TrimSpace(name) == "" || strings.TrimSpace(val) == "" {
				return nil, cmdutil.Usagef("--keep %q: want POSITION=VALUE, e.g. --keep r1=47K,r2=10K/5%%/0.25W", item)
			}
			rt, err := notation.ParseResistorText(strings.TrimSpace(val))
			if err != nil {
				return nil, cmdutil.Usagef("--keep %s: %v", strings.TrimSpace(name), err)
			}
			k := picker.KeptPart{Position: strings.ToLower(strings.TrimSpace(name)), Ohm: rt.Ohm}
			if rt.HasTol {
				k.Tol = rt.Tol
			}
			if rt.HasPower {
				k.Rated_W = rt.Rated_W
			}
			out = append(out, k)
		}
	}
	return out, nil
}

// requestError turns a request the picker or the solver refuses into a
// usage error naming the flag (exit 2); any other error is returned as it
// is.
func requestError(err error) error {
	var pin *picker.InputError
	var sin *solver.InputError
	switch {
	case errors.As(err, &pin):
		msg := pin.Problem
		if pin.Fix != "" {
			msg += "; " + pin.Fix
		}
		return cmdutil.Usagef("%s: %s", flagOf(pin.Field), msg)
	case errors.As(err, &sin):
		return cmdutil.Usagef("%s: %s", flagOf(sin.Field), sin.Problem)
	}
	return err
}

// flagOf names the flag behind a request field.
func flagOf(field string) string {
	switch {
	case field == "vcc_tol":
		return "--vcc-tol"
	case field == "vee_tol":
		return "--vee-tol"
	case strings.HasPrefix(field, "weights"):
		return "--weights"
	case field == "window":
		return "--ic-window/--vce-window"
	case field == "yield_boards":
		return "--sim-boards"
	case field == "stock":
		return "the stock"
	}
	return "--" + field
}

// parseTopology reads --topology: a topology's name or "any" (which
// topologies pick searches is the picker's rule, checked with the rest of
// the request).
func parseTopology(s string) (solver.Topology, error) {
	if strings.TrimSpace(s) == "any" {
		return picker.AnyTopology, nil
	}
	t, err := solver.ParseTopology(strings.TrimSpace(s))
	if err != nil {
		return 0, cmdutil.Usagef("--topology %q: want divider, collector-feedback, split-supply or any", s)
	}
	return t, nil
}

// parseAmbient reads "MIN..MAX" in °C.
func parseAmbient(s string) (lo, hi float64, err error) {
	if !strings.Contains(s, "..") {
		return 0, 0, cmdutil.Usagef("--ambient %q: want a range in °C like 0..50 or -10..60", s)
	}
	if lo, hi, err = notation.ParseRange(s, notation.ParseTemperature); err != nil {
		return 0, 0, cmdutil.Usagef("--ambient: %v (want a range in °C like 0..50 or -10..60)", err)
	}
	return lo, hi, nil
}

// window reads the yield window's rule from --ic-window and --vce-window:
// a percentage is a band around the design point (the target IC, and
// --vce or each build's VCE target), a range "A..B" is absolute
// (picker.WindowRule, the rule check follows too). The defaults leave the
// rule zero, the picker's DefaultWindowRule.
func (o *Options) window() (picker.WindowRule, error) {
	var r picker.WindowRule
	if strings.TrimSpace(o.ICWindow) == defaultICWindow && strings.TrimSpace(o.VCEWindow) == defaultVCEWindow {
		return r, nil
	}
	var err error
	if r.IC, err = stageflags.WindowBand("ic-window", o.ICWindow, notation.ParseCurrent); err != nil {
		return r, err
	}
	if r.VCE, err = stageflags.WindowBand("vce-window", o.VCEWindow, notation.ParseVoltage); err != nil {
		return r, err
	}
	return r, nil
}

// weightNames maps the names --weights accepts to the field they set.
var weightNames = map[string]func(*picker.Weights) *float64{
	"q":           func(w *picker.Weights) *float64 { return &w.QPoint },
	"qpoint":      func(w *picker.Weights) *float64 { return &w.QPoint },
	"e":           func(w *picker.Weights) *float64 { return &w.Emitter },
	"emitter":     func(w *picker.Weights) *float64 { return &w.Emitter },
	"beta":        func(w *picker.Weights) *float64 { return &w.Beta },
	"headroom":    func(w *picker.Weights) *float64 { return &w.Headroom },
	"util":        func(w *picker.Weights) *float64 { return &w.Utilization },
	"utilization": func(w *picker.Weights) *float64 { return &w.Utilization },
	"yield":       func(w *picker.Weights) *float64 { return &w.Yield },
	"parts":       func(w *picker.Weights) *float64 { return &w.Parts },
}

// parseWeights reads "q=2,beta=1,..." on top of the default weights.
// An empty string means the defaults.
func parseWeights(s string) (picker.Weights, error) {
	if strings.TrimSpace(s) == "" {
		return picker.Weights{}, nil
	}
	w := defaultWeights()
	for item := range strings.SplitSeq(s, ",") {
		name, val, ok := strings.Cut(strings.TrimSpace(item), "=")
		name = strings.ToLower(strings.TrimSpace(name))
		field, known := weightNames[name]
		if !ok || !known {
			return picker.Weights{}, cmdutil.Usagef("--weights %q: want NAME=VALUE pairs with NAME one of q, emitter, beta, headroom, util, yield, parts, e.g. --weights q=2,yield=0.5", item)
		}
		v, err := strconv.ParseFloat(strings.TrimSpace(val), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return picker.Weights{}, cmdutil.Usagef("--weights %s: %q is not a number", name, val)
		}
		if v < 0 {
			return picker.Weights{}, cmdutil.Usagef("--weights %s=%s: a weight cannot be negative; use 0 to ignore the term or a positive number to stress it", name, strings.TrimSpace(val))
		}
		*field(&w) = v
	}
	if w == (picker.Weights{}) {
		return picker.Weights{}, cmdutil.Usagef("--weights %s: every weight is 0, so nothing would rank the builds; give at least one a positive weight", s)
	}
	return w, nil
}

// trimV writes a voltage for messages, e.g. "12 V".
func trimV(v float64) string { return trimNum(v) + " V" }

// trimNum writes a number with no trailing zeros.
func trimNum(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

// defaultWeights returns the picker's documented default weights, used for
// the terms --weights leaves out.
func defaultWeights() picker.Weights { return picker.DefaultWeights() }

// weightsHelp writes the default weights as --weights takes them.
func weightsHelp() string {
	w := defaultWeights()
	return "q=" + trimNum(w.QPoint) + ",emitter=" + trimNum(w.Emitter) + ",beta=" + trimNum(w.Beta) + ",headroom=" + trimNum(w.Headroom) +
		",util=" + trimNum(w.Utilization) + ",yield=" + trimNum(w.Yield) + ",parts=" + trimNum(w.Parts)
}
