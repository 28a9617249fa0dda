package observe

import (
	"fmt"
	"strings"
)

// RuleKind names how a DetectionRule combines the per-band detections.
type RuleKind string

// Detection rule kinds.
const (
	RuleAllOf   RuleKind = "all_of"   // every listed band detected
	RuleAnyOf   RuleKind = "any_of"   // at least one listed band detected
	RuleAtLeast RuleKind = "at_least" // at least K of the listed bands detected
)

// DetectionRule decides whether a star enters the observed catalogue from its
// per-band detection flags. Build it with NewDetectionRule, which binds the
// band names to positions in the survey's band list; the rule is immutable.
type DetectionRule struct {
	kind  RuleKind
	names []string
	idx   []int
	k     int
}

// NewDetectionRule builds a rule of kind ("all_of", "any_of" or "at_least") over
// the listed bands, which must be distinct members of surveyBands (the survey's
// band list, in the order of the flags later passed to Passes). k is used by
// "at_least" only and must be in [1, len(bands)]. An empty bands list means all
// survey bands.
func NewDetectionRule(kind RuleKind, bands []string, k int, surveyBands []string) (*DetectionRule, error) {
	if len(surveyBands) == 0 {
		return nil, fmt.Errorf("observe: detection rule: survey has no bands")
	}
	if len(bands) == 0 {
		bands = surveyBands
	}
	d := &DetectionRule{kind: kind, names: append([]string(nil), bands...), k: k}
	seen := map[string]bool{}
	for _, name := range bands {
		if seen[name] {
			return nil, fmt.Errorf("observe: detection rule: band %q listed twice", name)
		}
		seen[name] = true
		at := -1
		for i, s := range surveyBands {
			if s == name {
				at = i
				break
			}
		}
		if at < 0 {
			return nil, fmt.Errorf("observe: detection rule: band %q not in the survey (allowed: %s)", name, strings.Join(surveyBands, ", "))
		}
		d.idx = append(d.idx, at)
	}
	switch kind {
	case RuleAllOf:
		d.k = len(bands)
	case RuleAnyOf:
		d.k = 1
	case RuleAtLeast:
		if k < 1 || k > len(bands) {
			return nil, fmt.Errorf("observe: detection rule: at_least count %d outside allowed range [1, %d] (the number of listed bands)", k, len(bands))
		}
	default:
		return nil, fmt.Errorf("observe: detection rule: kind %q unknown (allowed: all_of, any_of, at_least)", string(kind))
	}
	return d, nil
}

// Kind returns the rule kind.
func (d *DetectionRule) Kind() RuleKind { return d.kind }

// Bands returns a copy of the listed band names.
func (d *DetectionRule) Bands() []string { return append([]string(nil), d.names...) }

// Count returns how many listed bands must be detected.
func (d *DetectionRule) Count() int { return d.k }

// String describes the rule, e.g. "at_least 2 of g, r, i".
func (d *DetectionRule) String() string {
	switch d.kind {
	case RuleAtLeast:
		return fmt.Sprintf("at_least %d of %s", d.k, strings.Join(d.names, ", "))
	}
	return string(d.kind) + " " + strings.Join(d.names, ", ")
}

// Passes reports whether the rule accepts a star whose per-band detection
// flags (in survey band order) are detected. It allocates nothing. It panics
// if detected is shorter than the survey band list the rule was built for (a
// caller bug).
func (d *DetectionRule) Passes(detected []bool) bool {
	n := 0
	for _, i := range d.idx {
		if detected[i] {
			n++
		}
	}
	return n >= d.k
}
