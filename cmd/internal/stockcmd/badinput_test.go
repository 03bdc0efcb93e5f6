package stockcmd

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// seeded returns a stock file holding the fixture stock.
func seeded(t *testing.T) string {
	t.Helper()
	db := tempDB(t)
	for _, f := range []string{"testdata/stock/resistors.csv", "testdata/stock/transistors.csv"} {
		if r := run(t, db, "", "stock", "import", f); r.code != 0 {
			t.Fatalf("seed %s: %s", f, r.errOut)
		}
	}
	return db
}

// exportAll returns both kinds' export, the stock as the user sees it.
func exportAll(t *testing.T, db string) string {
	t.Helper()
	var b strings.Builder
	for _, k := range []string{"resistor", "transistor"} {
		r := run(t, db, "", "stock", "export", "--kind", k)
		if r.code != 0 {
			t.Fatalf("export %s: %s", k, r.errOut)
		}
		b.WriteString(r.out)
	}
	return b.String()
}

// manyRows returns a resistor file of n rows with bad in place of row
// badRow (1-based data row; 0 for none).
func manyRows(n, badRow int, bad string) string {
	var b strings.Builder
	b.WriteString("value,tolerance,power,qty,bin\n")
	for i := 1; i <= n; i++ {
		if i == badRow {
			b.WriteString(bad + "\n")
			continue
		}
		fmt.Fprintf(&b, "%dR,1%%,0.25W,%d,Z%d\n", 100+i%900, 1+i%7, i/900)
	}
	return b.String()
}

// TestBadInputLeavesStockAlone imports each bad file the stock must refuse
// and checks the message names file, line and column, the exit status is
// not 0, and the exported stock is byte for byte what it was.
func TestBadInputLeavesStockAlone(t *testing.T) {
	const h = "value,tolerance,power,qty,bin\n"
	const th = "label,polarity,hfe_min,hfe_max,qty\n"
	for _, tc := range []struct {
		name, file, want string
	}{
		{"malformed value 4x7", h + "1K0,5%,0.25W,1,A2\n4x7,5%,0.25W,1,A\n", "bad.csv:3: value: "},
		{"malformed value --3k", h + "--3k,5%,0.25W,1,A\n", "bad.csv:2: value: "},
		{"empty value", h + ",5%,0.25W,1,A\n", "bad.csv:2: value: empty"},
		{"value 1e999", h + "1e999,5%,0.25W,1,A\n", "bad.csv:2: value: "},
		{"value NaN", h + "NaN,5%,0.25W,1,A\n", "bad.csv:2: value: "},
		{"negative quantity", h + "1K0,5%,0.25W,-1,A2\n", "bad.csv:2: qty: "},
		{"fractional quantity", h + "1K0,5%,0.25W,0.5,A2\n", "bad.csv:2: qty: "},
		{"hFE min above max", th + "QN-100,npn,800,110,1\n", "bad.csv:2: hfe_max: "},
		{"unknown polarity", th + "QN-100,nnp,110,800,1\n", "bad.csv:2: polarity: "},
		{"missing header column", "value,tolerance,power,bin\n1K0,5%,0.25W,A2\n", "bad.csv:1: header: missing required resistor column \"qty\""},
		{"duplicated header column", "value,tolerance,power,qty,bin,bin\n1K0,5%,0.25W,1,A2,A3\n", "bad.csv:1: header: column \"bin\" appears twice"},
		{"UTF-8 byte-order mark with a bad row", "\ufeff" + h + "1K0,5%,0.25W,1,A2\n1K0,5%,0.25W,x,A2\n", "bad.csv:3: qty: "},
		{"CRLF line ends with a bad row", strings.ReplaceAll(h+"1K0,5%,0.25W,1,A2\n1K0,5%,,1,A2\n", "\n", "\r\n"), "bad.csv:3: power: empty"},
		{"truncated last line", h + "1K0,5%,0.25W,1,A2\n4K7,5%,0.2", "bad.csv:3: row has 3 fields"},
		{"non-UTF-8 bytes", h + "1K0,5%,0.25W,1,A\xff\n", "bad.csv:2: bin: not UTF-8"},
		{"one bad row among 1,000", manyRows(1000, 617, "1K0,5%,0.25W,1e3.5,A2"), "bad.csv:618: qty: "},
		{"100,000 rows, the last one bad", manyRows(100_000, 100_000, "1K0,7 percent,0.25W,1,A2"), "bad.csv:100001: tolerance: "},
		{"same part twice with replace", h + "1K0,5%,0.25W,1,A2\n1K,5%,1/4W,2,A2\n", "bad.csv:3: value: same part and bin as an earlier one; with replace each part may appear once (line 2)"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db := seeded(t)
			before := exportAll(t, db)
			path := filepath.Join(t.TempDir(), "bad.csv")
			if err := os.WriteFile(path, []byte(tc.file), 0o644); err != nil {
				t.Fatal(err)
			}
			args := []string{"stock", "import", path}
			if strings.Contains(tc.name, "replace") {
				args = append(args, "--replace")
			}
			r := run(t, db, "", args...)
			if r.code == 0 {
				t.Fatalf("exit 0 for a bad file; stdout %q", r.out)
			}
			want := filepath.Join(filepath.Dir(path), tc.want)
			if !strings.Contains(r.errOut, want) {
				t.Errorf("stderr\n%s\nlacks %q", firstLines(r.errOut, 5), want)
			}
			if !strings.Contains(r.errOut, "nothing was imported") {
				t.Errorf("stderr does not say nothing was imported:\n%s", firstLines(r.errOut, 5))
			}
			if after := exportAll(t, db); after != before {
				t.Fatalf("stock changed:\nbefore\n%s\nafter\n%s", before, after)
			}
		})
	}
}

func firstLines(s string, n int) string {
	lines := strings.SplitN(s, "\n", n+1)
	if len(lines) > n {
		lines = lines[:n]
	}
	return strings.Join(lines, "\n")
}

// TestBadCommandsLeaveStockAlone covers the other commands' refusals.
func TestBadCommandsLeaveStockAlone(t *testing.T) {
	for _, tc := range []struct {
		name     string
		args     []string
		wantCode int
		want     string
	}{
		{"oversell", []string{"stock", "adjust", "1", "-201"}, 1, "not enough in stock: part 1 has 200, cannot take 201"},
		{"count below zero", []string{"stock", "adjust", "1", "=-3"}, 2, "change"},
		{"adjust missing part", []string{"stock", "adjust", "99", "-1"}, 1, "no such part"},
		{"remove missing part", []string{"stock", "remove", "99"}, 1, "no such part"},
		{"tag with a space", []string{"stock", "tag", "1", "two words"}, 2, "a tag is one word"},
		{"tag of only digits", []string{"stock", "tag", "1", "approved", "6", "7"}, 2, "only digits"},
		{"add with a tag of only digits", []string{"stock", "add", "resistor", "1K", "--qty", "5", "--tag", "6"}, 2, "only digits"},
		{"add hFE min above max", []string{"stock", "add", "transistor", "QX", "--polarity", "npn", "--hfe", "300..100"}, 2, "low end above high end"},
		{"add unknown polarity", []string{"stock", "add", "transistor", "QX", "--polarity", "nnp", "--hfe", "100..300"}, 2, "unknown polarity"},
		{"add negative quantity", []string{"stock", "add", "resistor", "1K", "--qty", "-5"}, 2, "--qty: quantity -5 is negative"},
		{"missing import file", []string{"stock", "import", "no-such-file.csv"}, 1, "no-such-file.csv"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db := seeded(t)
			before := exportAll(t, db)
			r := run(t, db, "", tc.args...)
			if r.code != tc.wantCode || !strings.Contains(r.errOut, tc.want) {
				t.Fatalf("exit %d, stderr %q; want exit %d and %q", r.code, r.errOut, tc.wantCode, tc.want)
			}
			if after := exportAll(t, db); after != before {
				t.Fatal("stock changed")
			}
		})
	}
}
