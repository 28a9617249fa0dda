package main

import (
	"flag"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/phot"
)

// Run "go test ./cmd/starmock -run Bands -update-bands" to rewrite the golden
// files after a deliberate change of output.
var updateBands = flag.Bool("update-bands", false, "rewrite the bands command golden files")

// TestBandsCommandGolden: regression tests of the output format (labelled as
// such). The pivot wavelengths are checked against the passband kit README in
// the phot tests and the coefficients against outside sources in the dust
// tests; TestBandsCommandNumbers ties the printed numbers to those packages.
func TestBandsCommandGolden(t *testing.T) {
	for _, c := range []struct{ name, args string }{
		{"list", "bands"},
		{"av1_ccm89", "bands --av 1"},
		{"av2_f99_rv5_hot", "bands --av 2 --rv 5 --law f99 --teff 20000"},
	} {
		t.Run(c.name, func(t *testing.T) {
			stdout, stderr, code := runArgs(t, strings.Fields(c.args)...)
			if code != 0 {
				t.Fatalf("exit %d, stderr %q", code, stderr)
			}
			assertGolden(t, "bands", c.name, stdout, *updateBands, "update-bands")
		})
	}
}

// The printed A_X/A_V are dust.BandRatio of the band curve and a blackbody,
// and the printed pivots are phot's, to the printed digits.
func TestBandsCommandNumbers(t *testing.T) {
	stdout, _, code := runArgs(t, "bands", "--av", "0.5", "--rv", "3.1", "--teff", "4000")
	if code != 0 {
		t.Fatal(code)
	}
	law, err := dust.NewLaw("ccm89", 3.1)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, line := range strings.Split(stdout, "\n") {
		f := strings.Fields(line)
		if len(f) < 5 || strings.HasPrefix(line, "#") || f[0] == "band" {
			continue
		}
		b, err := phot.LookupBand(f[0])
		if err != nil {
			t.Fatal(err)
		}
		want, err := dust.BandRatio(law, dust.Passband{WavelengthAA: b.Curve.WavelengthAA, Throughput: b.Curve.Throughput, Photon: b.Curve.Photon}, phot.BlackbodyFLambda(4000), 0.5)
		if err != nil {
			t.Fatal(err)
		}
		got, _ := strconv.ParseFloat(f[3], 64)
		pivot, _ := strconv.ParseFloat(f[2], 64)
		if math.Abs(got-want) > 5e-5 || math.Abs(pivot-b.PivotAA) > 0.05 {
			t.Errorf("%s: printed %v, %v; want %v, %v", f[0], pivot, got, b.PivotAA, want)
		}
		n++
	}
	if n != len(phot.BuiltinBands()) {
		t.Errorf("%d bands printed, want %d", n, len(phot.BuiltinBands()))
	}
}

func TestBandsCommandUserPassband(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(dir, "narrow_656.dat")
	os.WriteFile(good, []byte("# response_kind: photon\n6500 0\n6550 1\n6600 0\n"), 0o644)
	stdout, stderr, code := runArgs(t, "bands", "--passband", good, "--av", "1")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(stdout, "narrow_656  ab") {
		t.Errorf("user band not listed:\n%s", stdout)
	}
}

// Bad input exits with status 2 and names the flag or file.
func TestBandsCommandErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "neg.dat")
	os.WriteFile(bad, []byte("5000 0.1\n5100 -0.5\n"), 0o644)
	for _, c := range []struct{ args, want string }{
		{"bands --av -1", "--av -1 mag: want A_V >= 0 mag"},
		{"bands --av 1 --rv 9", "--law/--rv"},
		{"bands --av 1 --law ccm", "unknown extinction law"},
		{"bands --av 1 --teff 50", "--teff 50 K: want 1000 to 200000 K"},
		{"bands --av x", "invalid argument"},
		{"bands --passband " + bad, "neg.dat:2: throughput -0.5"},
		{"bands extra", "unknown command"},
	} {
		t.Run(c.args, func(t *testing.T) {
			_, stderr, code := runArgs(t, strings.Fields(c.args)...)
			if code != 2 {
				t.Errorf("exit %d, want 2 (stderr %q)", code, stderr)
			}
			if !strings.Contains(stderr, c.want) {
				t.Errorf("stderr %q, want it to contain %q", stderr, c.want)
			}
		})
	}
}
