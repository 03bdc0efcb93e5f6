package stockcmd

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The tests in this file try what a careless or hostile user would: each
// named after the point of the stock-safety issue it covers. Every one
// checks the message and exit status, and that the stock is exactly as it
// was (the export of both kinds before and after).

func writeFile(t *testing.T, name, body string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// Point 1: an export onto the stock file or its -wal/-shm, under any
// spelling, a symbolic link or a hard link, is refused (exit 2) and the
// stock is untouched.
func TestExportOntoTheStockIsRefused(t *testing.T) {
	db := seeded(t)
	before := exportAll(t, db)
	dir := filepath.Dir(db)
	link := filepath.Join(t.TempDir(), "link.db")
	if err := os.Symlink(db, link); err != nil {
		t.Fatal(err)
	}
	hard := filepath.Join(dir, "hard.db")
	if err := os.Link(db, hard); err != nil {
		t.Fatal(err)
	}
	for _, out := range []string{db, db + "-wal", db + "-shm", filepath.Join(dir, ".", "stock.db"),
		filepath.Join(dir, "..", filepath.Base(dir), "stock.db"), link, hard} {
		r := run(t, db, "", "stock", "export", "--kind", "resistor", out)
		if r.code != 2 || !strings.Contains(r.errOut, "would destroy the stock") {
			t.Errorf("export onto %s: exit %d: %s", out, r.code, r.errOut)
		}
	}
	if after := exportAll(t, db); after != before {
		t.Fatal("the stock changed")
	}
	// An ordinary export writes the whole file and leaves no temporary
	// file beside it.
	out := filepath.Join(t.TempDir(), "r.csv")
	if r := run(t, db, "", "stock", "export", "--kind", "resistor", out); r.code != 0 {
		t.Fatal(r.errOut)
	}
	if left, _ := os.ReadDir(filepath.Dir(out)); len(left) != 1 {
		t.Errorf("export left %d files", len(left))
	}
}

// Points 2 and 3: a row that matches a stocked line by label and bin but
// disagrees on a datasheet value is a bad row naming line, column and the
// stocked line; quantities that add up past the limit, against the stock
// or within one file, name line and column too; --replace --dry-run lists
// each difference and writes nothing; --replace rewrites.
func TestImportNeverRewritesAStockedLine(t *testing.T) {
	const head = "label,polarity,hfe_min,hfe_max,qty,bin\n"
	for _, tc := range []struct {
		name, body string
		args       []string
		code       int
		want       []string
	}{
		{"polarity and hFE differ", head + "ok-1,npn,100,300,1,T1\nq1,pnp,1,2,2,B\n", nil, 1,
			[]string{"bad.csv:3: polarity: stocked line #", `has "npn", this one "pnp"`, "bad.csv:3: hfe_min:",
				"bad.csv:3: hfe_max:", "nothing was imported"}},
		{"past the limit against the stock", head + "Q1,npn,100,300,1000000000,B\n", nil, 1,
			[]string{"bad.csv:2: qty: stocked line #", "above the limit of 1000000000"}},
		{"two rows of one file past the limit", head + "Q9,npn,100,300,600000000,Z\nQ9,npn,100,300,600000000,Z\n", nil, 1,
			[]string{"bad.csv:3: qty: stocked line #", "makes 1200000000"}},
		{"dry run of replace lists the differences", head + "q1,pnp,1,2,2,B\n", []string{"--replace", "--dry-run"}, 0,
			[]string{`bad.csv:2: polarity: stocked line #`, `"npn" -> "pnp"`, "hfe_min", "nothing written"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db := tempDB(t)
			if r := run(t, db, "", "stock", "add", "transistor", "Q1", "--polarity", "npn", "--hfe", "100..300",
				"--qty", "5", "--bin", "B"); r.code != 0 {
				t.Fatal(r.errOut)
			}
			before := exportAll(t, db)
			r := run(t, db, "", append([]string{"stock", "import", writeFile(t, "bad.csv", tc.body)}, tc.args...)...)
			all := r.out + r.errOut
			if r.code != tc.code {
				t.Fatalf("exit %d, want %d: %s", r.code, tc.code, all)
			}
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("output lacks %q:\n%s", w, all)
				}
			}
			if after := exportAll(t, db); after != before {
				t.Errorf("the stock changed:\n%s", after)
			}
		})
	}
	// --replace without --dry-run makes the line take the row's values.
	db := tempDB(t)
	run(t, db, "", "stock", "add", "transistor", "Q1", "--polarity", "npn", "--hfe", "100..300", "--qty", "5", "--bin", "B")
	r := run(t, db, "", "stock", "import", writeFile(t, "r.csv", head+"Q1,pnp,150,200,2,B\n"), "--replace")
	if r.code != 0 || !strings.Contains(r.out, "rewrote 3 values") {
		t.Fatalf("replace: exit %d: %s%s", r.code, r.out, r.errOut)
	}
	if s := exportAll(t, db); !strings.Contains(s, "Q1,pnp,150,200,2,") {
		t.Errorf("replace did not rewrite the line:\n%s", s)
	}
}

// Point 4: cells starting with = + - @ are exported with a leading ' (the
// OWASP CSV injection defence, REFERENCE.md §18) and read back to the same
// text, so a second export is identical.
func TestFormulaCellsRoundTrip(t *testing.T) {
	db := tempDB(t)
	body := "label,polarity,hfe_min,hfe_max,qty,bin,tags,note\n" +
		"+Q5,npn,100,300,1,B,,\n" +
		"Q3,npn,100,300,1,\"=HYPERLINK(\"\"http://x\"\")\",-a,@SUM(1)\n" +
		"Q4,npn,100,300,1,B,,'=typed as text\n"
	if r := run(t, db, "", "stock", "import", writeFile(t, "f.csv", body)); r.code != 0 {
		t.Fatal(r.errOut)
	}
	first := run(t, db, "", "stock", "export", "--kind", "transistor")
	for _, w := range []string{"\n'+Q5,", `"'=HYPERLINK(""http://x"")",'-a,'@SUM(1)`, ",'=typed as text,"} {
		if !strings.Contains(first.out, w) {
			t.Errorf("export lacks %q:\n%s", w, first.out)
		}
	}
	for _, line := range strings.Split(first.out, "\n") {
		for _, cell := range strings.Split(line, ",") {
			if cell != "" && strings.ContainsRune("=+@", rune(cell[0])) {
				t.Errorf("cell %q starts a formula", cell)
			}
		}
	}
	db2 := tempDB(t)
	if r := run(t, db2, "", "stock", "import", writeFile(t, "e.csv", first.out)); r.code != 0 {
		t.Fatal(r.errOut)
	}
	list := run(t, db2, "", "stock", "list", "--json")
	for _, w := range []string{`"label": "+Q5"`, `"bin": "=HYPERLINK(\"http://x\")"`, `"-a"`, `"note": "@SUM(1)"`,
		`"note": "=typed as text"`} {
		if !strings.Contains(list.out, w) {
			t.Errorf("re-imported stock lacks %s", w)
		}
	}
	if second := run(t, db2, "", "stock", "export", "--kind", "transistor"); second.out != first.out {
		t.Errorf("second export differs:\n%s\n---\n%s", first.out, second.out)
	}
}

// Point 6: an empty file and a dangling link get a clear message from the
// reading commands and nothing is created.
func TestReadingCommandsCreateNothing(t *testing.T) {
	dir := t.TempDir()
	empty := filepath.Join(dir, "empty.db")
	if err := os.WriteFile(empty, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	dangling := filepath.Join(dir, "dangling.db")
	if err := os.Symlink(filepath.Join(dir, "nowhere", "x.db"), dangling); err != nil {
		t.Fatal(err)
	}
	csvFile := writeFile(t, "t.csv", "label,polarity,hfe_min,hfe_max,qty\nQ,npn,100,300,1\n")
	for _, tc := range []struct{ db, want string }{
		{empty, "is empty (0 bytes)"},
		{dangling, "symbolic link to " + filepath.Join(dir, "nowhere", "x.db") + ", which does not exist"},
		{csvFile, "not an SQLite database"},
		{dir, "it is a folder"},
	} {
		for _, args := range [][]string{{"stock", "list"}, {"stock", "verify"}, {"stock", "export", "--kind", "resistor"},
			{"stock", "adjust", "1", "+1"}} {
			r := run(t, tc.db, "", args...)
			if r.code != 1 || !strings.Contains(r.errOut, tc.want) {
				t.Errorf("%s %v: exit %d: %s", filepath.Base(tc.db), args, r.code, r.errOut)
			}
		}
	}
	if fi, err := os.Stat(empty); err != nil || fi.Size() != 0 {
		t.Error("the empty file was written")
	}
	if left, _ := os.ReadDir(dir); len(left) != 2 {
		t.Errorf("reading commands left %d entries in %s", len(left), dir)
	}
}

// Point 12: control and direction-override characters in labels, bins,
// notes and tags are refused, and so is a line with too many tags.
func TestHiddenCharactersAndTooManyTags(t *testing.T) {
	db := seeded(t)
	before := exportAll(t, db)
	body := "label,polarity,hfe_min,hfe_max,qty,bin,tags,note\n" +
		"Q\u202e1,npn,100,300,1,B,,\n" +
		"Q2,npn,100,300,1,B\u2066x,,\n" +
		"Q3,npn,100,300,1,B,a\u200bb,\n" +
		"Q4,npn,100,300,1,B,,note\u202dx\n" +
		"Q5,npn,100,300,1,B,a;b;c;d;e;f;g;h;i;j;k;l;m;n;o;p;q,\n"
	r := run(t, db, "", "stock", "import", writeFile(t, "h.csv", body))
	for _, w := range []string{"h.csv:2: label: contains the control, invisible or direction-override character U+202E",
		"h.csv:3: bin:", "h.csv:4: tags:", "h.csv:5: note:", "h.csv:6: tags: 17 tags; a line carries at most 16"} {
		if !strings.Contains(r.errOut, w) {
			t.Errorf("lacks %q:\n%s", w, r.errOut)
		}
	}
	if r.code != 1 || exportAll(t, db) != before {
		t.Errorf("exit %d or the stock changed", r.code)
	}
}

// Point 12: a 1001 Ω line and a 1 kΩ line never print alike.
func TestCloseValuesPrintApart(t *testing.T) {
	db := tempDB(t)
	body := "value,tolerance,power,qty,bin\n1K0,1%,0.25W,5,A\n1001,1%,0.25W,5,A\n"
	if r := run(t, db, "", "stock", "import", writeFile(t, "r.csv", body)); r.code != 0 {
		t.Fatal(r.errOut)
	}
	r := run(t, db, "", "stock", "list", "--kind", "resistor")
	if !strings.Contains(r.out, " 1K0 ") || !strings.Contains(r.out, " 1K001 ") {
		t.Errorf("list does not tell the lines apart:\n%s", r.out)
	}
}
