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
