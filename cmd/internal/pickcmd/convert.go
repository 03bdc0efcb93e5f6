package pickcmd

import (
	"biasbin/cmd/internal/report"
	"biasbin/picker"
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

// toTransistor converts one transistor line (report.Sheet fills the
// datasheet with the store's defaults, as biasbin check does).
func toTransistor(t store.Transistor) (picker.Transistor, error) {
	sheet, err := report.Sheet(t)
	if err != nil {
		return picker.Transistor{}, err
	}
	return picker.Transistor{ID: t.ID, Qty: t.Qty, Bin: t.Bin, Tags: store.NormalizeTags(t.Tags), Sheet: sheet}, nil
}
