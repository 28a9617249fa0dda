package imf_test

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/starmock/starmock/imf"
)

// TestBadSpec checks that each kind of bad input is rejected with a clear
// message wrapping ErrInvalidSpec (contracts.md error rules: lower-case,
// names the field, quotes the value with unit and the allowed range).
func TestBadSpec(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	for _, c := range []struct {
		name string
		spec imf.Spec
		want []string // substrings of the message
	}{
		{"lo_equals_hi", imf.Spec{Kind: "kroupa", LoMsun: 1, HiMsun: 1}, []string{"min_mass_msun 1 Msun must be below max_mass_msun 1 Msun"}},
		{"lo_above_hi", imf.Spec{Kind: "salpeter", LoMsun: 5, HiMsun: 2}, []string{"min_mass_msun 5 Msun must be below max_mass_msun 2 Msun"}},
		{"negative_lo", imf.Spec{Kind: "broken_power_law", LoMsun: -0.1, HiMsun: 10, Slopes: []float64{2}}, []string{"min_mass_msun", "-0.1 Msun is not a positive finite mass"}},
		{"negative_hi", imf.Spec{Kind: "kroupa", LoMsun: 0.1, HiMsun: -3}, []string{"max_mass_msun", "-3 Msun"}},
		{"nan_lo", imf.Spec{Kind: "chabrier_single", LoMsun: nan}, []string{"min_mass_msun", "NaN Msun"}},
		{"inf_hi", imf.Spec{Kind: "chabrier_system", HiMsun: math.Inf(1)}, []string{"max_mass_msun", "+Inf Msun"}},
		{"lo_below_supported", imf.Spec{Kind: "kroupa", LoMsun: 0.005}, []string{"0.005 Msun is outside the supported range [0.01, 150] Msun"}},
		{"hi_above_supported", imf.Spec{Kind: "chabrier_single", HiMsun: 300}, []string{"300 Msun is outside the supported range [0.01, 150] Msun"}},
		{"unknown_kind", imf.Spec{Kind: "kroupa2001"}, []string{`unknown kind "kroupa2001"`, "salpeter, kroupa, chabrier_single"}},
		{"breaks_not_increasing", imf.Spec{Kind: "broken_power_law", Breaks: []float64{0.5, 0.5}, Slopes: []float64{1, 2, 3}}, []string{"strictly increasing", "breaks_msun[1] is 0.5 Msun after 0.5 Msun"}},
		{"breaks_decreasing", imf.Spec{Kind: "broken_power_law", Breaks: []float64{1, 0.5}, Slopes: []float64{1, 2, 3}}, []string{"breaks_msun[1] is 0.5 Msun after 1 Msun"}},
		{"break_zero", imf.Spec{Kind: "broken_power_law", Breaks: []float64{0}, Slopes: []float64{1, 2}}, []string{"breaks_msun[0]: 0 Msun is not a positive finite mass"}},
		{"break_nan", imf.Spec{Kind: "broken_power_law", Breaks: []float64{nan}, Slopes: []float64{1, 2}}, []string{"breaks_msun[0]: NaN Msun"}},
		{"slope_nan", imf.Spec{Kind: "broken_power_law", Breaks: []float64{1}, Slopes: []float64{1, nan}}, []string{"slopes[1]: NaN is not a finite number"}},
		{"slope_count", imf.Spec{Kind: "broken_power_law", Breaks: []float64{1}, Slopes: []float64{1}}, []string{"len(slopes) = len(breaks)+1, got 1 slopes for 1 breaks"}},
		{"breaks_on_kroupa", imf.Spec{Kind: "kroupa", Breaks: []float64{1}}, []string{`breaks_msun and slopes are only used by kind "broken_power_law"`}},
		{"table_on_salpeter", imf.Spec{Kind: "salpeter", TablePath: "x.txt"}, []string{`a table file ("x.txt") is only used by kind "table", not "salpeter"`}},
		{"table_without_path", imf.Spec{Kind: "table"}, []string{"needs a table file"}},
		{"table_limits_outside", imf.Spec{Kind: "table", TablePath: filepath.Join("testdata", "table_invented.txt"), LoMsun: 0.01}, []string{"0.01 Msun is outside the range of the table [0.05, 120] Msun"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := imf.New(c.spec)
			if err == nil {
				t.Fatalf("no error")
			}
			if !errors.Is(err, imf.ErrInvalidSpec) {
				t.Errorf("error %q does not wrap ErrInvalidSpec", err)
			}
			checkMessage(t, err, c.want)
		})
	}
}

func checkMessage(t *testing.T, err error, want []string) {
	t.Helper()
	msg := err.Error()
	for _, w := range want {
		if !strings.Contains(msg, w) {
			t.Errorf("message %q lacks %q", msg, w)
		}
	}
	if strings.HasSuffix(msg, ".") || msg != strings.ToLower(msg[:1])+msg[1:] {
		t.Errorf("message %q: want lower-case start, no trailing period", msg)
	}
}

// TestBadTable checks each table rule with its file:line message
// (ErrBadTable).
func TestBadTable(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name, text string
		want       []string
	}{
		{"non_monotonic", "0.1 5\n0.5 2\n0.3 1\n", []string{"t.txt:3:", "mass 0.3 Msun is not above 0.5 Msun on line 2", "strictly increasing"}},
		{"repeated_mass", "# c\n0.1 5\n0.1 2\n", []string{"t.txt:3:", "not above 0.1 Msun"}},
		{"nan_mass", "0.1 5\nNaN 2\n", []string{"t.txt:2:", "mass NaN Msun must be a positive finite number"}},
		{"nan_density", "0.1 5\n1 nan\n", []string{"t.txt:2:", "dN/dm NaN at 1 Msun"}},
		{"zero_mass", "0 5\n1 2\n", []string{"t.txt:1:", "mass 0 Msun"}},
		{"negative_mass", "-1 5\n1 2\n", []string{"t.txt:1:", "mass -1 Msun"}},
		{"zero_density", "0.1 5\n1 0\n", []string{"t.txt:2:", "dN/dm 0 at 1 Msun", "needs dN/dm > 0"}},
		{"three_fields", "0.1 5 7\n1 2\n", []string{"t.txt:1:", "want 2 fields (mass_msun, dn_dm), got 3"}},
		{"not_a_number", "mass dn\n0.1 5\n1 x2\n", []string{"t.txt:3:", `dN/dm "x2" is not a number`}},
		{"one_node", "# only one\n0.1 5\n", []string{"t.txt:", "has 1 nodes, need at least 2"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := imf.ParseTable(strings.NewReader(c.text), "t.txt", 0, 0)
			if err == nil {
				t.Fatalf("no error")
			}
			if !errors.Is(err, imf.ErrBadTable) {
				t.Errorf("error %q does not wrap ErrBadTable", err)
			}
			checkMessage(t, err, c.want)
		})
	}
	_, err := imf.LoadTable(filepath.Join(t.TempDir(), "missing.txt"), 0, 0)
	if !errors.Is(err, os.ErrNotExist) {
		t.Errorf("missing file: %v", err)
	}
}
