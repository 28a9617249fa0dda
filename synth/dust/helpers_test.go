package dust

import (
	"bufio"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/internal/consts"
)

// readTSV reads a reference table of the kit layout: '#' lines are the source
// header, the first other line holds column names, then tab-separated rows.
// Empty fields are returned as "".
func readTSV(t *testing.T, path string) (cols []string, rows [][]string) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatalf("open %s: %v", path, err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.TrimSpace(line) == "" {
			continue
		}
		fields := strings.Split(line, "\t")
		if cols == nil {
			cols = fields
			continue
		}
		rows = append(rows, fields)
	}
	if err := sc.Err(); err != nil {
		t.Fatalf("read %s: %v", path, err)
	}
	return cols, rows
}

func parseF(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}

func mustLaw(t testing.TB, name string, rv float64) Law {
	t.Helper()
	l, err := NewLaw(name, rv)
	if err != nil {
		t.Fatalf("NewLaw(%q, %g): %v", name, rv, err)
	}
	return l
}

// loadPassband reads one of testdata/passbands/*.tsv (reference-kit layout:
// '#' header with a "response_kind: photon|energy" line, then columns
// wavelength_angstrom and throughput).
func loadPassband(t testing.TB, name string) Passband {
	t.Helper()
	path := "testdata/passbands/" + name + ".tsv"
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("read %s: %v", path, err)
	}
	var pb Passband
	kind := ""
	header := true
	for _, line := range strings.Split(string(data), "\n") {
		if strings.HasPrefix(line, "#") {
			if v, ok := strings.CutPrefix(line, "# response_kind:"); ok {
				kind = strings.TrimSpace(v)
			}
			continue
		}
		if strings.TrimSpace(line) == "" {
			continue
		}
		if header {
			header = false
			continue
		}
		f := strings.Split(line, "\t")
		w, err1 := strconv.ParseFloat(f[0], 64)
		s, err2 := strconv.ParseFloat(f[1], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("%s: bad row %q", path, line)
		}
		pb.WavelengthAA = append(pb.WavelengthAA, w)
		pb.Throughput = append(pb.Throughput, s)
	}
	switch kind {
	case "photon":
		pb.Photon = true
	case "energy":
	default:
		t.Fatalf("%s: response_kind %q", path, kind)
	}
	return pb
}

// planck returns a function λ(Å) → B_λ(T) (any unit; the ratio is scale free).
// (written out here rather than calling BlackbodyFlux, which TestBlackbodyFlux checks against it)
func planck(teffK float64) func(float64) float64 {
	return func(lamAA float64) float64 { return consts.PlanckLambda(lamAA*1e-10, teffK) }
}

// bandNames16 are the 16 passbands copied from the reference kit.
var bandNames16 = []string{
	"johnson_cousins_U", "johnson_cousins_B", "johnson_cousins_V", "johnson_cousins_R", "johnson_cousins_I",
	"twomass_J", "twomass_H", "twomass_Ks",
	"sdss_u", "sdss_g", "sdss_r", "sdss_i", "sdss_z",
	"gaia_dr3_G", "gaia_dr3_BP", "gaia_dr3_RP",
}
