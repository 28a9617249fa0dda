package dust

import "math"

// Cardelli, Clayton & Mathis (1989), ApJ 345, 245 ("CCM"): the mean R_V-dependent
// extinction law, A(λ)/A_V = a(x) + b(x)/R_V (CCM eq. 1) with x = 1/λ in μm⁻¹,
// in four pieces (eqs. 2–5). O'Donnell (1994) replaces only the optical/NIR
// polynomials; both share this file's code through ccmLaw.

// CCM's formulae span 0.3 ≤ x ≤ 10 μm⁻¹ (CCM section III; below 1250 Å,
// x > 8, the far-UV piece rests on few data and is less certain).
const (
	ccmMinX = 0.3
	ccmMaxX = 10.0
)

// ccmOpticalA/B are the coefficients c0..cn of the optical/NIR polynomials in
// y = x − 1.82, valid for 1.1 ≤ x ≤ 3.3 μm⁻¹ (CCM eqs. 3a, 3b; 5 decimals as
// printed).
var (
	ccmOpticalA = []float64{1, 0.17699, -0.50447, -0.02427, 0.72085, 0.01979, -0.77530, 0.32999}
	ccmOpticalB = []float64{0, 1.41338, 2.28305, 1.07233, -5.38434, -0.62251, 5.30260, -2.09002}
)

// ccmLaw is the CCM functional form with a choice of optical coefficients.
type ccmLaw struct {
	name     string
	rv       float64
	optA     []float64
	optB     []float64
	invRV    float64
	minAA    float64
	maxAA    float64
	citation string
}

func newCCM89(rv float64) *ccmLaw {
	return &ccmLaw{name: NameCCM89, rv: rv, invRV: 1 / rv, optA: ccmOpticalA, optB: ccmOpticalB,
		minAA: 1e4 / ccmMaxX, maxAA: 1e4 / ccmMinX,
		citation: "Cardelli, Clayton & Mathis 1989, ApJ 345, 245"}
}

// Name returns the law's name as accepted by NewLaw.
func (l *ccmLaw) Name() string { return l.name }

// RV returns the ratio of total to selective extinction A_V/E(B−V).
func (l *ccmLaw) RV() float64 { return l.rv }

// RangeAA returns the validity range 1000–33333.3 Å (0.3 ≤ x ≤ 10 μm⁻¹).
func (l *ccmLaw) RangeAA() (float64, float64) { return l.minAA, l.maxAA }

// ALambdaOverAV returns A(λ)/A_V = a(x) + b(x)/R_V at lambdaAA (Å, vacuum),
// CCM eq. 1 with the pieces of eqs. 2–5; outside 1000–33333.3 Å an error
// wrapping ErrWavelengthRange.
func (l *ccmLaw) ALambdaOverAV(lambdaAA float64) (float64, error) {
	if !(lambdaAA >= l.minAA && lambdaAA <= l.maxAA) {
		return 0, rangeError(l.name, lambdaAA, l.minAA, l.maxAA)
	}
	a, b := ccmAB(1e4/lambdaAA, l.optA, l.optB)
	return a + b*l.invRV, nil // CCM eq. 1
}

// ccmAB returns CCM's a(x), b(x) for x in [0.3, 10] μm⁻¹ (caller checks).
// CCM gives each piece as a closed interval, but the pieces do not join
// exactly (A/A_V jumps by about 0.01 at x = 3.3 for R_V = 3.1); a boundary
// point x = 1.1, 3.3 or 8 is given to the shorter-wavelength piece, as the
// python3-extinction reference does, so the two agree at the boundaries too.
func ccmAB(x float64, optA, optB []float64) (a, b float64) {
	switch {
	case x < 1.1: // infrared, CCM eqs. 2a, 2b
		p := math.Pow(x, 1.61)
		return 0.574 * p, -0.527 * p
	case x < 3.3: // optical / NIR, CCM eqs. 3a, 3b (or O'Donnell 1994 eq. 2)
		y := x - 1.82
		return horner(optA, y), horner(optB, y)
	case x < 8: // ultraviolet, CCM eqs. 4a, 4b
		var fa, fb float64
		if x >= 5.9 { // CCM eqs. 4c, 4d
			d := x - 5.9
			fa = -0.04473*d*d - 0.009779*d*d*d
			fb = 0.2130*d*d + 0.1207*d*d*d
		}
		a = 1.752 - 0.316*x - 0.104/((x-4.67)*(x-4.67)+0.341) + fa
		b = -3.090 + 1.825*x + 1.206/((x-4.62)*(x-4.62)+0.263) + fb
		return a, b
	default: // far ultraviolet 8 ≤ x ≤ 10, CCM eqs. 5a, 5b
		d := x - 8
		a = -1.073 - 0.628*d + 0.137*d*d - 0.070*d*d*d
		b = 13.670 + 4.257*d - 0.420*d*d + 0.374*d*d*d
		return a, b
	}
}

// horner evaluates c[0] + c[1] y + … + c[n] yⁿ.
func horner(c []float64, y float64) float64 {
	s := 0.0
	for i := len(c) - 1; i >= 0; i-- {
		s = s*y + c[i]
	}
	return s
}
