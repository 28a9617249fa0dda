package phot

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"
)

const goodGrid = `# test grid: BC = a linear function of log Teff, log g and [Fe/H]
# band: V vega Johnson V
# band: g ab SDSS g
# source: toy = made up for the test
teff_k	logg_cgs	feh	V	g	quality	blackbody_bands	source
4000	4	-1	-1.0	-1.5	model	-	toy
5000	4	-1	-0.5	-1.0	model	-	toy
6000	4	-1	0.0	-0.5	model	g	toy
4000	5	-1	-0.9	-1.4	model	-	toy
5000	5	-1	-0.4	-0.9	model	-	toy
6000	5	-1	0.1	-0.4	model	-	toy
4000	4	0	-0.8	-1.3	model	-	toy
5000	4	0	-0.3	-0.8	model	-	toy
6000	4	0	0.2	-0.3	model	-	toy
4000	5	0	-0.7	-1.2	model	-	toy
5000	5	0	-0.2	-0.7	model	-	toy
6000	5	0	0.3	-0.2	model	-	toy
`

func TestLoadGridAndInterpolate(t *testing.T) {
	g, err := LoadGrid(writeFile(t, "good.tsv", goodGrid))
	if err != nil {
		t.Fatal(err)
	}
	teff, logg, feh := g.Axes()
	if len(teff) != 3 || len(logg) != 2 || len(feh) != 2 {
		t.Fatalf("axes %v %v %v", teff, logg, feh)
	}
	if b := g.Bands(); b[0].System != SystemVega || b[1].System != SystemAB {
		t.Errorf("systems %+v", b)
	}
	p, err := NewPhotometer(g, []string{"V"})
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]float64, 1)
	// At a node the value is exact; between [Fe/H] and log g nodes it is linear:
	// V(5000 K, 4.5, −0.5) = mean of −0.5, −0.4, −0.3, −0.2 = −0.35.
	cases := []struct{ teff, logg, feh, want float64 }{
		{5000, 4, -1, -0.5}, {5000, 5, 0, -0.2}, {5000, 4.5, -0.5, -0.35}, {6000, 4.25, 0, 0.225},
	}
	for _, c := range cases {
		q := p.BCs(c.teff, c.logg, c.feh, dst)
		if q != QualityModel || math.Abs(dst[0]-c.want) > 1e-12 {
			t.Errorf("BC_V(%g, %g, %g) = %v (%v), want %v (model)", c.teff, c.logg, c.feh, dst[0], q, c.want)
		}
	}
	// [Fe/H] outside the grid's two slices: no extrapolation
	if q := p.BCs(5000, 4.5, 0.3, dst); q != QualityOutsideGrid || !math.IsNaN(dst[0]) {
		t.Errorf("feh 0.3: %v %v, want outside_grid NaN", q, dst[0])
	}
	// the g band of the 6000 K, log g 4, [Fe/H] −1 node is flagged as blackbody
	pg, _ := NewPhotometer(g, []string{"g"})
	if q := pg.BCs(5800, 4.2, -0.8, dst); q != QualityBlackbody {
		t.Errorf("g near the blackbody node: quality %v, want blackbody", q)
	}
	if q := p.BCs(5800, 4.2, -0.8, dst); q != QualityModel {
		t.Errorf("V near that node: quality %v, want model", q)
	}
}

// WriteGrid then LoadGrid gives back the same grid (regression test of the format).
func TestGridRoundTrip(t *testing.T) {
	g, err := DefaultGrid()
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteGrid(&buf, g); err != nil {
		t.Fatal(err)
	}
	g2, err := parseGrid(&buf, "roundtrip")
	if err != nil {
		t.Fatal(err)
	}
	if len(g2.bc) != len(g.bc) || len(g2.sources) != len(g.sources) {
		t.Fatalf("sizes differ")
	}
	for i := range g.bc {
		if g.bc[i] != g2.bc[i] {
			t.Fatalf("bc[%d] %v vs %v", i, g.bc[i], g2.bc[i])
		}
	}
	for i := range g.quality {
		if g.quality[i] != g2.quality[i] || g.bbMask[i] != g2.bbMask[i] || g.source[i] != g2.source[i] {
			t.Fatalf("node %d provenance differs", i)
		}
	}
}

// Each malformed grid gives an error wrapping ErrGrid that names the file and line.
func TestLoadGridErrors(t *testing.T) {
	lines := strings.Split(strings.TrimSuffix(goodGrid, "\n"), "\n")
	edit := func(f func([]string) []string) string {
		c := append([]string(nil), lines...)
		return strings.Join(f(c), "\n") + "\n"
	}
	cases := []struct{ name, text, want string }{
		{"hole", edit(func(l []string) []string { return append(l[:9], l[10:]...) }), "bad.tsv:10: grid has a hole"},
		{"unsorted teff", edit(func(l []string) []string { l[6], l[7] = l[7], l[6]; return l }), "bad.tsv:8: teff_k 5000 K not above the previous 6000 K"},
		{"unsorted logg", edit(func(l []string) []string {
			// swap the two log g blocks of the first [Fe/H] slice
			return append(append(append(l[:5:5], l[8:11]...), l[5:8]...), l[11:]...)
		}), "bad.tsv:9: logg_cgs 4 not above the previous block's 5"},
		{"unsorted feh", edit(func(l []string) []string {
			return append(append(l[:5:5], l[11:]...), l[5:11]...)
		}), "bad.tsv:12: feh -1 below the previous slice's 0"},
		{"missing system", edit(func(l []string) []string { return append(l[:2:2], l[3:]...) }), "bad.tsv:4: band column \"g\" has no \"# band: g SYSTEM\" header line"},
		{"bad system", edit(func(l []string) []string { l[2] = "# band: g stmag SDSS g"; return l }), "bad.tsv:3: band g: magnitude system \"stmag\""},
		{"NaN", edit(func(l []string) []string { l[6] = strings.Replace(l[6], "-1.0", "NaN", 1); return l }), "bad.tsv:7: bolometric correction g = \"NaN\""},
		{"not a number", edit(func(l []string) []string { l[5] = strings.Replace(l[5], "4000", "4e3K", 1); return l }), "bad.tsv:6: teff_k \"4e3K\" is not a finite number"},
		{"units", edit(func(l []string) []string { l[6] = strings.Replace(l[6], "-1.0", "-1000", 1); return l }), "bad.tsv:7: bolometric correction g = \"-1000\" mag, want |BC| <= 50 mag"},
		{"field count", edit(func(l []string) []string { l[6] = l[6] + "\t1"; return l }), "bad.tsv:7: 9 fields, want 8"},
		{"quality word", edit(func(l []string) []string { l[6] = strings.Replace(l[6], "model", "great", 1); return l }), "bad.tsv:7: quality \"great\""},
		{"unknown blackbody band", edit(func(l []string) []string { l[6] = strings.Replace(l[6], "\t-\t", "\tr\t", 1); return l }), "bad.tsv:7: blackbody_bands names \"r\""},
		{"column names", edit(func(l []string) []string { l[4] = strings.Replace(l[4], "teff_k", "teff", 1); return l }), "bad.tsv:5: column names start"},
		{"negative teff", edit(func(l []string) []string { l[5] = strings.Replace(l[5], "4000", "-4000", 1); return l }), "bad.tsv:6: teff_k \"-4000\" K, want 100 to 1e+07 K"},
		{"log teff", edit(func(l []string) []string { l[5] = strings.Replace(l[5], "4000", "3.60", 1); return l }), "bad.tsv:6: teff_k \"3.60\" K, want 100 to 1e+07 K (kelvin, not log10)"},
		{"linear g", edit(func(l []string) []string { l[5] = strings.Replace(l[5], "\t4\t", "\t27400\t", 1); return l }), "bad.tsv:6: logg_cgs \"27400\""},
		{"Z for feh", edit(func(l []string) []string { l[5] = strings.Replace(l[5], "\t-1\t", "\t0.014e3\t", 1); return l }), "bad.tsv:6: feh \"0.014e3\" dex"},
		{"no rows", strings.Join(lines[:5], "\n") + "\n", "bad.tsv: no data rows"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := LoadGrid(writeFile(t, "bad.tsv", c.text))
			if err == nil {
				t.Fatalf("no error, want one containing %q", c.want)
			}
			if !errors.Is(err, ErrGrid) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %q\nwant ErrGrid containing %q", err, c.want)
			}
		})
	}
}
