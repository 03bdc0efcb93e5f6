package store

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"
)

func TestResistorDefaults(t *testing.T) {
	for _, tc := range []struct {
		name     string
		in       Resistor
		wantTech string
		wantTCR  float64
		wantKnee float64
		wantMax  float64
	}{
		// IEC 60115-1 style rated ambient 70 °C and upper category
		// temperature 155 °C (from memory).
		{"no technology: thick film, ±100 ppm/K (common practice)", Resistor{}, TechThickFilm, 100, 70, 155},
		{"thin film ±5..±50 ppm/K, 25 taken (common practice)", Resistor{Tech: "Thin Film"}, TechThinFilm, 25, 70, 155},
		{"metal film ±50 ppm/K (common practice)", Resistor{Tech: TechMetalFilm}, TechMetalFilm, 50, 70, 155},
		{"carbon film −200..−1000 ppm/K, −500 taken (common practice)", Resistor{Tech: TechCarbonFilm}, TechCarbonFilm, -500, 70, 155},
		{"wirewound ±20 ppm/K (from memory)", Resistor{Tech: TechWirewound}, TechWirewound, 20, 70, 155},
		{"stated values kept", Resistor{Tech: TechMetalFilm, TCR_PPMPerK: 15, Knee_C: 85, Max_C: 125}, TechMetalFilm, 15, 85, 125},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := tc.in.WithDefaults()
			if got.Tech != tc.wantTech || got.TCR_PPMPerK != tc.wantTCR || got.Knee_C != tc.wantKnee || got.Max_C != tc.wantMax {
				t.Fatalf("got tech %q tcr %g knee %g max %g", got.Tech, got.TCR_PPMPerK, got.Knee_C, got.Max_C)
			}
		})
	}
}

func TestTransistorDefaults(t *testing.T) {
	got := Transistor{Label: " Q1 ", Polarity: "NPN", HFEMin: 100, HFEMax: 300}.WithDefaults()
	// VBE(on) 0.65 V at 1 mA and Tj max 150 °C for small-signal plastic
	// packages (common practice).
	if got.VBEOn_V != 0.65 || got.VBEAt_A != 1e-3 || got.TjMax_C != 150 {
		t.Fatalf("defaults: VBE %g V at %g A, Tj max %g °C", got.VBEOn_V, got.VBEAt_A, got.TjMax_C)
	}
	if got.Label != "Q1" || got.Polarity != "npn" {
		t.Fatalf("label %q polarity %q", got.Label, got.Polarity)
	}
}

func TestSameValueWrittenTwoWaysIsOneLine(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, err := db.AddResistor(ctx, Resistor{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 10, Bin: "A1"})
	if err != nil {
		t.Fatal(err)
	}
	// 4.7 × 1000 is 4700.000000000001 in float64.
	b, err := db.AddResistor(ctx, Resistor{Ohm: 4.7 * 1000, Tol: 0.05, Rated_W: 1.0 / 4, Qty: 5, Bin: " A1 "})
	if err != nil {
		t.Fatal(err)
	}
	if !b.Merged || a.ID != b.ID {
		t.Fatalf("second add %+v did not merge into %+v", b, a)
	}
	c, err := db.AddResistor(ctx, Resistor{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 1, Bin: "A2"})
	if err != nil || c.Merged || c.ID == a.ID {
		t.Fatalf("other bin: %+v %v, want a new line", c, err)
	}
	r, err := db.ResistorByID(ctx, a.ID)
	if err != nil || r.Qty != 15 {
		t.Fatalf("qty %d (%v), want 15", r.Qty, err)
	}
}

func TestInvalidPartsAreRefused(t *testing.T) {
	good := r4k7(1, "A")
	goodT := bc547(1, "B")
	for _, tc := range []struct {
		name  string
		r     *Resistor
		t     *Transistor
		field string
	}{
		{"zero ohms", &Resistor{Tol: 0.05, Rated_W: 0.25}, nil, "value"},
		{"NaN ohms", &Resistor{Ohm: math.NaN(), Tol: 0.05, Rated_W: 0.25}, nil, "value"},
		{"infinite ohms", &Resistor{Ohm: math.Inf(1), Tol: 0.05, Rated_W: 0.25}, nil, "value"},
		{"tolerance 100 %", &Resistor{Ohm: 1, Tol: 1, Rated_W: 0.25}, nil, "tolerance"},
		{"no power", &Resistor{Ohm: 1, Tol: 0.05}, nil, "power"},
		{"max below knee", &Resistor{Ohm: 1, Tol: 0.05, Rated_W: 0.25, Knee_C: 100, Max_C: 90}, nil, "max_c"},
		{"unknown technology", &Resistor{Ohm: 1, Tol: 0.05, Rated_W: 0.25, Tech: "unobtainium"}, nil, "tech"},
		{"negative qty", &Resistor{Ohm: 1, Tol: 0.05, Rated_W: 0.25, Qty: -1}, nil, "qty"},
		{"tag with space", &Resistor{Ohm: 1, Tol: 0.05, Rated_W: 0.25, Tags: []string{"two words"}}, nil, "tags"},
		{"control char in bin", &Resistor{Ohm: 1, Tol: 0.05, Rated_W: 0.25, Bin: "A\x01"}, nil, "bin"},
		{"hFE min above max", nil, &Transistor{Label: "Q", Polarity: "npn", HFEMin: 300, HFEMax: 100}, "hfe_max"},
		{"unknown polarity", nil, &Transistor{Label: "Q", Polarity: "nnp", HFEMin: 100, HFEMax: 300}, "polarity"},
		{"no label", nil, &Transistor{Polarity: "pnp", HFEMin: 100, HFEMax: 300}, "label"},
		{"typical outside window", nil, &Transistor{Label: "Q", Polarity: "npn", HFEMin: 100, HFEMax: 300, HFETyp: 400}, "hfe_typ"},
		{"negative VCEO", nil, &Transistor{Label: "Q", Polarity: "npn", HFEMin: 100, HFEMax: 300, VCEO_V: -45}, "vceo"},
		{"Tj max 20 °C", nil, &Transistor{Label: "Q", Polarity: "npn", HFEMin: 100, HFEMax: 300, TjMax_C: 20}, "tj_max"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			if _, err := db.AddResistor(ctx, good); err != nil {
				t.Fatal(err)
			}
			if _, err := db.AddTransistor(ctx, goodT); err != nil {
				t.Fatal(err)
			}
			var err error
			if tc.r != nil {
				_, err = db.AddResistor(ctx, *tc.r)
			} else {
				_, err = db.AddTransistor(ctx, *tc.t)
			}
			var ie *InvalidError
			if !errors.As(err, &ie) || !errors.Is(err, ErrInvalid) {
				t.Fatalf("err = %v, want an InvalidError", err)
			}
			found := false
			for _, p := range ie.Problems {
				found = found || p.Field == tc.field
			}
			if !found {
				t.Fatalf("problems %v do not name %s", ie.Problems, tc.field)
			}
			rs, _ := db.ListResistors(ctx, Filter{})
			ts, _ := db.ListTransistors(ctx, Filter{})
			if len(rs) != 1 || len(ts) != 1 || rs[0].Qty != 1 || ts[0].Qty != 1 {
				t.Fatalf("stock changed: %v %v", rs, ts)
			}
		})
	}
}

// TestSchemaRefusesWhatGoWouldCatch writes bad rows past the Go checks:
// the schema's own constraints must refuse them.
func TestSchemaRefusesWhatGoWouldCatch(t *testing.T) {
	for _, tc := range []struct{ name, sql string }{
		{"negative qty", `INSERT INTO parts (kind, ident, qty) VALUES ('resistor', 'x', -1)`},
		{"fractional qty", `INSERT INTO parts (kind, ident, qty) VALUES ('resistor', 'x', 1.5)`},
		{"unknown kind", `INSERT INTO parts (kind, ident, qty) VALUES ('capacitor', 'x', 1)`},
		{"same line twice", `INSERT INTO parts (kind, ident, qty, bin) VALUES ('resistor', 'dup', 1, 'A'), ('resistor', 'dup', 2, 'A')`},
		{"zero ohms", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'resistor', 'x', 1);
			INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech) VALUES (50, 0, 0.05, 0.25, 70, 155, 100, 'thick film')`},
		{"zero power rating", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'resistor', 'x', 1);
			INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech) VALUES (50, 10, 0.05, 0, 70, 155, 100, 'thick film')`},
		{"detail of the wrong kind", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'transistor', 'x', 1);
			INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech) VALUES (50, 10, 0.05, 0.25, 70, 155, 100, 'thick film')`},
		{"hFE min above max", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'transistor', 'Q', 1);
			INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, vbe_on_v, vbe_at_a, tj_max_c) VALUES (50, 'Q', 'npn', 300, 100, 0.65, 0.001, 150)`},
		{"unknown polarity", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'transistor', 'Q', 1);
			INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, vbe_on_v, vbe_at_a, tj_max_c) VALUES (50, 'Q', 'xyz', 100, 300, 0.65, 0.001, 150)`},
		{"upper-case tag", `INSERT INTO parts (id, kind, ident, qty) VALUES (50, 'resistor', 'x', 1);
			INSERT INTO part_tags (part_id, tag) VALUES (50, 'RoHS')`},
		{"tag of no part", `INSERT INTO part_tags (part_id, tag) VALUES (999, 'rohs')`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			tx := db.x.MustBegin()
			defer tx.Rollback()
			if _, err := tx.Exec(tc.sql); err == nil {
				t.Fatal("schema accepted it")
			} else if !strings.Contains(err.Error(), "constraint") {
				t.Fatalf("error %v is not a constraint failure", err)
			}
		})
	}
}

func TestDomainErrorsReadPlainly(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	_, err := db.Adjust(ctx, 42, 1)
	if !errors.Is(err, ErrNotFound) || !strings.Contains(err.Error(), "no such part") {
		t.Fatalf("adjust missing part: %v", err)
	}
	if err := db.Remove(ctx, 42); !errors.Is(err, ErrNotFound) {
		t.Fatalf("remove missing part: %v", err)
	}
	if _, err := db.TransistorByLabel(ctx, "nothing"); !errors.Is(err, ErrNotFound) {
		t.Fatalf("missing label: %v", err)
	}
	a, _ := db.AddResistor(ctx, r4k7(1, "A"))
	if _, err := db.TransistorByID(ctx, a.ID); !errors.Is(err, ErrNotFound) {
		t.Fatalf("resistor read as transistor: %v", err)
	}
	// A raw constraint failure maps to a domain error.
	_, err = db.x.Exec(`UPDATE parts SET qty = -1 WHERE id = ?`, a.ID)
	if derr := domainError(err); !errors.Is(derr, ErrBelowZero) {
		t.Fatalf("domainError(%v) = %v, want ErrBelowZero", err, derr)
	}
}
