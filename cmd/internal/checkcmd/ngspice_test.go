package checkcmd

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"biasbin/cmd/internal/report"
	"biasbin/solver"
	"biasbin/solver/spicecheck"
)

// checkDoc is the part of `check --json` a simulator rerun needs.
type checkDoc struct {
	Topology string       `json:"topology"`
	Region   string       `json:"region"`
	VCC_V    float64      `json:"vcc_v"`
	VEE_V    float64      `json:"vee_v"`
	Model    report.Model `json:"model"`
	Nominal  struct {
		IC_A  float64 `json:"ic_a"`
		VB_V  float64 `json:"vb_v"`
		VC_V  float64 `json:"vc_v"`
		VE_V  float64 `json:"ve_v"`
		BF    float64 `json:"bf"`
		Tj_C  float64 `json:"tj_c"`
		Beta  float64 `json:"beta"`
		VCE_V float64 `json:"vce_v"`
	} `json:"nominal"`
	Resistors map[string]struct {
		EffectiveOhms float64 `json:"effective_ohms"`
	} `json:"resistors"`
	Corners []struct {
		BF     float64            `json:"bf"`
		IS_A   float64            `json:"is_a"`
		VAF_V  float64            `json:"vaf_v"`
		Tj_C   float64            `json:"tj_c"`
		VCC_V  float64            `json:"vcc_v"`
		VEE_V  float64            `json:"vee_v"`
		Ohms   map[string]float64 `json:"ohms"`
		IC_A   float64            `json:"ic_a"`
		VB_V   float64            `json:"vb_v"`
		VC_V   float64            `json:"vc_v"`
		VE_V   float64            `json:"ve_v"`
		Region string             `json:"region"`
	} `json:"corners"`
	Worst struct {
		AllActive bool `json:"all_active"`
	} `json:"worst"`
}

// rerun is one reported point to simulate.
type rerun struct {
	name           string
	s              solver.Stage
	m              solver.Model
	tj             float64
	ic, vb, vc, ve float64
	region         string
}

// TestCheckSaturationAgainstNgspice runs `biasbin check --json` on builds
// that saturate, then reruns the nominal point and every reported corner
// in ngspice exactly as the JSON describes it (the transistor's model at
// tj_c, the resistors at their effective values) and holds the reported
// figures against the simulator: IC within 0.1 %, node voltages within
// 1 mV or 0.1 %, and ngspice's base-collector junction forward biased
// wherever check says "saturation".
func TestCheckSaturationAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	builds := []struct {
		name string
		args []string
	}{
		{"npn divider, RC too large", []string{"--vcc", "15V", "--r1", "10K", "--r2", "5K", "--rc", "3K3", "--re", "1K", "--hfe", "100..300", "--theta-ja", "200"}},
		{"pnp split supply, RC too large", []string{"--topology", "split-supply", "--polarity", "pnp", "--vcc", "15V", "--vee", "15V",
			"--rb", "10K", "--rc", "22K", "--re", "10K", "--hfe", "80..250", "--theta-ja", "250", "--ambient", "-20..70"}},
	}
	var runs []rerun
	var jobs []spicecheck.Job
	vectors := []string{"@q1[ic]", "v(b)", "v(c)", "v(e)"}
	for _, bd := range builds {
		out, errOut, code := run(t, append(bd.args, "--json", "--sim-boards", "100"))
		// A saturating build fails the verdict (exit 1) and is still reported in full.
		if code != 1 || !strings.Contains(errOut, "the build fails") {
			t.Fatalf("%s: exit %d, want 1 with the verdict: %s", bd.name, code, errOut)
		}
		var doc checkDoc
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatalf("%s: %v", bd.name, err)
		}
		if doc.Region != "saturation" || doc.Worst.AllActive {
			t.Fatalf("%s: region %q, all_active %v; want saturation, false", bd.name, doc.Region, doc.Worst.AllActive)
		}
		top, err := solver.ParseTopology(doc.Topology)
		if err != nil {
			t.Fatal(err)
		}
		pol, err := solver.ParsePolarity(doc.Model.Polarity)
		if err != nil {
			t.Fatal(err)
		}
		model := func(bf, is, vaf float64) solver.Model {
			mj := doc.Model
			return solver.Model{Polarity: pol, IS_A: is, BF: bf, BR: mj.BR, NF: mj.NF, VAF_V: vaf,
				XTI: mj.XTI, XTB: mj.XTB, EG_eV: mj.EG_eV, TNOM_C: mj.TNOM_C, ICBO_A: mj.ICBO_A}
		}
		stage := func(vcc, vee float64, ohms map[string]float64) solver.Stage {
			s := solver.Stage{Topology: top, VCC_V: vcc, VEE_V: vee}
			for name, v := range ohms {
				slot, err := solver.ParseSlot(name)
				if err != nil {
					t.Fatal(err)
				}
				s.R_Ohm[slot] = v
			}
			return s
		}
		nomOhms := map[string]float64{}
		for name, r := range doc.Resistors {
			nomOhms[name] = r.EffectiveOhms
		}
		n := doc.Nominal
		runs = append(runs, rerun{bd.name + ", nominal", stage(doc.VCC_V, doc.VEE_V, nomOhms), model(n.BF, doc.Model.IS_A, doc.Model.VAF_V), n.Tj_C, n.IC_A, n.VB_V, n.VC_V, n.VE_V, doc.Region})
		for i, c := range doc.Corners {
			runs = append(runs, rerun{fmt.Sprintf("%s, corner %d", bd.name, i), stage(c.VCC_V, c.VEE_V, c.Ohms), model(c.BF, c.IS_A, c.VAF_V), c.Tj_C, c.IC_A, c.VB_V, c.VC_V, c.VE_V, c.Region})
		}
	}
	for _, r := range runs {
		jobs = append(jobs, spicecheck.Job{Deck: solver.Netlist(r.s, r.m, r.tj, r.name), Vectors: vectors})
	}
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	saturated := 0
	for i, r := range runs {
		ng := got[i]
		sg := 1.0
		if r.m.Polarity == solver.PNP {
			sg = -1
		}
		// source: ngspice op of the deck rebuilt from the JSON; IC within 0.1 %.
		if icNg := sg * ng["@q1[ic]"]; math.Abs(r.ic-icNg) > 1e-3*math.Abs(icNg) {
			t.Errorf("%s: ic_a %.7g, ngspice %.7g", r.name, r.ic, icNg)
		}
		for _, v := range []struct {
			node       string
			mine, spic float64
		}{{"vb", r.vb, ng["v(b)"]}, {"vc", r.vc, ng["v(c)"]}, {"ve", r.ve, ng["v(e)"]}} {
			// source: ngspice op; 1 mV or 0.1 %, whichever is looser.
			if d := math.Abs(v.mine - v.spic); d > 1e-3 && d > 1e-3*math.Abs(v.spic) {
				t.Errorf("%s: %s_v %.7g, ngspice %.7g", r.name, v.node, v.mine, v.spic)
			}
		}
		if r.region == "saturation" {
			saturated++
			// ngspice agrees: the base-collector junction conducts (VBC > 0.4 V
			// forward, REFERENCE.md §5 "V_BC < about 0.4–0.5 V" in the active region).
			if vbc := sg * (ng["v(b)"] - ng["v(c)"]); vbc < 0.4 {
				t.Errorf("%s: reported saturation, ngspice VBC = %.3f V", r.name, vbc)
			}
		}
	}
	t.Logf("ngspice: %d points of `check --json` rerun (%d reported saturated)", len(runs), saturated)
	if saturated < len(builds) {
		t.Errorf("only %d saturated points compared", saturated)
	}
}
