package main

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
	"strconv"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/evolve"
)

func init() { extraCommands = append(extraCommands, newTrackCmd) }

const trackLong = `Write the evolutionary tracks of one or more initial masses.

For each mass in --mass (Msun, comma-separated) the star is evolved with the
analytic single-star model of the evolve package at the metallicity given by
--feh ([Fe/H], dex) or --z (Z); default [Fe/H] = 0 (Z = 0.02). The track is
written as CSV to --out (default: standard output) with the columns

  initial_mass_msun, age_yr, stage, mass_msun, luminosity_lsun, teff_k,
  radius_rsun, logg_cgs, core_mass_msun

sorted by initial mass and age. Every stage is sampled on its own interval
with --points ages, half spaced evenly and half crowding geometrically
towards the end of the stage (where luminosity changes fastest, e.g. the tip
of the giant branch and the thermal pulses), plus the first instant of each
stage. The remnant is followed from its birth to --max-age-after-death
(default 10 Gyr) in logarithmic steps. No row is written beyond the model's
maximum age (1e13 yr).

With --png FILE, also draws the tracks in the Hertzsprung–Russell diagram
(log Teff increasing to the left, log L upward), with the first point of each
stage marked. Neutron stars, black holes and white dwarfs hotter than 150 000 K
are left out of the picture (they are in the CSV).

Examples:
  starmock track --mass 1,2,5
  starmock track --mass 0.8,1,1.5 --feh -1.5 --out tracks.csv --png hr.png
  starmock track --mass 20 --z 0.004 --points 200`

type trackOptions struct {
	masses            []float64
	feh, metallicityZ float64
	outPath, pngPath  string
	points            int
	afterDeathYr      float64
	set               map[string]bool
}

func newTrackCmd(stdout, stderr io.Writer) *cobra.Command {
	o := &trackOptions{}
	cmd := &cobra.Command{
		Use:   "track --mass MSUN[,MSUN...] [--feh DEX | --z Z] [--out FILE.csv] [--png FILE.png]",
		Short: "write evolutionary tracks as CSV and draw them in the HR diagram",
		Long:  trackLong,
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			o.set = changedFlags(cmd)
			o.set["max-age-after-death"] = cmd.Flags().Changed("max-age-after-death")
			return runTrack(o, stdout)
		},
	}
	f := cmd.Flags()
	f.Var(floatList{&o.masses}, "mass", "initial masses in Msun, comma-separated (0.08–150)")
	f.Float64Var(&o.feh, "feh", 0, "iron abundance [Fe/H] in dex (default 0, i.e. Z = 0.02)")
	f.Float64Var(&o.metallicityZ, "z", 0, "metal mass fraction Z (1e-4–0.03), instead of --feh")
	f.StringVar(&o.outPath, "out", "-", "CSV output file ('-' = standard output)")
	f.StringVar(&o.pngPath, "png", "", "also draw the HR diagram to this PNG file")
	f.IntVar(&o.points, "points", 100, "ages sampled per stage (10–100000)")
	f.Float64Var(&o.afterDeathYr, "max-age-after-death", 1e10, "follow the remnant for this many years")
	return cmd
}

// trackPoint is one row of a track.
type trackPoint struct {
	initialMassMsun, ageYr float64
	star                   evolve.Star
}

func runTrack(o *trackOptions, stdout io.Writer) error {
	if len(o.masses) == 0 {
		return usageErrorf("give at least one initial mass with --mass (e.g. --mass 1,2,5)")
	}
	for _, ms := range o.masses {
		if err := checkMassFlag(ms); err != nil {
			return err
		}
	}
	if o.points < 10 || o.points > 100000 {
		return usageErrorf("--points %d is outside the allowed range [10, 100000]", o.points)
	}
	if !(o.afterDeathYr >= 0 && o.afterDeathYr <= evolve.MaxAgeYr) {
		return usageErrorf("--max-age-after-death %g yr is outside the allowed range [0, %g] yr", o.afterDeathYr, evolve.MaxAgeYr)
	}
	z, _, err := metallicityFromFlags(o.set, o.feh, o.metallicityZ)
	if err != nil {
		return err
	}
	m, err := evolve.NewModel(z)
	if err != nil {
		return asUsage(err)
	}
	masses := append([]float64(nil), o.masses...)
	sort.Float64s(masses)
	var tracks [][]trackPoint
	for _, ms := range masses {
		tr, err := computeTrack(m, ms, o.points, o.afterDeathYr)
		if err != nil {
			return err
		}
		tracks = append(tracks, tr)
	}
	if err := writeTrackCSV(o.outPath, stdout, tracks); err != nil {
		return err
	}
	if o.pngPath != "" {
		if err := plotHR(o.pngPath, tracks, z); err != nil {
			return fmt.Errorf("--png %s: %w", o.pngPath, err)
		}
	}
	return nil
}

// trackAges returns the sample ages of one initial mass: for each stage
// interval [a, b) its start, n/2 evenly spaced ages and n/2 ages whose
// distance to b shrinks geometrically down to 1e-6 (b − a); then the remnant
// in logarithmic steps of its age up to afterDeathYr.
func trackAges(ts evolve.Timescales, n int, afterDeathYr float64) []float64 {
	edges := []float64{0, ts.MSLifetimeYr, ts.BGBYr, ts.HeIgnitionYr, ts.EndCoreHeYr, ts.EndAGBYr}
	var ages []float64
	for i := 0; i+1 < len(edges); i++ {
		a, b := edges[i], edges[i+1]
		if !(b > a) || a > evolve.MaxAgeYr {
			continue
		}
		half := n / 2
		for k := 0; k < half; k++ {
			ages = append(ages, a+(b-a)*float64(k)/float64(half))
		}
		for k := 1; k <= n-half; k++ {
			ages = append(ages, b-(b-a)*math.Pow(1e-6, float64(k)/float64(n-half)))
		}
	}
	end := ts.EndAGBYr
	ages = append(ages, end)
	if afterDeathYr > 0 {
		lo := math.Max(afterDeathYr*1e-8, 1)
		for k := 0; k <= n; k++ {
			ages = append(ages, end+lo*math.Pow(afterDeathYr/lo, float64(k)/float64(n)))
		}
	}
	sort.Float64s(ages)
	out := ages[:0]
	for i, a := range ages {
		if a > evolve.MaxAgeYr {
			break
		}
		if i > 0 && a <= out[len(out)-1] {
			continue
		}
		out = append(out, a)
	}
	return out
}

func computeTrack(m *evolve.Model, massMsun float64, n int, afterDeathYr float64) ([]trackPoint, error) {
	ts, err := m.Timescales(massMsun)
	if err != nil {
		return nil, asUsage(fmt.Errorf("--mass: %w", err))
	}
	ages := trackAges(ts, n, afterDeathYr)
	out := make([]trackPoint, 0, len(ages))
	for _, a := range ages {
		s, err := m.Evolve(massMsun, a)
		if err != nil {
			return nil, err
		}
		out = append(out, trackPoint{massMsun, a, s})
	}
	return out, nil
}

func writeTrackCSV(path string, stdout io.Writer, tracks [][]trackPoint) (err error) {
	w := stdout
	var f *os.File
	if path != "-" {
		f, err = os.Create(path)
		if err != nil {
			return asUsage(fmt.Errorf("--out: %w", err))
		}
		defer func() {
			if cerr := f.Close(); err == nil && cerr != nil {
				err = fmt.Errorf("--out %s: %w", path, cerr)
			}
		}()
		w = f
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintln(bw, "initial_mass_msun,age_yr,stage,mass_msun,luminosity_lsun,teff_k,radius_rsun,logg_cgs,core_mass_msun")
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) } // shortest exact form
	for _, tr := range tracks {
		for _, p := range tr {
			s := p.star
			fmt.Fprintf(bw, "%s,%s,%s,%s,%s,%s,%s,%s,%s\n", g(p.initialMassMsun), g(p.ageYr), s.Stage, g(s.MassMsun),
				g(s.LuminosityLsun), g(s.TeffK), g(s.RadiusRsun), g(s.LoggCgs), g(s.CoreMassMsun))
		}
	}
	return bw.Flush()
}
