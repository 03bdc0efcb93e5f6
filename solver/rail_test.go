package solver

import (
	"errors"
	"testing"
)

// TestRail: the sign convention of doc.go (PNP rails negative, VEE
// opposite to VCC): a magnitude takes the rail's sign, a signed value must
// already carry it, 0 is no supply.
func TestRail(t *testing.T) {
	tests := []struct {
		v    float64
		p    Polarity
		side RailSide
		want float64
		bad  string // the field of the error, "" for none
	}{
		{12, NPN, Collector, 12, ""},
		{9, PNP, Collector, -9, ""},
		{-9, PNP, Collector, -9, ""},
		{-12, NPN, Collector, 0, "vcc"},
		{15, NPN, Emitter, -15, ""},
		{-15, NPN, Emitter, -15, ""},
		{15, PNP, Emitter, 15, ""},
		{-15, PNP, Emitter, 0, "vee"},
		{0, NPN, Collector, 0, "vcc"},
	}
	for _, tt := range tests {
		got, err := Rail(tt.v, tt.p, tt.side)
		var ie *InputError
		switch {
		case tt.bad == "" && (err != nil || got != tt.want):
			t.Errorf("Rail(%g, %v, %d) = %g, %v; want %g", tt.v, tt.p, tt.side, got, err, tt.want)
		case tt.bad != "" && (!errors.As(err, &ie) || ie.Field != tt.bad):
			t.Errorf("Rail(%g, %v, %d) = %g, %v; want an error on %s", tt.v, tt.p, tt.side, got, err, tt.bad)
		}
	}
}
