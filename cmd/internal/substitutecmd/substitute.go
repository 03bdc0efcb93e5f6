// Package substitutecmd implements `biasbin substitute`: a stage with a
// dead transistor, what is known of its original operating point (the
// original's ranges, a working twin's voltages, or both), and every
// stocked transistor of the same polarity ranked as its replacement, with
// the one resistor change from stock that re-centres the best ones when
// none keeps IC within the tolerance.
package substitutecmd

import (
	"context"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/cmd/internal/stageflags"
	"biasbin/cmd/internal/stockparts"
	"biasbin/picker/repair"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Options are the substitute command's inputs.
type Options struct {
	IO    *cmdutil.IOStreams
	Store func(context.Context) (*store.DB, error)

	Stage    stageflags.Stage
	Original stageflags.Device
	Twin     stageflags.Readings
	ICTol    string
	Pairs    bool
	Top      int
	JSON     bool
}

// Defaults shown in --help.
const (
	defaultICTol = "10%"
	defaultTop   = 10
)

// New returns the substitute command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "substitute --vcc V --r1 R ... (--original LABEL | --hfe MIN..MAX | --vb V --ve V --vc V) [flags]",
		Short: "Rank stocked transistors as the replacement for a dead one in an existing stage",
		Long: `Replace a dead transistor from the drawers. Give the stage as it is on the
board (topology, supply, resistor values, as for check) and what is known
of its original operating point: the original transistor's ranges
(--original LABEL from the stock, or inline --hfe, --vbe ...), the
voltages measured on a working twin channel (--vb --ve --vc, to 0 V as the
meter shows them; see --rail), or both. With a twin, the original IC is
read from the drop on RE and from the drop on RC and the two must agree within the meter accuracy (--meter) and
the resistor and supply tolerances; the twin's figure is then the target.

Every stocked transistor of the stage's polarity with parts on hand is
solved in the stage and ranked: limits broken last, then by the nominal IC
shift from the original, the worst-case shift, the quantity on hand. The
margins shown: VCE above VCE(sat) at the worst corner, VCEO above the
supply span, and the transistor's worst-case dissipation as a share of its
derated allowance at the stage's ambient (--ambient).

When no stocked part keeps IC within --ic-tol, the best substitutes each
get the one resistor change (one position, one stocked part or pair) that
brings the nominal Q-point nearest the original's (the larger of the IC
and VCE shifts), shown before and after.

Exit status: 0 when ranked, 1 when the readings cannot come from the
stage (the message names the reading) or nothing could be ranked, 2 for
bad flags.`,
		Example: `  biasbin substitute --vcc 12V --r1 47K --r2 10K --rc 4K7 --re 1K --vb 2.03V --ve 1.38V --vc 5.52V
  biasbin substitute --topology collector-feedback --vcc 12V --rf 470K --rc 4K7 --hfe 100..160 --json
  biasbin substitute --polarity pnp --vcc 9V --r1 33K --r2 10K --rc 2K2 --re 820R --original QP-77`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) > 0 {
				return cmdutil.Usagef("substitute takes no arguments, only flags (got %q)", args[0])
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
	o.Stage.AddFlags(fl)
	o.Original.AddFlags(fl, "original", "the original (dead) transistor by stock label, for its ranges", "original")
	o.Twin.AddFlags(fl, "a working twin")
	fl.StringVar(&o.ICTol, "ic-tol", defaultICTol, "IC shift a substitute may bring before a resistor change is proposed")
	fl.BoolVar(&o.Pairs, "pairs", true, "let the resistor change use series and parallel pairs of stocked parts")
	fl.IntVar(&o.Top, "top", defaultTop, "substitutes shown in the table (--json lists all)")
	fl.BoolVar(&o.JSON, "json", false, "write every figure as JSON (SI base units)")
	return cmd
}

// Request turns the flags into a substitution request (the stock read
// with read).
func (o *Options) Request(ctx context.Context) (repair.SubstituteRequest, error) {
	var req repair.SubstituteRequest
	pol, err := o.Original.PolarityOf()
	if err != nil {
		return req, err
	}
	if o.Original.Given() {
		d, _, err := o.Original.Datasheet(ctx, o.Store)
		if err != nil {
			return req, err
		}
		req.Original, pol = &d, d.Polarity
	}
	req.Polarity = pol
	if req.Build, err = o.Stage.Build(ctx, pol, o.Store); err != nil {
		return req, err
	}
	if o.Twin.Given() {
		r, m, err := o.Twin.Parse()
		if err != nil {
			return req, err
		}
		req.Twin, req.Meter = &r, m
	}
	if req.Original == nil && req.Twin == nil {
		return req, cmdutil.Usagef("give the original's ranges (--original LABEL, or --hfe MIN..MAX ...), a working twin's --vb --ve --vc, or both")
	}
	if req.Tolerance, err = notation.ParseTolerance(o.ICTol); err != nil {
		return req, stageflags.Usage("ic-tol", err)
	}
	if req.Tolerance <= 0 {
		return req, stageflags.Usagef("ic-tol", "%q: want a tolerance above 0", o.ICTol)
	}
	if o.Top < 1 {
		return req, stageflags.Usagef("top", "%d: want 1 or more", o.Top)
	}
	req.Pairs = o.Pairs
	if err := req.Build.NominalStage().Validate(pol); err != nil {
		return req, stageflags.InputError(err)
	}
	if o.Store == nil {
		return req, errors.New("substitute: no stock available")
	}
	db, err := o.Store(ctx)
	if err != nil {
		return req, err
	}
	if req.Stock, err = stockparts.Read(ctx, db); err != nil {
		return req, fmt.Errorf("substitute: %w", err)
	}
	return req, nil
}

// Run executes a substitution with o; tests call it with buffer streams.
func Run(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	req, err := o.Request(ctx)
	if err != nil {
		return err
	}
	res, err := repair.Substitute(req)
	if err != nil {
		return stageflags.JobError("substitute", err)
	}
	if o.JSON {
		if err := WriteJSON(o.IO.Out, req, res); err != nil {
			return fmt.Errorf("substitute: write JSON: %w", err)
		}
	} else {
		WriteText(o.IO.Out, res, o.Top)
	}
	writeCautions(o.IO.ErrOut, res.Cautions)
	if len(res.Candidates) == 0 {
		fmt.Fprintf(o.IO.ErrOut, "biasbin: substitute: no %v transistor with parts on hand in the stock\n", req.Polarity)
		return cmdutil.ErrSilent
	}
	return nil
}

// writeCautions prints the bench cautions to w.
func writeCautions(w io.Writer, cs []repair.Caution) {
	for _, c := range cs {
		fmt.Fprintln(w, "caution:", report.BenchCaution(c))
	}
}
