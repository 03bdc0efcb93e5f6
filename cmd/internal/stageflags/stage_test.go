package stageflags

import (
	"context"
	"errors"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/spf13/pflag"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockparts"
	"biasbin/solver"
	"biasbin/store"
)

// parseStage registers the stage flags on a fresh flag set, as check,
// substitute and diagnose do, and parses args.
func parseStage(t *testing.T, args ...string) *Stage {
	t.Helper()
	var s Stage
	fl := pflag.NewFlagSet("test", pflag.ContinueOnError)
	s.AddFlags(fl)
	if err := fl.Parse(args); err != nil {
		t.Fatal(err)
	}
	return &s
}

// TestStageRails: the rails take their sign from solver.Rail, the one
// place the convention lives (solver/doc.go: a PNP stage's VCC is
// negative, VEE opposite to VCC); a sign against the rail is a usage error
// naming the flag.
func TestStageRails(t *testing.T) {
	tests := []struct {
		args     []string
		pol      solver.Polarity
		vcc, vee float64
		bad      string // the flag a usage error names, "" for none
	}{
		{[]string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2"}, solver.NPN, 12, 0, ""},
		{[]string{"--vcc", "9V", "--r1", "47K", "--r2", "10K", "--rc", "2K2"}, solver.PNP, -9, 0, ""},
		{[]string{"--vcc", "-9V", "--r1", "47K", "--r2", "10K", "--rc", "2K2"}, solver.PNP, -9, 0, ""},
		{[]string{"--vcc", "-12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2"}, solver.NPN, 0, 0, "--vcc"},
		{[]string{"--topology", "split-supply", "--vcc", "15V", "--vee", "15V", "--rb", "10K", "--rc", "10K", "--re", "20K"}, solver.NPN, 15, -15, ""},
		{[]string{"--topology", "split-supply", "--vcc", "15V", "--vee", "15V", "--rb", "10K", "--rc", "10K", "--re", "20K"}, solver.PNP, -15, 15, ""},
		{[]string{"--topology", "split-supply", "--vcc", "15V", "--vee", "-15V", "--rb", "10K", "--rc", "10K", "--re", "20K"}, solver.PNP, 0, 0, "--vee"},
	}
	for _, tt := range tests {
		b, err := parseStage(t, tt.args...).Build(context.Background(), tt.pol, nil)
		var ue *cmdutil.UsageError
		switch {
		case tt.bad == "" && (err != nil || b.VCC_V != tt.vcc || b.VEE_V != tt.vee):
			t.Errorf("%v (%v): VCC %g VEE %g, %v; want %g, %g", tt.args, tt.pol, b.VCC_V, b.VEE_V, err, tt.vcc, tt.vee)
		case tt.bad != "" && (!errors.As(err, &ue) || !strings.HasPrefix(err.Error(), tt.bad+":")):
			t.Errorf("%v (%v): %v; want a usage error naming %s", tt.args, tt.pol, err, tt.bad)
		}
	}
}

// TestStageStockResistor: a stock line whose data the solver refuses (a
// 60 % tolerance; the solver takes up to 50 %) is the stock's fault, not
// the flag's: a *stockparts.LineError (exit 1), never a usage error.
func TestStageStockResistor(t *testing.T) {
	ctx := context.Background()
	db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	line, err := db.AddResistor(ctx, store.Resistor{Ohm: 2200, Tol: 0.6, Rated_W: 0.25, Qty: 4, Bin: "A"})
	if err != nil {
		t.Skipf("the store refuses the line itself: %v", err)
	}
	open := func(context.Context) (*store.DB, error) { return db, nil }
	s := parseStage(t, "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "#"+strconv.FormatInt(line.ID, 10))
	_, err = s.Build(ctx, solver.NPN, open)
	var le *stockparts.LineError
	var ue *cmdutil.UsageError
	if !errors.As(err, &le) || errors.As(err, &ue) {
		t.Fatalf("err = %v, want a stock line error", err)
	}
}

// TestStageGround: --rail and the sign of --vcc say where 0 V is (common
// practice: a PNP stage usually runs from a positive supply, emitter side
// to +V and collector side to 0 V; the negative-rail form puts its emitter
// side on 0 V; a split supply is read from its common).
func TestStageGround(t *testing.T) {
	div := []string{"--r1", "47K", "--r2", "10K", "--rc", "2K2"}
	tests := []struct {
		args []string
		pol  solver.Polarity
		want solver.Ground
		bad  string
	}{
		{append([]string{"--vcc", "12V"}, div...), solver.NPN, solver.EmitterRailGround, ""},
		{append([]string{"--vcc", "5V"}, div...), solver.PNP, solver.CollectorRailGround, ""},
		{append([]string{"--vcc", "5V", "--rail", "positive"}, div...), solver.PNP, solver.CollectorRailGround, ""},
		{append([]string{"--vcc", "5V", "--rail", "negative"}, div...), solver.PNP, solver.EmitterRailGround, ""},
		{append([]string{"--vcc", "-5V"}, div...), solver.PNP, solver.EmitterRailGround, ""},
		{append([]string{"--vcc", "-5V", "--rail", "positive"}, div...), solver.PNP, 0, "--vcc"},
		{append([]string{"--vcc", "12V", "--rail", "negative"}, div...), solver.NPN, 0, "--rail"},
		{append([]string{"--vcc", "12V", "--rail", "up"}, div...), solver.PNP, 0, "--rail"},
		{[]string{"--topology", "split-supply", "--vcc", "15V", "--vee", "15V", "--rb", "10K", "--rc", "10K", "--re", "20K"}, solver.PNP, solver.EmitterRailGround, ""},
		{[]string{"--topology", "split-supply", "--vcc", "15V", "--vee", "15V", "--rb", "10K", "--rc", "10K", "--re", "20K", "--rail", "positive"}, solver.PNP, 0, "--rail"},
	}
	for _, tt := range tests {
		b, err := parseStage(t, tt.args...).Build(context.Background(), tt.pol, nil)
		var ue *cmdutil.UsageError
		switch {
		case tt.bad == "" && (err != nil || b.Ground != tt.want):
			t.Errorf("%v (%v): ground %v, %v; want %v", tt.args, tt.pol, b.Ground, err, tt.want)
		case tt.bad != "" && (!errors.As(err, &ue) || !strings.HasPrefix(err.Error(), tt.bad+":")):
			t.Errorf("%v (%v): %v; want a usage error naming %s", tt.args, tt.pol, err, tt.bad)
		}
	}
}
