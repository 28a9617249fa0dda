package main

import (
	"encoding/csv"
	"image/png"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/evolve"
)

// TestTrackCommandGolden is a regression test of the CSV format (labelled as
// such) for a short track.
func TestTrackCommandGolden(t *testing.T) {
	stdout, stderr, code := runArgs(t, "track", "--mass", "3", "--points", "10", "--max-age-after-death", "1e9")
	if code != 0 {
		t.Fatalf("exit %d, %s", code, stderr)
	}
	assertGolden(t, "evolve", "track_3msun_10pts", roundNumbers(stdout), *updateEvolve, "update-evolve")
}

// TestTrackCommandCSV: columns, every stage of a 1 Msun star resolved with
// many points, ages increasing per mass, rows equal to evolve.Evolve.
func TestTrackCommandCSV(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "t.csv")
	pngPath := filepath.Join(dir, "hr.png")
	_, stderr, code := runArgs(t, "track", "--mass", "5,1,2", "--feh", "-0.5", "--out", out, "--png", pngPath)
	if code != 0 {
		t.Fatalf("exit %d, %s", code, stderr)
	}
	f, err := os.Open(out)
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(f).ReadAll()
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	wantHdr := "initial_mass_msun,age_yr,stage,mass_msun,luminosity_lsun,teff_k,radius_rsun,logg_cgs,core_mass_msun"
	if strings.Join(rows[0], ",") != wantHdr {
		t.Fatalf("header %v", rows[0])
	}
	m, _ := evolve.NewModel(evolve.ZFromFeH(-0.5))
	count := map[string]map[string]int{}
	lastAge := map[string]float64{}
	lastMass := ""
	for i, r := range rows[1:] {
		mi, age := r[0], mustParse(t, r[1])
		if mi != lastMass && lastMass != "" && mustParse(t, mi) < mustParse(t, lastMass) {
			t.Errorf("row %d: masses not sorted", i)
		}
		lastMass = mi
		if a, ok := lastAge[mi]; ok && age <= a {
			t.Errorf("row %d: age not increasing", i)
		}
		lastAge[mi] = age
		if count[mi] == nil {
			count[mi] = map[string]int{}
		}
		count[mi][r[2]]++
		if i%97 == 0 {
			s, _ := m.Evolve(mustParse(t, mi), age)
			if s.Stage.String() != r[2] || !close8(s.LuminosityLsun, mustParse(t, r[4])) || !close8(s.TeffK, mustParse(t, r[5])) {
				t.Errorf("row %d differs from evolve: %v vs %+v", i, r, s)
			}
		}
	}
	for _, st := range []string{"main_sequence", "subgiant", "red_giant_branch", "core_helium_burning", "early_agb", "thermally_pulsing_agb", "carbon_oxygen_white_dwarf"} {
		if count["1"][st] < 20 {
			t.Errorf("1 Msun track: only %d rows of %s", count["1"][st], st)
		}
	}
	pf, err := os.Open(pngPath)
	if err != nil {
		t.Fatal(err)
	}
	defer pf.Close()
	img, err := png.Decode(pf)
	if err != nil {
		t.Fatalf("PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() < 400 || b.Dy() < 300 {
		t.Errorf("PNG only %v", b)
	}
}

func close8(a, b float64) bool { return a == b }

func mustParse(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}

// TestTrackCommandErrors: bad input exits with status 2 naming the flag.
func TestTrackCommandErrors(t *testing.T) {
	for _, c := range []struct{ args, want string }{
		{"track", "--mass"},
		{"track --mass 1,500", "--mass"},
		{"track --mass 1 --points 3", "--points"},
		{"track --mass 1 --z 1", "--z"},
		{"track --mass 1 --out /nonexistent/dir/x.csv", "--out"},
		{"track --mass a,b", "invalid argument"},
	} {
		_, stderr, code := runArgs(t, strings.Fields(c.args)...)
		if code != 2 || !strings.Contains(stderr, c.want) {
			t.Errorf("%q: exit %d, stderr %q; want 2 and %q", c.args, code, stderr, c.want)
		}
	}
}
