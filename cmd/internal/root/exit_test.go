package root

import (
	"path/filepath"
	"strings"
	"testing"
)

// TestExitCodes: the exit status says the cause, as biasbin --help states:
// 0 done; 1 the job could not be done (nothing fits, a stock line the
// math refuses, a file problem); 2 a usage error.
func TestExitCodes(t *testing.T) {
	tour := filepath.Join("..", "..", "..", "testdata", "tour")
	stocked := func(t *testing.T, extra ...[]string) map[string]string {
		t.Helper()
		env := map[string]string{"BIASBIN_DB": filepath.Join(t.TempDir(), "stock.db")}
		for _, f := range []string{"resistors.csv", "transistors.csv"} {
			if _, errOut, code := run(t, env, "stock", "import", filepath.Join(tour, f)); code != 0 {
				t.Fatalf("import %s: exit %d: %s", f, code, errOut)
			}
		}
		for _, args := range extra {
			if _, errOut, code := run(t, env, args...); code != 0 {
				t.Fatalf("%v: exit %d: %s", args, code, errOut)
			}
		}
		return env
	}
	// A resistor stocked at ±60 %: the store keeps it, the solver refuses
	// tolerances of 50 % and more (its accepted range).
	wide := []string{"stock", "add", "resistor", "4K7", "--tol", "60%", "--qty", "10"}
	tests := []struct {
		name  string
		extra [][]string
		args  []string
		code  int
		say   []string // in stderr
	}{
		{"pick done", nil, []string{"pick", "--vcc", "12V", "--ic", "1mA"}, 0, nil},
		{"check done", nil, []string{"check", "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--transistor", "QX-1"}, 0, nil},
		{"nothing fits", nil, []string{"pick", "--vcc", "12V", "--ic", "1mA", "--boards", "400"}, 1, []string{"nothing fits"}},
		{"stocked part the solver refuses", [][]string{wide}, []string{"pick", "--vcc", "12V", "--ic", "1mA"}, 1, []string{"stock line #", "tolerance", "60 %"}},
		{"missing file", nil, []string{"stock", "import", "no-such-file.csv"}, 1, []string{"no-such-file.csv"}},
		{"missing stock file", nil, []string{"--db", "/nonexistent/dir/stock.db", "pick", "--vcc", "12V", "--ic", "1mA"}, 1, []string{"no stock file"}},
		{"missing flag", nil, []string{"pick", "--vcc", "12V"}, 2, []string{"--ic"}},
		{"bad value", nil, []string{"check", "--vcc", "12V", "--r1", "ten", "--r2", "10K", "--rc", "2K2", "--hfe", "100..300"}, 2, []string{"--r1"}},
		{"unknown flag", nil, []string{"pick", "--vcc", "12V", "--ic", "1mA", "--colour"}, 2, []string{"colour"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			env := stocked(t, tt.extra...)
			_, errOut, code := run(t, env, tt.args...)
			if code != tt.code {
				t.Errorf("%v: exit %d, want %d\n%s", tt.args, code, tt.code, errOut)
			}
			for _, s := range tt.say {
				if !strings.Contains(errOut, s) {
					t.Errorf("%v: stderr lacks %q:\n%s", tt.args, s, errOut)
				}
			}
		})
	}
	out, _, _ := run(t, nil, "--help")
	for _, s := range []string{"0  the job is done", "1  the job could not be done", "2  a usage error"} {
		if !strings.Contains(out, s) {
			t.Errorf("biasbin --help lacks %q", s)
		}
	}
}
