package eseries_test

import (
	"fmt"

	"biasbin/solver/eseries"
)

func Example() {
	fmt.Println(eseries.Range(eseries.E12, 3000, 7000))
	fmt.Println(eseries.Nearest(eseries.E24, 5000))
	s, _ := eseries.Of(5600)
	fmt.Println(s, eseries.Tolerance(s))
	// Output:
	// [3300 3900 4700 5600 6800]
	// 5100
	// E12 0.1
}
