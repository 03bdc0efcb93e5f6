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
