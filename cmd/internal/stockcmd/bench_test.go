package stockcmd

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// BenchmarkImport10kResistors imports a 10,000-row resistor file (CSV read,
// every value parsed, one transaction) into a fresh stock file. Goal: under
// 2 s per import on a 2-core machine.
func BenchmarkImport10kResistors(b *testing.B) {
	var sb strings.Builder
	sb.WriteString("value,tolerance,power,qty,bin,tech,tags\n")
	values := []string{"1", "1.2", "1.5", "1.8", "2.2", "2.7", "3.3", "3.9", "4.7", "5.6", "6.8", "8.2"}
	for i := range 10_000 {
		fmt.Fprintf(&sb, "%se%d,5%%,0.25W,%d,D%d,metal film,rohs\n", values[i%12], i/12%7, 1+i%100, i/84)
	}
	dir := b.TempDir()
	file := filepath.Join(dir, "10k.csv")
	if err := os.WriteFile(file, []byte(sb.String()), 0o644); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := range b.N {
		b.StopTimer()
		db := filepath.Join(dir, fmt.Sprintf("bench-%d.db", i))
		b.StartTimer()
		r := run(b, db, "", "stock", "import", file)
		if r.code != 0 || !strings.Contains(r.out, "10000 resistor rows: 10000 new lines") {
			b.Fatalf("import: %s%s", r.out, r.errOut)
		}
	}
}

// BenchmarkImport200kResistors imports a 200,000-row resistor file into a
// fresh stock file. Goal (issue: bounded reading): peak memory under 60 MB
// with the rows streamed into one transaction; run it alone to read its
// peak RSS: BENCH=Import200k BENCHTIME=1x bash .ci/bench ./cmd/internal/stockcmd
func BenchmarkImport200kResistors(b *testing.B) {
	dir := b.TempDir()
	file := filepath.Join(dir, "200k.csv")
	fh, err := os.Create(file)
	if err != nil {
		b.Fatal(err)
	}
	fmt.Fprintln(fh, "value,tolerance,power,qty,bin,tags,note")
	for i := range 200_000 {
		fmt.Fprintf(fh, "%.2f,1%%,0.25W,%d,B%d,rohs,row %d\n", 1+float64(i)*0.37, i%50, i%97, i)
	}
	if err := fh.Close(); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := range b.N {
		r := run(b, filepath.Join(dir, fmt.Sprintf("bench-%d.db", i)), "", "stock", "import", file)
		if r.code != 0 || !strings.Contains(r.out, "200000 resistor rows: 200000 new lines") {
			b.Fatalf("import: %s%s", r.out, r.errOut)
		}
	}
}
