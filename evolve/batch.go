package evolve

import "fmt"

// EvolveBatch evaluates many stars of this model's metallicity: star i has
// initial mass massMsun[i] (Msun) and age ageYr[i] (yr). Results are written
// to dst, which is grown only if its capacity is below len(massMsun), and
// dst[:len(massMsun)] is returned. It panics if the two input slices differ
// in length (a programming error). On bad input it stops at the first bad
// star and returns an error naming its index and wrapping the *RangeError.
func (m *Model) EvolveBatch(dst []Star, massMsun, ageYr []float64) ([]Star, error) {
	if len(massMsun) != len(ageYr) {
		panic(fmt.Sprintf("evolve: EvolveBatch: %d masses but %d ages", len(massMsun), len(ageYr)))
	}
	if cap(dst) < len(massMsun) {
		dst = make([]Star, len(massMsun))
	}
	dst = dst[:len(massMsun)]
	for i := range massMsun {
		s, err := m.Evolve(massMsun[i], ageYr[i])
		if err != nil {
			return dst[:i], fmt.Errorf("evolve: star %d: %w", i, err)
		}
		dst[i] = s
	}
	return dst, nil
}
