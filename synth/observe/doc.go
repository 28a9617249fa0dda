// Package observe turns the true apparent magnitudes of stars into what a
// survey measures: a noisy flux and its error, a magnitude from that flux,
// saturation and detection flags, and a per-star decision of a detection rule
// over several bands. It knows nothing about the physics of the stars.
//
// # Fluxes
//
// Every flux is on one scale, f = 10^(−0.4 (m − 31.4)) (FluxZeroPointMag): for
// AB bands f is in nanojansky (Oke & Gunn 1983); for Vega bands f is a flux
// relative to the Vega zero point of the band on the same numerical scale, not
// a nanojansky value.
//
// # Noise
//
// Noise is Gaussian in flux: f_obs = f + σ_f z with z ~ N(0, 1), and
//
//	σ_f² = σ_sys² f² + σ_rand,f²                      Ivezić et al. 2019 eq. 4, in flux
//
// with the random part from one of three models (NoiseModel):
//
//	ivezic2019:          σ_rand,f² = (0.04 − γ) f5 f + γ f5²     eq. 5 × f², x = f5/f
//	background_limited:  σ_rand,f  = f5 / 5
//	table:               σ_rand,f  = σ(m) f, σ(m) from a user table (ErrorTable)
//
// where f5 is the flux at the 5σ limiting magnitude m5. Magnitude errors in the
// inputs (σ_sys, σ_rand, table values) are read as noise-to-signal ratios
// σ_f/f, the convention of Ivezić et al. 2019, whose eq. 5 gives σ_rand = 0.2
// at m5: so S/N = 5 at m5 exactly (without floor). The output magnitude error
// is the standard first-order propagation (2.5/ln 10) σ_f/f_obs of the measured
// flux (common practice), so it is 0.217 mag for a noise-free source at m5.
// A measured flux ≤ 0 has no magnitude: Mag and MagErr are NaN and the star is
// not detected in that band.
//
// # Saturation, completeness, detection
//
// A star with true magnitude brighter than the band's saturation magnitude is
// flagged saturated and not detected. A star is detected in a band when its
// measured S/N f_obs/σ_f reaches the threshold (default 5), a completeness draw
// passes (probability c(m) of the true magnitude: none, logistic
// c = c_max/(1 + exp((m − m50)/w)) — common practice — or a user table), and it
// is not saturated. The completeness factor multiplies the S/N selection; set
// it to none to let the S/N threshold alone define the limit. DetectionRule
// combines the per-band flags: all_of, any_of or at_least k of a band list.
// BandSpec.DetectionProbability gives the probability of the whole per-band
// selection, for expected (as opposed to realised) counts; MagAtProbability
// inverts it, and ExactFaintLimit gives the magnitude beyond which a detection
// is impossible (when one exists: a completeness table reaching 0, or an S/N
// threshold above the largest deviate Observe can draw, MaxNormalDeviate ≈ 8.29).
//
// # Randomness
//
// BandSpec.Observe takes exactly DrawsPerObserve = 2 values of r.Uint64 per
// call, whatever the input or outcome: the flux deviate (inverse normal CDF of
// a uniform on a 2⁻⁵³ grid, never 0 or 1) and the completeness uniform.
// Survey.Observe takes 2 per band, band by band. Streams of a chunk therefore
// stay aligned whatever the stars are.
//
// # Tables
//
// Error and completeness tables are text files of our own format (see
// ErrorTable and CompletenessTable): a header line naming the two columns,
// then rows of magnitude (strictly increasing) and value; '#' comments. Errors
// give file:line and wrap ErrBadTable. Outside the rows: the error table keeps
// the fractional error of the first row on the bright side and the flux error
// of the last row on the faint side; the completeness table keeps the first
// and last values. These are documented extrapolations.
//
// # References
//
//   - Ivezić, Ž., Kahn, S. M., Tyson, J. A., et al. 2019, ApJ 873, 111,
//     "LSST: From Science Drivers to Reference Design and Anticipated Data
//     Products", eqs. 4–5 and Table 2 (doi:10.3847/1538-4357/ab042c).
//   - Oke, J. B. & Gunn, J. E. 1983, ApJ 266, 713, the AB magnitude system
//     (doi:10.1086/160817).
//   - Wichura, M. J. 1988, Applied Statistics 37, 477, algorithm AS 241, the
//     inverse normal CDF behind math.Erfinv (doi:10.2307/2347330).
//
// # Incomplete
//
// Not modelled: errors correlated between bands, multi-visit co-adds, the
// eq. 6 computation of m5 from sky brightness, seeing and exposure (give m5
// directly), crowding as a function of density, astrometric errors, and a
// magnitude bound for skipping stars that can never be detected.
package observe
