package checkcmd

import (
	"context"
	"errors"
	"fmt"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/job"
	"biasbin/store"
)

// buildFlags are the flags that name a build; a build ID names the whole
// build, so none of them goes with it.
var buildFlags = []string{"topology", "vcc", "vee", "r1", "r2", "rc", "re", "rf", "rb", "transistor", "polarity",
	"hfe", "hfe-typ", "vbe", "vce-sat", "vaf", "vceo", "ic-max", "pd", "theta-ja", "tj-max", "icbo", "vcc-tol",
	"tol", "tcr", "power", "ambient", "beta", "temp", "load", "bypass"}

// refInput is the request for `check ID`: the build a pick listed (kept
// with the pick) or a reserved build, as it was picked, with the yield run
// against the pick's own window (or --window, --ic, --vce) with
// --sim-boards and --seed.
func (o *Options) refInput(ctx context.Context) (job.CheckRequest, error) {
	var in job.CheckRequest
	for _, f := range buildFlags {
		if o.Changed != nil && o.Changed(f) {
			return in, stageflags.Usagef(f, "check %s names the whole build; leave out --%s (only --window, --ic, --vce, --sim-boards, --seed, --json and --spice go with a build ID)", o.Ref, f)
		}
	}
	ref, err := buildjob.ParseRef(o.Ref)
	if err != nil {
		return in, stageflags.Usagef("build", "%v", err)
	}
	if o.Store == nil {
		return in, fmt.Errorf("check %s: no stock available", o.Ref)
	}
	db, err := o.Store(ctx)
	if err != nil {
		return in, err
	}
	plan, err := buildjob.PlanOf(ctx, db, ref)
	switch {
	case errors.Is(err, store.ErrNoPick):
		return in, stageflags.Usagef("build", "%s is not a build a pick listed in the last %d days (pick again, or give the build with flags)", o.Ref, int(store.PickKeep.Hours()/24))
	case errors.Is(err, store.ErrNoBuild):
		return in, stageflags.Usagef("build", "%s is not a reserved build (see biasbin build list)", o.Ref)
	case err != nil:
		return in, fmt.Errorf("check %s: %w", o.Ref, err)
	}
	in.Build = plan.Build
	in.Label = plan.Build.Device.Label
	if err := o.yieldRequest(&in); err != nil {
		return in, err
	}
	// The pick's window (its rule around its design point) unless the
	// flags give another: the same build reads the same yield in both.
	if w := plan.Figures.Window; w != nil {
		if !o.changed("window") {
			in.Window = w.Rule
		}
		if !o.changed("ic") && !o.changed("vce") {
			in.TargetIC_A, in.TargetVCE_V = w.Centre.IC_A, w.Centre.VCE_V
		}
	} else if !o.changed("ic") {
		in.TargetIC_A = plan.Request.IC_A // a plan kept before windows were
	}
	return in, nil
}
