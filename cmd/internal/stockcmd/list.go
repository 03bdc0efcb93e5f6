package stockcmd

import (
	"context"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/solver"
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
	// Value, when not empty, asks for one resistor value or a range
	// ("6K8", "4K..5K"): the lines in it and the nearest either side.
	Value string
	// Long adds the limiting element voltage and the note to each line.
	Long bool
}

func newListCmd(f *cmdutil.Factory, runF func(*ListOptions) error) *cobra.Command {
	o := &ListOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "list",
		Short: "List the stock, resistors by value then transistors by label",
		Example: `  biasbin stock list
  biasbin stock list --kind resistor --bin A3
  biasbin stock list --tag approved --json
  biasbin stock list --value 6K8
  biasbin stock list --value 4K..5K --long`,
		Args: usageArgs(cobra.NoArgs),
		RunE: func(cmd *cobra.Command, _ []string) error {
			k, err := parseKind(o.Kind, true)
			if err != nil {
				return err
			}
			o.Kind = string(k)
			if o.Value != "" {
				if k == store.KindTransistor {
					return cmdutil.Usagef("--value looks for resistors; leave out --kind transistor")
				}
				o.Kind = string(store.KindResistor)
			}
			if runF != nil {
				return runF(o)
			}
			return runList(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.Kind, "kind", "", "only resistor or transistor lines")
	fl.StringVar(&o.Bin, "bin", "", "only lines in this bin")
	fl.StringSliceVar(&o.Tags, "tag", nil, "only lines carrying this tag (repeatable: all must match; a tag matches in any letter case)")
	fl.StringVar(&o.Value, "value", "", "resistors of this value or range (6K8, 4K..5K), with the nearest stocked values either side")
	fl.BoolVar(&o.Long, "long", false, "also show each line's limiting element voltage and note")
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
	// Value is the value or range asked for with --value (omitted without).
	Value       *jsonValueQuery  `json:"value,omitempty"`
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
	var how []store.ValueMatch
	var q *jsonValueQuery
	if o.Value != "" {
		lo, hi, err := notation.ParseRange(o.Value, notation.ParseOhms)
		if err != nil {
			return cmdutil.Usagef("--value: %v", err)
		}
		if !(lo > 0) {
			return cmdutil.Usagef("--value %s: a resistance above 0 Ω", o.Value)
		}
		rs, how = store.NearValues(rs, lo, hi)
		q = &jsonValueQuery{Lo_Ohm: lo, Hi_Ohm: hi, Stocked: slices.Contains(how, store.MatchIn)}
	}
	match := func(i int) string {
		if how == nil {
			return ""
		}
		return how[i].String()
	}
	if o.JSON {
		out := listResult{Value: q, Resistors: []jsonResistor{}, Transistors: []jsonTransistor{}}
		for i, r := range rs {
			jr := toJSONResistor(r)
			jr.Match = match(i)
			out.Resistors = append(out.Resistors, jr)
		}
		for _, t := range ts {
			out.Transistors = append(out.Transistors, toJSONTransistor(t))
		}
		return writeJSON(o.IO.Out, out)
	}
	if q != nil && !q.Stocked {
		fmt.Fprintf(o.IO.ErrOut, "no line of %s in stock", o.Value)
		if len(rs) > 0 {
			fmt.Fprint(o.IO.ErrOut, "; the nearest either side are listed")
		}
		fmt.Fprintln(o.IO.ErrOut)
	}
	if len(rs) == 0 && len(ts) == 0 {
		_, err := fmt.Fprintln(o.IO.ErrOut, "no parts in stock match")
		return err
	}
	w := tabwriter.NewWriter(o.IO.Out, 0, 0, 2, ' ', 0)
	if len(rs) > 0 {
		head := "ID\tRESISTOR\tTOL\tPOWER\tTECH\tTCR\tQTY\tBIN\tPART NO\tTAGS"
		if how != nil {
			head = "MATCH\t" + head
		}
		if o.Long {
			head += "\tLEV\tNOTE"
		}
		fmt.Fprintln(w, head)
		for i, r := range rs {
			if how != nil {
				fmt.Fprintf(w, "%s\t", matchWord[how[i]])
			}
			fmt.Fprintf(w, "%d\t%s\t%s\t%s\t%s\t%s\t%d\t%s\t%s\t%s", r.ID, notation.FormatResistanceExact(r.Ohm),
				notation.FormatTolerance(r.Tol), notation.FormatPower(r.Rated_W), r.Tech,
				notation.FormatTCR(r.TCR_PPMPerK), r.Qty, orDash(r.Bin), orDash(r.PartNumber), orDash(strings.Join(r.Tags, ",")))
			if o.Long {
				lev := "-"
				if r.LEV_V > 0 {
					lev = notation.FormatVoltage(r.LEV_V)
				}
				fmt.Fprintf(w, "\t%s\t%s", lev, orDash(oneLine(r.Note)))
			}
			fmt.Fprintln(w)
		}
	}
	if len(rs) > 0 && len(ts) > 0 {
		fmt.Fprintln(w)
	}
	if len(ts) > 0 {
		head := "ID\tTRANSISTOR\tPOL\tHFE\tVBE(ON)\tVCEO\tPD\tQTY\tBIN\tPART NO\tTAGS"
		if o.Long {
			head += "\tVBE(ON) PART TO PART\tEARLY VOLTAGE\tNOTE"
		}
		fmt.Fprintln(w, head)
		for _, t := range ts {
			fmt.Fprintf(w, "%d\t%s\t%s\t%s\t%s\t%s\t%s\t%d\t%s\t%s\t%s", t.ID, t.Label, t.Polarity, hfeText(t),
				notation.FormatVoltage(t.VBEOn_V)+" @ "+notation.FormatCurrent(t.VBEAt_A),
				unknownOr(t.VCEO_V, notation.FormatVoltage), unknownOr(t.PD25_W, notation.FormatPower),
				t.Qty, orDash(t.Bin), orDash(t.PartNumber), orDash(strings.Join(t.Tags, ",")))
			if o.Long {
				fmt.Fprintf(w, "\t%s\t%s\t%s", vbeSpreadText(t), vafText(t), orDash(oneLine(t.Note)))
			}
			fmt.Fprintln(w)
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

// jsonValueQuery is what --value asked for in --json output.
type jsonValueQuery struct {
	Lo_Ohm float64 `json:"lo_ohms"`
	Hi_Ohm float64 `json:"hi_ohms"`
	// Stocked is true when some line lies in the value or range.
	Stocked bool `json:"stocked"`
}

// matchWord is the MATCH column of `stock list --value`.
var matchWord = map[store.ValueMatch]string{store.MatchIn: "yes", store.MatchBelow: "nearest below", store.MatchAbove: "nearest above"}

// oneLine writes a note on one line of a table.
func oneLine(s string) string { return strings.Join(strings.Fields(s), " ") }

// vbeSpreadText writes the stocked VBE(on) range, or the default spread
// the solver assumes when none is stocked.
func vbeSpreadText(t store.Transistor) string {
	if t.VBEMin_V > 0 && t.VBEMax_V > 0 {
		return notation.FormatBand(t.VBEMin_V, t.VBEMax_V, "V")
	}
	return "±" + notation.FormatVoltage(solver.DefaultVBESpread_V) + " (default)"
}

// vafText writes the stocked Early-voltage range, the single value, or "-"
// (infinite).
func vafText(t store.Transistor) string {
	if t.VAFMin_V > 0 && t.VAFMax_V > 0 {
		return notation.FormatBand(t.VAFMin_V, t.VAFMax_V, "V")
	}
	return unknownOr(t.VAF_V, notation.FormatVoltage)
}
