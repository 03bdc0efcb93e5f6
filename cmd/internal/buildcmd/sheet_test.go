package buildcmd

import "testing"

// TestSafeCell: a text cell a spreadsheet would run as a formula gets a
// leading quote (OWASP ASVS 5.0 requirement 1.2.10: = + - @ tab CR NUL);
// any other text is left as it is.
func TestSafeCell(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"=HYPERLINK(\"x\")", "'=HYPERLINK(\"x\")"},
		{"+1", "'+1"},
		{"-A3", "'-A3"},
		{"@SUM(A1)", "'@SUM(A1)"},
		{"\tx", "'\tx"},
		{"\rx", "'\rx"},
		{"4K7", "4K7"},
		{"QX-1", "QX-1"},
		{"", ""},
	} {
		if got := safeCell(tc.in); got != tc.want {
			t.Errorf("safeCell(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
