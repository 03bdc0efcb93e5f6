package stageflags

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/pflag"

	"biasbin/solver"
	"biasbin/solver/fault"
	"biasbin/solver/notation"
)

// DefaultMeter is --meter's default, fault's meter defaults written as
// the flag takes them ("1%+10mV").
func DefaultMeter() string {
	return fmt.Sprintf("%g%%+%gmV", 100*fault.DefaultFraction, 1e3*fault.DefaultOffset_V)
}

// DefaultMeterInput is --meter-input's default, fault.DefaultInput_Ohm
// written as the flag takes it ("10M").
func DefaultMeterInput() string { return notation.FormatResistance(fault.DefaultInput_Ohm) }

// Readings holds the measured-voltage flags as typed.
type Readings struct {
	VB, VE, VC string
	Meter      string
	MeterInput string
}

// AddFlags registers --vb --ve --vc (what says where they were measured),
// --meter and --meter-input on fl.
func (r *Readings) AddFlags(fl *pflag.FlagSet, what string) {
	fl.StringVar(&r.VB, "vb", "", "base voltage to 0 V measured on "+what+", signed as the meter shows it (e.g. 2.08V; see --rail for where 0 V is)")
	fl.StringVar(&r.VE, "ve", "", "emitter voltage to 0 V measured on "+what)
	fl.StringVar(&r.VC, "vc", "", "collector voltage to 0 V measured on "+what)
	fl.StringVar(&r.Meter, "meter", DefaultMeter(), "meter accuracy: PERCENT of the reading + VOLTS")
	fl.StringVar(&r.MeterInput, "meter-input", DefaultMeterInput(), "meter input resistance on DC volts")
}

// Given reports whether any reading was given.
func (r *Readings) Given() bool { return r.VB != "" || r.VE != "" || r.VC != "" }

// Parse reads the three readings (all required) and the meter.
func (r *Readings) Parse() (fault.Readings, fault.Meter, error) {
	var out fault.Readings
	for _, f := range []struct {
		flag string
		text string
		dst  *float64
	}{{"vb", r.VB, &out.VB_V}, {"ve", r.VE, &out.VE_V}, {"vc", r.VC, &out.VC_V}} {
		if strings.TrimSpace(f.text) == "" {
			return out, fault.Meter{}, Usagef(f.flag, "missing: give all three of --vb --ve --vc, measured to ground")
		}
		v, err := notation.ParseVoltage(f.text)
		if err != nil {
			return out, fault.Meter{}, Usage(f.flag, err)
		}
		*f.dst = v
	}
	m, err := r.meter()
	return out, m, err
}

// meter reads --meter "1%+10mV" and --meter-input.
func (r *Readings) meter() (fault.Meter, error) {
	var m fault.Meter
	pct, volts, ok := strings.Cut(strings.ReplaceAll(r.Meter, " ", ""), "+")
	if !ok || !strings.HasSuffix(pct, "%") {
		return m, Usagef("meter", "%q: want PERCENT+VOLTS, e.g. %s", r.Meter, DefaultMeter())
	}
	var err error
	if m.Fraction, err = notation.ParseTolerance(pct); err != nil {
		return m, Usage("meter", err)
	}
	if m.Offset_V, err = notation.ParseVoltage(volts); err != nil {
		return m, Usage("meter", err)
	}
	if m.Input_Ohm, err = notation.ParseOhms(r.MeterInput); err != nil {
		return m, Usage("meter-input", err)
	}
	if !(m.Fraction > 0 && m.Offset_V > 0) {
		return m, Usagef("meter", "%q: both parts must be above 0 (every meter has a share of the reading and a floor), e.g. %s", r.Meter, DefaultMeter())
	}
	if err := m.Validate(); err != nil {
		return m, Usage("meter", err)
	}
	return m, nil
}

// ReadingFlags names the flags behind a fault.ReadingError's Reading
// ("vb" → "--vb", "ve/vc" → "--ve and --vc").
func ReadingFlags(reading string) string {
	parts := strings.Split(reading, "/")
	for i, p := range parts {
		parts[i] = "--" + p
	}
	return strings.Join(parts, " and ")
}

// JobError maps an error of a repair job for the command named cmd: a
// reading the stage cannot give names its flags (exit 1), a solver input
// error names its flag (exit 2), anything else is wrapped.
func JobError(cmd string, err error) error {
	var re *fault.ReadingError
	var ie *solver.InputError
	switch {
	case err == nil:
		return nil
	case errors.As(err, &re) && re.OtherGround != nil:
		rail := "--rail negative (emitter side on 0 V)"
		if *re.OtherGround == solver.CollectorRailGround {
			rail = "--rail positive (emitter side on +V, collector side on 0 V)"
		}
		return fmt.Errorf("%s: %s: %s; every reading fits the stage built the other way round: %s", cmd, ReadingFlags(re.Reading), re.Problem, rail)
	case errors.As(err, &re):
		return fmt.Errorf("%s: %s: %s", cmd, ReadingFlags(re.Reading), re.Problem)
	case errors.As(err, &ie):
		return InputError(err)
	}
	return fmt.Errorf("%s: %w", cmd, err)
}
