package phot

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// readTSV reads a reference table of ../shared/reference (copied into
// testdata/ with its source header): '#' lines are comments, the first other
// line names the columns.
func readTSV(t *testing.T, path string) (cols []string, rows [][]string) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		l := sc.Text()
		if strings.HasPrefix(l, "#") || strings.TrimSpace(l) == "" {
			continue
		}
		fs := strings.Split(l, "\t")
		if cols == nil {
			cols = fs
			continue
		}
		rows = append(rows, fs)
	}
	return cols, rows
}

// calibValue returns the value column of a quantity row of
// testdata/solar_and_calibration_values.tsv.
func calibValue(t *testing.T, quantity string) float64 {
	t.Helper()
	_, rows := readTSV(t, "testdata/solar_and_calibration_values.tsv")
	for _, r := range rows {
		if r[0] == quantity {
			v, err := strconv.ParseFloat(r[1], 64)
			if err != nil {
				t.Fatalf("%s: %v", quantity, err)
			}
			return v
		}
	}
	t.Fatalf("quantity %s not in solar_and_calibration_values.tsv", quantity)
	return math.NaN()
}

func defaultPhotometer(t testing.TB) *Photometer {
	t.Helper()
	g, err := DefaultGrid()
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPhotometer(g, DefaultBandNames)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func bandIndex(p *Photometer, name string) int {
	for k, b := range p.Bands() {
		if b.Name == name {
			return k
		}
	}
	return -1
}
