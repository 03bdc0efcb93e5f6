// Package migrations holds the stock database schema as numbered SQL files
// (0001_name.sql, ...), embedded so the binary carries its own schema.
package migrations

import "embed"

// FS holds every migration file, applied in name order.
//
//go:embed *.sql
var FS embed.FS
