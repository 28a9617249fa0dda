package synth

// ScenarioReference documents every key of a scenario file. It is printed by
// `starmock scenario` and reproduced in the README.
const ScenarioReference = `A scenario is a YAML file. Unknown keys are errors; every error names the
file, line, key and allowed range. Times accept a number of years or a number
with yr, kyr, Myr or Gyr ("1.5Gyr", "300 Myr").

seed: 42                      required; non-negative integer; fixes every random stream
name: free text               copied into the manifest
components:                   one or more stellar populations
  - name: word                required, unique; the catalogue's component column
    kind: population          population (default; placed by geometry) or a Galactic
                              component thin_disc | thick_disc | halo | bulge (placed
                              by the field section, sized by its density law)
    stars: 10000              number of primaries (systems), or instead
    total_mass_msun: 5000     total initial mass of the primaries, sampled until the
                              target is reached ("stop nearest": the crossing star is
                              kept if that leaves the total closer to the target)
    density_scale: 1          Galactic components: multiplies the default density
    mass_function:
      kind: kroupa            salpeter | kroupa | chabrier_single | chabrier_system |
                              broken_power_law | table
      min_mass_msun: 0.1      limits (default: the mass function's own; must lie in
      max_mass_msun: 100      the evolution model's 0.08-150 Msun)
      breaks_msun: [0.5]      broken_power_law: interior breaks, increasing
      slopes: [1.3, 2.3]      broken_power_law: alpha of dN/dm ~ m^-alpha per segment
      table: imf.txt          table: rows "mass_msun dN/dm", log-log interpolated
    age:                      star-formation history
      kind: burst             burst (age, optional Gaussian spread) |
                              constant (uniform between min_age and max_age) |
                              exponential (rate ~ exp(-t/tau) from max_age on, ages
                              min_age..max_age) | table (rows "age_yr rate",
                              piecewise linear)
      age: 1.5Gyr             0 < age <= 13.8 Gyr
      spread: 20Myr
      min_age: 0
      max_age: 10Gyr
      tau: 3Gyr
    metallicity:
      kind: fixed             fixed (feh) | gaussian (feh, sigma_dex; truncated to the
                              evolution model's -2.3..+0.17 by redrawing) |
                              table (rows "feh weight", piecewise linear)
      feh: 0.0                [Fe/H] in dex
      sigma_dex: 0.1
    binaries:                 unresolved companions, combined in flux; both truths kept
      fraction: 0.4           probability of a companion, 0..1, or instead
      fraction_by_mass:       rows {above_mass_msun, fraction}: a primary takes the
        - {above_mass_msun: 0, fraction: 0.3}   fraction of the last row it reaches
      mass_ratio:
        kind: flat            flat | power_law (dN/dq ~ q^gamma)
        min: 0.1              0 < min < max <= 1
        max: 1.0
        gamma: 0.3            -5..5
    geometry:                 population components only
      kind: plummer           fixed (all at distance_pc) | plummer (Plummer 1911
                              sphere, scale_radius_pc, truncated at max_radius_pc,
                              default 10 scale radii)
      distance_pc: 3000       0 < d <= 1e6 pc
      scale_radius_pc: 2
      max_radius_pc: 20
      ra_deg: 120.0           ICRS centre, 0 <= ra < 360
      dec_deg: -20.0          -90 <= dec <= 90
    extinction: {...}         overrides the scenario-wide extinction for this component
extinction:                   dust in front of population components
  law: ccm89                  ccm89 (Cardelli, Clayton & Mathis 1989) | od94
                              (O'Donnell 1994) | f99 (Fitzpatrick 1999)
  rv: 3.1                     R_V; E(B-V) = A_V / R_V
  av_mag: 1.0                 mean A_V, 0..30 mag
  av_spread_mag: 0.1          per-star Gaussian spread (differential reddening),
                              truncated at zero by redrawing
field:                        required when there are Galactic components
  area:
    kind: cone                cone (l_deg, b_deg, radius_deg in (0, 180]) |
                              galactic_box (l_min_deg, l_max_deg, b_min_deg, b_max_deg)
                              | equatorial_box (ra_min_deg, ra_max_deg, dec_min_deg,
                              dec_max_deg) | healpix (nside, nested, pixels)
  min_distance_pc: 10         sight line from min to max distance (default 10 pc ..
  max_distance_pc: 50000      50 kpc), cut into logarithmic shells
  shells: 64
  dust:
    model: disc               disc (dust layer exponential in height, no radial
                              gradient, evaluated along each star's direction) |
                              table (columns l_deg b_deg distance_pc av_mag; see
                              package dust) | none
    law: ccm89
    rv: 3.1
    av_per_kpc: 1.0           disc: A_V per kpc at the Sun (default 1.0)
    scale_height_pc: 103      disc: dust scale height (default 103, Li et al. 2018)
    table: av.txt
  skip_undetectable: true     do not simulate stars that cannot pass the detection
                              rule at any age, metallicity or extinction allowed
  structure:                  the Galactic density laws (package galaxy); every key
                              is optional and defaults to the value shown. The thin
                              disc's mid-plane density is set so that all components
                              sum to local_density_msun_pc3 at the Sun (Juric et al.
                              2008 eqs. 22-24); density_scale multiplies the result
    local_density_msun_pc3: 0.040
                              present-day stars and remnants of all components at
                              the Sun, Msun/pc^3, (0, 10]; Gaia 100 pc census
                              (arXiv:2507.06052, Kroupa IMF correction)
    thick_to_thin_local: 0.12 thick/thin mid-plane density at the Sun's radius,
                              [0, 10]; Juric et al. 2008 (f)
    halo_to_thin_local: 0.005 halo/thin density there, [0, 1]; Juric et al. 2008 (f_h)
    sun:
      r0_pc: 8200             Sun-Galactic-centre distance, (0, 20000] pc;
                              Bland-Hawthorn & Gerhard 2016
      z_pc: 25                height above the mid-plane, [-200, 200] pc;
                              Bland-Hawthorn & Gerhard 2016 (the dust layer keeps its
                              own 23 pc)
    thin_disc:                rho ~ exp(-R/L - |z|/H), Juric et al. 2008 eq. 22
      scale_length_pc: 2600   L, [100, 20000] pc; Juric et al. 2008 (L1)
      scale_height_pc: 300    H, [10, 5000] pc; Juric et al. 2008 (H1); one height
                              for stars of all ages unless heating is given
      heating:                optional: the height grows with age,
                              H(t) = H ((t + offset)/(reference_age + offset))^index,
                              applied to the thin-disc components in age slices that
                              keep the local density (off when absent)
        index: 0.5            (0, 2]; Wielen 1977 (disc heating by diffusion)
        offset: 0.1Gyr        (0, 14 Gyr]; this package's choice
        reference_age: 5Gyr   [0, 14 Gyr], the age whose height is scale_height_pc;
                              this package's choice (the mean age of a constant
                              10 Gyr history)
        slices: 8             2-32 age slices, equal steps in ln(age + offset)
    thick_disc:               same law
      scale_length_pc: 3600   L, [100, 20000] pc; Juric et al. 2008 (L2)
      scale_height_pc: 900    H, [10, 10000] pc; Juric et al. 2008 (H2)
    halo:                     rho ~ (R^2 + (z/q)^2 + a^2)^(-n/2): Juric et al. 2008
                              eq. 24 with a core radius a
      axis_ratio: 0.64        q = c/a (below 1: flattened), [0.1, 2]; Juric et al.
                              2008 (q_H)
      power_law_index: 2.8    n, [0, 6]; Juric et al. 2008 (n_H)
      core_radius_pc: 500     a, [0, 20000] pc; our softening (changes the law by
                              < 1 % beyond 4.8 kpc)
      break_radius_pc: 0      0 = no break, else (0, 1e6] pc: the law steepens to
                              outer_index beyond it, continuously (Sesar, Juric &
                              Ivezic 2011: 28000 pc)
      outer_index: 3.8        index beyond the break, [0, 10]; no default, required
                              with a break (Sesar et al. 2011: 3.8)
    bulge:                    triaxial bar, Dwek et al. 1995 model G2
      mass_msun: 1.5e10       present-day stellar mass, [0, 1e12] (0 = no bulge);
                              Bland-Hawthorn & Gerhard 2016; its density at the Sun
                              must stay below local_density_msun_pc3
      x0_pc: 1580             scale lengths along the bar, across it and vertically,
      y0_pc: 620              each [10, 10000] pc; Dwek et al. 1995 (G2)
      z0_pc: 430
      bar_angle_deg: 27       bar major axis from the Sun-centre line, near end at
                              l > 0, [-90, 90]; Bland-Hawthorn & Gerhard 2016
                              (bulge values recalled, see package galaxy)
survey:
  name: free text
  bands:                      one entry per band (see 'starmock bands')
    - band: g                 a built-in band, or a name for the filter in passband
      passband: my_filter.tsv user filter (wavelength_angstrom, throughput; response
                              kind in the header): AB magnitudes with blackbody colour
                              terms, approximate for cool stars
      limit_5sigma_mag: 24.5  magnitude of S/N = 5 for a point source
      floor_mag: 0.005        systematic error, added in quadrature (default 0.005)
      saturation_mag: 16      brighter stars are flagged saturated, not detected
      noise: ivezic2019       ivezic2019 (Ivezic et al. 2019 eqs. 4-5, gamma default
                              0.039) | background_limited (sigma_flux = f5/5) |
                              table (rows "mag mag_err")
      gamma: 0.039
      table: errors.txt
      completeness: none      extra losses beyond the S/N threshold: none | logistic
                              (completeness_50_mag, default the 5-sigma limit;
                              completeness_width_mag, default 0.2) | table
                              (completeness_table: rows "mag fraction")
  detection:
    rule: all_of              all_of | any_of | at_least (count)
    bands: [g, r]             default: every survey band
    count: 2
output:
  path: catalogue             path without extension; each format adds its own
  formats: [parquet]          any of parquet, arrow, fits, csv (CSV is ECSV: the
                              header carries units and the manifest)
  columns: [star_id, ...]     a subset of the catalogue columns (default: all)
  chunk_size: 32768           stars per chunk; fixes the random streams (changing it
                              changes the catalogue)
  workers: 0                  goroutines; 0 = all CPUs; never changes the catalogue
  detected_only: false        write only stars that pass the detection rule`
