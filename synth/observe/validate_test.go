package observe

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestValidateErrors(t *testing.T) {
	t.Parallel()
	good := func() BandSpec { return ivezicBand(24, 0.005, 0.039) }
	cases := []struct {
		name string
		mod  func(b *BandSpec)
		want []string // substrings of the message: field, value, allowed range
	}{
		{"empty band", func(b *BandSpec) { b.Band = "" }, []string{"band name empty"}},
		{"negative floor", func(b *BandSpec) { b.FloorMag = -0.01 }, []string{"band r", "floor", "-0.01 mag", "[0, 0.5] mag"}},
		{"huge floor", func(b *BandSpec) { b.FloorMag = 0.8 }, []string{"floor", "0.8 mag", "[0, 0.5]"}},
		{"nan limit", func(b *BandSpec) { b.Limit5SigmaMag = math.NaN() }, []string{"limit_5sigma", "NaN mag", "[0, 35] mag"}},
		{"limit too faint", func(b *BandSpec) { b.Limit5SigmaMag = 40 }, []string{"limit_5sigma", "40 mag"}},
		{"saturation fainter than limit", func(b *BandSpec) { b.SaturationMag = 25 }, []string{"saturation", "25 mag", "not brighter than limit_5sigma 24 mag", "< 24 mag"}},
		{"saturation equal to limit", func(b *BandSpec) { b.SaturationMag = 24 }, []string{"saturation 24 mag"}},
		{"saturation NaN", func(b *BandSpec) { b.SaturationMag = math.NaN() }, []string{"saturation NaN"}},
		{"gamma zero", func(b *BandSpec) { b.Noise.Gamma = 0 }, []string{"noise.gamma", "0 outside", "(0, 0.04]"}},
		{"gamma too big", func(b *BandSpec) { b.Noise.Gamma = 0.05 }, []string{"noise.gamma 0.05", "(0, 0.04]"}},
		{"noise kind missing", func(b *BandSpec) { b.Noise = NoiseModel{} }, []string{"noise.kind missing", "ivezic2019, background_limited, table"}},
		{"noise kind unknown", func(b *BandSpec) { b.Noise.Kind = "poisson" }, []string{`noise.kind "poisson" unknown`}},
		{"noise table nil", func(b *BandSpec) { b.Noise = TableNoise(nil) }, []string{"noise.table missing"}},
		{"snr negative", func(b *BandSpec) { b.DetectionSNR = -3 }, []string{"detection_snr -3", "(0, 1000]"}},
		{"completeness width", func(b *BandSpec) { b.Completeness = LogisticCompleteness(1, 23, 0) }, []string{"completeness.width 0 mag", "(0, 5] mag"}},
		{"completeness max", func(b *BandSpec) { b.Completeness = LogisticCompleteness(1.2, 23, 0.2) }, []string{"completeness.max_fraction 1.2", "(0, 1]"}},
		{"completeness m50", func(b *BandSpec) { b.Completeness = LogisticCompleteness(1, math.Inf(1), 0.2) }, []string{"completeness.mag50 +Inf mag", "[-5, 40] mag"}},
		{"completeness kind", func(b *BandSpec) { b.Completeness.Kind = "erf" }, []string{`completeness.kind "erf" unknown`, "none, logistic, table"}},
		{"completeness table nil", func(b *BandSpec) { b.Completeness = TableCompleteness(nil) }, []string{"completeness.table missing"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b := good()
			c.mod(&b)
			err := b.Validate()
			if err == nil {
				t.Fatalf("no error")
			}
			msg := err.Error()
			for _, w := range c.want {
				if !strings.Contains(msg, w) {
					t.Errorf("message %q lacks %q", msg, w)
				}
			}
			if msg != strings.TrimSuffix(msg, ".") || strings.ToLower(msg[:1]) != msg[:1] {
				t.Errorf("message %q: want lower-case start, no trailing period", msg)
			}
			if b.ready {
				t.Errorf("spec marked ready after a failed Validate")
			}
		})
	}
	b := good()
	b.SaturationMag = math.Inf(-1)
	if err := b.Validate(); err != nil {
		t.Errorf("saturation -Inf (no saturation) rejected: %v", err)
	}
}

func TestTableErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name, text, want string
	}{
		{"no header", "16 0.01\n24 0.2\n", `inline:1: header "16 0.01", want "mag mag_err"`},
		{"empty", "# only a comment\n\n", `inline: no header line`},
		{"one row", "mag mag_err\n16 0.01\n", "inline:2: 1 data rows, want at least 2"},
		{"three fields", "mag mag_err\n16 0.01 3\n", "inline:2: 3 fields, want 2"},
		{"not a number", "mag mag_err\n16 0.01\n2x 0.2\n", `inline:3: column mag: "2x" is not a finite number`},
		{"nan", "mag mag_err\n16 NaN\n", `inline:2: column mag_err: "NaN" is not a finite number`},
		{"negative error", "# c\nmag mag_err\n16 -0.01\n", "inline:3: column mag_err: -0.01 outside allowed range (0, 5] mag"},
		{"mag out of range", "mag mag_err\n99 0.1\n", "inline:2: column mag: 99 mag outside allowed range [-5, 40] mag"},
		{"not increasing", "mag mag_err\n16 0.01\n16 0.02\n", "inline:3: column mag: 16 mag not greater than 16 mag on line 2"},
		{"error decreasing", "mag mag_err\n16 0.05\n20 0.01\n", "inline:3: column mag_err: 0.01 mag smaller than 0.05 mag on line 2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseErrorTable(strings.NewReader(c.text), "inline")
			if err == nil {
				t.Fatal("no error")
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %q, want it to contain %q", err, c.want)
			}
			if !errors.Is(err, ErrBadTable) {
				t.Errorf("error %q does not wrap ErrBadTable", err)
			}
		})
	}
	_, err := ParseCompletenessTable(strings.NewReader("mag completeness\n20 0.5\n21 0.9\n"), "c.txt")
	if err == nil || !strings.Contains(err.Error(), "c.txt:3: column completeness: 0.9 greater than 0.5 on line 2") {
		t.Errorf("increasing completeness: %v", err)
	}
	_, err = ParseCompletenessTable(strings.NewReader("mag completeness\n20 1.5\n21 0.9\n"), "c.txt")
	if err == nil || !strings.Contains(err.Error(), "c.txt:2: column completeness: 1.5 outside allowed range [0, 1]") {
		t.Errorf("completeness above 1: %v", err)
	}
	if _, err := LoadErrorTable("testdata/does-not-exist.txt"); err == nil || !strings.Contains(err.Error(), "does-not-exist.txt") {
		t.Errorf("missing file: %v", err)
	}
}

func TestErrorTableInterpolation(t *testing.T) {
	t.Parallel()
	tab, err := LoadErrorTable("testdata/invented_survey_errors.txt")
	if err != nil {
		t.Fatal(err)
	}
	// nodes reproduced exactly, midpoints linear, faint side constant flux error
	cases := []struct{ m, want float64 }{
		{16, 0.004}, {20, 0.012}, {18, 0.008}, {23, 0.1}, {24, 0.2},
		{14, 0.004},                   // bright side: first row's value
		{25, 0.2 * math.Pow(10, 0.4)}, // faint side: σ_f constant
	}
	for _, c := range cases {
		if got := tab.MagErr(c.m); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("MagErr(%v) = %v, want %v", c.m, got, c.want)
		}
		f := FluxFromMag(c.m)
		if got := tab.FluxErr(c.m, f); math.Abs(got/(c.want*f)-1) > 1e-12 {
			t.Errorf("FluxErr(%v) = %v, want %v", c.m, got, c.want*f)
		}
	}
	// monotone: σ never decreases with magnitude over a fine grid
	prev := 0.0
	for m := 10.0; m < 30; m += 0.01 {
		if s := tab.MagErr(m); s < prev {
			t.Fatalf("MagErr decreases at %v mag: %v < %v", m, s, prev)
		} else {
			prev = s
		}
	}
	if lo, hi := tab.Range(); lo != 16 || hi != 24 {
		t.Errorf("Range = %v, %v", lo, hi)
	}
	// a table band reports S/N = 1/σ at a node when the floor is zero
	b := mustBand(t, BandSpec{Band: "i", Limit5SigmaMag: 24, SaturationMag: 14, Noise: TableNoise(tab)})
	if s := b.ExpectedSNR(24); math.Abs(s-5) > 1e-12 {
		t.Errorf("table band S/N at 24 mag = %v, want 5", s)
	}
}

func TestDetectionRule(t *testing.T) {
	t.Parallel()
	survey := []string{"g", "r", "i"}
	type tc struct {
		kind  RuleKind
		bands []string
		k     int
		flags []bool
		want  bool
	}
	cases := []tc{
		{RuleAllOf, nil, 0, []bool{true, true, true}, true},
		{RuleAllOf, nil, 0, []bool{true, false, true}, false},
		{RuleAllOf, []string{"g", "i"}, 0, []bool{true, false, true}, true},
		{RuleAnyOf, []string{"r", "i"}, 0, []bool{true, false, false}, false},
		{RuleAnyOf, []string{"r", "i"}, 0, []bool{false, false, true}, true},
		{RuleAtLeast, nil, 2, []bool{false, true, true}, true},
		{RuleAtLeast, nil, 2, []bool{false, false, true}, false},
	}
	for _, c := range cases {
		d, err := NewDetectionRule(c.kind, c.bands, c.k, survey)
		if err != nil {
			t.Errorf("%v: %v", c, err)
			continue
		}
		if got := d.Passes(c.flags); got != c.want {
			t.Errorf("%s on %v = %v, want %v", d, c.flags, got, c.want)
		}
	}
	bad := []struct {
		kind  RuleKind
		bands []string
		k     int
		want  string
	}{
		{"most_of", nil, 0, `kind "most_of" unknown (allowed: all_of, any_of, at_least)`},
		{RuleAllOf, []string{"z"}, 0, `band "z" not in the survey (allowed: g, r, i)`},
		{RuleAllOf, []string{"g", "g"}, 0, `band "g" listed twice`},
		{RuleAtLeast, []string{"g", "r"}, 3, "at_least count 3 outside allowed range [1, 2]"},
		{RuleAtLeast, nil, 0, "at_least count 0 outside allowed range [1, 3]"},
	}
	for _, c := range bad {
		_, err := NewDetectionRule(c.kind, c.bands, c.k, survey)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("rule %s %v %d: error %v, want %q", c.kind, c.bands, c.k, err, c.want)
		}
	}
}

func TestSurvey(t *testing.T) {
	t.Parallel()
	g := ivezicBand(24.8, 0.005, 0.039)
	g.Band = "g"
	r := ivezicBand(24.3, 0.005, 0.039)
	rule, err := NewDetectionRule(RuleAnyOf, []string{"r"}, 0, []string{"g", "r"})
	if err != nil {
		t.Fatal(err)
	}
	s, err := NewSurvey([]BandSpec{g, r}, rule)
	if err != nil {
		t.Fatal(err)
	}
	if got := s.Bands(); len(got) != 2 || got[0] != "g" || got[1] != "r" {
		t.Errorf("Bands = %v", got)
	}
	src := &countingSource{Source: newPCG()}
	rr := randFrom(src)
	dst := make([]Measurement, 2)
	det := s.Observe([]float64{20, 20}, rr, dst)
	if !det || !dst[1].Detected || src.n != 4 {
		t.Errorf("bright star: detected %v, %+v, %d draws (want true, 4 draws)", det, dst, src.n)
	}
	if s.Observe([]float64{20, 35}, rr, dst) && !dst[1].Detected {
		t.Errorf("rule any_of r passed without an r detection")
	}
	if _, err := NewSurvey([]BandSpec{r, r}, nil); err == nil || !strings.Contains(err.Error(), `band "r" listed twice`) {
		t.Errorf("duplicate bands: %v", err)
	}
	if _, err := NewSurvey([]BandSpec{r, g}, rule); err == nil || !strings.Contains(err.Error(), "built for another band list") {
		t.Errorf("rule for another band order: %v", err)
	}
	bad := r
	bad.FloorMag = -1
	if _, err := NewSurvey([]BandSpec{bad}, nil); err == nil || !strings.Contains(err.Error(), "floor -1 mag") {
		t.Errorf("bad band in survey: %v", err)
	}
}
