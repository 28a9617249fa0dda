// Package galaxy is the Milky Way model of starmock: sky coordinates (Galactic ↔ ICRS,
// heliocentric ↔ Galactocentric), HEALPix pixels, sky areas (cones, longitude–latitude
// rectangles, HEALPix pixel lists), the structural components of the Galaxy (thin disc,
// thick disc, stellar halo, bulge/bar) as stellar mass densities, and the integrals and
// draws along a sight line (distance shells, expected mass per shell and component,
// Poisson numbers, positions inside a shell).
//
// # Frames and units
//
// Angles in the API are degrees unless the name says Rad; distances are pc; densities are
// Msun pc⁻³ of present-day stellar mass (living stars plus stellar remnants). The
// Galactocentric frame is right-handed, centred on the Galactic centre at (l, b) = (0, 0),
// with the Sun at X < 0, Y = 0, Z = z_sun (see Sun and Frame).
//
// # Normalisation and the initial-mass hook
//
// The local density (LocalMassDensityMsunPc3, 0.040 Msun pc⁻³ from the Gaia 100 pc census)
// counts stars and remnants today. A pipeline that samples initial masses from an IMF must
// convert: it computes, from its IMF, star-formation history and evolution, the initial mass
// formed per unit present-day mass and sets it with Model.SetInitialMassPerPresentMass; the
// shell integrals then report both masses.
//
// # Integrals and draws along the sight line
//
// Model.ShellMasses integrates ρ d² over distance shells and an area: Gauss–Legendre in
// distance on sub-intervals of at most max(200 pc, 0.05 d), split where a sight line crosses
// the mid-plane, times the area's angular rule. Galactic rectangles (and WholeSky) use a
// rule graded toward the plane and the Galactic centre, with extra cuts where sight lines
// meet the plane at the shell edges. Tested accuracy with the default options: 1e-6
// relative against nested gonum quadrature for 10 deg² cones (one crossing the plane toward
// the bulge), against closed forms for whole-sky spheres and polar cones; the bulge mass
// is recovered over the whole sky to 4e-9. Cones are not graded: for large cones across the
// plane raise AngularOrder or use a Rect.
//
// PoissonCount draws the number of stars; SampleUniformInShell places them uniformly in
// volume; ShellSampler places them with density ∝ ρ inside the shell by stratified rejection
// on adaptive HEALPix cells × radial bins (exact as long as its envelope holds, which it
// checks on every trial).
//
// # References
//
//   - Blaauw, Gum, Pawsey & Westerhout 1960, MNRAS 121, 123: the IAU 1958 Galactic system.
//   - Kaplan 2005, USNO Circular 179: ICRS–FK5 frame bias (η0, ξ0, dα0), as used by astropy.
//   - Astropy Collaboration 2013, A&A 558, A33; astropy 5.2.1: the Galactic-pole constants
//     in FK5 J2000 and the Galactocentric construction the tests compare with.
//   - Górski, Hivon, Banday, Wandelt, Hansen, Reinecke & Bartelmann 2005, ApJ 622, 759:
//     HEALPix (ring and nested schemes, eqs. 4–9, equal-area pixels).
//   - Jurić, Ivezić, Brooks et al. 2008, ApJ 673, 864: thin/thick disc and halo laws
//     (eqs. 22–24) and their best-fit parameters (abstract values: H1 = 300 pc, L1 = 2.6 kpc,
//     H2 = 900 pc, L2 = 3.6 kpc, f = 0.12, f_h = 0.005, q = 0.64, n = 2.8).
//   - Bland-Hawthorn & Gerhard 2016, ARA&A 54, 529: R0 = 8.2 kpc, z_sun = 25 pc, bar angle
//     and bulge mass (values from memory; see population_values.tsv).
//   - Dwek, Arendt, Hauser et al. 1995, ApJ 445, 716: triaxial bulge model G2 (scale lengths
//     from memory).
//   - McKee, Parravano & Hollenbach 2015, ApJ 814, 13: local stellar surface density
//     33.4 ± 3 Msun pc⁻² (used as a test of the normalisation).
//   - Gaia-based local census, arXiv:2507.06052 (2025): 0.040 (+0.012/−0.006) Msun pc⁻³ of
//     stars and remnants within 100 pc (Kroupa IMF correction).
//   - Wielen 1977, A&A 60, 263: disc heating, σ ∝ τ^½ (from memory), for the optional
//     age-dependent thin-disc scale height.
//   - Sesar, Jurić & Ivezić 2011, ApJ 731, 4: broken halo power law (2.62 inside ~28 kpc,
//     3.8 outside), the optional halo break.
//   - Hörmann 1993, Insurance: Mathematics and Economics 12, 39: the PTRS Poisson generator.
//   - Stanek et al. 1994, ApJ 429, L73: the bar's near end at positive longitude (test).
//
// # Incomplete
//
// The age-dependent scale height is provided as a function of age (ThinDisc.ScaleHeightAtAgePc)
// but the shell integrals use the single scale height; ages, metallicities and mass
// functions of the components belong to the pipeline (package synth). There is no warp,
// flare, spiral structure or inner-disc hole; the bulge parameters are recalled, not read
// from the papers. The default halo (Jurić's number-density normalisation applied to mass)
// holds 4.6e9 Msun within 100 kpc, more than usual stellar-halo mass estimates.
package galaxy
