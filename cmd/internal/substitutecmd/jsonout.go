package substitutecmd

import (
	"encoding/json"
	"io"
	"math"

	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/repair"
	"biasbin/solver"
)

// jsonDoc is the --json document; SI base units, the unit in the key.
type jsonDoc struct {
	// Reference says what the readings and node voltages are measured
	// against (rail, ground).
	report.Reference
	Original   jsonOriginal    `json:"original"`
	Tolerance  float64         `json:"ic_tolerance"`
	NoneWithin bool            `json:"none_within"`
	Candidates []jsonCandidate `json:"candidates"`
	Skipped    []jsonSkipped   `json:"skipped"`
	Cautions   []string        `json:"cautions"`
}

type jsonOriginal struct {
	IC_A   float64 `json:"ic_a"`
	VCE_V  float64 `json:"vce_v"`
	Source string  `json:"source"` // "measured" or "ranges"
	// Inferred holds the twin's two readings of IC (measured only).
	Inferred *jsonInferred `json:"inferred,omitempty"`
	// Ranges is the stage solved with the original's ranges (when given).
	Ranges *jsonPoint `json:"ranges,omitempty"`
}

type jsonInferred struct {
	FromRE *jsonEstimate `json:"ic_from_re"`
	FromRC *jsonEstimate `json:"ic_from_rc"`
	IB     jsonEstimate  `json:"ib"`
}

type jsonEstimate struct {
	Value_A float64 `json:"value_a"`
	Min_A   float64 `json:"min_a"`
	Max_A   float64 `json:"max_a"`
}

type jsonPoint struct {
	Nominal jsonNominal `json:"nominal"`
	Worst   jsonWorst   `json:"worst"`
}

type jsonTransistor struct {
	ID    int64  `json:"id"`
	Label string `json:"label"`
	Bin   string `json:"bin"`
	Qty   int    `json:"qty"`
}

type jsonNominal struct {
	IC_A  float64 `json:"ic_a"`
	VCE_V float64 `json:"vce_v"`
	VB_V  float64 `json:"vb_v"`
	VE_V  float64 `json:"ve_v"`
	VC_V  float64 `json:"vc_v"`
	Tj_C  float64 `json:"tj_c"`
}

type jsonWorst struct {
	ICMin_A   float64 `json:"ic_min_a"`
	ICMax_A   float64 `json:"ic_max_a"`
	VCEMin_V  float64 `json:"vce_min_v"`
	VCEMax_V  float64 `json:"vce_max_v"`
	AllActive bool    `json:"all_active"`
}

type jsonMargins struct {
	Saturation_V float64  `json:"saturation_v"`
	VCEO_V       *float64 `json:"vceo_v"`
	ICMax_A      *float64 `json:"ic_max_a"`
	Power        *float64 `json:"power"`
}

type jsonCandidate struct {
	Rank       int            `json:"rank"`
	Transistor jsonTransistor `json:"transistor"`
	Nominal    *jsonNominal   `json:"nominal"`
	Worst      *jsonWorst     `json:"worst"`
	ICShift    *float64       `json:"ic_shift"`
	VCEShift   *float64       `json:"vce_shift"`
	Within     bool           `json:"within"`
	Margins    *jsonMargins   `json:"margins"`
	Failing    []string       `json:"failing"`
	Change     *jsonChange    `json:"change"`
}

type jsonPart struct {
	ID   int64   `json:"id"`
	Ohms float64 `json:"ohms"`
	Bin  string  `json:"bin"`
}

type jsonChange struct {
	Position    string     `json:"position"`
	FromOhms    float64    `json:"from_ohms"`
	Ohms        float64    `json:"ohms"`
	Arrangement string     `json:"arrangement"`
	Parts       []jsonPart `json:"parts"`
	After       jsonPoint  `json:"after"`
	ICShift     float64    `json:"ic_shift"`
	VCEShift    float64    `json:"vce_shift"`
	Within      bool       `json:"within"`
	Failing     []string   `json:"failing"`
}

type jsonSkipped struct {
	Transistor jsonTransistor `json:"transistor"`
	Reason     string         `json:"reason"`
}

// WriteJSON writes a substitution as one indented JSON document.
func WriteJSON(w io.Writer, req repair.SubstituteRequest, s *repair.Substitution) error {
	doc := jsonDoc{
		Reference:  report.ReferenceOf(req.Polarity, req.Build.Topology, req.Build.Ground),
		Original:   originalOf(s.Original),
		Tolerance:  s.Tolerance,
		NoneWithin: s.NoneWithin,
		Candidates: []jsonCandidate{},
		Skipped:    []jsonSkipped{},
		Cautions:   []string{},
	}
	for _, c := range s.Candidates {
		doc.Candidates = append(doc.Candidates, candidateOf(c))
	}
	for _, sk := range s.Skipped {
		why := "none on hand"
		if !sk.Empty {
			why = sk.Err.Error()
		}
		doc.Skipped = append(doc.Skipped, jsonSkipped{Transistor: transistorOf(sk.Transistor), Reason: why})
	}
	for _, c := range s.Cautions {
		doc.Cautions = append(doc.Cautions, report.BenchCaution(c))
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

func originalOf(o repair.Original) jsonOriginal {
	j := jsonOriginal{IC_A: o.IC_A, VCE_V: o.VCE_V, Source: o.Source.String()}
	if in := o.Inference; in != nil {
		inf := &jsonInferred{IB: estimateOf(in.IB)}
		if in.HasFromRE {
			e := estimateOf(in.FromRE)
			inf.FromRE = &e
		}
		if in.HasFromRC {
			e := estimateOf(in.FromRC)
			inf.FromRC = &e
		}
		j.Inferred = inf
	}
	if r := o.Ranges; r != nil {
		p := pointOf(*r)
		j.Ranges = &p
	}
	return j
}

func estimateOf(e repair.Estimate) jsonEstimate {
	return jsonEstimate{Value_A: e.Value_A, Min_A: e.Min_A, Max_A: e.Max_A}
}

func pointOf(p repair.Point) jsonPoint {
	return jsonPoint{Nominal: nominalOf(p.Nominal), Worst: worstOf(p.Worst)}
}

func nominalOf(op solver.OperatingPoint) jsonNominal {
	return jsonNominal{IC_A: op.IC_A, VCE_V: op.VCE_V, VB_V: op.VB_V, VE_V: op.VE_V, VC_V: op.VC_V, Tj_C: op.Tj_C}
}

func worstOf(wc solver.WorstCase) jsonWorst {
	return jsonWorst{ICMin_A: wc.ICMin_A, ICMax_A: wc.ICMax_A, VCEMin_V: wc.VCEMin_V, VCEMax_V: wc.VCEMax_V, AllActive: wc.AllActive}
}

func transistorOf(t picker.Transistor) jsonTransistor {
	return jsonTransistor{ID: t.ID, Label: t.Sheet.Label, Bin: t.Bin, Qty: t.Qty}
}

func finite(v float64) *float64 {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return nil
	}
	return &v
}

func marginsOf(m repair.Margins) *jsonMargins {
	j := &jsonMargins{Saturation_V: m.Saturation_V}
	if m.HasVCEO {
		j.VCEO_V = finite(m.VCEO_V)
	}
	if m.HasICMax {
		j.ICMax_A = finite(m.ICMax_A)
	}
	if m.HasPower {
		j.Power = finite(m.Power)
	}
	return j
}

func failingOf(fs []repair.Failure) []string {
	out := []string{}
	for _, f := range fs {
		out = append(out, report.SubstituteFailure(f))
	}
	return out
}

func candidateOf(c repair.Candidate) jsonCandidate {
	j := jsonCandidate{Rank: c.Rank, Transistor: transistorOf(c.Transistor), Within: c.Within, Failing: failingOf(c.Failing)}
	solved := !(len(c.Failing) > 0 && c.Failing[0].Kind == repair.FailSolve)
	if solved {
		n, w := nominalOf(c.Nominal), worstOf(c.Worst)
		j.Nominal, j.Worst = &n, &w
		j.ICShift, j.VCEShift = finite(c.ICShift), finite(c.VCEShift)
		j.Margins = marginsOf(c.Margins)
	}
	if ch := c.Change; ch != nil {
		jc := &jsonChange{Position: ch.Position.String(), FromOhms: ch.FromOhm, Ohms: ch.Filling.Ohm, Arrangement: ch.Filling.Arrangement,
			Parts: []jsonPart{}, After: pointOf(ch.After), ICShift: ch.ICShift, VCEShift: ch.VCEShift, Within: ch.Within, Failing: failingOf(ch.Failing)}
		for _, p := range ch.Filling.Parts {
			jc.Parts = append(jc.Parts, jsonPart{ID: p.ID, Ohms: p.Ohm, Bin: p.Bin})
		}
		j.Change = jc
	}
	return j
}
