package dust

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Law is an interstellar extinction curve at a fixed R_V, in the A_λ/A_V
// convention: the extinction at wavelength λ divided by the extinction in the
// V band (the laws' own normalisation, see each law's doc for how close to 1 it
// is at 5500 Å).
//
// ALambdaOverAV takes a vacuum wavelength in Å. Outside the law's validity range
// it returns an error wrapping ErrWavelengthRange; it never extrapolates.
// Implementations are safe for concurrent use (they hold only constants).
type Law interface {
	Name() string
	RV() float64
	ALambdaOverAV(lambdaAA float64) (float64, error)
}

// Ranger is implemented by every law of this package: the closed wavelength
// interval in Å on which ALambdaOverAV returns a value.
type Ranger interface {
	RangeAA() (minAA, maxAA float64)
}

// Sentinel errors that callers may test for with errors.Is.
var (
	// ErrWavelengthRange: a wavelength outside a law's validity range.
	ErrWavelengthRange = errors.New("wavelength outside the extinction law's range")
	// ErrRVRange: R_V outside MinRV..MaxRV, or not finite.
	ErrRVRange = errors.New("r_v outside the allowed range")
	// ErrUnknownLaw: a law name NewLaw does not know.
	ErrUnknownLaw = errors.New("unknown extinction law")
	// ErrNegativeAV: a negative (or NaN) A_V.
	ErrNegativeAV = errors.New("negative extinction")
)

// MinRV and MaxRV bound the ratio of total to selective extinction accepted by
// NewLaw for every law. The Cardelli, Clayton & Mathis (1989) sample spans
// roughly R_V = 2.6–5.6 (from memory) and Fitzpatrick (1999) fits its R_V
// dependence over a similar range; the interval is widened slightly, to 2.0–6.0,
// so that the common low (2.5) and high (5.0–5.5) dense-cloud values are
// accepted. Outside it NewLaw returns ErrRVRange: the curves' R_V dependence is
// an empirical fit and is not extrapolated further.
const (
	MinRV = 2.0
	MaxRV = 6.0
	// DefaultRV is the mean value for the diffuse Milky Way interstellar medium
	// (common practice; Cardelli, Clayton & Mathis 1989 adopt it as their mean).
	DefaultRV = 3.1
)

// Law names accepted by NewLaw.
const (
	NameCCM89 = "ccm89"
	NameOD94  = "od94"
	NameF99   = "f99"
)

// LawNames returns the names NewLaw accepts, in a fixed order.
func LawNames() []string { return []string{NameCCM89, NameOD94, NameF99} }

// NewLaw returns the extinction law called name ("ccm89": Cardelli, Clayton &
// Mathis 1989; "od94": O'Donnell 1994; "f99": Fitzpatrick 1999) at the given
// R_V = A_V/E(B−V). R_V must lie in [MinRV, MaxRV] (error wrapping ErrRVRange
// otherwise); an unknown name gives an error wrapping ErrUnknownLaw.
func NewLaw(name string, rv float64) (Law, error) {
	if err := checkRV(rv); err != nil {
		return nil, err
	}
	switch name {
	case NameCCM89:
		return newCCM89(rv), nil
	case NameOD94:
		return newOD94(rv), nil
	case NameF99:
		return newF99(rv), nil
	}
	return nil, fmt.Errorf("dust: law %q: %w (choose one of %s)", name, ErrUnknownLaw,
		strings.Join(LawNames(), ", "))
}

func checkRV(rv float64) error {
	if !(rv >= MinRV && rv <= MaxRV) { // also rejects NaN
		return fmt.Errorf("dust: %w: got %g, allowed [%g, %g]", ErrRVRange, rv, MinRV, MaxRV)
	}
	return nil
}

// EBV returns the colour excess E(B−V) in mag for a V-band extinction avMag and
// a ratio of total to selective extinction rv, by the definition
//
//	E(B−V) = A_V / R_V
//
// (the convention of every law here; it holds exactly only for the
// monochromatic B and V of the law, broad-band excesses of a given star differ
// slightly, see BandRatio). A negative or NaN avMag gives ErrNegativeAV, an rv
// outside [MinRV, MaxRV] gives ErrRVRange.
func EBV(avMag, rv float64) (float64, error) {
	if err := CheckAV(avMag); err != nil {
		return 0, err
	}
	if err := checkRV(rv); err != nil {
		return 0, err
	}
	return avMag / rv, nil
}

// AVFromEBV returns A_V = R_V · E(B−V) in mag, the inverse of EBV, with the
// same checks (ebvMag must be ≥ 0).
func AVFromEBV(ebvMag, rv float64) (float64, error) {
	if !(ebvMag >= 0) || math.IsInf(ebvMag, 1) {
		return 0, fmt.Errorf("dust: e(b-v) %g mag: %w (must be finite and >= 0)", ebvMag, ErrNegativeAV)
	}
	if err := checkRV(rv); err != nil {
		return 0, err
	}
	return rv * ebvMag, nil
}

// CheckAV returns an error wrapping ErrNegativeAV unless avMag is finite and
// non-negative. Extinction cannot be negative: a negative value is always an
// input error, never a "blueing".
func CheckAV(avMag float64) error {
	if !(avMag >= 0) || math.IsInf(avMag, 1) {
		return fmt.Errorf("dust: a_v %g mag: %w (must be finite and >= 0)", avMag, ErrNegativeAV)
	}
	return nil
}

// rangeError builds the error for a wavelength outside [minAA, maxAA].
func rangeError(law string, lambdaAA, minAA, maxAA float64) error {
	return fmt.Errorf("dust: %s: %w: got %g Å, allowed [%.6g, %.6g] Å", law, ErrWavelengthRange,
		lambdaAA, minAA, maxAA)
}

// PivotRatio returns A_X/A_V for a band known only by its pivot wavelength in
// Å: the law evaluated there,
//
//	A_X/A_V ≈ A(λ_p)/A_V
//
// This is the documented fallback for bands without a passband curve. It is
// exact only in the narrow-band limit; for broad bands it ignores the
// dependence on the source spectrum and on A_V. At small A_V with F99
// (R_V = 3.1) the pivot value for Gaia G (6217.6 Å) is 0.824 while the
// synthetic-photometry values are 1.024 for a 30000 K and 0.706 for a 3500 K
// blackbody; for Bessell V (5477.7 Å) 0.983 against 0.995 and 0.969.
// Errors as for law.ALambdaOverAV.
func PivotRatio(law Law, pivotAA float64) (float64, error) {
	return law.ALambdaOverAV(pivotAA)
}
