package democmd

import (
	"fmt"
	"io"
	"strings"

	"biasbin/cmd/internal/diagnosecmd"
	"biasbin/cmd/internal/report"
	"biasbin/cmd/internal/substitutecmd"
	"biasbin/picker"
	"biasbin/picker/repair"
	"biasbin/solver"
	"biasbin/solver/fault"
)

// The demo's repair bench is an invented unit: the "Brackwater PA-2"
// two-channel practice amplifier, whose channel B input stage has a dead
// transistor of the invented, long-gone type "VX-31" (hFE 25..50).
// Channel A is the working twin. The readings are demo data, made up to
// suit the story.

// demoStage is the stage as the command line's defaults make it: 5 %
// resistors at 100 ppm/K and 1/4 W, supply ±5 %, 0..50 °C, nominal 25 °C.
func demoStage(top solver.Topology, vcc float64, r map[solver.Slot]float64) solver.Build {
	b := solver.Build{Topology: top, VCC_V: vcc, VCCTol: 0.05, AmbientMin_C: 0, AmbientMax_C: 50, NominalAmbient_C: 25}
	for sl, ohm := range r {
		b.Resistors[sl] = solver.ResistorSpec{Nominal_Ohm: ohm, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	return b
}

// repairExample is the demo's substitution and diagnosis, each as the
// command line shown and the typed request the demo hands the repair jobs.
type repairExample struct {
	title, story string
	args         []string
	substitute   *repair.SubstituteRequest // nil for the diagnosis
	diagnose     *repair.DiagnoseRequest
}

// demoTransistor is the datasheet of a stocked line by label.
func demoTransistor(stock picker.Stock, label string) (solver.Datasheet, bool) {
	for _, t := range stock.Transistors {
		if picker.LabelMatches(t.Sheet.Label, label) {
			return t.Sheet, true
		}
	}
	return solver.Datasheet{}, false
}

// substituteArgs is the command line of the demo's substitution.
func substituteArgs() []string {
	return []string{"--vcc", "12V", "--r1", "220K", "--r2", "33K", "--rc", "4K7", "--re", "470R", "--vb", "1.00V", "--ve", "0.332V", "--vc", "8.77V", "--top", "3"}
}

// diagnoseArgs is the command line of the demo's diagnosis.
func diagnoseArgs() []string {
	return []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "4K7", "--re", "1K", "--transistor", "QN-104A", "--vb", "2.10V", "--ve", "0V", "--vc", "12.0V", "--top", "4"}
}

// repairExamples are the demo's repair bench: one substitution, one
// diagnosis.
func repairExamples(stock picker.Stock) ([]repairExample, error) {
	type R = map[solver.Slot]float64
	input := demoStage(solver.Divider, 12, R{solver.R1: 220e3, solver.R2: 33e3, solver.RC: 4.7e3, solver.RE: 470})
	twin := fault.Readings{VB_V: 1.00, VE_V: 0.332, VC_V: 8.77}
	driver := demoStage(solver.Divider, 12, R{solver.R1: 47e3, solver.R2: 10e3, solver.RC: 4.7e3, solver.RE: 1e3})
	q, ok := demoTransistor(stock, "QN-104A")
	if !ok {
		return nil, fmt.Errorf("demo repair: QN-104A is not on the demo wall")
	}
	return []repairExample{
		{
			title: "Brackwater PA-2, channel B input stage: the VX-31 is dead",
			story: `The VX-31 (an invented type, hFE 25..50) went out of production long ago
and the wall has none. Channel A is a working twin: its base, emitter and
collector read 1.00 V, 0.332 V and 8.77 V. substitute reads the original
Q-point from them (IC from VE/RE and from the drop across RC must agree),
then tries every stocked NPN type in the stage; the higher-gain parts shift
IC, so it proposes the one resistor change that brings each back.`,
			args: substituteArgs(),
			substitute: &repair.SubstituteRequest{Build: input, Polarity: solver.NPN, Twin: &twin,
				Meter: fault.Meter{Fraction: 0.01, Offset_V: 0.010, Input_Ohm: 10e6}, Tolerance: 0.10, Stock: stock, Pairs: true},
		},
		{
			title: "Brackwater PA-2, channel B driver stage: stuck at the rail",
			story: `The driver stage of the same channel (a QN-104A from drawer T01) reads
2.10 V at the base, 0 V at the emitter and 12.0 V at the collector: no
current flows. diagnose re-solves every single fault against the readings
and names the check that tells the two best apart.`,
			args: diagnoseArgs(),
			diagnose: &repair.DiagnoseRequest{Stage: driver.NominalStage(), Device: q, Readings: fault.Readings{VB_V: 2.10, VE_V: 0, VC_V: 12.0},
				Settings: fault.Settings{Meter: fault.Meter{Fraction: 0.01, Offset_V: 0.010, Input_Ohm: 10e6}, VBESpread_V: 0.03}},
		},
	}, nil
}

// runRepair narrates the repair bench through the same jobs and renderers
// as biasbin substitute and biasbin diagnose.
func runRepair(w io.Writer, stock picker.Stock) error {
	examples, err := repairExamples(stock)
	if err != nil {
		return err
	}
	for i, ex := range examples {
		fmt.Fprintf(w, "\n=== Repair %d: %s\n", i+1, ex.title)
		fmt.Fprintln(w, ex.story)
		var cautions []repair.Caution
		switch {
		case ex.substitute != nil:
			fmt.Fprintf(w, "$ biasbin substitute %s\n\n", strings.Join(ex.args, " "))
			res, err := repair.Substitute(*ex.substitute)
			if err != nil {
				return fmt.Errorf("demo repair %d: %w", i+1, err)
			}
			substitutecmd.WriteText(w, res, 3)
			cautions = res.Cautions
		default:
			fmt.Fprintf(w, "$ biasbin diagnose %s\n\n", strings.Join(ex.args, " "))
			res, err := repair.Diagnose(*ex.diagnose)
			if err != nil {
				return fmt.Errorf("demo repair %d: %w", i+1, err)
			}
			diagnosecmd.WriteText(w, *ex.diagnose, res, 4)
			cautions = res.Cautions
		}
		for _, c := range cautions {
			fmt.Fprintln(w, "caution:", report.BenchCaution(c))
		}
	}
	return nil
}
