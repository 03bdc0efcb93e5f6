package checkcmd

import (
	"strings"

	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/job"
	"biasbin/solver/notation"
)

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
