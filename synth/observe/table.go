package observe

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
)

// ErrBadTable is wrapped by every error about the content of an error or
// completeness table, so callers can test for it with errors.Is.
var ErrBadTable = errors.New("bad table")

// tableError is an error about one line of a table file.
type tableError struct {
	name string
	line int
	msg  string
}

func (e *tableError) Error() string {
	if e.line > 0 {
		return fmt.Sprintf("observe: %s:%d: %s", e.name, e.line, e.msg)
	}
	return fmt.Sprintf("observe: %s: %s", e.name, e.msg)
}

func (e *tableError) Unwrap() error { return ErrBadTable }

// readTwoColumns reads the table format shared by error and completeness
// tables: UTF-8 text, '#' starts a comment (whole line or trailing), blank lines
// are skipped, the first other line is the header with exactly the two words
// of header, every following line holds two numbers separated by white space.
// x must be strictly increasing. yOK checks each y value and returns a
// description of the allowed range if it is bad.
func readTwoColumns(r io.Reader, name string, header [2]string, xRange [2]float64, yOK func(y float64) (ok bool, allowed string)) (x, y []float64, lines []int, err error) {
	sc := bufio.NewScanner(r)
	lineNo := 0
	seenHeader := false
	for sc.Scan() {
		lineNo++
		text := sc.Text()
		if i := strings.IndexByte(text, '#'); i >= 0 {
			text = text[:i]
		}
		f := strings.Fields(text)
		if len(f) == 0 {
			continue
		}
		if !seenHeader {
			if len(f) != 2 || f[0] != header[0] || f[1] != header[1] {
				return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("header %q, want %q", strings.Join(f, " "), header[0]+" "+header[1])}
			}
			seenHeader = true
			continue
		}
		if len(f) != 2 {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("%d fields, want 2 (%s %s)", len(f), header[0], header[1])}
		}
		xv, e1 := strconv.ParseFloat(f[0], 64)
		if e1 != nil || math.IsNaN(xv) || math.IsInf(xv, 0) {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("column %s: %q is not a finite number", header[0], f[0])}
		}
		if xv < xRange[0] || xv > xRange[1] {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("column %s: %v mag outside allowed range [%v, %v] mag", header[0], xv, xRange[0], xRange[1])}
		}
		yv, e2 := strconv.ParseFloat(f[1], 64)
		if e2 != nil || math.IsNaN(yv) || math.IsInf(yv, 0) {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("column %s: %q is not a finite number", header[1], f[1])}
		}
		if ok, allowed := yOK(yv); !ok {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("column %s: %v outside allowed range %s", header[1], yv, allowed)}
		}
		if n := len(x); n > 0 && !(xv > x[n-1]) {
			return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("column %s: %v mag not greater than %v mag on line %d (rows must be in strictly increasing magnitude)", header[0], xv, x[n-1], lines[n-1])}
		}
		x = append(x, xv)
		y = append(y, yv)
		lines = append(lines, lineNo)
	}
	if err := sc.Err(); err != nil {
		return nil, nil, nil, fmt.Errorf("observe: reading %s: %w", name, err)
	}
	if !seenHeader {
		return nil, nil, nil, &tableError{name, 0, fmt.Sprintf("no header line (want %q)", header[0]+" "+header[1])}
	}
	if len(x) < 2 {
		return nil, nil, nil, &tableError{name, lineNo, fmt.Sprintf("%d data rows, want at least 2", len(x))}
	}
	return x, y, lines, nil
}

// openAndRead opens path and hands it to parse.
func openAndRead[T any](path string, parse func(io.Reader, string) (T, error)) (T, error) {
	f, err := os.Open(path)
	if err != nil {
		var zero T
		return zero, fmt.Errorf("observe: %w", err)
	}
	defer f.Close()
	return parse(f, path)
}

// interpLinear interpolates y(x) linearly on strictly increasing x, for
// x[0] <= v <= x[n-1]; callers handle the ends. No allocation.
func interpLinear(x, y []float64, v float64) float64 {
	// binary search for the interval [x[i], x[i+1]] holding v
	lo, hi := 0, len(x)-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if x[mid] <= v {
			lo = mid
		} else {
			hi = mid
		}
	}
	t := (v - x[lo]) / (x[hi] - x[lo])
	return y[lo] + t*(y[hi]-y[lo])
}
