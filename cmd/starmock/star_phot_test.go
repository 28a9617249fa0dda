package main

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"testing"
)

// TestStarPhotometryJSON: `starmock star --json` carries abs_mag for the 16 standard bands
// plus spectral_type and luminosity_class. Checks: the nominal Sun given by Teff, L and
// log g has M_V within 0.05 mag of 4.81 (Willmer 2018, ApJS 236, 47, as copied in the
// reference kit) and is a G dwarf; a neutron star has null magnitudes and labels.
func TestStarPhotometryJSON(t *testing.T) {
	runJSON := func(args ...string) map[string]any {
		t.Helper()
		var out, errb bytes.Buffer
		if code := run(context.Background(), append([]string{"star", "--json"}, args...), &out, &errb); code != 0 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		var m map[string]any
		if err := json.Unmarshal(out.Bytes(), &m); err != nil {
			t.Fatal(err)
		}
		return m
	}
	sun := runJSON("--teff", "5772", "--luminosity", "1", "--logg", "4.438", "--feh", "0")
	mags, ok := sun["abs_mag"].(map[string]any)
	if !ok {
		t.Fatalf("no abs_mag object: %v", sun)
	}
	for _, b := range []string{"U", "B", "V", "Rc", "Ic", "J", "H", "Ks", "u", "g", "r", "i", "z", "G", "BP", "RP"} {
		if _, ok := mags[b].(float64); !ok {
			t.Errorf("abs_mag.%s missing or null: %v", b, mags[b])
		}
	}
	if v, _ := mags["V"].(float64); math.Abs(v-4.81) > 0.05 {
		t.Errorf("solar M_V %.3f, want 4.81 ± 0.05", v)
	}
	if st, _ := sun["spectral_type"].(string); len(st) == 0 || st[0] != 'G' {
		t.Errorf("solar spectral type %q, want G", st)
	}
	if lc, _ := sun["luminosity_class"].(string); lc != "V" {
		t.Errorf("solar luminosity class %q, want V", lc)
	}
	ns := runJSON("--mass", "15", "--age", "1Gyr", "--feh", "0")
	if ns["stage"] != "neutron_star" {
		t.Fatalf("15 Msun at 1 Gyr: stage %v, want neutron_star", ns["stage"])
	}
	for b, v := range ns["abs_mag"].(map[string]any) {
		if v != nil {
			t.Errorf("neutron star abs_mag.%s = %v, want null", b, v)
		}
	}
	if ns["spectral_type"] != nil || ns["luminosity_class"] != nil {
		t.Errorf("neutron star labels %v %v, want null", ns["spectral_type"], ns["luminosity_class"])
	}
}
