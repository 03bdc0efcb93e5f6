package buildcmd

import (
	"context"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// ShowOptions are the arguments of `build show`.
type ShowOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool
	ID    int64
}

func newShowCmd(f *cmdutil.Factory, runF func(*ShowOptions) error) *cobra.Command {
	o := &ShowOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "show ID [--json]",
		Short: "Show a build: parts by bin, what it was picked for, test-point bands, every board",
		Long: `Show build ID: its state, the request and the figures it was picked with,
the parts it took by bin, the voltages every board should measure to ground
(VB, VE, VC, each with the band the worst-case corners span: hFE spread,
part tolerances, supply tolerance and the ambient range), and every board's
readings and verdict.`,
		Example: "  biasbin build show 3\n  biasbin build show 3 --json",
		Args:    oneBuildID("show"),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseBuildID(args[0])
			if err != nil {
				return err
			}
			o.ID = id
			if runF != nil {
				return runF(o)
			}
			return runShow(cmd.Context(), o)
		},
	}
	cmd.Flags().BoolVar(&o.JSON, "json", false,
		"print the build as JSON: id, candidate, state, created, note, board_count, request, figures, parts[], bands, boards[] (every board of the run; unmeasured ones have verdict \"unmeasured\"), cautions[]")
	return cmd
}

func runShow(ctx context.Context, o *ShowOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	v, err := buildjob.Show(ctx, db, o.ID)
	if err != nil {
		return err
	}
	if o.JSON {
		return writeJSON(o.IO.Out, showJSON(v))
	}
	writeShow(o.IO.Out, v)
	return nil
}

// writeShow writes a build for reading.
func writeShow(w io.Writer, v buildjob.View) {
	p := v.Plan
	fmt.Fprintf(w, "build %d: %s, %d board%s of %s, created %s UTC", v.ID, v.State, v.Boards, plural(v.Boards),
		v.Candidate, v.Created.UTC().Format("2006-01-02 15:04"))
	if !v.Ended.IsZero() {
		fmt.Fprintf(w, ", %s %s UTC", v.State, v.Ended.UTC().Format("2006-01-02 15:04"))
	}
	fmt.Fprintln(w)
	if v.Note != "" {
		fmt.Fprintf(w, "note: %s\n", v.Note)
	}
	fmt.Fprintf(w, "picked for: %s\n", requestWords(p))
	f := p.Figures
	yield := fmt.Sprintf("%.1f %%", 100*f.Yield) // a plan kept before the interval was
	if f.YieldBoards > 0 {
		y := solver.YieldResult{Boards: f.YieldBoards, Pass: f.YieldPassed, Yield: f.Yield, Low95: f.YieldLow95, High95: f.YieldHigh95}
		yield = report.Yield(y) + " of " + report.Count(f.YieldBoards) + " simulated boards"
	}
	fmt.Fprintf(w, "as picked: IC %s (%s .. %s worst case), VCE %s (%s .. %s), yield %s\n",
		notation.FormatCurrent(f.IC_A), notation.FormatCurrent(f.ICMin_A), notation.FormatCurrent(f.ICMax_A),
		notation.FormatVoltage(f.VCE_V), notation.FormatVoltage(f.VCEMin_V), notation.FormatVoltage(f.VCEMax_V), yield)
	if f.Window != nil {
		fmt.Fprintf(w, "yield window: %s\n", report.Window(*f.Window))
	}
	fmt.Fprintf(w, "stage: %s, transistor %s\n", stageWords(p), p.Build.Device.Label)
	writeCautions(w, "", p.Cautions)
	fmt.Fprintln(w, "\nparts by bin:")
	writeParts(w, v)
	fmt.Fprintf(w, "\ntest points per board, to 0 V at %s (band: worst case over hFE spread, tolerances, supply, ambient):\n",
		report.ZeroV(p.Build.Topology, p.Build.Ground))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	for _, tp := range []struct {
		name string
		b    buildjob.Band
	}{{"VB", p.Bands.VB}, {"VE", p.Bands.VE}, {"VC", p.Bands.VC}} {
		fmt.Fprintf(tw, "  %s\t%s\t%s\n", tp.name, notation.FormatVoltage(tp.b.Nominal_V), bandWords(tp.b))
	}
	tw.Flush()
	fmt.Fprintln(w, "\nboards:")
	for _, rd := range boardsOf(v) {
		if rd.Verdict == "" {
			fmt.Fprintf(w, "  board %d: not measured\n", rd.Board)
			continue
		}
		writeReading(w, "  ", rd, p.Bands)
	}
}

// requestWords says what a build was picked for.
// stageWords writes each resistor position with its value and what it
// joins: "R1 51K (+V to base), RE 6K8‖6K8 parallel pair (emitter to 0 V)".
func stageWords(p buildjob.Plan) string {
	joins := map[string]string{}
	for _, j := range job.Joins(p.Build) {
		joins[j.Slot.String()] = report.Join(j)
	}
	var stage []string
	for _, s := range p.Slots {
		arr := ""
		switch s.Arrangement {
		case picker.Single:
		case picker.Kept:
			arr = " kept on the board"
		default:
			arr = " " + s.Arrangement + " pair"
		}
		stage = append(stage, fmt.Sprintf("%s %s%s (%s)", strings.ToUpper(s.Slot), notation.FormatResistance(s.Ohm), arr, joins[s.Slot]))
	}
	return strings.Join(stage, ", ")
}

func requestWords(p buildjob.Plan) string {
	r, b := p.Request, p.Build
	vce := "VCE for the largest swing"
	if r.VCE_V != 0 {
		vce = "VCE " + notation.FormatVoltage(r.VCE_V)
	}
	s := fmt.Sprintf("%s, VCC %s %s (%s), IC %s, %s, ambient %s .. %s", strings.ToUpper(b.Device.Polarity.String()),
		notation.FormatVoltage(b.Ground.Supply_V(b.VCC_V)), notation.FormatTolerance(b.VCCTol),
		report.Rail(b.Device.Polarity, solver.RailOf(b.Device.Polarity, b.Topology, b.Ground)), notation.FormatCurrent(r.IC_A), vce,
		notation.FormatTemperature(b.AmbientMin_C), notation.FormatTemperature(b.AmbientMax_C))
	if r.Pairs {
		s += ", pairs allowed"
	}
	if len(r.RequireTags) > 0 {
		s += ", only parts tagged " + strings.Join(r.RequireTags, " and ")
	}
	return s
}
