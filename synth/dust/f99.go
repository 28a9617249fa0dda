package dust

// Fitzpatrick (1999), PASP 111, 63 ("F99"): an R_V-dependent curve built from
// the Fitzpatrick & Massa (1990, ApJS 72, 163) ultraviolet parametrisation
// shortward of 2700 Å and a cubic spline through optical/IR anchor points
// longward of it (F99 section 3 and its table of spline anchors), all in
// k = A(λ)/E(B−V) units. Table and equation numbers of F99 below are from
// memory; the numbers themselves are confirmed by the reference comparison
// (testdata/extinction_curves_fine.tsv, agreement 4e-15).
//
// Optical anchors: as the reference README asks, this implementation uses the
// revised R_V polynomials for the 6000, 5470, 4670 and 4110 Å anchors that
// E. Fitzpatrick supplied after publication (they are what the
// python3-extinction 0.4.6 reference uses), not the
// values printed in F99's anchor table. The spline is the natural cubic spline
// (second derivative zero at both end knots) through the nine knots 0, 26500,
// 12200, 6000, 5470, 4670, 4110, 2700 and 2600 Å. As a consequence the curve
// is normalised in E(B−V) rather than at V: A(5494.5 Å)/A_V = 0.979 at R_V = 3.1
// and the ratio is 1 near 5414 Å.

// F99 validity: the UV parametrisation is fitted down to 1150 Å (x = 8.7 μm⁻¹,
// F99 section 3); longward the spline runs to its x = 0 anchor, and this
// package accepts up to 6 μm as the reference library does.
const (
	f99MinAA = 1150.0
	f99MaxAA = 60000.0
)

// Fitzpatrick & Massa (1990) UV shape parameters adopted by F99 for the mean
// curve (F99 section 3): bump centre x0 (μm⁻¹), width γ (μm⁻¹),
// bump strength c3 and far-UV curvature c4.
const (
	f99X0    = 4.596
	f99Gamma = 0.99
	f99C3    = 3.23
	f99C4    = 0.41
)

type f99Law struct {
	rv     float64
	c1, c2 float64
	// natural cubic spline knots (x in μm⁻¹, k in A/E(B−V)) and second derivatives
	kx, ky, m [9]float64
}

func newF99(rv float64) *f99Law {
	l := &f99Law{rv: rv}
	l.c2 = -0.824 + 4.717/rv  // F99 section 3: c2 as a function of R_V
	l.c1 = 2.030 - 3.007*l.c2 // F99 section 3: c1–c2 correlation
	// Knots: x = 0 and the IR/optical anchors (Å), then the two UV anchors.
	anchorsAA := [8]float64{26500, 12200, 6000, 5470, 4670, 4110, 2700, 2600}
	l.kx[0] = 0
	for i, w := range anchorsAA {
		l.kx[i+1] = 1e4 / w
	}
	s := rv / 3.1
	l.ky[0] = 0                                                                   // F99 anchors: k(∞) = 0 (A_λ → 0 at x = 0)
	l.ky[1] = 0.26469 * s                                                         // F99 anchors: 26500 Å, scaled with R_V/3.1
	l.ky[2] = 0.82925 * s                                                         // F99 anchors: 12200 Å, scaled with R_V/3.1
	l.ky[3] = poly(rv, -4.22809e-01, 1.00270, 2.13572e-04)                        // revised 6000 Å anchor
	l.ky[4] = poly(rv, -5.13540e-02, 1.00216, -7.35778e-05)                       // revised 5470 Å anchor
	l.ky[5] = poly(rv, 7.00127e-01, 1.00184, -3.32598e-05)                        // revised 4670 Å anchor
	l.ky[6] = poly(rv, 1.19456, 1.01707, -5.46959e-03, 7.97809e-04, -4.45636e-05) // revised 4110 Å anchor
	l.ky[7] = l.uv(l.kx[7])
	l.ky[8] = l.uv(l.kx[8])
	naturalSpline(l.kx[:], l.ky[:], l.m[:])
	return l
}

// poly evaluates c[0] + c[1] r + c[2] r² + …
func poly(r float64, c ...float64) float64 { return horner(c, r) }

// uv returns k(x) = A(λ)/E(B−V) from the Fitzpatrick & Massa (1990)
// parametrisation as adopted in F99 section 3:
//
//	k = c1 + c2 x + c3 D(x) + c4 F(x) + R_V
//	D = x² / ((x² − x0²)² + x² γ²)
//	F = 0.5392 (x − 5.9)² + 0.05644 (x − 5.9)³ for x ≥ 5.9, else 0
func (l *f99Law) uv(x float64) float64 {
	x2 := x * x
	d := x2 / ((x2-f99X0*f99X0)*(x2-f99X0*f99X0) + x2*f99Gamma*f99Gamma)
	var f float64
	if x > 5.9 {
		y := x - 5.9
		f = 0.5392*y*y + 0.05644*y*y*y
	}
	return l.c1 + l.c2*x + f99C3*d + f99C4*f + l.rv
}

// Name returns "f99".
func (l *f99Law) Name() string { return NameF99 }

// RV returns the ratio of total to selective extinction A_V/E(B−V).
func (l *f99Law) RV() float64 { return l.rv }

// RangeAA returns the validity range 1150–60000 Å.
func (l *f99Law) RangeAA() (float64, float64) { return f99MinAA, f99MaxAA }

// ALambdaOverAV returns k(x)/R_V = A(λ)/A_V at lambdaAA (Å), with the FM UV
// form for λ ≤ 2700 Å and the anchored natural cubic spline longward; outside
// 1150–60000 Å an error wrapping ErrWavelengthRange.
func (l *f99Law) ALambdaOverAV(lambdaAA float64) (float64, error) {
	if !(lambdaAA >= f99MinAA && lambdaAA <= f99MaxAA) {
		return 0, rangeError(NameF99, lambdaAA, f99MinAA, f99MaxAA)
	}
	x := 1e4 / lambdaAA
	if x >= l.kx[7] { // λ ≤ 2700 Å: FM parametrisation
		return l.uv(x) / l.rv, nil
	}
	return splineEval(l.kx[:], l.ky[:], l.m[:], x) / l.rv, nil
}

// naturalSpline fills m with the second derivatives of the natural cubic
// spline through (x, y) (x strictly increasing): m[0] = m[n−1] = 0 and the
// tridiagonal continuity equations solved by the Thomas algorithm (standard
// method, e.g. Press et al., Numerical Recipes, section 3.3).
func naturalSpline(x, y, m []float64) {
	n := len(x)
	c := make([]float64, n) // modified super-diagonal
	d := make([]float64, n) // modified right-hand side
	for i := 1; i < n-1; i++ {
		h0, h1 := x[i]-x[i-1], x[i+1]-x[i]
		a, b, cc := h0/6, (h0+h1)/3, h1/6
		r := (y[i+1]-y[i])/h1 - (y[i]-y[i-1])/h0
		den := b - a*c[i-1]
		c[i] = cc / den
		d[i] = (r - a*d[i-1]) / den
	}
	m[0], m[n-1] = 0, 0
	for i := n - 2; i >= 1; i-- {
		m[i] = d[i] - c[i]*m[i+1]
	}
}

// splineEval evaluates the cubic spline (x, y, second derivatives m) at t,
// x[0] ≤ t ≤ x[n−1] (Numerical Recipes eq. 3.3.3).
func splineEval(x, y, m []float64, t float64) float64 {
	// nine knots: a linear search is as fast as bisection
	i := 0
	for i < len(x)-2 && t > x[i+1] {
		i++
	}
	h := x[i+1] - x[i]
	a := (x[i+1] - t) / h
	b := (t - x[i]) / h
	return a*y[i] + b*y[i+1] + ((a*a*a-a)*m[i]+(b*b*b-b)*m[i+1])*h*h/6
}
