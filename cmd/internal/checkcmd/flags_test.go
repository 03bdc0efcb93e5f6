package checkcmd

import (
	"biasbin/cmd/internal/buildjob"
	"biasbin/picker"
	"bytes"
	"context"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// parseFlags runs the command's flag parsing on args and returns the input
// it builds, or the error a user would see. open, when not nil, is the
// stock; otherwise opening the stock fails the test.
func parseFlags(t *testing.T, args []string, open func(context.Context) (*store.DB, error)) (job.CheckRequest, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	var in job.CheckRequest
	cmd := newCmd(f, func(o *Options) error {
		if open != nil {
			o.Store = open
		} else {
			o.Store = func(context.Context) (*store.DB, error) {
				t.Errorf("the stock was opened without --transistor")
				return nil, context.Canceled
			}
		}
		var err error
		in, err = o.input(context.Background())
		return err
	})
	err := cmdtest.Execute(cmd, args, &out, &errOut)
	if out.Len() != 0 {
		t.Errorf("flag parsing wrote to stdout: %q", out.String())
	}
	return in, err
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Max(1, math.Abs(b)) }

var divider = []string{"--vcc", "15V", "--r1", "10K", "--r2", "5K", "--rc", "1K", "--re", "1K", "--hfe", "100..300"}

func args(extra ...string) []string { return append(append([]string{}, divider...), extra...) }

func TestFlags(t *testing.T) {
	tests := []struct {
		name  string
		args  []string
		check func(t *testing.T, in job.CheckRequest)
	}{
		// A 9 V battery from 9.6 V fresh to 7 V flat (common practice):
		// the middle ± the tolerance that reaches both ends.
		{"supply range", []string{"--vcc", "7V..9.6V", "--r1", "10K", "--r2", "5K", "--rc", "1K", "--re", "1K", "--hfe", "100..300"}, func(t *testing.T, in job.CheckRequest) {
			b := in.Build
			if !near(b.VCC_V*(1-b.VCCTol), 7) || !near(b.VCC_V*(1+b.VCCTol), 9.6) {
				t.Errorf("vcc %g ±%g: spans %g..%g, want 7..9.6", b.VCC_V, b.VCCTol, b.VCC_V*(1-b.VCCTol), b.VCC_V*(1+b.VCCTol))
			}
		}},
		{"defaults", divider, func(t *testing.T, in job.CheckRequest) {
			b := in.Build
			if b.Topology != solver.Divider || b.Device.Polarity != solver.NPN || !near(b.VCC_V, 15) || !near(b.VCCTol, 0.05) {
				t.Errorf("topology %v polarity %v vcc %g tol %g; want divider npn 15 0.05", b.Topology, b.Device.Polarity, b.VCC_V, b.VCCTol)
			}
			want := map[solver.Slot]float64{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3}
			for s, ohm := range want {
				r := b.Resistors[s]
				if !near(r.Nominal_Ohm, ohm) || !near(r.Tol, 0.05) || !near(r.TCR_PPMPerK, 100) || !near(r.Rated_W, 0.25) {
					t.Errorf("%v = %+v, want %g Ω ±5 %% 100 ppm/K 0.25 W", s, r, ohm)
				}
			}
			if b.AmbientMin_C != 0 || b.AmbientMax_C != 50 || b.NominalAmbient_C != 25 || b.NominalBeta != 0 {
				t.Errorf("ambient %g..%g nominal %g beta %g; want 0..50, 25, typical", b.AmbientMin_C, b.AmbientMax_C, b.NominalAmbient_C, b.NominalBeta)
			}
			if b.Device.HFEMin != 100 || b.Device.HFEMax != 300 {
				t.Errorf("hFE %g..%g, want 100..300", b.Device.HFEMin, b.Device.HFEMax)
			}
			if !in.Window.IC.Relative || !near(in.Window.IC.Frac, 0.1) || !in.Window.VCE.Relative || !near(in.Window.VCE.Frac, 0.2) {
				t.Errorf("window %+v, want ±10 %% IC, ±20 %% VCE", in.Window)
			}
			if in.Boards != 10000 || in.Seed != 1 || in.Label != "" {
				t.Errorf("boards %d seed %d label %q", in.Boards, in.Seed, in.Label)
			}
		}},
		{"tolerance letter on a value", args("--r2", "4K7F", "--tol", "2%"), func(t *testing.T, in job.CheckRequest) {
			if !near(in.Build.Resistors[solver.R2].Tol, 0.01) || !near(in.Build.Resistors[solver.R1].Tol, 0.02) {
				t.Errorf("tolerances %g, %g; want 0.01 (F) and 0.02 (--tol)", in.Build.Resistors[solver.R2].Tol, in.Build.Resistors[solver.R1].Tol)
			}
		}},
		{"SI values", args("--r1", "10k", "--rc", "2.2 kΩ", "--tcr", "-200ppm/K", "--power", "1/2W"), func(t *testing.T, in job.CheckRequest) {
			if !near(in.Build.Resistors[solver.R1].Nominal_Ohm, 10e3) || !near(in.Build.Resistors[solver.RC].Nominal_Ohm, 2200) ||
				!near(in.Build.Resistors[solver.RC].TCR_PPMPerK, -200) || !near(in.Build.Resistors[solver.RC].Rated_W, 0.5) {
				t.Errorf("resistors %+v", in.Build.Resistors)
			}
		}},
		{"pnp magnitude rail", args("--polarity", "pnp", "--vcc", "9V"), func(t *testing.T, in job.CheckRequest) {
			if in.Build.Device.Polarity != solver.PNP || !near(in.Build.VCC_V, -9) {
				t.Errorf("polarity %v vcc %g, want pnp -9", in.Build.Device.Polarity, in.Build.VCC_V)
			}
		}},
		{"pnp signed rail", args("--polarity", "PNP", "--vcc", "-9V"), func(t *testing.T, in job.CheckRequest) {
			if !near(in.Build.VCC_V, -9) {
				t.Errorf("vcc %g, want -9", in.Build.VCC_V)
			}
		}},
		{"split supply", []string{"--topology", "split-supply", "--vcc", "15V", "--vee", "15V", "--rb", "0", "--rc", "10K", "--re", "20K", "--hfe", "100..300"}, func(t *testing.T, in job.CheckRequest) {
			b := in.Build
			if b.Topology != solver.SplitSupply || !near(b.VEE_V, -15) || b.Resistors[solver.RB].Nominal_Ohm != 0 || !near(b.Resistors[solver.RE].Nominal_Ohm, 20e3) {
				t.Errorf("split supply build %+v", b)
			}
		}},
		{"collector feedback without RE", []string{"--topology", "collector-feedback", "--vcc", "10V", "--rf", "250K", "--rc", "4K7", "--hfe", "90"}, func(t *testing.T, in job.CheckRequest) {
			b := in.Build
			if b.Topology != solver.CollectorFeedback || !near(b.Resistors[solver.RF].Nominal_Ohm, 250e3) || b.Resistors[solver.RE].Nominal_Ohm != 0 || b.Device.HFEMin != 90 || b.Device.HFEMax != 90 {
				t.Errorf("feedback build %+v", b)
			}
		}},
		{"inline datasheet", args("--hfe", "110..800@2mA", "--hfe-typ", "290", "--vbe", "0.66V@2mA", "--vce-sat", "0.25V", "--vaf", "74V", "--vceo", "45V", "--ic-max", "100mA", "--pd", "625mW", "--theta-ja", "200K/W", "--tj-max", "150", "--icbo", "15nA"), func(t *testing.T, in job.CheckRequest) {
			d := in.Build.Device
			want := solver.Datasheet{Polarity: solver.NPN, HFEMin: 110, HFEMax: 800, HFETyp: 290, HFEAt_A: 2e-3, VBEOn_V: 0.66, VBEAt_A: 2e-3,
				VCESat_V: 0.25, VAF_V: 74, VCEO_V: 45, ICMax_A: 0.1, PD25_W: 0.625, ThetaJA_KPerW: 200, TjMax_C: 150, ICBO_A: 15e-9}
			for _, c := range []struct {
				name      string
				got, want float64
			}{{"hfe min", d.HFEMin, want.HFEMin}, {"hfe max", d.HFEMax, want.HFEMax}, {"hfe typ", d.HFETyp, want.HFETyp}, {"hfe at", d.HFEAt_A, want.HFEAt_A},
				{"vbe", d.VBEOn_V, want.VBEOn_V}, {"vbe at", d.VBEAt_A, want.VBEAt_A}, {"vce sat", d.VCESat_V, want.VCESat_V}, {"vaf", d.VAF_V, want.VAF_V},
				{"vceo", d.VCEO_V, want.VCEO_V}, {"ic max", d.ICMax_A, want.ICMax_A}, {"pd", d.PD25_W, want.PD25_W}, {"theta", d.ThetaJA_KPerW, want.ThetaJA_KPerW},
				{"tj max", d.TjMax_C, want.TjMax_C}, {"icbo", d.ICBO_A, want.ICBO_A}} {
				if !near(c.got, c.want) {
					t.Errorf("%s = %g, want %g", c.name, c.got, c.want)
				}
			}
		}},
		{"bare --bypass is all of RE", args("--bypass", "--load", "10K"), func(t *testing.T, in job.CheckRequest) {
			if !near(in.Build.RBypass_Ohm, 1e3) || !near(in.Build.RL_Ohm, 10e3) {
				t.Errorf("bypass %g load %g, want 1000 and 10000", in.Build.RBypass_Ohm, in.Build.RL_Ohm)
			}
		}},
		{"partial bypass", args("--bypass=470R"), func(t *testing.T, in job.CheckRequest) {
			if !near(in.Build.RBypass_Ohm, 470) {
				t.Errorf("bypass %g, want 470", in.Build.RBypass_Ohm)
			}
		}},
		{"absolute window, nominal point pinned", args("--window", "1.8mA..2.2mA,4V..8V", "--beta", "200", "--temp", "40", "--ambient", "-10..60", "--sim-boards", "500", "--seed", "9"), func(t *testing.T, in job.CheckRequest) {
			w := in.Window.At(picker.WindowCentre{IC_A: 1, VCE_V: 1})
			if !near(w.ICMin_A, 1.8e-3) || !near(w.ICMax_A, 2.2e-3) || !near(w.VCEMin_V, 4) || !near(w.VCEMax_V, 8) {
				t.Errorf("window %+v", w)
			}
			b := in.Build
			if b.NominalBeta != 200 || b.NominalAmbient_C != 40 || b.AmbientMin_C != -10 || b.AmbientMax_C != 60 || in.Boards != 500 || in.Seed != 9 {
				t.Errorf("nominal %g/%g ambient %g..%g boards %d seed %d", b.NominalBeta, b.NominalAmbient_C, b.AmbientMin_C, b.AmbientMax_C, in.Boards, in.Seed)
			}
		}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			in, err := parseFlags(t, tt.args, nil)
			if err != nil {
				t.Fatalf("%v: %v", tt.args, err)
			}
			tt.check(t, in)
		})
	}
}

func TestFlagErrors(t *testing.T) {
	tests := []struct {
		name string
		args []string
		want string // the flag the message must name
	}{
		{"no supply", []string{"--r1", "10K", "--r2", "5K", "--rc", "1K", "--hfe", "100..300"}, "--vcc"},
		{"supply range and tolerance", []string{"--vcc", "7V..9.6V", "--vcc-tol", "5%", "--r1", "10K", "--r2", "5K", "--rc", "1K", "--hfe", "100..300"}, "--vcc-tol"},
		{"supply range across 0 V", []string{"--vcc", "-5V..5V", "--r1", "10K", "--r2", "5K", "--rc", "1K", "--hfe", "100..300"}, "--vcc"},
		{"negative rail for npn", args("--vcc", "-12V"), "--vcc"},
		{"bad resistance", args("--r1", "ten"), "--r1"},
		{"negative resistance", args("--rc", "-1K"), "--rc"},
		{"zero R1", args("--r1", "0"), "--r1"},
		{"resistor the topology lacks", args("--rf", "100K"), "--rf"},
		{"missing R2", []string{"--vcc", "12V", "--r1", "10K", "--rc", "1K", "--hfe", "100..300"}, "--r2"},
		{"hFE reversed", args("--hfe", "300..100"), "--hfe"},
		{"no transistor", []string{"--vcc", "12V", "--r1", "10K", "--r2", "5K", "--rc", "1K"}, "--hfe"},
		{"typical outside the window", args("--hfe-typ", "50"), "--hfe-typ"},
		{"vee on a divider", args("--vee", "5V"), "--vee"},
		{"split supply without vee", []string{"--topology", "split-supply", "--vcc", "15V", "--rb", "10K", "--rc", "10K", "--re", "20K", "--hfe", "100..300"}, "--vee"},
		{"unknown topology", args("--topology", "cascode"), "--topology"},
		{"unknown polarity", args("--polarity", "fet"), "--polarity"},
		{"ambient below -55 °C", args("--ambient", "-80..20"), "--ambient"},
		{"nominal ambient above 150 °C", args("--temp", "200"), "--temp"},
		{"bad ambient range", args("--ambient", "60..-10"), "--ambient"},
		{"negative beta", args("--beta", "-5"), "--beta"},
		{"no boards", args("--sim-boards", "0"), "--sim-boards"},
		{"window without VCE part", args("--window", "10%"), "--window"},
		{"bypass more than RE", args("--bypass=2K"), "--bypass"},
		{"bypass value without =", args("--bypass", "470R"), "--bypass=470R"},
		{"bypass with no RE", []string{"--vcc", "12V", "--r1", "10K", "--r2", "5K", "--rc", "1K", "--hfe", "100..300", "--bypass"}, "--bypass"},
		{"tolerance too wide", args("--tol", "60%"), "tol"},
		{"zero power rating", args("--power", "0W"), "--power"},
		{"vbe not a silicon junction", args("--vbe", "3V@1mA"), "--vbe"},
		{"ambient up to tj max", args("--tj-max", "125", "--ambient", "0..130"), "--ambient"},
		{"tj max 0 (refused, not read as the default)", args("--tj-max", "0"), "--tj-max"},
		{"beta 1e12", args("--beta", "1e12"), "--beta"},
		{"icbo 1 A", args("--icbo", "1A"), "--icbo"},
		{"sim boards above a million", args("--sim-boards", "2000000"), "--sim-boards"},
		{"--boards is not the simulated boards", args("--boards", "150"), "--sim-boards"},
		{"window share of 100 %", args("--window", "100%,20%"), "--window"},
		{"design IC not a current", args("--ic", "-1mA"), "--ic"},
		{"stray argument", args("extra"), "argument"},
		{"unknown flag", args("--r7", "1K"), "r7"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := parseFlags(t, tt.args, nil)
			if err == nil {
				t.Fatalf("%v: no error, want one naming %s", tt.args, tt.want)
			}
			if code := cmdutil.ExitCode(err); code != 2 {
				t.Errorf("exit code %d for %v, want 2 (usage)", code, err)
			}
			if !strings.Contains(err.Error(), tt.want) {
				t.Errorf("error %q does not name %s", err, tt.want)
			}
		})
	}
}

func TestFlagsStockTransistor(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "stock.db")
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	if _, err := db.AddTransistor(ctx, store.Transistor{Label: "GP-PNP", Polarity: "pnp", HFEMin: 120, HFEMax: 360, ThetaJA_KPerW: 250, Qty: 10, Bin: "T3"}); err != nil {
		t.Fatal(err)
	}
	opened := 0
	open := func(context.Context) (*store.DB, error) { opened++; return db, nil }
	in, err := parseFlags(t, []string{"--vcc", "9V", "--r1", "10K", "--r2", "2K2", "--rc", "3K6", "--re", "1K", "--transistor", "GP-PNP"}, open)
	if err != nil {
		t.Fatal(err)
	}
	d := in.Build.Device
	if opened != 1 || in.Label != "GP-PNP" || d.Polarity != solver.PNP || d.HFEMin != 120 || d.HFEMax != 360 || d.ThetaJA_KPerW != 250 || !near(in.Build.VCC_V, -9) {
		t.Errorf("stock transistor read as %+v (label %q, vcc %g, opened %d)", d, in.Label, in.Build.VCC_V, opened)
	}
	// Inline flags override the stock line.
	in, err = parseFlags(t, []string{"--vcc", "9V", "--r1", "10K", "--r2", "2K2", "--rc", "3K6", "--transistor", "GP-PNP", "--theta-ja", "100", "--hfe", "150..200"}, open)
	if err != nil {
		t.Fatal(err)
	}
	if in.Build.Device.ThetaJA_KPerW != 100 || in.Build.Device.HFEMin != 150 || in.Build.Device.HFEMax != 200 {
		t.Errorf("overrides not applied: %+v", in.Build.Device)
	}
	_, err = parseFlags(t, []string{"--vcc", "9V", "--r1", "10K", "--r2", "2K2", "--rc", "3K6", "--transistor", "NOPE"}, open)
	if err == nil || cmdutil.ExitCode(err) != 2 || !strings.Contains(err.Error(), "--transistor") {
		t.Errorf("unknown label: error %v, want a usage error naming --transistor", err)
	}
}

// TestStockTransistorLabelCase: --transistor finds a stock line whatever
// the letter case typed and reports it under its stocked label; a label
// stocked in two spellings is a usage error listing each line's label, bin
// and ID.
func TestStockTransistorLabelCase(t *testing.T) {
	type line struct {
		label, bin string
		hfeMin     float64
	}
	for _, tc := range []struct {
		name   string
		stock  []line
		ask    string
		want   int   // index of the line used, -1 for an error
		listed []int // lines the error must list
	}{
		{"exact", []line{{"QN-230", "T1", 110}}, "QN-230", 0, nil},
		{"other case", []line{{"QP-7", "T2", 90}, {"QN-230", "T1", 110}}, "qn-230", 1, nil},
		{"one spelling in two bins: lowest ID", []line{{"QN-230", "T1", 110}, {"QN-230", "T2", 150}}, "Qn-230", 0, nil},
		{"two spellings", []line{{"QN-230", "T1", 110}, {"qn-230", "T2", 150}}, "qn-230", -1, []int{0, 1}},
		{"not stocked", []line{{"QN-230", "T1", 110}}, "QN-231", -1, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ctx := context.Background()
			db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
			if err != nil {
				t.Fatal(err)
			}
			defer db.Close()
			ids := make([]int64, len(tc.stock))
			for i, l := range tc.stock {
				res, err := db.AddTransistor(ctx, store.Transistor{Label: l.label, Polarity: "npn", HFEMin: l.hfeMin, HFEMax: 400, Qty: 5, Bin: l.bin})
				if err != nil {
					t.Fatal(err)
				}
				ids[i] = res.ID
			}
			open := func(context.Context) (*store.DB, error) { return db, nil }
			in, err := parseFlags(t, []string{"--vcc", "9V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--transistor", tc.ask}, open)
			if tc.want >= 0 {
				w := tc.stock[tc.want]
				if err != nil || in.Label != w.label || in.Build.Device.HFEMin != w.hfeMin {
					t.Fatalf("got label %q hFE min %g (%v), want %s with hFE min %g", in.Label, in.Build.Device.HFEMin, err, w.label, w.hfeMin)
				}
				return
			}
			if err == nil || cmdutil.ExitCode(err) != 2 || !strings.Contains(err.Error(), "--transistor") {
				t.Fatalf("error %v, want a usage error naming --transistor", err)
			}
			for _, k := range tc.listed {
				for _, s := range []string{tc.stock[k].label + " (ID " + strconv.FormatInt(ids[k], 10) + ", bin " + tc.stock[k].bin + ")", "stock remove ID"} {
					if !strings.Contains(err.Error(), s) {
						t.Errorf("message %q lacks %q", err, s)
					}
				}
			}
		})
	}
}

// TestResistorFlagForms: a resistor flag takes VALUE/TOLERANCE/POWER
// (IEC 60062 code, REFERENCE.md §2) or a stock line #ID, whose stocked
// tolerance, rating, TCR and element voltage are used.
func TestResistorFlagForms(t *testing.T) {
	ctx := context.Background()
	db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	line, err := db.AddResistor(ctx, store.Resistor{Ohm: 6800, Tol: 0.1, Rated_W: 1, Tech: store.TechMetalOxide, LEV_V: 350, Qty: 4, Bin: "A"})
	if err != nil {
		t.Fatal(err)
	}
	open := func(context.Context) (*store.DB, error) { return db, nil }
	base := []string{"--vcc", "15V", "--r1", "10K", "--r2", "5K", "--re", "1K", "--hfe", "100..300"}

	in, err := parseFlags(t, append(base, "--rc", "6K8/10%/1W"), nil)
	if err != nil {
		t.Fatal(err)
	}
	if rc := in.Build.Resistors[solver.RC]; rc.Nominal_Ohm != 6800 || !near(rc.Tol, 0.1) || rc.Rated_W != 1 {
		t.Errorf("--rc 6K8/10%%/1W: %+v", rc)
	}
	in, err = parseFlags(t, append(base, "--rc", "#"+strconv.FormatInt(line.ID, 10)), open)
	if err != nil {
		t.Fatal(err)
	}
	// Metal oxide ±350 ppm/K is the store's default (from memory).
	if rc := in.Build.Resistors[solver.RC]; rc.Nominal_Ohm != 6800 || !near(rc.Tol, 0.1) || rc.Rated_W != 1 || rc.LEV_V != 350 || rc.TCR_PPMPerK != 350 {
		t.Errorf("--rc #%d: %+v", line.ID, rc)
	}
	if _, err := parseFlags(t, append(base, "--rc", "#999"), open); err == nil || !strings.Contains(err.Error(), "--rc") {
		t.Errorf("--rc #999: %v", err)
	}
}

// TestCheckBuildID: `check ID` takes the build a pick listed, kept with
// the pick, exactly as picked (the stock is invented); build flags beside
// an ID are refused.
func TestCheckBuildID(t *testing.T) {
	ctx := context.Background()
	db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	var st picker.Stock
	for i, ohm := range []float64{1e3, 2.2e3, 4.7e3, 10e3, 22e3, 47e3} {
		st.Resistors = append(st.Resistors, picker.Resistor{ID: int64(i + 1), Ohm: ohm, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25, Qty: 10, Bin: "A"})
	}
	st.Transistors = []picker.Transistor{{ID: 9, Qty: 5, Bin: "T", Sheet: solver.Datasheet{Label: "QX-1", Polarity: solver.NPN,
		HFEMin: 100, HFEMax: 300, VCEO_V: 40, PD25_W: 0.5, ICMax_A: 0.1}}}
	out, err := job.Pick(st, picker.Request{Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 1e-3, Top: 1}, picker.Pick)
	if err != nil || len(out.Builds) == 0 {
		t.Fatalf("pick: %v", err)
	}
	if err := buildjob.KeepPick(ctx, db, out, st); err != nil {
		t.Fatal(err)
	}
	open := func(context.Context) (*store.DB, error) { return db, nil }
	id := out.Builds[0].ID
	in, err := parseFlags(t, []string{id}, open)
	if err != nil {
		t.Fatal(err)
	}
	want := out.Builds[0].Build
	if in.Build.VCC_V != want.VCC_V || in.Build.Resistors != want.Resistors || in.Build.Device.Label != "QX-1" {
		t.Errorf("check %s: build %+v, want %+v", id, in.Build, want)
	}
	if _, err := parseFlags(t, []string{id, "--vcc", "9V"}, open); err == nil || !strings.Contains(err.Error(), "--vcc") {
		t.Errorf("check %s --vcc 9V: %v", id, err)
	}
	if _, err := parseFlags(t, []string{"b0000000000000"}, open); err == nil {
		t.Error("an unknown build ID was accepted")
	}
}
