package stockcsv

// A spreadsheet opening a CSV file evaluates a cell that starts with = + -
// or @ as a formula, and tab or carriage return lead to the same; quoting
// the field (RFC 4180 §2.6) does not stop it. The defence OWASP ASVS 5.0
// requirement 1.2.10 and CWE-1236 name is to prefix such a cell with a
// single quote, which makes the spreadsheet show it as text (the trigger
// set is that of the OWASP "CSV Injection" page; ASVS adds NUL, which the
// store refuses anyway). Export writes text cells that way and import
// takes the quote off, so the round trip gives the same text back. A cell
// that itself starts with a quote gets one more, so that a text really
// starting with ' also survives.

// formulaStart reports whether c makes a spreadsheet read a cell as a formula.
func formulaStart(c byte) bool {
	switch c {
	case '=', '+', '-', '@', '\t', '\r', 0:
		return true
	}
	return false
}

// EscapeFormula returns s as a text cell a spreadsheet will not evaluate:
// s with a leading ' when it starts with a formula character or a quote.
func EscapeFormula(s string) string {
	if s != "" && (formulaStart(s[0]) || s[0] == '\'') {
		return "'" + s
	}
	return s
}

// UnescapeFormula undoes EscapeFormula: a leading ' followed by a formula
// character or another ' is taken off. Any other cell comes back as it is.
func UnescapeFormula(s string) string {
	if len(s) >= 2 && s[0] == '\'' && (formulaStart(s[1]) || s[1] == '\'') {
		return s[1:]
	}
	return s
}
