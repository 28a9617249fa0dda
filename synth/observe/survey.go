package observe

import (
	"fmt"
	"math/rand/v2"
)

// Survey is a set of bands observed together and the rule that decides which
// stars enter the observed catalogue.
type Survey struct {
	bands []BandSpec
	names []string
	rule  *DetectionRule
}

// NewSurvey validates each band (band names must be distinct) and binds the
// rule; rule nil means "all_of" every band. The bands are copied.
func NewSurvey(bands []BandSpec, rule *DetectionRule) (*Survey, error) {
	if len(bands) == 0 {
		return nil, fmt.Errorf("observe: survey has no bands (want at least 1)")
	}
	s := &Survey{bands: append([]BandSpec(nil), bands...)}
	seen := map[string]bool{}
	for i := range s.bands {
		if err := s.bands[i].Validate(); err != nil {
			return nil, err
		}
		if seen[s.bands[i].Band] {
			return nil, fmt.Errorf("observe: survey: band %q listed twice", s.bands[i].Band)
		}
		seen[s.bands[i].Band] = true
		s.names = append(s.names, s.bands[i].Band)
	}
	if rule == nil {
		var err error
		if rule, err = NewDetectionRule(RuleAllOf, nil, 0, s.names); err != nil {
			return nil, err
		}
	} else {
		for j, i := range rule.idx {
			if i >= len(s.names) || s.names[i] != rule.names[j] {
				return nil, fmt.Errorf("observe: survey: detection rule %q was built for another band list (survey bands: %v)", rule.String(), s.names)
			}
		}
	}
	s.rule = rule
	return s, nil
}

// Bands returns the band names in survey order (a copy).
func (s *Survey) Bands() []string { return append([]string(nil), s.names...) }

// Band returns the i-th validated band spec (a pointer into the survey; do not
// modify it).
func (s *Survey) Band(i int) *BandSpec { return &s.bands[i] }

// Rule returns the detection rule.
func (s *Survey) Rule() *DetectionRule { return s.rule }

// Observe measures one star in every band: trueMags and dst are in survey band
// order and must both have len(Bands()) elements (else it panics: a caller
// bug). It consumes exactly DrawsPerObserve × len(Bands()) values of
// r.Uint64, band by band in order, allocates nothing, and returns whether the
// detection rule accepts the star.
func (s *Survey) Observe(trueMags []float64, r *rand.Rand, dst []Measurement) bool {
	if len(trueMags) != len(s.bands) || len(dst) != len(s.bands) {
		panic("observe: Survey.Observe: trueMags and dst must have one element per band")
	}
	for i := range s.bands {
		dst[i] = s.bands[i].Observe(trueMags[i], r)
	}
	k := 0
	for _, i := range s.rule.idx {
		if dst[i].Detected {
			k++
		}
	}
	return k >= s.rule.k
}
