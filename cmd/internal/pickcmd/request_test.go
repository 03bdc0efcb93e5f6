package pickcmd

import (
	"bytes"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/picker"
	"biasbin/solver"
)

// parseFlags runs the command's flag parsing on args and returns the
// request it builds, or the error a user would see.
func parseFlags(t *testing.T, args []string) (picker.Request, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	var req picker.Request
	cmd := newCmd(f, func(o *Options) error {
		var err error
		req, err = o.request()
		return err
	})
	err := cmdtest.Execute(cmd, args, &out, &errOut)
	if out.Len() != 0 {
		t.Errorf("flag parsing wrote to stdout: %q", out.String())
	}
	return req, err
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Max(1, math.Abs(b)) }

func TestFlags(t *testing.T) {
	base := []string{"--vcc", "12V", "--ic", "2mA"}
	tests := []struct {
		name  string
		args  []string
		check func(t *testing.T, r picker.Request)
	}{
		// A 9 V battery, 9.6 V fresh to 7 V flat (common practice).
		{"supply range", []string{"--vcc", "7V..9.6V", "--ic", "2mA"}, func(t *testing.T, r picker.Request) {
			if !near(r.VCC_V*(1-r.VCCTol), 7) || !near(r.VCC_V*(1+r.VCCTol), 9.6) {
				t.Errorf("vcc %g ±%g spans %g..%g, want 7..9.6", r.VCC_V, r.VCCTol, r.VCC_V*(1-r.VCCTol), r.VCC_V*(1+r.VCCTol))
			}
		}},
		{"keep", append(base, "--keep", "R1=47K,r2=10K/5%/0.25W", "--keep", "re=1K0F"), func(t *testing.T, r picker.Request) {
			want := []picker.KeptPart{{Position: "r1", Ohm: 47e3}, {Position: "r2", Ohm: 10e3, Tol: 0.05, Rated_W: 0.25}, {Position: "re", Ohm: 1e3, Tol: 0.01}}
			if len(r.Keep) != len(want) {
				t.Fatalf("keep %+v, want %+v", r.Keep, want)
			}
			for i, k := range r.Keep {
				if k.Position != want[i].Position || !near(k.Ohm, want[i].Ohm) || !near(k.Tol, want[i].Tol) || !near(k.Rated_W, want[i].Rated_W) {
					t.Errorf("keep %d = %+v, want %+v", i, k, want[i])
				}
			}
		}},
		{"time limit by default", base, func(t *testing.T, r picker.Request) {
			if r.TimeLimit != picker.DefaultTimeLimit {
				t.Errorf("time limit %v, want the default %v", r.TimeLimit, picker.DefaultTimeLimit)
			}
		}},
		{"no time limit", append(base, "--time-limit", "0"), func(t *testing.T, r picker.Request) {
			if r.TimeLimit != 0 {
				t.Errorf("time limit %v, want none", r.TimeLimit)
			}
		}},
		{"emitter rail tolerance", append(base, "--topology", "split-supply", "--vee", "12V", "--vee-tol", "10%"), func(t *testing.T, r picker.Request) {
			if !near(r.VEE_V, -12) || !near(r.VEETol, 0.1) || !near(r.VCCTol, 0.05) {
				t.Errorf("vee %g ±%g (vcc ±%g), want -12 ±0.1 (vcc ±0.05)", r.VEE_V, r.VEETol, r.VCCTol)
			}
		}},
		// A 9 V battery on the emitter rail, 9.6 V fresh to 7 V flat (common practice).
		{"emitter rail range", append(base, "--topology", "split-supply", "--vee", "-9.6V..-7V"), func(t *testing.T, r picker.Request) {
			if lo, hi := -r.VEE_V*(1-r.VEETol), -r.VEE_V*(1+r.VEETol); !near(lo, 7) || !near(hi, 9.6) {
				t.Errorf("vee %g ±%g spans %g..%g, want 7..9.6", r.VEE_V, r.VEETol, lo, hi)
			}
		}},
		{"defaults", base, func(t *testing.T, r picker.Request) {
			if r.Topology != solver.Divider || r.Polarity != solver.NPN {
				t.Errorf("topology/polarity = %v/%v, want divider/npn", r.Topology, r.Polarity)
			}
			if !near(r.VCC_V, 12) || !near(r.IC_A, 2e-3) || r.VCE_V != 0 {
				t.Errorf("vcc, ic, vce = %g, %g, %g; want 12, 0.002, 0 (swing rule)", r.VCC_V, r.IC_A, r.VCE_V)
			}
			if !near(r.VCCTol, 0.05) || r.AmbientMin_C != 0 || r.AmbientMax_C != 50 {
				t.Errorf("vcc tol %g, ambient %g..%g; want 0.05, 0..50", r.VCCTol, r.AmbientMin_C, r.AmbientMax_C)
			}
			if r.Boards != 1 || r.Top != 5 || r.Pairs || r.Exhaustive || r.ShowFailing || r.Bypass || r.Seed != 1 {
				t.Errorf("boards %d top %d pairs %v exhaustive %v show-failing %v bypass %v seed %d",
					r.Boards, r.Top, r.Pairs, r.Exhaustive, r.ShowFailing, r.Bypass, r.Seed)
			}
			if r.Window != (picker.WindowRule{}) || r.Weights != (picker.Weights{}) || r.YieldBoards != picker.DefaultYieldBoards {
				t.Errorf("window %+v weights %+v; want zero (the picker's defaults)", r.Window, r.Weights)
			}
		}},
		{"pnp signs the rail", []string{"--vcc", "9V", "--ic", "500uA", "--polarity", "pnp"}, func(t *testing.T, r picker.Request) {
			if r.Polarity != solver.PNP || !near(r.VCC_V, -9) || !near(r.IC_A, 500e-6) {
				t.Errorf("polarity %v vcc %g ic %g; want pnp -9 0.0005", r.Polarity, r.VCC_V, r.IC_A)
			}
		}},
		{"pnp accepts a signed rail", []string{"--vcc", "-9V", "--ic", "1mA", "--polarity", "PNP"}, func(t *testing.T, r picker.Request) {
			if !near(r.VCC_V, -9) || r.Rail != solver.NegativeRail {
				t.Errorf("vcc %g rail %v, want -9 on the negative rail (the sign as typed)", r.VCC_V, r.Rail)
			}
		}},
		{"pnp on a positive supply by default", []string{"--vcc", "5V", "--ic", "1mA", "--polarity", "pnp"}, func(t *testing.T, r picker.Request) {
			if r.Rail != solver.PositiveRail {
				t.Errorf("rail %v, want positive (emitter side to +V, collector side to 0 V)", r.Rail)
			}
		}},
		{"pnp on a stated negative rail", []string{"--vcc", "5V", "--ic", "1mA", "--polarity", "pnp", "--rail", "negative"}, func(t *testing.T, r picker.Request) {
			if r.Rail != solver.NegativeRail || !near(r.VCC_V, -5) {
				t.Errorf("rail %v vcc %g, want negative, -5", r.Rail, r.VCC_V)
			}
		}},
		{"split supply from its common", []string{"--vcc", "9V", "--vee", "9V", "--topology", "split-supply", "--ic", "1mA", "--polarity", "pnp"}, func(t *testing.T, r picker.Request) {
			if r.Rail != solver.SplitRails {
				t.Errorf("rail %v, want split", r.Rail)
			}
		}},
		{"vce and windows around it", append(base, "--vce", "5V", "--ic-window", "5%", "--vce-window", "10%"), func(t *testing.T, r picker.Request) {
			w := picker.WindowRule{IC: picker.Band{Relative: true, Frac: 0.05}, VCE: picker.Band{Relative: true, Frac: 0.1}}
			if !near(r.Window.IC.Frac, 0.05) || !near(r.Window.VCE.Frac, 0.1) || !r.Window.IC.Relative || !r.Window.VCE.Relative || !near(r.VCE_V, 5) {
				t.Errorf("window %+v, want %+v", r.Window, w)
			}
		}},
		{"absolute windows", append(base, "--ic-window", "1.5mA..2.5mA", "--vce-window", "4V..8V"), func(t *testing.T, r picker.Request) {
			if r.Window.IC.Relative || !near(r.Window.IC.Min, 1.5e-3) || !near(r.Window.IC.Max, 2.5e-3) || r.Window.VCE.Min != 4 || r.Window.VCE.Max != 8 {
				t.Errorf("window %+v", r.Window)
			}
		}},
		{"ic window alone without vce: the VCE band stays ±20 % of each build's target", append(base, "--ic-window", "20%"), func(t *testing.T, r picker.Request) {
			if !near(r.Window.IC.Frac, 0.2) || !r.Window.VCE.Relative || !near(r.Window.VCE.Frac, picker.DefaultVCEWindow) {
				t.Errorf("window %+v; want IC ±20 %%, VCE ±20 %%", r.Window)
			}
		}},
		{"simulated boards", append(base, "--sim-boards", "2500"), func(t *testing.T, r picker.Request) {
			if r.YieldBoards != 2500 || r.Boards != 1 {
				t.Errorf("yield boards %d, boards %d; want 2500 and 1", r.YieldBoards, r.Boards)
			}
		}},
		{"everything else", append(base, "--vcc-tol", "±2 %", "--ambient", "-10..60", "--boards", "25", "--load", "10K",
			"--bypass", "--pairs", "--require-tag", "Approved", "--require-tag", "rohs", "--require-tag", "approved",
			"--top", "3", "--exhaustive", "--show-failing", "--seed", "42", "--json"), func(t *testing.T, r picker.Request) {
			if !near(r.VCCTol, 0.02) || r.AmbientMin_C != -10 || r.AmbientMax_C != 60 || r.Boards != 25 || !near(r.RL_Ohm, 10e3) {
				t.Errorf("tol %g ambient %g..%g boards %d load %g", r.VCCTol, r.AmbientMin_C, r.AmbientMax_C, r.Boards, r.RL_Ohm)
			}
			if !r.Bypass || !r.Pairs || !r.Exhaustive || !r.ShowFailing || r.Top != 3 || r.Seed != 42 {
				t.Errorf("switches: %+v", r)
			}
			if !slices.Equal(r.RequireTags, []string{"approved", "rohs"}) {
				t.Errorf("tags %q, want [approved rohs]", r.RequireTags)
			}
		}},
		{"weights on top of the defaults", append(base, "--weights", "q=2, yield=0.5,util=0"), func(t *testing.T, r picker.Request) {
			want := defaultWeights()
			want.QPoint, want.Yield, want.Utilization = 2, 0.5, 0
			if r.Weights != want {
				t.Errorf("weights %+v, want %+v", r.Weights, want)
			}
		}},
		{"resistance in SI for the load", append(base, "--load", "4.7k"), func(t *testing.T, r picker.Request) {
			if !near(r.RL_Ohm, 4700) {
				t.Errorf("load %g, want 4700", r.RL_Ohm)
			}
		}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r, err := parseFlags(t, tt.args)
			if err != nil {
				t.Fatalf("%v: %v", tt.args, err)
			}
			tt.check(t, r)
		})
	}
}

func TestFlagErrors(t *testing.T) {
	base := []string{"--vcc", "12V", "--ic", "2mA"}
	tests := []struct {
		name string
		args []string
		want []string // substrings of the message: the problem and the fix
	}{
		{"no vcc", []string{"--ic", "2mA"}, []string{"--vcc is required", "--vcc 12V"}},
		{"no ic", []string{"--vcc", "12V"}, []string{"--ic is required", "--ic 2mA"}},
		{"bad vcc", []string{"--vcc", "12X", "--ic", "2mA"}, []string{"--vcc"}},
		{"vcc range and tolerance", []string{"--vcc", "7V..9.6V", "--vcc-tol", "5%", "--ic", "2mA"}, []string{"already a range", "not both"}},
		{"vcc range too wide", []string{"--vcc", "3V..12V", "--ic", "2mA"}, []string{"below 3 times"}},
		{"zero vcc", []string{"--vcc", "0", "--ic", "2mA"}, []string{"--vcc", "needs a supply"}},
		{"negative rail for npn", []string{"--vcc", "-12V", "--ic", "2mA"}, []string{"--vcc", "positive", "12 V"}},
		{"negative supply on a stated positive rail", []string{"--vcc", "-5V", "--rail", "positive", "--polarity", "pnp", "--ic", "1mA"}, []string{"--vcc", "positive rail", "5 V"}},
		{"npn on a negative rail", []string{"--vcc", "12V", "--rail", "negative", "--ic", "1mA"}, []string{"--rail", "NPN", "positive supply"}},
		{"rail for a split supply", []string{"--vcc", "9V", "--vee", "9V", "--topology", "split-supply", "--rail", "positive", "--polarity", "pnp", "--ic", "1mA"},
			[]string{"--rail", "common of its two supplies", "collector rail negative"}},
		{"unknown rail", []string{"--vcc", "9V", "--rail", "sideways", "--ic", "1mA"}, []string{"--rail", "positive or negative"}},
		{"negative ic", []string{"--vcc", "12V", "--ic", "-2mA"}, []string{"--ic", "negative"}},
		{"vce above the supply", append(base, "--vce", "15V"), []string{"--vce: 15 V cannot exist", "12 V supply", "choose a VCE below 11.4 V or raise --vcc"}},
		{"vce at the supply's low end", append(base, "--vce", "11.5V"), []string{"cannot exist", "11.4 V"}},
		{"unknown polarity", append(base, "--polarity", "fet"), []string{"--polarity", "npn or pnp"}},
		{"zero emitter rail", append(base, "--topology", "split-supply", "--vee", "0"), []string{"--vee", "needs a supply"}},
		{"unknown topology", append(base, "--topology", "cascode"), []string{"--topology", "want divider"}},
		{"ambient backwards", append(base, "--ambient", "60..-10"), []string{"--ambient"}},
		{"ambient not a range", append(base, "--ambient", "25"), []string{"--ambient", "0..50"}},
		{"ambient too hot", append(base, "--ambient", "0..200"), []string{"-55 °C..150 °C"}},
		{"zero boards", append(base, "--boards", "0"), []string{"--boards 0"}},
		{"zero top", append(base, "--top", "0"), []string{"--top 0"}},
		{"negative time limit", append(base, "--time-limit", "-5s"), []string{"--time-limit -5s", "0 to search to the end"}},
		{"negative weight", append(base, "--weights", "beta=-1"), []string{"beta=-1", "cannot be negative", "use 0"}},
		{"unknown weight", append(base, "--weights", "speed=1"), []string{"speed=1", "q, emitter, beta, headroom, util, yield, parts"}},
		{"all weights zero", append(base, "--weights", "q=0,emitter=0,beta=0,headroom=0,util=0,yield=0,parts=0"), []string{"every weight is 0", "positive"}},
		{"weight not a number", append(base, "--weights", "q=lots"), []string{"not a number"}},
		{"vce window of 100 %", append(base, "--vce-window", "100%"), []string{"--vce-window", "below 100 %"}},
		{"sim boards 0", append(base, "--sim-boards", "0"), []string{"--sim-boards"}},
		{"window not a band", append(base, "--ic-window", "wide"), []string{"--ic-window", "10%"}},
		{"zero load", append(base, "--load", "0R"), []string{"--load", "positive"}},
		{"huge supply tolerance", append(base, "--vcc-tol", "60%"), []string{"--vcc-tol"}},
		{"empty tag", append(base, "--require-tag", " "), []string{"--require-tag", "empty"}},
		{"emitter rail range and tolerance", append(base, "--topology", "split-supply", "--vee", "7V..9.6V", "--vee-tol", "5%"), []string{"--vee 7V..9.6V is already a range", "not both"}},
		{"emitter rail tolerance without the rail", append(base, "--vee-tol", "5%"), []string{"--vee-tol 5%", "no --vee"}},
		{"emitter rail tolerance zero", append(base, "--topology", "split-supply", "--vee", "12V", "--vee-tol", "0"), []string{"--vee-tol 0", "no supply is exact"}},
		{"emitter rail tolerance too wide", append(base, "--topology", "split-supply", "--vee", "12V", "--vee-tol", "60%"), []string{"--vee-tol", "50 %"}},
		{"keep without a value", append(base, "--keep", "r1"), []string{"--keep", "POSITION=VALUE"}},
		{"keep a bad value", append(base, "--keep", "r1=4X7"), []string{"--keep r1"}},
		{"keep a position the divider lacks", append(base, "--keep", "rf=100K"), []string{"--keep", "divider stage has no rf", "r1, r2, rc, re"}},
		{"keep a position twice", append(base, "--keep", "r1=47K", "--keep", "R1=39K"), []string{"--keep", "twice"}},
		{"keep a value out of range", append(base, "--keep", "re=0"), []string{"--keep", "re's value", "1 mΩ"}},
		{"keep positions of two topologies", append(base, "--topology", "any", "--keep", "r1=47K,rf=1M"), []string{"--keep", "no topology searched"}},
		{"unknown flag", append(base, "--frobnicate"), []string{"frobnicate"}},
		{"stray argument", append(base, "extra"), []string{"extra"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := parseFlags(t, tt.args)
			if err == nil {
				t.Fatalf("%v: no error", tt.args)
			}
			var u *cmdutil.UsageError
			if !errors.As(err, &u) {
				t.Errorf("%v: %T is not a usage error (exit 2)", tt.args, err)
			}
			if cmdutil.ExitCode(err) == 0 {
				t.Errorf("exit code 0 for %v", tt.args)
			}
			for _, w := range tt.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("%v: message %q lacks %q", tt.args, err, w)
				}
			}
		})
	}
}
