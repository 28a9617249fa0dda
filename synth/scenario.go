package synth

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"regexp"
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"
)

// Scenario is a whole simulation request as written in a scenario file. Field names are
// the YAML keys; every field is documented in ScenarioHelp. A Scenario is validated by
// Load or Parse, which fill documented defaults and record where each key was written so
// that later errors can name the line.
type Scenario struct {
	// Name is a free label for the run, copied into the manifest.
	Name string `yaml:"name" json:"name"`
	// Seed is the run seed; every random stream derives from it. Required.
	Seed *uint64 `yaml:"seed" json:"seed"`
	// Components are the stellar populations. At least one is required.
	Components []Component `yaml:"components" json:"components"`
	// Extinction applies to every component that has none of its own.
	Extinction *Extinction `yaml:"extinction,omitempty" json:"extinction,omitempty"`
	// Survey describes the bands, depths, noise and detection rule. Required.
	Survey *Survey `yaml:"survey" json:"survey"`
	// Field places the Galactic components (thin_disc, thick_disc, halo, bulge) on the sky.
	Field *Field `yaml:"field,omitempty" json:"field,omitempty"`
	// Output says what is written where.
	Output Output `yaml:"output" json:"output"`

	file  string
	lines map[string]int
	text  []byte
}

// Component is one stellar population.
type Component struct {
	// Name labels the component in the catalogue's component column. Required, unique.
	Name string `yaml:"name" json:"name"`
	// Kind is "population" (a cluster or simple population placed by Geometry) or one of
	// the Galactic components "thin_disc", "thick_disc", "halo", "bulge" (placed by the
	// scenario's field section). Default "population".
	Kind string `yaml:"kind,omitempty" json:"kind"`
	// Stars is the number of primary stars (systems). Exactly one of Stars and
	// TotalMassMsun is given for a population component.
	Stars int64 `yaml:"stars,omitempty" json:"stars,omitempty"`
	// TotalMassMsun is a total initial mass in Msun (primaries only), sampled stochastically.
	TotalMassMsun float64 `yaml:"total_mass_msun,omitempty" json:"total_mass_msun,omitempty"`
	// MassFunction is the initial mass function of the primaries.
	MassFunction MassFunction `yaml:"mass_function" json:"mass_function"`
	// Age is the star-formation history.
	Age AgeSpec `yaml:"age" json:"age"`
	// Metallicity is the [Fe/H] distribution.
	Metallicity Metallicity `yaml:"metallicity" json:"metallicity"`
	// Binaries describes unresolved companions; absent means no binaries.
	Binaries *Binaries `yaml:"binaries,omitempty" json:"binaries,omitempty"`
	// Geometry places a population component. Required for kind population.
	Geometry *Geometry `yaml:"geometry,omitempty" json:"geometry,omitempty"`
	// Extinction overrides the scenario-wide extinction for this component.
	Extinction *Extinction `yaml:"extinction,omitempty" json:"extinction,omitempty"`
	// DensityScale multiplies a Galactic component's default normalisation (default 1).
	DensityScale float64 `yaml:"density_scale,omitempty" json:"density_scale,omitempty"`
}

// MassFunction selects an initial mass function from package imf.
type MassFunction struct {
	// Kind: salpeter, kroupa, chabrier_single, chabrier_system, broken_power_law, table.
	Kind string `yaml:"kind" json:"kind"`
	// MinMassMsun and MaxMassMsun are the limits (0 = the mass function's default).
	MinMassMsun float64 `yaml:"min_mass_msun,omitempty" json:"min_mass_msun,omitempty"`
	MaxMassMsun float64 `yaml:"max_mass_msun,omitempty" json:"max_mass_msun,omitempty"`
	// BreaksMsun and Slopes define a broken power law (len(Slopes) = len(BreaksMsun)+1).
	BreaksMsun []float64 `yaml:"breaks_msun,omitempty" json:"breaks_msun,omitempty"`
	Slopes     []float64 `yaml:"slopes,omitempty" json:"slopes,omitempty"`
	// Table is a file of mass, dN/dm rows for kind table (relative to the scenario file).
	Table string `yaml:"table,omitempty" json:"table,omitempty"`
}

// AgeSpec is a star-formation history.
type AgeSpec struct {
	// Kind: burst (AgeYr with optional SpreadYr, Gaussian), constant (uniform in age
	// between MinAgeYr and MaxAgeYr), exponential (rate ∝ exp(−t/τ) in formation time t,
	// ages from MinAgeYr to MaxAgeYr, TauYr), table (age, rate rows; piecewise linear).
	Kind     string   `yaml:"kind" json:"kind"`
	AgeYr    Duration `yaml:"age,omitempty" json:"age_yr,omitempty"`
	SpreadYr Duration `yaml:"spread,omitempty" json:"spread_yr,omitempty"`
	MinAgeYr Duration `yaml:"min_age,omitempty" json:"min_age_yr,omitempty"`
	MaxAgeYr Duration `yaml:"max_age,omitempty" json:"max_age_yr,omitempty"`
	TauYr    Duration `yaml:"tau,omitempty" json:"tau_yr,omitempty"`
	Table    string   `yaml:"table,omitempty" json:"table,omitempty"`
}

// Metallicity is an [Fe/H] distribution.
type Metallicity struct {
	// Kind: fixed (FeH), gaussian (FeH mean, SigmaDex), table ([Fe/H], weight rows).
	Kind     string  `yaml:"kind" json:"kind"`
	FeH      float64 `yaml:"feh" json:"feh"`
	SigmaDex float64 `yaml:"sigma_dex,omitempty" json:"sigma_dex,omitempty"`
	Table    string  `yaml:"table,omitempty" json:"table,omitempty"`
}

// Binaries describes unresolved companions.
type Binaries struct {
	// Fraction is the probability that a primary has a companion (0–1).
	Fraction *float64 `yaml:"fraction,omitempty" json:"fraction,omitempty"`
	// FractionByMass gives a primary-mass-dependent fraction: rows of
	// {above_mass_msun, fraction}; a primary takes the fraction of the last row whose
	// mass it reaches. Exclusive with Fraction.
	FractionByMass []MassFraction `yaml:"fraction_by_mass,omitempty" json:"fraction_by_mass,omitempty"`
	// MassRatio is the distribution of q = m2/m1.
	MassRatio MassRatio `yaml:"mass_ratio" json:"mass_ratio"`
}

// MassFraction is one row of a mass-dependent binary fraction.
type MassFraction struct {
	AboveMassMsun float64 `yaml:"above_mass_msun" json:"above_mass_msun"`
	Fraction      float64 `yaml:"fraction" json:"fraction"`
}

// MassRatio is a distribution of q = m2/m1 on [Min, Max] ⊂ (0, 1].
type MassRatio struct {
	// Kind: flat, or power_law with dN/dq ∝ q^Gamma.
	Kind  string  `yaml:"kind" json:"kind"`
	Min   float64 `yaml:"min,omitempty" json:"min"`
	Max   float64 `yaml:"max,omitempty" json:"max"`
	Gamma float64 `yaml:"gamma,omitempty" json:"gamma,omitempty"`
}

// Geometry places a population component.
type Geometry struct {
	// Kind: fixed (every star at DistancePc, at the centre) or plummer (Plummer 1911
	// sphere of ScaleRadiusPc truncated at MaxRadiusPc, centred at DistancePc).
	Kind          string  `yaml:"kind" json:"kind"`
	DistancePc    float64 `yaml:"distance_pc" json:"distance_pc"`
	ScaleRadiusPc float64 `yaml:"scale_radius_pc,omitempty" json:"scale_radius_pc,omitempty"`
	MaxRadiusPc   float64 `yaml:"max_radius_pc,omitempty" json:"max_radius_pc,omitempty"`
	// RADeg and DecDeg are the ICRS centre of the component on the sky.
	RADeg  float64 `yaml:"ra_deg" json:"ra_deg"`
	DecDeg float64 `yaml:"dec_deg" json:"dec_deg"`
}

// Extinction describes the dust in front of a component.
type Extinction struct {
	// Law: ccm89, od94 or f99. RV default 3.1.
	Law string  `yaml:"law" json:"law"`
	RV  float64 `yaml:"rv,omitempty" json:"rv"`
	// AVMag is the mean V-band extinction; AVSpreadMag the per-star Gaussian spread
	// (differential reddening, truncated at zero). For Galactic components the sight-line
	// model of the field section is used instead, and AVMag is ignored.
	AVMag       float64 `yaml:"av_mag" json:"av_mag"`
	AVSpreadMag float64 `yaml:"av_spread_mag,omitempty" json:"av_spread_mag,omitempty"`
}

// Survey describes what the instrument sees.
type Survey struct {
	Name  string       `yaml:"name" json:"name"`
	Bands []SurveyBand `yaml:"bands" json:"bands"`
	// Detection: which bands must detect a star for it to count as detected.
	Detection Detection `yaml:"detection" json:"detection"`
}

// SurveyBand is one band of a survey.
type SurveyBand struct {
	// Band is a built-in band name (see `starmock bands`), or the name given to a user
	// filter read from Passband.
	Band string `yaml:"band" json:"band"`
	// Passband is a user filter file (wavelength_angstrom, throughput; see package phot)
	// whose AB magnitudes are computed with blackbody colour terms tied to the nearest
	// built-in band (approximate for cool stars, flagged "blackbody").
	Passband string `yaml:"passband,omitempty" json:"passband,omitempty"`
	// Limit5SigmaMag is the magnitude at which a point source has S/N = 5.
	Limit5SigmaMag float64 `yaml:"limit_5sigma_mag" json:"limit_5sigma_mag"`
	// FloorMag is the systematic error added in quadrature (mag). Default 0.005.
	FloorMag *float64 `yaml:"floor_mag,omitempty" json:"floor_mag"`
	// SaturationMag: stars brighter than this are flagged saturated and not detected.
	SaturationMag float64 `yaml:"saturation_mag" json:"saturation_mag"`
	// Noise: "ivezic2019" (Ivezić et al. 2019 eqs. 4–5 with Gamma, default 0.039),
	// "background_limited" (σ_flux = f5/5) or "table" (Table: mag, error rows).
	// Default ivezic2019.
	Noise string   `yaml:"noise,omitempty" json:"noise"`
	Gamma *float64 `yaml:"gamma,omitempty" json:"gamma,omitempty"`
	Table string   `yaml:"table,omitempty" json:"table,omitempty"`
	// Completeness: extra losses on top of the S/N threshold (which alone already makes
	// the survey limit): "none" (default), "logistic" (50 % at Completeness50Mag, default
	// the 5σ limit, width CompletenessWidthMag, default 0.2 mag) or "table"
	// (CompletenessTable: mag, fraction rows).
	Completeness         string   `yaml:"completeness,omitempty" json:"completeness"`
	Completeness50Mag    *float64 `yaml:"completeness_50_mag,omitempty" json:"completeness_50_mag,omitempty"`
	CompletenessWidthMag float64  `yaml:"completeness_width_mag,omitempty" json:"completeness_width_mag,omitempty"`
	CompletenessTable    string   `yaml:"completeness_table,omitempty" json:"completeness_table,omitempty"`
}

// Detection is the rule that combines per-band detections.
type Detection struct {
	// Rule: all_of, any_of or at_least (with Count). Default all_of.
	Rule  string   `yaml:"rule" json:"rule"`
	Bands []string `yaml:"bands" json:"bands"`
	Count int      `yaml:"count,omitempty" json:"count,omitempty"`
}

// Output says what is written.
type Output struct {
	// Path is the catalogue path without extension or with one; each format adds its own
	// extension. Relative paths are relative to the current directory.
	Path string `yaml:"path" json:"path"`
	// Formats: any of parquet, arrow, fits, csv. Default [parquet].
	Formats []string `yaml:"formats,omitempty" json:"formats"`
	// Columns restricts the catalogue to these columns (default: all).
	Columns []string `yaml:"columns,omitempty" json:"columns,omitempty"`
	// ChunkSize is the number of stars per chunk (default 32768). It fixes the random
	// streams, so changing it changes the catalogue.
	ChunkSize int `yaml:"chunk_size,omitempty" json:"chunk_size"`
	// Workers is the number of goroutines (default: the number of CPUs). It never changes
	// the catalogue.
	Workers int `yaml:"workers,omitempty" json:"workers"`
	// DetectedOnly writes only stars that pass the detection rule.
	DetectedOnly bool `yaml:"detected_only,omitempty" json:"detected_only"`
}

// Duration is a time span in years. In YAML it is a number of years or a string with a
// unit: "4.57Gyr", "300 Myr", "1e9yr", "1e9".
type Duration float64

// UnmarshalYAML accepts a number (years) or a string with yr, kyr, Myr or Gyr.
func (d *Duration) UnmarshalYAML(n *yaml.Node) error {
	v, err := ParseDuration(n.Value)
	if err != nil {
		return fmt.Errorf("line %d: %w", n.Line, err)
	}
	*d = Duration(v)
	return nil
}

var durationRE = regexp.MustCompile(`^\s*([-+0-9.eE]+)\s*(yr|kyr|Myr|Gyr)?\s*$`)

// ParseDuration reads a time span in years from "4.57Gyr", "300 Myr", "1e9yr" or "1e9".
func ParseDuration(s string) (float64, error) {
	m := durationRE.FindStringSubmatch(s)
	if m == nil {
		return 0, fmt.Errorf("bad time %q: want a number of years or a number with yr, kyr, Myr or Gyr", s)
	}
	v, err := strconv.ParseFloat(m[1], 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("bad time %q: want a finite number of years", s)
	}
	switch m[2] {
	case "kyr":
		v *= 1e3
	case "Myr":
		v *= 1e6
	case "Gyr":
		v *= 1e9
	}
	return v, nil
}

// ScenarioError is a problem in a scenario file, located by file, line and field.
type ScenarioError struct {
	File  string
	Line  int
	Field string
	Msg   string
}

func (e *ScenarioError) Error() string {
	loc := e.File
	if e.Line > 0 {
		loc = fmt.Sprintf("%s:%d", e.File, e.Line)
	}
	if e.Field != "" {
		return fmt.Sprintf("%s: %s: %s", loc, e.Field, e.Msg)
	}
	return fmt.Sprintf("%s: %s", loc, e.Msg)
}

// Load reads and validates a scenario file.
func Load(path string) (*Scenario, error) {
	text, err := os.ReadFile(path)
	if err != nil {
		return nil, &ScenarioError{File: path, Msg: err.Error()}
	}
	return Parse(path, text)
}

var yamlLineRE = regexp.MustCompile(`^(?:yaml: )?line (\d+): (.*)$`)

// Parse decodes scenario text strictly (unknown keys are errors), fills defaults and
// validates every field. file names the source in error messages.
func Parse(file string, text []byte) (*Scenario, error) {
	s := &Scenario{file: file, text: append([]byte(nil), text...)}
	dec := yaml.NewDecoder(bytes.NewReader(text))
	dec.KnownFields(true)
	if err := dec.Decode(s); err != nil {
		return nil, yamlError(file, err)
	}
	var root yaml.Node
	if err := yaml.Unmarshal(text, &root); err != nil {
		return nil, yamlError(file, err)
	}
	s.lines = map[string]int{}
	indexLines(&root, "", s.lines)
	if err := s.validate(); err != nil {
		return nil, err
	}
	return s, nil
}

func yamlError(file string, err error) error {
	var te *yaml.TypeError
	msgs := []string{err.Error()}
	if errors.As(err, &te) {
		msgs = te.Errors
	}
	// Report the first problem with its line; yaml.v3 phrases them as "line N: ...".
	first := strings.TrimPrefix(msgs[0], "yaml: unmarshal errors:\n")
	first = strings.TrimSpace(first)
	if m := yamlLineRE.FindStringSubmatch(first); m != nil {
		line, _ := strconv.Atoi(m[1])
		msg := m[2]
		msg = strings.Replace(msg, "not found in type synth.", "is not a known key in ", 1)
		if len(msgs) > 1 {
			msg += fmt.Sprintf(" (and %d more problems)", len(msgs)-1)
		}
		return &ScenarioError{File: file, Line: line, Msg: msg}
	}
	if err.Error() == "EOF" {
		return &ScenarioError{File: file, Msg: "the file is empty"}
	}
	return &ScenarioError{File: file, Msg: first}
}

// indexLines records the line of every key path ("components[0].age.kind").
func indexLines(n *yaml.Node, path string, lines map[string]int) {
	switch n.Kind {
	case yaml.DocumentNode:
		for _, c := range n.Content {
			indexLines(c, path, lines)
		}
	case yaml.MappingNode:
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := n.Content[i], n.Content[i+1]
			p := k.Value
			if path != "" {
				p = path + "." + k.Value
			}
			lines[p] = k.Line
			indexLines(v, p, lines)
		}
	case yaml.SequenceNode:
		for i, c := range n.Content {
			p := fmt.Sprintf("%s[%d]", path, i)
			lines[p] = c.Line
			indexLines(c, p, lines)
		}
	}
}

// errf builds a ScenarioError for a key path, finding the line of the key or of its
// nearest written parent.
func (s *Scenario) errf(field, format string, a ...any) error {
	return &ScenarioError{File: s.file, Line: s.lineOf(field), Field: field, Msg: fmt.Sprintf(format, a...)}
}

func (s *Scenario) lineOf(field string) int {
	for p := field; p != ""; {
		if l, ok := s.lines[p]; ok {
			return l
		}
		i := strings.LastIndexAny(p, ".[")
		if i < 0 {
			break
		}
		p = p[:i]
	}
	return 0
}

// File returns the path the scenario was read from.
func (s *Scenario) File() string { return s.file }

// Text returns the scenario file exactly as given.
func (s *Scenario) Text() []byte { return s.text }
