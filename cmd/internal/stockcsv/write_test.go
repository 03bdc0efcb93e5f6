package stockcsv

import (
	"bytes"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"biasbin/solver/eseries"
	"biasbin/store"
)

// randomResistors makes n resistor lines over the E192 values (IEC 60063
// Table 2, through package eseries) from 10 mΩ to 99 MΩ, with the
// tolerances, powers and texts a stock file holds, stored the way the
// store keeps them (defaults filled in, 12 digits).
func randomResistors(rng *rand.Rand, n int) []store.Resistor {
	vals := eseries.Values(eseries.E192)
	tols := []float64{0.001, 0.0025, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.03}
	powers := []float64{0.063, 0.1, 0.125, 0.25, 0.4, 0.5, 0.6, 1, 2, 5}
	notes := []string{"", "cut tape", `from "old" reel, 2019`, "two\nlines", "ünïcode Ω"}
	out := make([]store.Resistor, n)
	for i := range out {
		r := store.Resistor{
			Ohm:     vals[rng.IntN(len(vals))] * math.Pow(10, float64(rng.IntN(10)-2)),
			Tol:     tols[rng.IntN(len(tols))],
			Rated_W: powers[rng.IntN(len(powers))],
			Tech:    store.Technologies()[rng.IntN(5)],
			Qty:     rng.IntN(10000),
			Bin:     []string{"", "A1", "drawer 3, left"}[rng.IntN(3)],
			Note:    notes[rng.IntN(len(notes))],
		}
		if rng.IntN(2) == 0 {
			r.TCR_PPMPerK = float64(rng.IntN(400) - 200)
			r.Knee_C, r.Max_C = 85, 125
		}
		if rng.IntN(2) == 0 {
			r.Tags = []string{"rohs", "approved"}[:1+rng.IntN(2)]
		}
		out[i] = r.WithDefaults()
	}
	return out
}

// randomTransistors makes n transistor lines with every optional field
// sometimes given.
func randomTransistors(rng *rand.Rand, n int) []store.Transistor {
	pick := func(vs ...float64) float64 { return vs[rng.IntN(len(vs))] }
	out := make([]store.Transistor, n)
	for i := range out {
		lo := pick(20, 40, 100, 110, 200, 420)
		q := store.Transistor{
			Label:         []string{"QA", "QB-7", "Q, odd"}[rng.IntN(3)],
			Polarity:      []string{"npn", "pnp"}[rng.IntN(2)],
			HFEMin:        lo,
			HFEMax:        lo * pick(1, 2, 3, 4.5),
			HFEAt_A:       pick(0, 1e-4, 2e-3, 0.15),
			VBEOn_V:       pick(0, 0.6, 0.65, 0.72),
			VBEAt_A:       pick(0, 1e-3, 1e-2),
			VCESat_V:      pick(0, 0.2, 0.25, 0.6),
			VCEO_V:        pick(0, 30, 45, 65, 300),
			ICMax_A:       pick(0, 0.1, 0.5, 1.5),
			PD25_W:        pick(0, 0.35, 0.5, 0.625, 40),
			ThetaJA_KPerW: pick(0, 200, 250, 357, 62.5),
			TjMax_C:       pick(0, 125, 150, 175),
			VAF_V:         pick(0, 74.03, 100),
			ICBO_A:        pick(0, 15e-9, 1e-7, 5e-12),
			Qty:           rng.IntN(500),
			Bin:           []string{"", "B1"}[rng.IntN(2)],
			Note:          []string{"", "gain group B"}[rng.IntN(2)],
		}
		q.HFETyp = pick(0, q.HFEMin, math.Sqrt(q.HFEMin*q.HFEMax))
		if rng.IntN(2) == 0 { // a stocked VBE(on) spread around the nominal
			v, d := q.VBEOn_V, pick(0.02, 0.045)
			if v == 0 {
				v = store.DefaultVBEOn_V
			}
			q.VBEMin_V, q.VBEMax_V = v-d, v+d
		}
		if rng.IntN(2) == 0 && q.VAF_V > 0 { // a stocked Early-voltage range
			q.VAFMin_V, q.VAFMax_V = 0.5*q.VAF_V, 1.5*q.VAF_V
		}
		out[i] = q.WithDefaults()
	}
	return out
}

// TestWriteReadsBack writes random lines, reads them back and compares: the
// values come back exactly (to the 12 digits the store keeps), and writing
// what was read gives the same bytes.
func TestWriteReadsBack(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	rs := randomResistors(rng, 2000)
	ts := randomTransistors(rng, 500)
	for i := range rs {
		rs[i].Tags = nonNilTags(rs[i].Tags)
	}
	var b1 bytes.Buffer
	if err := WriteResistors(&b1, rs); err != nil {
		t.Fatal(err)
	}
	f, err := Read(bytes.NewReader(b1.Bytes()), "r.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i, got := range f.Batch.Resistors {
		got = got.WithDefaults()
		got.Tags = nonNilTags(got.Tags)
		if !reflect.DeepEqual(got, rs[i]) {
			t.Fatalf("line %d:\nwrote %+v\nread  %+v\nas %q", f.Lines[i], rs[i], got, strings.Split(b1.String(), "\n")[f.Lines[i]-1])
		}
	}
	var b2 bytes.Buffer
	if err := WriteResistors(&b2, f.Batch.Resistors); err != nil {
		t.Fatal(err)
	}
	if b1.String() != b2.String() {
		t.Fatal("second write differs from the first")
	}

	var c1 bytes.Buffer
	if err := WriteTransistors(&c1, ts); err != nil {
		t.Fatal(err)
	}
	g, err := Read(bytes.NewReader(c1.Bytes()), "q.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i, got := range g.Batch.Transistors {
		got = got.WithDefaults()
		if !reflect.DeepEqual(got, ts[i]) {
			t.Fatalf("line %d:\nwrote %+v\nread  %+v", g.Lines[i], ts[i], got)
		}
	}
}

func nonNilTags(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

func TestWriteFormat(t *testing.T) {
	rs := []store.Resistor{
		{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Knee_C: 70, Max_C: 155, TCR_PPMPerK: 100, Tech: store.TechThickFilm, Qty: 100, Bin: "A1", Tags: []string{"approved", "rohs"}},
		{Ohm: 0.47, Tol: 0.01, Rated_W: 0.5, Knee_C: 70, Max_C: 155, TCR_PPMPerK: -500, Tech: store.TechCarbonFilm, Qty: 3, Note: `a "quoted", note`},
		{Ohm: 1234.5, Tol: 0.001, Rated_W: 0.1, Knee_C: 70, Max_C: 155, TCR_PPMPerK: 25, Tech: store.TechThinFilm, Qty: 1},
		{Ohm: 1e6, Tol: 0.01, Rated_W: 0.5, Knee_C: 70, Max_C: 155, TCR_PPMPerK: 350, Tech: store.TechMetalOxide, LEV_V: 350, PartNumber: "MO-1M-350", Qty: 2},
	}
	var b bytes.Buffer
	if err := WriteResistors(&b, rs); err != nil {
		t.Fatal(err)
	}
	// Letter-and-digit codes per IEC 60062 (REFERENCE.md §2): 4700 Ω is
	// 4K7, 0.47 Ω is R47; 1234.5 Ω needs five digits, beyond the code's
	// three, so it is written as a plain number.
	want := "value,tolerance,power,qty,bin,tcr,tech,knee_c,max_c,tags,note,lev,part_number\n" +
		"4K7,5%,0.25W,100,A1,100,thick film,70,155,approved;rohs,,,\n" +
		"R47,1%,0.5W,3,,-500,carbon film,70,155,,\"a \"\"quoted\"\", note\",,\n" +
		"1234.5,0.1%,0.1W,1,,25,thin film,70,155,,,,\n" +
		"1M0,1%,0.5W,2,,350,metal oxide,70,155,,,350V,MO-1M-350\n"
	if b.String() != want {
		t.Fatalf("got\n%s\nwant\n%s", b.String(), want)
	}
}
