package stageflags

import (
	"strings"

	"biasbin/picker"
	"biasbin/solver/notation"
)

// WindowBand reads one band of a yield window as check and pick take it:
// "10%" (±10 % around the design point, picker.WindowRule) or an absolute
// "MIN..MAX" read with parse. flag names the flag in errors.
func WindowBand(flag, text string, parse notation.Parser) (picker.Band, error) {
	text = strings.TrimSpace(text)
	if strings.HasSuffix(text, "%") {
		f, err := notation.ParseTolerance(text)
		if err != nil {
			return picker.Band{}, Usage(flag, err)
		}
		if f <= 0 || f >= 1 {
			return picker.Band{}, Usagef(flag, "%s: want a share between 0 and 100 %%, e.g. 10%%", text)
		}
		return picker.Band{Relative: true, Frac: f}, nil
	}
	if !strings.Contains(text, "..") {
		return picker.Band{}, Usagef(flag, "%q: want a percentage like 10%% or a range MIN..MAX", text)
	}
	lo, hi, err := notation.ParseRange(text, parse)
	if err != nil {
		return picker.Band{}, Usage(flag, err)
	}
	if lo < 0 || hi <= lo {
		return picker.Band{}, Usagef(flag, "%s: the band is empty or negative; give MIN..MAX magnitudes with MIN below MAX", text)
	}
	return picker.Band{Min: lo, Max: hi}, nil
}
