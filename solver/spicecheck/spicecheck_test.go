package spicecheck

import (
	"context"
	"math"
	"strings"
	"testing"
	"time"
)

// rawSample is an ASCII raw file as ngspice 39 writes it after
// `let x0 = v(b)`, `let x1 = @q1[ic]`, `write file x0 x1` (source: ngspice
// run while writing this harness).
const rawSample = `Title: * x
Date: Wed Dec  2 00:24:44  2026
Plotname: Operating Point
Flags: real
No. Variables: 3
No. Points: 1
Variables:
	0	v(vcc)	voltage
	1	v(x0)	voltage
	2	x1	notype
Values:
 0	-1.500000000000000e+01
	9.357189965472850e+00
	-2.489736196755668e-02
`

func TestParseRaw(t *testing.T) {
	vals, err := ParseRaw([]byte(rawSample))
	if err != nil {
		t.Fatal(err)
	}
	for name, want := range map[string]float64{"v(vcc)": -15, "v(x0)": 9.357189965472850, "x1": -2.489736196755668e-02} {
		if got, ok := vals[name]; !ok || got != want {
			t.Errorf("%s = %v (present %v), want %v", name, got, ok, want)
		}
	}
	if v, ok := lookup(vals, "x0"); !ok || v != 9.357189965472850 {
		t.Errorf("lookup x0 = %v %v", v, ok)
	}
	if _, err := ParseRaw([]byte(strings.Replace(rawSample, "No. Variables: 3", "No. Variables: 4", 1))); err == nil {
		t.Error("a short raw file parsed without error")
	}
}

func TestStripControl(t *testing.T) {
	deck := "* t\nr1 a 0 1k\n.control\nop\nprint v(a)\n.endc\n.end\n"
	if got, want := StripControl(deck), "* t\nr1 a 0 1k\n.end\n"; got != want {
		t.Errorf("StripControl = %q, want %q", got, want)
	}
}

// TestRunDivider: a resistive divider through ngspice gives exactly
// V·R2/(R1+R2) (Ohm's law), for two decks in one process.
func TestRunDivider(t *testing.T) {
	Require(t)
	jobs := []Job{
		{Deck: "* a\nv1 in 0 dc 9\nr1 in out 2k\nr2 out 0 1k\n.end\n", Vectors: []string{"v(out)", "i(v1)"}},
		{Deck: "* b\nv1 in 0 dc -5\nr1 in out 1k\nr2 out 0 4k\n.end\n", Vectors: []string{"v(out)"}},
	}
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	defer cancel()
	got, err := Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	if v := got[0]["v(out)"]; math.Abs(v-3) > 1e-9 {
		t.Errorf("deck a: v(out) = %v, want 3", v)
	}
	if i := got[0]["i(v1)"]; math.Abs(i+3e-3) > 1e-12 {
		t.Errorf("deck a: i(v1) = %v, want -3 mA (SPICE: current into the + terminal)", i)
	}
	if v := got[1]["v(out)"]; math.Abs(v+4) > 1e-9 {
		t.Errorf("deck b: v(out) = %v, want -4", v)
	}
}
