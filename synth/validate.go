package synth

import (
	"fmt"
	"math"
	"path/filepath"
	"strings"
)

// Limits a scenario is checked against.
const (
	// MaxAgeYr is the oldest allowed stellar age: the age of the Universe, 13.8 Gyr
	// (Planck Collaboration 2020, A&A 641, A6: 13.797 ± 0.023 Gyr; rounded, from memory).
	MaxAgeYr = 13.8e9
	// MaxDistancePc bounds distances to the Local Group scale (1 Mpc).
	MaxDistancePc = 1e6
	// DefaultChunkSize is the number of stars per chunk when the scenario gives none.
	DefaultChunkSize = 32768
	// MaxChunkSize bounds a chunk's memory.
	MaxChunkSize = 1 << 22
)

var (
	componentKinds = []string{"population", "thin_disc", "thick_disc", "halo", "bulge"}
	ageKinds       = []string{"burst", "constant", "exponential", "table"}
	fehKinds       = []string{"fixed", "gaussian", "table"}
	qKinds         = []string{"flat", "power_law"}
	geometryKinds  = []string{"fixed", "plummer"}
	noiseKinds     = []string{"ivezic2019", "background_limited", "table"}
	complKinds     = []string{"logistic", "table", "none"}
	ruleKinds      = []string{"all_of", "any_of", "at_least"}
	formatKinds    = []string{"parquet", "arrow", "fits", "csv"}
)

func oneOf(v string, allowed []string) bool {
	for _, a := range allowed {
		if v == a {
			return true
		}
	}
	return false
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// resolvePath makes a table path relative to the scenario file.
func (s *Scenario) resolvePath(p string) string {
	if p == "" || filepath.IsAbs(p) {
		return p
	}
	return filepath.Join(filepath.Dir(s.file), p)
}

func (s *Scenario) validate() error {
	if s.Seed == nil {
		return s.errf("seed", "missing: give a non-negative integer seed")
	}
	if len(s.Components) == 0 {
		return s.errf("components", "missing: give at least one component")
	}
	names := map[string]bool{}
	hasGalactic := false
	for i := range s.Components {
		c := &s.Components[i]
		p := fmt.Sprintf("components[%d]", i)
		if c.Name == "" {
			return s.errf(p+".name", "missing: every component needs a name")
		}
		if names[c.Name] {
			return s.errf(p+".name", "duplicate component name %q", c.Name)
		}
		names[c.Name] = true
		if c.Kind == "" {
			c.Kind = "population"
		}
		if !oneOf(c.Kind, componentKinds) {
			return s.errf(p+".kind", "unknown component kind %q; allowed: %s", c.Kind, strings.Join(componentKinds, ", "))
		}
		if err := s.validateComponent(p, c); err != nil {
			return err
		}
		if c.Kind != "population" {
			hasGalactic = true
		}
	}
	if hasGalactic {
		if s.Field == nil {
			return s.errf("field", "missing: Galactic components need a field section (sky area and distance range)")
		}
		if err := s.validateField(); err != nil {
			return err
		}
	}
	if s.Extinction != nil {
		if err := s.validateExtinction("extinction", s.Extinction); err != nil {
			return err
		}
	}
	if s.Survey == nil {
		return s.errf("survey", "missing: give the survey bands and detection rule")
	}
	if err := s.validateSurvey(); err != nil {
		return err
	}
	return s.validateOutput()
}

func (s *Scenario) validateComponent(p string, c *Component) error {
	if c.Kind == "population" {
		switch {
		case c.Stars < 0:
			return s.errf(p+".stars", "%d is negative; allowed: 1 to 10^12", c.Stars)
		case c.Stars > 0 && c.TotalMassMsun != 0:
			return s.errf(p+".total_mass_msun", "give either stars or total_mass_msun, not both")
		case c.Stars == 0 && c.TotalMassMsun == 0:
			return s.errf(p, "missing size: give stars (a number of primaries) or total_mass_msun")
		case c.Stars > 1e12:
			return s.errf(p+".stars", "%d is too many; allowed: 1 to 10^12", c.Stars)
		case c.TotalMassMsun < 0 || !finite(c.TotalMassMsun) || c.TotalMassMsun > 1e12:
			return s.errf(p+".total_mass_msun", "%g Msun is out of range; allowed: > 0 to 10^12 Msun", c.TotalMassMsun)
		}
		if c.Geometry == nil {
			return s.errf(p+".geometry", "missing: a population component needs a geometry (fixed or plummer)")
		}
		if err := s.validateGeometry(p+".geometry", c.Geometry); err != nil {
			return err
		}
	} else {
		if c.Stars != 0 || c.TotalMassMsun != 0 {
			return s.errf(p+".stars", "a Galactic component's size comes from its density law; remove stars/total_mass_msun (use density_scale to rescale)")
		}
		if c.Geometry != nil {
			return s.errf(p+".geometry", "a Galactic component is placed by the field section, not by a geometry")
		}
		if c.DensityScale == 0 {
			c.DensityScale = 1
		}
		galacticDefaults(c)
		if c.DensityScale < 0 || !finite(c.DensityScale) {
			return s.errf(p+".density_scale", "%g is out of range; allowed: > 0", c.DensityScale)
		}
	}
	if c.MassFunction.Kind == "" {
		return s.errf(p+".mass_function.kind", "missing: salpeter, kroupa, chabrier_single, chabrier_system, broken_power_law or table")
	}
	if err := s.validateAge(p+".age", &c.Age); err != nil {
		return err
	}
	if err := s.validateFeH(p+".metallicity", &c.Metallicity); err != nil {
		return err
	}
	if c.Binaries != nil {
		if err := s.validateBinaries(p+".binaries", c.Binaries); err != nil {
			return err
		}
	}
	if c.Extinction != nil {
		if err := s.validateExtinction(p+".extinction", c.Extinction); err != nil {
			return err
		}
	}
	return nil
}

func (s *Scenario) checkAge(field string, v Duration, allowZero bool) error {
	if !finite(float64(v)) || v < 0 || (!allowZero && v == 0) || float64(v) > MaxAgeYr {
		lo := "0"
		if !allowZero {
			lo = "> 0"
		}
		return s.errf(field, "%g yr is out of range; allowed: %s to 13.8 Gyr (the age of the Universe)", float64(v), lo)
	}
	return nil
}

func (s *Scenario) validateAge(p string, a *AgeSpec) error {
	if a.Kind == "" {
		return s.errf(p+".kind", "missing: %s", strings.Join(ageKinds, ", "))
	}
	if !oneOf(a.Kind, ageKinds) {
		return s.errf(p+".kind", "unknown star-formation history %q; allowed: %s", a.Kind, strings.Join(ageKinds, ", "))
	}
	switch a.Kind {
	case "burst":
		if err := s.checkAge(p+".age", a.AgeYr, false); err != nil {
			return err
		}
		if a.SpreadYr < 0 || !finite(float64(a.SpreadYr)) || a.SpreadYr > a.AgeYr {
			return s.errf(p+".spread", "%g yr is out of range; allowed: 0 to the burst age", float64(a.SpreadYr))
		}
	case "constant", "exponential":
		if err := s.checkAge(p+".min_age", a.MinAgeYr, true); err != nil {
			return err
		}
		if err := s.checkAge(p+".max_age", a.MaxAgeYr, false); err != nil {
			return err
		}
		if a.MinAgeYr >= a.MaxAgeYr {
			return s.errf(p+".max_age", "%g yr must be greater than min_age (%g yr)", float64(a.MaxAgeYr), float64(a.MinAgeYr))
		}
		if a.Kind == "exponential" && (a.TauYr <= 0 || !finite(float64(a.TauYr))) {
			return s.errf(p+".tau", "%g yr is out of range; allowed: > 0", float64(a.TauYr))
		}
	case "table":
		if a.Table == "" {
			return s.errf(p+".table", "missing: a file of age, rate rows")
		}
	}
	return nil
}

func (s *Scenario) validateFeH(p string, m *Metallicity) error {
	if m.Kind == "" {
		m.Kind = "fixed"
	}
	if !oneOf(m.Kind, fehKinds) {
		return s.errf(p+".kind", "unknown metallicity distribution %q; allowed: %s", m.Kind, strings.Join(fehKinds, ", "))
	}
	if m.Kind != "table" && (!finite(m.FeH) || m.FeH < -2.3 || m.FeH > 0.2) {
		return s.errf(p+".feh", "%g dex is out of range; allowed: -2.3 to +0.2 (Z = 0.0001 to 0.03 of the evolution model)", m.FeH)
	}
	if m.Kind == "gaussian" && (m.SigmaDex <= 0 || m.SigmaDex > 2 || !finite(m.SigmaDex)) {
		return s.errf(p+".sigma_dex", "%g dex is out of range; allowed: > 0 to 2", m.SigmaDex)
	}
	if m.Kind == "table" && m.Table == "" {
		return s.errf(p+".table", "missing: a file of [Fe/H], weight rows")
	}
	return nil
}

func (s *Scenario) validateBinaries(p string, b *Binaries) error {
	switch {
	case b.Fraction == nil && len(b.FractionByMass) == 0:
		return s.errf(p+".fraction", "missing: give fraction or fraction_by_mass")
	case b.Fraction != nil && len(b.FractionByMass) > 0:
		return s.errf(p+".fraction_by_mass", "give either fraction or fraction_by_mass, not both")
	case b.Fraction != nil && (*b.Fraction < 0 || *b.Fraction > 1 || !finite(*b.Fraction)):
		return s.errf(p+".fraction", "%g is out of range; allowed: 0 to 1", *b.Fraction)
	}
	for i, r := range b.FractionByMass {
		q := fmt.Sprintf("%s.fraction_by_mass[%d]", p, i)
		if r.Fraction < 0 || r.Fraction > 1 || !finite(r.Fraction) {
			return s.errf(q+".fraction", "%g is out of range; allowed: 0 to 1", r.Fraction)
		}
		if !finite(r.AboveMassMsun) || r.AboveMassMsun < 0 || (i > 0 && r.AboveMassMsun <= b.FractionByMass[i-1].AboveMassMsun) {
			return s.errf(q+".above_mass_msun", "%g Msun: rows must have increasing non-negative masses", r.AboveMassMsun)
		}
	}
	q := &b.MassRatio
	if q.Kind == "" {
		q.Kind = "flat"
	}
	if !oneOf(q.Kind, qKinds) {
		return s.errf(p+".mass_ratio.kind", "unknown mass-ratio distribution %q; allowed: %s", q.Kind, strings.Join(qKinds, ", "))
	}
	if q.Max == 0 {
		q.Max = 1
	}
	if q.Min == 0 {
		q.Min = 0.1
	}
	if !(q.Min > 0 && q.Min < q.Max && q.Max <= 1) {
		return s.errf(p+".mass_ratio.min", "q range [%g, %g] is invalid; allowed: 0 < min < max <= 1", q.Min, q.Max)
	}
	if !finite(q.Gamma) || q.Gamma < -5 || q.Gamma > 5 {
		return s.errf(p+".mass_ratio.gamma", "%g is out of range; allowed: -5 to 5", q.Gamma)
	}
	return nil
}

func (s *Scenario) validateGeometry(p string, g *Geometry) error {
	if g.Kind == "" {
		g.Kind = "fixed"
	}
	if !oneOf(g.Kind, geometryKinds) {
		return s.errf(p+".kind", "unknown geometry %q; allowed: %s", g.Kind, strings.Join(geometryKinds, ", "))
	}
	if !finite(g.DistancePc) || g.DistancePc <= 0 || g.DistancePc > MaxDistancePc {
		return s.errf(p+".distance_pc", "%g pc is out of range; allowed: > 0 to 1e6 pc", g.DistancePc)
	}
	if !finite(g.RADeg) || g.RADeg < 0 || g.RADeg >= 360 {
		return s.errf(p+".ra_deg", "%g deg is out of range; allowed: 0 to <360", g.RADeg)
	}
	if !finite(g.DecDeg) || g.DecDeg < -90 || g.DecDeg > 90 {
		return s.errf(p+".dec_deg", "%g deg is out of range; allowed: -90 to 90", g.DecDeg)
	}
	if g.Kind == "plummer" {
		if !finite(g.ScaleRadiusPc) || g.ScaleRadiusPc <= 0 || g.ScaleRadiusPc > 1000 {
			return s.errf(p+".scale_radius_pc", "%g pc is out of range; allowed: > 0 to 1000 pc", g.ScaleRadiusPc)
		}
		if g.MaxRadiusPc == 0 {
			g.MaxRadiusPc = 10 * g.ScaleRadiusPc
		}
		if !finite(g.MaxRadiusPc) || g.MaxRadiusPc <= g.ScaleRadiusPc*0.01 || g.MaxRadiusPc >= g.DistancePc {
			return s.errf(p+".max_radius_pc", "%g pc is out of range; allowed: above 1%% of the scale radius and below the distance (%g pc)", g.MaxRadiusPc, g.DistancePc)
		}
	}
	return nil
}

func (s *Scenario) validateExtinction(p string, e *Extinction) error {
	if e.Law == "" {
		e.Law = "ccm89"
	}
	if e.RV == 0 {
		e.RV = 3.1
	}
	if !finite(e.AVMag) || e.AVMag < 0 || e.AVMag > 30 {
		return s.errf(p+".av_mag", "%g mag is out of range; allowed: 0 to 30 (negative extinction is unphysical)", e.AVMag)
	}
	if !finite(e.AVSpreadMag) || e.AVSpreadMag < 0 || e.AVSpreadMag > 10 {
		return s.errf(p+".av_spread_mag", "%g mag is out of range; allowed: 0 to 10", e.AVSpreadMag)
	}
	return nil
}

func (s *Scenario) validateSurvey() error {
	sv := s.Survey
	if len(sv.Bands) == 0 {
		return s.errf("survey.bands", "missing: give at least one band")
	}
	seen := map[string]bool{}
	for i := range sv.Bands {
		b := &sv.Bands[i]
		p := fmt.Sprintf("survey.bands[%d]", i)
		if b.Band == "" {
			return s.errf(p+".band", "missing band name (see `starmock bands`)")
		}
		if seen[b.Band] {
			return s.errf(p+".band", "band %q is listed twice", b.Band)
		}
		seen[b.Band] = true
		if !finite(b.Limit5SigmaMag) || b.Limit5SigmaMag < 5 || b.Limit5SigmaMag > 35 {
			return s.errf(p+".limit_5sigma_mag", "%g mag is out of range; allowed: 5 to 35", b.Limit5SigmaMag)
		}
		if b.FloorMag == nil {
			v := 0.005
			b.FloorMag = &v
		}
		if !finite(*b.FloorMag) || *b.FloorMag < 0 || *b.FloorMag > 1 {
			return s.errf(p+".floor_mag", "%g mag is out of range; allowed: 0 to 1", *b.FloorMag)
		}
		if !finite(b.SaturationMag) || b.SaturationMag >= b.Limit5SigmaMag || b.SaturationMag < -30 {
			return s.errf(p+".saturation_mag", "%g mag is out of range; allowed: -30 up to the 5-sigma limit (%g mag)", b.SaturationMag, b.Limit5SigmaMag)
		}
		if b.Noise == "" {
			b.Noise = "ivezic2019"
		}
		if !oneOf(b.Noise, noiseKinds) {
			return s.errf(p+".noise", "unknown noise model %q; allowed: %s", b.Noise, strings.Join(noiseKinds, ", "))
		}
		if b.Noise == "table" && b.Table == "" {
			return s.errf(p+".table", "missing: a file of mag, error rows for noise: table")
		}
		if b.Completeness == "" {
			b.Completeness = "none"
		}
		if !oneOf(b.Completeness, complKinds) {
			return s.errf(p+".completeness", "unknown completeness model %q; allowed: %s", b.Completeness, strings.Join(complKinds, ", "))
		}
		if b.Completeness == "logistic" {
			if b.Completeness50Mag == nil {
				v := b.Limit5SigmaMag
				b.Completeness50Mag = &v
			}
			if b.CompletenessWidthMag == 0 {
				b.CompletenessWidthMag = 0.2
			}
			if !finite(b.CompletenessWidthMag) || b.CompletenessWidthMag <= 0 || b.CompletenessWidthMag > 5 {
				return s.errf(p+".completeness_width_mag", "%g mag is out of range; allowed: > 0 to 5", b.CompletenessWidthMag)
			}
		}
		if b.Completeness == "table" && b.CompletenessTable == "" {
			return s.errf(p+".completeness_table", "missing: a file of mag, fraction rows")
		}
	}
	d := &sv.Detection
	if d.Rule == "" {
		d.Rule = "all_of"
	}
	if !oneOf(d.Rule, ruleKinds) {
		return s.errf("survey.detection.rule", "unknown rule %q; allowed: %s", d.Rule, strings.Join(ruleKinds, ", "))
	}
	if len(d.Bands) == 0 {
		for _, b := range sv.Bands {
			d.Bands = append(d.Bands, b.Band)
		}
	}
	for i, b := range d.Bands {
		if !seen[b] {
			return s.errf(fmt.Sprintf("survey.detection.bands[%d]", i), "band %q is not one of the survey's bands", b)
		}
	}
	if d.Rule == "at_least" && (d.Count < 1 || d.Count > len(d.Bands)) {
		return s.errf("survey.detection.count", "%d is out of range; allowed: 1 to %d (the number of detection bands)", d.Count, len(d.Bands))
	}
	return nil
}

func (s *Scenario) validateOutput() error {
	o := &s.Output
	if o.Path == "" {
		o.Path = "catalogue"
	}
	if len(o.Formats) == 0 {
		o.Formats = []string{"parquet"}
	}
	for i, f := range o.Formats {
		if !oneOf(f, formatKinds) {
			return s.errf(fmt.Sprintf("output.formats[%d]", i), "unknown format %q; allowed: %s", f, strings.Join(formatKinds, ", "))
		}
	}
	if o.ChunkSize == 0 {
		o.ChunkSize = DefaultChunkSize
	}
	if o.ChunkSize < 1 || o.ChunkSize > MaxChunkSize {
		return s.errf("output.chunk_size", "%d is out of range; allowed: 1 to %d", o.ChunkSize, MaxChunkSize)
	}
	if o.Workers < 0 || o.Workers > 1024 {
		return s.errf("output.workers", "%d is out of range; allowed: 0 (all CPUs) to 1024", o.Workers)
	}
	return nil
}
