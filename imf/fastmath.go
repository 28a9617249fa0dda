package imf

import "math"

// Table-driven natural logarithm and exponential for the sampling hot path
// (the quantile of every form needs one log and one exp per star). They are
// the classical table + short polynomial reductions (Tang 1989, ACM TOMS 15,
// 144 for exp; Tang 1990, ACM TOMS 16, 378 for log), with tables computed at
// start-up by the math package. Accuracy: absolute error of fastLog below
// 2.5e-16 (1 + |ln y|), relative error of fastExp below 6e-16, checked in
// fastmath_test.go against math.Log and math.Exp; both are about three times
// faster than the math package on amd64. Inputs outside the fast ranges
// fall back to the math package, so results are never clamped.

const (
	logTableBits = 7
	logTableSize = 1 << logTableBits
	expTableBits = 6
	expTableSize = 1 << expTableBits
)

var (
	logInvC [logTableSize]float64 // 1/c_i, c_i = 1 + (i + 0.5)/128
	logLogC [logTableSize]float64 // ln c_i
	expT    [expTableSize]float64 // 2^(j/64)
)

// ln 2 / 64 split into a high part with 21 trailing zero bits and a low
// part (Cody & Waite 1980 argument reduction), so n*expLn2Hi is exact for
// |n| < 2^21. ln2Hi = 0x3fe62e42fee00000 is the usual split; ln2Lo =
// ln 2 - ln2Hi was computed with Python's decimal module at 60 digits
// (ln 2 = 0.693147180559945309417232121458176568...), giving
// 1.9082149292705877e-10 (0x3dea39ef35793c76). Dividing by 64 is exact.
const (
	expLn2Hi  = 6.93147180369123816490e-01 / expTableSize
	expLn2Lo  = 1.9082149292705877e-10 / expTableSize
	expInvLn2 = expTableSize / math.Ln2
)

func init() {
	for i := 0; i < logTableSize; i++ {
		c := 1 + (float64(i)+0.5)/logTableSize
		logInvC[i] = 1 / c
		logLogC[i] = math.Log(c)
	}
	for j := 0; j < expTableSize; j++ {
		expT[j] = math.Exp2(float64(j) / expTableSize)
	}
}

// fastLog returns ln(y) for y > 0: y = 2^e f, f in [1, 2); with c the centre
// of f's 1/128 table interval and r = (f - c)/c (|r| < 1/257),
//
//	ln y = e ln 2 + ln c + log1p(r),  log1p(r) = r - r^2/2 + ... - r^8/8.
//
// Zero, negative, subnormal, infinite and NaN inputs go to math.Log.
func fastLog(y float64) float64 {
	bits := math.Float64bits(y)
	exp := int(bits>>52) - 1023
	if exp <= -1022 || exp >= 1024 || bits>>63 != 0 {
		return math.Log(y)
	}
	i := (bits >> (52 - logTableBits)) & (logTableSize - 1)
	f := math.Float64frombits(bits&(1<<52-1) | 1023<<52)
	c := 1 + (float64(i)+0.5)/logTableSize
	r := (f - c) * logInvC[i]
	// Horner form of the log1p series to r^8 (truncation < |r|^9/9 < 1e-22).
	p := r * (1 + r*(-1.0/2+r*(1.0/3+r*(-1.0/4+r*(1.0/5+r*(-1.0/6+r*(1.0/7+r*(-1.0/8))))))))
	return float64(exp)*math.Ln2 + logLogC[i] + p
}

// fastExp returns e^x: with n = round(64 x / ln 2), k = n >> 6, j = n & 63
// and r = x - n ln2/64 (|r| <= ln2/128),
//
//	e^x = 2^k 2^(j/64) e^r,  e^r = 1 + r + r^2/2 + ... + r^7/7!.
//
// |x| > 700 and NaN go to math.Exp.
func fastExp(x float64) float64 {
	if !(x > -700 && x < 700) {
		return math.Exp(x)
	}
	n := math.Round(x * expInvLn2)
	r := (x - n*expLn2Hi) - n*expLn2Lo
	ni := int64(n)
	k := ni >> expTableBits
	j := ni & (expTableSize - 1)
	// Horner form of the exponential series to r^7 (truncation < 1e-21).
	p := 1 + r*(1+r*(1.0/2+r*(1.0/6+r*(1.0/24+r*(1.0/120+r*(1.0/720+r*(1.0/5040)))))))
	return math.Float64frombits(math.Float64bits(expT[j]*p) + uint64(k)<<52)
}
