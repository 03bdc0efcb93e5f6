package diagnosecmd

import (
	"encoding/json"
	"io"
	"math"

	"biasbin/cmd/internal/report"
	"biasbin/picker/repair"
	"biasbin/solver/fault"
)

// jsonDoc is the --json document; SI base units, the unit in the key.
type jsonDoc struct {
	// Reference says what the readings are measured against (rail,
	// ground).
	report.Reference
	Readings  jsonReadings `json:"readings"`
	Meter     jsonMeter    `json:"meter"`
	Working   jsonWorking  `json:"working"`
	Healthy   bool         `json:"healthy"`
	Explained bool         `json:"explained"`
	Faults    []jsonFault  `json:"faults"`
	Next      *jsonNext    `json:"next_measurement"`
	Fit       string       `json:"fit_measure"`
	Cautions  []string     `json:"cautions"`
}

type jsonReadings struct {
	VB_V float64 `json:"vb_v"`
	VE_V float64 `json:"ve_v"`
	VC_V float64 `json:"vc_v"`
}

type jsonMeter struct {
	Fraction    float64 `json:"fraction"`
	Offset_V    float64 `json:"offset_v"`
	Input_Ohm   float64 `json:"input_ohms"`
	VBESpread_V float64 `json:"vbe_spread_v"`
}

type jsonWorking struct {
	Fit       *float64     `json:"fit"`
	Predicted jsonReadings `json:"predicted"`
}

type jsonFault struct {
	Rank      int          `json:"rank"`
	Position  string       `json:"position"`
	Kind      string       `json:"kind"`
	Ohms      *float64     `json:"ohms"`
	Leak_A    *float64     `json:"leak_a,omitempty"`
	HFE       float64      `json:"hfe"`
	Fit       *float64     `json:"fit"`
	RMS       *float64     `json:"rms"`
	Predicted jsonReadings `json:"predicted"`
	IC_A      float64      `json:"ic_a"`
}

type jsonExpect struct {
	Outcome string   `json:"outcome"`
	Value   *float64 `json:"value"`
	Text    string   `json:"text"`
}

type jsonNext struct {
	Check    string     `json:"check"`
	Position string     `json:"position"`
	Action   string     `json:"action"`
	IfFirst  jsonExpect `json:"if_first"`
	IfSecond jsonExpect `json:"if_second"`
}

// fitMeasure states the measure behind "fit" in the document itself.
const fitMeasure = "max over vb, ve, vc of |predicted - measured| / (fraction*|measured| + offset_v); <= 1 means within the meter accuracy"

func finite(v float64) *float64 {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return nil
	}
	return &v
}

func readingsOf(r fault.Readings) jsonReadings {
	return jsonReadings{VB_V: r.VB_V, VE_V: r.VE_V, VC_V: r.VC_V}
}

func expectOf(c fault.Check, e fault.Expect) jsonExpect {
	j := jsonExpect{Outcome: e.Outcome.String(), Text: report.Expectation(c, e)}
	if e.Outcome == fault.Value {
		j.Value = finite(e.Value)
	}
	return j
}

// WriteJSON writes a diagnosis as one indented JSON document.
func WriteJSON(w io.Writer, req repair.DiagnoseRequest, d *repair.Diagnosis) error {
	m := d.Settings.Meter
	doc := jsonDoc{
		Reference: report.ReferenceOf(req.Device.Polarity, req.Stage.Topology, req.Stage.Ground),
		Readings:  readingsOf(req.Readings),
		Meter:     jsonMeter{Fraction: m.Fraction, Offset_V: m.Offset_V, Input_Ohm: m.Input_Ohm, VBESpread_V: d.Settings.VBESpread_V},
		Working:   jsonWorking{Fit: finite(d.Working.Fit), Predicted: readingsOf(d.Working.Predicted)},
		Healthy:   d.Healthy,
		Explained: d.Explained,
		Faults:    []jsonFault{},
		Fit:       fitMeasure,
		Cautions:  []string{},
	}
	for _, c := range d.Faults {
		j := jsonFault{Rank: c.Rank, Position: c.Fault.Position.String(), Kind: c.Fault.Kind.String(), HFE: c.HFE,
			Fit: finite(c.Fit), RMS: finite(c.RMS), Predicted: readingsOf(c.Predicted), IC_A: c.Point.IC_A}
		switch c.Fault.Kind {
		case fault.Drift:
			j.Ohms = finite(c.Fault.Ohm)
		case fault.Short:
			j.Ohms = finite(fault.ShortOhm)
		case fault.Leak:
			j.Leak_A = finite(c.Fault.Leak_A)
		}
		doc.Faults = append(doc.Faults, j)
	}
	if n := d.Next; n != nil {
		doc.Next = &jsonNext{Check: n.Check.String(), Position: n.Position.String(), Action: report.CheckAction(n.Check, n.Position),
			IfFirst: expectOf(n.Check, n.IfFirst), IfSecond: expectOf(n.Check, n.IfSecond)}
	}
	for _, c := range d.Cautions {
		doc.Cautions = append(doc.Cautions, report.BenchCaution(c))
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}
