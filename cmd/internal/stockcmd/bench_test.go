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
