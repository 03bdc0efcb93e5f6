package root

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Points 6 and 11 of the stock-safety issue: `--db ""` is a usage error
// (exit 2) that creates nothing, and a flag given twice with different
// values is refused naming the flag, for every command; the same value
// twice and list flags are accepted.
func TestFlagMisuseIsAUsageError(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "stock.db")
	env := map[string]string{"HOME": dir}
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"--db", "", "stock", "list"}, 2, `invalid argument "" for "--db" flag: empty path`},
		{[]string{"--db", db, "--db", db + "2", "stock", "list"}, 2, `for "--db" flag: given twice with different values`},
		{[]string{"--db", db, "pick", "--vcc", "12", "--vcc", "24", "--ic", "1mA"}, 2, `for "--vcc" flag: given twice`},
		{[]string{"--db", db, "check", "--vcc", "12", "--r1", "10k", "--r1", "20k"}, 2, `"--r1" flag: given twice`},
		{[]string{"--db", db, "stock", "export", "--kind", "resistor", "--kind", "transistor"}, 2, `"--kind" flag: given twice`},
		{[]string{"--db", db, "stock", "list", "--kind", "resistor", "--kind", "resistor"}, 1, "no stock file"},
		{[]string{"--db", db, "stock", "list", "--tag", "a", "--tag", "b"}, 1, "no stock file"},
	} {
		_, errOut, code := run(t, env, tc.args...)
		if code != tc.code || !strings.Contains(errOut, tc.want) {
			t.Errorf("%q: exit %d, want %d with %q: %s", tc.args, code, tc.code, tc.want, errOut)
		}
	}
	if left, _ := os.ReadDir(dir); len(left) != 0 {
		t.Errorf("left %d entries in %s", len(left), dir)
	}
}

// Points 8 to 10 of the stock-safety issue: physically absurd requests and
// counts that would overflow are refused with exit 2, naming the input and
// the accepted range (the ranges and their reasons are the tables in
// solver/ranges.go and picker/ranges.go), before any stock is read.
func TestAbsurdRequestsAreRefused(t *testing.T) {
	db := filepath.Join(t.TempDir(), "stock.db")
	stage := []string{"--r1", "47k", "--r2", "10k", "--rc", "4k7", "--re", "1k"}
	check := func(extra ...string) []string {
		return append(append([]string{"--db", db, "check"}, stage...), extra...)
	}
	pick := func(extra ...string) []string { return append([]string{"--db", db, "pick"}, extra...) }
	for _, tc := range []struct {
		name string
		args []string
		want string
	}{
		{"check supply 1e-300 V", check("--vcc", "1e-300", "--hfe", "100..300"), "--vcc: supply voltage (magnitude) 1e-300 V is outside the accepted 1 V..1.5 kV"},
		{"check supply 1 GV", check("--vcc", "1e9", "--hfe", "100..300"), "--vcc: supply voltage (magnitude) 1 GV is outside"},
		{"check beta 1e12", check("--vcc", "12", "--hfe", "100..300", "--beta", "1e12"), "--beta: hFE 1e+12 is outside the accepted 1..100000"},
		{"check ICBO 1 A", check("--vcc", "12", "--hfe", "100..300", "--icbo", "1A"), "--icbo: ICBO at 25 °C 1 A is outside the accepted 0 A..1 mA"},
		{"check VCE(sat) above the supply", check("--vcc", "3", "--hfe", "100..300", "--vce-sat", "4V"), "--vce-sat: VCE(sat) 4 V is not below the lowest supply"},
		{"check hFE 1e-30", check("--vcc", "12", "--hfe", "1e-30..1e-30"), "--hfe: hFE 1e-30 is outside"},
		{"check Tj max 0", check("--vcc", "12", "--hfe", "100..300", "--tj-max", "0"), "--tj-max: Tj max 0 °C is outside the accepted 100 °C..200 °C"},
		{"check a 1e-30 Ω resistor", append(check("--vcc", "12", "--hfe", "100..300"), "--rc", "1e-30"), "given twice"},
		{"pick IC 1e-300", pick("--vcc", "12", "--ic", "1e-300"), "ic: target IC 1e-300 A is outside the accepted 100 nA..10 A"},
		{"pick supply 1 GV", pick("--vcc", "1e9", "--ic", "1mA"), "vcc: supply voltage (magnitude) 1 GV is outside"},
		{"pick --top 1e9", pick("--vcc", "12", "--ic", "1mA", "--top", "1000000000"), "top: builds shown 1e+09 is outside the accepted 1..256"},
		{"pick --boards 2^63-1", pick("--vcc", "12", "--ic", "1mA", "--boards", "9223372036854775807"), "boards: boards 9.223e+18 is outside the accepted 1..1000000"},
		{"pick --boards 1e12", pick("--vcc", "12", "--ic", "1mA", "--boards", "1000000000000"), "boards: boards 1e+12 is outside"},
	} {
		_, errOut, code := run(t, nil, tc.args...)
		if code != 2 || !strings.Contains(errOut, tc.want) {
			t.Errorf("%s: exit %d, want 2 with %q:\n%s", tc.name, code, tc.want, errOut)
		}
	}
	// A 1e-30 Ω resistor given once.
	args := []string{"--db", db, "check", "--r1", "47k", "--r2", "10k", "--rc", "1e-30", "--re", "1k", "--vcc", "12", "--hfe", "100..300"}
	if _, errOut, code := run(t, nil, args...); code != 2 || !strings.Contains(errOut, "--rc: resistance 1e-30 Ω is outside the accepted 1 mΩ..1 TΩ") {
		t.Errorf("1e-30 Ω: exit %d: %s", code, errOut)
	}
}
