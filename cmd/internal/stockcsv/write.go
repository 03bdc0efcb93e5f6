package stockcsv

import (
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"biasbin/solver/notation"
	"biasbin/store"
)

// writeCSV writes the header of k and n records.
func writeCSV(w io.Writer, k store.Kind, n int, record func(i int) []string) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(header(k)); err != nil {
		return fmt.Errorf("write CSV: %w", err)
	}
	for i := range n {
		if err := cw.Write(record(i)); err != nil {
			return fmt.Errorf("write CSV: %w", err)
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("write CSV: %w", err)
	}
	return nil
}

// WriteResistors writes rs as a resistor stock file with every column.
func WriteResistors(w io.Writer, rs []store.Resistor) error {
	return writeCSV(w, store.KindResistor, len(rs), func(i int) []string {
		r := rs[i]
		return []string{
			Ohms(r.Ohm), exactPercent(r.Tol), plain(r.Rated_W, "W", notation.ParsePower),
			strconv.Itoa(r.Qty), EscapeFormula(r.Bin),
			plain(r.TCR_PPMPerK, "", notation.ParseTCR), r.Tech,
			plain(r.Knee_C, "", notation.ParseTemperature), plain(r.Max_C, "", notation.ParseTemperature),
			EscapeFormula(strings.Join(r.Tags, ";")), EscapeFormula(r.Note),
			optional(r.LEV_V, notation.ParseVoltage, "V"), EscapeFormula(r.PartNumber),
		}
	})
}

// WriteTransistors writes ts as a transistor stock file with every column.
func WriteTransistors(w io.Writer, ts []store.Transistor) error {
	num := notation.ParseNumber
	volt, amp := notation.ParseVoltage, notation.ParseCurrent
	return writeCSV(w, store.KindTransistor, len(ts), func(i int) []string {
		t := ts[i]
		return []string{
			EscapeFormula(t.Label), t.Polarity, optional(t.HFEMin, num, ""), optional(t.HFEMax, num, ""), strconv.Itoa(t.Qty),
			optional(t.HFETyp, num, ""), optional(t.HFEAt_A, amp, "A"),
			optional(t.VBEOn_V, volt, "V"), optional(t.VBEAt_A, amp, "A"),
			optional(t.VCESat_V, volt, "V"), optional(t.VCEO_V, volt, "V"), optional(t.ICMax_A, amp, "A"),
			optional(t.PD25_W, notation.ParsePower, "W"),
			optional(t.ThetaJA_KPerW, notation.ParseThermalResistance, ""),
			optional(t.TjMax_C, notation.ParseTemperature, ""),
			optional(t.VAF_V, volt, "V"), optional(t.ICBO_A, amp, "A"),
			EscapeFormula(t.Bin), EscapeFormula(strings.Join(t.Tags, ";")), EscapeFormula(t.Note), EscapeFormula(t.PartNumber),
			optional(t.VBEMin_V, volt, "V"), optional(t.VBEMax_V, volt, "V"),
			optional(t.VAFMin_V, volt, "V"), optional(t.VAFMax_V, volt, "V"),
		}
	})
}

// digits12 writes v to 12 significant digits, the precision the store
// keeps, so that reading it back gives the stored value.
func digits12(v float64) string { return strconv.FormatFloat(v, 'g', 12, 64) }

// same reports whether a and b agree to the 12 digits the store keeps.
func same(a, b float64) bool { return digits12(a) == digits12(b) }

// Ohms writes a resistance in the IEC 60062 letter-and-digit code when
// that code reads back to the same value (4K7, 470R, R47), otherwise as a
// plain number of ohms ("4701.5").
func Ohms(ohm float64) string {
	code := notation.FormatResistance(ohm)
	if back, err := notation.ParseOhms(code); err == nil && same(back, ohm) {
		return code
	}
	return digits12(ohm)
}

// exactPercent writes a tolerance fraction as a percentage ("5%").
func exactPercent(tol float64) string {
	return digits12(tol*100) + "%"
}

// plain writes v as a number with unit (the unit's base, no prefix),
// checking that parse reads it back.
func plain(v float64, unit string, parse notation.Parser) string {
	s := digits12(v) + unit
	if back, err := parse(s); err == nil && same(back, v) {
		return s
	}
	return digits12(v)
}

// optional writes 0 (not given) as an empty field; currents with an SI
// prefix ("2mA", "15nA") when that reads back exactly; other values as
// plain numbers with unit.
func optional(v float64, parse notation.Parser, unit string) string {
	if v == 0 {
		return ""
	}
	if unit == "A" {
		s := strings.NewReplacer(" ", "", "µ", "u").Replace(notation.FormatSI(v, unit))
		if back, err := parse(s); err == nil && same(back, v) {
			return s
		}
	}
	return plain(v, unit, parse)
}
