// Package stageflags reads the flags that describe a bias stage as it sits
// on a board — topology, rails, resistors with their tolerances, ambient —
// and a transistor taken from stock or given inline, for every command that
// takes a stage (check, substitute, diagnose): one parser, one set of
// defaults, one mapping from the solver's field names to the flags.
package stageflags

import (
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockparts"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Opener opens the stock file; the commands pass the factory's lazy
// ExistingStore, called only when a flag names a stock line.
type Opener func(context.Context) (*store.DB, error)

// Flag defaults, shown in --help.
const (
	DefaultTopology = "divider"
	DefaultVCCTol   = "5%"
	// DefaultTol is the resistor tolerance when a value carries none: E24
	// parts are usually ±5 % (common practice, REFERENCE.md §1).
	DefaultTol = "5%"
	// DefaultPower is the usual 1/4 W through-hole rating (common practice).
	DefaultPower   = "0.25W"
	DefaultAmbient = "0..50"
	DefaultTemp    = "25"
)

// DefaultTCR is --tcr's default: the TCR the stock assumes for a thick-film
// line (store.DefaultTCR_PPMPerK), written as the flag takes it ("100ppm").
func DefaultTCR() string {
	tcr, _ := store.DefaultTCR_PPMPerK(store.TechThickFilm)
	return fmt.Sprintf("%gppm", tcr)
}

// Stage holds the stage flags as typed.
type Stage struct {
	Topology string
	VCC      string
	VEE      string
	Rail     string
	R        [solver.NumSlots]string // --r1 --r2 --rc --re --rf --rb
	VCCTol   string
	Tol      string
	TCR      string
	Power    string
	Ambient  string
	Temp     string
	// Changed reports whether a flag was given on the command line.
	Changed func(name string) bool
}

// AddFlags registers the stage flags on fl.
func (s *Stage) AddFlags(fl *pflag.FlagSet) {
	s.Changed = fl.Changed
	fl.StringVar(&s.Topology, "topology", DefaultTopology, "bias circuit: divider, collector-feedback or split-supply")
	fl.StringVar(&s.VCC, "vcc", "", "collector supply, e.g. 12V, or the range it moves over, e.g. 7V..9.6V for a 9 V battery (then no --vcc-tol)")
	fl.StringVar(&s.VEE, "vee", "", "emitter supply of the split-supply stage, e.g. 12V (taken as the rail opposite --vcc)")
	fl.StringVar(&s.Rail, "rail", "", RailHelp)
	for _, r := range []struct {
		slot solver.Slot
		help string
	}{
		{solver.R1, "divider: collector-side rail to base"},
		{solver.R2, "divider: base to emitter-side rail"},
		{solver.RC, "collector-side rail to collector"},
		{solver.RE, "emitter to emitter-side rail (or to --vee); 0 or absent = emitter tied to it"},
		{solver.RF, "collector-feedback: collector to base"},
		{solver.RB, "split-supply: base to the common (0 V)"},
	} {
		fl.StringVar(&s.R[r.slot], r.slot.String(), "", r.help+", e.g. 4K7 or 4.7k; with tolerance and rating 6K8/10%/1W; or a stock line '#26'")
	}
	fl.StringVar(&s.VCCTol, "vcc-tol", DefaultVCCTol, "supply tolerance (both rails, each varied on its own)")
	fl.StringVar(&s.Tol, "tol", DefaultTol, "resistor tolerance where the value carries none")
	fl.StringVar(&s.TCR, "tcr", DefaultTCR(), "resistor temperature coefficient")
	fl.StringVar(&s.Power, "power", DefaultPower, "resistor power rating at 70 °C (derated to 0 at 155 °C)")
	fl.StringVar(&s.Ambient, "ambient", DefaultAmbient, "ambient temperature range in °C, MIN..MAX")
	fl.StringVar(&s.Temp, "temp", DefaultTemp, "ambient temperature of the nominal point, °C")
}

// TopologyOf parses --topology.
func (s *Stage) TopologyOf() (solver.Topology, error) {
	top, err := solver.ParseTopology(strings.ToLower(strings.TrimSpace(s.Topology)))
	if err != nil {
		return 0, Usage("topology", err)
	}
	return top, nil
}

// Build parses the stage flags into a build for a transistor of polarity
// pol: topology, signed rails (solver.Rail), supply tolerance, resistors,
// ambient range and nominal ambient. A resistor given as a stock line
// ("#26") is read through open. The device, AC side and beta are left to
// the caller.
func (s *Stage) Build(ctx context.Context, pol solver.Polarity, open Opener) (solver.Build, error) {
	var b solver.Build
	top, err := s.TopologyOf()
	if err != nil {
		return b, err
	}
	b.Topology = top
	// Rails: a magnitude, or the signed rail of the polarity.
	if s.VCC == "" {
		return b, Usagef("vcc", "missing: give the collector supply, e.g. --vcc 12V")
	}
	vcc, vccTol, vccRange, err := notation.ParseSupply(s.VCC)
	if err != nil {
		return b, Usage("vcc", err)
	}
	rail, err := SettleRail(s.Rail, vcc, pol, top)
	if err != nil {
		return b, err
	}
	b.Ground = solver.GroundOf(pol, top, rail)
	if b.VCC_V, err = solver.Rail(vcc, pol, solver.Collector); err != nil {
		return b, InputError(err)
	}
	switch {
	case top == solver.SplitSupply && s.VEE == "":
		return b, Usagef("vee", "missing: the split-supply stage needs the emitter supply, e.g. --vee 12V")
	case top != solver.SplitSupply && s.VEE != "":
		return b, Usagef("vee", "only the split-supply stage has an emitter supply")
	case s.VEE != "":
		vee, err := notation.ParseVoltage(s.VEE)
		if err != nil {
			return b, Usage("vee", err)
		}
		if b.VEE_V, err = solver.Rail(vee, pol, solver.Emitter); err != nil {
			return b, InputError(err)
		}
	}
	switch {
	case vccRange && s.Changed != nil && s.Changed("vcc-tol"):
		return b, Usagef("vcc-tol", "--vcc %s is already a range; give either the range or --vcc-tol, not both", s.VCC)
	case vccRange:
		// The solver's rule, asked here to name --vcc rather than --vcc-tol.
		if err := solver.CheckTolerance("vcc_tol", vccTol); err != nil {
			return b, Usagef("vcc", "%s: %s", s.VCC, err.(*solver.InputError).Problem)
		}
		b.VCCTol = vccTol
	default:
		if b.VCCTol, err = notation.ParseTolerance(s.VCCTol); err != nil {
			return b, Usage("vcc-tol", err)
		}
	}

	// Resistors.
	tol, err := notation.ParseTolerance(s.Tol)
	if err != nil {
		return b, Usage("tol", err)
	}
	tcr, err := notation.ParseTCR(s.TCR)
	if err != nil {
		return b, Usage("tcr", err)
	}
	power, err := notation.ParsePower(s.Power)
	if err != nil {
		return b, Usage("power", err)
	}
	used := map[solver.Slot]bool{}
	for _, sl := range top.Slots() {
		used[sl] = true
	}
	for sl := range solver.NumSlots {
		text := strings.TrimSpace(s.R[sl])
		name := sl.String()
		if !used[sl] {
			if text != "" {
				return b, Usagef(name, "the %s stage has no %s (it uses %s)", top, name, SlotList(top))
			}
			continue
		}
		if text == "" {
			if sl == solver.RE && top != solver.SplitSupply {
				continue // emitter tied to ground
			}
			return b, Usagef(name, "missing: the %s stage needs %s", top, SlotList(top))
		}
		if strings.HasPrefix(text, "#") {
			if b.Resistors[sl], err = stockResistor(ctx, open, name, text); err != nil {
				return b, err
			}
			continue
		}
		rt, err := notation.ParseResistorText(text)
		if err != nil {
			return b, Usage(name, err)
		}
		spec := solver.ResistorSpec{Nominal_Ohm: rt.Ohm, Tol: tol, TCR_PPMPerK: tcr, Rated_W: power}
		if rt.HasTol {
			spec.Tol = rt.Tol
		}
		if rt.HasPower {
			spec.Rated_W = rt.Rated_W
		}
		b.Resistors[sl] = spec
	}

	// Temperatures.
	if b.AmbientMin_C, b.AmbientMax_C, err = notation.ParseRange(s.Ambient, notation.ParseTemperature); err != nil {
		return b, Usage("ambient", err)
	}
	if b.NominalAmbient_C, err = notation.ParseTemperature(s.Temp); err != nil {
		return b, Usage("temp", err)
	}
	return b, nil
}

// SlotList names the resistor flags a topology takes.
func SlotList(t solver.Topology) string {
	var names []string
	for _, s := range t.Slots() {
		names = append(names, "--"+s.String())
	}
	return strings.Join(names, " ")
}

// stockResistor reads the resistor stock line a position names as "#ID":
// its value, tolerance, rating, derating, TCR and element voltage as
// stocked, converted by stockparts (the store's defaults filled in).
func stockResistor(ctx context.Context, open Opener, flag, text string) (solver.ResistorSpec, error) {
	id, err := strconv.ParseInt(strings.TrimSpace(strings.TrimPrefix(text, "#")), 10, 64)
	if err != nil || id <= 0 {
		return solver.ResistorSpec{}, Usagef(flag, "%q: a stock line is written #ID, like #26 (see biasbin stock list)", text)
	}
	if open == nil {
		return solver.ResistorSpec{}, fmt.Errorf("--%s %s: no stock available", flag, text)
	}
	db, err := open(ctx)
	if err != nil {
		return solver.ResistorSpec{}, err
	}
	r, err := db.ResistorByID(ctx, id)
	switch {
	case errors.Is(err, store.ErrNotFound):
		return solver.ResistorSpec{}, Usagef(flag, "%s is not a resistor line in stock (see biasbin stock list --kind resistor)", text)
	case err != nil:
		return solver.ResistorSpec{}, fmt.Errorf("--%s %s: %w", flag, text, err)
	}
	spec, err := stockparts.Spec(r)
	if err != nil {
		return spec, fmt.Errorf("--%s %s: %w", flag, text, err)
	}
	return spec, nil
}

// Usage returns a usage error (exit 2) naming the flag.
func Usage(flag string, err error) error {
	return &cmdutil.UsageError{Err: fmt.Errorf("--%s: %w", flag, err)}
}

// Usagef returns a usage error (exit 2) naming the flag.
func Usagef(flag, format string, a ...any) error {
	return &cmdutil.UsageError{Err: fmt.Errorf("--%s: "+format, append([]any{flag}, a...)...)}
}
