package stockcmd

import (
	"fmt"
	"strings"

	"biasbin/solver/notation"
	"biasbin/store"
)

// describeResistor names a resistor line in one phrase:
// "4K7 ±5 % 250 mW metal film, bin A1".
func describeResistor(r store.Resistor) string {
	return fmt.Sprintf("%s %s %s %s%s", notation.FormatResistanceExact(r.Ohm), notation.FormatTolerance(r.Tol),
		notation.FormatPower(r.Rated_W), r.Tech, binPhrase(r.Bin))
}

// describeTransistor names a transistor line: "BC-X npn, bin B2".
func describeTransistor(t store.Transistor) string {
	return fmt.Sprintf("%s %s%s", t.Label, t.Polarity, binPhrase(t.Bin))
}

func binPhrase(bin string) string {
	if bin == "" {
		return ", no bin"
	}
	return ", bin " + bin
}

// jsonResistor is a resistor line in --json output (SI keys).
type jsonResistor struct {
	ID          int64   `json:"id"`
	Kind        string  `json:"kind"`
	Code        string  `json:"code"`
	Ohms        float64 `json:"ohms"`
	Tol         float64 `json:"tol"`
	Power_W     float64 `json:"power_w"`
	Knee_C      float64 `json:"knee_c"`
	Max_C       float64 `json:"max_c"`
	TCR_PPMPerK float64 `json:"tcr_ppm_per_k"`
	Tech        string  `json:"tech"`
	// LEV_V is the limiting element voltage the line states; 0 = not
	// stated (check and pick then take the default by power rating).
	LEV_V      float64 `json:"lev_v"`
	PartNumber string  `json:"part_number"`
	// Match is how the line stands to `stock list --value` ("in",
	// "below", "above"); omitted otherwise.
	Match string   `json:"match,omitempty"`
	Qty   int      `json:"qty"`
	Bin   string   `json:"bin"`
	Note  string   `json:"note"`
	Tags  []string `json:"tags"`
}

func toJSONResistor(r store.Resistor) jsonResistor {
	return jsonResistor{ID: r.ID, Kind: string(store.KindResistor), Code: notation.FormatResistanceExact(r.Ohm),
		Ohms: r.Ohm, Tol: r.Tol, Power_W: r.Rated_W, Knee_C: r.Knee_C, Max_C: r.Max_C,
		TCR_PPMPerK: r.TCR_PPMPerK, Tech: r.Tech, LEV_V: r.LEV_V, PartNumber: r.PartNumber, Qty: r.Qty, Bin: r.Bin, Note: r.Note, Tags: nonNil(r.Tags)}
}

// jsonTransistor is a transistor line in --json output (SI keys; 0 means
// not given).
type jsonTransistor struct {
	ID            int64   `json:"id"`
	Kind          string  `json:"kind"`
	Label         string  `json:"label"`
	Polarity      string  `json:"polarity"`
	HFEMin        float64 `json:"hfe_min"`
	HFEMax        float64 `json:"hfe_max"`
	HFETyp        float64 `json:"hfe_typ"`
	HFEAt_A       float64 `json:"hfe_at_a"`
	VBEOn_V       float64 `json:"vbe_on_v"`
	VBEAt_A       float64 `json:"vbe_at_a"`
	VCESat_V      float64 `json:"vce_sat_v"`
	VCEO_V        float64 `json:"vceo_v"`
	ICMax_A       float64 `json:"ic_max_a"`
	PD25_W        float64 `json:"pd25_w"`
	ThetaJA_KPerW float64 `json:"theta_ja_k_per_w"`
	TjMax_C       float64 `json:"tj_max_c"`
	VAF_V         float64 `json:"vaf_v"`
	ICBO_A        float64 `json:"icbo_a"`
	// VBEMin_V..VBEMax_V and VAFMin_V..VAFMax_V are the stocked
	// part-to-part ranges; 0 = not stocked (the default spread applies).
	VBEMin_V   float64  `json:"vbe_min_v"`
	VBEMax_V   float64  `json:"vbe_max_v"`
	VAFMin_V   float64  `json:"vaf_min_v"`
	VAFMax_V   float64  `json:"vaf_max_v"`
	PartNumber string   `json:"part_number"`
	Qty        int      `json:"qty"`
	Bin        string   `json:"bin"`
	Note       string   `json:"note"`
	Tags       []string `json:"tags"`
}

func toJSONTransistor(t store.Transistor) jsonTransistor {
	return jsonTransistor{ID: t.ID, Kind: string(store.KindTransistor), Label: t.Label, Polarity: t.Polarity,
		HFEMin: t.HFEMin, HFEMax: t.HFEMax, HFETyp: t.HFETyp, HFEAt_A: t.HFEAt_A, VBEOn_V: t.VBEOn_V,
		VBEAt_A: t.VBEAt_A, VCESat_V: t.VCESat_V, VCEO_V: t.VCEO_V, ICMax_A: t.ICMax_A, PD25_W: t.PD25_W,
		ThetaJA_KPerW: t.ThetaJA_KPerW, TjMax_C: t.TjMax_C, VAF_V: t.VAF_V, ICBO_A: t.ICBO_A,
		VBEMin_V: t.VBEMin_V, VBEMax_V: t.VBEMax_V, VAFMin_V: t.VAFMin_V, VAFMax_V: t.VAFMax_V,
		PartNumber: t.PartNumber, Qty: t.Qty, Bin: t.Bin, Note: t.Note, Tags: nonNil(t.Tags)}
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// orDash writes "-" for an empty cell.
func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "-"
	}
	return s
}
