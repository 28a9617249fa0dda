package phot

import "fmt"

// Quality says where a star's magnitudes come from. Higher values are worse;
// a star's quality is the worst over the grid nodes its interpolation uses.
type Quality uint8

const (
	// QualityEmpirical: every band comes from published empirical relations
	// (dwarf sequence, giant colour calibration, photometric transformations).
	QualityEmpirical Quality = iota
	// QualityModel: from a user grid (model atmospheres or other, as its file says).
	QualityModel
	// QualityBlackbody: at least one band comes from synthetic photometry of a
	// blackbody (tied to the empirical scale where stated); approximate,
	// especially for cool stars, whose spectra are far from a blackbody.
	QualityBlackbody
	// QualityOutsideGrid: (Teff, log g, [Fe/H]) is outside the grid; magnitudes are NaN.
	QualityOutsideGrid
	// QualityNone: the object has no magnitudes (NaN or non-positive luminosity
	// or temperature, e.g. a neutron star or black hole); magnitudes are NaN.
	QualityNone
)

var qualityWords = [...]string{"empirical", "model", "blackbody", "outside_grid", "none"}

// String returns the snake_case word of q ("empirical", "model", "blackbody",
// "outside_grid", "none").
func (q Quality) String() string {
	if int(q) < len(qualityWords) {
		return qualityWords[q]
	}
	return fmt.Sprintf("quality(%d)", uint8(q))
}

// ParseQuality returns the Quality named by word.
func ParseQuality(word string) (Quality, error) {
	for i, w := range qualityWords {
		if w == word {
			return Quality(i), nil
		}
	}
	return 0, fmt.Errorf("quality %q, want one of empirical, model, blackbody, outside_grid, none", word)
}

// HasMagnitudes reports whether magnitudes with this quality are numbers.
func (q Quality) HasMagnitudes() bool { return q <= QualityBlackbody }
