package solver

import (
	"errors"
	"testing"
)

// TestSettleRail: how a stage is built from the supply as given (common
// practice: a PNP stage usually runs from a positive supply with its
// emitter side on +V and its collector side on 0 V; the negative-rail
// form, emitter side on 0 V, is the mirror of the NPN stage; a split
// supply is measured from the common of its two supplies).
func TestSettleRail(t *testing.T) {
	tests := []struct {
		name   string
		vcc    float64
		p      Polarity
		top    Topology
		r      RailSign
		want   RailSign
		ground Ground
		bad    string // the field of the error, "" for none
	}{
		{"npn magnitude", 12, NPN, Divider, RailFromSupply, PositiveRail, EmitterRailGround, ""},
		{"npn stated positive", 12, NPN, Divider, PositiveRail, PositiveRail, EmitterRailGround, ""},
		{"npn negative refused", 12, NPN, Divider, NegativeRail, 0, 0, "rail"},
		{"npn negative supply: positive, Rail refuses the sign", -12, NPN, Divider, RailFromSupply, PositiveRail, EmitterRailGround, ""},
		{"pnp magnitude: positive, the usual build", 5, PNP, Divider, RailFromSupply, PositiveRail, CollectorRailGround, ""},
		{"pnp feedback on a positive supply", 5, PNP, CollectorFeedback, RailFromSupply, PositiveRail, CollectorRailGround, ""},
		{"pnp given negative: negative rail", -5, PNP, Divider, RailFromSupply, NegativeRail, EmitterRailGround, ""},
		{"pnp magnitude on a stated negative rail", 5, PNP, Divider, NegativeRail, NegativeRail, EmitterRailGround, ""},
		{"pnp negative supply on a stated positive rail", -5, PNP, Divider, PositiveRail, 0, 0, "vcc"},
		{"pnp split supply: the common", 12, PNP, SplitSupply, RailFromSupply, SplitRails, EmitterRailGround, ""},
		{"pnp split supply given negative", -12, PNP, SplitSupply, RailFromSupply, SplitRails, EmitterRailGround, ""},
		{"split supply takes no rail", 12, PNP, SplitSupply, PositiveRail, 0, 0, "rail"},
		{"split rails only for split supply", 12, PNP, Divider, SplitRails, 0, 0, "rail"},
		{"unknown rail", 12, PNP, Divider, RailSign(9), 0, 0, "rail"},
	}
	for _, tt := range tests {
		got, err := SettleRail(tt.vcc, tt.p, tt.top, tt.r)
		var ie *InputError
		switch {
		case tt.bad == "" && (err != nil || got != tt.want):
			t.Errorf("%s: SettleRail = %v, %v; want %v", tt.name, got, err, tt.want)
		case tt.bad != "" && (!errors.As(err, &ie) || ie.Field != tt.bad):
			t.Errorf("%s: SettleRail = %v, %v; want an error on %s", tt.name, got, err, tt.bad)
		}
		if tt.bad != "" {
			continue
		}
		if g := GroundOf(tt.p, tt.top, got); g != tt.ground {
			t.Errorf("%s: GroundOf = %v, want %v", tt.name, g, tt.ground)
		}
		if back := RailOf(tt.p, tt.top, GroundOf(tt.p, tt.top, got)); back != got {
			t.Errorf("%s: RailOf(GroundOf) = %v, want %v", tt.name, back, got)
		}
	}
}

// TestGroundMeter: moving 0 V from the emitter-side rail to the
// collector-side rail raises every node by |VCC| (common practice: a
// meter reads the potential difference to where its black lead sits).
// A PNP stage on a 5 V supply solved with VCC = −5 V: the base at −1.6 V
// against the emitter-side rail reads 3.4 V against the collector-side
// rail, the emitter-side rail itself 5 V, the collector-side rail 0 V.
func TestGroundMeter(t *testing.T) {
	tests := []struct {
		g          Ground
		v, vcc     float64
		want       float64
		wantSupply float64
	}{
		{EmitterRailGround, -1.6, -5, -1.6, -5},
		{CollectorRailGround, -1.6, -5, 3.4, 5},
		{CollectorRailGround, 0, -5, 5, 5},
		{CollectorRailGround, -5, -5, 0, 5},
		{EmitterRailGround, 2.65, 12, 2.65, 12},
	}
	for _, tt := range tests {
		got := tt.g.Meter(tt.v, tt.vcc)
		if d := got - tt.want; d > 1e-12 || d < -1e-12 {
			t.Errorf("%v.Meter(%g, %g) = %g, want %g", tt.g, tt.v, tt.vcc, got, tt.want)
		}
		if back := tt.g.Node(got, tt.vcc); back-tt.v > 1e-12 || tt.v-back > 1e-12 {
			t.Errorf("%v.Node(%g, %g) = %g, want %g", tt.g, got, tt.vcc, back, tt.v)
		}
		if s := tt.g.Supply_V(tt.vcc); s != tt.wantSupply {
			t.Errorf("%v.Supply_V(%g) = %g, want %g", tt.g, tt.vcc, s, tt.wantSupply)
		}
	}
}

// TestStageGroundRefused: a split supply has no collector-side ground.
func TestStageGroundRefused(t *testing.T) {
	s := Stage{Topology: SplitSupply, VCC_V: -12, VEE_V: 12, Ground: CollectorRailGround}
	s.R_Ohm[RB], s.R_Ohm[RC], s.R_Ohm[RE] = 10e3, 4.7e3, 10e3
	var ie *InputError
	if err := s.Validate(PNP); !errors.As(err, &ie) || ie.Field != "ground" {
		t.Errorf("split supply grounded on its collector rail: %v, want an error on ground", err)
	}
	s.Ground = EmitterRailGround
	if err := s.Validate(PNP); err != nil {
		t.Errorf("split supply grounded on its common: %v", err)
	}
}
