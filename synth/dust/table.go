package dust

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"
)

// AVTable holds user sight lines: A_V against distance for one or more
// directions, read from a text file of our own format:
//
//	# any number of comment lines starting with '#'
//	l_deg  b_deg  distance_pc  av_mag
//	30.0   -2.0   100          0.08
//	30.0   -2.0   250          0.31
//	30.0   -2.0   1000         1.20
//	45.0    5.0   200          0.05
//
// Fields are separated by tabs or spaces; blank lines are ignored. The first
// non-comment line must be exactly the four column names above (degrees,
// Galactic longitude and latitude; distance in pc; cumulative A_V in mag).
// Consecutive rows with the same (l, b) form one direction; a direction may
// not reappear later in the file. Within a direction distances are ≥ 0 and
// strictly increasing, A_V is ≥ 0 and non-decreasing, and A_V is 0 at distance
// 0 if that row is given. l must lie in [0, 360) and b in [−90, 90]. Every
// violation is an error naming file:line, the column and the bad value
// (wrapping ErrAVTable).
type AVTable struct {
	lines []*TableSightLine
}

// TableSightLine is one direction of an AVTable; it implements SightLine.
//
// AV interpolates linearly in distance between the tabulated points, and from
// (0 pc, 0 mag) to the first point. Beyond the last tabulated distance it
// returns the last A_V: the table is taken to hold all the dust along the
// line (documented extrapolation; use MaxDistancePc or Covers to detect it).
type TableSightLine struct {
	LDeg, BDeg float64 // direction: Galactic longitude and latitude, degrees
	distPc     []float64
	avMag      []float64
}

// ErrAVTable marks a malformed sight-line table.
var ErrAVTable = errors.New("invalid sight-line table")

// avTableColumns is the required header.
var avTableColumns = []string{"l_deg", "b_deg", "distance_pc", "av_mag"}

// LoadAVTable reads a sight-line table from path (format in AVTable).
func LoadAVTable(path string) (*AVTable, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("dust: sight-line table: %w", err)
	}
	defer f.Close()
	return ReadAVTable(f, path)
}

// ReadAVTable reads a sight-line table from r; name is used in error messages
// (usually the file path).
func ReadAVTable(r io.Reader, name string) (*AVTable, error) {
	sc := bufio.NewScanner(r)
	t := &AVTable{}
	seen := map[[2]float64]bool{}
	var cur *TableSightLine
	lineNo := 0
	header := false
	fail := func(format string, a ...any) error {
		return fmt.Errorf("dust: %s:%d: %w: %s", name, lineNo, ErrAVTable, fmt.Sprintf(format, a...))
	}
	for sc.Scan() {
		lineNo++
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		fields := strings.Fields(line)
		if !header {
			if strings.Join(fields, " ") != strings.Join(avTableColumns, " ") {
				return nil, fail("header %q, want the columns %q", line, strings.Join(avTableColumns, " "))
			}
			header = true
			continue
		}
		if len(fields) != 4 {
			return nil, fail("%d fields, want 4 (%s)", len(fields), strings.Join(avTableColumns, " "))
		}
		var v [4]float64
		for i, s := range fields {
			x, err := strconv.ParseFloat(s, 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, fail("%s %q is not a finite number", avTableColumns[i], s)
			}
			v[i] = x
		}
		l, b, d, av := v[0], v[1], v[2], v[3]
		switch {
		case l < 0 || l >= 360:
			return nil, fail("l_deg %g deg outside [0, 360)", l)
		case b < -90 || b > 90:
			return nil, fail("b_deg %g deg outside [-90, 90]", b)
		case d < 0:
			return nil, fail("distance_pc %g pc is negative", d)
		case av < 0:
			return nil, fail("av_mag %g mag is negative", av)
		}
		key := [2]float64{l, b}
		if cur == nil || cur.LDeg != l || cur.BDeg != b {
			if seen[key] {
				return nil, fail("direction l_deg %g b_deg %g appears again after other directions (keep its rows together)", l, b)
			}
			seen[key] = true
			cur = &TableSightLine{LDeg: l, BDeg: b}
			t.lines = append(t.lines, cur)
		} else {
			n := len(cur.distPc)
			if !(d > cur.distPc[n-1]) {
				return nil, fail("distance_pc %g pc not above %g pc of the previous row (must increase strictly within a direction)", d, cur.distPc[n-1])
			}
			if av < cur.avMag[n-1] {
				return nil, fail("av_mag %g mag below %g mag of the previous row (cumulative A_V cannot decrease with distance)", av, cur.avMag[n-1])
			}
		}
		if d == 0 && av != 0 {
			return nil, fail("av_mag %g mag at distance_pc 0, must be 0", av)
		}
		cur.distPc = append(cur.distPc, d)
		cur.avMag = append(cur.avMag, av)
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("dust: %s: %w", name, err)
	}
	if !header {
		return nil, fmt.Errorf("dust: %s: %w: no header line (%s)", name, ErrAVTable, strings.Join(avTableColumns, " "))
	}
	if len(t.lines) == 0 {
		return nil, fmt.Errorf("dust: %s: %w: no data rows", name, ErrAVTable)
	}
	return t, nil
}

// Len returns the number of directions.
func (t *AVTable) Len() int { return len(t.lines) }

// Lines returns the directions in file order (shared, do not modify).
func (t *AVTable) Lines() []*TableSightLine { return t.lines }

// Nearest returns the direction closest on the sky to (lDeg, bDeg) and its
// angular separation in degrees (great-circle distance by the haversine
// formula). The caller decides what separation is acceptable.
func (t *AVTable) Nearest(lDeg, bDeg float64) (*TableSightLine, float64) {
	best, bestSep := t.lines[0], math.Inf(1)
	for _, s := range t.lines {
		if sep := angSepDeg(lDeg, bDeg, s.LDeg, s.BDeg); sep < bestSep {
			best, bestSep = s, sep
		}
	}
	return best, bestSep
}

// angSepDeg is the great-circle separation in degrees (haversine formula,
// well conditioned for small angles; common practice).
func angSepDeg(l1, b1, l2, b2 float64) float64 {
	const d2r = math.Pi / 180
	sdb := math.Sin((b2 - b1) * d2r / 2)
	sdl := math.Sin((l2 - l1) * d2r / 2)
	h := sdb*sdb + math.Cos(b1*d2r)*math.Cos(b2*d2r)*sdl*sdl
	return 2 * math.Asin(math.Min(1, math.Sqrt(h))) / d2r
}

// MaxDistancePc returns the largest tabulated distance (pc).
func (s *TableSightLine) MaxDistancePc() float64 { return s.distPc[len(s.distPc)-1] }

// Covers reports whether distancePc is within the tabulated range (≤ MaxDistancePc).
func (s *TableSightLine) Covers(distancePc float64) bool { return distancePc <= s.MaxDistancePc() }

// Points returns copies of the tabulated distances (pc) and A_V values (mag).
func (s *TableSightLine) Points() (distPc, avMag []float64) {
	return append([]float64(nil), s.distPc...), append([]float64(nil), s.avMag...)
}

// AV returns A_V (mag) at distancePc by linear interpolation (see the type
// doc for the ends). Panics for a negative, NaN or infinite distance. No
// allocation.
func (s *TableSightLine) AV(distancePc float64) float64 {
	checkDistance(distancePc)
	n := len(s.distPc)
	if distancePc >= s.distPc[n-1] {
		return s.avMag[n-1]
	}
	i := sort.SearchFloat64s(s.distPc, distancePc) // first index with dist >= d
	if s.distPc[i] == distancePc {
		return s.avMag[i]
	}
	var d0, a0 float64 // (0, 0) before the first point
	if i > 0 {
		d0, a0 = s.distPc[i-1], s.avMag[i-1]
	}
	f := (distancePc - d0) / (s.distPc[i] - d0)
	return a0 + f*(s.avMag[i]-a0)
}
