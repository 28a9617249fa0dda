package synth

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/synth/galaxy"
)

// structureScenario is a thin-disc field toward the north Galactic pole; line 8 holds
// the structure keys of a test (one line, nested keys as a flow map).
const structureScenario = `seed: 5
components:
  - {name: disc, kind: thin_disc}
field:
  area: {kind: cone, l_deg: 0, b_deg: 90, radius_deg: 0.1}
  max_distance_pc: 3000
  shells: 12
  skip_undetectable: false
  structure: STRUCTURE
survey:
  bands: [{band: V, limit_5sigma_mag: 20, saturation_mag: 10}]
output: {path: cat}
`

// structureLine is the line of "structure:" in structureScenario.
const structureLine = 9

// withStructure puts a structure block into structureScenario: "" drops the key, a
// "{...}" flow map is written inline, and "key: value" lines go on the line below.
func withStructure(block string) string {
	switch {
	case block == "":
		return strings.Replace(structureScenario, "  structure: STRUCTURE\n", "", 1)
	case strings.HasPrefix(block, "{") || block == "null":
		return strings.Replace(structureScenario, "STRUCTURE", block, 1)
	}
	return strings.Replace(structureScenario, " STRUCTURE", "\n    "+block, 1)
}

// structureFields lists every key of field.structure with the galaxy.Params field it
// sets, a valid non-default value and a value outside the galaxy package's range.
var structureFields = []struct {
	key       string
	field     func(*galaxy.Params) *float64
	good, bad float64
}{
	{"local_density_msun_pc3", func(p *galaxy.Params) *float64 { return &p.LocalMassDensityMsunPc3 }, 0.05, 0},
	{"thick_to_thin_local", func(p *galaxy.Params) *float64 { return &p.ThickToThinLocal }, 0.2, 11},
	{"halo_to_thin_local", func(p *galaxy.Params) *float64 { return &p.HaloToThinLocal }, 0.002, 1.5},
	{"sun.r0_pc", func(p *galaxy.Params) *float64 { return &p.Sun.R0Pc }, 8000, 0},
	{"sun.z_pc", func(p *galaxy.Params) *float64 { return &p.Sun.ZSunPc }, 20, 300},
	{"thin_disc.scale_length_pc", func(p *galaxy.Params) *float64 { return &p.ThinDisc.ScaleLengthPc }, 2300, 50},
	{"thin_disc.scale_height_pc", func(p *galaxy.Params) *float64 { return &p.ThinDisc.ScaleHeightPc }, 250, -5},
	{"thick_disc.scale_length_pc", func(p *galaxy.Params) *float64 { return &p.ThickDisc.ScaleLengthPc }, 3000, 30000},
	{"thick_disc.scale_height_pc", func(p *galaxy.Params) *float64 { return &p.ThickDisc.ScaleHeightPc }, 1000, 20000},
	{"halo.axis_ratio", func(p *galaxy.Params) *float64 { return &p.Halo.AxisRatioQ }, 0.7, 2.5},
	{"halo.power_law_index", func(p *galaxy.Params) *float64 { return &p.Halo.PowerLawIndexN }, 2.6, 7},
	{"halo.core_radius_pc", func(p *galaxy.Params) *float64 { return &p.Halo.CoreRadiusPc }, 1000, -1},
	{"halo.break_radius_pc", func(p *galaxy.Params) *float64 { return &p.Halo.BreakRadiusPc }, 28000, -1},
	{"halo.outer_index", func(p *galaxy.Params) *float64 { return &p.Halo.OuterIndexN }, 3.8, 11},
	{"bulge.mass_msun", func(p *galaxy.Params) *float64 { return &p.Bulge.MassMsun }, 1.7e10, -1},
	{"bulge.x0_pc", func(p *galaxy.Params) *float64 { return &p.Bulge.X0Pc }, 1500, 5},
	{"bulge.y0_pc", func(p *galaxy.Params) *float64 { return &p.Bulge.Y0Pc }, 700, 20000},
	{"bulge.z0_pc", func(p *galaxy.Params) *float64 { return &p.Bulge.Z0Pc }, 400, 0},
	{"bulge.bar_angle_deg", func(p *galaxy.Params) *float64 { return &p.Bulge.BarAngleDeg }, 30, 120},
}

// keyYAML writes one key of field.structure as a flow map: "halo.axis_ratio" = v gives
// "{halo: {axis_ratio: v}}". A halo break comes with its outer index (required).
func keyYAML(key string, v float64) string {
	val := strconv.FormatFloat(v, 'g', -1, 64)
	if key == "halo.break_radius_pc" && v > 0 {
		return "{halo: {break_radius_pc: " + val + ", outer_index: 3.8}}"
	}
	if i := strings.IndexByte(key, '.'); i >= 0 {
		return "{" + key[:i] + ": {" + key[i+1:] + ": " + val + "}}"
	}
	return "{" + key + ": " + val + "}"
}

// yamlKeys lists the YAML key paths of a struct type, recursing into pointers to structs.
func yamlKeys(t reflect.Type, prefix string) []string {
	var out []string
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		name, _, _ := strings.Cut(f.Tag.Get("yaml"), ",")
		if ft := f.Type; ft.Kind() == reflect.Pointer && ft.Elem().Kind() == reflect.Struct {
			out = append(out, yamlKeys(ft.Elem(), prefix+name+".")...)
			continue
		}
		out = append(out, prefix+name)
	}
	return out
}

// heatingKeys are the keys of the thin-disc heating block, tested apart (they switch the
// age-dependent scale height on together; heating_test.go).
var heatingKeys = []string{"thin_disc.heating.index", "thin_disc.heating.offset", "thin_disc.heating.reference_age", "thin_disc.heating.slices"}

// TestStructureKeysComplete: the table above and heatingKeys cover every key of the
// block (so the tests see every key).
func TestStructureKeysComplete(t *testing.T) {
	got := yamlKeys(reflect.TypeFor[Structure](), "")
	var want []string
	for _, f := range structureFields {
		want = append(want, f.key)
		if f.key == "thin_disc.scale_height_pc" {
			want = append(want, heatingKeys...)
		}
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("keys of Structure %v, table %v", got, want)
	}
}

// TestStructureDefaults: without the block, with an empty or null block, and with every
// key written at its default, the model is exactly galaxy.DefaultParams (the published
// values named there). The plan's model is checked too, not only the resolution.
func TestStructureDefaults(t *testing.T) {
	def := galaxy.DefaultParams()
	var all []string
	for _, f := range structureFields {
		if f.key == "halo.outer_index" {
			continue // no default of its own: used only beyond a break, which is off
		}
		all = append(all, fmt.Sprintf("%s: %s", f.key, strconv.FormatFloat(*f.field(&def), 'g', -1, 64)))
	}
	// nested form of "sun.r0_pc: v" lines
	nested := map[string][]string{}
	var top []string
	for _, kv := range all {
		if k, rest, ok := strings.Cut(kv, "."); ok {
			nested[k] = append(nested[k], rest)
		} else {
			top = append(top, kv)
		}
	}
	for _, k := range []string{"sun", "thin_disc", "thick_disc", "halo", "bulge"} {
		top = append(top, k+": {"+strings.Join(nested[k], ", ")+"}")
	}
	blocks := map[string]string{"absent": "", "empty": "{}", "null": "null",
		"every key at its default": "{" + strings.Join(top, ", ") + "}"}
	for name, b := range blocks {
		t.Run(name, func(t *testing.T) {
			s, err := Parse("s.yaml", []byte(withStructure(b)))
			if err != nil {
				t.Fatal(err)
			}
			if got := s.Field.GalaxyParams(); got != def {
				t.Errorf("resolved %+v, want galaxy.DefaultParams %+v", got, def)
			}
			if name == "every key at its default" && s.Field.Structure == nil {
				t.Fatal("block not decoded")
			}
			p, err := NewPlan(t.Context(), s)
			if err != nil {
				t.Fatal(err)
			}
			if got := p.field.model.Params(); got != def {
				t.Errorf("plan model %+v, want galaxy.DefaultParams", got)
			}
		})
	}
}

// TestStructureOverrides: each key, written alone, changes exactly its galaxy.Params
// field (the break radius together with its outer index) and leaves every other
// parameter at its default; all keys at once reach the plan's model.
func TestStructureOverrides(t *testing.T) {
	all := galaxy.DefaultParams()
	for _, f := range structureFields {
		s, err := Parse("s.yaml", []byte(withStructure(keyYAML(f.key, f.good))))
		if err != nil {
			t.Errorf("%s = %g: %v", f.key, f.good, err)
			continue
		}
		want := galaxy.DefaultParams()
		*f.field(&want) = f.good
		if f.key == "halo.break_radius_pc" {
			want.Halo.OuterIndexN = 3.8
		}
		if got := s.Field.GalaxyParams(); got != want {
			t.Errorf("%s = %g: resolved %+v, want %+v", f.key, f.good, got, want)
		}
		*f.field(&all) = f.good
	}
	block := `local_density_msun_pc3: 0.05
    thick_to_thin_local: 0.2
    halo_to_thin_local: 0.002
    sun: {r0_pc: 8000, z_pc: 20}
    thin_disc: {scale_length_pc: 2300, scale_height_pc: 250}
    thick_disc: {scale_length_pc: 3000, scale_height_pc: 1000}
    halo: {axis_ratio: 0.7, power_law_index: 2.6, core_radius_pc: 1000, break_radius_pc: 28000, outer_index: 3.8}
    bulge: {mass_msun: 1.7e10, x0_pc: 1500, y0_pc: 700, z0_pc: 400, bar_angle_deg: 30}`
	s, err := Parse("s.yaml", []byte(withStructure(block)))
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPlan(t.Context(), s)
	if err != nil {
		t.Fatal(err)
	}
	if got := p.field.model.Params(); got != all {
		t.Errorf("plan model %+v, want %+v", got, all)
	}
}

// TestStructureThinDiscScaleHeight checks that a changed thin-disc scale height reaches
// the shell masses with the Jurić et al. (2008, eq. 22) vertical law. Along the north
// Galactic pole the double exponential is, at heliocentric distance d,
//
//	ρ(d) ∝ exp(−(R(d) − R⊙)/L − Z(d)/H),  Z = z⊙ + d cos θ,  R = R0 cos θ − d sin θ,
//
// (sin θ = z⊙/R0, the tilt of package galaxy's frame), so ρ ∝ exp(−k d) with
// k = cos θ/H − sin θ/L: between two distances the density falls by exp(−Δz/H) up to
// the tilt term. The shell masses are then ∝ ∫ d² e^(−kd) dd over each shell, in closed
// form [−e^(−kd)(d²/k + 2d/k² + 2/k³)], and the ratio of every shell to the first must
// match it. Tolerance 1e-4 relative: the package's shell integrals are accurate to 1e-6,
// and the 0.1° cone's off-axis terms are below d α²/(2H) ≈ 2e-5 at 3 kpc. The expected
// numbers of systems are the masses times one factor per component, which cancels. The
// default 300 pc must miss the 250 pc prediction by far more (so the check can fail).
func TestStructureThinDiscScaleHeight(t *testing.T) {
	ratios := func(block string) ([]float64, []ShellInfo, galaxy.Params) {
		t.Helper()
		s, err := Parse("s.yaml", []byte(withStructure(block)))
		if err != nil {
			t.Fatal(err)
		}
		p, err := NewPlan(t.Context(), s)
		if err != nil {
			t.Fatal(err)
		}
		sh := p.Components[0].Shells()
		out := make([]float64, len(sh))
		for i := range sh {
			out[i] = sh[i].ExpectedSystems / sh[0].ExpectedSystems
		}
		return out, sh, p.field.model.Params()
	}
	closed := func(sh []ShellInfo, p galaxy.Params) []float64 {
		st := p.Sun.ZSunPc / p.Sun.R0Pc
		ct := math.Sqrt(1 - st*st)
		k := ct/p.ThinDisc.ScaleHeightPc - st/p.ThinDisc.ScaleLengthPc
		prim := func(d float64) float64 { return -math.Exp(-k*d) * (d*d/k + 2*d/(k*k) + 2/(k*k*k)) }
		out := make([]float64, len(sh))
		for i := range sh {
			out[i] = (prim(sh[i].OuterPc) - prim(sh[i].InnerPc)) / (prim(sh[0].OuterPc) - prim(sh[0].InnerPc))
		}
		return out
	}
	got, sh, p := ratios("{thin_disc: {scale_height_pc: 250}}")
	if p.ThinDisc.ScaleHeightPc != 250 {
		t.Fatalf("plan model scale height %g pc, want 250", p.ThinDisc.ScaleHeightPc)
	}
	want := closed(sh, p)
	worst := 0.0
	for i := range got {
		worst = math.Max(worst, math.Abs(got[i]/want[i]-1))
		if math.Abs(got[i]/want[i]-1) > 1e-4 {
			t.Errorf("H = 250 pc, shell %d (%.0f-%.0f pc): mass ratio to shell 0 %.6g, closed form %.6g", i, sh[i].InnerPc, sh[i].OuterPc, got[i], want[i])
		}
	}
	def, _, _ := ratios("")
	last := len(def) - 1
	t.Logf("H = 250 pc: worst relative deviation from the closed form %.2g; last shell ratio %.4g (default 300 pc: %.4g)", worst, got[last], def[last])
	if math.Abs(def[last]/want[last]-1) < 0.5 {
		t.Errorf("default H = 300 pc gives ratio %.4g in the last shell, too close to the 250 pc law's %.4g: the check cannot tell them apart", def[last], want[last])
	}
}

// TestStructureErrors: every key outside the galaxy package's range, a missing outer
// index with a halo break, unknown keys, bad heating values
// and a bulge too dense for the local density are errors naming the file, the line,
// the key and the allowed range (the scenario-error convention of DEVELOPERS.md; the
// ranges are the package's own).
func TestStructureErrors(t *testing.T) {
	type errCase struct {
		name, block string
		line        int
		want        []string
	}
	var cases []errCase
	for _, f := range structureFields {
		cases = append(cases, errCase{f.key + " out of range", keyYAML(f.key, f.bad), structureLine,
			[]string{"field.structure." + f.key + ":", "is out of range; allowed: "}})
	}
	cases = append(cases,
		errCase{"negative thin-disc scale height", "{thin_disc: {scale_height_pc: -5}}", structureLine,
			[]string{"field.structure.thin_disc.scale_height_pc: -5 pc is out of range; allowed: [10, 5000] pc"}},
		errCase{"halo axis ratio above the package's 2", "{halo: {axis_ratio: 2.5}}", structureLine,
			[]string{"field.structure.halo.axis_ratio: 2.5 is out of range; allowed: [0.1, 2]"}},
		errCase{"local density zero", "local_density_msun_pc3: 0", structureLine + 1,
			[]string{"field.structure.local_density_msun_pc3: 0 Msun/pc^3 is out of range; allowed: (0, 10] Msun/pc^3"}},
		errCase{"sun height", "sun:\n      z_pc: -250", structureLine + 2,
			[]string{"field.structure.sun.z_pc: -250 pc", "[-200, 200] pc"}},
		errCase{"not a number", "{thin_disc: {scale_length_pc: .nan}}", structureLine,
			[]string{"field.structure.thin_disc.scale_length_pc: NaN pc is out of range; allowed: [100, 20000] pc"}},
		errCase{"outer index without break, out of range", "{halo: {outer_index: -1}}", structureLine,
			[]string{"field.structure.halo.outer_index: -1 is out of range; allowed: [0, 10]"}},
		errCase{"break without outer index", "{halo: {break_radius_pc: 28000}}", structureLine,
			[]string{"field.structure.halo.outer_index: missing", "[0, 10]"}},
		errCase{"heating index outside the block", "{thin_disc: {heating_index: 0.5}}", structureLine,
			[]string{"heating_index", "not a known key"}},
		errCase{"heating index zero", "{thin_disc: {heating: {index: 0}}}", structureLine,
			[]string{"field.structure.thin_disc.heating.index: 0 is out of range; allowed: (0, 2]"}},
		errCase{"heating index above the package's 2", "{thin_disc: {heating: {index: 2.5}}}", structureLine,
			[]string{"field.structure.thin_disc.heating.index: 2.5 is out of range; allowed: [0, 2]"}},
		errCase{"heating offset zero", "{thin_disc: {heating: {offset: 0}}}", structureLine,
			[]string{"field.structure.thin_disc.heating.offset: 0 yr is out of range"}},
		errCase{"heating reference age too old", "{thin_disc: {heating: {reference_age: 20Gyr}}}", structureLine,
			[]string{"field.structure.thin_disc.heating.reference_age: 2e+10 yr is out of range"}},
		errCase{"one slice", "{thin_disc: {heating: {slices: 1}}}", structureLine,
			[]string{"field.structure.thin_disc.heating.slices: 1 is out of range; allowed: 2 to 32"}},
		errCase{"misspelt component", "thin_disk: {scale_height_pc: 250}", structureLine + 1,
			[]string{"thin_disk", "not a known key"}},
		errCase{"bulge denser than the local density", "{bulge: {mass_msun: 1e12, x0_pc: 10000, y0_pc: 10000, z0_pc: 1000}}", structureLine,
			[]string{"field.structure: bulge density at the Sun", "exceeds local_density_msun_pc3 = 0.04 Msun/pc^3"}},
	)
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse("s.yaml", []byte(withStructure(c.block)))
			if err == nil {
				t.Fatalf("%q accepted", c.block)
			}
			var se *ScenarioError
			if !errors.As(err, &se) {
				t.Fatalf("not a ScenarioError (exit status 2): %T %v", err, err)
			}
			msg := err.Error()
			if loc := fmt.Sprintf("s.yaml:%d: ", c.line); !strings.HasPrefix(msg, loc) {
				t.Errorf("error %q does not start with %q", msg, loc)
			}
			for _, w := range c.want {
				if !strings.Contains(msg, w) {
					t.Errorf("error %q lacks %q", msg, w)
				}
			}
		})
	}
}

// TestStructureReference: `starmock scenario` documents every key of the block with the
// default galaxy.DefaultParams uses (read back from the reference text), and names the
// sources of the defaults.
func TestStructureReference(t *testing.T) {
	ref := ScenarioReference
	i := strings.Index(ref, "\n  structure:")
	j := strings.Index(ref, "\nsurvey:")
	if i < 0 || j < i {
		t.Fatal("no structure section in ScenarioReference")
	}
	keyRE := regexp.MustCompile(`^( {4}| {6})([a-z0-9_]+):\s*(\S*)`)
	values := map[string]string{}
	parent := ""
	for _, line := range strings.Split(ref[i:j], "\n") {
		m := keyRE.FindStringSubmatch(line)
		if m == nil {
			continue
		}
		if len(m[1]) == 4 {
			parent = m[2]
			values[m[2]] = m[3]
			continue
		}
		values[parent+"."+m[2]] = m[3]
	}
	def := galaxy.DefaultParams()
	for _, f := range structureFields {
		v, ok := values[f.key]
		if !ok {
			t.Errorf("%s not documented", f.key)
			continue
		}
		if f.key == "halo.outer_index" {
			continue // an example value: there is no default
		}
		x, err := strconv.ParseFloat(v, 64)
		if err != nil || x != *f.field(&def) {
			t.Errorf("%s documented as %q, default is %g", f.key, v, *f.field(&def))
		}
	}
	for _, src := range []string{"Juric et al. 2008", "Bland-Hawthorn & Gerhard 2016", "Dwek et al. 1995", "Gaia 100 pc census"} {
		if !strings.Contains(ref[i:j], src) {
			t.Errorf("structure section does not cite %s", src)
		}
	}
}
