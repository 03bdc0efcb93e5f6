package notation

import "testing"

// TestFormatBand: both ends of a band in the unit and prefix of the larger
// end (SI prefixes, BIPM SI Brochure §3, common practice for tables).
func TestFormatBand(t *testing.T) {
	tests := []struct {
		lo, hi float64
		unit   string
		want   string
	}{
		{-1.17, -0.709, "V", "-1.17 V..-0.709 V"},
		{0.00101, 0.00134, "A", "1.01 mA..1.34 mA"},
		{0.7, 1.38, "V", "0.7 V..1.38 V"},
		{26.1, 41.7, "V", "26.1 V..41.7 V"},
		{0.000734, 0.00125, "A", "0.734 mA..1.25 mA"},
		{0, 5, "V", "0 V..5 V"},
		{120, 183, "V", "120 V..183 V"},
		{999.8e-6, 1.2e-3, "A", "1 mA..1.2 mA"},
		{9.34, 12.2, "V", "9.34 V..12.2 V"},
		{1e-6, 5, "V", "0 V..5 V"},
	}
	for _, tt := range tests {
		if got := FormatBand(tt.lo, tt.hi, tt.unit); got != tt.want {
			t.Errorf("FormatBand(%g, %g, %q) = %q, want %q", tt.lo, tt.hi, tt.unit, got, tt.want)
		}
	}
}
