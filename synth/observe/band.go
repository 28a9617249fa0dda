package observe

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Allowed ranges of the band parameters (checked by BandSpec.Validate).
const (
	Limit5SigmaMinMag = 0.0  // brightest accepted 5σ depth, mag
	Limit5SigmaMaxMag = 35.0 // faintest accepted 5σ depth, mag
	FloorMaxMag       = 0.5  // largest accepted systematic floor, mag
	DetectionSNRMax   = 1000.0
	// DefaultDetectionSNR is the S/N threshold used when BandSpec.DetectionSNR is 0.
	DefaultDetectionSNR = 5.0
)

// DrawsPerObserve is the exact number of 64-bit values that one call of
// BandSpec.Observe takes from its random source (two calls of rand.Rand.Uint64:
// one for the flux noise, one for the completeness draw), whatever the
// magnitude, noise model, completeness model or outcome. Streams of different
// bands and stars therefore stay aligned.
const DrawsPerObserve = 2

// BandSpec is the survey description of one band: depth, error floor,
// saturation, noise model, completeness and detection threshold. Fill it, call
// Validate once, then call Observe per star. Change no field after Validate
// without calling Validate again.
type BandSpec struct {
	// Band is the band name (as known to the photometry package); not empty.
	Band string
	// Limit5SigmaMag is m5, the magnitude of a point source detected at S/N = 5
	// in the survey's exposure; allowed [0, 35] mag.
	Limit5SigmaMag float64
	// FloorMag is σ_sys, the systematic error floor (mag), added in quadrature
	// to the random error as in Ivezić et al. 2019 eq. 4 and applied to the flux
	// as a fractional error σ_sys f; allowed [0, 0.5] mag.
	FloorMag float64
	// SaturationMag: sources with true magnitude brighter (smaller) than this
	// are flagged saturated and not detected. Must be brighter than
	// Limit5SigmaMag; math.Inf(-1) means no saturation.
	SaturationMag float64
	// Noise is the random-error model.
	Noise NoiseModel
	// Completeness is the extra completeness factor; the zero value means none.
	Completeness Completeness
	// DetectionSNR is the threshold on the measured S/N = f_obs/σ_f; 0 means
	// DefaultDetectionSNR (5); allowed (0, 1000].
	DetectionSNR float64

	ready     bool    // set by a successful Validate
	f5        float64 // flux at Limit5SigmaMag, set by Validate
	threshold float64 // S/N threshold in use, set by Validate
}

// Measurement is the observed photometry of one star in one band.
//
// Flux and FluxErr are on the FluxZeroPointMag scale (nJy for AB bands). Mag is
// the magnitude of the noisy flux, NaN when Flux <= 0 (such a star is never
// detected). MagErr is the first-order error (2.5/ln 10) FluxErr/Flux of that
// magnitude (common practice), NaN when Flux <= 0.
type Measurement struct {
	Mag, MagErr, Flux, FluxErr float64
	Detected, Saturated        bool
}

// Validate checks every field against its allowed range and readies the spec
// for Observe. Error messages name the field (prefixed by the band name) and
// give the bad value with unit and the allowed range.
func (b *BandSpec) Validate() error {
	b.ready = false
	if b.Band == "" {
		return fmt.Errorf("observe: band name empty")
	}
	p := "band " + b.Band
	if !(b.Limit5SigmaMag >= Limit5SigmaMinMag && b.Limit5SigmaMag <= Limit5SigmaMaxMag) {
		return fmt.Errorf("observe: %s: limit_5sigma %v mag outside allowed range [0, 35] mag", p, b.Limit5SigmaMag)
	}
	if !(b.FloorMag >= 0 && b.FloorMag <= FloorMaxMag) {
		return fmt.Errorf("observe: %s: floor %v mag outside allowed range [0, 0.5] mag", p, b.FloorMag)
	}
	if math.IsNaN(b.SaturationMag) || math.IsInf(b.SaturationMag, 1) || b.SaturationMag >= b.Limit5SigmaMag {
		return fmt.Errorf("observe: %s: saturation %v mag not brighter than limit_5sigma %v mag (allowed: -inf or a value < %v mag)", p, b.SaturationMag, b.Limit5SigmaMag, b.Limit5SigmaMag)
	}
	if b.DetectionSNR != 0 && !(b.DetectionSNR > 0 && b.DetectionSNR <= DetectionSNRMax) {
		return fmt.Errorf("observe: %s: detection_snr %v outside allowed range (0, 1000] (0 means the default 5)", p, b.DetectionSNR)
	}
	if err := b.Noise.validate(p + ": noise"); err != nil {
		return err
	}
	if err := b.Completeness.validate(p + ": completeness"); err != nil {
		return err
	}
	b.f5 = FluxFromMag(b.Limit5SigmaMag)
	b.threshold = b.DetectionSNR
	if b.threshold == 0 {
		b.threshold = DefaultDetectionSNR
	}
	b.ready = true
	return nil
}

func (b *BandSpec) mustBeReady() {
	if !b.ready {
		panic("observe: BandSpec used before a successful Validate")
	}
}

// FluxErr returns the total flux error σ_f (FluxZeroPointMag scale) of a
// source of true magnitude trueMag:
//
//	σ_f² = σ_sys² f² + σ_rand,f²        (Ivezić et al. 2019 eq. 4, in flux)
//
// with σ_rand,f from the noise model: Ivezić et al. 2019 eq. 5 times f²,
// (0.04 − γ) f5 f + γ f5²; background-limited (f5/5)²; or the table. f5 is the
// flux at Limit5SigmaMag. trueMag = +Inf (no light) gives the error of an empty
// aperture. It panics if Validate has not succeeded (a caller bug).
func (b *BandSpec) FluxErr(trueMag float64) float64 {
	b.mustBeReady()
	return b.fluxErr(trueMag, FluxFromMag(trueMag))
}

func (b *BandSpec) fluxErr(trueMag, flux float64) float64 {
	sys := b.FloorMag * flux // σ_sys as a fractional flux error, Ivezić et al. 2019 eq. 4
	return math.Sqrt(sys*sys + b.Noise.fluxVariance(flux, trueMag, b.f5))
}

// ExpectedSNR returns the noise-free S/N = f/σ_f of a source of true magnitude
// trueMag. With FloorMag = 0 it is exactly 5 at Limit5SigmaMag for the Ivezić
// and background-limited models (by construction of eq. 5). Panics if Validate
// has not succeeded.
func (b *BandSpec) ExpectedSNR(trueMag float64) float64 {
	b.mustBeReady()
	f := FluxFromMag(trueMag)
	return f / b.fluxErr(trueMag, f)
}

// DetectionProbability returns the probability that Observe reports a source
// of true magnitude trueMag as detected:
//
//	P = 0                               if trueMag < SaturationMag
//	P = c(m) Φ((f − t σ_f) / σ_f)       otherwise
//
// with t the S/N threshold, c the completeness and Φ the standard normal CDF
// (the measured flux is Gaussian, f_obs ~ N(f, σ_f²)). It is the weight to use
// for expected (not realised) counts. Panics if Validate has not succeeded.
func (b *BandSpec) DetectionProbability(trueMag float64) float64 {
	b.mustBeReady()
	if math.IsNaN(trueMag) {
		return math.NaN()
	}
	if trueMag < b.SaturationMag {
		return 0
	}
	f := FluxFromMag(trueMag)
	s := b.fluxErr(trueMag, f)
	x := (f - b.threshold*s) / s
	return b.Completeness.At(trueMag) * 0.5 * math.Erfc(-x/math.Sqrt2) // Φ(x) = erfc(−x/√2)/2
}

// Observe simulates the measurement of a star of true magnitude trueMag (mag,
// including extinction and companion light) in this band:
//
//	f = 10^(−0.4 (m − 31.4));  σ_f from FluxErr;  f_obs = f + σ_f z,  z ~ N(0, 1)
//	Mag = 31.4 − 2.5 log10 f_obs,  MagErr = (2.5/ln 10) σ_f / f_obs   (f_obs > 0; else NaN)
//	Saturated = trueMag < SaturationMag
//	Detected  = f_obs > 0  and  f_obs/σ_f ≥ DetectionSNR  and  u < c(trueMag)  and  not Saturated
//
// The noise is Gaussian in flux with the error of the true flux (a noise model
// of the expected error, not of the measured one). It consumes exactly
// DrawsPerObserve (2) values of r.Uint64: the first gives z by the inverse
// normal CDF (math.Erfinv, Wichura 1988 AS 241) of a uniform on the open
// interval (0, 1) on a 2⁻⁵³ grid, so |z| < 8.3; the second gives u in [0, 1).
// Both are drawn even for saturated stars and for c = 1. It allocates nothing.
// trueMag = +Inf (no light) gives pure noise; NaN gives NaN fields and
// Detected = false. Panics if Validate has not succeeded (a caller bug).
func (b *BandSpec) Observe(trueMag float64, r *rand.Rand) Measurement {
	b.mustBeReady()
	u1, u2 := r.Uint64(), r.Uint64()
	f := FluxFromMag(trueMag)
	s := b.fluxErr(trueMag, f)
	fo := f + s*normalFromBits(u1)
	m := Measurement{Flux: fo, FluxErr: s, Saturated: trueMag < b.SaturationMag}
	if fo > 0 {
		m.Mag = MagFromFlux(fo)
		m.MagErr = pogson * s / fo // first-order propagation, common practice
	} else {
		m.Mag, m.MagErr = math.NaN(), math.NaN()
	}
	u := float64(u2>>11) * (1.0 / (1 << 53)) // uniform in [0, 1), as rand.Float64
	m.Detected = fo > 0 && fo >= b.threshold*s && u < b.Completeness.At(trueMag) && !m.Saturated
	return m
}

// normalFromBits turns 64 random bits into a standard normal deviate by the
// inverse CDF, z = √2 erf⁻¹(2p − 1), with p = (k + 1/2)/2⁵³ and k the top 53
// bits, so p is never 0 or 1. 2p − 1 = (2k + 1 − 2⁵³)/2⁵³ is computed exactly.
func normalFromBits(bits uint64) float64 {
	k := int64(bits >> 11)
	v := float64(2*k+1-(1<<53)) * (1.0 / (1 << 53))
	return math.Sqrt2 * math.Erfinv(v)
}
