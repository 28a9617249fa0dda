package main

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/imf"
)

func init() { extraCommands = append(extraCommands, newIMFCmd) }

const imfLong = `Inspect an initial mass function (IMF), or draw stellar masses from it.

Without --sample or --total-msun, prints the properties of the chosen mass
function: its limits, the mean stellar mass, the fraction of stars (by
number) and of mass in each bin given by --bins-msun, and the expected number
of stars above each mass in --above-msun per solar mass of stars formed.
--format chooses a readable table or JSON.

With --sample N, draws N masses; with --total-msun M, draws stars until
their summed mass reaches M, with the stop-nearest rule: the star that
crosses M is kept only if that brings the total closer to M, so the realised
total is within half a stellar mass of M; it is reported on stderr. Masses
are written as CSV with one column, mass_msun, to --out (default: standard
output). The same --seed gives the same masses (the random stream is PCG
seeded with the pair (--seed, 0x696d66), one uniform number per star).

Mass functions (--form):
  salpeter          Salpeter (1955): dN/dm ∝ m^-2.35
  kroupa            Kroupa (2001): alpha 0.3 / 1.3 / 2.3, breaks 0.08 and 0.5 Msun
  chabrier_single   Chabrier (2003) individual objects: lognormal below 1 Msun,
                    m_c = 0.079 Msun, sigma = 0.69; power law x = 1.3 above
  chabrier_system   Chabrier (2003) unresolved systems: m_c = 0.22 Msun,
                    sigma = 0.57; power law x = 1.3 above 1 Msun
  broken_power_law  your own: --breaks-msun and --slopes (alpha of dN/dm ∝ m^-alpha)
  table             your own file of mass_msun, dn_dm rows (--table), interpolated
                    in log–log; '#' comments and one header line allowed

Mass limits: --min-mass-msun and --max-mass-msun; 0 means the default, 0.1 and 100 Msun
for the published forms (which accept 0.01 to 150 Msun) and for
broken_power_law, and the table's own first and last mass for a table.

Examples:
  # mean mass and fractions of the Kroupa IMF between 0.08 and 150 Msun
  starmock imf --form kroupa --min-mass-msun 0.08 --max-mass-msun 150

  # the same as JSON, with your own bins and thresholds
  starmock imf --form chabrier_system --bins-msun 0.1,0.5,1,8,100 \
      --above-msun 0.8,8,20 --format json

  # a steeper-than-Salpeter broken power law for the invented cluster "Brinmoor 3"
  starmock imf --form broken_power_law --breaks-msun 0.5 --slopes 1.3,2.7

  # 100000 Chabrier masses to a CSV file, reproducibly
  starmock imf --form chabrier_single --sample 100000 --seed 7 --out masses.csv

  # stars of a 5000 Msun cluster drawn from a tabulated mass function
  starmock imf --form table --table my_imf.txt --total-msun 5000 --seed 3 > cluster.csv`

// imfOptions holds the parsed flags of the imf command.
type imfOptions struct {
	form      enumValue
	format    enumValue
	loMsun    float64
	hiMsun    float64
	breaks    []float64
	slopes    []float64
	tablePath string
	binsMsun  []float64
	aboveMsun []float64
	sample    int64
	totalMsun float64
	seed      uint64
	outPath   string
	sampleSet bool
	totalSet  bool
	binsSet   bool
	formatSet bool
}

// enumValue is a pflag.Value that accepts one of a fixed list of words, so
// bad values fail at parse time with the allowed list.
type enumValue struct {
	value   string
	allowed []string
}

func (e *enumValue) String() string { return e.value }
func (e *enumValue) Type() string   { return "word" }
func (e *enumValue) Set(s string) error {
	for _, a := range e.allowed {
		if s == a {
			e.value = s
			return nil
		}
	}
	return fmt.Errorf("%q is not one of %s", s, strings.Join(e.allowed, ", "))
}

// floatList is a pflag.Value for a comma-separated list of numbers, shown
// in help as plain numbers ("1,8") rather than Go slice syntax.
type floatList struct{ v *[]float64 }

func (l floatList) Type() string { return "list" }
func (l floatList) String() string {
	if l.v == nil {
		return ""
	}
	parts := make([]string, len(*l.v))
	for i, x := range *l.v {
		parts[i] = strconv.FormatFloat(x, 'g', -1, 64)
	}
	return strings.Join(parts, ",")
}
func (l floatList) Set(s string) error {
	var out []float64
	for _, f := range strings.Split(s, ",") {
		x, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil {
			return fmt.Errorf("%q is not a number", f)
		}
		out = append(out, x)
	}
	*l.v = out
	return nil
}

// imfSeedStream is the second PCG word used with --seed, so that the mass
// stream of this command is fixed and documented: PCG(seed, 0x696d66).
const imfSeedStream = 0x696d66 // "imf"

// maxTotalMsun bounds --total-msun: all masses are held in memory (about
// 8 bytes × 1.7 stars per Msun for typical IMFs, so ~140 MB at the bound).
const maxTotalMsun = 1e7

func newIMFCmd(stdout, stderr io.Writer) *cobra.Command {
	o := &imfOptions{
		form:   enumValue{value: imf.KindKroupa, allowed: imf.Kinds()},
		format: enumValue{value: "table", allowed: []string{"table", "json"}},
		seed:   1,
	}
	cmd := &cobra.Command{
		Use:   "imf [flags]",
		Short: "show the properties of an initial mass function or sample masses from it",
		Long:  imfLong,
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			fl := cmd.Flags()
			o.sampleSet, o.totalSet = fl.Changed("sample"), fl.Changed("total-msun")
			o.binsSet, o.formatSet = fl.Changed("bins-msun"), fl.Changed("format")
			return runIMF(cmd.Context(), o, stdout, stderr)
		},
	}
	f := cmd.Flags()
	f.Var(&o.form, "form", "mass function: "+strings.Join(imf.Kinds(), ", "))
	f.Float64Var(&o.loMsun, "min-mass-msun", 0, "lower mass limit in Msun (0 = default: 0.1, or the table's first mass)")
	f.Float64Var(&o.hiMsun, "max-mass-msun", 0, "upper mass limit in Msun (0 = default: 100, or the table's last mass)")
	f.Var(floatList{&o.breaks}, "breaks-msun", "interior break masses in Msun of a broken_power_law, increasing (e.g. 0.08,0.5)")
	f.Var(floatList{&o.slopes}, "slopes", "exponents alpha of dN/dm ∝ m^-alpha of a broken_power_law, one more than breaks (e.g. 0.3,1.3,2.3)")
	f.StringVar(&o.tablePath, "table", "", "file of mass_msun, dn_dm rows for --form table")
	f.Var(floatList{&o.binsMsun}, "bins-msun", "bin edges in Msun for number and mass fractions, increasing (default: lo, 0.5, 1, 8, hi, keeping those inside the limits)")
	o.aboveMsun = []float64{1, 8}
	f.Var(floatList{&o.aboveMsun}, "above-msun", "masses in Msun for the expected number of stars above them per Msun formed")
	f.Var(&o.format, "format", "properties output: table, json")
	f.Int64Var(&o.sample, "sample", 0, "draw this many masses and write them as CSV")
	f.Float64Var(&o.totalMsun, "total-msun", 0, fmt.Sprintf("draw stars up to this total mass in Msun (at most %g) and write them as CSV", float64(maxTotalMsun)))
	f.Uint64Var(&o.seed, "seed", 1, "random seed for --sample and --total-msun")
	f.StringVar(&o.outPath, "out", "-", "CSV output file for samples ('-' = standard output)")
	return cmd
}

func runIMF(ctx context.Context, o *imfOptions, stdout, stderr io.Writer) error {
	spec := imf.Spec{Kind: o.form.value, LoMsun: o.loMsun, HiMsun: o.hiMsun, Breaks: o.breaks, Slopes: o.slopes, TablePath: o.tablePath}
	switch {
	case o.form.value != imf.KindBrokenPowerLaw && (len(o.breaks) > 0 || len(o.slopes) > 0):
		return usageErrorf("--breaks-msun and --slopes are only used with --form %s, not --form %s", imf.KindBrokenPowerLaw, o.form.value)
	case o.form.value != imf.KindTable && o.tablePath != "":
		return usageErrorf("--table is only used with --form %s, not --form %s", imf.KindTable, o.form.value)
	case o.form.value == imf.KindTable && o.tablePath == "":
		return usageErrorf("--form %s needs --table FILE (rows of mass_msun, dn_dm)", imf.KindTable)
	}
	f, err := imf.New(spec)
	if err != nil {
		return asUsage(fmt.Errorf("--form %s: %w", o.form.value, err))
	}
	if o.sampleSet && o.totalSet {
		return usageErrorf("--sample and --total-msun cannot be used together: choose a number of stars or a total mass")
	}
	if o.sampleSet || o.totalSet {
		if o.binsSet || o.formatSet {
			return usageErrorf("--bins-msun and --format apply to the properties output, not to sampling with --sample or --total-msun")
		}
		return sampleIMF(ctx, o, f, stdout, stderr)
	}
	bins, err := resolveBins(o, f)
	if err != nil {
		return err
	}
	for _, m := range o.aboveMsun {
		if math.IsNaN(m) || math.IsInf(m, 0) || m <= 0 {
			return usageErrorf("--above-msun: %g Msun is not a positive finite mass", m)
		}
	}
	props := computeProperties(f, bins, o.aboveMsun)
	if o.format.value == "json" {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		return enc.Encode(props)
	}
	return writePropertiesTable(stdout, props)
}

// resolveBins returns the bin edges: the user's (validated) or the default.
func resolveBins(o *imfOptions, f imf.IMF) ([]float64, error) {
	lo, hi := f.Bounds()
	if !o.binsSet {
		edges := []float64{lo}
		for _, m := range []float64{0.5, 1, 8} {
			if m > lo && m < hi {
				edges = append(edges, m)
			}
		}
		return append(edges, hi), nil
	}
	if len(o.binsMsun) < 2 {
		return nil, usageErrorf("--bins-msun needs at least two edges, got %d", len(o.binsMsun))
	}
	for i, m := range o.binsMsun {
		if math.IsNaN(m) || math.IsInf(m, 0) || m <= 0 {
			return nil, usageErrorf("--bins-msun edge %d: %g Msun is not a positive finite mass", i+1, m)
		}
		if i > 0 && m <= o.binsMsun[i-1] {
			return nil, usageErrorf("--bins-msun edges must be strictly increasing: edge %d is %g Msun after %g Msun", i+1, m, o.binsMsun[i-1])
		}
	}
	return o.binsMsun, nil
}

// imfProperties is the properties report (also the JSON schema).
type imfProperties struct {
	Form         string          `json:"form"`
	LoMsun       float64         `json:"min_mass_msun"`
	HiMsun       float64         `json:"max_mass_msun"`
	MeanMassMsun float64         `json:"mean_mass_msun"`
	Bins         []imfBin        `json:"bins"`
	NumberAbove  []imfNumberOver `json:"number_above_per_msun"`
}

type imfBin struct {
	LoMsun         float64 `json:"lo_msun"`
	HiMsun         float64 `json:"hi_msun"`
	NumberFraction float64 `json:"number_fraction"`
	MassFraction   float64 `json:"mass_fraction"`
}

type imfNumberOver struct {
	MassMsun   float64 `json:"mass_msun"`
	PerMsunSum float64 `json:"stars_per_msun_formed"`
}

func computeProperties(f imf.IMF, bins, above []float64) imfProperties {
	lo, hi := f.Bounds()
	p := imfProperties{Form: f.Name(), LoMsun: lo, HiMsun: hi, MeanMassMsun: f.Mean(),
		Bins: []imfBin{}, NumberAbove: []imfNumberOver{}}
	for i := 0; i+1 < len(bins); i++ {
		p.Bins = append(p.Bins, imfBin{LoMsun: bins[i], HiMsun: bins[i+1],
			NumberFraction: f.NumberFraction(bins[i], bins[i+1]), MassFraction: f.MassFraction(bins[i], bins[i+1])})
	}
	for _, m := range above {
		p.NumberAbove = append(p.NumberAbove, imfNumberOver{MassMsun: m, PerMsunSum: imf.ExpectedNumberAbove(f, m)})
	}
	return p
}

func writePropertiesTable(w io.Writer, p imfProperties) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "mass function:\t%s\n", p.Form)
	fmt.Fprintf(tw, "mass limits:\t%g to %g Msun\n", p.LoMsun, p.HiMsun)
	fmt.Fprintf(tw, "mean mass:\t%.6g Msun\n", p.MeanMassMsun)
	fmt.Fprintln(tw)
	fmt.Fprintln(tw, "bin (Msun)\tnumber fraction\tmass fraction")
	for _, b := range p.Bins {
		fmt.Fprintf(tw, "[%g, %g)\t%.6g\t%.6g\n", b.LoMsun, b.HiMsun, b.NumberFraction, b.MassFraction)
	}
	if len(p.NumberAbove) > 0 {
		fmt.Fprintln(tw)
		fmt.Fprintln(tw, "stars above (Msun)\tper Msun formed")
		for _, n := range p.NumberAbove {
			fmt.Fprintf(tw, "%g\t%.6g\n", n.MassMsun, n.PerMsunSum)
		}
	}
	return tw.Flush()
}

// sampleIMF writes sampled masses as CSV to --out (a temporary file renamed
// on success) or stdout.
func sampleIMF(ctx context.Context, o *imfOptions, f imf.IMF, stdout, stderr io.Writer) error {
	if o.sampleSet && o.sample <= 0 {
		return usageErrorf("--sample: %d stars, need a positive number", o.sample)
	}
	if o.totalSet && (math.IsNaN(o.totalMsun) || o.totalMsun <= 0 || o.totalMsun > maxTotalMsun) {
		return usageErrorf("--total-msun: %g Msun is outside (0, %g] Msun", o.totalMsun, float64(maxTotalMsun))
	}
	r := rand.New(rand.NewPCG(o.seed, imfSeedStream))
	out, commit, abort, err := openOutput(o.outPath, stdout)
	if err != nil {
		return err
	}
	bw := bufio.NewWriterSize(out, 1<<16)
	werr := func() error {
		if _, err := bw.WriteString("mass_msun\n"); err != nil {
			return err
		}
		buf := make([]byte, 0, 32)
		write := func(m float64) error {
			buf = strconv.AppendFloat(buf[:0], m, 'g', -1, 64)
			buf = append(buf, '\n')
			_, err := bw.Write(buf)
			return err
		}
		if o.totalSet {
			masses, total := imf.SampleTotalMass(f, o.totalMsun, r, nil)
			for _, m := range masses {
				if err := write(m); err != nil {
					return err
				}
			}
			fmt.Fprintf(stderr, "starmock imf: %d stars, realised total %.6g Msun (target %g Msun, stop-nearest rule)\n", len(masses), total, o.totalMsun)
		} else {
			for i := int64(0); i < o.sample; i++ {
				if i&0xffff == 0 && ctx.Err() != nil {
					return ctx.Err()
				}
				if err := write(f.Rand(r)); err != nil {
					return err
				}
			}
		}
		return bw.Flush()
	}()
	if werr != nil {
		abort()
		return fmt.Errorf("writing samples to %s: %w", o.outPath, werr)
	}
	return commit()
}

// openOutput returns the writer for path ("-" = stdout). For a file it
// writes to a temporary name in the same folder; commit renames it into
// place, abort removes it.
func openOutput(path string, stdout io.Writer) (io.Writer, func() error, func(), error) {
	if path == "-" || path == "" {
		return stdout, func() error { return nil }, func() {}, nil
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return nil, nil, nil, asUsage(fmt.Errorf("--out %s: %w", path, err))
	}
	commit := func() error {
		if err := tmp.Close(); err != nil {
			os.Remove(tmp.Name())
			return fmt.Errorf("closing %s: %w", path, err)
		}
		if err := os.Rename(tmp.Name(), path); err != nil {
			os.Remove(tmp.Name())
			return fmt.Errorf("writing %s: %w", path, err)
		}
		return nil
	}
	abort := func() { tmp.Close(); os.Remove(tmp.Name()) }
	return tmp, commit, abort, nil
}
