package phot

import (
	"math"
	"testing"

	"github.com/starmock/starmock/internal/consts"
)

func TestSpectralType(t *testing.T) {
	// Pecaut & Mamajek (2013, table 2024.05.15) type–Teff scale; the nominal
	// Sun (5772 K) is G2 (common practice: the Sun is G2 V).
	cases := []struct {
		teffK float64
		want  string
	}{
		{5772, "G2"}, {5770, "G2"}, {3110, "M4.5"}, {9700, "A0"}, {10400, "B9.5"},
		{45900, "O3"}, {31400, "B0"}, {2330, "M9.5"}, {1255, "T0"},
		{60000, ""}, {100, ""}, {math.NaN(), ""},
	}
	for _, c := range cases {
		if got := SpectralType(c.teffK); got != c.want {
			t.Errorf("SpectralType(%g) = %q, want %q", c.teffK, got, c.want)
		}
	}
	// every tabulated node maps to its own type
	rows, _ := dwarfSequence()
	for _, r := range rows {
		if got := SpectralType(r.teffK); got+"V" != r.spt {
			t.Errorf("SpectralType(%g) = %q, table %s", r.teffK, got, r.spt)
		}
	}
}

func TestStarSpectralType(t *testing.T) {
	if got := StarSpectralType(12000, 8); got != "WD" {
		t.Errorf("white dwarf: %q, want WD", got)
	}
	if got := StarSpectralType(5772, 4.44); got != "G2" {
		t.Errorf("Sun: %q, want G2", got)
	}
}

// Luminosity classes (boundaries: common practice, see LuminosityClass).
func TestLuminosityClass(t *testing.T) {
	cases := []struct {
		name             string
		logg, lum, teffK float64
		want             string
	}{
		{"Sun", consts.LogGSunCgs, 1, 5772, "V"},
		{"O3 dwarf", 3.95, 6.6e5, 45900, "V"},
		{"M5 dwarf", 5.0, 0.003, 3060, "V"},
		{"subgiant", 3.8, 3, 5400, "IV"},
		{"red clump", 2.4, 50, 4750, "III"},
		{"RGB tip", 0.5, 2500, 3900, "III"},
		{"AGB", 0.0, 6000, 3300, "II"},
		{"red supergiant", 0.0, 1e5, 3800, "I"},
		{"blue supergiant", 2.5, 2e5, 20000, "I"},
		{"white dwarf", 8.0, 0.003, 10000, "WD"},
		{"neutron star", 14, math.NaN(), math.NaN(), ""},
	}
	for _, c := range cases {
		if got := LuminosityClass(c.logg, c.lum, c.teffK); got != c.want {
			t.Errorf("%s: LuminosityClass = %q, want %q", c.name, got, c.want)
		}
	}
	// log g of the mean dwarf sequence at the G2V node: M = 1.00, R = 1.012
	// (Pecaut & Mamajek table) → 4.438 + log10(1/1.012²) = 4.428 (computed here).
	if g := MainSequenceLoggCgs(5770); math.Abs(g-4.428) > 0.001 {
		t.Errorf("MainSequenceLoggCgs(5770) = %.4f, want 4.428", g)
	}
}
