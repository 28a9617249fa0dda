package dust

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
)

// Spread kinds accepted by NewSpread.
const (
	// SpreadLognormal: A = Ā exp(σ Z − σ²/2), Z ~ N(0, 1); σ is the standard
	// deviation of ln A (dimensionless). The mean is exactly Ā, A > 0 whenever
	// Ā > 0, and the scatter is proportional to Ā (patchy dust; common practice
	// for differential reddening).
	SpreadLognormal = "lognormal"
	// SpreadGaussian: A = Ā + σ Z truncated at zero (a draw below 0 is
	// redrawn); σ in mag. For Ā ≫ σ the mean is Ā; for Ā ≲ 2σ the truncation
	// raises the mean above Ā (for Ā = 0 the draw is half-normal, mean σ√(2/π)).
	SpreadGaussian = "gaussian"
)

// ErrSpread marks an invalid spread specification.
var ErrSpread = errors.New("invalid extinction spread")

// MaxLognormalSigma bounds σ of ln A for SpreadLognormal: 2 (a factor e² ≈ 7.4
// at one σ) is already far wider than any observed differential reddening,
// and larger values make the distribution's mean dominated by rare draws.
const MaxLognormalSigma = 2.0

// Spread draws star-to-star (differential) scatter of A_V about a sight-line
// value: each star behind the same column gets its own A_V. The zero value is
// not usable; build with NewSpread.
type Spread struct {
	kind  string
	sigma float64
}

// NewSpread returns a spread of the given kind (SpreadLognormal or
// SpreadGaussian) and width sigma (σ of ln A for lognormal, 0 ≤ σ ≤
// MaxLognormalSigma; σ in mag for gaussian, finite ≥ 0). σ = 0 is allowed and
// returns the sight-line value unchanged (while consuming the same draws, so
// random streams do not shift when σ changes). Errors wrap ErrSpread.
func NewSpread(kind string, sigma float64) (Spread, error) {
	switch kind {
	case SpreadLognormal:
		if !(sigma >= 0 && sigma <= MaxLognormalSigma) {
			return Spread{}, fmt.Errorf("dust: spread sigma %g (of ln A_V): %w (must be in [0, %g])", sigma, ErrSpread, MaxLognormalSigma)
		}
	case SpreadGaussian:
		if !(sigma >= 0) || math.IsInf(sigma, 1) {
			return Spread{}, fmt.Errorf("dust: spread sigma %g mag: %w (must be finite and >= 0)", sigma, ErrSpread)
		}
	default:
		return Spread{}, fmt.Errorf("dust: spread kind %q: %w (choose %s or %s)", kind, ErrSpread, SpreadLognormal, SpreadGaussian)
	}
	return Spread{kind: kind, sigma: sigma}, nil
}

// Kind returns the spread kind; Sigma its width (see NewSpread for units).
func (s Spread) Kind() string { return s.kind }

// Sigma returns σ (of ln A_V for lognormal, mag for gaussian).
func (s Spread) Sigma() float64 { return s.sigma }

// Draw returns one star's A_V (mag) for a sight-line value avMag (mag, the
// mean Ā; see the kinds for the formulas). Draws: lognormal exactly one
// r.NormFloat64; gaussian one NormFloat64 per attempt, at most 2 on average
// (acceptance ≥ 1/2 because Ā ≥ 0). Panics if avMag is negative, NaN or
// infinite, or if s is the zero Spread (caller bugs). No allocation.
func (s Spread) Draw(avMag float64, r *rand.Rand) float64 {
	if !(avMag >= 0) || math.IsInf(avMag, 1) {
		panic(fmt.Sprintf("dust: Spread.Draw: avMag %g mag must be finite and >= 0", avMag))
	}
	switch s.kind {
	case SpreadLognormal:
		z := r.NormFloat64()
		return avMag * math.Exp(s.sigma*z-0.5*s.sigma*s.sigma)
	case SpreadGaussian:
		for {
			a := avMag + s.sigma*r.NormFloat64()
			if a >= 0 {
				return a
			}
		}
	}
	panic("dust: Spread.Draw on a zero Spread (build it with NewSpread)")
}
