package notation

import "testing"

// TestFormatResistanceExact: values that differ in the fourth or a later
// significant digit print differently and read back exactly; the IEC 60062
// letter-and-digit code places the multiplier letter at the decimal point
// (IEC 60062:2016 clause 4, REFERENCE.md §2: 4K7 = 4.7 kΩ, R47 = 0.47 Ω).
func TestFormatResistanceExact(t *testing.T) {
	for _, tc := range []struct {
		ohm  float64
		want string
	}{
		{1000, "1K0"}, {1001, "1K001"}, {4700, "4K7"}, {4701.5, "4K7015"}, {0.4702, "R4702"},
		{12345678, "12M345678"}, {1.0001, "1R0001"}, {0.0047, "4L7"}, {100.5, "100R5"},
	} {
		got := FormatResistanceExact(tc.ohm)
		if got != tc.want {
			t.Errorf("FormatResistanceExact(%g) = %q, want %q", tc.ohm, got, tc.want)
			continue
		}
		back, err := ParseOhms(got)
		if err != nil || back != tc.ohm {
			t.Errorf("%q reads back as %g, %v; want %g", got, back, err, tc.ohm)
		}
	}
	if FormatResistanceExact(1000) == FormatResistanceExact(1001) {
		t.Error("1000 Ω and 1001 Ω print alike")
	}
}
