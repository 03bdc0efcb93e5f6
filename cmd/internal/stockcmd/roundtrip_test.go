package stockcmd

import (
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"biasbin/cmd/internal/stockcsv"
	"biasbin/store"
)

// TestImportExportRoundTrip: import → export → import into a fresh stock →
// export gives identical files, for the fixtures and a generated file in
// mixed notations.
func TestImportExportRoundTrip(t *testing.T) {
	generated := filepath.Join(t.TempDir(), "mixed.csv")
	if err := os.WriteFile(generated, []byte(mixedNotationFile(rand.New(rand.NewPCG(7, 11)), 300)), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ kind, file string }{
		{"resistor", "testdata/stock/resistors.csv"},
		{"transistor", "testdata/stock/transistors.csv"},
		{"resistor", generated},
	} {
		t.Run(filepath.Base(tc.file), func(t *testing.T) {
			db1 := tempDB(t)
			if r := run(t, db1, "", "stock", "import", tc.file); r.code != 0 {
				t.Fatal(r.errOut)
			}
			exp1 := filepath.Join(t.TempDir(), "export1.csv")
			if r := run(t, db1, "", "stock", "export", "--kind", tc.kind, exp1); r.code != 0 {
				t.Fatal(r.errOut)
			}
			db2 := tempDB(t)
			if r := run(t, db2, "", "stock", "import", exp1); r.code != 0 {
				t.Fatal(r.errOut)
			}
			exp2 := run(t, db2, "", "stock", "export", "--kind", tc.kind)
			first, err := os.ReadFile(exp1)
			if err != nil {
				t.Fatal(err)
			}
			if exp2.out != string(first) {
				t.Fatalf("second export differs:\n--- first\n%s\n--- second\n%s", first, exp2.out)
			}
			if strings.Count(exp2.out, "\n") < 3 {
				t.Fatalf("export too short to mean anything:\n%s", exp2.out)
			}
			// The lists (IDs aside) agree too.
			l1 := run(t, db1, "", "stock", "list", "--json")
			l2 := run(t, db2, "", "stock", "list", "--json")
			if noIDs(l1.out) != noIDs(l2.out) {
				t.Fatal("the two stocks list differently")
			}
		})
	}
}

// noIDs drops the "id" lines of list --json output.
func noIDs(s string) string { return idLine.ReplaceAllString(s, "") }

var idLine = regexp.MustCompile(`(?m)^\s*"id": [0-9]+,\n`)

// mixedNotationFile writes n resistor rows in the many notations a
// spreadsheet holds (4K7, 4.7k, 4700, 4.7e3, J, ±5 %, 1/4W, 250mW ...).
func mixedNotationFile(rng *rand.Rand, n int) string {
	values := []string{"4K7", "4.7k", "4700", "4.7e3", "R47", "0.47", "470R", "2M2", "2.2M", "1K0", "1k", "47K3", "10.2k", "976R", "1.05M"}
	tols := []string{"1%", "±5 %", "J", "F", "5", "0.5%", "K", "M", "G"}
	powers := []string{"0.25W", "1/4W", "250mW", "0.125", "1/8 W", "0.6W", "2W"}
	techs := []string{"", "metal film", "Thick-Film", "carbon", "thin", "wirewound"}
	// One TCR per technology: rows of one part must agree on everything
	// but quantity, note and tags to merge.
	tcrOf := map[string]string{"": "", "metal film": "±50 ppm", "Thick-Film": "", "carbon": "-200",
		"thin": "15ppm/K", "wirewound": ""}
	var b strings.Builder
	b.WriteString("value,tolerance,power,qty,bin,tech,tcr,tags,note\n")
	for range n {
		tech := techs[rng.IntN(len(techs))]
		fields := []string{values[rng.IntN(len(values))], tols[rng.IntN(len(tols))], powers[rng.IntN(len(powers))],
			[]string{"0", "1", "25", "100"}[rng.IntN(4)], []string{"A1", "B2", ""}[rng.IntN(3)],
			tech, tcrOf[tech],
			[]string{"", "rohs", "approved;rohs"}[rng.IntN(3)], []string{"", "\"a, b\""}[rng.IntN(2)]}
		b.WriteString(strings.Join(fields, ",") + "\n")
	}
	return b.String()
}

// TestExportWritesAFileAtomically leaves no temporary file behind and
// overwrites an older export.
func TestExportWritesAFileAtomically(t *testing.T) {
	db := seeded(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "r.csv")
	os.WriteFile(path, []byte("old"), 0o644)
	if r := run(t, db, "", "stock", "export", "--kind", "resistor", path); r.code != 0 {
		t.Fatal(r.errOut)
	}
	got, _ := os.ReadFile(path)
	f, err := stockcsv.Read(strings.NewReader(string(got)), path)
	if err != nil || f.Kind != store.KindResistor || len(f.Lines) != 7 {
		t.Fatalf("export read back: %v, %d rows", err, len(f.Lines))
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Fatalf("files left: %v", entries)
	}
}
