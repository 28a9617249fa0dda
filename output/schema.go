package output

import (
	"errors"
	"fmt"
	"strings"
)

// Kind is the storage type of a catalogue column. Each kind maps to one Go slice type in
// a Batch and to one native type in every file format (see the table in doc.go).
type Kind uint8

// Column kinds. The zero value is invalid so that a forgotten Kind is caught by Validate.
const (
	Float32 Kind = iota + 1 // []float32; IEEE single, ~7 significant digits (magnitudes to 1e-4 mag)
	Float64                 // []float64; IEEE double
	Int64                   // []int64
	Int32                   // []int32
	Int8                    // []int8
	Bool                    // []bool
	String                  // []string (UTF-8)
)

var kindNames = [...]string{Float32: "float32", Float64: "float64", Int64: "int64",
	Int32: "int32", Int8: "int8", Bool: "bool", String: "string"}

// String returns the kind's lower-case name ("float32", …, "string"), which is also the
// ECSV datatype name; invalid kinds print as "kind(N)".
func (k Kind) String() string {
	if k >= Float32 && k <= String {
		return kindNames[k]
	}
	return fmt.Sprintf("kind(%d)", uint8(k))
}

// ParseKind is the inverse of Kind.String. It returns an error naming the bad word and
// the allowed ones.
func ParseKind(word string) (Kind, error) {
	for k := Float32; k <= String; k++ {
		if kindNames[k] == word {
			return k, nil
		}
	}
	return 0, fmt.Errorf("output: unknown column kind %q (allowed: %s)", word, strings.Join(kindNames[1:], ", "))
}

// Encoding is a per-column hint for columnar formats (Parquet). It does not change the
// values stored, only how they are laid out on disk.
type Encoding uint8

const (
	// EncodingAuto selects dictionary encoding for String columns and plain encoding for
	// every other kind. Dictionary encoding of random-valued floats costs ~4x the write
	// time for no size gain (measured in issue 5 and in BenchmarkParquetDictionary).
	EncodingAuto Encoding = iota
	// EncodingPlain forces plain encoding.
	EncodingPlain
	// EncodingDictionary forces dictionary encoding, for low-cardinality numeric columns
	// (component index, flags stored as integers).
	EncodingDictionary
)

// Column describes one catalogue column.
//
// Name is the column name (snake_case with a unit suffix, e.g. "mass_msun"). Unit is a
// unit string in the IAU/FITS convention that astropy's unit parser understands ("mag",
// "K", "pc", "deg", "yr", "solMass", "solLum", "solRad", "dex", "mJy", "" for
// dimensionless); it is written to Arrow field metadata "unit", FITS TUNITn and the ECSV
// datatype "unit". Description is free text (Arrow "description", FITS TCOMMn, ECSV
// "description"). Nullable allows missing values (e.g. magnitudes of a black hole).
// MaxLen is the fixed width in bytes of a String column in FITS (FITS tables have fixed
// widths); longer strings make FITS Write fail with an error naming the column; 0 means
// 16. Encoding is a Parquet layout hint.
type Column struct {
	Name, Unit, Description string
	Kind                    Kind
	Nullable                bool
	MaxLen                  int
	Encoding                Encoding
}

// DefaultStringMaxLen is the FITS width used for String columns whose MaxLen is 0.
const DefaultStringMaxLen = 16

// ErrSchema reports an invalid column list or a batch that does not match its schema.
// Errors returned by Validate and by Writer.Write for malformed batches wrap it.
var ErrSchema = errors.New("output: schema mismatch")

// ValidateColumns checks a column list: at least one column, non-empty unique names made
// of printable ASCII without spaces, commas or quotes and not starting with '#' (so every
// format can carry them), valid
// kinds, MaxLen within 0..10000. The error wraps ErrSchema and names the column.
func ValidateColumns(cols []Column) error {
	if len(cols) == 0 {
		return fmt.Errorf("%w: no columns", ErrSchema)
	}
	seen := make(map[string]bool, len(cols))
	for i, c := range cols {
		if c.Name == "" {
			return fmt.Errorf("%w: column %d has an empty name", ErrSchema, i)
		}
		for _, r := range c.Name {
			if r <= ' ' || r > '~' || r == ',' || r == '"' || r == '\'' {
				return fmt.Errorf("%w: column %d name %q has character %q (allowed: printable ASCII without space, comma or quotes)", ErrSchema, i, c.Name, r)
			}
		}
		if c.Name[0] == '#' {
			return fmt.Errorf("%w: column %d name %q starts with '#' (CSV readers take the line for a comment)", ErrSchema, i, c.Name)
		}
		if seen[c.Name] {
			return fmt.Errorf("%w: duplicate column name %q", ErrSchema, c.Name)
		}
		seen[c.Name] = true
		if c.Kind < Float32 || c.Kind > String {
			return fmt.Errorf("%w: column %q has invalid kind %d", ErrSchema, c.Name, c.Kind)
		}
		if c.MaxLen < 0 || c.MaxLen > 10000 {
			return fmt.Errorf("%w: column %q max length %d bytes outside 0..10000", ErrSchema, c.Name, c.MaxLen)
		}
		if c.Encoding > EncodingDictionary {
			return fmt.Errorf("%w: column %q has invalid encoding %d", ErrSchema, c.Name, c.Encoding)
		}
	}
	return nil
}

func (c Column) strLen() int {
	if c.MaxLen > 0 {
		return c.MaxLen
	}
	return DefaultStringMaxLen
}

// Batch is a column-major block of rows. Cols[i] holds the values of column i as the
// slice type of its Kind ([]float32, []float64, []int64, []int32, []int8, []bool,
// []string) with len >= N; only the first N entries are rows. Valid is nil (no nulls
// anywhere) or has one entry per column, each nil (column fully valid) or a []bool with
// len >= N where false marks a null. Values under a null are ignored by writers.
//
// A Batch is meant to be allocated once with NewBatch and refilled for every chunk after
// Reset; writers never retain it after Write returns.
type Batch struct {
	N     int
	Cols  []any
	Valid [][]bool
}

// NewBatch allocates a Batch for the schema with room for capacity rows: every column
// slice has len capacity, and every Nullable column gets a validity slice of len capacity
// set to true. N starts at 0. It panics if capacity < 0 or a Kind is invalid (programming
// errors; call ValidateColumns on untrusted schemas first).
func NewBatch(cols []Column, capacity int) *Batch {
	if capacity < 0 {
		panic("output: NewBatch: negative capacity")
	}
	b := &Batch{Cols: make([]any, len(cols)), Valid: make([][]bool, len(cols))}
	for i, c := range cols {
		switch c.Kind {
		case Float32:
			b.Cols[i] = make([]float32, capacity)
		case Float64:
			b.Cols[i] = make([]float64, capacity)
		case Int64:
			b.Cols[i] = make([]int64, capacity)
		case Int32:
			b.Cols[i] = make([]int32, capacity)
		case Int8:
			b.Cols[i] = make([]int8, capacity)
		case Bool:
			b.Cols[i] = make([]bool, capacity)
		case String:
			b.Cols[i] = make([]string, capacity)
		default:
			panic(fmt.Sprintf("output: NewBatch: column %q has invalid kind %d", c.Name, c.Kind))
		}
		if c.Nullable {
			v := make([]bool, capacity)
			for j := range v {
				v[j] = true
			}
			b.Valid[i] = v
		}
	}
	return b
}

// Cap returns the number of rows the batch can hold (the shortest column slice).
func (b *Batch) Cap() int {
	m := -1
	for _, c := range b.Cols {
		if n := colLen(c); m < 0 || n < m {
			m = n
		}
	}
	if m < 0 {
		return 0
	}
	return m
}

// Reset prepares the batch for n new rows: N = n and every validity entry of the first n
// rows is set back to true. Values are left as they are (the producer overwrites them).
// It allocates nothing. It panics if n is negative or exceeds Cap (a programming error).
func (b *Batch) Reset(n int) {
	if n < 0 || n > b.Cap() {
		panic(fmt.Sprintf("output: Batch.Reset: %d rows outside 0..%d", n, b.Cap()))
	}
	b.N = n
	for _, v := range b.Valid {
		if v != nil {
			for j := range v[:n] {
				v[j] = true
			}
		}
	}
}

// SetNull marks row r of column c as null. It panics if column c has no validity slice
// (it was not declared Nullable when the batch was made) or r is out of range.
func (b *Batch) SetNull(c, r int) {
	if b.Valid == nil || b.Valid[c] == nil {
		panic(fmt.Sprintf("output: Batch.SetNull: column %d has no validity slice", c))
	}
	b.Valid[c][r] = false
}

// Float32 returns the first N values of column c. It panics if column c is not Float32.
func (b *Batch) Float32(c int) []float32 { return b.Cols[c].([]float32)[:b.N] }

// Float64 returns the first N values of column c. It panics if column c is not Float64.
func (b *Batch) Float64(c int) []float64 { return b.Cols[c].([]float64)[:b.N] }

// Int64 returns the first N values of column c. It panics if column c is not Int64.
func (b *Batch) Int64(c int) []int64 { return b.Cols[c].([]int64)[:b.N] }

// Int32 returns the first N values of column c. It panics if column c is not Int32.
func (b *Batch) Int32(c int) []int32 { return b.Cols[c].([]int32)[:b.N] }

// Int8 returns the first N values of column c. It panics if column c is not Int8.
func (b *Batch) Int8(c int) []int8 { return b.Cols[c].([]int8)[:b.N] }

// Bool returns the first N values of column c. It panics if column c is not Bool.
func (b *Batch) Bool(c int) []bool { return b.Cols[c].([]bool)[:b.N] }

// String returns the first N values of column c. It panics if column c is not String.
func (b *Batch) String(c int) []string { return b.Cols[c].([]string)[:b.N] }

// IsValid reports whether row r of column c holds a value (true) or is null.
func (b *Batch) IsValid(c, r int) bool {
	return b.Valid == nil || b.Valid[c] == nil || b.Valid[c][r]
}

func colLen(c any) int {
	switch v := c.(type) {
	case []float32:
		return len(v)
	case []float64:
		return len(v)
	case []int64:
		return len(v)
	case []int32:
		return len(v)
	case []int8:
		return len(v)
	case []bool:
		return len(v)
	case []string:
		return len(v)
	}
	return -1
}

func kindOf(c any) Kind {
	switch c.(type) {
	case []float32:
		return Float32
	case []float64:
		return Float64
	case []int64:
		return Int64
	case []int32:
		return Int32
	case []int8:
		return Int8
	case []bool:
		return Bool
	case []string:
		return String
	}
	return 0
}

// CheckBatch verifies that b matches cols: one slice per column of the right type with
// len >= N, validity only on Nullable columns (a validity slice on a non-nullable column
// is accepted only if it marks no row of the first N null). It allocates nothing on
// success. The error wraps ErrSchema and names the column.
func CheckBatch(cols []Column, b *Batch) error {
	if b == nil {
		return fmt.Errorf("%w: nil batch", ErrSchema)
	}
	if b.N < 0 {
		return fmt.Errorf("%w: batch has negative row count %d", ErrSchema, b.N)
	}
	if len(b.Cols) != len(cols) {
		return fmt.Errorf("%w: batch has %d columns, schema has %d", ErrSchema, len(b.Cols), len(cols))
	}
	if b.Valid != nil && len(b.Valid) != len(cols) {
		return fmt.Errorf("%w: batch has %d validity slices, schema has %d columns", ErrSchema, len(b.Valid), len(cols))
	}
	for i, c := range cols {
		if k := kindOf(b.Cols[i]); k != c.Kind {
			return fmt.Errorf("%w: column %q is %s in the schema but the batch holds %T", ErrSchema, c.Name, c.Kind, b.Cols[i])
		}
		if n := colLen(b.Cols[i]); n < b.N {
			return fmt.Errorf("%w: column %q has %d values, batch has %d rows", ErrSchema, c.Name, n, b.N)
		}
		if b.Valid == nil || b.Valid[i] == nil {
			continue
		}
		v := b.Valid[i]
		if len(v) < b.N {
			return fmt.Errorf("%w: column %q has %d validity entries, batch has %d rows", ErrSchema, c.Name, len(v), b.N)
		}
		if !c.Nullable {
			for r, ok := range v[:b.N] {
				if !ok {
					return fmt.Errorf("%w: column %q is not nullable but row %d is null", ErrSchema, c.Name, r)
				}
			}
		}
	}
	return nil
}
