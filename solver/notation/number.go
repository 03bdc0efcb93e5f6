package notation

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// number is a scanned decimal number, kept as text so that scaling by a
// prefix stays exact (4.7k reads as 4.7e3, the float64 nearest 4700).
type number struct {
	neg     bool
	mant    string // digits with at most one '.', e.g. "4.7", ".5"
	exp     int    // decimal exponent written after e/E
	nonzero bool   // some mantissa digit is not 0
}

// maxExpDigits bounds the exponent text; anything longer is out of range.
const maxExpDigits = 5

// clean checks UTF-8 and trims surrounding white space.
func clean(s string) (string, *problem) {
	if !utf8.ValidString(s) {
		return "", syntaxf("invalid UTF-8")
	}
	t := strings.TrimFunc(s, unicode.IsSpace)
	if t == "" {
		return "", syntaxf("empty")
	}
	return t, nil
}

// scanSign reads an optional '+', '-' or '−' (U+2212).
func scanSign(s string) (neg bool, rest string) {
	switch {
	case strings.HasPrefix(s, "+"):
		return false, s[1:]
	case strings.HasPrefix(s, "-"):
		return true, s[1:]
	case strings.HasPrefix(s, "−"):
		return true, s[len("−"):]
	}
	return false, s
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// scanNumber reads [sign] digits [. digits] [e [sign] digits] from the
// start of s and returns the rest.
func scanNumber(s string) (number, string, *problem) {
	var n number
	n.neg, s = scanSign(s)
	i, digits, dot := 0, 0, false
	for i < len(s) {
		c := s[i]
		switch {
		case isDigit(c):
			digits++
			if c != '0' {
				n.nonzero = true
			}
		case c == '.' && !dot && !strings.HasPrefix(s[i:], ".."):
			dot = true
		default:
			goto done
		}
		i++
	}
done:
	if digits == 0 {
		return n, "", unexpectedOrMissing(s[i:])
	}
	n.mant, s = s[:i], s[i:]
	if len(s) >= 2 && (s[0] == 'e' || s[0] == 'E') {
		j := 1
		if s[j] == '+' || s[j] == '-' {
			j++
		}
		k := j
		for k < len(s) && isDigit(s[k]) {
			k++
		}
		if k > j { // an exponent; otherwise leave the 'e' as trailing text
			text := strings.TrimLeft(s[j:k], "0")
			if len(text) > maxExpDigits {
				if n.nonzero {
					return n, "", rangef("exponent too large")
				}
				text = ""
			}
			e := 0
			if text != "" {
				e, _ = strconv.Atoi(text)
			}
			if s[1] == '-' {
				e = -e
			}
			n.exp = e
			s = s[k:]
		}
	}
	return n, s, nil
}

// unexpectedOrMissing reports the rune at the start of rest, or a missing
// number when rest is empty.
func unexpectedOrMissing(rest string) *problem {
	if rest == "" {
		return syntaxf("missing number")
	}
	return unexpected(rest)
}

// float returns n·10^shift as the float64 nearest to the decimal value.
func (n number) float(shift int) (float64, *problem) {
	e := n.exp + shift
	f, err := strconv.ParseFloat(n.mant+"e"+strconv.Itoa(e), 64)
	if err != nil && !errors.Is(err, strconv.ErrRange) {
		return 0, syntaxf("malformed number")
	}
	if math.IsInf(f, 0) {
		return 0, rangef("too large")
	}
	if f == 0 && n.nonzero {
		return 0, rangef("too small")
	}
	if n.neg {
		f = -f
	}
	return f, nil
}

// suffixSet is the set of texts allowed after a number, each with the
// decimal exponent it applies (a prefix, optionally with a unit).
type suffixSet map[string]int

// newSuffixes builds the suffixes prefix+unit for every prefix and unit;
// with bare, a prefix alone is allowed too. The empty prefix and, when
// unitOptional, the empty unit are always included.
func newSuffixes(prefixes map[string]int, units []string, unitOptional, bare bool) suffixSet {
	set := suffixSet{}
	for _, u := range units {
		set[u] = 0
		for p, e := range prefixes {
			set[p+u] = e
		}
	}
	if unitOptional {
		set[""] = 0
	}
	if bare {
		for p, e := range prefixes {
			set[p] = e
		}
	}
	return set
}

// match returns the exponent of suffix rest (white space between the
// number and the suffix allowed), or the problem at the first character
// that no suffix explains.
func (set suffixSet) match(rest string) (int, *problem) {
	t := strings.TrimLeftFunc(rest, unicode.IsSpace)
	if e, ok := set[t]; ok && (t != "" || rest == "") {
		return e, nil
	}
	if t == "" {
		return 0, syntaxf("trailing space")
	}
	// Point at the first character no known suffix explains.
	longest := 0
	for k := range set {
		n := commonPrefix(t, k)
		if n == len(k) && n == len(t) {
			// t is a complete suffix that needs more (a prefix needing its unit).
			return 0, syntaxf("missing unit after %q", t)
		}
		longest = max(longest, n)
	}
	for longest > 0 && longest < len(t) && !utf8.RuneStart(t[longest]) {
		longest--
	}
	if longest == len(t) {
		return 0, syntaxf("missing unit after %q", t)
	}
	return 0, unexpected(t[longest:])
}

// commonPrefix returns the length in bytes of the common start of a and b.
func commonPrefix(a, b string) int {
	n := 0
	for n < len(a) && n < len(b) && a[n] == b[n] {
		n++
	}
	return n
}

// siPrefixes are the prefixes every quantity except resistance takes.
var siPrefixes = map[string]int{
	"f": -15, "p": -12, "n": -9, "u": -6, "µ": -6, "μ": -6, "m": -3, "k": 3, "M": 6, "G": 9, "T": 12,
}

// quantity describes one kind of value for the generic parser.
type quantity struct {
	name     string
	suffixes suffixSet
	signed   bool    // negative values allowed
	zero     bool    // zero allowed
	min      float64 // smallest allowed value (checked when hasMin)
	hasMin   bool
	fraction bool // a/b allowed (1/4W)
}

// parse reads s as q.
func (q quantity) parse(s string) (float64, error) {
	v, p := q.value(s)
	if p != nil {
		return 0, p.wrap(q.name, s)
	}
	return v, nil
}

func (q quantity) value(s string) (float64, *problem) {
	t, p := clean(s)
	if p != nil {
		return 0, p
	}
	n, rest, p := scanNumber(t)
	if p != nil {
		return 0, p
	}
	var v float64
	if q.fraction && strings.HasPrefix(rest, "/") && n.exp == 0 && !strings.Contains(n.mant, ".") {
		var den number
		den, rest, p = scanNumber(rest[1:])
		if p != nil {
			return 0, p
		}
		if den.neg || den.exp != 0 || strings.Contains(den.mant, ".") || strings.HasPrefix(rest, "/") {
			return 0, syntaxf("fraction must be whole numbers, like 1/4")
		}
		if !den.nonzero {
			return 0, rangef("division by zero")
		}
		e, p := q.suffixes.match(rest)
		if p != nil {
			return 0, p
		}
		num, _ := n.float(0)
		d, _ := den.float(0)
		v = num / d * math.Pow10(e)
		if math.IsInf(v, 0) {
			return 0, rangef("too large")
		}
	} else {
		e, p := q.suffixes.match(rest)
		if p != nil {
			return 0, p
		}
		if v, p = n.float(e); p != nil {
			return 0, p
		}
	}
	return q.check(v)
}

// check applies q's sign, zero and minimum rules.
func (q quantity) check(v float64) (float64, *problem) {
	switch {
	case v < 0 && !q.signed:
		return 0, rangef("must not be negative")
	case v == 0 && !q.zero:
		return 0, rangef("must not be zero")
	case q.hasMin && v < q.min:
		return 0, rangef("below %s", strconv.FormatFloat(q.min, 'g', -1, 64))
	}
	if v == 0 {
		v = 0 // no negative zero
	}
	return v, nil
}
