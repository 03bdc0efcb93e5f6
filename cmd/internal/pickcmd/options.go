package pickcmd

import (
	"context"
	"time"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/picker"
	"biasbin/store"
)

// Options are the pick command's inputs: the flags as typed (parsed by
// request) and what the command needs from outside, injectable by tests.
type Options struct {
	IO *cmdutil.IOStreams
	// Store opens the stock, an existing file only (the factory's lazy
	// ExistingStore outside tests).
	Store func(context.Context) (*store.DB, error)
	// Pick runs the search (picker.Pick outside tests).
	Pick func(picker.Stock, picker.Request) (picker.Result, error)
	// Now reads the clock for the progress indicator (time.Now outside tests).
	Now func() time.Time
	// Changed reports whether a flag was given on the command line (nil:
	// none was).
	Changed func(name string) bool

	VCC         string
	VCCTol      string
	IC          string
	VCE         string
	VE          string
	Polarity    string
	Topology    string
	VEE         string
	Rail        string // --rail: positive (default) or negative; "" = from the sign of --vcc
	VEETol      string
	Ambient     string
	Boards      int
	Load        string
	Bypass      bool
	ICWindow    string
	VCEWindow   string
	Weights     string
	Pairs       bool
	RequireTags []string
	Transistor  string
	// Keep are the --keep flags as typed: POSITION=VALUE items, comma
	// separated, the flag repeatable.
	Keep       []string
	Top        int
	Exhaustive bool
	// Settle searches on until the order of the listed builds is proven.
	Settle bool
	// TimeLimit stops the search after this long (0: none).
	TimeLimit   time.Duration
	ShowFailing bool
	All         bool
	// AllowUnrated lets transistor lines that state no VCEO or power
	// rating into the search (each such build says so).
	AllowUnrated bool
	Seed         uint64
	// SimBoards is the Monte Carlo size per build (--sim-boards, the same
	// flag as check's).
	SimBoards int
	JSON      bool
	// Plot is the picture file of the first build (or of the first Compare
	// builds overlaid); PlotSize its size as typed (WIDTHxHEIGHT).
	Plot     string
	Compare  int
	PlotSize string
}

// Flag defaults, shown in --help.
const (
	defaultVCCTol    = "5%"
	defaultAmbient   = "0..50"
	defaultICWindow  = "10%"
	defaultVCEWindow = "20%"
	defaultTop       = 5
	defaultBoards    = 1
	defaultSeed      = 1
)

// changed reports whether the flag name was given on the command line.
func (o *Options) changed(name string) bool { return o.Changed != nil && o.Changed(name) }
