package solver

// TEMPORARY: keeps gonum in go.mod until the solver imports it for real.
import (
	_ "gonum.org/v1/gonum/mat"
	_ "gonum.org/v1/gonum/stat/distuv"
)
