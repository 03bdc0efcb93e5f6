// Package stockcsv reads and writes the stock CSV format of
// `biasbin stock import` and `biasbin stock export`.
//
// The header row decides the kind: a file with a value column holds
// resistors, one with a label column transistors. Columns may come in any
// order and any case; unknown, duplicated or missing required columns are
// errors. Values may be written in any notation package notation reads.
// A UTF-8 byte-order mark, CRLF line ends and a missing final newline are
// accepted. Every problem is reported as FILE:LINE: column: problem, and
// reading goes on to find them all.
//
// Write produces exactly the format Read takes, with every column, so that
// import → export → import → export gives identical files.
package stockcsv
