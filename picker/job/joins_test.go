package job

import (
	"testing"

	"biasbin/solver"
)

// TestJoins: what each resistor joins, as the technician wires it
// (common practice: voltage-divider bias puts R1 and RC on the collector
// side's rail and R2 and RE on the emitter side's; a PNP stage on a
// positive supply has its emitter side on +V and its collector side on
// 0 V; a split supply returns the base to the common).
func TestJoins(t *testing.T) {
	const (
		B, C, E       = PointBase, PointCollector, PointEmitter
		Plus, Minus   = PointPlus, PointMinus
		Zero          = PointZero
		npn, pnp      = solver.NPN, solver.PNP
		onCollector   = solver.CollectorRailGround
		onEmitterSide = solver.EmitterRailGround
	)
	tests := []struct {
		name string
		top  solver.Topology
		pol  solver.Polarity
		vcc  float64
		vee  float64
		g    solver.Ground
		want []Join
	}{
		{"npn divider", solver.Divider, npn, 12, 0, onEmitterSide,
			[]Join{{solver.R1, Plus, B}, {solver.R2, B, Zero}, {solver.RC, Plus, C}, {solver.RE, E, Zero}}},
		{"pnp divider on a positive supply", solver.Divider, pnp, -5, 0, onCollector,
			[]Join{{solver.R1, B, Zero}, {solver.R2, Plus, B}, {solver.RC, C, Zero}, {solver.RE, Plus, E}}},
		{"pnp divider on a negative supply", solver.Divider, pnp, -5, 0, onEmitterSide,
			[]Join{{solver.R1, B, Minus}, {solver.R2, Zero, B}, {solver.RC, C, Minus}, {solver.RE, Zero, E}}},
		{"pnp collector feedback on a positive supply", solver.CollectorFeedback, pnp, -9, 0, onCollector,
			[]Join{{solver.RF, B, C}, {solver.RC, C, Zero}, {solver.RE, Plus, E}}},
		{"npn split supply", solver.SplitSupply, npn, 12, -12, onEmitterSide,
			[]Join{{solver.RB, B, Zero}, {solver.RC, Plus, C}, {solver.RE, E, Minus}}},
		{"pnp split supply", solver.SplitSupply, pnp, -12, 12, onEmitterSide,
			[]Join{{solver.RB, Zero, B}, {solver.RC, C, Minus}, {solver.RE, Plus, E}}},
	}
	for _, tt := range tests {
		b := solver.Build{Topology: tt.top, VCC_V: tt.vcc, VEE_V: tt.vee, Ground: tt.g, Device: solver.Datasheet{Polarity: tt.pol}}
		for _, sl := range tt.top.Slots() {
			b.Resistors[sl] = solver.ResistorSpec{Nominal_Ohm: 1e3}
		}
		got := Joins(b)
		if len(got) != len(tt.want) {
			t.Errorf("%s: %v, want %v", tt.name, got, tt.want)
			continue
		}
		for i := range got {
			if got[i] != tt.want[i] {
				t.Errorf("%s: %v joins %v–%v, want %v–%v", tt.name, got[i].Slot, got[i].From, got[i].To, tt.want[i].From, tt.want[i].To)
			}
		}
	}
	// A position marked 0 Ω is a wire: no resistor to name.
	b := solver.Build{Topology: solver.Divider, VCC_V: 12, Device: solver.Datasheet{Polarity: npn}}
	b.Resistors[solver.R1].Nominal_Ohm, b.Resistors[solver.R2].Nominal_Ohm, b.Resistors[solver.RC].Nominal_Ohm = 47e3, 10e3, 4.7e3
	if got := Joins(b); len(got) != 3 {
		t.Errorf("divider with RE = 0: %v, want R1, R2, RC only", got)
	}
}
