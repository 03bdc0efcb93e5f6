// Package stockparts turns stock lines read from the database into the
// parts the picker and solver take: the one conversion of a stocked part
// into what the math sees, with the defaults for the ratings a line leaves
// zero filled in on the way.
package stockparts

import (
	"context"
	"fmt"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/store"
)

// Read reads every stock line of db and converts it for the picker.
func Read(ctx context.Context, db *store.DB) (picker.Stock, error) {
	rs, err := db.ListResistors(ctx, store.Filter{})
	if err != nil {
		return picker.Stock{}, fmt.Errorf("read resistor stock: %w", err)
	}
	ts, err := db.ListTransistors(ctx, store.Filter{})
	if err != nil {
		return picker.Stock{}, fmt.Errorf("read transistor stock: %w", err)
	}
	return Stock(rs, ts)
}

// Stock converts the stock lines read from the database into what the
// picker searches. Zero optional fields take the store's documented
// defaults (knee, zero-power temperature, the technology's TCR, VBE(on),
// Tj max), so the picker sees every rating it needs. A transistor line with
// data the solver refuses (a 60 % tolerance, an unknown polarity) is a
// *LineError naming the line and the field.
func Stock(rs []store.Resistor, ts []store.Transistor) (picker.Stock, error) {
	st := picker.Stock{
		Resistors:   make([]picker.Resistor, 0, len(rs)),
		Transistors: make([]picker.Transistor, 0, len(ts)),
	}
	for _, r := range rs {
		pr, err := Resistor(r)
		if err != nil {
			return picker.Stock{}, err
		}
		st.Resistors = append(st.Resistors, pr)
	}
	for _, t := range ts {
		pt, err := Transistor(t)
		if err != nil {
			return picker.Stock{}, err
		}
		st.Transistors = append(st.Transistors, pt)
	}
	return st, nil
}

// Resistor converts one resistor line, with the store's defaults filled
// in for any rating the line leaves zero; data the solver refuses is a
// *LineError.
func Resistor(r store.Resistor) (picker.Resistor, error) {
	if _, err := Spec(r); err != nil {
		return picker.Resistor{}, err
	}
	r = r.WithDefaults()
	return picker.Resistor{
		ID:          r.ID,
		Ohm:         r.Ohm,
		Tol:         r.Tol,
		TCR_PPMPerK: r.TCR_PPMPerK,
		Rated_W:     r.Rated_W,
		Knee_C:      r.Knee_C,
		Max_C:       r.Max_C,
		LEV_V:       r.LEV_V,
		Qty:         r.Qty,
		Bin:         r.Bin,
		Tags:        r.Tags,
	}, nil
}

// Spec converts one resistor line into the part the solver takes (as
// biasbin check --rc '#26' uses it), with the store's defaults filled in
// for any rating the line leaves zero; data the solver refuses is a
// *LineError.
func Spec(r store.Resistor) (solver.ResistorSpec, error) {
	r = r.WithDefaults()
	spec := solver.ResistorSpec{Nominal_Ohm: r.Ohm, Tol: r.Tol, TCR_PPMPerK: r.TCR_PPMPerK, Rated_W: r.Rated_W, Knee_C: r.Knee_C, Max_C: r.Max_C, LEV_V: r.LEV_V}
	if err := spec.Validate(); err != nil {
		return solver.ResistorSpec{}, lineError(store.KindResistor, r.ID, notation.FormatResistanceExact(r.Ohm), r.Bin, err)
	}
	return spec, nil
}

// Transistor converts one transistor line (Sheet fills the datasheet with
// the store's defaults, as biasbin check does).
func Transistor(t store.Transistor) (picker.Transistor, error) {
	sheet, err := Sheet(t)
	if err != nil {
		return picker.Transistor{}, err
	}
	return picker.Transistor{ID: t.ID, Qty: t.Qty, Bin: t.Bin, Tags: store.NormalizeTags(t.Tags), Sheet: sheet}, nil
}
