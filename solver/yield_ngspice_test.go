package solver

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
	"time"

	"biasbin/solver/spicecheck"
)

// mcBoardsPerCircuit is the size of the ngspice Monte Carlo check: enough
// for a statistical comparison, small enough for CI (every board is one
// transistor in a batched deck).
const mcBoardsPerCircuit = 300

// TestYieldAgainstNgspice is an outside check of the whole Monte Carlo:
// boards are drawn exactly as EvalYield draws them (resistor values and
// TCRs, supply, hFE, VBE(on) through IS, VAF), then each board is solved
// by ngspice (Debian package, ngspice manual §8 BJT model with the
// instance temperature) at both ambient ends, its resistors at their
// values at that ambient and its junction self-heated by a secant
// iteration on Tj = Ta + θJA·P run against ngspice's own dissipation
// @q[p] — no biasbin solve enters the ngspice side. ngspice's yield over
// the two ends must agree with biasbin's (which also checks between the
// ends) within the combined statistical error of two estimates,
// 2·√(2·p(1−p)/n), and at most 1 % of the boards may be judged
// differently (boards on a window edge).
func TestYieldAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	div := dividerBuild() // 15 V, 10k/5k, 1k/1k 5 % 100 ppm/K, hFE 100..300, θJA 200 K/W, -10..60 °C
	cf := Build{
		Topology: CollectorFeedback, VCC_V: 12, VCCTol: 0.05,
		Device: Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 400, VBEOn_V: 0.65, VBEAt_A: 1e-3, VCESat_V: 0.2,
			VAF_V: 80, ThetaJA_KPerW: 250, TjMax_C: 150},
		AmbientMin_C: -20, AmbientMax_C: 70, NominalAmbient_C: 25,
	}
	for s, r := range map[Slot]float64{RF: 220e3, RC: 2.2e3, RE: 470} {
		cf.Resistors[s] = ResistorSpec{Nominal_Ohm: r, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	var lines []string
	total := 0
	for _, c := range []struct {
		name string
		b    Build
	}{{"divider", div}, {"collector feedback", cf}} {
		nom, _, err := Nominal(c.b)
		if err != nil {
			t.Fatal(err)
		}
		w := Window{ICMin_A: nom.IC_A * 0.9, ICMax_A: nom.IC_A * 1.1, VCEMin_V: nom.VCE_V * 0.8, VCEMax_V: nom.VCE_V * 1.2}
		smp, err := newBoardSampler(&c.b, rand.New(rand.NewPCG(8, 8)), YieldOptions{})
		if err != nil {
			t.Fatal(err)
		}
		j := newBoardJudge(&c.b, w)
		boards := make([]board, mcBoardsPerCircuit)
		ours := make([]bool, len(boards))
		pOurs := 0
		for i := range boards {
			smp.draw(&boards[i])
			pass, _, err := j.judge(&boards[i])
			if err != nil {
				t.Fatalf("%s board %d: %v", c.name, i, err)
			}
			ours[i] = pass
			if pass {
				pOurs++
			}
		}
		theirs := make([]bool, len(boards))
		for i := range theirs {
			theirs[i] = true
		}
		for _, ta := range [2]float64{c.b.AmbientMin_C, c.b.AmbientMax_C} {
			ops, err := ngspiceSelfHeated(&c.b, boards, ta)
			if err != nil {
				t.Fatalf("%s at %g °C: %v", c.name, ta, err)
			}
			for i, op := range ops {
				theirs[i] = theirs[i] && w.Contains(&op)
			}
		}
		pTheirs, differ := 0, 0
		for i := range boards {
			if theirs[i] {
				pTheirs++
			}
			if theirs[i] != ours[i] {
				differ++
			}
		}
		n := float64(len(boards))
		p := 0.5 * float64(pOurs+pTheirs) / n
		allow := 2 * math.Sqrt(2*p*(1-p)/n)
		if math.Abs(float64(pOurs-pTheirs))/n > allow+0.5/n {
			t.Errorf("%s: biasbin %d of %d boards, ngspice %d: apart by more than %.3f", c.name, pOurs, len(boards), pTheirs, allow)
		}
		if differ > len(boards)/100 {
			t.Errorf("%s: %d boards judged differently by biasbin and ngspice (at most %d allowed)", c.name, differ, len(boards)/100)
		}
		lines = append(lines, fmt.Sprintf("%s biasbin %d, ngspice %d of %d pass (%d judged differently)", c.name, pOurs, pTheirs, len(boards), differ))
		total += len(boards)
	}
	t.Logf("ngspice: %d Monte Carlo boards solved at both ambient ends, self-heated (%s)", total, strings.Join(lines, "; "))
}

// ngspiceSelfHeated solves every board of b at ambient ta in ngspice,
// self-heated: all boards sit in one deck, each transistor at its own
// instance temperature Tj, and Tj is moved by a secant iteration on the
// heat balance g(Tj) = ta + θJA·P(Tj) − Tj (P from ngspice's @q[p]) from
// the ambient until |g| < 1e-4 K for every board.
func ngspiceSelfHeated(b *Build, boards []board, ta float64) ([]OperatingPoint, error) {
	theta := ThermalResistance(b.Device)
	n := len(boards)
	tj := make([]float64, n)
	prevT, prevG := make([]float64, n), make([]float64, n)
	done := make([]bool, n)
	for i := range tj {
		tj[i] = ta
		prevT[i] = math.NaN()
	}
	ops := make([]OperatingPoint, n)
	for round := range 12 {
		res, err := runBoardsDeck(b, boards, ta, tj)
		if err != nil {
			return nil, err
		}
		all := true
		for i := range boards {
			r := res[i]
			ops[i] = OperatingPoint{IC_A: r.ic, VCE_V: r.vce}
			g := ta + theta*max(r.p, 0) - tj[i]
			if math.Abs(g) < 1e-4 || theta == 0 {
				done[i] = true
				continue
			}
			done[i] = false
			all = false
			next := tj[i] + g // fixed-point step
			if !math.IsNaN(prevT[i]) && g != prevG[i] {
				next = tj[i] - g*(tj[i]-prevT[i])/(g-prevG[i])
			}
			prevT[i], prevG[i] = tj[i], g
			tj[i] = next
		}
		if all {
			return ops, nil
		}
		if round == 11 {
			return nil, fmt.Errorf("self-heating did not settle in ngspice after 12 rounds")
		}
	}
	return ops, nil
}

type ngResult struct{ ic, vce, p float64 }

// boardsPerDeck bounds the boards in one deck: ngspice's `write` takes a
// limited number of vectors.
const boardsPerDeck = 20

// runBoardsDeck solves the boards in batched ngspice decks: board k has
// its own supply, resistors at their values at ambient ta (tolerance and
// TCR applied, R = R0(1+dev)(1+TCR(ta−25)), ngspice manual eq. (6)), and
// its own model card (IS, BF, VAF drawn) with the transistor at instance
// temperature tj[k].
func runBoardsDeck(b *Build, boards []board, ta float64, tj []float64) ([]ngResult, error) {
	num := func(v float64) string { return fmt.Sprintf("%.12g", v) }
	var jobs []spicecheck.Job
	for first := 0; first < len(boards); first += boardsPerDeck {
		var d strings.Builder
		fmt.Fprintf(&d, "* Monte Carlo boards at ambient %g C\n", ta)
		var vecs []string
		for k := first; k < min(first+boardsPerDeck, len(boards)); k++ {
			bd := &boards[k]
			r := func(s Slot) string {
				rs := b.Resistors[s]
				return num(rs.Nominal_Ohm * (1 + bd.dev[s]) * (1 + bd.tcr[s]*1e-6*(ta-25)))
			}
			fmt.Fprintf(&d, "vcc%d vcc%d 0 dc %s\n", k, k, num(b.VCC_V*bd.vccFactor))
			switch b.Topology {
			case Divider:
				fmt.Fprintf(&d, "r1_%d vcc%d b%d %s\nr2_%d b%d 0 %s\n", k, k, k, r(R1), k, k, r(R2))
			case CollectorFeedback:
				fmt.Fprintf(&d, "rf_%d c%d b%d %s\n", k, k, k, r(RF))
			}
			fmt.Fprintf(&d, "rc_%d vcc%d c%d %s\nre_%d e%d 0 %s\n", k, k, k, r(RC), k, k, r(RE))
			m := bd.m
			fmt.Fprintf(&d, "q%d c%d b%d e%d qm%d temp=%s\n", k, k, k, k, k, num(tj[k]))
			fmt.Fprintf(&d, ".model qm%d npn (is=%s bf=%s br=%s nf=%s", k, num(m.IS_A), num(m.BF), num(m.BR), num(m.NF))
			if m.VAF_V > 0 {
				fmt.Fprintf(&d, " vaf=%s", num(m.VAF_V))
			}
			fmt.Fprintf(&d, " xti=%s xtb=%s eg=%s tnom=%s)\n", num(m.XTI), num(m.XTB), num(m.EG_eV), num(m.TNOM_C))
			vecs = append(vecs, fmt.Sprintf("@q%d[ic]", k), fmt.Sprintf("v(c%d)", k), fmt.Sprintf("v(e%d)", k), fmt.Sprintf("@q%d[p]", k))
		}
		fmt.Fprintf(&d, ".options tnom=25 temp=%s reltol=1e-8 vntol=1e-11 abstol=1e-16\n.end\n", num(ta))
		jobs = append(jobs, spicecheck.Job{Deck: d.String(), Vectors: vecs})
	}
	ctx, cancel := context.WithTimeout(context.Background(), 120*time.Second)
	defer cancel()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		return nil, err
	}
	out := make([]ngResult, len(boards))
	for k := range boards {
		g := got[k/boardsPerDeck]
		out[k] = ngResult{
			ic:  g[fmt.Sprintf("@q%d[ic]", k)],
			vce: g[fmt.Sprintf("v(c%d)", k)] - g[fmt.Sprintf("v(e%d)", k)],
			p:   g[fmt.Sprintf("@q%d[p]", k)],
		}
	}
	return out, nil
}

// TestNgspiceInstanceTemperature checks the device of the Monte Carlo
// check above: a transistor at instance temperature temp=Tj in ngspice
// gives the same operating point as the whole circuit at .options temp=Tj
// (the form the other ngspice comparisons use).
func TestNgspiceInstanceTemperature(t *testing.T) {
	spicecheck.Require(t)
	b := dividerBuild()
	smp, err := newBoardSampler(&b, rand.New(rand.NewPCG(1, 1)), YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	boards := make([]board, 2)
	for i := range boards {
		smp.draw(&boards[i])
	}
	const ta, tj = 40.0, 57.5
	inst, err := runBoardsDeck(&b, boards, ta, []float64{tj, tj})
	if err != nil {
		t.Fatal(err)
	}
	for k, bd := range boards {
		s := b.resolveTCR(&bd.dev, &bd.tcr, bd.vccFactor, bd.veeFactor, ta)
		got, err := spicecheck.Run(context.Background(), []spicecheck.Job{{Deck: Netlist(s, bd.m, tj, "global temperature"), Vectors: []string{"@q1[ic]"}}})
		if err != nil {
			t.Fatal(err)
		}
		if ic := got[0]["@q1[ic]"]; math.Abs(ic-inst[k].ic) > 1e-7*ic {
			t.Errorf("board %d: IC %g A at instance temperature, %g A at the global temperature", k, inst[k].ic, ic)
		}
	}
}
