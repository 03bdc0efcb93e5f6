package notation_test

import (
	"fmt"

	"biasbin/solver/notation"
)

func Example() {
	ohm, tol, hasTol, err := notation.ParseResistance("27KK")
	fmt.Println(ohm, tol, hasTol, err)
	fmt.Println(notation.FormatResistance(47300), notation.FormatResistanceSI(47300))
	lo, hi, at, _, _ := notation.ParseRangeAt("100..300@2mA", notation.ParseNumber)
	fmt.Println(lo, hi, notation.FormatCurrent(at))
	_, _, _, err = notation.ParseResistance("4x7")
	fmt.Println(err)
	// Output:
	// 27000 0.1 true <nil>
	// 47K3 47.3 kΩ
	// 100 300 2 mA
	// resistance "4x7": unexpected character 'x'
}
