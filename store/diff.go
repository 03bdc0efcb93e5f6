package store

import (
	"slices"
	"strconv"
	"strings"
)

// Change is one value of a stocked line that an import with Replace
// rewrites.
type Change struct {
	// Index is the part's index as the import was given it.
	Index int
	// LineID is the stock line rewritten.
	LineID int64
	// Field is the CSV column of the value.
	Field string
	// Stocked and Given are the old and new values as text.
	Stocked, Given string
	// Text is true for a column of free text (note, tags, polarity), whose
	// values a renderer should quote.
	Text bool
}

// difference is one value on which a part and its stocked line disagree.
type difference struct {
	field, stocked, given string
	text                  bool
}

// show writes a value of d for a message.
func (d difference) show(v string) string {
	if d.text {
		return strconv.Quote(v)
	}
	return v
}

// fieldCompare collects the differences between a stocked line and a
// part. Unless replace is set, a value the part leaves out (empty note or
// tags, an optional number left 0 before defaults) agrees with any.
type fieldCompare struct {
	replace bool
	diffs   []difference
}

// num12 writes a value to the 12 digits the store keeps; 0 of an optional
// value reads "not given".
func num12(v float64, unit string) string {
	if v == 0 {
		return "none"
	}
	return strconv.FormatFloat(v, 'g', 12, 64) + unit
}

// number compares a stocked value with the part's value after defaults
// (given); raw is the part's value as given, 0 when left out.
func (c *fieldCompare) number(field string, stocked, raw, given float64, unit string) {
	if stocked == given || (!c.replace && raw == 0) {
		return
	}
	c.diffs = append(c.diffs, difference{field, num12(stocked, unit), num12(given, unit), false})
}

// text compares two texts. Unless required, when not replacing an empty
// text on either side agrees: the part leaves it out, or fills in what the
// line lacks.
func (c *fieldCompare) text(field, stocked, given string, required bool) {
	if stocked != given && (required || c.replace || (given != "" && stocked != "")) {
		c.diffs = append(c.diffs, difference{field, stocked, given, true})
	}
}

// tags compares two sorted tag lists; when not replacing tags are only
// ever added, so any list agrees.
func (c *fieldCompare) tags(stocked, given []string) {
	if slices.Equal(stocked, given) || !c.replace {
		return
	}
	c.diffs = append(c.diffs, difference{"tags", strings.Join(stocked, ";"), strings.Join(given, ";"), true})
}

// diffResistor lists where part g (raw as given, def with defaults) disagrees
// with stocked line s of the same identity (value, tolerance, power and
// technology agree by then).
func diffResistor(s, raw, def Resistor, replace bool) []difference {
	c := fieldCompare{replace: replace}
	c.number("knee_c", s.Knee_C, raw.Knee_C, def.Knee_C, " °C")
	c.number("max_c", s.Max_C, raw.Max_C, def.Max_C, " °C")
	c.number("tcr", s.TCR_PPMPerK, raw.TCR_PPMPerK, def.TCR_PPMPerK, " ppm/K")
	c.number("lev", s.LEV_V, raw.LEV_V, def.LEV_V, " V")
	c.text("part_number", s.PartNumber, def.PartNumber, false)
	c.text("note", s.Note, def.Note, false)
	c.tags(s.Tags, def.Tags)
	return c.diffs
}

// diffTransistor lists where part g disagrees with stocked line s of the
// same label and bin.
func diffTransistor(s, raw, def Transistor, replace bool) []difference {
	c := fieldCompare{replace: replace}
	c.text("polarity", s.Polarity, def.Polarity, true)
	c.number("hfe_min", s.HFEMin, raw.HFEMin, def.HFEMin, "")
	c.number("hfe_max", s.HFEMax, raw.HFEMax, def.HFEMax, "")
	c.number("hfe_typ", s.HFETyp, raw.HFETyp, def.HFETyp, "")
	c.number("hfe_at", s.HFEAt_A, raw.HFEAt_A, def.HFEAt_A, " A")
	c.number("vbe", s.VBEOn_V, raw.VBEOn_V, def.VBEOn_V, " V")
	c.number("vbe_at", s.VBEAt_A, raw.VBEAt_A, def.VBEAt_A, " A")
	c.number("vce_sat", s.VCESat_V, raw.VCESat_V, def.VCESat_V, " V")
	c.number("vceo", s.VCEO_V, raw.VCEO_V, def.VCEO_V, " V")
	c.number("ic_max", s.ICMax_A, raw.ICMax_A, def.ICMax_A, " A")
	c.number("pd", s.PD25_W, raw.PD25_W, def.PD25_W, " W")
	c.number("theta_ja", s.ThetaJA_KPerW, raw.ThetaJA_KPerW, def.ThetaJA_KPerW, " K/W")
	c.number("tj_max", s.TjMax_C, raw.TjMax_C, def.TjMax_C, " °C")
	c.number("vaf", s.VAF_V, raw.VAF_V, def.VAF_V, " V")
	c.number("icbo", s.ICBO_A, raw.ICBO_A, def.ICBO_A, " A")
	c.number("vbe_min", s.VBEMin_V, raw.VBEMin_V, def.VBEMin_V, " V")
	c.number("vbe_max", s.VBEMax_V, raw.VBEMax_V, def.VBEMax_V, " V")
	c.number("vaf_min", s.VAFMin_V, raw.VAFMin_V, def.VAFMin_V, " V")
	c.number("vaf_max", s.VAFMax_V, raw.VAFMax_V, def.VAFMax_V, " V")
	c.text("part_number", s.PartNumber, def.PartNumber, false)
	c.text("note", s.Note, def.Note, false)
	c.tags(s.Tags, def.Tags)
	return c.diffs
}
