// Package store keeps the parts stock in a local SQLite file
// (modernc.org/sqlite through sqlx, no cgo).
//
// Every pooled connection gets busy_timeout, foreign_keys and WAL from the
// DSN; write transactions begin IMMEDIATE so two writers never deadlock on
// a lock upgrade, and a write that still meets a busy database is retried.
// The schema comes only from the numbered files in package migrations.
//
// Values are SI floats (ohms, fractions, watts, volts, amperes, °C). Each
// exported method owns its transaction; unexported helpers take *sqlx.Tx.
// Constraint failures and missing rows come back as the domain errors in
// errors.go. The package never prints.
package store
