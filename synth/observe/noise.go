package observe

import (
	"fmt"
	"math"
)

// NoiseKind names a photometric noise model. The words are the values used in
// scenario files.
type NoiseKind string

// Noise model kinds.
const (
	// NoiseIvezic2019 is the single-visit point-source error model of Ivezić et
	// al. 2019 (ApJ 873, 111, eqs. 4–5) derived from the 5σ depth, with the band
	// parameter γ (NoiseModel.Gamma).
	NoiseIvezic2019 NoiseKind = "ivezic2019"
	// NoiseBackgroundLimited is a purely sky-limited model: the flux error is the
	// same for every source, σ_f = f5/5, where f5 is the flux at the 5σ depth.
	NoiseBackgroundLimited NoiseKind = "background_limited"
	// NoiseFromTable takes the random error from a user table of magnitude error vs
	// magnitude (NoiseModel.Table, see ParseErrorTable).
	NoiseFromTable NoiseKind = "table"
)

// NoiseKinds lists the accepted noise model words in a fixed order.
func NoiseKinds() []NoiseKind {
	return []NoiseKind{NoiseIvezic2019, NoiseBackgroundLimited, NoiseFromTable}
}

// ParseNoiseKind returns the NoiseKind named by word, or an error listing the
// accepted words.
func ParseNoiseKind(word string) (NoiseKind, error) {
	for _, k := range NoiseKinds() {
		if string(k) == word {
			return k, nil
		}
	}
	return "", fmt.Errorf("observe: noise kind %q unknown (allowed: ivezic2019, background_limited, table)", word)
}

// Allowed range of the Ivezić et al. (2019) γ parameter. The paper's Table 2
// gives 0.037–0.040 for its six bands; γ must stay in (0, 0.04] so that both
// terms of eq. 5 are non-negative (γ = 0.04 is the purely background-limited
// case, γ → 0 would give zero error for a source of zero flux).
const (
	GammaMin = 0.0  // exclusive
	GammaMax = 0.04 // inclusive
)

// NoiseModel describes the random part of the photometric error of one band.
// The systematic floor (BandSpec.FloorMag) is added to it by BandSpec.
//
// All three kinds follow the convention of Ivezić et al. 2019 (eq. 5, σ_rand =
// 0.2 mag at the 5σ depth): a magnitude error σ is read as the noise-to-signal
// ratio of the flux, σ_f / f = σ, so S/N = 5 at m5 holds exactly.
type NoiseModel struct {
	// Kind selects the model; it must be one of NoiseKinds().
	Kind NoiseKind
	// Gamma is the γ parameter of Ivezić et al. 2019 eq. 5 (dimensionless), used
	// by NoiseIvezic2019 only; allowed (0, 0.04]. Table 2 of the paper gives
	// 0.038 for u and 0.039 for g, r, i, z, y.
	Gamma float64
	// Table is the error table used by NoiseFromTable only.
	Table *ErrorTable
}

// IvezicNoise returns the Ivezić et al. (2019) noise model with parameter gamma
// (dimensionless, allowed (0, 0.04]; checked by BandSpec.Validate).
func IvezicNoise(gamma float64) NoiseModel {
	return NoiseModel{Kind: NoiseIvezic2019, Gamma: gamma}
}

// BackgroundLimitedNoise returns the sky-limited model σ_f = f5/5.
func BackgroundLimitedNoise() NoiseModel {
	return NoiseModel{Kind: NoiseBackgroundLimited}
}

// TableNoise returns the noise model read from an error table.
func TableNoise(t *ErrorTable) NoiseModel {
	return NoiseModel{Kind: NoiseFromTable, Table: t}
}

// validate checks the model; field is the name used in messages.
func (n *NoiseModel) validate(field string) error {
	switch n.Kind {
	case NoiseIvezic2019:
		if !(n.Gamma > GammaMin && n.Gamma <= GammaMax) {
			return fmt.Errorf("observe: %s.gamma %v outside allowed range (0, 0.04] (dimensionless, Ivezić et al. 2019 eq. 5)", field, n.Gamma)
		}
	case NoiseBackgroundLimited:
	case NoiseFromTable:
		if n.Table == nil || len(n.Table.magAB) < 2 {
			return fmt.Errorf("observe: %s.table missing (noise kind table needs a table loaded with LoadErrorTable or ParseErrorTable)", field)
		}
	case "":
		return fmt.Errorf("observe: %s.kind missing (allowed: ivezic2019, background_limited, table)", field)
	default:
		return fmt.Errorf("observe: %s.kind %q unknown (allowed: ivezic2019, background_limited, table)", field, string(n.Kind))
	}
	return nil
}

// IvezicSigmaRand returns the random photometric error σ_rand (mag) of a point
// source of magnitude mag in a single visit of 5σ depth limit5SigmaMag, from
// Ivezić et al. 2019 (ApJ 873, 111), eq. 5:
//
//	σ_rand² = (0.04 − γ) x + γ x²,   x = 10^(0.4 (m − m5))
//
// It is 0.2 mag at m = m5 for any γ. gamma must be in (0, 0.04] (the function
// does not check; BandSpec.Validate does). mag = +Inf gives +Inf.
func IvezicSigmaRand(mag, limit5SigmaMag, gamma float64) float64 {
	x := math.Exp(0.4 * math.Ln10 * (mag - limit5SigmaMag)) // x = 10^(0.4 (m − m5)), Ivezić et al. 2019 eq. 5
	return math.Sqrt((0.04-gamma)*x + gamma*x*x)            // Ivezić et al. 2019 eq. 5
}

// fluxVariance returns σ_f² of the random part for a source of true flux f
// (FluxZeroPointMag scale) and true magnitude mag, in a band of 5σ flux f5.
func (n *NoiseModel) fluxVariance(flux, mag, f5 float64) float64 {
	switch n.Kind {
	case NoiseIvezic2019:
		// Ivezić et al. 2019 eq. 5 multiplied by f² with x = f5/f, so that it stays
		// finite at f = 0: σ_f² = (0.04 − γ) f5 f + γ f5².
		return (0.04-n.Gamma)*f5*flux + n.Gamma*f5*f5
	case NoiseBackgroundLimited:
		s := f5 / 5 // S/N = 5 at f = f5 with a flux-independent error
		return s * s
	case NoiseFromTable:
		s := n.Table.fluxErr(mag, flux)
		return s * s
	}
	panic("observe: NoiseModel used without BandSpec.Validate") // unreachable after Validate
}
