package pickcmd

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"biasbin/solver/spicecheck"
)

// TestPNPPositiveSupplyAgainstNgspice is the outside check of the PNP
// stage on a positive supply: pick --json prints the first build's node
// voltages; a deck written here from the printed build alone (a +5 V
// source, the emitter side to it, the collector side and 0 V as ngspice's
// node 0, the model card and junction temperature as printed) is solved
// by ngspice (Debian package, run by the test), and every printed node
// voltage, its test point and each resistor's joins must be what the
// meter reads there: ngspice's node voltage to ground within 0.1 %.
func TestPNPPositiveSupplyAgainstNgspice(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	spicecheck.Require(t)
	path := newTestDB(t, tinyWall())
	inv := runPick(t, path, nil, "--vcc", "5V", "--ic", "1mA", "--polarity", "pnp", "--top", "1", "--json")
	if inv.err != nil {
		t.Fatalf("%v\n%s", inv.err, inv.stderr)
	}
	var doc struct {
		Request struct {
			VCC_V  float64 `json:"vcc_v"`
			Rail   string  `json:"rail"`
			Ground string  `json:"ground"`
		} `json:"request"`
		Candidates []struct {
			Resistors map[string]struct {
				Ohms float64 `json:"ohms"`
			} `json:"resistors"`
			Joins   map[string][2]string `json:"joins"`
			Rail    string               `json:"rail"`
			Nominal struct {
				VB_V float64 `json:"vb_v"`
				VE_V float64 `json:"ve_v"`
				VC_V float64 `json:"vc_v"`
				Tj_C float64 `json:"tj_c"`
			} `json:"nominal"`
			TestPoints map[string]struct {
				Nominal_V float64 `json:"nominal_v"`
			} `json:"test_points"`
			Model struct {
				IS_A, BF, BR, NF, VAF_V, XTI, XTB, EG_eV, TNOM_C, ICBO_A float64
			} `json:"model"`
		} `json:"candidates"`
	}
	if err := json.Unmarshal([]byte(inv.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Request.VCC_V != 5 || doc.Request.Rail != "positive" || doc.Request.Ground != "collector-rail" {
		t.Errorf("request: vcc_v %g, rail %q, ground %q; want 5, positive, collector-rail (the default PNP build)",
			doc.Request.VCC_V, doc.Request.Rail, doc.Request.Ground)
	}
	if len(doc.Candidates) == 0 {
		t.Fatalf("no build:\n%s", inv.stdout)
	}
	c := doc.Candidates[0]
	// Common practice: a PNP divider stage on a positive supply has R2 and
	// RE from +V to the base and emitter, R1 and RC from the base and
	// collector to 0 V.
	wantJoins := map[string][2]string{"r1": {"base", "0v"}, "r2": {"+v", "base"}, "rc": {"collector", "0v"}, "re": {"+v", "emitter"}}
	for slot, want := range wantJoins {
		if c.Resistors[slot].Ohms > 0 && c.Joins[slot] != want {
			t.Errorf("%s joins %v, want %v", slot, c.Joins[slot], want)
		}
	}
	m := c.Model
	var deck strings.Builder
	fmt.Fprintf(&deck, "* pnp divider on +5 V, written from pick --json\nvs vplus 0 dc 5\n")
	fmt.Fprintf(&deck, "r2 vplus b %.12g\nr1 b 0 %.12g\nre vplus e %.12g\nrc c 0 %.12g\nq1 c b e qp\n",
		c.Resistors["r2"].Ohms, c.Resistors["r1"].Ohms, c.Resistors["re"].Ohms, c.Resistors["rc"].Ohms)
	if m.ICBO_A != 0 || m.VAF_V != 0 {
		t.Fatalf("the test stock's transistor has no leakage and no Early voltage; the model says icbo %g, vaf %g", m.ICBO_A, m.VAF_V)
	}
	fmt.Fprintf(&deck, ".model qp pnp (is=%.12g bf=%.12g br=%.12g nf=%.12g xti=%.12g xtb=%.12g eg=%.12g tnom=%.12g)\n",
		m.IS_A, m.BF, m.BR, m.NF, m.XTI, m.XTB, m.EG_eV, m.TNOM_C)
	fmt.Fprintf(&deck, ".options tnom=%.12g temp=%.12g reltol=1e-9 vntol=1e-12 abstol=1e-18\n.end\n", m.TNOM_C, c.Nominal.Tj_C)
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	res, err := spicecheck.Run(ctx, []spicecheck.Job{{Deck: deck.String(), Vectors: []string{"v(b)", "v(e)", "v(c)"}}})
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range []struct {
		node        string
		printed, tp float64
	}{
		{"b", c.Nominal.VB_V, c.TestPoints["vb"].Nominal_V},
		{"e", c.Nominal.VE_V, c.TestPoints["ve"].Nominal_V},
		{"c", c.Nominal.VC_V, c.TestPoints["vc"].Nominal_V},
	} {
		ng := res[0]["v("+n.node+")"]
		// source: ngspice op run of the deck above; 0.1 %.
		if math.Abs(n.printed-ng) > 1e-3*math.Abs(ng) || math.Abs(n.tp-ng) > 1e-3*math.Abs(ng) {
			t.Errorf("V%s printed %.6g V (test point %.6g V), ngspice %.6g V to ground", strings.ToUpper(n.node), n.printed, n.tp, ng)
		}
		if ng <= 0 {
			t.Errorf("V%s = %.4g V: a stage on a positive supply reads positive", strings.ToUpper(n.node), ng)
		}
	}
	t.Logf("ngspice: PNP divider on +5 V, VB/VE/VC printed %.4g/%.4g/%.4g V", c.Nominal.VB_V, c.Nominal.VE_V, c.Nominal.VC_V)
}
