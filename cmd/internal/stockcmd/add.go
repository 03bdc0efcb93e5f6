package stockcmd

import (
	"context"
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockcsv"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Defaults of `stock add resistor` for what a technician often leaves out.
const (
	defaultAddTol   = "5%"    // E24 parts are the common stock (common practice)
	defaultAddPower = "0.25W" // small film resistors (common practice)
)

// AddOptions are the flags of `stock add resistor|transistor`. Values are
// texts in any notation; they are read like a CSV row's columns.
type AddOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	Kind  store.Kind
	Value string // resistor VALUE or transistor LABEL
	// Fields holds the other values keyed by CSV column name.
	Fields map[string]string
	Qty    int
	Tags   []string
	// flagOf maps a CSV column to the flag that set it, for messages.
	flagOf map[string]string
}

func newAddCmd(f *cmdutil.Factory) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "add",
		Short: "Add parts to the stock",
		Args:  usageArgs(cobra.NoArgs),
		RunE:  func(cmd *cobra.Command, _ []string) error { return cmd.Help() },
	}
	cmd.AddCommand(newAddResistorCmd(f, nil), newAddTransistorCmd(f, nil))
	return cmd
}

// fieldFlag binds a string flag to a CSV column of o.
type fieldFlag struct{ flag, column, def, usage string }

func bindFields(cmd *cobra.Command, o *AddOptions, specs []fieldFlag) map[string]*string {
	vals := map[string]*string{}
	for _, s := range specs {
		vals[s.column] = cmd.Flags().String(s.flag, s.def, s.usage)
		o.flagOf[s.column] = "--" + s.flag
	}
	return vals
}

func bindCommon(cmd *cobra.Command, o *AddOptions) {
	fl := cmd.Flags()
	fl.IntVar(&o.Qty, "qty", 1, "how many to add")
	fl.StringSliceVar(&o.Tags, "tag", nil, "tag to attach (repeatable, or comma-separated)")
	fl.BoolVar(&o.JSON, "json", false, "print the stock line as JSON")
	o.flagOf["qty"], o.flagOf["tags"] = "--qty", "--tag"
}

func newAddResistorCmd(f *cmdutil.Factory, runF func(*AddOptions) error) *cobra.Command {
	o := &AddOptions{IO: f.IO, Store: f.Store, Kind: store.KindResistor, flagOf: map[string]string{"value": "VALUE"}}
	var vals map[string]*string
	cmd := &cobra.Command{
		Use:   "resistor VALUE",
		Short: "Add resistors (merged into an identical line in the same bin)",
		Long: `Add resistors of one value. VALUE is the letter-and-digit code (4K7, R47,
470R, 2M2, with an optional tolerance letter: 4K7J) or SI (4.7k, 4700).
Parts with the same value, tolerance, power and technology in the same bin
join that stock line. Without --tol the tolerance is the value's letter,
else ±5 %; without --power 0.25 W; without --tcr the technology's usual
TCR; derating starts at --knee (70 °C) and reaches zero at --max-temp
(155 °C).`,
		Example: `  biasbin stock add resistor 4K7 --qty 100 --bin A3
  biasbin stock add resistor 10k --tol 1% --power 0.6W --tech "metal film" --tag approved`,
		Args: usageArgs(cobra.ExactArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.Value = args[0]
			o.Fields = collect(vals)
			if o.Fields["tolerance"] == "" {
				if _, _, hasTol, err := notation.ParseResistance(o.Value); err != nil || !hasTol {
					o.Fields["tolerance"] = defaultAddTol
				}
			}
			if runF != nil {
				return runF(o)
			}
			return runAdd(cmd.Context(), o)
		},
	}
	vals = bindFields(cmd, o, []fieldFlag{
		{"tol", "tolerance", "", "tolerance: 1%, ±5 %, or a letter F G J K M (default the value's letter, else 5%)"},
		{"power", "power", defaultAddPower, "rated power at the knee temperature: 0.25W, 250mW, 1/4W"},
		{"bin", "bin", "", "bin location"},
		{"tcr", "tcr", "", "temperature coefficient in ppm/K (default by technology)"},
		{"tech", "tech", store.TechThickFilm, "technology: " + strings.Join(store.Technologies(), ", ")},
		{"knee", "knee_c", "", "temperature where derating starts, °C (default 70)"},
		{"max-temp", "max_c", "", "temperature where the allowed power reaches zero, °C (default 155)"},
		{"lev", "lev", "", "limiting element voltage, the datasheet's maximum working voltage (empty: check and pick assume one by power rating)"},
		{"part-number", "part_number", "", "the maker's part number"},
		{"note", "note", "", "free note"},
	})
	bindCommon(cmd, o)
	return cmd
}

func newAddTransistorCmd(f *cmdutil.Factory, runF func(*AddOptions) error) *cobra.Command {
	o := &AddOptions{IO: f.IO, Store: f.Store, Kind: store.KindTransistor, flagOf: map[string]string{"label": "LABEL"}}
	var vals map[string]*string
	var hfe string
	cmd := &cobra.Command{
		Use:   "transistor LABEL --polarity npn|pnp --hfe MIN..MAX",
		Short: "Add transistors (merged into the same label, in any letter case, in the same bin)",
		Long: `Add bipolar transistors of one type. --hfe takes the datasheet window,
optionally at its test current: 110..800 or 110..800@2mA. VBE(on) defaults
to 0.65 V at 1 mA and Tj max to 150 °C (common practice). Voltages are
magnitudes for both polarities.`,
		Example: `  biasbin stock add transistor Q2N-A --polarity npn --hfe 100..300@2mA --vceo 45V --pd 500mW --theta-ja 200 --qty 20 --bin B1`,
		Args:    usageArgs(cobra.ExactArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.Value = args[0]
			o.Fields = collect(vals)
			if hfe == "" {
				return cmdutil.Usagef("--hfe is required: the datasheet hFE window, like 100..300 or 100..300@2mA")
			}
			lo, hi, at, hasAt, err := notation.ParseRangeAt(hfe, notation.ParseNumber)
			if err != nil {
				return cmdutil.Usagef("--hfe: %v", err)
			}
			o.Fields["hfe_min"], o.Fields["hfe_max"] = num(lo), num(hi)
			if hasAt {
				if o.Fields["hfe_at"] != "" {
					return cmdutil.Usagef("--hfe gives the test current after @ and --hfe-at gives it again; give it once")
				}
				o.Fields["hfe_at"] = num(at)
			}
			if v := o.Fields["vbe"]; strings.Contains(v, "@") {
				von, at, _, err := notation.ParseAt(v, notation.ParseVoltage)
				if err != nil {
					return cmdutil.Usagef("--vbe: %v", err)
				}
				o.Fields["vbe"], o.Fields["vbe_at"] = num(von), num(at)
			}
			if runF != nil {
				return runF(o)
			}
			return runAdd(cmd.Context(), o)
		},
	}
	cmd.Flags().StringVar(&hfe, "hfe", "", "hFE window MIN..MAX, optionally @ its test current (required)")
	o.flagOf["hfe_min"], o.flagOf["hfe_max"] = "--hfe", "--hfe"
	vals = bindFields(cmd, o, []fieldFlag{
		{"polarity", "polarity", "", "npn or pnp (required)"},
		{"hfe-typ", "hfe_typ", "", "typical hFE"},
		{"hfe-at", "hfe_at", "", "collector current of the hFE test, like 2mA"},
		{"vbe", "vbe", "", "VBE(on), optionally @ its current: 0.65V@1mA (default 0.65V@1mA)"},
		{"vce-sat", "vce_sat", "", "VCE(sat) max"},
		{"vceo", "vceo", "", "VCEO max"},
		{"ic-max", "ic_max", "", "IC max"},
		{"pd", "pd", "", "total dissipation at 25 °C"},
		{"theta-ja", "theta_ja", "", "junction-to-ambient thermal resistance, K/W"},
		{"tj-max", "tj_max", "", "maximum junction temperature, °C (default 150)"},
		{"vaf", "vaf", "", "Early voltage"},
		{"icbo", "icbo", "", "collector-base leakage at 25 °C"},
		{"vbe-min", "vbe_min", "", "lowest VBE(on) part to part at the VBE test current, 25 °C (with --vbe-max; default VBE(on) ± 30 mV)"},
		{"vbe-max", "vbe_max", "", "highest VBE(on) part to part (with --vbe-min)"},
		{"vaf-min", "vaf_min", "", "lowest Early voltage part to part (with --vaf-max)"},
		{"vaf-max", "vaf_max", "", "highest Early voltage part to part (with --vaf-min)"},
		{"bin", "bin", "", "bin location"},
		{"part-number", "part_number", "", "the maker's part number"},
		{"note", "note", "", "free note"},
	})
	o.flagOf["vbe_at"] = "--vbe"
	bindCommon(cmd, o)
	return cmd
}

// collect copies the flag values into a column map.
func collect(vals map[string]*string) map[string]string {
	out := make(map[string]string, len(vals))
	for k, v := range vals {
		out[k] = *v
	}
	return out
}

// num writes a parsed value back as text the parsers read exactly.
func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// usageProblems turns field problems into one usage error naming flags.
func usageProblems(o *AddOptions, ps []stockcsv.Problem) error {
	var msgs []string
	for _, p := range ps {
		name := o.flagOf[p.Column]
		if name == "" {
			name = p.Column
		}
		// hfe_min and hfe_max both come from --hfe: say a thing once.
		if m := name + ": " + p.Msg; !slices.Contains(msgs, m) {
			msgs = append(msgs, m)
		}
	}
	return cmdutil.Usagef("%s", strings.Join(msgs, "\n"))
}

// addResult is the --json output of stock add.
type addResult struct {
	Merged     bool            `json:"merged"`
	Resistor   *jsonResistor   `json:"resistor,omitempty"`
	Transistor *jsonTransistor `json:"transistor,omitempty"`
}

func runAdd(ctx context.Context, o *AddOptions) error {
	fields := map[string]string{}
	for k, v := range o.Fields {
		fields[k] = v
	}
	fields["qty"] = strconv.Itoa(o.Qty)
	fields["tags"] = strings.Join(o.Tags, ";")
	var (
		r  store.Resistor
		t  store.Transistor
		ps []stockcsv.Problem
	)
	if o.Kind == store.KindResistor {
		fields["value"] = o.Value
		r, ps = stockcsv.ResistorFromFields(fields)
	} else {
		fields["label"] = o.Value
		t, ps = stockcsv.TransistorFromFields(fields)
	}
	if len(ps) > 0 {
		return usageProblems(o, ps)
	}
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	var res store.AddResult
	if o.Kind == store.KindResistor {
		res, err = db.AddResistor(ctx, r)
	} else {
		res, err = db.AddTransistor(ctx, t)
	}
	if err != nil {
		var ie *store.InvalidError
		if errors.As(err, &ie) {
			return usageProblems(o, storeProblems(ie))
		}
		return err
	}
	out := addResult{Merged: res.Merged}
	var what string
	var qty int
	if o.Kind == store.KindResistor {
		got, err := db.ResistorByID(ctx, res.ID)
		if err != nil {
			return err
		}
		j := toJSONResistor(got)
		out.Resistor, what, qty = &j, describeResistor(got), got.Qty
	} else {
		got, err := db.TransistorByID(ctx, res.ID)
		if err != nil {
			return err
		}
		j := toJSONTransistor(got)
		out.Transistor, what, qty = &j, describeTransistor(got), got.Qty
	}
	if o.JSON {
		return writeJSON(o.IO.Out, out)
	}
	verb := "new line"
	if res.Merged {
		verb = "added to line"
	}
	_, err = fmt.Fprintf(o.IO.Out, "%s %d: %s: %d in stock\n", verb, res.ID, what, qty)
	return err
}

// storeProblems converts the store's problems to field problems.
func storeProblems(ie *store.InvalidError) []stockcsv.Problem {
	ps := make([]stockcsv.Problem, len(ie.Problems))
	for i, p := range ie.Problems {
		ps[i] = stockcsv.Problem{Column: p.Field, Msg: p.Msg}
	}
	return ps
}
