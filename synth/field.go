package synth

// Field places the Galactic components of a scenario: which part of the sky, over which
// distances, behind which dust.
type Field struct {
	// Area is the patch of sky.
	Area Area `yaml:"area" json:"area"`
	// MinDistancePc and MaxDistancePc bound the sight line (defaults 10 pc and 50 kpc).
	MinDistancePc float64 `yaml:"min_distance_pc,omitempty" json:"min_distance_pc"`
	MaxDistancePc float64 `yaml:"max_distance_pc,omitempty" json:"max_distance_pc"`
	// Shells is the number of logarithmic distance shells (default 64).
	Shells int `yaml:"shells,omitempty" json:"shells"`
	// Dust is the sight-line dust model.
	Dust FieldDust `yaml:"dust" json:"dust"`
	// SkipUndetectable drops, before they are simulated, the stars that cannot pass the
	// detection rule at any age, metallicity or extinction the component allows (with
	// expected numbers adjusted). Default true.
	SkipUndetectable *bool `yaml:"skip_undetectable,omitempty" json:"skip_undetectable"`
	// Structure overrides the Galactic model's density laws (see Structure); absent, the
	// published defaults of galaxy.DefaultParams.
	Structure *Structure `yaml:"structure,omitempty" json:"structure,omitempty"`
}

// Area is a patch of sky.
type Area struct {
	// Kind: cone (LDeg, BDeg, RadiusDeg), galactic_box (LMinDeg…BMaxDeg),
	// equatorial_box (RAMinDeg…DecMaxDeg), healpix (Nside, Nested, Pixels).
	Kind      string  `yaml:"kind" json:"kind"`
	LDeg      float64 `yaml:"l_deg,omitempty" json:"l_deg,omitempty"`
	BDeg      float64 `yaml:"b_deg,omitempty" json:"b_deg,omitempty"`
	RadiusDeg float64 `yaml:"radius_deg,omitempty" json:"radius_deg,omitempty"`
	LMinDeg   float64 `yaml:"l_min_deg,omitempty" json:"l_min_deg,omitempty"`
	LMaxDeg   float64 `yaml:"l_max_deg,omitempty" json:"l_max_deg,omitempty"`
	BMinDeg   float64 `yaml:"b_min_deg,omitempty" json:"b_min_deg,omitempty"`
	BMaxDeg   float64 `yaml:"b_max_deg,omitempty" json:"b_max_deg,omitempty"`
	RAMinDeg  float64 `yaml:"ra_min_deg,omitempty" json:"ra_min_deg,omitempty"`
	RAMaxDeg  float64 `yaml:"ra_max_deg,omitempty" json:"ra_max_deg,omitempty"`
	DecMinDeg float64 `yaml:"dec_min_deg,omitempty" json:"dec_min_deg,omitempty"`
	DecMaxDeg float64 `yaml:"dec_max_deg,omitempty" json:"dec_max_deg,omitempty"`
	Nside     int     `yaml:"nside,omitempty" json:"nside,omitempty"`
	Nested    bool    `yaml:"nested,omitempty" json:"nested,omitempty"`
	Pixels    []int64 `yaml:"pixels,omitempty" json:"pixels,omitempty"`
}

// FieldDust is the dust model along the field's sight lines.
type FieldDust struct {
	// Model: disc (an exponential dust disc), table (A_V versus distance from a file) or
	// none. Default disc.
	Model string `yaml:"model,omitempty" json:"model"`
	// Law and RV select the extinction law (defaults ccm89, 3.1).
	Law string  `yaml:"law,omitempty" json:"law"`
	RV  float64 `yaml:"rv,omitempty" json:"rv"`
	// AVPerKpc and ScaleHeightPc override the disc model's defaults.
	AVPerKpc      float64 `yaml:"av_per_kpc,omitempty" json:"av_per_kpc,omitempty"`
	ScaleHeightPc float64 `yaml:"scale_height_pc,omitempty" json:"scale_height_pc,omitempty"`
	// Table is a file of A_V versus distance for model table.
	Table string `yaml:"table,omitempty" json:"table,omitempty"`
}

var (
	areaKinds = []string{"cone", "galactic_box", "equatorial_box", "healpix"}
	dustKinds = []string{"disc", "table", "none"}
)

func (s *Scenario) validateField() error {
	f := s.Field
	a := &f.Area
	if !oneOf(a.Kind, areaKinds) {
		return s.errf("field.area.kind", "unknown sky area %q; allowed: cone, galactic_box, equatorial_box, healpix", a.Kind)
	}
	if a.Kind == "cone" && (!finite(a.RadiusDeg) || a.RadiusDeg <= 0 || a.RadiusDeg > 180) {
		return s.errf("field.area.radius_deg", "%g deg is out of range; allowed: > 0 to 180", a.RadiusDeg)
	}
	if f.MinDistancePc == 0 {
		f.MinDistancePc = 10
	}
	if f.MaxDistancePc == 0 {
		f.MaxDistancePc = 50000
	}
	if !finite(f.MinDistancePc) || f.MinDistancePc <= 0 {
		return s.errf("field.min_distance_pc", "%g pc is out of range; allowed: > 0", f.MinDistancePc)
	}
	if !finite(f.MaxDistancePc) || f.MaxDistancePc <= f.MinDistancePc || f.MaxDistancePc > MaxDistancePc {
		return s.errf("field.max_distance_pc", "%g pc is out of range; allowed: above min_distance_pc (%g pc) and at most 1e6 pc", f.MaxDistancePc, f.MinDistancePc)
	}
	if f.Shells == 0 {
		f.Shells = 64
	}
	if f.Shells < 1 || f.Shells > 100000 {
		return s.errf("field.shells", "%d is out of range; allowed: 1 to 100000", f.Shells)
	}
	if f.SkipUndetectable == nil {
		t := true
		f.SkipUndetectable = &t
	}
	d := &f.Dust
	if d.Model == "" {
		d.Model = "disc"
	}
	if !oneOf(d.Model, dustKinds) {
		return s.errf("field.dust.model", "unknown dust model %q; allowed: disc, table, none", d.Model)
	}
	if d.Law == "" {
		d.Law = "ccm89"
	}
	if d.RV == 0 {
		d.RV = 3.1
	}
	if d.AVPerKpc < 0 || !finite(d.AVPerKpc) {
		return s.errf("field.dust.av_per_kpc", "%g mag/kpc is out of range; allowed: >= 0", d.AVPerKpc)
	}
	if d.ScaleHeightPc < 0 || !finite(d.ScaleHeightPc) {
		return s.errf("field.dust.scale_height_pc", "%g pc is out of range; allowed: > 0", d.ScaleHeightPc)
	}
	if d.Model == "table" && d.Table == "" {
		return s.errf("field.dust.table", "missing: a file of distance, A_V rows")
	}
	return s.validateStructure()
}
