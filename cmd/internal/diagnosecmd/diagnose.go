// Package diagnosecmd implements `biasbin diagnose`: a stage, the
// transistor fitted in it and the voltages measured on the faulty unit,
// and the single faults that explain them, ranked by how well each
// re-solved circuit matches the readings, with the check that tells the
// top two apart.
package diagnosecmd

import (
	"context"
	"fmt"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/repair"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Options are the diagnose command's inputs.
type Options struct {
	IO    *cmdutil.IOStreams
	Store func(context.Context) (*store.DB, error)

	Stage     stageflags.Stage
	Device    stageflags.Device
	Readings  stageflags.Readings
	VBESpread string
	Top       int
	JSON      bool
}

// Defaults shown in --help.
const (
	defaultVBESpread = "30mV"
	defaultTop       = 8
)

// New returns the diagnose command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "diagnose --vcc V --r1 R ... (--transistor LABEL | --hfe MIN..MAX) --vb V --ve V --vc V [flags]",
		Short: "Find the faulty part of a stage from the voltages measured on it",
		Long: `Rank the single faults that explain the base, emitter and collector voltages
measured (to ground) on a faulty stage. Give the stage as it should be (as
for check: topology, supply, resistor values) and the transistor fitted
(--transistor LABEL from the stock, or inline --hfe ...).

Each fault is re-solved exactly and compared with the readings: every
resistor open, shorted, or drifted to the value that fits best; the
transistor's base-emitter or base-collector junction open or shorted,
collector-emitter shorted, collector-base leakage, hFE far below its range.
The transistor's hFE is fitted within its range and its VBE(on) within
--vbe-spread of the datasheet figure; each reading is predicted with the
meter's input resistance (--meter-input) on that node.

FIT is the worst of the three readings' deviations in units of the meter
accuracy (--meter, ±(1 % of the reading + 10 mV) by default): 1 or less
means every predicted reading lies within the meter's accuracy of what was
read. The readings are explained when the best fault fits within 1; the
next measurement named tells the top two apart.

Exit status: 0 when ranked (explained or not), 1 when a reading cannot
come from the stage (outside its rails), 2 for bad flags.`,
		Example: `  biasbin diagnose --vcc 12V --r1 47K --r2 10K --rc 4K7 --re 1K --hfe 100..300 --vb 3.31V --ve 2.61V --vc 2.68V
  biasbin diagnose --topology split-supply --vcc 12V --vee 12V --rb 22K --rc 5K6 --re 10K --transistor QN-230 --vb -0.05V --ve -0.7V --vc 12V --json`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) > 0 {
				return cmdutil.Usagef("diagnose takes no arguments, only flags (got %q)", args[0])
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
	o.Device.AddFlags(fl, "transistor", "the transistor fitted, by stock label (any letter case)", "inline transistor")
	o.Readings.AddFlags(fl, "the faulty unit")
	fl.StringVar(&o.VBESpread, "vbe-spread", defaultVBESpread, "part-to-part VBE(on) spread the fit allows around the datasheet figure")
	fl.IntVar(&o.Top, "top", defaultTop, "faults shown in the table (--json lists all)")
	fl.BoolVar(&o.JSON, "json", false, "write every figure as JSON (SI base units)")
	return cmd
}

// Request turns the flags into a diagnosis request.
func (o *Options) Request(ctx context.Context) (repair.DiagnoseRequest, error) {
	var req repair.DiagnoseRequest
	d, _, err := o.Device.Datasheet(ctx, o.Store)
	if err != nil {
		return req, err
	}
	req.Device = d
	b, err := o.Stage.Build(ctx, d.Polarity, o.Store)
	if err != nil {
		return req, err
	}
	req.Stage = b.NominalStage()
	if err := req.Stage.Validate(d.Polarity); err != nil {
		return req, stageflags.InputError(err)
	}
	if req.Readings, req.Settings.Meter, err = o.Readings.Parse(); err != nil {
		return req, err
	}
	if req.Settings.VBESpread_V, err = notation.ParseVoltage(o.VBESpread); err != nil {
		return req, stageflags.Usage("vbe-spread", err)
	}
	if !(req.Settings.VBESpread_V > 0) || req.Settings.VBESpread_V > 0.2 {
		return req, stageflags.Usagef("vbe-spread", "%q: want above 0 up to 0.2 V", o.VBESpread)
	}
	if o.Top < 1 {
		return req, stageflags.Usagef("top", "%d: want 1 or more", o.Top)
	}
	return req, nil
}

// Run executes a diagnosis with o; tests call it with buffer streams.
func Run(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	req, err := o.Request(ctx)
	if err != nil {
		return err
	}
	res, err := repair.Diagnose(req)
	if err != nil {
		return stageflags.JobError("diagnose", err)
	}
	if o.JSON {
		if err := WriteJSON(o.IO.Out, req, res); err != nil {
			return fmt.Errorf("diagnose: write JSON: %w", err)
		}
	} else {
		WriteText(o.IO.Out, req, res, o.Top)
	}
	for _, c := range res.Cautions {
		fmt.Fprintln(o.IO.ErrOut, "caution:", report.BenchCaution(c))
	}
	return nil
}
