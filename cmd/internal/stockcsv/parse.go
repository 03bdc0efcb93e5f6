package stockcsv

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"biasbin/cmd/internal/stockparts"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/store"
)

// parser reads one row's fields, collecting a problem per bad field.
type parser struct {
	line     int
	row      map[string]string
	problems []Problem
	failed   map[string]bool // columns that already have a problem
}

func (p *parser) fail(col, msg string) {
	if p.failed == nil {
		p.failed = map[string]bool{}
	}
	p.failed[col] = true
	p.problems = append(p.problems, Problem{Line: p.line, Column: col, Msg: msg})
}

// required returns the column's text, reporting it when empty.
func (p *parser) required(col string) (string, bool) {
	s := p.row[col]
	if s == "" {
		p.fail(col, "empty (this column is required)")
		return "", false
	}
	return s, true
}

// value reads an optional (0 when empty) or required column with parse.
func (p *parser) value(col string, req bool, parse notation.Parser) float64 {
	s := p.row[col]
	if s == "" {
		if req {
			p.fail(col, "empty (this column is required)")
		}
		return 0
	}
	v, err := parse(s)
	if err != nil {
		p.fail(col, err.Error())
		return 0
	}
	return v
}

// magnitude wraps a signed parser so that "-0.65V" (a PNP's VBE) reads as
// its magnitude.
func magnitude(parse notation.Parser) notation.Parser {
	return func(s string) (float64, error) {
		v, err := parse(s)
		return math.Abs(v), err
	}
}

// qty reads the quantity column: a whole, non-negative number.
func (p *parser) qty() int {
	s, ok := p.required("qty")
	if !ok {
		return 0
	}
	n, err := strconv.Atoi(s)
	if err != nil {
		if f, ferr := strconv.ParseFloat(s, 64); ferr == nil && !math.IsNaN(f) {
			p.fail("qty", fmt.Sprintf("quantity %q is not a whole number", s))
		} else {
			p.fail("qty", fmt.Sprintf("quantity %q is not a number", s))
		}
		return 0
	}
	if n < 0 {
		p.fail("qty", fmt.Sprintf("quantity %d is negative", n))
		return 0
	}
	return n
}

// tags splits the tags column at semicolons.
func (p *parser) tags() []string {
	s := p.row["tags"]
	if s == "" {
		return nil
	}
	return strings.Split(s, ";")
}

// inRange checks each given cell's value against the solver's accepted
// range for it (solver.Ranges), the same ranges check and pick enforce.
func (p *parser) inRange(checks []rangeCheck) {
	for _, c := range checks {
		if p.row[c.col] == "" || p.failed[c.col] {
			continue
		}
		var ie *solver.InputError
		if err := c.r.Check(c.v); errors.As(err, &ie) {
			p.fail(c.col, ie.Problem)
		}
	}
}

// rangeCheck is one column's value and its accepted range.
type rangeCheck struct {
	col string
	v   float64
	r   solver.Range
}

// validate adds the store's problems for columns that read correctly.
func (p *parser) validate(ps []store.Problem) {
	for _, v := range ps {
		if !p.failed[v.Field] {
			p.fail(v.Field, v.Msg)
		}
	}
}

// techNames maps the ways a technology is written to its stored name.
var techNames = map[string]string{
	"thick": store.TechThickFilm, "thick film": store.TechThickFilm,
	"thin": store.TechThinFilm, "thin film": store.TechThinFilm,
	"metal": store.TechMetalFilm, "metal film": store.TechMetalFilm,
	"carbon": store.TechCarbonFilm, "carbon film": store.TechCarbonFilm,
	"wirewound": store.TechWirewound, "wire wound": store.TechWirewound, "ww": store.TechWirewound,
	"metal oxide": store.TechMetalOxide, "metal oxide film": store.TechMetalOxide, "mo": store.TechMetalOxide,
	"cermet": store.TechCermet,
}

// Tech returns the stored name of a technology as a technician writes it
// ("metal-film", "Thick", "wire wound"); unknown text comes back
// lower-cased for the store to reject.
func Tech(s string) string {
	k := strings.Join(strings.Fields(strings.NewReplacer("-", " ", "_", " ").Replace(strings.ToLower(s))), " ")
	if t, ok := techNames[k]; ok {
		return t
	}
	return k
}

// resistor reads a resistor row.
func (p *parser) resistor() store.Resistor {
	var r store.Resistor
	codeTol, hasTol := 0.0, false
	if s, ok := p.required("value"); ok {
		ohm, tol, has, err := notation.ParseResistance(s)
		if err != nil {
			p.fail("value", err.Error())
		}
		r.Ohm, codeTol, hasTol = ohm, tol, has
	}
	switch s := p.row["tolerance"]; {
	case s != "":
		tol, err := notation.ParseTolerance(s)
		if err != nil {
			p.fail("tolerance", err.Error())
			break
		}
		if hasTol && math.Abs(tol-codeTol) > 1e-12 {
			p.fail("tolerance", fmt.Sprintf("%s differs from the letter in value (%s)",
				notation.FormatTolerance(tol), notation.FormatTolerance(codeTol)))
		}
		r.Tol = tol
	case hasTol:
		r.Tol = codeTol
	default:
		p.fail("tolerance", "empty (give it here, like 5% or J, or as a letter after the value, like 4K7J)")
	}
	r.Rated_W = p.value("power", true, notation.ParsePower)
	r.Qty = p.qty()
	r.Bin = p.row["bin"]
	r.TCR_PPMPerK = p.value("tcr", false, notation.ParseTCR)
	r.Tech = Tech(p.row["tech"])
	r.Knee_C = p.value("knee_c", false, notation.ParseTemperature)
	r.Max_C = p.value("max_c", false, notation.ParseTemperature)
	r.Tags = p.tags()
	r.Note = p.row["note"]
	r.LEV_V = p.value("lev", false, magnitude(notation.ParseVoltage))
	r.PartNumber = p.row["part_number"]
	p.inRange([]rangeCheck{{"value", r.Ohm, solver.ResistanceRange}})
	return r
}

// transistor reads a transistor row.
func (p *parser) transistor() store.Transistor {
	var t store.Transistor
	t.Label, _ = p.required("label")
	if s, ok := p.required("polarity"); ok {
		t.Polarity = strings.ToLower(s)
	}
	num := notation.ParseNumber
	volt := magnitude(notation.ParseVoltage)
	t.HFEMin = p.value("hfe_min", true, num)
	t.HFEMax = p.value("hfe_max", true, num)
	t.Qty = p.qty()
	t.HFETyp = p.value("hfe_typ", false, num)
	t.HFEAt_A = p.value("hfe_at", false, notation.ParseCurrent)
	t.VBEOn_V = p.value("vbe", false, volt)
	t.VBEAt_A = p.value("vbe_at", false, notation.ParseCurrent)
	t.VCESat_V = p.value("vce_sat", false, volt)
	t.VCEO_V = p.value("vceo", false, volt)
	t.ICMax_A = p.value("ic_max", false, notation.ParseCurrent)
	t.PD25_W = p.value("pd", false, notation.ParsePower)
	t.ThetaJA_KPerW = p.value("theta_ja", false, notation.ParseThermalResistance)
	t.TjMax_C = p.value("tj_max", false, notation.ParseTemperature)
	t.VAF_V = p.value("vaf", false, volt)
	t.ICBO_A = p.value("icbo", false, notation.ParseCurrent)
	t.VBEMin_V = p.value("vbe_min", false, volt)
	t.VBEMax_V = p.value("vbe_max", false, volt)
	t.VAFMin_V = p.value("vaf_min", false, volt)
	t.VAFMax_V = p.value("vaf_max", false, volt)
	t.Bin = p.row["bin"]
	t.Tags = p.tags()
	t.Note = p.row["note"]
	t.PartNumber = p.row["part_number"]
	p.inRange([]rangeCheck{{"hfe_min", t.HFEMin, solver.HFERange}, {"hfe_max", t.HFEMax, solver.HFERange},
		{"hfe_typ", t.HFETyp, solver.HFERange}, {"icbo", t.ICBO_A, solver.ICBORange},
		{"vce_sat", t.VCESat_V, solver.VCESatRange}, {"tj_max", t.TjMax_C, solver.TjMaxRange},
		{"vbe", t.VBEOn_V, solver.JunctionVoltageRange},
		{"vbe_min", t.VBEMin_V, solver.JunctionVoltageRange}, {"vbe_max", t.VBEMax_V, solver.JunctionVoltageRange}})
	p.datasheet(t)
	return t
}

// ResistorFromFields reads one resistor from column texts keyed by CSV
// column name (value, tolerance, power, qty, bin, tcr, tech, knee_c,
// max_c, tags, note, lev, part_number), as a row of a file would be read. The problems have
// Line 0.
func ResistorFromFields(fields map[string]string) (store.Resistor, []Problem) {
	p := parser{row: trimmed(fields)}
	r := p.resistor()
	p.validate(r.WithDefaults().Validate())
	return r, p.problems
}

// TransistorFromFields reads one transistor from column texts keyed by CSV
// column name, as a row of a file would be read. The problems have Line 0.
func TransistorFromFields(fields map[string]string) (store.Transistor, []Problem) {
	p := parser{row: trimmed(fields)}
	t := p.transistor()
	p.validate(t.WithDefaults().Validate())
	return t, p.problems
}

func trimmed(fields map[string]string) map[string]string {
	out := make(map[string]string, len(fields))
	for k, v := range fields {
		out[k] = strings.TrimSpace(v)
	}
	return out
}

// spreadColumns maps the solver's fields for a transistor's part-to-part
// ranges to the CSV columns they come from.
var spreadColumns = map[string]string{"vbe_min": "vbe_min", "vbe_max": "vbe_max", "vaf_min": "vaf_min",
	"vaf_max": "vaf_max", "vbe_on": "vbe", "vaf": "vaf"}

// datasheet checks a row that stocks a part-to-part range against the
// solver's rules for it (both ends or neither, the nominal inside the
// range, accepted ranges) through the one stock-to-solver conversion, so
// a line the picker would refuse is refused at the row.
func (p *parser) datasheet(t store.Transistor) {
	if len(p.problems) > 0 || t.VBEMin_V == 0 && t.VBEMax_V == 0 && t.VAFMin_V == 0 && t.VAFMax_V == 0 ||
		len(t.WithDefaults().Validate()) > 0 { // the store's own problems come first
		return
	}
	_, err := stockparts.Sheet(t)
	var le *stockparts.LineError
	if !errors.As(err, &le) {
		return
	}
	if col, ok := spreadColumns[le.Field]; ok {
		p.fail(col, le.Problem)
	}
}
