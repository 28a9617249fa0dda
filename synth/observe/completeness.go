package observe

import (
	"fmt"
	"io"
	"math"
)

// CompletenessKind names a completeness model; the words are the values used
// in scenario files.
type CompletenessKind string

// Completeness model kinds.
const (
	// CompletenessNone means no losses beyond the S/N threshold: c(m) = 1. It is
	// what the zero value of Completeness selects.
	CompletenessNone CompletenessKind = "none"
	// CompletenessLogistic is the logistic (Fermi-function) roll-off
	//
	//	c(m) = c_max / (1 + exp((m − m50) / w))
	//
	// common practice for fits of artificial-star recovery fractions.
	CompletenessLogistic CompletenessKind = "logistic"
	// CompletenessFromTable takes c(m) from a user table (see ParseCompletenessTable).
	CompletenessFromTable CompletenessKind = "table"
)

// CompletenessKinds lists the accepted completeness words in a fixed order.
func CompletenessKinds() []CompletenessKind {
	return []CompletenessKind{CompletenessNone, CompletenessLogistic, CompletenessFromTable}
}

// ParseCompletenessKind returns the kind named by word ("" means "none"), or an
// error listing the accepted words.
func ParseCompletenessKind(word string) (CompletenessKind, error) {
	if word == "" {
		return CompletenessNone, nil
	}
	for _, k := range CompletenessKinds() {
		if string(k) == word {
			return k, nil
		}
	}
	return "", fmt.Errorf("observe: completeness kind %q unknown (allowed: none, logistic, table)", word)
}

// Allowed ranges of the logistic completeness parameters.
const (
	CompletenessWidthMinMag = 0.0 // exclusive
	CompletenessWidthMaxMag = 5.0 // inclusive
	Mag50MinMag             = -5.0
	Mag50MaxMag             = 40.0
)

// Completeness is the probability c(m) that a source of true magnitude m which
// passes the S/N threshold is also kept in the catalogue (blending, masks,
// crowding, pipeline losses). It multiplies the S/N selection; it does not
// replace it. The zero value is CompletenessNone (c = 1).
type Completeness struct {
	// Kind selects the model; "" means CompletenessNone.
	Kind CompletenessKind
	// MaxFraction is c_max, the completeness of bright sources, for the logistic
	// form; allowed (0, 1].
	MaxFraction float64
	// Mag50 is m50 (mag), where the logistic form falls to c_max/2; allowed
	// [−5, 40].
	Mag50 float64
	// WidthMag is w (mag), the logistic width (c falls from 0.73 c_max to
	// 0.27 c_max over m50 ± w); allowed (0, 5].
	WidthMag float64
	// Table is the table used by CompletenessFromTable only.
	Table *CompletenessTable
}

// LogisticCompleteness returns the logistic model with the given c_max, m50
// (mag) and width (mag); ranges are checked by BandSpec.Validate.
func LogisticCompleteness(maxFraction, mag50, widthMag float64) Completeness {
	return Completeness{Kind: CompletenessLogistic, MaxFraction: maxFraction, Mag50: mag50, WidthMag: widthMag}
}

// TableCompleteness returns the completeness model read from a table.
func TableCompleteness(t *CompletenessTable) Completeness {
	return Completeness{Kind: CompletenessFromTable, Table: t}
}

func (c *Completeness) validate(field string) error {
	switch c.Kind {
	case "", CompletenessNone:
	case CompletenessLogistic:
		if !(c.MaxFraction > 0 && c.MaxFraction <= 1) {
			return fmt.Errorf("observe: %s.max_fraction %v outside allowed range (0, 1]", field, c.MaxFraction)
		}
		if !(c.Mag50 >= Mag50MinMag && c.Mag50 <= Mag50MaxMag) {
			return fmt.Errorf("observe: %s.mag50 %v mag outside allowed range [-5, 40] mag", field, c.Mag50)
		}
		if !(c.WidthMag > CompletenessWidthMinMag && c.WidthMag <= CompletenessWidthMaxMag) {
			return fmt.Errorf("observe: %s.width %v mag outside allowed range (0, 5] mag", field, c.WidthMag)
		}
	case CompletenessFromTable:
		if c.Table == nil || len(c.Table.magAB) < 2 {
			return fmt.Errorf("observe: %s.table missing (completeness kind table needs a table loaded with LoadCompletenessTable or ParseCompletenessTable)", field)
		}
	default:
		return fmt.Errorf("observe: %s.kind %q unknown (allowed: none, logistic, table)", field, string(c.Kind))
	}
	return nil
}

// At returns c(m) in [0, 1] for true magnitude mag (the model must have passed
// BandSpec.Validate). NaN gives NaN.
//
//	none:     c = 1
//	logistic: c = c_max / (1 + exp((m − m50)/w))   (common practice)
//	table:    linear in m between rows; constant beyond the first and last rows
func (c *Completeness) At(mag float64) float64 {
	if math.IsNaN(mag) {
		return math.NaN()
	}
	switch c.Kind {
	case CompletenessLogistic:
		return c.MaxFraction / (1 + math.Exp((mag-c.Mag50)/c.WidthMag)) // logistic form, common practice
	case CompletenessFromTable:
		return c.Table.At(mag)
	}
	return 1
}

// CompletenessTable is a user table of completeness vs magnitude, read by
// ParseCompletenessTable or LoadCompletenessTable. It is immutable.
//
// File format (our own): as ErrorTable, with header "mag completeness"; the
// completeness is a fraction in [0, 1] that must not increase with magnitude.
// Between rows c is linear in magnitude; brighter than the first row it is
// the first row's value and fainter than the last row the last row's value
// (documented constant extension; end the table with 0 for a hard cut).
type CompletenessTable struct {
	name  string
	magAB []float64
	frac  []float64
}

// ParseCompletenessTable reads a completeness table from r; name is used in
// error messages (name:line). Errors wrap ErrBadTable.
func ParseCompletenessTable(r io.Reader, name string) (*CompletenessTable, error) {
	x, y, lines, err := readTwoColumns(r, name, [2]string{"mag", "completeness"}, [2]float64{tableMagMin, tableMagMax},
		func(v float64) (bool, string) { return v >= 0 && v <= 1, "[0, 1]" })
	if err != nil {
		return nil, err
	}
	for i := 1; i < len(y); i++ {
		if y[i] > y[i-1] {
			return nil, &tableError{name, lines[i], fmt.Sprintf("column completeness: %v greater than %v on line %d (completeness must not increase with magnitude)", y[i], y[i-1], lines[i-1])}
		}
	}
	return &CompletenessTable{name: name, magAB: x, frac: y}, nil
}

// LoadCompletenessTable reads the completeness table in the file at path.
func LoadCompletenessTable(path string) (*CompletenessTable, error) {
	return openAndRead(path, ParseCompletenessTable)
}

// Name returns the name the table was read under.
func (t *CompletenessTable) Name() string { return t.name }

// At returns the tabulated completeness at mag (see CompletenessTable for the
// interpolation and the constant extension outside the rows). NaN gives NaN.
func (t *CompletenessTable) At(mag float64) float64 {
	n := len(t.magAB)
	switch {
	case math.IsNaN(mag):
		return math.NaN()
	case mag <= t.magAB[0]:
		return t.frac[0]
	case mag >= t.magAB[n-1]:
		return t.frac[n-1]
	}
	return interpLinear(t.magAB, t.frac, mag)
}
