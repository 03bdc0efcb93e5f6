package checkcmd

import (
	"strings"

	"biasbin/cmd/internal/stageflags"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver/notation"
)

// yieldRequest fills in the yield window's rule and design point and the
// Monte Carlo's size and seed from --window, --ic, --vce, --sim-boards and
// --seed.
func (o *Options) yieldRequest(in *job.CheckRequest) error {
	if o.Changed != nil && o.Changed("boards") {
		return stageflags.Usagef("boards", "check simulates boards with --sim-boards N (in pick, --boards is the boards to build)")
	}
	var err error
	if in.Window, err = parseWindow(o.Window); err != nil {
		return err
	}
	if o.ICTarget != "" {
		if in.TargetIC_A, err = notation.ParseCurrent(o.ICTarget); err != nil {
			return stageflags.Usage("ic", err)
		}
		if in.TargetIC_A <= 0 {
			return stageflags.Usagef("ic", "%s: give the design IC as a positive current, e.g. 1mA", o.ICTarget)
		}
	}
	if o.VCETarget != "" {
		if in.TargetVCE_V, err = notation.ParseVoltage(o.VCETarget); err != nil {
			return stageflags.Usage("vce", err)
		}
		if in.TargetVCE_V <= 0 {
			return stageflags.Usagef("vce", "%s: give the design VCE as a positive magnitude, e.g. 6V", o.VCETarget)
		}
	}
	in.Boards, in.Seed = o.SimBoards, o.Seed
	return nil
}

// parseWindow reads --window "IC,VCE", each band as stageflags.WindowBand
// reads it (the rule pick's --ic-window and --vce-window follow).
func parseWindow(text string) (picker.WindowRule, error) {
	var w picker.WindowRule
	ic, vce, ok := strings.Cut(text, ",")
	if !ok || strings.TrimSpace(ic) == "" || strings.TrimSpace(vce) == "" {
		return w, stageflags.Usagef("window", "%q: want IC,VCE, e.g. 10%%,20%% or 1.8mA..2.2mA,4V..8V", text)
	}
	var err error
	if w.IC, err = stageflags.WindowBand("window", ic, notation.ParseCurrent); err != nil {
		return w, err
	}
	if w.VCE, err = stageflags.WindowBand("window", vce, notation.ParseVoltage); err != nil {
		return w, err
	}
	return w, nil
}
