package notation

import (
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// rkmMultipliers are the IEC 60062 multiplier letters that stand for the
// decimal point, with their decimal exponents. Lower-case r and k are
// accepted as the trade writes them (4k7); lower-case m is not (see doc.go).
var rkmMultipliers = map[byte]int{
	'L': -3, 'R': 0, 'K': 3, 'M': 6, 'G': 9, 'T': 12,
	'r': 0, 'k': 3,
}

// Resistance suffixes in SI form. A bare prefix may only be an upper-case
// or unambiguous one; milli and micro need the unit symbol.
var (
	ohmUnits         = []string{"Ω", "Ω", "ohm", "ohms", "Ohm", "Ohms", "OHM", "OHMS"}
	ohmBarePrefixes  = map[string]int{"k": 3, "K": 3, "M": 6, "meg": 6, "Meg": 6, "MEG": 6, "G": 9, "T": 12}
	ohmUnitPrefixes  = map[string]int{"f": -15, "p": -12, "n": -9, "µ": -6, "μ": -6, "u": -6, "m": -3, "k": 3, "K": 3, "M": 6, "meg": 6, "Meg": 6, "MEG": 6, "G": 9, "T": 12}
	resistanceSuffix = func() suffixSet {
		set := newSuffixes(ohmUnitPrefixes, ohmUnits, true, false)
		for p, e := range ohmBarePrefixes {
			set[p] = e
		}
		return set
	}()
)

// ParseResistance reads a resistance in ohms with an optional tolerance.
//
// Accepted forms:
//   - IEC 60062 letter-and-digit code: 4K7, R47, 470R, 2M2, 1K0, 47K3, 4L7
//     (4.7 mΩ), 4k7, with an optional tolerance letter: 1R8J (1.8 Ω ±5 %),
//     27KK (27 kΩ ±10 %).
//   - SI: 4.7k, 4.7 kΩ, 4.7kohm, 4700, 4.7e3, 470 Ω, 1.5M, 1meg, 220mΩ.
//   - Either, followed by a tolerance: "4K7 ±1 %", "4.7k 5%", "4K7 J".
//
// tol is a fraction and hasTol reports whether a tolerance was given.
// Zero is allowed (a zero-ohm link); negative values are rejected, and so
// is a bare "m" ("220m": milli or mega?).
func ParseResistance(s string) (ohm, tol float64, hasTol bool, err error) {
	ohm, tol, hasTol, p := resistanceValue(s)
	if p != nil {
		return 0, 0, false, p.wrap("resistance", s)
	}
	return ohm, tol, hasTol, nil
}

// ParseOhms reads a resistance without a tolerance (for ranges and
// settings); it takes the same forms as ParseResistance and rejects a
// tolerance.
func ParseOhms(s string) (float64, error) {
	ohm, _, hasTol, p := resistanceValue(s)
	if p == nil && hasTol {
		p = syntaxf("a tolerance is not expected here")
	}
	if p != nil {
		return 0, p.wrap("resistance", s)
	}
	return ohm, nil
}

func resistanceValue(s string) (ohm, tol float64, hasTol bool, p *problem) {
	t, p := clean(s)
	if p != nil {
		return 0, 0, false, p
	}
	val, tolText := splitTolerance(t)
	if tolText != "" {
		if tol, p = toleranceValue(tolText); p != nil {
			p.msg = "tolerance: " + p.msg
			return 0, 0, false, p
		}
		hasTol = true
	}
	neg, body := scanSign(val)
	if body == "" {
		return 0, 0, false, syntaxf("missing number")
	}
	if neg2, _ := scanSign(body); neg2 || body[0] == '+' {
		return 0, 0, false, unexpected(body)
	}
	if v, letterTol, ok, p := rkmValue(body); ok {
		if p != nil {
			return 0, 0, false, p
		}
		if letterTol >= 0 {
			if hasTol {
				return 0, 0, false, syntaxf("two tolerances")
			}
			tol, hasTol = letterTol, true
		}
		ohm = v
	} else {
		if ohm, p = siResistance(body); p != nil {
			return 0, 0, false, p
		}
	}
	if neg {
		return 0, 0, false, rangef("must not be negative")
	}
	return ohm, tol, hasTol, nil
}

// splitTolerance separates a trailing tolerance written after the value
// ("4K7 ±1 %", "4.7kΩ±1%", "4.7k 5%", "4K7 J"). The tolerance letter glued
// to a code (1R8J) is left to rkmValue.
func splitTolerance(t string) (val, tolText string) {
	best := -1
	for _, pm := range []string{"±", "+/-", "+-"} {
		if i := strings.Index(t, pm); i > 0 && (best < 0 || i < best) {
			best = i
		}
	}
	if best > 0 {
		return strings.TrimRightFunc(t[:best], unicode.IsSpace), t[best:]
	}
	if j := strings.LastIndexFunc(t, unicode.IsSpace); j > 0 {
		_, size := utf8.DecodeRuneInString(t[j:])
		val, last := strings.TrimRightFunc(t[:j], unicode.IsSpace), t[j+size:]
		if strings.HasSuffix(last, "%") {
			return val, last
		}
		// A lone letter is a tolerance only after a complete code: "4K7 J"
		// is 4.7 kΩ ±5 %, but "4.7 K" is 4.7 kΩ.
		if _, isLetter := letterTolerance(last); isLetter {
			if _, lt, ok, p := rkmValue(val); ok && p == nil && lt < 0 {
				return val, last
			}
		}
	}
	return t, ""
}

// rkmValue reads an IEC 60062 letter-and-digit code: digits, one
// multiplier letter, digits, and an optional tolerance letter. ok is false
// when t is not shaped like a code. letterTol is -1 without a tolerance
// letter.
func rkmValue(t string) (ohm, letterTol float64, ok bool, p *problem) {
	i := 0
	for i < len(t) && isDigit(t[i]) {
		i++
	}
	if i == len(t) {
		return 0, -1, false, nil
	}
	exp, isMult := rkmMultipliers[t[i]]
	if !isMult {
		return 0, -1, false, nil
	}
	intPart := t[:i]
	j := i + 1
	for j < len(t) && isDigit(t[j]) {
		j++
	}
	frac := t[i+1 : j]
	letterTol = -1
	rest := t[j:]
	if rest != "" {
		lt, isTol := letterTolerance(rest[:1])
		switch {
		case isTol && len(rest) == 1:
			letterTol = lt
		case frac == "":
			return 0, -1, false, nil // maybe SI: 47k, 1Meg, 470 Ω
		case isTol:
			// Digits after the letter make it a code; point at the junk.
			return 0, -1, true, unexpected(rest[1:])
		default:
			return 0, -1, true, unexpected(rest)
		}
	}
	if intPart == "" && frac == "" {
		return 0, -1, false, nil
	}
	if intPart == "" {
		intPart = "0"
	}
	n := number{mant: intPart + "." + frac, nonzero: strings.Trim(intPart+frac, "0") != ""}
	v, p := n.float(exp)
	return v, letterTol, true, p
}

// siResistance reads a resistance in SI form (sign already removed).
func siResistance(t string) (float64, *problem) {
	n, rest, p := scanNumber(t)
	if p != nil {
		return 0, p
	}
	e, p := resistanceSuffix.match(rest)
	if p != nil {
		r := strings.TrimLeftFunc(rest, unicode.IsSpace)
		if strings.HasPrefix(r, "m") && !strings.HasPrefix(r, "meg") && !startsWithAny(r[1:], ohmUnits) {
			return 0, syntaxf("ambiguous 'm' (milli or mega?): write mΩ for milliohm, M for megohm")
		}
		return 0, p
	}
	return n.float(e)
}

// startsWithAny reports whether s starts with one of prefixes.
func startsWithAny(s string, prefixes []string) bool {
	for _, p := range prefixes {
		if strings.HasPrefix(s, p) {
			return true
		}
	}
	return false
}

// rkmLetters maps a multiplier exponent to its IEC 60062 letter.
var rkmLetters = map[int]string{-3: "L", 0: "R", 3: "K", 6: "M", 9: "G", 12: "T"}

// FormatResistance writes ohm in the IEC 60062 letter-and-digit code with
// at most three significant digits and at least two: 4700 → "4K7",
// 470 → "470R", 0.47 → "R47", 1000 → "1K0", 47300 → "47K3", 1e6 → "1M0",
// 0.1 → "R10", 0.047 → "R047", 0.0047 → "4L7", 0 → "0R". Values below 1 mΩ
// start with L ("L47" is 0.47 mΩ). ParseResistance reads every result back
// to ohm rounded to three significant digits. A negative or non-finite ohm,
// which no part has, is written as "?" followed by the number.
func FormatResistance(ohm float64) string {
	if ohm == 0 {
		return "0R"
	}
	if !(ohm > 0) || math.IsInf(ohm, 1) {
		return "?" + strconv.FormatFloat(ohm, 'g', -1, 64)
	}
	digits, e := sigDigits(ohm)
	return placeLetter(digits, e)
}

// FormatResistanceExact writes ohm in the letter-and-digit code with as
// many significant digits as it takes to read back to ohm rounded to 12
// significant digits (the precision the stock keeps), and at least two:
// 1001 → "1K001" where FormatResistance writes "1K0", so two stock lines
// of different values never print alike. Values of three significant
// digits or fewer print as FormatResistance prints them.
func FormatResistanceExact(ohm float64) string {
	if !(ohm > 0) || math.IsInf(ohm, 1) {
		return FormatResistance(ohm)
	}
	s := strconv.FormatFloat(ohm, 'e', 11, 64) // d.ddddddddddde±XX
	mant, exp, _ := strings.Cut(s, "e")
	digits := strings.TrimRight(strings.Replace(mant, ".", "", 1), "0")
	if len(digits) <= 3 {
		return FormatResistance(ohm)
	}
	e, _ := strconv.Atoi(exp)
	return placeLetter(digits, e)
}

// placeLetter writes significant digits whose first has decimal exponent
// e with the IEC 60062 letter in place of the decimal point.
func placeLetter(digits string, e int) string {
	switch {
	case e == -1 || e == -2: // 0.01 Ω to 1 Ω: R47, R047
		return "R" + strings.Repeat("0", -e-1) + digits
	case e < -3: // below 1 mΩ: L47 = 0.47 mΩ
		return "L" + strings.Repeat("0", -e-4) + digits
	}
	m := floorDiv(e, 3) * 3
	if m > 12 {
		m = 12
	}
	whole := e - m + 1 // digits before the letter
	for len(digits) < whole {
		digits += "0"
	}
	return digits[:whole] + rkmLetters[m] + digits[whole:]
}

// sigDigits rounds v > 0 to three significant digits and returns them with
// trailing zeros removed (but at least two digits: "47", "473", "10") and
// the decimal exponent of the first digit (4700 → "47", 3).
func sigDigits(v float64) (string, int) {
	s := strconv.FormatFloat(v, 'e', 2, 64) // d.dde±XX
	digits := s[:1] + s[2:4]
	e, _ := strconv.Atoi(s[5:])
	for len(digits) > 2 && digits[len(digits)-1] == '0' {
		digits = digits[:len(digits)-1]
	}
	return digits, e
}

// floorDiv is a/b rounded towards minus infinity (b > 0).
func floorDiv(a, b int) int {
	q := a / b
	if a%b != 0 && a < 0 {
		q--
	}
	return q
}

// FormatResistanceCode writes ohm and tol as a part marking: the
// letter-and-digit code with the IEC 60062 tolerance letter appended when
// one exists (4700, 0.05 → "4K7J"; 27000, 0.10 → "27KK"), otherwise the
// code, a space and the percentage ("4K7 ±3 %").
func FormatResistanceCode(ohm, tol float64) string {
	code := FormatResistance(ohm)
	if l, ok := ToleranceLetter(tol); ok {
		return code + l
	}
	return code + " " + FormatTolerance(tol)
}

// FormatResistanceSI writes ohm for screens in SI form with three
// significant digits: 4700 → "4.7 kΩ", 0.47 → "470 mΩ".
func FormatResistanceSI(ohm float64) string { return FormatSI(ohm, "Ω") }
