package report

import "testing"

func TestQuantity(t *testing.T) {
	tests := []struct {
		v    float64
		unit string
		want string
	}{
		{0.00201, "A", "2.01 mA"},
		{-5.4, "V", "-5.4 V"},
		{0, "V", "0 V"},
		{12, "V", "12 V"},
		{999.96, "Ω", "1 kΩ"},
		{4.7e-6, "A", "4.7 µA"},
		{0.25, "W", "250 mW"},
		{1.2345e-3, "A", "1.23 mA"},
		{2.2e6, "Ω", "2.2 MΩ"},
	}
	for _, tt := range tests {
		if got := Quantity(tt.v, tt.unit); got != tt.want {
			t.Errorf("Quantity(%g, %q) = %q, want %q", tt.v, tt.unit, got, tt.want)
		}
	}
}

func TestPercent(t *testing.T) {
	tests := []struct {
		frac float64
		want string
	}{
		{0.987, "98.7 %"},
		{0.05, "5 %"},
		{1, "100 %"},
		{0.0004, "0 %"},
	}
	for _, tt := range tests {
		if got := Percent(tt.frac); got != tt.want {
			t.Errorf("Percent(%g) = %q, want %q", tt.frac, got, tt.want)
		}
	}
}
