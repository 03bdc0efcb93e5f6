package checkcmd

import (
	"encoding/json"
	"fmt"
	"io"

	"biasbin/cmd/internal/report"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/safety"
)

// The JSON document of `check --json`. Units are SI base units, named in
// every key; temperatures in °C.
type jsonDoc struct {
	Topology   string  `json:"topology"`
	Polarity   string  `json:"polarity"`
	Transistor string  `json:"transistor"`
	VCC_V      float64 `json:"vcc_v"` // the supply as a meter reads it against 0 V
	VEE_V      float64 `json:"vee_v,omitempty"`
	report.Reference
	VCCTol      float64                 `json:"vcc_tol"`
	Ambient     jsonRange               `json:"ambient_c"`
	Region      string                  `json:"region"`
	Nominal     jsonNominal             `json:"nominal"`
	Model       report.Model            `json:"model"`
	Resistors   map[string]jsonResistor `json:"resistors"`
	TestPoints  map[string]jsonBand     `json:"test_points"`
	Corners     []jsonCorner            `json:"corners"`
	Worst       *jsonWorst              `json:"worst"`
	Yield       *report.YieldJSON       `json:"yield"`
	Swing       jsonSwing               `json:"swing"`
	Dissipation jsonDissipation         `json:"dissipation"`
	Sensitivity *jsonSensitivity        `json:"sensitivity"`
	Verdict     jsonVerdict             `json:"verdict"`
	Cautions    []jsonCaution           `json:"cautions"`
	Problems    []string                `json:"problems"`
	Spice       string                  `json:"spice,omitempty"`
}

// jsonVerdict is the build's standing: fails when a hard limit breaks.
type jsonVerdict struct {
	Fails    bool   `json:"fails"`
	Cautions int    `json:"cautions"`
	Text     string `json:"text"`
}

// jsonCaution is one caution: its typed figures and the same in words.
type jsonCaution struct {
	safety.Caution
	Text string `json:"text"`
}

type jsonRange struct {
	Min float64 `json:"min"`
	Max float64 `json:"max"`
}

type jsonNominal struct {
	Ambient_C    float64 `json:"ambient_c"`
	Region       string  `json:"region"`
	IC_A         float64 `json:"ic_a"`
	IB_A         float64 `json:"ib_a"`
	IE_A         float64 `json:"ie_a"`
	VCE_V        float64 `json:"vce_v"`
	VBE_V        float64 `json:"vbe_v"`
	VB_V         float64 `json:"vb_v"`
	VE_V         float64 `json:"ve_v"`
	VC_V         float64 `json:"vc_v"`
	Beta         float64 `json:"beta"` // IC/IB at this point
	BF           float64 `json:"bf"`   // model forward beta at TNOM
	Tj_C         float64 `json:"tj_c"`
	IDivider_A   float64 `json:"idivider_a"`
	PTransistorW float64 `json:"p_transistor_w"`
}

type jsonResistor struct {
	// Joins are the two points the resistor joins ("+v", "base").
	Joins         [2]job.Point `json:"joins"`
	Ohms          float64      `json:"ohms"`
	Tol           float64      `json:"tol"`
	TCR_PPMPerK   float64      `json:"tcr_ppm_per_k"`
	Rated_W       float64      `json:"rated_w"`
	EffectiveOhms float64      `json:"effective_ohms"` // at the nominal point, after TCR
	Power_W       float64      `json:"power_w"`
	Allowed_W     float64      `json:"allowed_w"`
	Utilization   float64      `json:"utilization"`
	WorstPower_W  float64      `json:"worst_power_w"`
	WorstUtil     float64      `json:"worst_utilization"`
}

type jsonBand struct {
	Nominal_V float64 `json:"nominal_v"`
	Min_V     float64 `json:"min_v"`
	Max_V     float64 `json:"max_v"`
}

type jsonCorner struct {
	BF       float64            `json:"bf"`
	VBEOn_V  float64            `json:"vbe_on_v"`
	IS_A     float64            `json:"is_a"`
	VAF_V    float64            `json:"vaf_v"`
	Temp_C   float64            `json:"temp_c"`
	Tj_C     float64            `json:"tj_c"`
	VCC_V    float64            `json:"vcc_v"`
	VEE_V    float64            `json:"vee_v,omitempty"`
	Ohms     map[string]float64 `json:"ohms"`
	IC_A     float64            `json:"ic_a"`
	IB_A     float64            `json:"ib_a"`
	VCE_V    float64            `json:"vce_v"`
	VB_V     float64            `json:"vb_v"`
	VC_V     float64            `json:"vc_v"`
	VE_V     float64            `json:"ve_v"`
	Region   string             `json:"region"`
	PTrans_W float64            `json:"p_transistor_w"`
}

type jsonWorst struct {
	Corners      int     `json:"corners"`
	ICMin_A      float64 `json:"ic_min_a"`
	ICMax_A      float64 `json:"ic_max_a"`
	VCEMin_V     float64 `json:"vce_min_v"`
	VCEMax_V     float64 `json:"vce_max_v"`
	ICMinCorner  int     `json:"ic_min_corner"`
	ICMaxCorner  int     `json:"ic_max_corner"`
	VCEMinCorner int     `json:"vce_min_corner"`
	VCEMaxCorner int     `json:"vce_max_corner"`
	AllActive    bool    `json:"all_active"`
	NotActive    int     `json:"corners_not_active"`
	VCEFloor_V   float64 `json:"vce_floor_v"` // VCE(sat) + margin every corner must keep
	RSSIC_A      float64 `json:"rss_ic_a"`
	RSSVCE_V     float64 `json:"rss_vce_v"`
	TjMax_C      float64 `json:"tj_max_c"`
}

type jsonSwing struct {
	RDC_Ohm        float64 `json:"rdc_ohms"`
	RAC_Ohm        float64 `json:"rac_ohms"`
	RL_Ohm         float64 `json:"load_ohms"`
	RBypass_Ohm    float64 `json:"bypass_ohms"`
	ICSatDC_A      float64 `json:"ic_sat_dc_a"`
	VCECutDC_V     float64 `json:"vce_cut_dc_v"`
	ICSatAC_A      float64 `json:"ic_sat_ac_a"`
	VCECutAC_V     float64 `json:"vce_cut_ac_v"`
	VPeak_V        float64 `json:"v_peak_v"`
	VPeakLoad_V    float64 `json:"v_peak_load_v"`
	ClipsFirst     string  `json:"clips_first"`
	OptimumIC_A    float64 `json:"optimum_ic_a"`
	OptimumVCE_V   float64 `json:"optimum_vce_v"`
	OptimumVPeak_V float64 `json:"optimum_v_peak_v"`
}

type jsonDissipation struct {
	Nominal jsonDissSet `json:"nominal"`
	Worst   jsonDissSet `json:"worst"`
}

type jsonDissSet struct {
	Parts          map[string]jsonLoad `json:"parts"`
	MaxUtilization float64             `json:"max_utilization"`
	Ok             bool                `json:"ok"`
}

type jsonLoad struct {
	Power_W     float64 `json:"power_w"`
	Allowed_W   float64 `json:"allowed_w"`
	Utilization float64 `json:"utilization"`
	Rated       bool    `json:"rated"`
}

type jsonSensitivity struct {
	SI           float64 `json:"s_i"`
	SV_S         float64 `json:"s_v_s"`
	SBeta_A      float64 `json:"s_beta_a"`
	BetaSpread   float64 `json:"beta_spread"`
	ICAtHFEMin_A float64 `json:"ic_at_hfe_min_a"`
	ICAtHFEMax_A float64 `json:"ic_at_hfe_max_a"`
	Tj_C         float64 `json:"tj_c"`
}

// writeJSON writes the whole result; json.Marshal refuses NaN and Inf, so
// a non-finite figure anywhere is an error rather than bad output.
func writeJSON(w io.Writer, r *job.Analysis, withSpice bool) error {
	doc := jsonDocOf(r)
	if withSpice {
		doc.Spice = netlist(r)
	}
	data, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	_, err = fmt.Fprintf(w, "%s\n", data)
	return err
}

func jsonDocOf(r *job.Analysis) jsonDoc {
	b := r.Request.Build
	op := r.Nominal
	doc := jsonDoc{
		Topology:   b.Topology.String(),
		Polarity:   b.Device.Polarity.String(),
		Transistor: r.Request.Label,
		VCC_V:      b.Ground.Supply_V(b.VCC_V),
		VEE_V:      b.VEE_V,
		Reference:  report.ReferenceOf(b.Device.Polarity, b.Topology, b.Ground),
		VCCTol:     b.VCCTol,
		Ambient:    jsonRange{b.AmbientMin_C, b.AmbientMax_C},
		Region:     op.Region.String(),
		Nominal: jsonNominal{
			Ambient_C: b.NominalAmbient_C, Region: op.Region.String(),
			IC_A: op.IC_A, IB_A: op.IB_A, IE_A: op.IE_A, VCE_V: op.VCE_V, VBE_V: op.VBE_V,
			VB_V: op.VB_V, VE_V: op.VE_V, VC_V: op.VC_V, Beta: r.DCBeta(), BF: r.Model.BF, Tj_C: op.Tj_C,
			IDivider_A: op.IDivider_A, PTransistorW: op.PTransistor_W,
		},
		Model:      report.ModelOf(r.Model),
		Resistors:  map[string]jsonResistor{},
		TestPoints: map[string]jsonBand{},
		Corners:    []jsonCorner{},
		Swing: jsonSwing{
			RDC_Ohm: r.Swing.RDC_Ohm, RAC_Ohm: r.Swing.RAC_Ohm, RL_Ohm: b.RL_Ohm, RBypass_Ohm: b.RBypass_Ohm,
			ICSatDC_A: r.Swing.ICSatDC_A, VCECutDC_V: r.Swing.VCECutDC_V,
			ICSatAC_A: r.Swing.ICSatAC_A, VCECutAC_V: r.Swing.VCECutAC_V,
			VPeak_V: r.Swing.VPeak_V, VPeakLoad_V: r.Swing.VPeakLoad_V, ClipsFirst: r.Swing.ClipsFirst,
			OptimumIC_A: r.Swing.OptimumIC_A, OptimumVCE_V: r.Swing.OptimumVCE_V, OptimumVPeak_V: r.Swing.OptimumVPeak_V,
		},
		Dissipation: jsonDissipation{Nominal: dissSet(r, r.NominalDissipation), Worst: dissSet(r, r.WorstDissipation())},
		Verdict:     jsonVerdict{Fails: r.Verdict.Fails, Cautions: r.Verdict.Cautions, Text: report.Verdict(r.Verdict)},
		Cautions:    []jsonCaution{},
		Problems:    problems(r),
	}
	worst := r.WorstDissipation()
	joins := map[solver.Slot][2]job.Point{}
	for _, j := range r.Joins {
		joins[j.Slot] = [2]job.Point{j.From, j.To}
	}
	for _, p := range r.Loads(r.NominalDissipation) {
		if p.Part == job.PartQ1 {
			continue
		}
		spec := b.Resistors[p.Slot]
		doc.Resistors[p.Part] = jsonResistor{
			Joins: joins[p.Slot],
			Ohms:  spec.Nominal_Ohm, Tol: spec.Tol, TCR_PPMPerK: spec.TCR_PPMPerK, Rated_W: spec.Rated_W,
			EffectiveOhms: r.Stage.R_Ohm[p.Slot], Power_W: p.Load.Power_W, Allowed_W: p.Load.Allowed_W,
			Utilization: p.Load.Utilization, WorstPower_W: worst.Resistor[p.Slot].Power_W, WorstUtil: worst.Resistor[p.Slot].Utilization,
		}
	}
	for _, tp := range r.TestPoints {
		doc.TestPoints[tp.Node.String()] = jsonBand{tp.Nominal_V, tp.Min_V, tp.Max_V}
	}
	if wc := r.Worst; wc != nil {
		for _, c := range wc.Corners {
			jc := jsonCorner{
				BF: c.BF, VBEOn_V: c.VBEOn_V, IS_A: c.IS_A, VAF_V: c.VAF_V, Temp_C: c.Temp_C, Tj_C: c.Tj_C, VCC_V: b.Ground.Supply_V(c.VCC_V), VEE_V: c.VEE_V, Ohms: map[string]float64{},
				IC_A: c.OP.IC_A, IB_A: c.OP.IB_A, VCE_V: c.OP.VCE_V, VB_V: c.OP.VB_V, VC_V: c.OP.VC_V, VE_V: c.OP.VE_V,
				Region: c.OP.Region.String(), PTrans_W: c.OP.PTransistor_W,
			}
			for _, s := range b.Topology.Slots() {
				jc.Ohms[s.String()] = c.R_Ohm[s]
			}
			doc.Corners = append(doc.Corners, jc)
		}
		doc.Worst = &jsonWorst{
			Corners: wc.Count, ICMin_A: wc.ICMin_A, ICMax_A: wc.ICMax_A, VCEMin_V: wc.VCEMin_V, VCEMax_V: wc.VCEMax_V,
			ICMinCorner: wc.ICMinCorner, ICMaxCorner: wc.ICMaxCorner, VCEMinCorner: wc.VCEMinCorner, VCEMaxCorner: wc.VCEMaxCorner,
			AllActive: wc.AllActive, NotActive: wc.NotActive, VCEFloor_V: r.VCEFloor_V(),
			RSSIC_A: wc.RSSIC_A, RSSVCE_V: wc.RSSVCE_V, TjMax_C: wc.TjMax_C,
		}
	}
	if y := r.Yield; y != nil {
		yj := report.YieldJSONOf(*y, r.Request.Build, r.Window)
		doc.Yield = &yj
	}
	if s := r.Sensitivity; s != nil {
		doc.Sensitivity = &jsonSensitivity{s.SI, s.SV_S, s.SBeta_A, s.BetaSpread, s.ICAtHFEMin_A, s.ICAtHFEMax_A, s.Tj_C}
	}
	for _, c := range r.Safety {
		doc.Cautions = append(doc.Cautions, jsonCaution{Caution: c, Text: report.Caution(c)})
	}
	if doc.Problems == nil {
		doc.Problems = []string{}
	}
	return doc
}

// dissSet is the JSON shape of one dissipation check.
func dissSet(r *job.Analysis, d solver.Dissipation) jsonDissSet {
	set := jsonDissSet{Parts: map[string]jsonLoad{}, MaxUtilization: d.MaxUtilization, Ok: d.Ok}
	for _, p := range r.Loads(d) {
		set.Parts[p.Part] = jsonLoad{p.Load.Power_W, p.Load.Allowed_W, p.Load.Utilization, p.Load.Rated}
	}
	return set
}
