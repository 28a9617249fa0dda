package output

import (
	"os/exec"
	"path/filepath"
	"testing"
)

// TestAstropyReads runs scripts/check_astropy.py (an outside reader: astropy's FITS and
// ECSV readers) on a FITS and a CSV file written from the same batches. It is skipped
// when /usr/bin/python3 with astropy is not installed; CI installs python3-astropy.
func TestAstropyReads(t *testing.T) {
	if testing.Short() {
		t.Skip("runs python3")
	}
	py := "/usr/bin/python3"
	if err := exec.Command(py, "-c", "import astropy").Run(); err != nil {
		t.Skipf("no astropy: %v", err)
	}
	dir := t.TempDir()
	fp := filepath.Join(dir, "cat.fits")
	cp := filepath.Join(dir, "cat.csv")
	writeTestFile(t, FITS, fp, 400, 2, Options{})
	writeTestFile(t, CSV, cp, 400, 2, Options{})
	script, _ := filepath.Abs("../scripts/check_astropy.py")
	out, err := exec.Command(py, script, "--fits", fp, "--csv", cp).CombinedOutput()
	if err != nil {
		t.Errorf("check_astropy.py failed: %v\n%s", err, out)
	}
	// The script must also fail when the expectation is wrong (a test that can fail).
	out, err = exec.Command(py, script, "--fits", fp, "--csv", cp, "--rows", "801").CombinedOutput()
	if err == nil {
		t.Errorf("check_astropy.py passed with a wrong row count:\n%s", out)
	}
	// ... and when a unit string is not one astropy knows.
	bad := filepath.Join(dir, "bad.fits")
	w, err := Create(FITS, bad, []Column{{Name: "m", Unit: "Msun_per_blob", Kind: Float32}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if err := w.Write(&Batch{N: 1, Cols: []any{[]float32{1}}}); err != nil {
		t.Fatal(err)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	out, err = exec.Command(py, script, "--fits", bad).CombinedOutput()
	if err == nil {
		t.Errorf("check_astropy.py passed with an unknown unit:\n%s", out)
	}
}
