package notation

// The quantities other than resistance and tolerance. Each parser accepts
// a number, optional white space, an optional SI prefix and an optional
// unit symbol; a bare number is in the base unit.

var (
	voltage = quantity{
		name:     "voltage",
		suffixes: newSuffixes(siPrefixes, []string{"V", "v"}, true, true),
		signed:   true, zero: true,
	}
	current = quantity{
		name:     "current",
		suffixes: newSuffixes(siPrefixes, []string{"A"}, true, true),
		zero:     true,
	}
	power = quantity{
		name:     "power",
		suffixes: newSuffixes(siPrefixes, []string{"W"}, true, true),
		fraction: true,
	}
	temperature = quantity{
		name:     "temperature",
		suffixes: newSuffixes(nil, []string{"C", "°C", "℃", "°", "degC"}, true, false),
		signed:   true, zero: true,
		min: -273.15, hasMin: true,
	}
	thermalResistance = quantity{
		name:     "thermal resistance",
		suffixes: newSuffixes(nil, []string{"K/W", "°C/W", "C/W", "℃/W"}, true, false),
	}
	tcr = quantity{
		name:     "temperature coefficient",
		suffixes: newSuffixes(nil, []string{"ppm", "ppm/K", "ppm/°C", "ppm/C", "ppm/℃"}, true, false),
		signed:   true, zero: true,
	}
	plain = quantity{
		name:     "number",
		suffixes: suffixSet{"": 0},
		signed:   true, zero: true,
	}
)

// ParseVoltage reads a voltage in volts: "12V", "-12 V", "0.65V", "650mV",
// "12". Negative values (signed rails) are allowed.
func ParseVoltage(s string) (float64, error) { return voltage.parse(s) }

// ParseCurrent reads a current magnitude in amperes: "1mA", "2.5 mA",
// "100uA", "100µA", "0.001". Negative values are rejected (currents are
// magnitudes in biasbin); zero is allowed (no leakage).
func ParseCurrent(s string) (float64, error) { return current.parse(s) }

// ParsePower reads a power rating in watts: "0.25W", "250mW", "1/4W",
// "1/2 W", "2W", "0.5". Zero and negative values are rejected: a rating of
// 0 W means nothing.
func ParsePower(s string) (float64, error) { return power.parse(s) }

// ParseTemperature reads a temperature in degrees Celsius: "25", "25C",
// "25 °C", "-40°C". Values below −273.15 °C are rejected. Kelvin is not
// accepted (K reads as kilo elsewhere); convert first.
func ParseTemperature(s string) (float64, error) { return temperature.parse(s) }

// ParseThermalResistance reads a thermal resistance in K/W: "200K/W",
// "200 °C/W", "200". Zero and negative values are rejected.
func ParseThermalResistance(s string) (float64, error) { return thermalResistance.parse(s) }

// ParseTCR reads a temperature coefficient of resistance in ppm/K:
// "100ppm", "±50 ppm/K", "-200 ppm/°C", "100". A leading ± gives the
// magnitude (±50 ppm/K reads as 50).
func ParseTCR(s string) (float64, error) {
	t, p := clean(s)
	if p != nil {
		return 0, p.wrap(tcr.name, s)
	}
	if t, _ = cutPlusMinus(t); t == "" {
		return 0, syntaxf("missing number").wrap(tcr.name, s)
	}
	v, p := tcr.value(t)
	if p != nil {
		return 0, p.wrap(tcr.name, s)
	}
	return v, nil
}

// ParseNumber reads a plain number without unit or prefix, such as an hFE:
// "100", "2.5", "1e3", "-3". NaN and Inf are rejected.
func ParseNumber(s string) (float64, error) { return plain.parse(s) }
