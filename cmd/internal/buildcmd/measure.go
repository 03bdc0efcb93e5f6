package buildcmd

import (
	"context"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/solver/fault"
	"biasbin/solver/notation"
)

// MeasureOptions are the arguments of `build measure`.
type MeasureOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	ID       int64
	Board    int
	VB, VE   string
	VC       string
	Readings fault.Readings
}

func newMeasureCmd(f *cmdutil.Factory, runF func(*MeasureOptions) error) *cobra.Command {
	o := &MeasureOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "measure ID --board K --vb V --ve V --vc V",
		Short: "Record a board's bring-up readings and judge them against the bands",
		Long: `Record the DC voltages of board K of build ID, measured to 0 V with the
board powered: VB at the base, VE at the emitter, VC at the collector
(signed as the meter shows them against the 0 V the build sheet names:
positive on a stage built on a positive supply, PNP too). Each is checked against its band (the
worst case the build was picked with). When one lies outside, the stage is
solved again with each single part faulty (open, shorted or off its value;
the transistor's junctions open or shorted, leaking or low in hFE) and the
faults that explain the readings are ranked, most likely first, against a
meter of ±(1 % + 10 mV) with a 10 MΩ input. Measuring a board again
replaces its record.`,
		Example: "  biasbin build measure 3 --board 2 --vb 1.95 --ve 1.3 --vc 6.1",
		Args:    oneBuildID("measure"),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseBuildID(args[0])
			if err != nil {
				return err
			}
			o.ID = id
			if err := o.parse(cmd); err != nil {
				return err
			}
			if runF != nil {
				return runF(o)
			}
			return runMeasure(cmd.Context(), o)
		},
	}
	cmd.Flags().IntVar(&o.Board, "board", 0, "board number, 1 to the build's boards (required)")
	cmd.Flags().StringVar(&o.VB, "vb", "", "base voltage to 0 V as the meter shows it, e.g. 1.95 or 1.95V (required)")
	cmd.Flags().StringVar(&o.VE, "ve", "", "emitter voltage to 0 V (required)")
	cmd.Flags().StringVar(&o.VC, "vc", "", "collector voltage to 0 V (required)")
	cmd.Flags().BoolVar(&o.JSON, "json", false, "print the board's record as JSON (as in build show --json)")
	return cmd
}

// parse checks the flags and reads the voltages.
func (o *MeasureOptions) parse(cmd *cobra.Command) error {
	for _, name := range []string{"board", "vb", "ve", "vc"} {
		if !cmd.Flags().Changed(name) {
			return cmdutil.Usagef("build measure: --%s is required (e.g. --board 1 --vb 1.95 --ve 1.3 --vc 6.1)", name)
		}
	}
	if o.Board < 1 {
		return cmdutil.Usagef("--board %d: boards are numbered from 1", o.Board)
	}
	for _, v := range []struct {
		flag, text string
		dst        *float64
	}{{"vb", o.VB, &o.Readings.VB_V}, {"ve", o.VE, &o.Readings.VE_V}, {"vc", o.VC, &o.Readings.VC_V}} {
		x, err := notation.ParseVoltage(v.text)
		if err != nil {
			return cmdutil.Usagef("--%s %q: %v", v.flag, v.text, err)
		}
		*v.dst = x
	}
	return nil
}

func runMeasure(ctx context.Context, o *MeasureOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	rd, err := buildjob.Measure(ctx, db, o.ID, o.Board, o.Readings)
	var re *fault.ReadingError
	var be *buildjob.BoardError
	if errors.As(err, &be) {
		return cmdutil.Usagef("--board %d: %v; nothing was recorded", o.Board, be)
	}
	if errors.As(err, &re) {
		return cmdutil.Usagef("build %d board %d: --%s: %s; nothing was recorded", o.ID, o.Board, re.Reading, re.Problem)
	}
	if err != nil {
		return err
	}
	v, err := buildjob.Show(ctx, db, o.ID)
	if err != nil {
		return err
	}
	if o.JSON {
		return writeJSON(o.IO.Out, showJSON(v).Boards[rd.Board-1])
	}
	WriteMeasured(o.IO.Out, o.ID, rd, v.Plan.Bands)
	return nil
}

// WriteMeasured writes one board's record as build measure prints it.
func WriteMeasured(w io.Writer, id int64, rd buildjob.Reading, bands buildjob.Bands) {
	fmt.Fprintf(w, "build %d ", id)
	writeReading(w, "", rd, bands)
}
