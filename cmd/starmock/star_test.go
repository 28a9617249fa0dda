package main

import (
	"encoding/json"
	"flag"
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/evolve"
)

// Run "go test ./cmd/starmock -run 'Star|Track' -update-evolve" to rewrite the
// golden files of the star and track commands after a deliberate change.
var updateEvolve = flag.Bool("update-evolve", false, "rewrite the star/track command golden files")

// numberRE matches the long floating-point numbers of JSON and CSV output.
var numberRE = regexp.MustCompile(`-?\d+\.\d{7,}(e[-+]?\d+)?|-?\d\.\d+e[-+]\d+`)

// roundNumbers rounds long numbers to 7 significant digits before a golden
// comparison, so that the last-bit differences between platforms (fused
// multiply–add on some architectures) do not break the format test.
func roundNumbers(s string) string {
	return numberRE.ReplaceAllStringFunc(s, func(x string) string {
		v, err := strconv.ParseFloat(x, 64)
		if err != nil {
			return x
		}
		return strconv.FormatFloat(v, 'g', 7, 64)
	})
}

// TestStarCommandGolden is a regression test of the output format (labelled
// as such): the physics is tested in the evolve package, and
// TestStarCommandNumbers ties the printed numbers to it.
func TestStarCommandGolden(t *testing.T) {
	for _, c := range []struct{ name, args string }{
		{"star_sun_table", "star --mass 1 --age 4.57Gyr --feh 0"},
		{"star_sun_json", "star --mass 1 --age 4.57Gyr --z 0.02 --json"},
		{"star_clump_table", "star --mass 2.5 --age 600Myr --feh -0.5"},
		{"star_given_json", "star --teff 4800 --luminosity 50 --logg 2.5 --feh -0.2 --json"},
	} {
		t.Run(c.name, func(t *testing.T) {
			stdout, stderr, code := runArgs(t, strings.Fields(c.args)...)
			if code != 0 {
				t.Fatalf("exit %d, stderr %q", code, stderr)
			}
			assertGolden(t, "evolve", c.name, roundNumbers(stdout), *updateEvolve, "update-evolve")
		})
	}
}

// TestStarCommandNumbers: the JSON holds exactly the evolve package's values
// and the required keys; --feh 0 and --z 0.02 agree; ages in every unit agree.
func TestStarCommandNumbers(t *testing.T) {
	m, err := evolve.NewModel(0.02)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := m.Evolve(1, 4.57e9)
	ts, _ := m.Timescales(1)
	var first map[string]any
	for _, args := range []string{
		"star --mass 1 --age 4.57Gyr --feh 0 --json",
		"star --mass 1 --age 4570Myr --z 0.02 --json",
		"star --mass 1 --age 4.57e9yr --json",
		"star --mass 1 --age 4570000000 --json",
		"star --mass 1 --age 4.57e6kyr --json",
	} {
		stdout, stderr, code := runArgs(t, strings.Fields(args)...)
		if code != 0 {
			t.Fatalf("%s: exit %d, %s", args, code, stderr)
		}
		var got map[string]any
		if err := json.Unmarshal([]byte(stdout), &got); err != nil {
			t.Fatalf("%s: %v", args, err)
		}
		for _, k := range []string{"stage", "mass_msun", "luminosity_lsun", "teff_k", "radius_rsun", "logg_cgs",
			"core_mass_msun", "ms_lifetime_yr", "remnant", "remnant_mass_msun"} {
			if _, ok := got[k]; !ok {
				t.Errorf("%s: key %q missing", args, k)
			}
		}
		checks := map[string]float64{"mass_msun": want.MassMsun, "luminosity_lsun": want.LuminosityLsun, "teff_k": want.TeffK,
			"radius_rsun": want.RadiusRsun, "logg_cgs": want.LoggCgs, "ms_lifetime_yr": ts.MSLifetimeYr, "remnant_mass_msun": ts.RemnantMassMsun}
		for k, v := range checks {
			if g, _ := got[k].(float64); math.Abs(g-v) > 1e-9*math.Abs(v) {
				t.Errorf("%s: %s = %v, evolve gives %v", args, k, g, v)
			}
		}
		if got["stage"] != want.Stage.String() || got["remnant"] != ts.Remnant.String() {
			t.Errorf("%s: stage %v remnant %v", args, got["stage"], got["remnant"])
		}
		if first == nil {
			first = got
		} else if got["luminosity_lsun"] != first["luminosity_lsun"] {
			t.Errorf("%s differs from the first form", args)
		}
	}
	// Given star: R from L = 4πR²σT⁴ (Teff = 5772 K, L = 1 → R = 1), M from log g.
	stdout, _, code := runArgs(t, "star", "--teff", "5772", "--luminosity", "1", "--logg", "4.438067627", "--json")
	if code != 0 {
		t.Fatal("given star failed")
	}
	var g map[string]any
	_ = json.Unmarshal([]byte(stdout), &g)
	if r := g["radius_rsun"].(float64); math.Abs(r-1) > 1e-12 {
		t.Errorf("given Sun radius %v", r)
	}
	if ms := g["mass_msun"].(float64); math.Abs(ms-1) > 1e-9 {
		t.Errorf("given Sun mass %v (IAU 2015 nominal log g 4.438)", ms)
	}
	if g["stage"] != nil || g["ms_lifetime_yr"] != nil {
		t.Errorf("given star has evolutionary fields: %v", g)
	}
	keys := make([]string, 0, len(g))
	for k := range g {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	if len(keys) != len(first) {
		t.Errorf("given and evolved JSON have different keys: %v", keys)
	}
}

// TestStarCommandErrors: bad input exits with status 2 and a message naming the flag.
func TestStarCommandErrors(t *testing.T) {
	for _, c := range []struct{ args, want string }{
		{"star --mass -1 --age 1Gyr", "--mass"},
		{"star --mass 200 --age 1Gyr", "--mass"},
		{"star --mass 1 --age -1Gyr", "--age"},
		{"star --mass 1 --age 3parsec", "--age"},
		{"star --mass 1 --age NaN", "--age"},
		{"star --mass 1 --age 1Gyr --z 0.5", "--z"},
		{"star --mass 1 --age 1Gyr --feh -4", "--feh"},
		{"star --mass 1 --age 1Gyr --feh 0 --z 0.02", "--feh and --z"},
		{"star --mass 1", "--mass and --age"},
		{"star --teff 5000", "--luminosity"},
		{"star --teff 5000 --luminosity 1 --age 1Gyr", "--age"},
		{"star --teff 5000 --luminosity -1", "--luminosity"},
		{"star --teff 5000 --luminosity 1 --logg 4 --mass 1", "--logg or --mass"},
		{"star --mass x --age 1Gyr", "invalid argument"},
	} {
		_, stderr, code := runArgs(t, strings.Fields(c.args)...)
		if code != 2 || !strings.Contains(stderr, c.want) {
			t.Errorf("%q: exit %d, stderr %q; want 2 and %q", c.args, code, stderr, c.want)
		}
	}
}
