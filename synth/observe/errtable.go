package observe

import (
	"fmt"
	"io"
	"math"
)

// Allowed ranges of error-table values.
const (
	tableMagMin    = -5.0 // mag
	tableMagMax    = 40.0 // mag
	tableMagErrMax = 5.0  // mag
)

// ErrorTable is a user table of random photometric error vs magnitude for one
// band, read by ParseErrorTable or LoadErrorTable. It is immutable.
//
// File format (our own): text; '#' starts a comment; blank lines are skipped;
// the first other line is the header "mag mag_err"; then one row per line with
// two numbers: magnitude (mag, in [−5, 40], strictly increasing) and the random
// error at that magnitude (mag, in (0, 5], non-decreasing with magnitude). At
// least two rows. Example:
//
//	# invented survey, single visit
//	mag  mag_err
//	18   0.005
//	22   0.03
//	24   0.2
//
// The error σ is read as noise-to-signal, σ_f = σ f (the convention of Ivezić
// et al. 2019 eq. 5), and interpolated linearly in magnitude between rows.
// Outside the table it is extrapolated, as documented on FluxErr.
type ErrorTable struct {
	name   string
	magAB  []float64 // magnitudes of the rows, strictly increasing
	errMag []float64 // error at each row, non-decreasing
	fluxLo float64   // σ_f at the faintest row (FluxZeroPointMag scale)
}

// ParseErrorTable reads an error table from r; name (usually the file path) is
// used in error messages, which give name:line. Errors wrap ErrBadTable.
func ParseErrorTable(r io.Reader, name string) (*ErrorTable, error) {
	x, y, lines, err := readTwoColumns(r, name, [2]string{"mag", "mag_err"}, [2]float64{tableMagMin, tableMagMax},
		func(v float64) (bool, string) { return v > 0 && v <= tableMagErrMax, "(0, 5] mag" })
	if err != nil {
		return nil, err
	}
	for i := 1; i < len(y); i++ {
		if y[i] < y[i-1] {
			return nil, &tableError{name, lines[i], fmt.Sprintf("column mag_err: %v mag smaller than %v mag on line %d (the error must not decrease with magnitude)", y[i], y[i-1], lines[i-1])}
		}
	}
	n := len(x)
	return &ErrorTable{name: name, magAB: x, errMag: y, fluxLo: y[n-1] * FluxFromMag(x[n-1])}, nil
}

// LoadErrorTable reads the error table in the file at path (see ErrorTable for
// the format).
func LoadErrorTable(path string) (*ErrorTable, error) {
	return openAndRead(path, ParseErrorTable)
}

// Name returns the name the table was read under (usually its path).
func (t *ErrorTable) Name() string { return t.name }

// Range returns the magnitudes of the first and last rows (mag).
func (t *ErrorTable) Range() (brightMag, faintMag float64) {
	return t.magAB[0], t.magAB[len(t.magAB)-1]
}

// MagErr returns the tabulated random error σ (mag) at magnitude mag, linear
// in magnitude between rows. Outside the table it follows the extrapolation of
// FluxErr: brighter than the first row σ is the first row's value; fainter
// than the last row σ = σ_last · 10^(0.4 (m − m_last)) (constant flux error).
// NaN gives NaN.
func (t *ErrorTable) MagErr(mag float64) float64 {
	n := len(t.magAB)
	switch {
	case math.IsNaN(mag):
		return math.NaN()
	case mag <= t.magAB[0]:
		return t.errMag[0]
	case mag >= t.magAB[n-1]:
		return t.errMag[n-1] * math.Exp(0.4*math.Ln10*(mag-t.magAB[n-1]))
	}
	return interpLinear(t.magAB, t.errMag, mag)
}

// FluxErr returns the random flux error σ_f (FluxZeroPointMag scale) of a
// source of magnitude mag and flux flux = FluxFromMag(mag):
//
//	σ_f = σ(m) f                       inside the table (linear in m between rows)
//	σ_f = σ_first f                    brighter than the first row
//	σ_f = σ_last f_last  (constant)    fainter than the last row, also for f = 0
//
// The faint-side rule is the background-limited behaviour of a sky-dominated
// error; the bright-side rule keeps the fractional error of the brightest row.
// Both are documented extrapolations, not clamps of the input.
func (t *ErrorTable) FluxErr(mag, flux float64) float64 { return t.fluxErr(mag, flux) }

func (t *ErrorTable) fluxErr(mag, flux float64) float64 {
	n := len(t.magAB)
	switch {
	case math.IsNaN(mag):
		return math.NaN()
	case mag >= t.magAB[n-1]:
		return t.fluxLo
	case mag <= t.magAB[0]:
		return t.errMag[0] * flux
	}
	return interpLinear(t.magAB, t.errMag, mag) * flux
}
