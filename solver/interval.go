package solver

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// ClopperPearson95 returns the Clopper–Pearson exact two-sided 95 %
// confidence interval of a binomial proportion with x successes in n
// trials (Clopper & Pearson, "The use of confidence or fiducial limits
// illustrated in the case of the binomial", Biometrika 26, 1934;
// REFERENCE.md §14):
//
//	low  = Beta⁻¹(0.025; x, n−x+1)   (0 at x = 0)
//	high = Beta⁻¹(0.975; x+1, n−x)   (1 at x = n)
//
// At x = n the lower limit is 0.025^(1/n), at x = 0 the upper limit is
// 1 − 0.025^(1/n): the interval never collapses to a point. n < 1 gives
// the whole [0, 1].
func ClopperPearson95(x, n int) (low, high float64) {
	const alpha = 0.05
	if n < 1 {
		return 0, 1
	}
	x = min(max(x, 0), n)
	fx, fn := float64(x), float64(n)
	switch x {
	case 0:
		low = 0
	case n:
		low = math.Pow(alpha/2, 1/fn)
	default:
		low = distuv.Beta{Alpha: fx, Beta: fn - fx + 1}.Quantile(alpha / 2)
	}
	switch x {
	case n:
		high = 1
	case 0:
		high = 1 - math.Pow(alpha/2, 1/fn)
	default:
		high = distuv.Beta{Alpha: fx + 1, Beta: fn - fx}.Quantile(1 - alpha/2)
	}
	return low, high
}
