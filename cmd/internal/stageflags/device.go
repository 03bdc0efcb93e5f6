package stageflags

import (
	"context"
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/pflag"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockparts"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Device holds the transistor flags as typed: a stock label (under the
// flag name LabelFlag) and the inline datasheet flags, which override the
// stock line's values when both are given.
type Device struct {
	// LabelFlag is the name of the stock-label flag ("transistor",
	// "original").
	LabelFlag string
	Label     string
	Polarity  string
	HFE       string
	HFETyp    string
	VBE       string
	VCESat    string
	VAF       string
	VCEO      string
	ICMax     string
	PD        string
	ThetaJA   string
	TjMax     string
	ICBO      string
	// Changed reports whether a flag was given on the command line.
	Changed func(name string) bool
}

// AddFlags registers the transistor flags on fl; labelFlag names the
// stock-label flag and what says whose datasheet the inline flags give
// ("inline transistor", "original").
func (d *Device) AddFlags(fl *pflag.FlagSet, labelFlag, labelHelp, what string) {
	d.LabelFlag = labelFlag
	d.Changed = fl.Changed
	fl.StringVar(&d.Label, labelFlag, "", labelHelp)
	fl.StringVar(&d.Polarity, "polarity", "", what+": npn or pnp (default npn)")
	fl.StringVar(&d.HFE, "hfe", "", what+": hFE MIN..MAX, optionally @IC (100..300@2mA)")
	fl.StringVar(&d.HFETyp, "hfe-typ", "", what+": typical hFE (default the geometric mean of min and max)")
	fl.StringVar(&d.VBE, "vbe", "", what+": VBE(on)@IC (default 0.65V@1mA)")
	fl.StringVar(&d.VCESat, "vce-sat", "", what+": VCE(sat) (default 0.2V)")
	fl.StringVar(&d.VAF, "vaf", "", what+": Early voltage (default infinite)")
	fl.StringVar(&d.VCEO, "vceo", "", what+": VCEO max")
	fl.StringVar(&d.ICMax, "ic-max", "", what+": IC max")
	fl.StringVar(&d.PD, "pd", "", what+": total dissipation at 25 °C ambient")
	fl.StringVar(&d.ThetaJA, "theta-ja", "", what+": junction-to-ambient thermal resistance, K/W")
	fl.StringVar(&d.TjMax, "tj-max", "", what+": maximum junction temperature (default 150)")
	fl.StringVar(&d.ICBO, "icbo", "", what+": collector-base leakage at 25 °C")
}

// Given reports whether a transistor was named or given inline.
func (d *Device) Given() bool { return d.Label != "" || d.HFE != "" }

// PolarityOf returns --polarity, default NPN.
func (d *Device) PolarityOf() (solver.Polarity, error) {
	if strings.TrimSpace(d.Polarity) == "" {
		return solver.NPN, nil
	}
	p, err := solver.ParsePolarity(strings.TrimSpace(d.Polarity))
	if err != nil {
		return 0, Usage("polarity", err)
	}
	return p, nil
}

// Datasheet reads the transistor: the stock line the label names (matched
// without regard to letter case) with any inline flags overriding it, else
// the inline flags alone. open opens the stock; it is called only when a
// label is given. label is the stock line's label as stocked, or "" for an
// inline transistor.
func (d *Device) Datasheet(ctx context.Context, open Opener) (sheet solver.Datasheet, label string, err error) {
	if d.Label != "" {
		if sheet, label, err = d.stockDevice(ctx, open); err != nil {
			return sheet, "", err
		}
	} else {
		sheet.Polarity = solver.NPN
		if d.HFE == "" {
			return sheet, "", Usagef("hfe", "missing: name a stocked transistor with --%s LABEL, or give it inline with at least --hfe MIN..MAX", d.LabelFlag)
		}
	}
	sheet, err = d.inline(sheet)
	return sheet, label, err
}

// stockDevice reads the stock line the label names. A label stocked in
// two spellings (QN-230 and qn-230) is refused with every matching line,
// since the commands take no line ID.
func (d *Device) stockDevice(ctx context.Context, open Opener) (solver.Datasheet, string, error) {
	if open == nil {
		return solver.Datasheet{}, "", fmt.Errorf("--%s %s: no stock available", d.LabelFlag, d.Label)
	}
	db, err := open(ctx)
	if err != nil {
		return solver.Datasheet{}, "", err
	}
	t, err := db.TransistorByLabel(ctx, d.Label)
	var amb *store.AmbiguousLabelError
	switch {
	case errors.Is(err, store.ErrNotFound):
		return solver.Datasheet{}, "", Usagef(d.LabelFlag, "%q is not in stock (see biasbin stock list)", d.Label)
	case errors.As(err, &amb):
		return solver.Datasheet{}, "", Usagef(d.LabelFlag, "%v; --%s takes a label, not a line ID: "+
			"make the labels differ by more than letter case, remove the wrong line (biasbin stock remove ID), "+
			"or give the transistor inline (--hfe ...)", err, d.LabelFlag)
	case err != nil:
		return solver.Datasheet{}, "", fmt.Errorf("--%s %s: %w", d.LabelFlag, d.Label, err)
	}
	sheet, err := stockparts.Sheet(t)
	if err != nil {
		return sheet, "", fmt.Errorf("--%s %s: %w", d.LabelFlag, d.Label, err)
	}
	return sheet, t.Label, nil
}

// inline applies the inline transistor flags to sheet (the stock line or a
// default NPN) and checks the result.
func (d *Device) inline(sheet solver.Datasheet) (solver.Datasheet, error) {
	var err error
	if d.Polarity != "" {
		if sheet.Polarity, err = solver.ParsePolarity(strings.TrimSpace(d.Polarity)); err != nil {
			return sheet, Usage("polarity", err)
		}
	}
	if d.HFE != "" {
		if sheet.HFEMin, sheet.HFEMax, sheet.HFEAt_A, _, err = notation.ParseRangeAt(d.HFE, notation.ParseNumber); err != nil {
			return sheet, Usage("hfe", err)
		}
		if sheet.HFEMin <= 0 {
			return sheet, Usagef("hfe", "%q: hFE must be above 0", d.HFE)
		}
		if !d.changed("hfe-typ") && (sheet.HFETyp < sheet.HFEMin || sheet.HFETyp > sheet.HFEMax) {
			sheet.HFETyp = 0 // a stock typical outside the new window no longer applies
		}
	}
	type field struct {
		flag  string
		text  string
		parse notation.Parser
		dst   *float64
	}
	for _, f := range []field{
		{"hfe-typ", d.HFETyp, notation.ParseNumber, &sheet.HFETyp},
		{"vce-sat", d.VCESat, notation.ParseVoltage, &sheet.VCESat_V},
		{"vaf", d.VAF, notation.ParseVoltage, &sheet.VAF_V},
		{"vceo", d.VCEO, notation.ParseVoltage, &sheet.VCEO_V},
		{"ic-max", d.ICMax, notation.ParseCurrent, &sheet.ICMax_A},
		{"pd", d.PD, notation.ParsePower, &sheet.PD25_W},
		{"theta-ja", d.ThetaJA, notation.ParseThermalResistance, &sheet.ThetaJA_KPerW},
		{"tj-max", d.TjMax, notation.ParseTemperature, &sheet.TjMax_C},
		{"icbo", d.ICBO, notation.ParseCurrent, &sheet.ICBO_A},
	} {
		if f.text == "" {
			continue
		}
		v, err := f.parse(f.text)
		if err != nil {
			return sheet, Usage(f.flag, err)
		}
		if v < 0 {
			return sheet, Usagef(f.flag, "%q: give the magnitude", f.text)
		}
		*f.dst = v
	}
	if d.TjMax != "" {
		// 0 would read as "not given" below: a Tj max typed in is checked here.
		if err := solver.TjMaxRange.Check(sheet.TjMax_C); err != nil {
			return sheet, InputError(err)
		}
	}
	if d.VBE != "" {
		if sheet.VBEOn_V, sheet.VBEAt_A, _, err = notation.ParseAt(d.VBE, notation.ParseVoltage); err != nil {
			return sheet, Usage("vbe", err)
		}
		if sheet.VBEOn_V <= 0 {
			return sheet, Usagef("vbe", "%q: give the magnitude of VBE(on)", d.VBE)
		}
	}
	if err := sheet.Validate(); err != nil {
		return sheet, InputError(err)
	}
	return sheet, nil
}

// changed reports whether a flag was set on the command line.
func (d *Device) changed(name string) bool { return d.Changed != nil && d.Changed(name) }

// InputError turns a solver input error into a usage error naming the
// flag; other errors pass unchanged.
func InputError(err error) error {
	var ie *solver.InputError
	if errors.As(err, &ie) {
		return &cmdutil.UsageError{Err: fmt.Errorf("%s: %s", FlagName(ie.Field), ie.Problem)}
	}
	return err
}

// FlagName maps a solver input field to the flag a user typed.
func FlagName(field string) string {
	f := strings.Fields(field)
	if len(f) == 0 {
		return "input"
	}
	switch f[0] {
	case "hfe_min", "hfe_max":
		return "--hfe"
	case "hfe_typ":
		return "--hfe-typ"
	case "vbe_on", "vbe_at":
		return "--vbe"
	case "vce_sat":
		return "--vce-sat"
	case "ic_max":
		return "--ic-max"
	case "theta_ja":
		return "--theta-ja"
	case "tj_max":
		return "--tj-max"
	case "vcc_tol":
		return "--vcc-tol"
	case "pd", "vaf", "vceo", "icbo", "hfe", "vcc", "vee", "rail", "ambient", "temp", "beta", "bypass", "load", "polarity":
		return "--" + f[0]
	case "window":
		return "--window"
	case "yield_boards":
		return "--sim-boards"
	}
	if _, err := solver.ParseSlot(f[0]); err == nil {
		if len(f) > 1 {
			switch f[1] {
			case "tolerance":
				return "--" + f[0] + " (tolerance, or --tol)"
			case "tcr":
				return "--tcr"
			case "power", "derating":
				return "--power"
			}
		}
		return "--" + f[0]
	}
	return field
}
