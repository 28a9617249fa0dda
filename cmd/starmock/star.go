package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/internal/consts"
)

func init() { extraCommands = append(extraCommands, newStarCmd) }

const starLong = `Show the state of one star.

Evolved star (default): give the initial mass (--mass, Msun) and the age
(--age), and the metallicity as --feh ([Fe/H], dex) or --z (metal mass
fraction Z); without either, [Fe/H] = 0 (Z = 0.02). The star is evolved with
the analytic single-star model of the evolve package (Hurley, Pols & Tout
2000, zero-age main sequence of Tout et al. 1996). Ages take a unit: yr,
kyr, Myr or Gyr (e.g. 4.57Gyr, 250Myr, 1e9yr); a plain number is in years.
Valid ranges: mass 0.08–150 Msun (0.08–0.1 and 100–150 are extrapolations),
Z 1e-4–0.03 ([Fe/H] about −2.34 to +0.19), age 0–1e13 yr.

Given star: with --teff and --luminosity (and optionally --logg or --mass)
the star is taken as given and not evolved: the radius follows from
L = 4πR²σTeff⁴, the mass from log g (or log g from the mass). Evolutionary
fields are then null in the JSON output.

Output: a readable table, or with --json one JSON object with the keys
stage, stage_label, stage_fraction, mass_msun, luminosity_lsun, teff_k,
radius_rsun, logg_cgs, core_mass_msun, ms_lifetime_yr, bgb_age_yr,
he_ignition_age_yr, end_core_he_age_yr, end_agb_age_yr, remnant,
remnant_mass_msun, plus the inputs (input, initial_mass_msun, age_yr,
metallicity_z, feh).

Examples:
  starmock star --mass 1 --age 4.57Gyr --feh 0
  starmock star --mass 1 --age 4.57Gyr --z 0.02 --json
  starmock star --mass 2.5 --age 600Myr --feh -0.5
  starmock star --teff 4800 --luminosity 50 --logg 2.5 --feh -0.2 --json`

// starOptions holds the parsed flags of the star command.
type starOptions struct {
	massMsun, feh, metallicityZ float64
	age                         string
	teffK, lumLsun, loggCgs     float64
	json                        bool
	set                         map[string]bool
}

// starReport is the JSON object printed by "starmock star --json". Fields
// that do not apply (the evolutionary ones for a given star) are null. The
// struct is meant to be extended (for example with band magnitudes) by adding
// fields.
type starReport struct {
	Input           string   `json:"input"` // "evolved" or "given"
	InitialMassMsun *float64 `json:"initial_mass_msun"`
	AgeYr           *float64 `json:"age_yr"`
	MetallicityZ    float64  `json:"metallicity_z"`
	FeH             float64  `json:"feh"`
	Stage           *string  `json:"stage"`
	StageLabel      *string  `json:"stage_label"`
	StageFraction   *float64 `json:"stage_fraction"`
	MassMsun        *float64 `json:"mass_msun"`
	LuminosityLsun  float64  `json:"luminosity_lsun"`
	TeffK           float64  `json:"teff_k"`
	RadiusRsun      float64  `json:"radius_rsun"`
	LoggCgs         *float64 `json:"logg_cgs"`
	CoreMassMsun    *float64 `json:"core_mass_msun"`
	MSLifetimeYr    *float64 `json:"ms_lifetime_yr"`
	BGBAgeYr        *float64 `json:"bgb_age_yr"`
	HeIgnitionAgeYr *float64 `json:"he_ignition_age_yr"`
	EndCoreHeAgeYr  *float64 `json:"end_core_he_age_yr"`
	EndAGBAgeYr     *float64 `json:"end_agb_age_yr"`
	Remnant         *string  `json:"remnant"`
	RemnantMassMsun *float64 `json:"remnant_mass_msun"`
	// Photometry holds abs_mag, spectral_type, luminosity_class and phot_quality,
	// embedded at the top level of the JSON object (see star_phot.go).
	*starPhotometry `json:",omitempty"`
}

func newStarCmd(stdout, stderr io.Writer) *cobra.Command {
	o := &starOptions{}
	cmd := &cobra.Command{
		Use:   "star --mass MSUN --age AGE [--feh DEX | --z Z] [--json]",
		Short: "show the evolutionary state of one star",
		Long:  starLong,
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			o.set = changedFlags(cmd)
			rep, err := buildStarReport(o)
			if err != nil {
				return err
			}
			if err := addPhotometry(rep); err != nil {
				return err
			}
			if o.json {
				enc := json.NewEncoder(stdout)
				enc.SetIndent("", "  ")
				return enc.Encode(rep)
			}
			if err := printStarReport(stdout, rep); err != nil {
				return err
			}
			return printPhotometry(stdout, rep)
		},
	}
	f := cmd.Flags()
	f.Float64Var(&o.massMsun, "mass", 0, "initial mass in Msun (0.08–150); with --teff, the present mass")
	f.StringVar(&o.age, "age", "", "age with unit yr, kyr, Myr or Gyr (plain number = yr), e.g. 4.57Gyr")
	f.Float64Var(&o.feh, "feh", 0, "iron abundance [Fe/H] in dex (default 0, i.e. Z = 0.02)")
	f.Float64Var(&o.metallicityZ, "z", 0, "metal mass fraction Z (1e-4–0.03), instead of --feh")
	f.Float64Var(&o.teffK, "teff", 0, "given star: effective temperature in K (skips evolution)")
	f.Float64Var(&o.lumLsun, "luminosity", 0, "given star: luminosity in Lsun")
	f.Float64Var(&o.loggCgs, "logg", 0, "given star: log10 surface gravity in cm s^-2 (gives the mass)")
	f.BoolVar(&o.json, "json", false, "print one JSON object instead of a table")
	return cmd
}

// parseAgeYr reads an age with an optional unit (yr, kyr, Myr, Gyr) and returns years.
func parseAgeYr(s string) (float64, error) {
	t := strings.TrimSpace(s)
	mult := 1.0
	for _, u := range []struct {
		suffix string
		f      float64
	}{{"gyr", 1e9}, {"myr", 1e6}, {"kyr", 1e3}, {"yr", 1}} {
		if strings.HasSuffix(strings.ToLower(t), u.suffix) {
			t, mult = strings.TrimSpace(t[:len(t)-len(u.suffix)]), u.f
			break
		}
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("--age %q is not an age: give a number with unit yr, kyr, Myr or Gyr (e.g. 4.57Gyr)", s)
	}
	return v * mult, nil
}

// metallicityFromFlags resolves --feh/--z into Z and [Fe/H].
func metallicityFromFlags(set map[string]bool, feh, metallicityZ float64) (float64, float64, error) {
	switch {
	case set["feh"] && set["z"]:
		return 0, 0, usageErrorf("--feh and --z cannot be used together: give the metallicity once")
	case set["z"]:
		if !(metallicityZ >= evolve.MinZ && metallicityZ <= evolve.MaxZ) {
			return 0, 0, usageErrorf("--z %g is outside the allowed range [%g, %g]", metallicityZ, evolve.MinZ, evolve.MaxZ)
		}
		return metallicityZ, evolve.FeHFromZ(metallicityZ), nil
	default:
		z := evolve.ZFromFeH(feh)
		if !(z >= evolve.MinZ && z <= evolve.MaxZ) {
			return 0, 0, usageErrorf("--feh %g dex gives Z = %.3g, outside the allowed range [%g, %g] (--feh %.3f to %.3f)",
				feh, z, evolve.MinZ, evolve.MaxZ, evolve.FeHFromZ(evolve.MinZ), evolve.FeHFromZ(evolve.MaxZ))
		}
		return z, feh, nil
	}
}

func ptr[T any](v T) *T { return &v }

// checkMassFlag validates an initial mass given with --mass.
func checkMassFlag(massMsun float64) error {
	if !(massMsun >= evolve.MinMassMsun && massMsun <= evolve.MaxMassMsun) {
		return usageErrorf("--mass %g Msun is outside the allowed range [%g, %g] Msun", massMsun, evolve.MinMassMsun, evolve.MaxMassMsun)
	}
	return nil
}

// changedFlags returns the names of the flags given on the command line.
func changedFlags(cmd *cobra.Command) map[string]bool {
	set := map[string]bool{}
	for _, n := range []string{"mass", "age", "feh", "z", "teff", "luminosity", "logg", "out", "png", "points", "max-age"} {
		if f := cmd.Flags().Lookup(n); f != nil && f.Changed {
			set[n] = true
		}
	}
	return set
}

func buildStarReport(o *starOptions) (*starReport, error) {
	z, feh, err := metallicityFromFlags(o.set, o.feh, o.metallicityZ)
	if err != nil {
		return nil, err
	}
	if o.set["teff"] || o.set["luminosity"] || o.set["logg"] {
		return givenStarReport(o, z, feh)
	}
	if !o.set["mass"] || !o.set["age"] {
		return nil, usageErrorf("give --mass and --age (or a given star with --teff and --luminosity); see 'starmock star --help'")
	}
	ageYr, err := parseAgeYr(o.age)
	if err != nil {
		return nil, asUsage(err)
	}
	if err := checkMassFlag(o.massMsun); err != nil {
		return nil, err
	}
	if !(ageYr >= 0 && ageYr <= evolve.MaxAgeYr) {
		return nil, usageErrorf("--age %s (%g yr) is outside the allowed range [0, %g] yr", o.age, ageYr, evolve.MaxAgeYr)
	}
	m, err := evolve.NewModel(z)
	if err != nil {
		return nil, asUsage(err)
	}
	s, err := m.Evolve(o.massMsun, ageYr)
	if err != nil {
		return nil, asUsage(fmt.Errorf("--mass/--age: %w", err))
	}
	ts, err := m.Timescales(o.massMsun)
	if err != nil {
		return nil, asUsage(fmt.Errorf("--mass: %w", err))
	}
	return &starReport{
		Input: "evolved", InitialMassMsun: ptr(o.massMsun), AgeYr: ptr(ageYr),
		MetallicityZ: z, FeH: feh,
		Stage: ptr(s.Stage.String()), StageLabel: ptr(s.Stage.Label()), StageFraction: ptr(s.StageFraction),
		MassMsun: ptr(s.MassMsun), LuminosityLsun: s.LuminosityLsun, TeffK: s.TeffK, RadiusRsun: s.RadiusRsun,
		LoggCgs: ptr(s.LoggCgs), CoreMassMsun: ptr(s.CoreMassMsun),
		MSLifetimeYr: ptr(ts.MSLifetimeYr), BGBAgeYr: ptr(ts.BGBYr), HeIgnitionAgeYr: ptr(ts.HeIgnitionYr),
		EndCoreHeAgeYr: ptr(ts.EndCoreHeYr), EndAGBAgeYr: ptr(ts.EndAGBYr),
		Remnant: ptr(ts.Remnant.String()), RemnantMassMsun: ptr(ts.RemnantMassMsun),
	}, nil
}

// givenStarReport builds the report of a star given by Teff and L.
func givenStarReport(o *starOptions, z, feh float64) (*starReport, error) {
	if o.set["age"] {
		return nil, usageErrorf("--age is not used with a given star (--teff/--luminosity/--logg): the star is not evolved")
	}
	if !o.set["teff"] || !o.set["luminosity"] {
		return nil, usageErrorf("a given star needs both --teff K and --luminosity Lsun (and optionally --logg or --mass)")
	}
	if o.set["logg"] && o.set["mass"] {
		return nil, usageErrorf("give either --logg or --mass for a given star, not both")
	}
	if !(o.teffK >= 500 && o.teffK <= 1e6) {
		return nil, usageErrorf("--teff %g K is outside the allowed range [500, 1e6] K", o.teffK)
	}
	if !(o.lumLsun > 0 && o.lumLsun <= 1e8) {
		return nil, usageErrorf("--luminosity %g Lsun is outside the allowed range (0, 1e8] Lsun", o.lumLsun)
	}
	tr := o.teffK / consts.TeffSunK
	r := math.Sqrt(o.lumLsun) / (tr * tr) // L = 4πR²σT⁴ in nominal solar units
	rep := &starReport{Input: "given", MetallicityZ: z, FeH: feh, LuminosityLsun: o.lumLsun, TeffK: o.teffK, RadiusRsun: r}
	switch {
	case o.set["logg"]:
		if !(o.loggCgs >= -2 && o.loggCgs <= 10) {
			return nil, usageErrorf("--logg %g is outside the allowed range [-2, 10] (cgs)", o.loggCgs)
		}
		rep.LoggCgs = ptr(o.loggCgs)
		rep.MassMsun = ptr(math.Pow(10, o.loggCgs-consts.LogGSunCgs) * r * r) // g = GM/R²
	case o.set["mass"]:
		if !(o.massMsun > 0 && o.massMsun <= 1000) {
			return nil, usageErrorf("--mass %g Msun is outside the allowed range (0, 1000] Msun", o.massMsun)
		}
		rep.MassMsun = ptr(o.massMsun)
		rep.LoggCgs = ptr(consts.LoggCgs(o.massMsun, r))
	}
	return rep, nil
}

func fmtOpt(v *float64, format string) string {
	if v == nil {
		return "—"
	}
	return fmt.Sprintf(format, *v)
}

func printStarReport(w io.Writer, r *starReport) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	if r.Input == "evolved" {
		fmt.Fprintf(tw, "star\t%g Msun initial, age %.4g yr, Z = %.4g ([Fe/H] = %+.2f)\n", *r.InitialMassMsun, *r.AgeYr, r.MetallicityZ, r.FeH)
		fmt.Fprintf(tw, "stage\t%s (%s), %.1f %% of the stage elapsed\n", *r.Stage, *r.StageLabel, 100**r.StageFraction)
	} else {
		fmt.Fprintf(tw, "star\tgiven (not evolved), Z = %.4g ([Fe/H] = %+.2f)\n", r.MetallicityZ, r.FeH)
	}
	fmt.Fprintf(tw, "mass\t%s Msun\n", fmtOpt(r.MassMsun, "%.4g"))
	fmt.Fprintf(tw, "luminosity\t%.4g Lsun\n", r.LuminosityLsun)
	fmt.Fprintf(tw, "effective temperature\t%.0f K\n", r.TeffK)
	fmt.Fprintf(tw, "radius\t%.4g Rsun\n", r.RadiusRsun)
	fmt.Fprintf(tw, "log g\t%s (cgs)\n", fmtOpt(r.LoggCgs, "%.3f"))
	if r.Input == "evolved" {
		fmt.Fprintf(tw, "core mass\t%.4g Msun\n", *r.CoreMassMsun)
		fmt.Fprintf(tw, "main-sequence lifetime\t%.4g yr\n", *r.MSLifetimeYr)
		fmt.Fprintf(tw, "base of the giant branch\t%.4g yr\n", *r.BGBAgeYr)
		fmt.Fprintf(tw, "helium ignition\t%.4g yr\n", *r.HeIgnitionAgeYr)
		fmt.Fprintf(tw, "end of core helium burning\t%.4g yr\n", *r.EndCoreHeAgeYr)
		fmt.Fprintf(tw, "end of nuclear evolution\t%.4g yr\n", *r.EndAGBAgeYr)
		fmt.Fprintf(tw, "fate\t%s of %.4g Msun\n", *r.Remnant, *r.RemnantMassMsun)
	}
	return tw.Flush()
}
