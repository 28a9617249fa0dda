package evolve_test

import (
	"bufio"
	"os"
	"strconv"
	"strings"
	"testing"
)

// readTSV reads a project reference table (testdata/*.tsv): lines starting
// with '#' are its source header, the first other line the column names.
func readTSV(t *testing.T, path string) (cols map[string]int, rows [][]string) {
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
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		fields := strings.Split(line, "\t")
		if cols == nil {
			cols = map[string]int{}
			for i, c := range fields {
				cols[c] = i
			}
			continue
		}
		rows = append(rows, fields)
	}
	if err := sc.Err(); err != nil {
		t.Fatalf("read %s: %v", path, err)
	}
	return cols, rows
}

// quantities returns the quantity → value column of a "quantity value …" table.
func quantities(t *testing.T, path string) map[string]string {
	cols, rows := readTSV(t, path)
	out := map[string]string{}
	for _, r := range rows {
		out[r[cols["quantity"]]] = r[cols["value"]]
	}
	return out
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return v
}
