package phot

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Pivot wavelengths from data/passbands/README.md ("λp adopted", computed by the
// kit's pivot.py with the trapezoid rule on the tabulated points, following each
// file's response_kind). Printed to 0.1 Å, so the tolerance is half a unit of
// the last digit plus rounding slack: 0.051 Å.
func TestPivotWavelengthsMatchKitREADME(t *testing.T) {
	want := map[string]float64{
		"U": 3584.8, "B": 4371.1, "V": 5477.7, "Rc": 6498.1, "Ic": 8020.1,
		"J": 12358.1, "H": 16457.5, "Ks": 21603.1,
		"u": 3587.7, "g": 4701.4, "r": 6177.2, "i": 7496.6, "z": 8904.2,
		"G": 6217.6, "BP": 5109.7, "RP": 7769.0,
		"lsst_u": 3716.5, "lsst_g": 4787.0, "lsst_r": 6207.6, "lsst_i": 7548.9, "lsst_z": 8673.8, "lsst_y": 9746.2,
	}
	bands := BuiltinBands()
	if len(bands) != len(want) {
		t.Errorf("%d built-in bands, want %d", len(bands), len(want))
	}
	for _, b := range bands {
		w, ok := want[b.Name]
		if !ok {
			t.Errorf("unexpected band %s", b.Name)
			continue
		}
		if d := math.Abs(b.PivotAA - w); d > 0.051 {
			t.Errorf("%s pivot %.3f Å, README %.1f Å (diff %.3f > 0.051)", b.Name, b.PivotAA, w, d)
		}
	}
}

// The other reading of the curve (README column "λp other reading") must come out
// when the response kind is flipped: a check that response_kind is honoured.
func TestPivotOtherReading(t *testing.T) {
	other := map[string]float64{"V": 5500.5, "J": 12393.1, "G": 5879.1, "u": 3575.0}
	for name, w := range other {
		b, err := LookupBand(name)
		if err != nil {
			t.Fatal(err)
		}
		flipped := *b.Curve
		flipped.Photon = !flipped.Photon
		if d := math.Abs(flipped.PivotAA() - w); d > 0.051 {
			t.Errorf("%s flipped pivot %.3f Å, README %.1f Å", name, flipped.PivotAA(), w)
		}
	}
}

func TestBuiltinSystems(t *testing.T) {
	want := map[string]System{"U": SystemVega, "Ks": SystemVega, "G": SystemVega, "u": SystemAB, "z": SystemAB, "lsst_y": SystemAB}
	for n, s := range want {
		b, err := LookupBand(n)
		if err != nil {
			t.Fatal(err)
		}
		if b.System != s {
			t.Errorf("%s system %s, want %s", n, b.System, s)
		}
	}
	if _, err := LookupBand("R"); !errors.Is(err, ErrUnknownBand) {
		t.Errorf("LookupBand(R) error %v, want ErrUnknownBand", err)
	}
}

func writeFile(t *testing.T, name, text string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestLoadPassband(t *testing.T) {
	var sb strings.Builder
	sb.WriteString("# my box filter, 10 Å steps\nwavelength throughput\n4999 0\n")
	for l := 5000; l <= 6000; l += 10 {
		fmt.Fprintf(&sb, "%d 1\n", l)
	}
	sb.WriteString("6001 0\n")
	p := writeFile(t, "box.dat", sb.String())
	pb, err := LoadPassband(p)
	if err != nil {
		t.Fatal(err)
	}
	if !pb.Photon || pb.Name != "box" || len(pb.WavelengthAA) != 103 {
		t.Errorf("got %+v", pb)
	}
	// Pivot of a box of per-photon response on [a, b]: λp² = (b² − a²)/2 / ln(b/a)
	// (closed form of the definition); the 1 Å ramps and the trapezoid rule on
	// 10 Å steps change it by < 0.1 Å.
	a, b := 5000.0, 6000.0
	want := math.Sqrt((b*b - a*a) / 2 / math.Log(b/a))
	if d := math.Abs(pb.PivotAA() - want); d > 0.1 {
		t.Errorf("box pivot %.3f Å, closed form %.3f Å", pb.PivotAA(), want)
	}
}

func TestLoadPassbandErrors(t *testing.T) {
	cases := []struct{ name, text, want string }{
		{"negative", "5000 0.1\n5100 -0.2\n5200 0.3\n", "bad.dat:2: throughput -0.2"},
		{"nan", "5000 0.1\n5100 NaN\n5200 0.3\n", "bad.dat:2: throughput NaN"},
		{"unsorted", "5000 0.1\n5200 0.2\n5100 0.3\n", "bad.dat:3: wavelength 5100 angstrom not above"},
		{"duplicate", "5000 0.1\n5000 0.2\n", "bad.dat:2: wavelength 5000 angstrom not above"},
		{"one row", "# x\n5000 0.1\n", "1 data rows, want at least 2"},
		{"all zero", "5000 0\n5100 0\n", "throughput is zero everywhere"},
		{"text", "5000 0.1\n5100 abc\n", "bad.dat:2: cannot parse"},
		{"one column", "5000\n", "bad.dat:1: want two columns"},
		{"kind", "# response_kind: counts\n5000 0\n5100 1\n", "bad.dat:1: response_kind \"counts\""},
		{"negative wavelength", "-5 0.1\n5100 0.2\n", "bad.dat:1: wavelength -5 angstrom"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := LoadPassband(writeFile(t, "bad.dat", c.text))
			if err == nil {
				t.Fatalf("no error, want one containing %q", c.want)
			}
			if !errors.Is(err, ErrPassband) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %q, want ErrPassband containing %q", err, c.want)
			}
		})
	}
}

func TestNewPassband(t *testing.T) {
	v, _ := LookupBand("V")
	pb, err := NewPassband("v_copy", v.Curve.WavelengthAA, v.Curve.Throughput, false, "copy")
	if err != nil {
		t.Fatal(err)
	}
	f := func(float64) float64 { return 1e-27 }
	if a, b := ABMagFNu(pb, f), ABMagFNu(v.Curve, f); a != b {
		t.Errorf("copy %v vs built-in %v", a, b)
	}
	// a struct literal works too (quadrature built on the fly)
	lit := &Passband{WavelengthAA: v.Curve.WavelengthAA, Throughput: v.Curve.Throughput}
	if a, b := ABMagFNu(lit, f), ABMagFNu(v.Curve, f); math.Abs(a-b) > 1e-12 {
		t.Errorf("literal %v vs built-in %v", a, b)
	}
	for _, c := range []struct {
		name   string
		wl, tr []float64
	}{
		{"lengths", []float64{1, 2}, []float64{1}},
		{"short", []float64{1}, []float64{1}},
		{"order", []float64{2, 1}, []float64{1, 1}},
		{"negative", []float64{1, 2}, []float64{1, -1}},
		{"nan", []float64{1, 2}, []float64{math.NaN(), 1}},
		{"zero", []float64{1, 2}, []float64{0, 0}},
	} {
		if _, err := NewPassband(c.name, c.wl, c.tr, true, ""); !errors.Is(err, ErrPassband) {
			t.Errorf("%s: error %v, want ErrPassband", c.name, err)
		}
	}
}
