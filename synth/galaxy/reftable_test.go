package galaxy

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"sync"
	"testing"
)

var (
	refOnce sync.Once
	refRows map[string][]string
	refErr  error
)

// refValue returns the numeric value column of a row of testdata/population_values_galaxy.tsv
// (rows copied from /work/shared/reference/population_values.tsv; sources in the file).
func refValue(t *testing.T, quantity string) float64 {
	t.Helper()
	refOnce.Do(func() {
		f, err := os.Open("testdata/population_values_galaxy.tsv")
		if err != nil {
			refErr = err
			return
		}
		defer f.Close()
		refRows = map[string][]string{}
		sc := bufio.NewScanner(f)
		for sc.Scan() {
			line := sc.Text()
			if strings.HasPrefix(line, "#") || line == "" {
				continue
			}
			fs := strings.Split(line, "\t")
			refRows[fs[0]] = fs
		}
		refErr = sc.Err()
	})
	if refErr != nil {
		t.Fatal(refErr)
	}
	row, ok := refRows[quantity]
	if !ok {
		t.Fatalf("population_values_galaxy.tsv has no row %q", quantity)
	}
	v, err := strconv.ParseFloat(row[1], 64)
	if err != nil {
		t.Fatalf("row %q: value %q: %v", quantity, row[1], err)
	}
	return v
}

// TestDefaultsMatchReferenceTable: every published default of DefaultParams equals the row
// of the reference table it is named after (exact: the numbers are copied, unit-converted
// where the table uses kpc).
func TestDefaultsMatchReferenceTable(t *testing.T) {
	t.Parallel()
	p := DefaultParams()
	for _, c := range []struct {
		name  string
		got   float64
		row   string
		scale float64
	}{
		{"thin scale height", p.ThinDisc.ScaleHeightPc, "juric_thin_scale_height", 1},
		{"thin scale length", p.ThinDisc.ScaleLengthPc, "juric_thin_scale_length", 1},
		{"thick scale height", p.ThickDisc.ScaleHeightPc, "juric_thick_scale_height", 1},
		{"thick scale length", p.ThickDisc.ScaleLengthPc, "juric_thick_scale_length", 1},
		{"thick/thin", p.ThickToThinLocal, "juric_thick_to_thin_local_normalization", 1},
		{"halo q", p.Halo.AxisRatioQ, "juric_halo_axis_ratio_c/a", 1},
		{"halo n", p.Halo.PowerLawIndexN, "juric_halo_power_law_index", 1},
		{"halo/thin", p.HaloToThinLocal, "juric_halo_to_thin_local_normalization", 1},
		{"R0", p.Sun.R0Pc, "bhg16_R0", 1000},
		{"z_sun", p.Sun.ZSunPc, "bhg16_z_sun", 1},
		{"local density", p.LocalMassDensityMsunPc3, "local_stellar_mass_density_100pc_kroupa", 1},
	} {
		if want := refValue(t, c.row) * c.scale; math.Abs(c.got-want) > 1e-12*math.Abs(want) {
			t.Errorf("%s default %g, reference row %s gives %g", c.name, c.got, c.row, want)
		}
	}
}
