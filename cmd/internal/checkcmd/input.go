package checkcmd

import (
	"context"
	"strings"

	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// input parses the flags into a build. The stock is opened only when
// --transistor is given.
func (o *Options) input(ctx context.Context) (job.CheckRequest, error) {
	if o.Ref != "" {
		return o.refInput(ctx)
	}
	var in job.CheckRequest
	if _, err := o.Stage.TopologyOf(); err != nil {
		return in, err
	}
	d, label, err := o.Device.Datasheet(ctx, o.Store)
	if err != nil {
		return in, err
	}
	if in.Build, err = o.Stage.Build(ctx, d.Polarity, o.Store); err != nil {
		return in, err
	}
	b := &in.Build
	b.Device = d
	in.Label = label

	// AC side.
	if o.Load != "" {
		if b.RL_Ohm, err = notation.ParseOhms(o.Load); err != nil {
			return in, stageflags.Usage("load", err)
		}
	}
	switch bp := strings.TrimSpace(o.Bypass); {
	case bp == "":
	case b.Resistors[solver.RE].Nominal_Ohm == 0:
		return in, stageflags.Usagef("bypass", "there is no RE to bypass")
	case strings.EqualFold(bp, bypassAll):
		b.RBypass_Ohm = b.Resistors[solver.RE].Nominal_Ohm
	default:
		if b.RBypass_Ohm, err = notation.ParseOhms(bp); err != nil {
			return in, stageflags.Usage("bypass", err)
		}
		if b.RBypass_Ohm > b.Resistors[solver.RE].Nominal_Ohm {
			return in, stageflags.Usagef("bypass", "%s is more than RE (%s)", notation.FormatResistance(b.RBypass_Ohm), notation.FormatResistance(b.Resistors[solver.RE].Nominal_Ohm))
		}
	}

	// The nominal point.
	if o.Beta != "" {
		if b.NominalBeta, err = notation.ParseNumber(o.Beta); err != nil {
			return in, stageflags.Usage("beta", err)
		}
		if b.NominalBeta <= 0 {
			return in, stageflags.Usagef("beta", "%g: want a positive beta", b.NominalBeta)
		}
	}

	if err := o.yieldRequest(&in); err != nil {
		return in, err
	}
	if err := in.Validate(); err != nil {
		return in, stageflags.InputError(err)
	}
	return in, nil
}

// yieldRequest fills in the yield window and the Monte Carlo's size and
// seed from --window, --boards and --seed.
func (o *Options) yieldRequest(in *job.CheckRequest) error {
	var err error
	if in.Window, err = parseWindow(o.Window); err != nil {
		return err
	}
	in.Boards, in.Seed = o.Boards, o.Seed
	return nil
}

// parseWindow reads --window "IC,VCE".
func parseWindow(text string) (job.WindowSpec, error) {
	var w job.WindowSpec
	ic, vce, ok := strings.Cut(text, ",")
	if !ok || strings.TrimSpace(ic) == "" || strings.TrimSpace(vce) == "" {
		return w, stageflags.Usagef("window", "%q: want IC,VCE, e.g. 10%%,20%% or 1.8mA..2.2mA,4V..8V", text)
	}
	var err error
	if w.IC, err = windowPart(strings.TrimSpace(ic), notation.ParseCurrent); err != nil {
		return w, err
	}
	if w.VCE, err = windowPart(strings.TrimSpace(vce), notation.ParseVoltage); err != nil {
		return w, err
	}
	if !w.IC.Relative && w.IC.Max == 0 || !w.VCE.Relative && w.VCE.Max == 0 {
		return w, stageflags.Usagef("window", "%q: an absolute range needs a maximum above 0", text)
	}
	if w.VCE.Min < 0 {
		return w, stageflags.Usagef("window", "%q: VCE is a magnitude", text)
	}
	return w, nil
}

// windowPart reads one part of --window: "10%" or "MIN..MAX".
func windowPart(text string, parse notation.Parser) (job.Band, error) {
	if strings.HasSuffix(text, "%") {
		pct, err := notation.ParseTolerance(text)
		if err != nil {
			return job.Band{}, stageflags.Usage("window", err)
		}
		return job.Band{Relative: true, Frac: pct}, nil
	}
	lo, hi, err := notation.ParseRange(text, parse)
	if err != nil {
		return job.Band{}, stageflags.Usage("window", err)
	}
	return job.Band{Min: lo, Max: hi}, nil
}
