package stockparts

import (
	"biasbin/solver"
	"biasbin/store"
)

// Sheet converts a stock transistor line into the datasheet the solver
// models, with the store's defaults filled in for the fields the line
// leaves zero (the solver shares the zero-means-default convention). Data
// the solver refuses is a *LineError naming the line and the field.
func Sheet(t store.Transistor) (solver.Datasheet, error) {
	t = t.WithDefaults()
	pol, err := solver.ParsePolarity(t.Polarity)
	if err != nil {
		return solver.Datasheet{}, lineError(store.KindTransistor, t.ID, t.Label, t.Bin, &solver.InputError{Field: "polarity", Problem: err.Error()})
	}
	d := solver.Datasheet{
		Label:         t.Label,
		Polarity:      pol,
		HFEMin:        t.HFEMin,
		HFEMax:        t.HFEMax,
		HFETyp:        t.HFETyp,
		HFEAt_A:       t.HFEAt_A,
		VBEOn_V:       t.VBEOn_V,
		VBEAt_A:       t.VBEAt_A,
		VCESat_V:      t.VCESat_V,
		VCEO_V:        t.VCEO_V,
		ICMax_A:       t.ICMax_A,
		PD25_W:        t.PD25_W,
		ThetaJA_KPerW: t.ThetaJA_KPerW,
		TjMax_C:       t.TjMax_C,
		VAF_V:         t.VAF_V,
		ICBO_A:        t.ICBO_A,
		// The part-to-part ranges; 0 = not stocked, the solver's default
		// spread (solver.DefaultVBESpread_V, common practice) applies.
		VBEMin_V: t.VBEMin_V,
		VBEMax_V: t.VBEMax_V,
		VAFMin_V: t.VAFMin_V,
		VAFMax_V: t.VAFMax_V,
	}
	if err := d.Validate(); err != nil {
		return solver.Datasheet{}, lineError(store.KindTransistor, t.ID, t.Label, t.Bin, err)
	}
	return d, nil
}
