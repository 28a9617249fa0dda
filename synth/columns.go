package synth

import (
	"fmt"
	"strings"

	"github.com/starmock/starmock/output"
)

// Catalogue columns. Names are snake_case with the unit in the name where it is not
// obvious; units follow the FITS/IAU strings astropy understands.
func catalogueColumns(bands []string) []output.Column {
	f32 := func(name, unit, desc string) output.Column {
		return output.Column{Name: name, Unit: unit, Description: desc, Kind: output.Float32, Nullable: true}
	}
	f64 := func(name, unit, desc string) output.Column {
		return output.Column{Name: name, Unit: unit, Description: desc, Kind: output.Float64}
	}
	str := func(name, desc string, maxLen int) output.Column {
		return output.Column{Name: name, Description: desc, Kind: output.String, MaxLen: maxLen, Encoding: output.EncodingDictionary}
	}
	cols := []output.Column{
		{Name: "star_id", Description: "identifier of the system, unique within the run", Kind: output.Int64},
		str("component", "population component the star belongs to", 32),
		str("stage", "evolutionary stage of the primary (truth)", 28),
		f32("mass_initial_msun", "solMass", "initial mass of the primary (truth)"),
		f32("mass_msun", "solMass", "present mass of the primary after mass loss (truth)"),
		f32("age_yr", "yr", "age of the primary (truth)"),
		f32("feh", "", "[Fe/H] of the star in dex, a dimensionless log ratio (truth; rounded to 0.01 dex, the value evolved)"),
		f32("luminosity_lsun", "solLum", "bolometric luminosity of the primary (truth)"),
		f32("teff_k", "K", "effective temperature of the primary (truth)"),
		f32("radius_rsun", "solRad", "radius of the primary (truth)"),
		f32("logg_cgs", "", "log10 of the surface gravity of the primary in cm s^-2 (truth; dimensionless, since FITS has no logarithmic unit)"),
		f32("core_mass_msun", "solMass", "core mass of the primary (truth)"),
		{Name: "spectral_type", Description: "MK spectral type of the primary from Teff (truth label)", Kind: output.String, MaxLen: 8, Nullable: true, Encoding: output.EncodingDictionary},
		{Name: "luminosity_class", Description: "MK luminosity class of the primary (truth label)", Kind: output.String, MaxLen: 4, Nullable: true, Encoding: output.EncodingDictionary},
		str("phot_quality", "provenance of the primary's bolometric corrections", 16),
		f64("ra_deg", "deg", "ICRS right ascension (truth)"),
		f64("dec_deg", "deg", "ICRS declination (truth)"),
		f64("l_deg", "deg", "Galactic longitude (truth)"),
		f64("b_deg", "deg", "Galactic latitude (truth)"),
		f32("offset_east_pc", "pc", "offset from the component centre towards east (clusters; null for field stars)"),
		f32("offset_north_pc", "pc", "offset from the component centre towards north (clusters; null for field stars)"),
		f32("offset_depth_pc", "pc", "offset from the component centre along the line of sight, away from the observer (clusters; null for field stars)"),
		f32("distance_pc", "pc", "heliocentric distance (truth)"),
		f32("distance_modulus_mag", "mag", "5 log10(d / 10 pc) (truth)"),
		f32("av_mag", "mag", "V-band extinction A_V in front of the star (truth)"),
		f32("ebv_mag", "mag", "colour excess E(B-V) = A_V / R_V (truth)"),
		{Name: "is_binary", Description: "the system has an unresolved companion (truth)", Kind: output.Bool},
		f32("companion_mass_initial_msun", "solMass", "initial mass of the companion (null if single)"),
		f32("companion_mass_msun", "solMass", "present mass of the companion (null if single)"),
		{Name: "companion_stage", Description: "evolutionary stage of the companion (null if single or below the evolution model's mass range)", Kind: output.String, MaxLen: 28, Nullable: true, Encoding: output.EncodingDictionary},
		f32("companion_luminosity_lsun", "solLum", "luminosity of the companion (null if single)"),
		f32("companion_teff_k", "K", "effective temperature of the companion (null if single)"),
		str("dominant_stage", "stage of the member with the larger bolometric luminosity: what the light of the system shows (truth)", 28),
	}
	for _, b := range bands {
		cols = append(cols,
			f32("abs_mag_"+b, "mag", "absolute magnitude of the primary in "+b+" (truth; null without light or outside every calibration)"),
			f32("app_mag_"+b, "mag", "true apparent magnitude of the system in "+b+": primary plus companion light, with extinction"),
			f32("mag_"+b, "mag", "observed magnitude in "+b+" (null if the noisy flux is not positive)"),
			f32("mag_err_"+b, "mag", "magnitude error in "+b),
			f32("flux_"+b, "nJy", "observed flux in "+b+" (nJy on the AB scale; for Vega bands, 3631e9 nJy at magnitude 0 of that band's system)"),
			f32("flux_err_"+b, "nJy", "flux error in "+b),
			output.Column{Name: "detected_" + b, Description: "detected in " + b + " (S/N threshold, completeness, not saturated)", Kind: output.Bool},
			output.Column{Name: "saturated_" + b, Description: "brighter than the saturation magnitude in " + b, Kind: output.Bool},
		)
	}
	cols = append(cols, output.Column{Name: "detected", Description: "passes the survey's detection rule", Kind: output.Bool})
	return cols
}

// SelectColumns returns the indices of the requested columns in cols (all when want is
// empty), or an error naming an unknown column and listing the allowed names.
func SelectColumns(cols []output.Column, want []string) ([]int, error) {
	if len(want) == 0 {
		idx := make([]int, len(cols))
		for i := range idx {
			idx[i] = i
		}
		return idx, nil
	}
	pos := map[string]int{}
	for i, c := range cols {
		pos[c.Name] = i
	}
	var idx []int
	for _, w := range want {
		i, ok := pos[w]
		if !ok {
			names := make([]string, len(cols))
			for j, c := range cols {
				names[j] = c.Name
			}
			return nil, fmt.Errorf("unknown column %q; allowed: %s", w, strings.Join(names, ", "))
		}
		idx = append(idx, i)
	}
	return idx, nil
}

// BandColumn returns the position in Plan.Columns of per-band column j (0 abs_mag, 1
// app_mag, 2 mag, 3 mag_err, 4 flux, 5 flux_err, 6 detected, 7 saturated) of band k.
func BandColumn(k, j int) int { return nFixedCols + perBandCols*k + j }

// DominantStageColumn is the position of the dominant_stage column in Plan.Columns.
const DominantStageColumn = cDomStage
