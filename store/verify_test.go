package store

import (
	"context"
	"strings"
	"testing"
)

func TestVerifyFindsBrokenLines(t *testing.T) {
	for _, tc := range []struct {
		name   string
		break_ string
		want   string
	}{
		{"clean", "", ""},
		{"identity drifted from values", `UPDATE resistors SET ohm = 4800 WHERE part_id = 1`, "does not match"},
		{"part without detail row", `INSERT INTO parts (id, kind, ident, qty) VALUES (77, 'transistor', 'X', 1)`, "part 77 (transistor) has no detail row"},
		{"unknown schema step", `INSERT INTO schema_migrations (name) VALUES ('0999_x.sql')`, "unknown schema step"},
		{"foreign key broken behind the checks", `PRAGMA foreign_keys = OFF; INSERT INTO part_tags (part_id, tag) VALUES (555, 'x')`, "foreign key"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			if _, err := db.AddResistor(ctx, r4k7(1, "A")); err != nil {
				t.Fatal(err)
			}
			if _, err := db.AddTransistor(ctx, bc547(1, "A")); err != nil {
				t.Fatal(err)
			}
			if tc.break_ != "" {
				conn, err := db.x.Conn(ctx)
				if err != nil {
					t.Fatal(err)
				}
				for _, s := range strings.Split(tc.break_, ";") {
					if _, err := conn.ExecContext(ctx, s); err != nil {
						t.Fatal(err)
					}
				}
				conn.ExecContext(ctx, `PRAGMA foreign_keys = ON`)
				conn.Close()
			}
			ps, err := db.Verify(ctx)
			if err != nil {
				t.Fatal(err)
			}
			if tc.want == "" {
				if len(ps) != 0 {
					t.Fatalf("clean stock: %v", ps)
				}
				return
			}
			if !strings.Contains(strings.Join(ps, "\n"), tc.want) {
				t.Fatalf("problems %v lack %q", ps, tc.want)
			}
		})
	}
}
