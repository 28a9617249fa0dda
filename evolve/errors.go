package evolve

import (
	"errors"
	"fmt"
)

// ErrOutOfRange is the sentinel wrapped by every RangeError: test for it with
// errors.Is(err, evolve.ErrOutOfRange).
var ErrOutOfRange = errors.New("outside the model's validity range")

// RangeError reports an input outside the model's validity range (or NaN).
type RangeError struct {
	Field  string  // input name, e.g. "mass"
	Value  float64 // the bad value
	Unit   string  // unit of Value, e.g. "Msun"
	Lo, Hi float64 // allowed closed interval
}

// Error formats the message: field, value with unit and the allowed range.
func (e *RangeError) Error() string {
	u := ""
	if e.Unit != "" {
		u = " " + e.Unit
	}
	return fmt.Sprintf("evolve: %s %g%s is outside the allowed range [%g, %g]%s", e.Field, e.Value, u, e.Lo, e.Hi, u)
}

// Unwrap lets errors.Is match ErrOutOfRange.
func (e *RangeError) Unwrap() error { return ErrOutOfRange }

func checkRange(field string, v float64, unit string, lo, hi float64) error {
	if !(v >= lo && v <= hi) { // also catches NaN
		return &RangeError{Field: field, Value: v, Unit: unit, Lo: lo, Hi: hi}
	}
	return nil
}
