package galaxy

import (
	"errors"
	"fmt"
)

// ErrOutOfRange is matched (errors.Is) by every error this package returns for a
// parameter outside its allowed range; the concrete error is a *RangeError.
var ErrOutOfRange = errors.New("galaxy: value out of range")

// ErrUnknownComponent is matched by the error for a component name that the model
// does not have.
var ErrUnknownComponent = errors.New("galaxy: unknown component")

// ErrEnvelopeExceeded is returned by a ShellSampler when a density value above its
// rejection envelope is met: the sample would be biased, so no value is returned.
var ErrEnvelopeExceeded = errors.New("galaxy: density exceeds the rejection envelope")

// RangeError describes a parameter outside its allowed range: the field name, the bad
// value with its unit and the allowed range as text. It matches ErrOutOfRange.
type RangeError struct {
	Field   string
	Value   float64
	Unit    string
	Allowed string
}

// Error formats "galaxy: <field> = <value> <unit> is outside the allowed range <range> <unit>".
func (e *RangeError) Error() string {
	u := ""
	if e.Unit != "" && e.Unit != "-" {
		u = " " + e.Unit
	}
	return fmt.Sprintf("galaxy: %s = %g%s is outside the allowed range %s%s", e.Field, e.Value, u, e.Allowed, u)
}

// Is makes errors.Is(err, ErrOutOfRange) true.
func (e *RangeError) Is(target error) bool { return target == ErrOutOfRange }

func rangeErr(field string, v float64, unit, allowed string) error {
	return &RangeError{Field: field, Value: v, Unit: unit, Allowed: allowed}
}
