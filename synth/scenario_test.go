package synth

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// base is a small valid scenario; tests edit it to make one mistake at a time.
const base = `seed: 1
components:
  - name: test_cluster
    stars: 100
    mass_function: {kind: kroupa}
    age: {kind: burst, age: 1Gyr}
    metallicity: {kind: fixed, feh: 0}
    geometry: {kind: plummer, distance_pc: 1000, scale_radius_pc: 2}
survey:
  bands:
    - {band: g, limit_5sigma_mag: 24, saturation_mag: 15}
    - {band: r, limit_5sigma_mag: 23.5, saturation_mag: 15}
output: {path: out/cat}
`

func TestParseValid(t *testing.T) {
	s, err := Parse("base.yaml", []byte(base))
	if err != nil {
		t.Fatal(err)
	}
	if *s.Seed != 1 || s.Components[0].Geometry.MaxRadiusPc != 20 || s.Output.ChunkSize != DefaultChunkSize {
		t.Errorf("defaults not filled: %+v", s)
	}
	if s.Survey.Detection.Rule != "all_of" || len(s.Survey.Detection.Bands) != 2 {
		t.Errorf("detection defaults: %+v", s.Survey.Detection)
	}
	if got := *s.Survey.Bands[0].FloorMag; got != 0.005 {
		t.Errorf("floor default %g", got)
	}
}

// TestParseErrors checks that each kind of bad input is rejected with the file, the line
// of the offending key, the key path and the allowed range or choices.
func TestParseErrors(t *testing.T) {
	cases := []struct {
		name, old, new string
		line           int
		want           []string
	}{
		{"unknown key", "    stars: 100", "    stars: 100\n    colour: blue", 5, []string{"colour", "not a known key"}},
		{"negative distance", "distance_pc: 1000", "distance_pc: -5", 8, []string{"geometry.distance_pc", "-5 pc", "allowed: > 0 to 1e6 pc"}},
		{"age beyond the Universe", "age: 1Gyr", "age: 14Gyr", 6, []string{"age.age", "1.4e+10 yr", "13.8 Gyr"}},
		{"unknown band", "{band: r,", "{band: w9,", 12, []string{"survey.bands[1].band", `"w9"`}},
		{"bad time unit", "age: 1Gyr", "age: 1 fortnight", 6, []string{"bad time"}},
		{"both sizes", "    stars: 100", "    stars: 100\n    total_mass_msun: 50", 5, []string{"either stars or total_mass_msun"}},
		{"negative A_V", "output:", "extinction: {law: ccm89, av_mag: -1}\noutput:", 13, []string{"extinction.av_mag", "-1 mag", "negative extinction"}},
		{"unknown law", "output:", "extinction: {law: dusty, av_mag: 1}\noutput:", 13, []string{"extinction.law", "dusty"}},
		{"saturation fainter than limit", "limit_5sigma_mag: 24, saturation_mag: 15", "limit_5sigma_mag: 24, saturation_mag: 25", 11, []string{"saturation_mag", "5-sigma limit"}},
		{"metallicity outside the model", "feh: 0}", "feh: 0.9}", 7, []string{"metallicity.feh", "-2.3 to +0.2"}},
		{"unknown format", "output: {path: out/cat}", "output: {path: out/cat, formats: [hdf5]}", 13, []string{"output.formats[0]", "hdf5", "parquet, arrow, fits, csv"}},
		{"unknown component kind", "    stars: 100", "    stars: 100\n    kind: spiral_arm", 5, []string{"components[0].kind", "spiral_arm", "thin_disc"}},
		{"missing seed", "seed: 1\n", "", 0, []string{"seed", "missing"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			text := strings.Replace(base, c.old, c.new, 1)
			if text == base {
				t.Fatalf("test case did not change the scenario")
			}
			_, err := Parse("bad.yaml", []byte(text))
			if err == nil {
				// some mistakes are only found when the plan is built
				s, perr := Parse("bad.yaml", []byte(text))
				if perr == nil {
					_, err = NewPlan(t.Context(), s)
				}
			}
			if err == nil {
				t.Fatalf("accepted:\n%s", text)
			}
			var se *ScenarioError
			if !errors.As(err, &se) {
				t.Fatalf("error %v is not a *ScenarioError", err)
			}
			if se.File != "bad.yaml" || (c.line > 0 && se.Line != c.line) {
				t.Errorf("located at %s:%d, want bad.yaml:%d (%v)", se.File, se.Line, c.line, err)
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not mention %q", err, w)
				}
			}
		})
	}
}

func TestGalacticNeedsField(t *testing.T) {
	text := strings.Replace(base, "  - name: test_cluster", "  - name: disc\n    kind: thin_disc\n  - name: test_cluster", 1)
	_, err := Parse("f.yaml", []byte(text))
	if err == nil || !strings.Contains(err.Error(), "field") {
		t.Fatalf("want a missing-field error, got %v", err)
	}
}

// TestFieldErrors: the sky-area and distance checks of issue 6.
func TestFieldErrors(t *testing.T) {
	field := "field:\n  area: {kind: cone, l_deg: 10, b_deg: 40, radius_deg: %s}\n  min_distance_pc: %s\n  max_distance_pc: 2000\n"
	gal := strings.Replace(base, "  - name: test_cluster", "  - name: disc\n    kind: thin_disc\n  - name: test_cluster", 1)
	cases := []struct{ radius, dmin, want string }{
		{"0", "10", "radius_deg"},
		{"181", "10", "radius_deg"},
		{"1", "2000", "max_distance_pc"},
	}
	for _, c := range cases {
		text := gal + strings.NewReplacer("%s", c.radius).Replace(field)
		text = strings.Replace(text, "min_distance_pc: "+c.radius, "min_distance_pc: "+c.dmin, 1)
		_, err := Parse("f.yaml", []byte(text))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("radius %s, dmin %s: want error naming %s, got %v", c.radius, c.dmin, c.want, err)
		}
	}
}

func TestTableErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "sfh.txt")
	if err := os.WriteFile(bad, []byte("# age rate\n1e9 1\n5e8 2\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	text := strings.Replace(base, "age: {kind: burst, age: 1Gyr}", "age: {kind: table, table: "+bad+"}", 1)
	s, err := Parse(filepath.Join(dir, "s.yaml"), []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	_, err = NewPlan(t.Context(), s)
	if err == nil || !strings.Contains(err.Error(), "sfh.txt:3") || !strings.Contains(err.Error(), "does not increase") {
		t.Errorf("want a file:line error for a non-increasing table, got %v", err)
	}
}

// TestUserPassbandAndRubinBands: a survey may use a user filter file and the Rubin bands
// (no empirical corrections); both get blackbody colour terms and magnitudes, and a bad
// passband file is an error naming the key.
func TestUserPassbandAndRubinBands(t *testing.T) {
	dir := t.TempDir()
	pb := filepath.Join(dir, "filter.tsv")
	text := "# invented test filter: a box from 5000 to 6000 angstrom\n# response_kind: photon\nwavelength_angstrom\tthroughput\n4990\t0\n5000\t1\n6000\t1\n6010\t0\n"
	if err := os.WriteFile(pb, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	sc := strings.Replace(base, "    - {band: r, limit_5sigma_mag: 23.5, saturation_mag: 15}",
		"    - {band: box, passband: filter.tsv, limit_5sigma_mag: 23.5, saturation_mag: 15}\n    - {band: lsst_r, limit_5sigma_mag: 24, saturation_mag: 16}", 1)
	s, err := Parse(filepath.Join(dir, "s.yaml"), []byte(sc))
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPlan(t.Context(), s)
	if err != nil {
		t.Fatal(err)
	}
	if got := p.Survey.Bands[1].PivotAA; math.Abs(got-5500) > 30 {
		t.Errorf("box filter pivot %.1f Å, want about 5500 (box 5000–6000 Å, common practice)", got)
	}
	mags := make([]float64, len(p.Survey.Bands))
	q := p.Survey.Photo.AbsMags(5772, 4.438, 0, 1, mags)
	for k, m := range mags {
		if math.IsNaN(m) {
			t.Errorf("band %s: no magnitude for the Sun", p.Survey.Bands[k].Name)
		}
	}
	if q.String() != "blackbody" {
		t.Errorf("quality %s, want blackbody for a survey with user/Rubin bands", q)
	}
	// A V-like box and the built-in g bracket the solar V magnitude (4.8) loosely.
	if mags[1] < 4.0 || mags[1] > 5.6 {
		t.Errorf("solar AB magnitude in the 5000-6000 Å box %.2f, want 4.0-5.6 (the Sun's V is 4.81)", mags[1])
	}
	bad := strings.Replace(sc, "filter.tsv", "missing.tsv", 1)
	s2, err := Parse(filepath.Join(dir, "s2.yaml"), []byte(bad))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := NewPlan(t.Context(), s2); err == nil || !strings.Contains(err.Error(), "survey.bands[1].passband") {
		t.Errorf("missing passband file: got %v", err)
	}
}
