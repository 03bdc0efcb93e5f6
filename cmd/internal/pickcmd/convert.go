package pickcmd

import (
	"fmt"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/store"
)

// toStock converts the stock lines read from the database into what the
// picker searches. Zero optional fields take the store's documented
// defaults (knee, zero-power temperature, the technology's TCR, VBE(on),
// Tj max), so the picker sees every rating it needs. A transistor line with
// an unknown polarity is an error naming the line.
func toStock(rs []store.Resistor, ts []store.Transistor) (picker.Stock, error) {
	st := picker.Stock{
		Resistors:   make([]picker.Resistor, 0, len(rs)),
		Transistors: make([]picker.Transistor, 0, len(ts)),
	}
	for _, r := range rs {
		st.Resistors = append(st.Resistors, toResistor(r))
	}
	for _, t := range ts {
		pt, err := toTransistor(t)
		if err != nil {
			return picker.Stock{}, err
		}
		st.Transistors = append(st.Transistors, pt)
	}
	return st, nil
}

// toResistor converts one resistor line, with the store's defaults filled
// in for any rating the line leaves zero.
func toResistor(r store.Resistor) picker.Resistor {
	r = r.WithDefaults()
	return picker.Resistor{
		ID:          r.ID,
		Ohm:         r.Ohm,
		Tol:         r.Tol,
		TCR_PPMPerK: r.TCR_PPMPerK,
		Rated_W:     r.Rated_W,
		Knee_C:      r.Knee_C,
		Max_C:       r.Max_C,
		Qty:         r.Qty,
		Bin:         r.Bin,
		Tags:        r.Tags,
	}
}

// toTransistor converts one transistor line; the datasheet fields keep the
// store's zero-means-default convention, which the solver shares.
func toTransistor(t store.Transistor) (picker.Transistor, error) {
	t = t.WithDefaults()
	pol, err := solver.ParsePolarity(t.Polarity)
	if err != nil {
		return picker.Transistor{}, fmt.Errorf("stock line %d (%s): %w", t.ID, t.Label, err)
	}
	return picker.Transistor{
		ID:   t.ID,
		Qty:  t.Qty,
		Bin:  t.Bin,
		Tags: t.Tags,
		Sheet: solver.Datasheet{
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
		},
	}, nil
}
