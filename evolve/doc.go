// Package evolve computes the present state of a single star — evolutionary
// stage, current mass, luminosity, effective temperature, radius, surface
// gravity and core mass — from its initial mass, metallicity and age, together
// with its lifetimes and final remnant.
//
// # Method
//
// The backbone is the analytic single-star evolution of Hurley, Pols & Tout
// (2000, "HPT"): zero-age main sequence from Tout et al. (1996); main-sequence
// lifetime, luminosity and radius at the end of the main sequence and at the
// base of the giant branch, the helium-flash and first-giant-branch mass limits
// and the giant-branch core-mass–luminosity relation with its closed-form core
// growth from HPT; white-dwarf cooling, white-dwarf radius, neutron-star
// luminosity and naked-helium-star relations from HPT. Everything that depends
// only on metallicity is evaluated once in NewModel; Evolve evaluates a star at
// one age in closed form, without integrating a history, and does not allocate.
//
// Phases and their treatment (t in Myr inside the package, yr in the API):
//
//   - main sequence: L and R move from the Tout et al. ZAMS values to HPT's
//     L_TMS, R_TMS (eqs. 8–9) with fixed shapes in τ = t/t_MS (no hook);
//   - Hertzsprung gap ("subgiant"): geometric interpolation to the base of the
//     giant branch (HPT eqs. 26–27), core mass HPT eq. (30);
//   - red giant branch: for M ≤ M_HeF the core grows on L = min(B Mc³, D Mc⁶)
//     (HPT eqs. 37–40) from L_BGB to the tip L_HeI (eq. 49); for heavier stars a
//     short branch between L_BGB and L_HeI; stars above M_FGB ignite helium at
//     the end of the gap;
//   - core helium burning: duration 0.6 t_HeMS(Mc) (HPT eq. 79) for degenerate
//     ignition and 0.1 + 0.2/(1 + (M/5)³) of t_BGB otherwise; luminosity from
//     35 Lsun·10^(−0.05ζ) (degenerate) or L_HeI, rising by a factor 2 by the end
//     (1.4 for massive stars); radius the giant-branch radius times a
//     horizontal-branch factor (degenerate), a blue-loop dip (intermediate
//     masses) or a blue-to-red sweep (massive) — shapes of this package, not
//     HPT's equations;
//   - early AGB: the CO core grows at HPT's helium rate on the same
//     core-mass–luminosity relation until the core reaches the value after
//     second dredge-up; thermally pulsing AGB: core growth at A_H,He until the
//     white-dwarf mass of Cummings et al. (2018);
//   - stars above M_Ec end after a post-helium supergiant phase (labelled
//     early_agb, as HPT do) lasting 10 per cent of core helium burning; their
//     remnant follows Fryer et al. (2012, "rapid") from the CO core of HPT eq.
//     (75); helium cores of 64–133 Msun leave nothing (Heger & Woosley 2002);
//   - stars whose envelope is blown away during core helium burning become
//     naked helium stars (HPT eqs. 77–78) losing mass by a Wolf–Rayet wind;
//     stars whose envelope is lost on the first giant branch become helium
//     white dwarfs.
//
// Mass loss: Reimers (1975) with η = 0.4 on the giant branches (integrated in
// closed form on the first giant branch), Nieuwenhuijzen & de Jager (1990)
// scaled by (Z/0.02)^0.5 above 4000 Lsun, HPT's LBV term, a clumping-reduced
// Wolf–Rayet rate for naked helium stars; on the AGB the envelope is removed so
// that the star ends with the Cummings et al. mass (a stand-in for the
// superwind). Main-sequence winds are capped at half the initial mass:
// HPT's LBV term would otherwise remove more. The cap binds above about 57,
// 66 and 137 Msun at Z = 0.03, 0.02 and 0.001 (never at Z = 1e-4); treat the
// masses of the most massive stars as uncertain by a factor of about 2.
//
// Winds are evaluated at the start mass of each phase with a rate piecewise
// linear in time through the phase's start, middle and end, so a star that
// crosses the Humphreys–Davidson limit as a red supergiant loses its envelope
// late in core helium burning and becomes a Wolf–Rayet-like helium star.
//
// Metallicity: Z in [1e-4, 0.03]; ZFromFeH and FeHFromZ convert from and to
// [Fe/H] with X = 0.76 − 3Z and the fits' solar Z = 0.02.
//
// # Speed
//
// NewModel tabulates the main-sequence quantities on 2048 masses (about 5 ms
// and 160 kB per metallicity; cache models by metallicity). Evolve costs about
// 0.2 µs for a main-sequence star and 2–5 µs for an evolved one (up to ~20 µs
// for a stripped helium star); averaged over a Kroupa (2001) population of
// 0.08–150 Msun with ages uniform in 0–12 Gyr it takes about 0.45–0.6 µs at
// Z = 0.02 and 0.6–0.9 µs at Z = 0.001 on one core of a shared AMD EPYC
// (BenchmarkEvolveKroupa), with no allocation.
//
// # Accuracy and what is not HPT
//
// HPT claim their fits match their detailed models to about 5 per cent. The
// coefficients used here are written from memory (the project had no copy of
// the papers' tables), several HPT relations were replaced by simpler shapes
// marked "this package" in the code, and the tests check physics against
// outside values with the tolerances stated there. Treat results as a
// plausible population model, not as a reproduction of HPT to 5 per cent.
//
// # Incomplete
//
// No main-sequence hook; no third dredge-up; no blue-loop metallicity
// dependence; no binary interaction; HPT's luminosity-dependent shapes of the
// main sequence (α_L, β_L, …) and their core-helium-burning relations are
// replaced by fixed shapes; the metallicity dependence of Mc,BAGB and of the
// giant-branch radius coefficients is not recalled.
//
// # References
//
//   - Hurley J. R., Pols O. R., Tout C. A. 2000, MNRAS 315, 543 (HPT),
//     doi:10.1046/j.1365-8711.2000.03426.x
//   - Tout C. A., Pols O. R., Eggleton P. P., Han Z. 1996, MNRAS 281, 257,
//     doi:10.1093/mnras/281.1.257
//   - Pols O. R., Schröder K.-P., Hurley J. R., Tout C. A., Eggleton P. P. 1998,
//     MNRAS 298, 525 (the models HPT fit; X = 0.76 − 3Z)
//   - Reimers D. 1975, Mém. Soc. R. Sci. Liège 8, 369
//   - Nieuwenhuijzen H., de Jager C. 1990, A&A 231, 134
//   - Kudritzki R. P., Pauldrach A., Puls J., Abbott D. C. 1989, A&A 219, 205
//   - Hamann W.-R., Koesterke L., Wessolowski U. 1995, A&A 299, 151
//   - Cummings J. D., Kalirai J. S., Tremblay P.-E., Ramirez-Ruiz E., Choi J.
//     2018, ApJ 866, 21
//   - Fryer C. L., Belczynski K., Wiktorowicz G., Dominik M., Kalogera V.,
//     Holz D. E. 2012, ApJ 749, 91
//   - Lattimer J. M., Yahil A. 1989, ApJ 340, 426
//   - Heger A., Woosley S. E. 2002, ApJ 567, 532
//   - Mestel L. 1952, MNRAS 112, 583 (white-dwarf cooling law)
//   - Tout C. A., Aarseth S. J., Pols O. R., Eggleton P. P. 1997, MNRAS 291,
//     732 (white-dwarf mass–radius relation used by HPT; details from memory)
//
// Sources of the tests only: Pecaut M. J., Mamajek E. E. 2013, ApJS 208, 9
// (dwarf sequence; E. Mamajek's table version 2024.05.15); Kalirai J. S. et al.
// 2008, ApJ 676, 594; Smartt S. J. 2009, ARA&A 47, 63; Thorsett S. E.,
// Chakrabarty D. 1999, ApJ 512, 288; IAU 2015 Resolution B3 (nominal solar
// values); the reference tables in testdata/ name their own sources.
package evolve
