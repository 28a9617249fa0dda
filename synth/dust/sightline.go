package dust

import (
	"fmt"
	"math"
)

// SightLine gives the cumulative V-band extinction A_V in mag from the
// observer to a distance distancePc (pc) along one line of sight. A_V is
// non-negative and non-decreasing in distance; it is 0 at distance 0 for the
// dust-disc and table models (a Constant screen is the exception). Every
// implementation in this package panics for a negative, NaN or infinite
// distance (a caller bug) and is safe for concurrent use.
type SightLine interface {
	AV(distancePc float64) float64
}

// Constant is a foreground screen: the same A_V at every distance > 0 (for
// example the reddening of a distant cluster, when combined with Spread for
// its star-to-star scatter). A_V at distance exactly 0 is also AVMag: the
// screen is taken to lie in front of every star.
type Constant struct {
	avMag float64
}

// NewConstant returns a Constant screen of avMag magnitudes; avMag must be
// finite and ≥ 0 (ErrNegativeAV otherwise).
func NewConstant(avMag float64) (Constant, error) {
	if err := CheckAV(avMag); err != nil {
		return Constant{}, err
	}
	return Constant{avMag: avMag}, nil
}

// AV returns the screen's A_V (mag) for any distance ≥ 0; panics for a
// negative, NaN or infinite distance.
func (c Constant) AV(distancePc float64) float64 {
	checkDistance(distancePc)
	return c.avMag
}

func checkDistance(distancePc float64) {
	if !(distancePc >= 0) || math.IsInf(distancePc, 1) {
		panic(fmt.Sprintf("dust: SightLine.AV: distancePc %g pc must be finite and >= 0", distancePc))
	}
}
