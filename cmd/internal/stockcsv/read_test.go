package stockcsv

import (
	"errors"
	"math"
	"strings"
	"testing"

	"biasbin/store"
)

const rHeader = "value,tolerance,power,qty,bin\n"

func TestReadGoodFiles(t *testing.T) {
	for _, tc := range []struct {
		name string
		in   string
		want []store.Resistor // Ohm, Tol, Rated_W, Qty, Bin, Tech, Tags checked
	}{
		{"plain", rHeader + "4K7,5%,0.25W,100,A1\n",
			[]store.Resistor{{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 100, Bin: "A1"}}},
		// IEC 60062 code examples and tolerance letters (REFERENCE.md §2):
		// R47 = 0.47 Ω, 2M2 = 2.2 MΩ, 27KK = 27 kΩ ±10 %, 1R8J = 1.8 Ω ±5 %.
		{"IEC 60062 codes, letters in value", rHeader + "R47,1%,1/4W,1,A\n2M2,J,250mW,2,A\n27KK,,0.5W,3,B\n1R8J,,0.25,4,B\n",
			[]store.Resistor{
				{Ohm: 0.47, Tol: 0.01, Rated_W: 0.25, Qty: 1, Bin: "A"},
				{Ohm: 2.2e6, Tol: 0.05, Rated_W: 0.25, Qty: 2, Bin: "A"},
				{Ohm: 27000, Tol: 0.10, Rated_W: 0.5, Qty: 3, Bin: "B"},
				{Ohm: 1.8, Tol: 0.05, Rated_W: 0.25, Qty: 4, Bin: "B"},
			}},
		{"SI forms", rHeader + "4.7k,±5 %,0.25 W,1,A\n4700,5,250mW,1,A\n4.7e3,5%,0.25W,1,A\n",
			[]store.Resistor{
				{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 1, Bin: "A"},
				{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 1, Bin: "A"},
				{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 1, Bin: "A"},
			}},
		{"byte-order mark, CRLF, no final newline", "\ufeff" + strings.ReplaceAll(rHeader, "\n", "\r\n") + "1K0,1%,0.25W,5,A\r\n10K,1%,0.25W,6,B",
			[]store.Resistor{{Ohm: 1000, Tol: 0.01, Rated_W: 0.25, Qty: 5, Bin: "A"}, {Ohm: 10000, Tol: 0.01, Rated_W: 0.25, Qty: 6, Bin: "B"}}},
		{"columns in any order and case, optional ones, blank line", "Bin, QTY ,power,tolerance,value,tech,tags\nA,3,0.6W,1%,10K,Metal-Film,rohs;Approved\n\n",
			[]store.Resistor{{Ohm: 10000, Tol: 0.01, Rated_W: 0.6, Qty: 3, Bin: "A", Tech: store.TechMetalFilm, Tags: []string{"rohs", "Approved"}}}},
		{"quoted note with comma", "value,tolerance,power,qty,bin,note\n100R,1%,0.25W,1,A,\"from reel 3, cut\"\n",
			[]store.Resistor{{Ohm: 100, Tol: 0.01, Rated_W: 0.25, Qty: 1, Bin: "A"}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Read(strings.NewReader(tc.in), "in.csv")
			if err != nil {
				t.Fatal(err)
			}
			if f.Kind != store.KindResistor || len(f.Batch.Resistors) != len(tc.want) {
				t.Fatalf("kind %s, %d resistors, want %d", f.Kind, len(f.Batch.Resistors), len(tc.want))
			}
			for i, w := range tc.want {
				g := f.Batch.Resistors[i]
				if !close(g.Ohm, w.Ohm) || !close(g.Tol, w.Tol) || !close(g.Rated_W, w.Rated_W) ||
					g.Qty != w.Qty || g.Bin != w.Bin || (w.Tech != "" && g.Tech != w.Tech) ||
					strings.Join(g.Tags, ";") != strings.Join(w.Tags, ";") {
					t.Errorf("row %d: got %+v, want %+v", i, g, w)
				}
			}
		})
	}
}

func close(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b)) }

func TestReadTransistors(t *testing.T) {
	in := "label,polarity,hfe_min,hfe_max,qty,hfe_at,vbe,vbe_at,vceo,pd,theta_ja,tj_max,icbo,bin\n" +
		"QP1,PNP,100,300,20,2mA,-0.7V,2mA,-45V,500mW,200,150,15nA,C3\n"
	f, err := Read(strings.NewReader(in), "q.csv")
	if err != nil {
		t.Fatal(err)
	}
	if f.Kind != store.KindTransistor || len(f.Batch.Transistors) != 1 {
		t.Fatalf("kind %s, %d transistors", f.Kind, len(f.Batch.Transistors))
	}
	q := f.Batch.Transistors[0]
	want := store.Transistor{Label: "QP1", Polarity: "pnp", HFEMin: 100, HFEMax: 300, HFEAt_A: 2e-3, VBEOn_V: 0.7,
		VBEAt_A: 2e-3, VCEO_V: 45, PD25_W: 0.5, ThetaJA_KPerW: 200, TjMax_C: 150, ICBO_A: 15e-9, Qty: 20, Bin: "C3"}
	q.Tags, want.Tags = nil, nil
	if !close(q.ICBO_A, want.ICBO_A) || !close(q.VBEOn_V, want.VBEOn_V) {
		t.Fatalf("got %+v\nwant %+v", q, want)
	}
	q.ICBO_A, q.VBEOn_V = want.ICBO_A, want.VBEOn_V
	if q.Label != want.Label || q.Polarity != want.Polarity || q.HFEMin != want.HFEMin || q.HFEMax != want.HFEMax ||
		!close(q.HFEAt_A, want.HFEAt_A) || q.VCEO_V != want.VCEO_V || q.PD25_W != want.PD25_W ||
		q.ThetaJA_KPerW != want.ThetaJA_KPerW || q.TjMax_C != want.TjMax_C || q.Qty != want.Qty || q.Bin != want.Bin {
		t.Fatalf("got %+v\nwant %+v", q, want)
	}
}

// TestReadBadFiles covers each bad input the stock must refuse: the error
// names the file, the line and the column.
func TestReadBadFiles(t *testing.T) {
	tHeader := "label,polarity,hfe_min,hfe_max,qty\n"
	// sHeader adds the part-to-part ranges; the checks are the solver's
	// (solver.Datasheet.Validate, JunctionVoltageRange) through stockparts.
	sHeader := "label,polarity,hfe_min,hfe_max,qty,vbe,vbe_min,vbe_max,vaf_min,vaf_max\n"
	for _, tc := range []struct {
		name string
		in   string
		want []string // each a whole FILE:LINE: column: ... prefix or fragment
	}{
		{"malformed value 4x7", rHeader + "4K7,5%,0.25W,1,A\n4x7,5%,0.25W,1,A\n", []string{"bad.csv:3: value: "}},
		{"malformed value --3k", rHeader + "--3k,5%,0.25W,1,A\n", []string{"bad.csv:2: value: "}},
		{"empty value", rHeader + ",5%,0.25W,1,A\n", []string{"bad.csv:2: value: empty"}},
		{"value 1e999", rHeader + "1e999,5%,0.25W,1,A\n", []string{"bad.csv:2: value: "}},
		{"value NaN", rHeader + "NaN,5%,0.25W,1,A\n", []string{"bad.csv:2: value: "}},
		{"power NaN", rHeader + "1K,5%,NaN,1,A\n", []string{"bad.csv:2: power: "}},
		{"negative quantity", rHeader + "1K,5%,0.25W,-3,A\n", []string{"bad.csv:2: qty: quantity -3 is negative"}},
		{"fractional quantity", rHeader + "1K,5%,0.25W,2.5,A\n", []string{"bad.csv:2: qty: quantity \"2.5\" is not a whole number"}},
		{"tolerance differs from letter", rHeader + "4K7J,1%,0.25W,1,A\n", []string{"bad.csv:2: tolerance: "}},
		{"no tolerance anywhere", rHeader + "4K7,,0.25W,1,A\n", []string{"bad.csv:2: tolerance: empty"}},
		{"unknown technology", "value,tolerance,power,qty,bin,tech\n1K,5%,0.25W,1,A,bakelite\n", []string{"bad.csv:2: tech: unknown technology"}},
		{"hFE min above max", tHeader + "Q1,npn,300,100,5\n", []string{"bad.csv:2: hfe_max: hFE min 300 is above hFE max 100"}},
		{"unknown polarity", tHeader + "Q1,nnp,100,300,5\n", []string{"bad.csv:2: polarity: unknown polarity \"nnp\""}},
		{"missing header column", "value,tolerance,qty,bin\n1K,5%,1,A\n", []string{"bad.csv:1: header: missing required resistor column \"power\""}},
		{"duplicated header column", "value,tolerance,power,qty,bin,qty\n1K,5%,0.25W,1,A,2\n", []string{"bad.csv:1: header: column \"qty\" appears twice"}},
		{"unknown header column", "value,tolerance,power,qty,bin,colour\n1K,5%,0.25W,1,A,red\n", []string{"bad.csv:1: header: unknown resistor column \"colour\""}},
		{"no kind column", "tolerance,power,qty,bin\n", []string{"bad.csv:1: header: no value or label column"}},
		{"both kinds", "value,label\n", []string{"bad.csv:1: header: both value and label"}},
		{"empty file", "", []string{"bad.csv:1: header: empty file"}},
		{"BOM only", "\ufeff", []string{"bad.csv:1: header: empty file"}},
		{"truncated last line", rHeader + "1K,5%,0.25W,1,A\n2K2,5%,0.2", []string{"bad.csv:3: row has 3 fields, the header has 5"}},
		{"truncated inside quotes", rHeader + "1K,5%,0.25W,1,A\n2K2,5%,0.25W,1,\"A", []string{"bad.csv:3: bad CSV"}},
		{"non-UTF-8 bytes", rHeader + "1K,5%,0.25W,1,B\xe4ck\n", []string{"bad.csv:2: bin: not UTF-8 text"}},
		{"non-UTF-8 header", "value,tol\xe9rance\n", []string{"bad.csv:1: header: not UTF-8"}},
		{"vbe_min without vbe_max", sHeader + "Q1,npn,100,300,5,,0.6V,,,\n", []string{"bad.csv:2: vbe_max: vbe_min and vbe_max go together"}},
		{"vbe_max below vbe_min", sHeader + "Q1,npn,100,300,5,,0.7V,0.6V,,\n", []string{"bad.csv:2: vbe_max: vbe_max 0.6 V is below vbe_min 0.7 V"}},
		{"vbe outside its spread", sHeader + "Q1,npn,100,300,5,0.75V,0.6V,0.7V,,\n", []string{"bad.csv:2: vbe: 0.75 V is outside vbe_min..vbe_max"}},
		{"vbe_min not a junction voltage", sHeader + "Q1,npn,100,300,5,,3V,4V,,\n", []string{"bad.csv:2: vbe_min: ", "bad.csv:2: vbe_max: "}},
		{"vaf_min not an Early voltage", sHeader + "Q1,npn,100,300,5,,,,1V,100V\n", []string{"bad.csv:2: vaf_min: 1 V is not an Early voltage"}},
		{"every bad row reported", rHeader + "4x7,5%,0.25W,1,A\n1K,5%,0.25W,1,A\n1K,5%,0.25W,-1,A\n", []string{"bad.csv:2: value: ", "bad.csv:4: qty: "}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read(strings.NewReader(tc.in), "bad.csv")
			var fe *FileError
			if !errors.As(err, &fe) {
				t.Fatalf("err = %v, want a FileError", err)
			}
			msg := err.Error()
			for _, w := range tc.want {
				if !strings.Contains(msg, w) {
					t.Errorf("message\n%s\nlacks %q", msg, w)
				}
			}
			if len(fe.Problems) != len(tc.want) {
				t.Errorf("%d problems, want %d:\n%s", len(fe.Problems), len(tc.want), msg)
			}
		})
	}
}

// TestReadLargeFileNamesTheBadRow reads 100,000 rows with one bad row near
// the end.
func TestReadLargeFileNamesTheBadRow(t *testing.T) {
	var b strings.Builder
	b.WriteString(rHeader)
	for i := range 100_000 {
		if i == 99_990 {
			b.WriteString("4K7,5%,0.25W,1.5,A\n")
			continue
		}
		b.WriteString("4K7,5%,0.25W,1,A\n")
	}
	_, err := Read(strings.NewReader(b.String()), "big.csv")
	if err == nil || err.Error() != `big.csv:99992: qty: quantity "1.5" is not a whole number` {
		t.Fatalf("err = %v", err)
	}
}

func TestExplainNamesLines(t *testing.T) {
	f, err := Read(strings.NewReader(rHeader+"1K,5%,0.25W,1,A\n4K7,5%,0.25W,1,A\n1K0,5%,0.25W,2,A\n"), "d.csv")
	if err != nil {
		t.Fatal(err)
	}
	ie := &store.InvalidError{Problems: []store.Problem{{Index: 2, Field: "value", Msg: "same part", Ref: 1}}}
	got := f.Explain(ie).Error()
	if got != "d.csv:4: value: same part (line 2)" {
		t.Fatalf("got %q", got)
	}
}

// TestReadDecimalComma: a spreadsheet set to a comma decimal mark writes
// "4,7k;5%;0,25W" with semicolons between fields (the usual export in
// locales that write 4,7 for 4.7, common practice). The header row tells:
// semicolons and no comma. Numbers read with the comma as decimal mark;
// free text keeps its commas.
func TestReadDecimalComma(t *testing.T) {
	in := "value;tolerance;power;qty;bin;note\n4,7k;5%;0,25W;100;A1;\"one, two\"\n2K2;0,5%;0,125W;3;A2;\n"
	f, err := Read(strings.NewReader(in), "semi.csv")
	if err != nil {
		t.Fatal(err)
	}
	rs := f.Batch.Resistors
	if len(rs) != 2 {
		t.Fatalf("%d rows", len(rs))
	}
	if rs[0].Ohm != 4700 || rs[0].Rated_W != 0.25 || rs[0].Note != "one, two" || rs[1].Tol != 0.005 || rs[1].Rated_W != 0.125 {
		t.Fatalf("read %+v / %+v", rs[0], rs[1])
	}
	// A comma-separated file keeps the comma as the field separator: a
	// comma decimal there splits the row, which the reader reports.
	_, err = Read(strings.NewReader("value,tolerance,power,qty,bin\n4,7k,5%,0.25W,1,A\n"), "bad.csv")
	var fe *FileError
	if !errors.As(err, &fe) || !strings.Contains(fe.Error(), "fields") {
		t.Fatalf("comma file with a comma decimal: %v", err)
	}
}
