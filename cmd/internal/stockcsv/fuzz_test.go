package stockcsv

import (
	"bytes"
	"os"
	"testing"

	"biasbin/store"
)

// FuzzRead feeds arbitrary bytes to Read: it never panics, and a file it
// accepts, once written and read again, writes the same bytes (the
// format is stable after one pass through the store's rounding).
func FuzzRead(f *testing.F) {
	for _, p := range []string{"../stockcmd/testdata/stock/resistors.csv", "../stockcmd/testdata/stock/transistors.csv",
		"../stockcmd/testdata/stock/bad.csv"} {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b)
	}
	f.Add([]byte("\ufeffvalue,tolerance,power,qty,bin\r\n27KK,,1/4W,3,A\r\n1R8J,,250mW,1,B"))
	f.Add([]byte("label,polarity,hfe_min,hfe_max,qty,vbe\nQ,pnp,1e2,3e2,1,-650mV\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		file, err := Read(bytes.NewReader(data), "fuzz.csv")
		if err != nil {
			return
		}
		once := write(t, file)
		again, err := Read(bytes.NewReader(once), "once.csv")
		if err != nil {
			t.Fatalf("written file does not read back: %v\n%s", err, once)
		}
		if twice := write(t, again); !bytes.Equal(once, twice) {
			t.Fatalf("not stable:\n%s\n---\n%s", once, twice)
		}
	})
}

// write stores-rounds the file's parts (as the store would) and writes them.
func write(t *testing.T, f *File) []byte {
	var b bytes.Buffer
	var err error
	if f.Kind == store.KindResistor {
		rs := make([]store.Resistor, len(f.Batch.Resistors))
		for i, r := range f.Batch.Resistors {
			rs[i] = r.WithDefaults()
		}
		err = WriteResistors(&b, rs)
	} else {
		ts := make([]store.Transistor, len(f.Batch.Transistors))
		for i, q := range f.Batch.Transistors {
			ts[i] = q.WithDefaults()
		}
		err = WriteTransistors(&b, ts)
	}
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}
