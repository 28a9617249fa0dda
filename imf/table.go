package imf

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
)

// LoadTable reads a tabulated mass function from the file at path (format as
// for ParseTable) and returns it truncated to [loMsun, hiMsun]. File-system
// errors are returned wrapped with the path.
func LoadTable(path string, loMsun, hiMsun float64) (*PowerLaw, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("imf: mass-function table: %w", err)
	}
	defer fh.Close()
	return ParseTable(fh, path, loMsun, hiMsun)
}

// ParseTable reads a tabulated mass function and interpolates it linearly in
// log m – log(dN/dm), which makes it a continuous piecewise power law with a
// break at every node:
//
//	dN/dm = p_i (m/m_i)^-alpha_i,  alpha_i = -ln(p_(i+1)/p_i) / ln(m_(i+1)/m_i)
//
// on m_i <= m < m_(i+1). So the CDF, quantile, mean and fractions are exact
// for the interpolated function (see PowerLaw).
//
// Format: plain text, one node per line with two numbers, the mass (Msun)
// and dN/dm (any units: the function is normalised on [lo, hi]), separated
// by white space or one comma. Blank lines and lines starting with '#' are
// skipped; one header line whose first field is not a number (for example
// "mass_msun,dn_dm") is allowed before the first node. Rules, each checked
// with an error naming name:line and wrapping ErrBadTable: exactly two
// fields; both finite numbers (no NaN or Inf); mass > 0; dN/dm > 0 (log–log
// interpolation cannot pass through 0: end the table instead); masses
// strictly increasing; at least two nodes.
//
// Limits of 0 select the first and last tabulated mass; explicit limits must
// lie inside the table (no extrapolation) and satisfy lo < hi, otherwise an
// error wrapping ErrInvalidSpec is returned.
func ParseTable(r io.Reader, name string, loMsun, hiMsun float64) (*PowerLaw, error) {
	var masses, dens []float64
	var lines []int
	sc := bufio.NewScanner(r)
	lineNo := 0
	sawData := false
	for sc.Scan() {
		lineNo++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		fields := strings.FieldsFunc(text, func(c rune) bool { return c == ',' || c == ' ' || c == '\t' })
		if !sawData && len(fields) > 0 {
			if _, err := strconv.ParseFloat(fields[0], 64); err != nil {
				sawData = true // header line
				continue
			}
		}
		sawData = true
		if len(fields) != 2 {
			return nil, tableErrorf(name, lineNo, "want 2 fields (mass_msun, dn_dm), got %d in %q", len(fields), text)
		}
		m, err := strconv.ParseFloat(fields[0], 64)
		if err != nil {
			return nil, tableErrorf(name, lineNo, "mass %q is not a number", fields[0])
		}
		p, err := strconv.ParseFloat(fields[1], 64)
		if err != nil {
			return nil, tableErrorf(name, lineNo, "dN/dm %q is not a number", fields[1])
		}
		if math.IsNaN(m) || math.IsInf(m, 0) || m <= 0 {
			return nil, tableErrorf(name, lineNo, "mass %g Msun must be a positive finite number", m)
		}
		if math.IsNaN(p) || math.IsInf(p, 0) || p <= 0 {
			return nil, tableErrorf(name, lineNo, "dN/dm %g at %g Msun must be a positive finite number (log–log interpolation needs dN/dm > 0)", p, m)
		}
		if k := len(masses); k > 0 && m <= masses[k-1] {
			return nil, tableErrorf(name, lineNo, "mass %g Msun is not above %g Msun on line %d: masses must be strictly increasing", m, masses[k-1], lines[k-1])
		}
		masses = append(masses, m)
		dens = append(dens, p)
		lines = append(lines, lineNo)
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("imf: reading mass-function table %s: %w", name, err)
	}
	if len(masses) < 2 {
		return nil, &inputError{msg: fmt.Sprintf("imf: %s: mass-function table has %d nodes, need at least 2", name, len(masses)), sentinel: ErrBadTable}
	}
	first, last := masses[0], masses[len(masses)-1]
	if loMsun == 0 {
		loMsun = first
	}
	if hiMsun == 0 {
		hiMsun = last
	}
	lo, hi, err := resolveLimits(KindTable, loMsun, hiMsun, first, last, first, last)
	if err != nil {
		return nil, err
	}
	// Log–log slopes between nodes; the slope in force on [m_i, m_(i+1)).
	edges := []float64{lo}
	var alphas []float64
	i := 0
	for i < len(masses)-2 && masses[i+1] <= lo {
		i++
	}
	for {
		alphas = append(alphas, -math.Log(dens[i+1]/dens[i])/math.Log(masses[i+1]/masses[i]))
		if i+1 >= len(masses)-1 || masses[i+1] >= hi {
			break
		}
		edges = append(edges, masses[i+1])
		i++
	}
	edges = append(edges, hi)
	return newPowerLaw(KindTable, edges, alphas), nil
}

func tableErrorf(name string, line int, format string, a ...any) error {
	return &inputError{msg: fmt.Sprintf("imf: %s:%d: ", name, line) + fmt.Sprintf(format, a...), sentinel: ErrBadTable}
}
