// Package synth is the pipeline of starmock: it reads and validates scenario files,
// resolves them into a Plan (mass functions, star-formation histories, metallicity
// distributions, binaries, cluster geometry, Galactic fields with their distance shells,
// dust and the survey), cuts the run into fixed-size chunks with their own random
// streams, and evaluates the chunks in a pool of workers into column batches handed out
// in chunk order. It knows nothing of file formats (package output writes the batches;
// package simulate joins the two).
//
// Determinism. Chunk k of component c draws from ChaCha8 generators keyed by
// SHA-256(seed, c, k, purpose), one for initial masses and one for everything else, in a
// fixed order per star. Chunk boundaries depend only on the scenario, so the output is
// the same for any number of workers, and a shard (a contiguous run of chunks) holds
// exactly the rows the whole run has for those chunks.
//
// Populations. A population component has a number of primaries or a total initial
// mass (sampled chunk by chunk with the stop-nearest rule of package imf). A Galactic
// component (thin_disc, thick_disc, halo, bulge) takes its stellar mass per distance
// shell from package galaxy, converted to initial mass by a Monte Carlo of its own IMF,
// history and evolution, divided by the mean initial mass of a system (primary plus
// companion) into an expected number of systems, drawn as a Poisson number per shell.
// With skip_undetectable, only systems with a member that may pass the detection rule
// in their shell are drawn: cells of ([Fe/H], initial mass, age in units of the
// main-sequence lifetime) carry a brightness bound (bound.go), and the live cells of
// each shell are sampled directly, with Poisson thinning and a second class for systems
// seen only through their companion (liveBound in live.go).
//
// Ages. Burst (Gaussian spread truncated to 0–13.8 Gyr), constant, exponentially
// declining, or a piecewise-linear table; [Fe/H] fixed, Gaussian (truncated to the
// evolution model's range by redrawing) or tabulated; the [Fe/H] used for evolution is
// rounded to 0.01 dex and reported so.
//
// Binaries. A primary-mass-dependent fraction, and mass ratios flat or dN/dq ∝ q^γ; the
// companion is evolved as a single star of the same age and metallicity and its light is
// added to the primary's in every band (unresolved pairs).
//
// Geometry. Clusters are Plummer (1911) spheres, truncated, placed exactly on the sky by
// vector addition; field stars are placed inside their shell by density-weighted
// rejection sampling.
//
// References
//
//   - Plummer, H. C. 1911, MNRAS 71, 460 (the cluster profile).
//   - Duchêne, G. & Kraus, A. 2013, ARA&A 51, 269 (default field binary fractions).
//   - Kroupa, P., Tout, C. A. & Gilmore, G. 1993, MNRAS 262, 545 (default field mass
//     function, from memory).
//   - Jurić, M. et al. 2008, ApJ 673, 864; Ivezić, Ž. et al. 2008, ApJ 684, 287 (Galactic
//     structure and default metallicities, the latter from memory).
//   - Bland-Hawthorn, J. & Gerhard, O. 2016, ARA&A 54, 529; Dwek, E. et al. 1995, ApJ 445,
//     716; Sesar, B., Jurić, M. & Ivezić, Ž. 2011, ApJ 731, 4; the Gaia 100 pc census,
//     arXiv:2507.06052 (the other defaults and examples of the field.structure keys, via
//     package galaxy).
//   - Ivezić, Ž. et al. 2019, ApJ 873, 111 (the survey noise model, via package observe).
//   - Li, L. et al. 2018, ApJ 858, 75 (the default dust scale height, via package dust).
//   - Planck Collaboration 2020, A&A 641, A6 (the 13.8 Gyr age limit, from memory).
package synth
