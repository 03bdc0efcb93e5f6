// Package checkcmd implements `biasbin check`: analyse one bias build the
// user names — operating point, region, worst case over every tolerance
// corner, Monte Carlo yield, dissipation against derated ratings, swing —
// and list the test-point voltages a technician measures with their
// expected bands.
package checkcmd

import (
	"context"
	"errors"
	"fmt"
	"strconv"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// Options are the check command's inputs: the flags as typed (parsed by
// input) and what the command needs from outside, injectable by tests.
type Options struct {
	IO *cmdutil.IOStreams
	// Store opens the stock, an existing file only (the factory's lazy
	// ExistingStore outside tests); it is called only when --transistor
	// names a stock line.
	Store func(context.Context) (*store.DB, error)
	// Changed reports whether a flag was given on the command line.
	Changed func(name string) bool

	// Stage and Device are the stage and transistor flags, shared with
	// substitute and diagnose (cmd/internal/stageflags).
	Stage  stageflags.Stage
	Device stageflags.Device
	Beta   string
	Load   string
	Bypass string
	Window string
	// ICTarget and VCETarget are the design point the window sits
	// around (--ic, --vce); "" = the nominal point.
	ICTarget  string
	VCETarget string
	// SimBoards is the Monte Carlo size (--sim-boards); OldBoards catches
	// the old --boards, refused with a pointer to --sim-boards.
	SimBoards int
	OldBoards int
	Seed      uint64
	JSON      bool
	Spice     bool
	// Ref is a build ID given as the argument (a pick's build, or a
	// reserved build's number): the build to check instead of the flags.
	Ref string
	// Plot is the file check --plot draws the picture to; Out is plot's.
	Plot string
	Out  string
	// PlotSize is the picture size as typed (WIDTHxHEIGHT); Kind the
	// picture plot draws.
	PlotSize string
	Kind     string
	// Zoom closes plot's axes in on the Q-point spread.
	Zoom bool
	// Refs are the builds plot draws by reference (a pick's build ID or a
	// reserved build's number) instead of by the build flags.
	Refs []string
	// buildFlags are the flags that name a build, refused beside Refs.
	buildFlags []string
}

// Flag defaults, shown in --help (the stage's are stageflags').
const (
	defaultWindow    = "10%,20%"
	defaultSimBoards = 10000
	defaultSeed      = 1
	// bypassAll is what a bare --bypass means: all of RE bypassed.
	bypassAll = "all"
)

// New returns the check command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

// newCmd builds the command; runF, when not nil, replaces Run so flag
// tests can inspect the parsed options.
func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "check (--vcc V --r1 R ... (--transistor LABEL | --hfe MIN..MAX) | BUILD-ID) [flags]",
		Short: "Analyse one bias build: Q-point, worst case, yield, dissipation, swing",
		Long: `Solve one bias build exactly and show how it holds up: the nominal
operating point and region, every worst-case corner of hFE spread, resistor
and supply tolerance and ambient range (each resistor's TCR applied at the
corner's ambient, resistors taken to sit at the ambient, the transistor
self-heated through its θJA), a Monte Carlo yield, each part's dissipation
against its derated rating, the load lines and swing, and the test-point
voltages (VB, VE, VC to 0 V, as a meter shows them) to measure at
bring-up with their bands.

Values take the letter-and-digit code or SI: 12V, 4K7, 470R, 10k, 2mA.
A supply that moves over a range (a battery from fresh to flat) is given as
the range, --vcc 7V..9.6V: the nominal point sits at its middle and the
worst case reaches both ends.
A build a pick listed (its ID, like b3b39a272f57c, kept ` + strconv.Itoa(store.PickKeepDays) + ` days) or a
reserved build (its number from build list) is checked by naming it:
check b3b39a272f57c; its yield runs against the pick's own window unless
--window, --ic or --vce say otherwise; --sim-boards and --seed apply.
A resistor may carry its own tolerance and power rating after slashes
(6K8/10%/1W, 4K7F/0.5W) or name a resistor stock line ('#26': its stocked
tolerance, rating, TCR and element voltage); otherwise
--tol applies.

A PNP stage runs from a positive supply by default: emitter side to +V,
collector side to 0 V, so its voltages read positive. --rail negative (or
a negative --vcc) builds it with the emitter side on 0 V and the collector
side on -V. A split-supply stage is measured from the common of its two
supplies: --vee is the emitter rail (magnitude or signed); for a PNP stage
the collector rail is the negative one and the emitter rail the positive
one, for an NPN stage the other way round. The report names what each
resistor joins (R1 +V to base, RE emitter to 0 V, ...).

The transistor comes from the stock (--transistor LABEL, in any letter
case) or inline (--polarity, --hfe ...). Inline flags given with --transistor override the
stock line's values (a heatsink's --theta-ja, a measured --hfe).

By default the nominal point is at 25 °C ambient (--temp) and the typical
hFE (the datasheet typical, else the geometric mean of min and max; --beta
pins it).

` + report.YieldHelp + `
Here the window is --window IC,VCE, each a percentage (10%,20%) or a range
(1.8mA..2.2mA,4V..8V). --boards is not check's: the simulated boards are
--sim-boards (pick's --boards is the boards to build).

The report leads with a verdict. A build fails when it breaks a hard
limit: a worst-case corner leaves the active region or the VCE margin, a
part runs over its design limit (resistors 50 %, the transistor 75 % of
the rating derated to the hottest ambient) or over its rating, a resistor
carries more than 80 % of its limiting element voltage (stated in the stock,
else assumed from its power rating), VCE passes VCEO or IC passes IC max.
Cautions follow in plain words: parts hot enough to burn a finger, a supply
above the touchable 60 V d.c. or beyond extra-low voltage, transistor
ratings not stated. With --json or --spice they go to stderr.

Exit status: 0 when the build passes (cautions or not), 1 when it fails a
hard limit or a corner or the nominal point cannot be solved, 2 for bad
flags.

` + report.Ranges(solver.Ranges()),
		Example: `  biasbin check --vcc 15V --r1 10K --r2 5K --rc 1K --re 1K --hfe 100..300
  biasbin check --vcc 12V --r1 47K --r2 10K --rc 2K2 --re 470R --transistor NPN-GP --json
  biasbin check --topology split-supply --vcc 15V --vee 15V --rb 10K --rc 10K --re 20K --hfe 100..300 --spice
  biasbin check --polarity pnp --vcc 9V --r1 10K --r2 2K2 --rc 3K6 --re 1K --hfe 100..300 --ambient -10..60`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return nil
			}
			if _, err := buildjob.ParseRef(args[0]); err == nil && len(args) == 1 && !(cmd.Flags().Changed("bypass") && o.Bypass == bypassAll) {
				o.Ref = args[0]
				return nil
			}
			if cmd.Flags().Changed("bypass") && o.Bypass == bypassAll {
				return cmdutil.Usagef("check takes no arguments, only flags (got %q); a value for --bypass is written --bypass=%s", args[0], args[0])
			}
			return cmdutil.Usagef("check takes no arguments, only flags (got %q)", args[0])
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			if runF != nil {
				return runF(o)
			}
			return Run(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	o.bindBuild(fl)
	fl.StringVar(&o.Plot, "plot", "", "also draw the load-line picture to FILE (.svg, .png or .pdf; see biasbin plot)")
	fl.StringVar(&o.PlotSize, "plot-size", "", "size of the --plot picture in pixels, WIDTHxHEIGHT (default "+defaultSize()+")")
	fl.BoolVar(&o.JSON, "json", false, "write every figure as JSON (SI base units)")
	fl.BoolVar(&o.Spice, "spice", false, "print an equivalent SPICE netlist of the nominal point instead of the report (with --json: add it as \"spice\")")
	return cmd
}

// Run executes a check with o; tests call it with buffer streams.
func Run(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	pic, err := o.pictureOptions("plot", o.Plot)
	if err != nil {
		return err
	}
	in, err := o.input(ctx)
	if err != nil {
		return err
	}
	in.KeepBoards = pic != nil
	res, err := job.Check(in)
	if err != nil {
		var ie *solver.InputError
		if errors.As(err, &ie) {
			return &cmdutil.UsageError{Err: fmt.Errorf("%s: %s", stageflags.FlagName(ie.Field), ie.Problem)}
		}
		return fmt.Errorf("check: %w", err)
	}
	switch {
	case o.JSON:
		if err := writeJSON(o.IO.Out, res, o.Spice); err != nil {
			return fmt.Errorf("check: write JSON: %w", err)
		}
	case o.Spice:
		fmt.Fprint(o.IO.Out, netlist(res))
	default:
		fmt.Fprintf(o.IO.Out, "verdict: %s\n", report.Verdict(res.Verdict))
		for _, c := range res.Safety {
			fmt.Fprintf(o.IO.Out, "  %s %s\n", cautionMark(c), report.Caution(c))
		}
		fmt.Fprintln(o.IO.Out)
		writeText(o.IO.Out, res)
	}
	if o.JSON || o.Spice {
		// The report leads with them; data-only output keeps them on stderr.
		for _, c := range cautions(res) {
			fmt.Fprintln(o.IO.ErrOut, "caution:", c)
		}
	}
	if pic != nil {
		if err := pic.write(o.IO, res); err != nil {
			return err
		}
	}
	if len(res.Problems) > 0 {
		for _, p := range problems(res) {
			fmt.Fprintln(o.IO.ErrOut, "biasbin: check:", p)
		}
		return cmdutil.ErrSilent
	}
	if res.Verdict.Fails {
		fmt.Fprintln(o.IO.ErrOut, "biasbin: check: the build fails:", report.Caution(*res.Verdict.First))
		return cmdutil.ErrSilent
	}
	return nil
}

// bindBuild binds the flags that name a build and its analysis, shared by
// check and plot.
func (o *Options) bindBuild(fl *pflag.FlagSet) {
	o.Changed = fl.Changed
	o.Stage.AddFlags(fl)
	o.Device.AddFlags(fl, "transistor", "transistor by stock label (any letter case)", "inline transistor")
	fl.StringVar(&o.Beta, "beta", "", "pin the nominal point's beta (default the typical hFE)")
	fl.StringVar(&o.Load, "load", "", "AC load on the collector, e.g. 10K (for the AC load line)")
	fl.StringVar(&o.Bypass, "bypass", "", "part of RE bypassed for AC, written --bypass=470R; a bare --bypass means all of RE")
	fl.Lookup("bypass").NoOptDefVal = bypassAll
	fl.StringVar(&o.Window, "window", defaultWindow, "yield window IC,VCE: each ±percent of the design point (--ic/--vce, else the nominal point) or MIN..MAX")
	fl.StringVar(&o.ICTarget, "ic", "", "design IC the yield window sits around, e.g. 1mA (default the nominal IC)")
	fl.StringVar(&o.VCETarget, "vce", "", "design VCE the yield window sits around, e.g. 6V (default the nominal VCE)")
	fl.IntVar(&o.SimBoards, "sim-boards", defaultSimBoards, "simulated boards of the Monte Carlo yield (the same flag in pick)")
	fl.IntVar(&o.OldBoards, "boards", 0, "")
	_ = fl.MarkHidden("boards")
	fl.Uint64Var(&o.Seed, "seed", defaultSeed, "Monte Carlo seed")
}

// changed reports whether a flag was set on the command line.
func (o *Options) changed(name string) bool { return o.Changed != nil && o.Changed(name) }
