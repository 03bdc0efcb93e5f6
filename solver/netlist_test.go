package solver_test

import (
	"strings"
	"testing"

	"biasbin/solver"
)

// TestNetlistCards checks the deck's cards against the ngspice syntax
// (ngspice manual §8.1 instance line `QXXX nc nb ne mname`, §2.4 .model,
// §15.1.1 .options temp/tnom; REFERENCE.md §11): the transistor line, the
// model card with every parameter the solver uses, the temperatures, a
// zero-ohm position as a 0 V source, the leakage source oriented
// collector→base for NPN and base→collector for PNP, and a one-line title.
func TestNetlistCards(t *testing.T) {
	s := stage(solver.SplitSupply, 12, -12, R{solver.RB: 0, solver.RC: 4.7e3, solver.RE: 10e3})
	m := npnModel(2e-14, 180, 90, 1e-9)
	for _, c := range []struct {
		pol   solver.Polarity
		leak  string
		model string
	}{
		{solver.NPN, "ileak c b dc 1.6e-08", ".model qdut npn (is=2e-14 bf=180 br=1 nf=1 vaf=90 xti=3 xtb=1.5 eg=1.11 tnom=25)"},
		{solver.PNP, "ileak b c dc 1.6e-08", ".model qdut pnp (is=2e-14 bf=180 br=1 nf=1 vaf=90 xti=3 xtb=1.5 eg=1.11 tnom=25)"},
	} {
		ss, mm := s, m
		if c.pol == solver.PNP {
			ss, mm = mirror(s, m)
		}
		deck := solver.Netlist(ss, mm, 65, "two\nlines")
		for _, want := range []string{
			"* two lines\n",
			"q1 c b e qdut\n",
			c.model + "\n",
			".options tnom=25 temp=65 ",
			"vrb b 0 dc 0\n",
			"rc vcc c 4700\n",
			"re e vee 10000\n",
			c.leak + "\n", // 1 nA at 25 °C doubled 4 times at 65 °C (common practice)
			".control\nop\n",
			".end\n",
		} {
			if !strings.Contains(deck, want) {
				t.Errorf("%v deck lacks %q:\n%s", c.pol, want, deck)
			}
		}
		if strings.Contains(deck, "\nlines") {
			t.Errorf("%v deck: title leaked onto extra lines:\n%s", c.pol, deck)
		}
	}
}
