package democmd

import (
	"biasbin/picker"
	"biasbin/solver"
)

// scenario is one pick the demo runs: what it asks, in words, as the
// command line a technician would type (shown, and checked by a test to
// ask the same), and as the request the demo hands the picker.
type scenario struct {
	title string
	story string
	args  []string
	req   picker.Request
	// nothingFits marks the pick that is meant to come up short.
	nothingFits bool
}

// scenarios are the demo's picks, in order: a plain build from the
// whole wall, a build from the sparse approved list where series
// pairs fill the gaps, and a run larger than the PNP drawers can supply.
func scenarios() []scenario {
	return []scenario{
		{
			title: "A 12 V NPN gain stage at 2 mA, five boards",
			story: `The whole wall may be used, singles only. VCE is left to the swing rule
for a 10K load on the collector; five boards need five of every part,
and ten where one drawer fills two positions.`,
			args: []string{"--vcc", "12V", "--ic", "2mA", "--load", "10K", "--boards", "5", "--top", "2"},
			req: picker.Request{Topology: solver.Divider, Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 2e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 5, RL_Ohm: 10e3, Top: 2, Seed: 1},
		},
		{
			title: "A 9 V low-noise stage at 500 µA from the approved list, pairs allowed",
			story: `Only parts tagged "approved": 1 % metal film in E6 values and one NPN type.
The ideal values fall between those sparse singles, so pick may join two
stocked parts in series or parallel to land closer.`,
			args: []string{"--vcc", "9V", "--ic", "500uA", "--vce", "4V", "--require-tag", "approved", "--pairs", "--boards", "10", "--top", "1"},
			req: picker.Request{Topology: solver.Divider, Polarity: solver.NPN, VCC_V: 9, VCCTol: 0.05, IC_A: 500e-6, VCE_V: 4,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 10, RequireTags: []string{"approved"}, Pairs: true, Top: 1, Seed: 1},
		},
		{
			title: "A 15 V PNP stage at 1 mA for a run of 30 boards",
			story: `The PNP stage runs from the same positive supply as the rest of the board:
emitter side to +15 V, collector side to 0 V, so every voltage reads
positive on the meter and each resistor says what it joins (--rail negative
builds it with the emitter side on 0 V instead). The PNP drawers hold 12
and 8 parts: not enough for 30 boards. pick says why nothing fits, shows
the nearest builds and names what to buy.`,
			args: []string{"--vcc", "15V", "--ic", "1mA", "--polarity", "pnp", "--boards", "30", "--top", "1"},
			req: picker.Request{Topology: solver.Divider, Polarity: solver.PNP, VCC_V: -15, Rail: solver.PositiveRail, VCCTol: 0.05, IC_A: 1e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 30, Top: 1, Seed: 1},
			nothingFits: true,
		},
		{
			title: "A 9 V collector-feedback stage at 1 mA for a repair",
			story: `An older board biases its stage with one resistor from the collector to
the base: two parts fewer than a divider, and the feedback steadies IC
against hFE, though less than a divider does.`,
			args: []string{"--vcc", "9V", "--ic", "1mA", "--topology", "collector-feedback", "--top", "1"},
			req: picker.Request{Topology: solver.CollectorFeedback, Polarity: solver.NPN, VCC_V: 9, VCCTol: 0.05, IC_A: 1e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 1, Top: 1, Seed: 1},
		},
		{
			title: "A split-supply stage on ±12 V at 1 mA",
			story: `With a negative rail the emitter resistor to VEE sets the current and the
base sits near ground through RB: IC hardly moves with hFE.`,
			args: []string{"--vcc", "12V", "--vee", "12V", "--ic", "1mA", "--topology", "split-supply", "--top", "1"},
			req: picker.Request{Topology: solver.SplitSupply, Polarity: solver.NPN, VCC_V: 12, VEE_V: -12, VCCTol: 0.05, IC_A: 1e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 1, Top: 1, Seed: 1},
		},
		{
			title: "Which topology serves a 12 V stage at 1 mA best?",
			story: `--topology any searches the divider, collector feedback and (with --vee)
the split supply, ranks them on one scale and says why the first wins.`,
			args: []string{"--vcc", "12V", "--vee", "12V", "--ic", "1mA", "--topology", "any", "--top", "2"},
			req: picker.Request{Topology: picker.AnyTopology, Polarity: solver.NPN, VCC_V: 12, VEE_V: -12, VCCTol: 0.05, IC_A: 1e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 1, Top: 2, Seed: 1},
		},
		{
			title: "A repair: keep the divider on the board, fill the rest from the wall",
			story: `A 12 V stage (about 1 mA) came in with its emitter resistor burnt open and
the collector resistor scorched; the transistor is suspect too. R1 measures
46.8K on a 1 % meter and stays; R2 (10K) is buried under a bracket and
stays unmeasured, so pick takes it with conservative figures and says so.
The kept parts are never pulled from stock.`,
			args: []string{"--vcc", "12V", "--ic", "1mA", "--keep", "r1=46K8/1%,r2=10K", "--top", "1"},
			req: picker.Request{Topology: solver.Divider, Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 1e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 1, Top: 1, Seed: 1,
				Keep: []picker.KeptPart{{Position: "r1", Ohm: 46.8e3, Tol: 0.01}, {Position: "r2", Ohm: 10e3}}},
		},
		{
			title: "A 24 V driver stage at 10 mA: parts that get hot",
			story: `At 10 mA from 24 V the resistors and the transistor warm well above the
room. Each build says in plain words which part can burn a finger and
what to do about it.`,
			args: []string{"--vcc", "24V", "--ic", "10mA", "--top", "1"},
			req: picker.Request{Topology: solver.Divider, Polarity: solver.NPN, VCC_V: 24, VCCTol: 0.05, IC_A: 10e-3,
				AmbientMin_C: 0, AmbientMax_C: 50, Boards: 1, Top: 1, Seed: 1},
		},
	}
}
