package stockcmd

import (
	"context"
	"fmt"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/solver/notation"
	"biasbin/store"
)

// ListOptions are the flags of `stock list`.
type ListOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	Kind string // "", "resistor" or "transistor"
	Bin  string
	Tags []string
}

func newListCmd(f *cmdutil.Factory, runF func(*ListOptions) error) *cobra.Command {
	o := &ListOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "list",
		Short: "List the stock, resistors by value then transistors by label",
		Example: `  biasbin stock list
  biasbin stock list --kind resistor --bin A3
  biasbin stock list --tag approved --json`,
		Args: usageArgs(cobra.NoArgs),
		RunE: func(cmd *cobra.Command, _ []string) error {
			k, err := parseKind(o.Kind, true)
			if err != nil {
				return err
			}
			o.Kind = string(k)
			if runF != nil {
				return runF(o)
			}
			return runList(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.Kind, "kind", "", "only resistor or transistor lines")
	fl.StringVar(&o.Bin, "bin", "", "only lines in this bin")
	fl.StringSliceVar(&o.Tags, "tag", nil, "only lines carrying this tag (repeatable: all must match)")
	fl.BoolVar(&o.JSON, "json", false, "print JSON (SI units: ohms, tol as a fraction, power_w ...)")
	return cmd
}

// parseKind reads --kind; "" is allowed when optional.
func parseKind(s string, optional bool) (store.Kind, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "resistor", "resistors", "r":
		return store.KindResistor, nil
	case "transistor", "transistors", "q":
		return store.KindTransistor, nil
	case "":
		if optional {
			return "", nil
		}
		return "", cmdutil.Usagef("--kind is required: resistor or transistor")
	}
	return "", cmdutil.Usagef("--kind %q: want resistor or transistor", s)
}

// listResult is the --json output of stock list.
type listResult struct {
	Resistors   []jsonResistor   `json:"resistors"`
	Transistors []jsonTransistor `json:"transistors"`
}

func runList(ctx context.Context, o *ListOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	filter := store.Filter{Bin: o.Bin, Tags: o.Tags}
	var rs []store.Resistor
	var ts []store.Transistor
	if o.Kind != string(store.KindTransistor) {
		if rs, err = db.ListResistors(ctx, filter); err != nil {
			return err
		}
	}
	if o.Kind != string(store.KindResistor) {
		if ts, err = db.ListTransistors(ctx, filter); err != nil {
			return err
		}
	}
	if o.JSON {
		out := listResult{Resistors: []jsonResistor{}, Transistors: []jsonTransistor{}}
		for _, r := range rs {
			out.Resistors = append(out.Resistors, toJSONResistor(r))
		}
		for _, t := range ts {
			out.Transistors = append(out.Transistors, toJSONTransistor(t))
		}
		return writeJSON(o.IO.Out, out)
	}
	if len(rs) == 0 && len(ts) == 0 {
		_, err := fmt.Fprintln(o.IO.ErrOut, "no parts in stock match")
		return err
	}
	w := tabwriter.NewWriter(o.IO.Out, 0, 0, 2, ' ', 0)
	if len(rs) > 0 {
		fmt.Fprintln(w, "ID\tRESISTOR\tTOL\tPOWER\tTECH\tTCR\tQTY\tBIN\tTAGS")
		for _, r := range rs {
			fmt.Fprintf(w, "%d\t%s\t%s\t%s\t%s\t%s\t%d\t%s\t%s\n", r.ID, notation.FormatResistanceExact(r.Ohm),
				notation.FormatTolerance(r.Tol), notation.FormatPower(r.Rated_W), r.Tech,
				notation.FormatTCR(r.TCR_PPMPerK), r.Qty, orDash(r.Bin), orDash(strings.Join(r.Tags, ",")))
		}
	}
	if len(rs) > 0 && len(ts) > 0 {
		fmt.Fprintln(w)
	}
	if len(ts) > 0 {
		fmt.Fprintln(w, "ID\tTRANSISTOR\tPOL\tHFE\tVBE(ON)\tVCEO\tPD\tQTY\tBIN\tTAGS")
		for _, t := range ts {
			fmt.Fprintf(w, "%d\t%s\t%s\t%s\t%s\t%s\t%s\t%d\t%s\t%s\n", t.ID, t.Label, t.Polarity, hfeText(t),
				notation.FormatVoltage(t.VBEOn_V)+" @ "+notation.FormatCurrent(t.VBEAt_A),
				unknownOr(t.VCEO_V, notation.FormatVoltage), unknownOr(t.PD25_W, notation.FormatPower),
				t.Qty, orDash(t.Bin), orDash(strings.Join(t.Tags, ",")))
		}
	}
	return w.Flush()
}

// hfeText writes the hFE window: "110..800 @ 2 mA".
func hfeText(t store.Transistor) string {
	s := strconv.FormatFloat(t.HFEMin, 'g', 4, 64) + ".." + strconv.FormatFloat(t.HFEMax, 'g', 4, 64)
	if t.HFEAt_A > 0 {
		s += " @ " + notation.FormatCurrent(t.HFEAt_A)
	}
	return s
}

// unknownOr writes "-" for 0 (not given), else format(v).
func unknownOr(v float64, format func(float64) string) string {
	if v == 0 {
		return "-"
	}
	return format(v)
}
