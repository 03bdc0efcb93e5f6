package solver

import (
	"fmt"
	"math"
	"strconv"
)

// Range is the span of one physical quantity the solver accepts, with the
// reason for each end: a physical bound, a rating, or where the model
// stops being valid. Min and Max are inclusive and in SI units (°C for
// temperatures); a value outside is refused, never solved into nonsense.
type Range struct {
	// Field is the input's name as a user knows it ("vcc", "hfe", "r1" ...).
	Field string
	// Quantity says what the value is, in the trade's words.
	Quantity string
	// Unit is the SI unit ("" for a ratio).
	Unit     string
	Min, Max float64
	// Why gives the reason for the two ends.
	Why string
}

// Contains reports whether v is a finite number within r.
func (r Range) Contains(v float64) bool {
	return !math.IsNaN(v) && !math.IsInf(v, 0) && v >= r.Min && v <= r.Max
}

// Check returns nil for a value within r, else an *InputError naming the
// field, the accepted range and why.
func (r Range) Check(v float64) error {
	if r.Contains(v) {
		return nil
	}
	return &InputError{Field: r.Field, Problem: fmt.Sprintf("%s %s is outside the accepted %s (%s)",
		r.Quantity, quantity(v, r.Unit), r.Span(), r.Why), Range: &r}
}

// Span writes the range as "MIN..MAX" with SI prefixes ("100 nA..10 A").
func (r Range) Span() string {
	return quantity(r.Min, r.Unit) + ".." + quantity(r.Max, r.Unit)
}

// quantity writes v with unit: with an SI prefix (n, µ, m, k, M, G, T) for
// a unit that takes one, a whole number below ten million in full, else to
// four significant digits.
func quantity(v float64, unit string) string {
	if unit == "" || unit == "°C" || v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		s := strconv.FormatFloat(v, 'g', 4, 64)
		if v == math.Trunc(v) && math.Abs(v) < 1e7 {
			s = strconv.FormatFloat(v, 'f', 0, 64)
		}
		if unit == "" {
			return s
		}
		return s + " " + unit
	}
	e := int(math.Floor(math.Log10(math.Abs(v))/3)) * 3
	if e < -12 || e > 12 {
		return strconv.FormatFloat(v, 'g', 4, 64) + " " + unit
	}
	prefix := map[int]string{-12: "p", -9: "n", -6: "µ", -3: "m", 0: "", 3: "k", 6: "M", 9: "G", 12: "T"}[e]
	return strconv.FormatFloat(v/math.Pow(10, float64(e)), 'g', 4, 64) + " " + prefix + unit
}

// The accepted ranges of the quantities of a stage and its parts. Each is
// the one place its limits live: the solver's Validate methods and every
// front end (commands, stock import) check values against these.
var (
	// SupplyRange bounds |VCC| and |VEE|.
	SupplyRange = Range{Field: "vcc", Quantity: "supply voltage (magnitude)", Unit: "V", Min: 1, Max: 1500,
		Why: "below 1 V a silicon stage cannot fit VBE (about 0.65 V), an emitter drop and VCE(sat); " +
			"above 1500 V d.c. is high voltage, beyond the low-voltage band of IEC 61140"}
	// ResistanceRange bounds every resistor of a stage.
	ResistanceRange = Range{Field: "resistance", Quantity: "resistance", Unit: "Ω", Min: 1e-3, Max: 1e12,
		Why: "below 1 mΩ the wiring and contacts outweigh the part, above 1 TΩ the board's surface " +
			"leakage does (common practice)"}
	// HFERange bounds hFE min, max, typical and a pinned beta.
	HFERange = Range{Field: "hfe", Quantity: "hFE", Unit: "", Min: 1, Max: 1e5,
		Why: "a working bipolar transistor carries more collector than base current; Darlington pairs " +
			"reach some 10⁴ to 10⁵ (common practice)"}
	// ICBORange bounds the collector-base leakage at 25 °C.
	ICBORange = Range{Field: "icbo", Quantity: "ICBO at 25 °C", Unit: "A", Min: 0, Max: 1e-3,
		Why: "silicon leaks nanoamperes at 25 °C, large power transistors up to about 1 mA (from memory); " +
			"more is a broken part"}
	// VCESatRange bounds VCE(sat); it must also stay below the supply.
	VCESatRange = Range{Field: "vce_sat", Quantity: "VCE(sat)", Unit: "V", Min: 0, Max: 5,
		Why: "silicon saturates at 0.05 to 1 V, Darlingtons at about 2 V (common practice)"}
	// TjMaxRange bounds the rated maximum junction temperature.
	TjMaxRange = Range{Field: "tj_max", Quantity: "Tj max", Unit: "°C", Min: 100, Max: MaxTj_C,
		Why: "silicon transistors are rated 125 to 200 °C, small plastic packages 150 °C (common practice); " +
			"the model is not evaluated above 200 °C"}
	// JunctionVoltageRange bounds VBE(on).
	JunctionVoltageRange = Range{Field: "vbe_on", Quantity: "VBE(on)", Unit: "V", Min: 0.2, Max: 1.5,
		Why: "a silicon junction conducts at 0.5 to 0.8 V; germanium from 0.2 V, Darlingtons up to about " +
			"1.5 V (common practice)"}
	// AmbientRange bounds every ambient temperature.
	AmbientRange = Range{Field: "ambient", Quantity: "ambient", Unit: "°C", Min: MinTemp_C, Max: MaxTemp_C,
		Why: "the military temperature range of silicon parts (common practice) beyond which the " +
			"temperature laws of the model are not checked"}
)

// CheckAmbient returns nil for an ambient range whose ends lie within
// AmbientRange with min not above max, else an *InputError on "ambient":
// the one rule for an ambient range (a build's, a pick request's).
func CheckAmbient(min_C, max_C float64) error {
	for _, t := range []float64{min_C, max_C} {
		if err := AmbientRange.Check(t); err != nil {
			return err
		}
	}
	if min_C > max_C {
		return &InputError{Field: "ambient", Problem: fmt.Sprintf("minimum %g °C above maximum %g °C: give MIN..MAX", min_C, max_C)}
	}
	return nil
}

// Ranges lists every accepted range of the solver, in the order the
// README's table and --help show them.
func Ranges() []Range {
	return []Range{SupplyRange, ResistanceRange, HFERange, ICBORange, VCESatRange, TjMaxRange, JunctionVoltageRange, AmbientRange,
		YieldBoardsRange}
}

// named returns r reporting under another field name.
func (r Range) named(field string) Range { r.Field = field; return r }

// YieldBoardsRange bounds the boards of a Monte Carlo yield.
var YieldBoardsRange = Range{Field: "yield_boards", Quantity: "Monte Carlo boards", Min: 1, Max: 1_000_000,
	Why: "a million boards pin a yield to ±0.1 % (95 %) and take seconds; more only takes longer"}
