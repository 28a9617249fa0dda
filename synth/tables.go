package synth

import (
	"bufio"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
)

// loadPiecewiseLinear reads a two-column text table (x, weight), whitespace or comma
// separated, '#' starting a comment, an optional header line of names. x must increase
// strictly and lie in [xmin, xmax]; weights must be finite and non-negative. Errors name
// the file and line.
func loadPiecewiseLinear(path, xname, wname string, xmin, xmax float64) (*piecewiseLinear, error) {
	x, w, err := readTwoColumns(path, xname, wname)
	if err != nil {
		return nil, err
	}
	for i := range x {
		if x[i] < xmin || x[i] > xmax {
			return nil, fmt.Errorf("%s: %s %g is out of range; allowed: %g to %g", path, xname, x[i], xmin, xmax)
		}
		if w[i] < 0 {
			return nil, fmt.Errorf("%s: %s %g is negative; weights must be >= 0", path, wname, w[i])
		}
	}
	pl, err := newPiecewiseLinear(x, w)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", path, err)
	}
	return pl, nil
}

func readTwoColumns(path, xname, wname string) (x, w []float64, err error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	line := 0
	for sc.Scan() {
		line++
		t := strings.TrimSpace(sc.Text())
		if i := strings.IndexByte(t, '#'); i >= 0 {
			t = strings.TrimSpace(t[:i])
		}
		if t == "" {
			continue
		}
		fields := strings.FieldsFunc(t, func(r rune) bool { return r == ',' || r == ' ' || r == '\t' })
		if len(fields) != 2 {
			return nil, nil, fmt.Errorf("%s:%d: want 2 columns (%s, %s), found %d", path, line, xname, wname, len(fields))
		}
		a, e1 := strconv.ParseFloat(fields[0], 64)
		b, e2 := strconv.ParseFloat(fields[1], 64)
		if e1 != nil || e2 != nil {
			if len(x) == 0 && e1 != nil { // a header line of names
				continue
			}
			return nil, nil, fmt.Errorf("%s:%d: cannot read numbers from %q", path, line, t)
		}
		if math.IsNaN(a) || math.IsNaN(b) || math.IsInf(a, 0) || math.IsInf(b, 0) {
			return nil, nil, fmt.Errorf("%s:%d: %s and %s must be finite numbers, got %q", path, line, xname, wname, t)
		}
		if len(x) > 0 && !(a > x[len(x)-1]) {
			return nil, nil, fmt.Errorf("%s:%d: %s %g does not increase (previous %g)", path, line, xname, a, x[len(x)-1])
		}
		x = append(x, a)
		w = append(w, b)
	}
	if err := sc.Err(); err != nil {
		return nil, nil, fmt.Errorf("%s: %v", path, err)
	}
	if len(x) < 2 {
		return nil, nil, fmt.Errorf("%s: need at least two rows of %s, %s", path, xname, wname)
	}
	return x, w, nil
}
