package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/phot"
)

func init() { extraCommands = append(extraCommands, newBandsCmd) }

const bandsLong = `List the photometric bands starmock knows: name, magnitude system
(vega or ab), pivot wavelength in angstrom (computed from the passband curve)
and the source of the curve.

Built-in bands: U B V Rc Ic (Johnson-Cousins, Vega), J H Ks (2MASS, Vega),
u g r i z (SDSS, AB), G BP RP (Gaia DR3, Vega), and lsst_u ... lsst_y (Rubin,
AB; curves only, no bolometric corrections in the built-in grid). --passband
adds your own filter files (two columns: wavelength in angstrom, throughput;
AB magnitudes).

With --av, each band's extinction coefficient A_X/A_V is also printed, for
the extinction law --law at R_V = --rv, computed by synthetic photometry of a
blackbody of --teff kelvin reddened by A_V magnitudes (so it depends on the
star's temperature and on A_V, strongly for wide bands such as Gaia G), and
A_X in magnitudes. E(B-V) = A_V / R_V.

Examples:
  # the band list
  starmock bands

  # A_X/A_V for a sun-like star behind A_V = 1 mag of R_V = 3.1 dust (CCM89)
  starmock bands --av 1

  # a hot star, Fitzpatrick (1999) law, R_V = 5
  starmock bands --av 2 --rv 5 --law f99 --teff 20000`

type bandsOptions struct {
	avMag     float64
	rv        float64
	law       string
	teffK     float64
	passbands []string
}

func newBandsCmd(stdout, stderr io.Writer) *cobra.Command {
	o := &bandsOptions{}
	cmd := &cobra.Command{
		Use:   "bands",
		Short: "list photometric bands, and their extinction coefficients for a given A_V",
		Long:  bandsLong,
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runBands(stdout, o, cmd.Flags().Changed("av"))
		},
	}
	f := cmd.Flags()
	f.Float64Var(&o.avMag, "av", 0, "V-band extinction A_V in mag (>= 0); prints A_X/A_V per band")
	f.Float64Var(&o.rv, "rv", dust.DefaultRV, fmt.Sprintf("ratio of total to selective extinction R_V = A_V/E(B-V), %g to %g", dust.MinRV, dust.MaxRV))
	f.StringVar(&o.law, "law", dust.NameCCM89, "extinction law: "+strings.Join(dust.LawNames(), ", "))
	f.Float64Var(&o.teffK, "teff", 5772, "temperature in K of the blackbody source spectrum for A_X/A_V (1000 to 200000)")
	f.StringArrayVar(&o.passbands, "passband", nil, "your own passband file (wavelength_angstrom, throughput); repeatable")
	return cmd
}

func runBands(w io.Writer, o *bandsOptions, withAV bool) error {
	bands := phot.BuiltinBands()
	for _, path := range o.passbands {
		pb, err := phot.LoadPassband(path)
		if err != nil {
			return asUsage(fmt.Errorf("--passband: %w", err))
		}
		bands = append(bands, phot.Band{Name: pb.Name, System: phot.SystemAB, PivotAA: pb.PivotAA(), Source: pb.Source, Curve: pb})
	}
	var law dust.Law
	if withAV {
		if !(o.avMag >= 0) {
			return usageErrorf("--av %v mag: want A_V >= 0 mag", o.avMag)
		}
		if !(o.teffK >= 1000 && o.teffK <= 200000) {
			return usageErrorf("--teff %v K: want 1000 to 200000 K", o.teffK)
		}
		var err error
		if law, err = dust.NewLaw(o.law, o.rv); err != nil {
			return asUsage(fmt.Errorf("--law/--rv: %w", err))
		}
		ebv, err := dust.EBV(o.avMag, o.rv)
		if err != nil {
			return asUsage(err)
		}
		fmt.Fprintf(w, "# extinction law %s, R_V = %g, A_V = %g mag, E(B-V) = A_V/R_V = %.4f mag; source spectrum: blackbody %g K\n",
			law.Name(), law.RV(), o.avMag, ebv, o.teffK)
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	if withAV {
		fmt.Fprintln(tw, "band\tsystem\tpivot_aa\ta_x_over_a_v\ta_x_mag\tsource")
	} else {
		fmt.Fprintln(tw, "band\tsystem\tpivot_aa\tsource")
	}
	spec := phot.BlackbodyFLambda(o.teffK)
	for _, b := range bands {
		pivot := strconv.FormatFloat(b.PivotAA, 'f', 1, 64)
		if !withAV {
			fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", b.Name, b.System, pivot, b.Source)
			continue
		}
		pb := dust.Passband{WavelengthAA: b.Curve.WavelengthAA, Throughput: b.Curve.Throughput, Photon: b.Curve.Photon}
		ratio, err := dust.BandRatio(law, pb, spec, o.avMag)
		if err != nil {
			return asUsage(fmt.Errorf("band %s: %w", b.Name, err))
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%.4f\t%.4f\t%s\n", b.Name, b.System, pivot, ratio, ratio*o.avMag, b.Source)
	}
	return tw.Flush()
}
