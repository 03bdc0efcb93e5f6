package solver

import (
	"fmt"
	"strings"
)

// Netlist returns an ngspice-ready deck of s with the transistor m at
// device temperature tj_C: the stage's resistors at their effective values,
// a .model card with IS BF BR NF VAF XTI XTB EG TNOM, `.options tnom temp`
// so the simulator evaluates the model exactly as Solve does (with
// Newton tolerances tight enough to be a reference), and a
// .control block that runs `op` and prints the node voltages and the
// transistor's currents. Node names: vcc, vee, b, c, e; node 0 is the
// stage's ground (Stage.Ground), so v(b) v(c) v(e) are what Solve reports
// and a meter reads; vcc is the other rail. The transistor is q1. A zero-ohm position becomes a 0 V source (a wire SPICE can measure).
// The optional ICBO leakage becomes a current source ileak between
// collector and base holding ICBO(tj_C) (SPICE does not scale it with
// temperature). title must be one line; it is written as a comment.
func Netlist(s Stage, m Model, tj_C float64, title string) string {
	var b strings.Builder
	title = strings.Join(strings.Fields(title), " ")
	if title == "" {
		title = fmt.Sprintf("%v %v stage", m.Polarity, s.Topology)
	}
	fmt.Fprintf(&b, "* %s\n", title)
	fmt.Fprintf(&b, "* %v %v stage, transistor at Tj = %s C; resistors at effective values\n", m.Polarity, s.Topology, num(tj_C))
	// Node 0 is the stage's ground and node vcc the other rail: with 0 V
	// on the collector-side rail the collector side joins node 0 and the
	// emitter side node vcc, which sits at the supply as a meter reads it.
	fmt.Fprintf(&b, "vcc vcc 0 dc %s\n", num(s.Ground.Supply_V(s.VCC_V)))
	if s.Topology == SplitSupply {
		fmt.Fprintf(&b, "vee vee 0 dc %s\n", num(s.VEE_V))
	}
	r := &s.R_Ohm
	if s.Ground == CollectorRailGround {
		fmt.Fprintf(&b, "* 0 V on the collector-side rail: the emitter side is the supply node vcc\n")
	}
	for _, sl := range s.Topology.Slots() {
		t1, t2, _ := s.Topology.Joins(sl)
		n1, n2 := s.netNode(t1), s.netNode(t2)
		if r[sl] == 0 {
			fmt.Fprintf(&b, "v%s %s %s dc 0\n", sl, n1, n2)
			continue
		}
		fmt.Fprintf(&b, "%s %s %s %s\n", sl, n1, n2, num(r[sl]))
	}
	typ := "npn"
	if m.Polarity == PNP {
		typ = "pnp"
	}
	b.WriteString("q1 c b e qdut\n")
	if m.ICBO_A > 0 {
		_, _, _, leak := m.At(tj_C)
		from, to := "c", "b"
		if m.Polarity == PNP {
			from, to = "b", "c"
		}
		fmt.Fprintf(&b, "* ICBO at Tj (%s A at %s C, doubling every 10 K)\n", num(m.ICBO_A), num(m.TNOM_C))
		fmt.Fprintf(&b, "ileak %s %s dc %s\n", from, to, num(leak))
	}
	fmt.Fprintf(&b, ".model qdut %s (is=%s bf=%s br=%s nf=%s", typ, num(m.IS_A), num(m.BF), num(m.BR), num(m.NF))
	if m.VAF_V > 0 {
		fmt.Fprintf(&b, " vaf=%s", num(m.VAF_V))
	}
	fmt.Fprintf(&b, " xti=%s xtb=%s eg=%s tnom=%s)\n", num(m.XTI), num(m.XTB), num(m.EG_eV), num(m.TNOM_C))
	// ngspice's default reltol (1e-3) stops Newton early enough to leave
	// errors of ~0.1 % in saturation; the tighter settings make the deck
	// an exact reference.
	fmt.Fprintf(&b, ".options tnom=%s temp=%s reltol=1e-9 vntol=1e-12 abstol=1e-18\n", num(m.TNOM_C), num(tj_C))
	b.WriteString(".control\nop\nprint v(b) v(c) v(e) @q1[ic] @q1[ib] @q1[p]\n.endc\n.end\n")
	return b.String()
}

// netNode is the deck's node of terminal t: node 0 is the stage's ground
// and node vcc the other rail of a single supply.
func (s Stage) netNode(t Terminal) string {
	switch t {
	case BaseLead:
		return "b"
	case CollectorLead:
		return "c"
	case EmitterLead:
		return "e"
	case CollectorRail:
		if s.Ground == CollectorRailGround {
			return "0"
		}
		return "vcc"
	case EmitterRail:
		switch {
		case s.Topology == SplitSupply:
			return "vee"
		case s.Ground == CollectorRailGround:
			return "vcc"
		}
	}
	return "0"
}

// num writes a float with full precision in SPICE syntax.
func num(v float64) string { return fmt.Sprintf("%.12g", v) }
