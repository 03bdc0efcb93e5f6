package store

import (
	"context"
	"testing"
)

// TestResistorLEVAndPartNumber stocks a line that states its limiting
// element voltage (IEC 60115-1 term) and the maker's part number, and one
// of each technology the trade adds (metal oxide, cermet), and reads them
// back.
func TestResistorLEVAndPartNumber(t *testing.T) {
	ctx := context.Background()
	db, _ := openTemp(t)
	r := r4k7(10, "A1")
	r.LEV_V, r.PartNumber = 250, " MF-4K7-250 "
	res, err := db.AddResistor(ctx, r)
	if err != nil {
		t.Fatal(err)
	}
	got, err := db.ResistorByID(ctx, res.ID)
	if err != nil {
		t.Fatal(err)
	}
	if got.LEV_V != 250 || got.PartNumber != "MF-4K7-250" {
		t.Fatalf("read back LEV %g V, part number %q", got.LEV_V, got.PartNumber)
	}
	// Adding to the line without a part number or LEV keeps both.
	r.LEV_V, r.PartNumber = 0, ""
	if _, err := db.AddResistor(ctx, r); err != nil {
		t.Fatal(err)
	}
	got, _ = db.ResistorByID(ctx, res.ID)
	if got.Qty != 20 || got.LEV_V != 250 || got.PartNumber != "MF-4K7-250" {
		t.Fatalf("after adding without them: qty %d, LEV %g V, part number %q", got.Qty, got.LEV_V, got.PartNumber)
	}
	tr := bc547(5, "B")
	tr.PartNumber = "QT-1"
	tres, err := db.AddTransistor(ctx, tr)
	if err != nil {
		t.Fatal(err)
	}
	if gt, err := db.TransistorByID(ctx, tres.ID); err != nil || gt.PartNumber != "QT-1" {
		t.Fatalf("transistor part number: %+v %v", gt, err)
	}
	// Metal oxide ±200..±350 ppm/K, the upper figure (from memory);
	// cermet ±100 ppm/K (from memory).
	for _, tc := range []struct {
		tech string
		tcr  float64
	}{{TechMetalOxide, 350}, {TechCermet, 100}} {
		x := Resistor{Ohm: 1000, Tol: 0.05, Rated_W: 1, Tech: tc.tech, Qty: 1, Bin: "C"}
		res, err := db.AddResistor(ctx, x)
		if err != nil {
			t.Fatalf("%s: %v", tc.tech, err)
		}
		got, _ := db.ResistorByID(ctx, res.ID)
		if got.Tech != tc.tech || got.TCR_PPMPerK != tc.tcr {
			t.Fatalf("%s: stored %q at %g ppm/K", tc.tech, got.Tech, got.TCR_PPMPerK)
		}
	}
	bad := r4k7(1, "A1")
	bad.LEV_V = -5
	if _, err := db.AddResistor(ctx, bad); err == nil {
		t.Fatal("a negative LEV was stocked")
	}
}
