package picture

import (
	"fmt"
	"strings"

	"biasbin/solver"
	"biasbin/solver/notation"
)

// MaxCompare is the most builds one picture overlays: more than four
// clouds on one plane stop being told apart.
const MaxCompare = 4

// Subject is one analysed build as the pictures take it: the typed results
// of the analysis, nothing parsed from text.
type Subject struct {
	// Name names the build for the title and legend (BuildName).
	Name string
	// Build is the build as analysed (rails, parts, ambient range).
	Build solver.Build
	// Nominal is the nominal operating point.
	Nominal solver.OperatingPoint
	// VCESat_V is the VCE(sat) the analyses used (the datasheet's, else
	// the default).
	VCESat_V float64
	// Swing is the load-line analysis at the nominal point.
	Swing solver.Swing
	// Corners are the worst-case corners; nil when they were not solved.
	Corners []solver.Corner
	// Window is the yield window.
	Window solver.Window
	// Yield is the Monte Carlo run with its boards kept
	// (solver.YieldOptions.KeepBoards); nil when it was not run.
	Yield *solver.YieldResult
}

// BuildName names a build in the trade's letter-and-digit code (IEC 60062):
// the transistor (its stock label, else its polarity and hFE range), then
// each fitted resistor and the rails, e.g.
// "NPN-GP · R1 47K · R2 10K · RC 2K2 · RE 470R · 12V".
func BuildName(b solver.Build, transistor string) string {
	if transistor == "" {
		d := b.Device
		transistor = fmt.Sprintf("%s hFE %.4g..%.4g", strings.ToUpper(d.Polarity.String()), d.HFEMin, d.HFEMax)
	}
	parts := []string{transistor}
	for _, s := range b.Topology.Slots() {
		if r := b.Resistors[s].Nominal_Ohm; r > 0 {
			parts = append(parts, strings.ToUpper(s.String())+" "+notation.FormatResistance(r))
		}
	}
	rails := volts(b.Ground.Supply_V(b.VCC_V)) // as a meter reads it against 0 V
	if b.Topology == solver.SplitSupply {
		rails += "/" + volts(b.VEE_V)
	}
	return strings.Join(append(parts, rails), " · ")
}

// volts writes a rail as on a schematic: "12V", "-9V", "4.5V".
func volts(v float64) string { return fmt.Sprintf("%.3gV", v) }
