package store

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode"
)

// MaxQty is the largest quantity one stock line may hold.
const MaxQty = 1_000_000_000

// canon rounds v to 12 significant digits, so that the same value written
// two ways (4K7, 4.7e3) is stored as the same float.
func canon(v float64) float64 {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return v
	}
	c, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	if err != nil {
		return v
	}
	return c
}

// fmtKey writes v exactly for an identity key.
func fmtKey(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// NormalizeTags lower-cases, trims, de-duplicates and sorts tags, dropping
// empty ones.
func NormalizeTags(tags []string) []string {
	seen := make(map[string]bool, len(tags))
	out := make([]string, 0, len(tags))
	for _, t := range tags {
		t = strings.ToLower(strings.TrimSpace(t))
		if t == "" || seen[t] {
			continue
		}
		seen[t] = true
		out = append(out, t)
	}
	sort.Strings(out)
	return out
}

// MaxTags is the most tags one stock line may carry: enough for an
// approval list, a supplier and a few properties, few enough to read.
const MaxTags = 16

// TagProblem says what is wrong with a tag as given (normalized first:
// trimmed, lower-cased), or "" for a good one: the one tag rule, which
// commands call to refuse a bad tag as a usage error before opening the
// stock.
func TagProblem(tag string) string {
	return checkTag(strings.ToLower(strings.TrimSpace(tag)))
}

// checkTag reports what is wrong with a normalized tag, or "".
func checkTag(t string) string {
	if len(t) > 64 {
		return fmt.Sprintf("tag %q is longer than 64 characters", t)
	}
	if hidden(t) {
		return fmt.Sprintf("tag %q contains an invisible control or direction-override character", t)
	}
	digits := true
	for _, r := range t {
		if unicode.IsSpace(r) || r == ';' || r == ',' {
			return fmt.Sprintf("tag %q: a tag is one word without spaces, commas or semicolons", t)
		}
		digits = digits && r >= '0' && r <= '9'
	}
	if digits {
		return fmt.Sprintf("tag %q is only digits, which reads as a line ID; give a word (batch-%s)", t, t)
	}
	return ""
}

// checkText reports what is wrong with a bin, label or note, or "".
func checkText(s string, multiline bool) string {
	if len(s) > 1000 {
		return "longer than 1000 characters"
	}
	for _, r := range s {
		if r == '\n' && multiline {
			continue
		}
		if unicode.IsControl(r) || r == unicode.ReplacementChar || invisible(r) {
			return fmt.Sprintf("contains the control, invisible or direction-override character %U", r)
		}
	}
	return ""
}

// invisible reports a character that changes how text around it shows
// without showing itself: Unicode format characters (Cf), among them the
// direction overrides U+202A..U+202E and isolates U+2066..U+2069 that can
// make a label read as another (Unicode Standard Annex #9), and the line
// and paragraph separators.
func invisible(r rune) bool {
	return unicode.Is(unicode.Cf, r) || unicode.Is(unicode.Zl, r) || unicode.Is(unicode.Zp, r)
}

// hidden reports whether s holds a control or invisible character.
func hidden(s string) bool {
	for _, r := range s {
		if unicode.IsControl(r) || invisible(r) || r == unicode.ReplacementChar {
			return true
		}
	}
	return false
}

// finiteIn reports whether lo < v < hi and v is a number.
func finiteIn(v, lo, hi float64) bool {
	return !math.IsNaN(v) && v > lo && v < hi
}

// WithDefaults returns r with the documented defaults filled in (knee and
// maximum temperature, TCR by technology, thick film when no technology is
// given), values rounded to 12 significant digits, text trimmed and tags
// normalized.
func (r Resistor) WithDefaults() Resistor {
	r.Tech = strings.ToLower(strings.TrimSpace(r.Tech))
	if r.Tech == "" {
		r.Tech = TechThickFilm
	}
	if r.Knee_C == 0 {
		r.Knee_C = DefaultKnee_C
	}
	if r.Max_C == 0 {
		r.Max_C = DefaultMax_C
	}
	if r.TCR_PPMPerK == 0 {
		if tcr, ok := DefaultTCR_PPMPerK(r.Tech); ok {
			r.TCR_PPMPerK = tcr
		}
	}
	r.Ohm, r.Tol, r.Rated_W = canon(r.Ohm), canon(r.Tol), canon(r.Rated_W)
	r.Knee_C, r.Max_C, r.TCR_PPMPerK = canon(r.Knee_C), canon(r.Max_C), canon(r.TCR_PPMPerK)
	r.LEV_V = canon(r.LEV_V)
	r.PartNumber = strings.TrimSpace(r.PartNumber)
	r.Bin = strings.TrimSpace(r.Bin)
	r.Note = strings.TrimSpace(r.Note)
	r.Tags = NormalizeTags(r.Tags)
	return r
}

// Validate returns every rule r breaks (call it on r.WithDefaults()). Each
// problem's Field is the CSV column the value comes from.
func (r Resistor) Validate() []Problem {
	var ps []Problem
	add := func(field, format string, a ...any) {
		ps = append(ps, Problem{Kind: KindResistor, Field: field, Msg: fmt.Sprintf(format, a...)})
	}
	switch {
	case math.IsNaN(r.Ohm) || r.Ohm <= 0:
		add("value", "resistance must be above 0 Ω (zero-ohm links are not stocked)")
	case r.Ohm >= 1e13:
		add("value", "resistance %g Ω is not below 10 TΩ", r.Ohm)
	}
	if !finiteIn(r.Tol, 0, 1) {
		add("tolerance", "tolerance %g %% is not above 0 %% and below 100 %%", r.Tol*100)
	}
	if !finiteIn(r.Rated_W, 0, 1e6) {
		add("power", "rated power %g W is not above 0 W (and below 1 MW)", r.Rated_W)
	}
	if !finiteIn(r.Knee_C, -273.15, 1000) {
		add("knee_c", "knee temperature %g °C is out of range", r.Knee_C)
	}
	if !finiteIn(r.Max_C, -273.15, 1000) {
		add("max_c", "maximum temperature %g °C is out of range", r.Max_C)
	} else if r.Max_C <= r.Knee_C {
		add("max_c", "maximum temperature %g °C is not above the knee %g °C", r.Max_C, r.Knee_C)
	}
	if !finiteIn(r.TCR_PPMPerK, -1e5, 1e5) {
		add("tcr", "TCR %g ppm/K is out of range", r.TCR_PPMPerK)
	}
	if _, ok := DefaultTCR_PPMPerK(r.Tech); !ok {
		add("tech", "unknown technology %q (want %s)", r.Tech, strings.Join(Technologies(), ", "))
	}
	if math.IsNaN(r.LEV_V) || r.LEV_V < 0 || r.LEV_V >= 1e6 {
		add("lev", "limiting element voltage %g V is negative or out of range (0 = not stated)", r.LEV_V)
	}
	ps = append(ps, partNumberProblems(KindResistor, r.PartNumber)...)
	ps = append(ps, commonProblems(KindResistor, r.Qty, r.Bin, r.Note, r.Tags)...)
	return ps
}

// partNumberProblems checks a maker's part number: one line of printable
// text.
func partNumberProblems(k Kind, pn string) []Problem {
	if m := checkText(pn, false); m != "" {
		return []Problem{{Kind: k, Field: "part_number", Msg: "part number " + m}}
	}
	return nil
}

// commonProblems checks the fields every kind has.
func commonProblems(k Kind, qty int, bin, note string, tags []string) []Problem {
	var ps []Problem
	add := func(field, msg string) { ps = append(ps, Problem{Kind: k, Field: field, Msg: msg}) }
	if qty < 0 {
		add("qty", fmt.Sprintf("quantity %d is negative", qty))
	} else if qty > MaxQty {
		add("qty", fmt.Sprintf("quantity %d is above %d", qty, MaxQty))
	}
	if m := checkText(bin, false); m != "" {
		add("bin", m)
	}
	if m := checkText(note, true); m != "" {
		add("note", m)
	}
	for _, t := range tags {
		if m := checkTag(t); m != "" {
			add("tags", m)
		}
	}
	if len(tags) > MaxTags {
		add("tags", fmt.Sprintf("%d tags; a line carries at most %d", len(tags), MaxTags))
	}
	return ps
}

// ident is the line's identity within its kind and bin.
func (r Resistor) ident() string {
	return fmtKey(r.Ohm) + "|" + fmtKey(r.Tol) + "|" + fmtKey(r.Rated_W) + "|" + r.Tech
}

// WithDefaults returns t with the documented defaults filled in (VBE(on)
// 0.65 V at 1 mA, Tj max 150 °C), values rounded to 12 significant digits,
// polarity lower-cased, text trimmed and tags normalized.
func (t Transistor) WithDefaults() Transistor {
	t.Label = strings.TrimSpace(t.Label)
	t.Polarity = strings.ToLower(strings.TrimSpace(t.Polarity))
	if t.VBEOn_V == 0 {
		t.VBEOn_V = DefaultVBEOn_V
		if t.VBEMin_V > 0 && t.VBEMax_V > 0 {
			t.VBEOn_V = 0.5 * (t.VBEMin_V + t.VBEMax_V) // the middle of the stocked range
		}
	}
	if t.VBEAt_A == 0 {
		t.VBEAt_A = DefaultVBEAt_A
	}
	if t.TjMax_C == 0 {
		t.TjMax_C = DefaultTjMax_C
	}
	for _, p := range []*float64{&t.HFEMin, &t.HFEMax, &t.HFETyp, &t.HFEAt_A, &t.VBEOn_V, &t.VBEAt_A,
		&t.VCESat_V, &t.VCEO_V, &t.ICMax_A, &t.PD25_W, &t.ThetaJA_KPerW, &t.TjMax_C, &t.VAF_V, &t.ICBO_A,
		&t.VBEMin_V, &t.VBEMax_V, &t.VAFMin_V, &t.VAFMax_V} {
		*p = canon(*p)
	}
	t.PartNumber = strings.TrimSpace(t.PartNumber)
	t.Bin = strings.TrimSpace(t.Bin)
	t.Note = strings.TrimSpace(t.Note)
	t.Tags = NormalizeTags(t.Tags)
	return t
}

// Validate returns every rule t breaks (call it on t.WithDefaults()). Each
// problem's Field is the CSV column the value comes from.
func (t Transistor) Validate() []Problem {
	var ps []Problem
	add := func(field, format string, a ...any) {
		ps = append(ps, Problem{Kind: KindTransistor, Field: field, Msg: fmt.Sprintf(format, a...)})
	}
	if t.Label == "" {
		add("label", "empty label")
	} else if m := checkText(t.Label, false); m != "" {
		add("label", "%s", m)
	}
	if t.Polarity != "npn" && t.Polarity != "pnp" {
		add("polarity", "unknown polarity %q (want npn or pnp)", t.Polarity)
	}
	hfeOK := true
	if !finiteIn(t.HFEMin, 0, 1e6) {
		add("hfe_min", "hFE min %g is not above 0", t.HFEMin)
		hfeOK = false
	}
	if !finiteIn(t.HFEMax, 0, 1e6) {
		add("hfe_max", "hFE max %g is not above 0 (and below 1e6)", t.HFEMax)
		hfeOK = false
	}
	if hfeOK && t.HFEMin > t.HFEMax {
		add("hfe_max", "hFE min %g is above hFE max %g", t.HFEMin, t.HFEMax)
	}
	if t.HFETyp != 0 && (!finiteIn(t.HFETyp, 0, 1e6) || (hfeOK && (t.HFETyp < t.HFEMin || t.HFETyp > t.HFEMax))) {
		add("hfe_typ", "typical hFE %g is not between hFE min and max", t.HFETyp)
	}
	optional := []struct {
		field, what, unit string
		v, hi             float64
	}{
		{"hfe_at", "hFE test current", "A", t.HFEAt_A, 1e4},
		{"vce_sat", "VCE(sat)", "V", t.VCESat_V, 100},
		{"vceo", "VCEO", "V", t.VCEO_V, 1e5},
		{"ic_max", "IC max", "A", t.ICMax_A, 1e4},
		{"pd", "dissipation", "W", t.PD25_W, 1e6},
		{"theta_ja", "θJA", "K/W", t.ThetaJA_KPerW, 1e5},
		{"vaf", "Early voltage", "V", t.VAF_V, 1e6},
		{"icbo", "ICBO", "A", t.ICBO_A, 1},
		{"vbe_min", "VBE(on) min", "V", t.VBEMin_V, 10},
		{"vbe_max", "VBE(on) max", "V", t.VBEMax_V, 10},
		{"vaf_min", "Early voltage min", "V", t.VAFMin_V, 1e6},
		{"vaf_max", "Early voltage max", "V", t.VAFMax_V, 1e6},
	}
	for _, o := range optional {
		if math.IsNaN(o.v) || o.v < 0 || o.v >= o.hi {
			add(o.field, "%s %g %s is negative or out of range", o.what, o.v, o.unit)
		}
	}
	for _, pr := range []struct {
		lo, hi   string
		loV, hiV float64
	}{{"vbe_min", "vbe_max", t.VBEMin_V, t.VBEMax_V}, {"vaf_min", "vaf_max", t.VAFMin_V, t.VAFMax_V}} {
		switch {
		case (pr.loV > 0) != (pr.hiV > 0):
			add(pr.hi, "%s and %s go together: give both or neither", pr.lo, pr.hi)
		case pr.hiV < pr.loV:
			add(pr.hi, "%s %g V is below %s %g V", pr.hi, pr.hiV, pr.lo, pr.loV)
		}
	}
	if !finiteIn(t.VBEOn_V, 0, 10) {
		add("vbe", "VBE(on) %g V is not between 0 V and 10 V", t.VBEOn_V)
	}
	if !finiteIn(t.VBEAt_A, 0, 1e4) {
		add("vbe_at", "VBE(on) test current %g A is not above 0 A", t.VBEAt_A)
	}
	if !finiteIn(t.TjMax_C, 25, 1000) {
		add("tj_max", "Tj max %g °C is not above 25 °C", t.TjMax_C)
	}
	ps = append(ps, partNumberProblems(KindTransistor, t.PartNumber)...)
	ps = append(ps, commonProblems(KindTransistor, t.Qty, t.Bin, t.Note, t.Tags)...)
	return ps
}

// ident is the line's identity within its kind and bin.
func (t Transistor) ident() string { return t.Label }
