package democmd

import "embed"

// wall holds the invented parts wall the demo stocks: resistors.csv and
// transistors.csv in the stock import format. The labels, bins and counts
// are made up for the demo (no real part numbers, no real shop); the
// ratings are typical of small-signal parts.
//
//go:embed wall/*.csv
var wall embed.FS

// wallFiles are the files loaded, in order.
var wallFiles = [...]string{"wall/resistors.csv", "wall/transistors.csv"}
