package phot

import (
	"bufio"
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"
)

// dwarfRow is one spectral subtype of the Pecaut & Mamajek (2013) mean dwarf
// sequence (E. Mamajek's table, version 2024.05.15, data/dwarf_sequence.tsv).
// Missing values are NaN.
type dwarfRow struct {
	spt      string
	teffK    float64
	logLLsun float64
	rRsun    float64
	massMsun float64
	col      map[string]float64
}

var (
	dwarfOnce sync.Once
	dwarfRows []dwarfRow // in increasing Teff
	dwarfErr  error
)

// dwarfSequence returns the parsed dwarf table in increasing Teff.
func dwarfSequence() ([]dwarfRow, error) {
	dwarfOnce.Do(func() {
		raw, err := dataFS.ReadFile("data/dwarf_sequence.tsv")
		if err != nil {
			dwarfErr = err
			return
		}
		sc := bufio.NewScanner(bytes.NewReader(raw))
		var cols []string
		line := 0
		for sc.Scan() {
			line++
			t := sc.Text()
			if strings.HasPrefix(t, "#") || strings.TrimSpace(t) == "" {
				continue
			}
			f := strings.Split(t, "\t")
			if cols == nil {
				cols = f
				continue
			}
			r := dwarfRow{spt: f[0], col: map[string]float64{}}
			for i := 1; i < len(cols); i++ {
				v := math.NaN()
				if i < len(f) && strings.TrimSpace(f[i]) != "" {
					v, err = strconv.ParseFloat(strings.TrimSpace(f[i]), 64)
					if err != nil {
						dwarfErr = fmt.Errorf("phot: dwarf_sequence.tsv:%d: column %s: %v", line, cols[i], err)
						return
					}
				}
				r.col[cols[i]] = v
			}
			r.teffK = r.col["teff_k"]
			r.logLLsun = r.col["log_l_lsun"]
			r.rRsun = r.col["r_rsun"]
			r.massMsun = r.col["mass_msun"]
			dwarfRows = append(dwarfRows, r)
		}
		// reverse to increasing Teff
		for i, j := 0, len(dwarfRows)-1; i < j; i, j = i+1, j-1 {
			dwarfRows[i], dwarfRows[j] = dwarfRows[j], dwarfRows[i]
		}
		for i := 1; i < len(dwarfRows); i++ {
			if dwarfRows[i].teffK <= dwarfRows[i-1].teffK {
				dwarfErr = fmt.Errorf("phot: dwarf_sequence.tsv: teff_k not monotone at %s", dwarfRows[i].spt)
				return
			}
		}
	})
	return dwarfRows, dwarfErr
}
