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
