package main

import (
	"fmt"
	"io"
	"math"
	"text/tabwriter"

	"github.com/starmock/starmock/synth/phot"
)

// starPhotometry is the photometric part of a star report: absolute magnitudes in the
// 16 standard bands (null where the star has no light or lies outside every
// calibration), the provenance of its bolometric corrections, and the MK labels.
type starPhotometry struct {
	AbsMag          map[string]*float64 `json:"abs_mag"`
	PhotQuality     string              `json:"phot_quality"`
	SpectralType    *string             `json:"spectral_type"`
	LuminosityClass *string             `json:"luminosity_class"`
	// LoggAssumed is true when the star was given without log g or mass, and the
	// photometry used the main-sequence gravity at its Teff.
	LoggAssumed bool `json:"logg_assumed,omitempty"`
}

// addPhotometry computes the photometry of a star report with the built-in grid.
func addPhotometry(r *starReport) error {
	p, err := phot.NewDefaultPhotometer()
	if err != nil {
		return err
	}
	bands := p.Bands()
	mags := make([]float64, len(bands))
	r.starPhotometry = &starPhotometry{AbsMag: map[string]*float64{}}
	dark := r.Stage != nil && (*r.Stage == "neutron_star" || *r.Stage == "black_hole" || *r.Stage == "no_remnant")
	lum := r.LuminosityLsun
	if dark || !(lum > 0) || !(r.TeffK > 0) {
		lum = math.NaN() // no light: the photometer returns quality "none"
	}
	var logg float64
	switch {
	case r.LoggCgs != nil:
		logg = *r.LoggCgs
	case r.TeffK > 0:
		logg = phot.MainSequenceLoggCgs(r.TeffK)
		r.starPhotometry.LoggAssumed = true
	}
	q := p.AbsMags(r.TeffK, logg, r.FeH, lum, mags)
	r.starPhotometry.PhotQuality = q.String()
	for i, b := range bands {
		if math.IsNaN(mags[i]) || math.IsInf(mags[i], 0) {
			r.starPhotometry.AbsMag[b.Name] = nil
			continue
		}
		v := math.Round(mags[i]*1e4) / 1e4
		r.starPhotometry.AbsMag[b.Name] = &v
	}
	if !math.IsNaN(lum) {
		if st := phot.StarSpectralType(r.TeffK, logg); st != "" {
			r.starPhotometry.SpectralType = &st
		}
		if lc := phot.LuminosityClass(logg, lum, r.TeffK); lc != "" {
			r.starPhotometry.LuminosityClass = &lc
		}
	}
	return nil
}

// printPhotometry prints the photometric part of a report as text.
func printPhotometry(w io.Writer, r *starReport) error {
	ph := r.starPhotometry
	if ph == nil {
		return nil
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	label := func(s *string) string {
		if s == nil {
			return "—"
		}
		return *s
	}
	fmt.Fprintf(tw, "spectral type\t%s %s\n", label(ph.SpectralType), label(ph.LuminosityClass))
	note := ""
	if ph.LoggAssumed {
		note = " (log g of the main sequence assumed)"
	}
	fmt.Fprintf(tw, "bolometric corrections\t%s%s\n", ph.PhotQuality, note)
	p, err := phot.NewDefaultPhotometer()
	if err != nil {
		return err
	}
	for _, b := range p.Bands() {
		fmt.Fprintf(tw, "M_%s\t%s mag (%s)\n", b.Name, fmtOpt(ph.AbsMag[b.Name], "%.3f"), b.System)
	}
	return tw.Flush()
}
