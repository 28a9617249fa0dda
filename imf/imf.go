package imf

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
)

// IMF is a normalised initial mass function: a probability density over
// initial stellar mass on the closed interval [lo, hi] (solar masses).
//
// All methods are safe for concurrent use: an IMF is immutable after
// construction, and Rand draws only from the *rand.Rand it is given.
type IMF interface {
	// Prob returns the normalised density dN/dm (Msun^-1) at massMsun; it is 0
	// outside [lo, hi] and integrates to 1 over [lo, hi].
	Prob(massMsun float64) float64
	// CDF returns the fraction of stars with mass below massMsun: 0 below lo,
	// 1 at and above hi.
	CDF(massMsun float64) float64
	// Quantile returns the mass (Msun) below which a fraction p of the stars
	// lie; it panics if p is outside [0, 1] or NaN.
	Quantile(p float64) float64
	// Mean returns the mean stellar mass (Msun) on [lo, hi].
	Mean() float64
	// Bounds returns the lower and upper mass limits (Msun).
	Bounds() (loMsun, hiMsun float64)
	// NumberFraction returns the fraction of stars with m1 <= m < m2 (the
	// interval is intersected with [lo, hi]); it panics if m1 > m2 or either
	// is NaN.
	NumberFraction(m1, m2 float64) float64
	// MassFraction returns the fraction of the total mass in stars with
	// m1 <= m < m2 (intersected with [lo, hi]); it panics like NumberFraction.
	MassFraction(m1, m2 float64) float64
	// Rand draws one mass (Msun) by evaluating Quantile at one uniform
	// variate from r (exactly one r.Float64 call per draw). It does not
	// allocate.
	Rand(r *rand.Rand) float64
	// Name returns the kind word of the mass function (see Spec.Kind).
	Name() string
}

// Kind words accepted in Spec.Kind.
const (
	KindSalpeter       = "salpeter"
	KindKroupa         = "kroupa"
	KindChabrierSingle = "chabrier_single"
	KindChabrierSystem = "chabrier_system"
	KindBrokenPowerLaw = "broken_power_law"
	KindTable          = "table"
)

// Kinds returns the accepted Spec.Kind words in a fixed order.
func Kinds() []string {
	return []string{KindSalpeter, KindKroupa, KindChabrierSingle, KindChabrierSystem, KindBrokenPowerLaw, KindTable}
}

// Default and supported mass limits (Msun).
//
// The published forms (Salpeter, Kroupa, Chabrier) default to
// [DefaultLoMsun, DefaultHiMsun] = [0.1, 100] Msun, the range most often
// quoted with these functions (common practice), and accept any limits inside
// [MinMassMsun, MaxMassMsun] = [0.01, 150] Msun. Outside that range New
// returns an error; there is no clamping. The range extends each published
// form beyond the masses its authors fitted (documented extrapolation: e.g.
// Salpeter 1955 fitted roughly 0.4–10 Msun; Kroupa 2001 and Chabrier 2003
// discuss 0.01 Msun up to the most massive stars).
//
// A broken power law accepts any limits 0 < lo < hi < +Inf (its shape is the
// user's); it defaults to the same [0.1, 100] Msun. A table defaults to its
// own first and last mass and never extrapolates beyond them.
const (
	DefaultLoMsun = 0.1
	DefaultHiMsun = 100.0
	MinMassMsun   = 0.01
	MaxMassMsun   = 150.0
)

// Spec is a declarative description of a mass function, as written in a
// scenario file or on the command line. Build the IMF with New.
type Spec struct {
	// Kind is one of "salpeter", "kroupa", "chabrier_single",
	// "chabrier_system", "broken_power_law", "table".
	Kind string
	// LoMsun and HiMsun are the mass limits in Msun; 0 selects the default
	// (see DefaultLoMsun; for "table" the table's own range).
	LoMsun, HiMsun float64
	// Breaks are the interior break masses (Msun, strictly increasing) of a
	// "broken_power_law"; Slopes are its len(Breaks)+1 exponents alpha of
	// dN/dm ∝ m^-alpha, lowest mass first. Both must be empty for other kinds.
	// Breaks outside (lo, hi) are allowed: the shape is defined on all
	// masses and then truncated to [lo, hi].
	Breaks []float64
	Slopes []float64
	// TablePath is the file of a "table" mass function (see ParseTable for
	// the format); it must be empty for other kinds.
	TablePath string
}

// ErrInvalidSpec is wrapped by every error New and the constructors return
// for a bad specification (unknown kind, bad limits, breaks or slopes).
// Test for it with errors.Is.
var ErrInvalidSpec = errors.New("invalid mass-function specification")

// ErrBadTable is wrapped by every error about the content of a tabulated
// mass function file; the message carries the file name and line.
var ErrBadTable = errors.New("invalid mass-function table")

// inputError carries a message and the sentinel it wraps.
type inputError struct {
	msg      string
	sentinel error
}

func (e *inputError) Error() string { return e.msg }
func (e *inputError) Unwrap() error { return e.sentinel }

func specErrorf(format string, a ...any) error {
	return &inputError{msg: "imf: " + fmt.Sprintf(format, a...), sentinel: ErrInvalidSpec}
}

// New builds the mass function described by spec. It returns an error
// wrapping ErrInvalidSpec (or ErrBadTable, or the file-system error, for
// tables) if the kind is unknown, a limit is not finite, not positive or
// outside the supported range, lo >= hi, or breaks/slopes are malformed.
func New(spec Spec) (IMF, error) {
	if spec.Kind != KindBrokenPowerLaw && (len(spec.Breaks) > 0 || len(spec.Slopes) > 0) {
		return nil, specErrorf("breaks_msun and slopes are only used by kind %q, not %q", KindBrokenPowerLaw, spec.Kind)
	}
	if spec.Kind != KindTable && spec.TablePath != "" {
		return nil, specErrorf("a table file (%q) is only used by kind %q, not %q", spec.TablePath, KindTable, spec.Kind)
	}
	switch spec.Kind {
	case KindSalpeter:
		return NewSalpeter(spec.LoMsun, spec.HiMsun)
	case KindKroupa:
		return NewKroupa(spec.LoMsun, spec.HiMsun)
	case KindChabrierSingle:
		return NewChabrier(ChabrierSingle, spec.LoMsun, spec.HiMsun)
	case KindChabrierSystem:
		return NewChabrier(ChabrierSystem, spec.LoMsun, spec.HiMsun)
	case KindBrokenPowerLaw:
		return NewBrokenPowerLaw(spec.Breaks, spec.Slopes, spec.LoMsun, spec.HiMsun)
	case KindTable:
		if spec.TablePath == "" {
			return nil, specErrorf("kind %q needs a table file of mass_msun, dn_dm rows", KindTable)
		}
		return LoadTable(spec.TablePath, spec.LoMsun, spec.HiMsun)
	}
	return nil, specErrorf("unknown kind %q (allowed: %s)", spec.Kind, strings.Join(Kinds(), ", "))
}

// resolveLimits applies defaults (0 means default) and checks
// 0 < lo < hi, both finite, and, if minMsun > 0, minMsun <= lo, hi <= maxMsun.
func resolveLimits(kind string, loMsun, hiMsun, defLo, defHi, minMsun, maxMsun float64) (float64, float64, error) {
	rangeName := "supported range"
	if kind == KindTable {
		rangeName = "range of the table"
	}
	if loMsun == 0 {
		loMsun = defLo
	}
	if hiMsun == 0 {
		hiMsun = defHi
	}
	for _, v := range []struct {
		name string
		val  float64
	}{{"min_mass_msun", loMsun}, {"max_mass_msun", hiMsun}} {
		if math.IsNaN(v.val) || math.IsInf(v.val, 0) || v.val <= 0 {
			return 0, 0, specErrorf("%s for %s: %g Msun is not a positive finite mass", v.name, kind, v.val)
		}
		if minMsun > 0 && (v.val < minMsun || v.val > maxMsun) {
			return 0, 0, specErrorf("%s for %s: %g Msun is outside the %s [%g, %g] Msun", v.name, kind, v.val, rangeName, minMsun, maxMsun)
		}
	}
	if loMsun >= hiMsun {
		return 0, 0, specErrorf("min_mass_msun %g Msun must be below max_mass_msun %g Msun for %s", loMsun, hiMsun, kind)
	}
	return loMsun, hiMsun, nil
}

// checkInterval panics on the caller's bugs in NumberFraction/MassFraction.
func checkInterval(m1, m2 float64) {
	if math.IsNaN(m1) || math.IsNaN(m2) || m1 > m2 {
		panic(fmt.Sprintf("imf: bad mass interval [%g, %g) (need m1 <= m2, no NaN)", m1, m2))
	}
}

// checkProb panics if p is not in [0, 1].
func checkProb(p float64) {
	if !(p >= 0 && p <= 1) {
		panic(fmt.Sprintf("imf: quantile probability %g outside [0, 1]", p))
	}
}

// ExpectedNumberAbove returns the expected number of stars with initial mass
// at or above mMsun per solar mass of stars formed with mass function f (unit
// Msun^-1), i.e.
//
//	n(>m) = [1 - CDF(m)] / <m>
//
// where <m> = f.Mean(). It is 0 for mMsun >= hi and 1/<m> for mMsun <= lo.
// It panics if mMsun is NaN.
func ExpectedNumberAbove(f IMF, mMsun float64) float64 {
	if math.IsNaN(mMsun) {
		panic("imf: ExpectedNumberAbove mass is NaN")
	}
	return (1 - f.CDF(mMsun)) / f.Mean()
}

// SampleTotalMass draws stars from f until their summed mass reaches
// totalMsun, and returns the masses (written into dst[:0], which is grown as
// needed) and their realised total (Msun).
//
// Stopping rule ("stop nearest"): stars are drawn one at a time with f.Rand;
// as soon as the running sum S reaches or exceeds totalMsun, the last star
// (mass m) is kept if that leaves the total closer to the target, i.e. if
// S - totalMsun <= totalMsun - (S - m), and dropped otherwise. Why: the
// realised total is then always within half of one stellar mass of the
// target (the smallest possible error for a prefix of the draws); "stop
// before" (always drop the crossing star) falls short by up to a whole
// stellar mass and removes massive stars preferentially, "stop after"
// (always keep it) overshoots and adds them. Whatever the rule, only the
// last star is affected, so the mass distribution of the sample is that of
// the IMF up to a correction of order 1/N for N stars; for targets of only
// a few times the upper mass limit every stopping rule distorts the
// high-mass end, and callers who need exact IMF statistics should sample by
// number. The kept stars are an unaltered prefix of the i.i.d. sequence, so
// a given seed gives the same masses for any target that stops at the same
// star. Stopping rules and their effects are compared by Haas & Anders
// (2010, A&A 512, A79; from memory).
//
// Random stream: one r.Float64 per drawn star, including a dropped last
// star. If totalMsun is smaller than half the first drawn mass the result is
// empty with total 0.
//
// SampleTotalMass panics if totalMsun is not positive and finite (a caller
// bug: validate user input first).
func SampleTotalMass(f IMF, totalMsun float64, r *rand.Rand, dst []float64) ([]float64, float64) {
	if !(totalMsun > 0) || math.IsInf(totalMsun, 1) {
		panic(fmt.Sprintf("imf: SampleTotalMass target %g Msun is not positive and finite", totalMsun))
	}
	dst = dst[:0]
	sum := 0.0
	for {
		m := f.Rand(r)
		keep, stop := StopNearest(sum, m, totalMsun)
		if keep {
			dst = append(dst, m)
			sum += m
		}
		if stop {
			return dst, sum
		}
	}
}

// StopNearest is the stopping rule of SampleTotalMass for one drawn star, for
// callers that stream their own draws (for example chunk by chunk): given the
// running sum sumMsun of the stars kept so far, the new star's massMsun and
// the target totalMsun (all Msun), it reports whether to keep the star and
// whether to stop:
//
//	sum + m <  total:                          keep, continue
//	sum + m >= total, sum + m - total <= total - sum: keep, stop
//	otherwise:                                 drop, stop
func StopNearest(sumMsun, massMsun, totalMsun float64) (keep, stop bool) {
	s := sumMsun + massMsun
	if s < totalMsun {
		return true, false
	}
	return s-totalMsun <= totalMsun-sumMsun, true // keep the crossing star if that is closer
}
