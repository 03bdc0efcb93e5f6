package buildjob

import "testing"

// TestParseRef: a pick's build ID is b and twelve hex digits (the form
// pick prints), a reserved build's number is what build list shows.
func TestParseRef(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Ref
		ok   bool
	}{
		{"b3b39a272f57c", Ref{Candidate: "b3b39a272f57c"}, true},
		{" B3B39A272F57C ", Ref{Candidate: "b3b39a272f57c"}, true},
		{"3", Ref{Build: 3}, true},
		{"#12", Ref{Build: 12}, true},
		{"b3b39", Ref{}, false},
		{"bzzzzzzzzzzzz", Ref{}, false},
		{"0", Ref{}, false},
		{"-2", Ref{}, false},
		{"q1", Ref{}, false},
	} {
		got, err := ParseRef(tc.in)
		if (err == nil) != tc.ok || got != tc.want {
			t.Errorf("ParseRef(%q) = %+v, %v; want %+v, ok %v", tc.in, got, err, tc.want, tc.ok)
		}
	}
}
