// Package pickcmd implements `biasbin pick`: search the stock for the best
// bias builds for a target operating point and show what to pull from
// which bin.
package pickcmd

import (
	"context"
	"fmt"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
	"biasbin/cmd/internal/report"
	"biasbin/cmd/internal/stageflags"
	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// New returns the pick command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

// newCmd builds the command; runF, when not nil, replaces Run so flag
// tests can inspect the parsed options.
func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore, Pick: picker.Pick, Now: time.Now}
	cmd := &cobra.Command{
		Use:   "pick --vcc V --ic I [flags]",
		Short: "Find the best bias builds from the parts in stock",
		Long: `Search the stocked resistors and transistors for divider-bias builds that
hit the target Q-point and hold it over the transistor's hFE spread, part
tolerances, supply tolerance and the ambient range, without running any part
beyond its derated rating. Builds are ranked; each shows the parts to pull
from which bin for the number of boards, the nominal Q-point, the worst-case
band, the voltages to measure at bring-up and the Monte Carlo yield.

Values take the letter-and-digit code or SI: 12V, 2mA, 4K7, 470R, 10k.

Topologies (--topology): divider (R1, R2, RC, RE), collector-feedback (RF
from collector to base, RC, RE) and split-supply (RB from base to 0 V,
RC, RE to the emitter rail --vee). "any" searches every one (split supply
only with --vee), ranks their builds on one scale, names each build's
topology and says in one line why the first beats the best of each other
topology. For split supply the supply span is VCC + VEE and the emitter
term does not apply (VEE sets the emitter resistor's drop).

A PNP stage runs from a positive supply by default (emitter side to +V,
collector side to 0 V); --rail negative, or a negative --vcc, puts its
emitter side on 0 V and its collector side on -V. A split-supply stage is
measured from the common of its two supplies (PNP: collector rail -V,
emitter rail +V). Every voltage shown is what a meter reads against 0 V,
and each resistor says what it joins.

A repair keeps the resistors still good on the board and fills the rest
from stock: --keep r1=47K,r2=10K names positions of the topology (r1, r2,
rc, re for the divider; rf, rc, re for collector feedback; rb, rc, re for
split supply) and their values, which need not be stocked. A kept part is
never taken from stock. Give its tolerance and rating if known
(r1=47K/5%/0.25W); otherwise it is taken as ±` + keptDefaults + `,
conservative for a part of unknown make and age, and every kept part with
a TCR of ` + fmt.Sprint(picker.KeptTCR_PPMPerK) + ` ppm/K. With --topology any only the topologies having
every kept position are searched (a kept r1 means the divider; rc and re
are in all three).

Without --vce the target VCE is, for each build, the one that gives the
largest symmetrical swing on its load lines:
  VCE = VCE(sat) + (VCC - VCE(sat)) * r_ac / (R_dc + r_ac)
with R_dc = RC + RE and r_ac = RC‖RL, plus RE unless --bypass. With no
--load and no --bypass that is the mid-point (VCC + VCE(sat)) / 2.

The emitter resistor takes a slice of the supply: builds whose emitter
voltage falls outside --ve (default 5 % to 20 % of the supply, about a tenth
being the usual choice) pay the emitter term, the distance outside the band
as a share of the supply.

` + report.YieldHelp + `
Here --ic-window 10% is a band around --ic, --vce-window 4V..8V a range;
without --vce a VCE percentage is of each build's VCE target. --boards is
the boards to build, --sim-boards the boards simulated per build.

Ranking weights (--weights NAME=VALUE,...; NAME one of q, emitter, beta,
headroom, util, yield, parts): every term is at least 0 and lower is better; the score is
their weighted sum. A weight of 0 ignores a term; negative weights are
refused. Terms left out keep their defaults: ` + weightsHelp() + `.

Hard limits: a build fails when any worst-case corner leaves the active
region or comes within the margin of VCE(sat), when any part runs over its
derated, margined rating or IC over IC max at a corner, or when the board
on the bench at 25 °C (marked values, hFE min, typical or max) leaves the
active region or the margin, whatever --ambient says. A failing build never
ranks above a passing one (--show-failing lists them with the reason).
A transistor line that does not state VCEO, a power rating (PD or θJA) or,
above 50 mA, IC max is left out: nothing can say a build on it survives.
--allow-unrated lets it in, and every build on it names what is unknown.

When nothing fits, pick writes the reasons and the parts to buy on stderr,
the nearest builds on stdout, and exits 1. The nearest builds are those that
break a limit (each with the reason), or, when the stock is short for the
number of boards, the best builds for the most boards it does supply, with
the extra parts all boards would take.
Bad flags exit 2. pick never changes the stock; it keeps the builds it lists
in the stock file for ` + strconv.Itoa(store.PickKeepDays) + ` days, so that "biasbin build new ID --boards N"
can take their parts out of stock later.

` + report.Ranges(append([]solver.Range{solver.SupplyRange}, picker.RequestRanges()...)),
		Example: `  biasbin pick --vcc 12V --ic 2mA
  biasbin pick --vcc 9V --ic 500uA --polarity pnp --boards 20 --pairs
  biasbin pick --vcc 15V --ic 1mA --vce 6V --load 10K --bypass --weights q=2,yield=0.5 --json
  biasbin pick --vcc 12V --vee 12V --ic 1mA --topology split-supply
  biasbin pick --vcc 9V --ic 1mA --topology any
  biasbin pick --vcc 12V --ic 1mA --keep r1=47K,r2=10K`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) > 0 {
				return cmdutil.Usagef("pick takes no arguments, only flags (got %q); e.g. biasbin pick --vcc 12V --ic 2mA", args[0])
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			if runF != nil {
				return runF(o)
			}
			return Run(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	o.Changed = fl.Changed
	fl.StringVar(&o.VCC, "vcc", "", "supply voltage, e.g. 12V (a magnitude; -12V builds a PNP stage on a negative rail, see --rail), or the range it moves over, e.g. 7V..9.6V for a 9 V battery (then no --vcc-tol)")
	fl.StringVar(&o.Rail, "rail", "", stageflags.RailHelp)
	fl.StringVar(&o.VCCTol, "vcc-tol", defaultVCCTol, "supply tolerance")
	fl.StringVar(&o.IC, "ic", "", "target collector current, e.g. 2mA")
	fl.StringVar(&o.VCE, "vce", "", "target VCE (default: the maximum-symmetrical-swing rule, see above)")
	fl.StringVar(&o.VE, "ve", "", "the voltage across RE, MIN..MAX or a single value (default 5 % to 20 % of the supply); VE itself for a stage with its emitter side on 0 V, +V minus VE for a PNP stage on a positive supply")
	fl.StringVar(&o.Polarity, "polarity", "npn", "transistor polarity: npn or pnp")
	fl.StringVar(&o.Topology, "topology", "divider", "bias circuit: divider, collector-feedback, split-supply, or any (every one, ranked on one scale)")
	fl.StringVar(&o.VEE, "vee", "", "emitter rail of the split-supply stage, e.g. 12V (a magnitude, taken opposite to --vcc), or the range it moves over, e.g. 7V..9.6V (then no --vee-tol)")
	fl.StringVar(&o.VEETol, "vee-tol", "", "emitter rail tolerance (default: --vcc-tol's); the two rails are taken as two supplies, each varied on its own")
	fl.StringVar(&o.Ambient, "ambient", defaultAmbient, "ambient temperature range in °C, MIN..MAX")
	fl.IntVar(&o.Boards, "boards", defaultBoards, "boards to build; every part is needed this many times")
	fl.StringVar(&o.Load, "load", "", "AC load on the collector, e.g. 10K (for the AC load line)")
	fl.BoolVar(&o.Bypass, "bypass", false, "RE is bypassed by a capacitor for AC")
	fl.StringVar(&o.ICWindow, "ic-window", defaultICWindow, "yield window for IC: ±percent of --ic, or MIN..MAX")
	fl.StringVar(&o.VCEWindow, "vce-window", defaultVCEWindow, "yield window for VCE: ±percent of --vce (or of each build's VCE target), or MIN..MAX")
	fl.IntVar(&o.SimBoards, "sim-boards", picker.DefaultYieldBoards, "simulated boards of each build's Monte Carlo yield (the same flag in check)")
	fl.StringVar(&o.Weights, "weights", "", "ranking weights NAME=VALUE,... (default "+weightsHelp()+")")
	fl.BoolVar(&o.Pairs, "pairs", false, "also use series and parallel pairs of two stocked resistors")
	fl.StringArrayVar(&o.RequireTags, "require-tag", nil, "use only parts carrying this tag (repeatable; a tag matches in any letter case)")
	fl.StringVar(&o.Transistor, "transistor", "", "use only the transistor line(s) with this label (letter case aside), e.g. for a repair")
	fl.StringArrayVar(&o.Keep, "keep", nil, "keep resistors already on the board, POSITION=VALUE,... e.g. r1=47K,r2=10K/5%/0.25W (see above)")
	fl.IntVar(&o.Top, "top", defaultTop, "how many builds to show")
	fl.BoolVar(&o.Exhaustive, "exhaustive", false, "evaluate every combination instead of the pruned search")
	fl.BoolVar(&o.Settle, "settle", false, "search on until the order of the listed builds is proven (see 'order' in the output; slow when yields are low)")
	fl.DurationVar(&o.TimeLimit, "time-limit", picker.DefaultTimeLimit, "stop searching after this long and list the best builds found, saying so (0: search to the end)")
	fl.BoolVar(&o.ShowFailing, "show-failing", false, "also show builds that break a hard limit, with the reason")
	fl.BoolVar(&o.All, "all", false, "list near-duplicate builds (the same values with another tolerance grade, rating or drawer) each in its own place instead of folding them into the best one")
	fl.BoolVar(&o.AllowUnrated, "allow-unrated", false, "also use transistors that state no VCEO or power rating (each such build says what is unknown)")
	fl.Uint64Var(&o.Seed, "seed", defaultSeed, "seed of the Monte Carlo yield runs")
	fl.BoolVar(&o.JSON, "json", false, "write the result as JSON")
	fl.StringVar(&o.Plot, "plot", "", "also draw the first build's load-line picture to FILE (.svg, .png or .pdf; see biasbin plot)")
	fl.IntVar(&o.Compare, "compare", 0, fmt.Sprintf("with --plot: overlay the first N builds (2 to %d) in one picture", picture.MaxCompare))
	fl.StringVar(&o.PlotSize, "plot-size", "", fmt.Sprintf("size of the --plot picture in pixels, WIDTHxHEIGHT (default %dx%d)", picture.DefaultSize.Width_px, picture.DefaultSize.Height_px))
	return cmd
}

// keptDefaults is the tolerance and rating a kept part is taken with when
// it states none (picker.KeptPart.Spec), for --help.
var keptDefaults = strings.TrimSuffix(percent(picker.KeptDefaultTol), " %") + " % and " + quantity(picker.KeptDefaultRated_W, "W")

// Run executes a pick with o; tests call it with buffer streams.
func Run(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	req, err := o.request()
	if err != nil {
		return err
	}
	pic, err := o.pictureOptions()
	if err != nil {
		return err
	}
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	stock, err := stockparts.Read(ctx, db)
	if err != nil {
		return err
	}
	done := func() {}
	if o.IO.IsStderrTTY() {
		now := o.Now
		if now == nil {
			now = time.Now
		}
		p := newProgress(o.IO.ErrOut, now)
		req.Progress, done = p.update, p.finish
		defer p.finish() // on the error paths; finishing twice is harmless
	}
	out, err := job.Pick(stock, req, o.Pick)
	if err != nil {
		return pickError(err)
	}
	done() // erase the indicator before any output
	out.Request.Progress = nil
	if err := buildjob.KeepPick(ctx, db, out, stock); err != nil {
		fmt.Fprintf(o.IO.ErrOut, "warning: the builds are not kept, so build new cannot take their IDs: %v\n", err)
	}
	if o.JSON {
		if err := writeJSON(o.IO.Out, out); err != nil {
			return fmt.Errorf("write JSON: %w", err)
		}
	} else {
		WriteText(o.IO.Out, out, StyleFor(o.IO))
	}
	WriteNotes(o.IO.ErrOut, out)
	if pic != nil {
		if err := pic.write(o.IO, out); err != nil {
			return err
		}
	}
	if !out.Fits {
		return cmdutil.ErrSilent
	}
	return nil
}
