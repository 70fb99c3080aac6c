package fluid

import (
	"math"

	"fogbench/calc/phys"
)

// gasConstant is R in J/(mol K) (CODATA 2018, via calc/phys).
const gasConstant = phys.GasConstant

func log10(x float64) float64 { return math.Log10(x) }
