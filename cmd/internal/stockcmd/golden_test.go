package stockcmd

import (
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
)

// checkGolden compares got with testdata/golden/name, or writes it with
// -update.
func checkGolden(t *testing.T, name, got string) {
	t.Helper()
	cmdtest.Golden(t, filepath.Join("testdata", "golden", name), got)
}

// runRecord formats one run for a golden file.
func runRecord(args []string, r result) string {
	return fmt.Sprintf("$ biasbin %s\n[exit %d]\n--- stdout\n%s--- stderr\n%s", strings.Join(args, " "), r.code, r.out, r.errOut)
}

// TestCommandsGolden runs a session of stock commands on one stock file,
// each step's output compared with its golden file.
func TestCommandsGolden(t *testing.T) {
	db := tempDB(t)
	steps := []struct {
		golden string
		args   []string
	}{
		{"01-import-resistors.txt", []string{"stock", "import", "testdata/stock/resistors.csv"}},
		{"02-import-transistors.txt", []string{"stock", "import", "testdata/stock/transistors.csv"}},
		{"03-list.txt", []string{"stock", "list"}},
		{"04-list-approved-resistors.txt", []string{"stock", "list", "--kind", "resistor", "--tag", "approved"}},
		{"05-list-json.txt", []string{"stock", "list", "--json", "--kind", "transistor", "--bin", "B1"}},
		{"05a-list-value-missing.txt", []string{"stock", "list", "--value", "6K8"}},
		{"05b-list-value-range.txt", []string{"stock", "list", "--value", "4K..12K", "--long"}},
		{"05c-list-value-json.txt", []string{"stock", "list", "--value", "470R", "--json"}},
		{"05d-add-part-number.txt", []string{"stock", "add", "resistor", "6K8", "--qty", "5", "--bin", "A5", "--lev", "350V", "--part-number", "MF-6K8-350", "--note", "pulled from the amplifier rework"}},
		{"05e-list-long.txt", []string{"stock", "list", "--value", "6K8", "--long"}},
		{"06-add-merge.txt", []string{"stock", "add", "resistor", "4.7k", "--tol", "J", "--qty", "10", "--bin", "A3", "--tech", "metal film"}},
		{"07-add-transistor.txt", []string{"stock", "add", "transistor", "QN-400", "--polarity", "npn", "--hfe", "200..450@2mA", "--vceo", "30V", "--qty", "12", "--bin", "B4", "--tag", "reel"}},
		{"08-add-bad.txt", []string{"stock", "add", "resistor", "4x7", "--power", "lots"}},
		{"09-adjust-take.txt", []string{"stock", "adjust", "1", "-5"}},
		{"10-adjust-oversell.txt", []string{"stock", "adjust", "1", "-10000"}},
		{"11-adjust-missing.txt", []string{"stock", "adjust", "999", "+1"}},
		{"12-adjust-count.txt", []string{"stock", "adjust", "9", "=3", "--json"}},
		{"13-tag.txt", []string{"stock", "tag", "2", "Reel", "rohs"}},
		{"13a-tag-digits.txt", []string{"stock", "tag", "5", "approved", "6", "7"}},
		{"13b-tag-lines.txt", []string{"stock", "tag", "--tag", "approved", "5", "6"}},
		{"14-untag.txt", []string{"stock", "untag", "2", "reel"}},
		{"15-import-bad.txt", []string{"stock", "import", "testdata/stock/bad.csv"}},
		{"16-import-dry-run.txt", []string{"stock", "import", "--dry-run", "testdata/stock/resistors.csv"}},
		{"17-remove.txt", []string{"stock", "remove", "3"}},
		{"18-export-resistors.txt", []string{"stock", "export", "--kind", "resistor"}},
		{"19-export-transistors.txt", []string{"stock", "export", "--kind", "transistor"}},
		{"20-verify.txt", []string{"stock", "verify"}},
		{"21-verify-json.txt", []string{"stock", "verify", "--json"}},
	}
	for _, s := range steps {
		r := run(t, db, "", s.args...)
		checkGolden(t, s.golden, runRecord(s.args, r))
	}
}
