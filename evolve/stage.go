package evolve

import (
	"fmt"
	"strings"
)

// Stage is an evolutionary stage. It is never exposed as an integer code: its
// String method returns a snake_case word and ParseStage reads the word back.
// The zero value is MainSequence.
type Stage uint8

// The stages, in evolutionary order. Helium stars (HeliumMainSequence,
// HeliumGiant) are produced when winds strip the hydrogen envelope of a massive
// star during or after core helium burning.
const (
	MainSequence           Stage = iota // core hydrogen burning
	Subgiant                            // Hertzsprung gap: shell hydrogen burning before the giant branch
	RedGiantBranch                      // first giant branch, up to helium ignition
	CoreHeliumBurning                   // red clump, horizontal branch or blue loop
	EarlyAGB                            // early asymptotic giant branch (for core-collapse progenitors: the post-helium supergiant phase)
	ThermallyPulsingAGB                 // thermally pulsing asymptotic giant branch
	HeliumMainSequence                  // naked helium star burning helium in its core
	HeliumGiant                         // naked helium star after core helium exhaustion
	HeliumWhiteDwarf                    // white dwarf made of helium
	CarbonOxygenWhiteDwarf              // carbon–oxygen white dwarf
	OxygenNeonWhiteDwarf                // oxygen–neon white dwarf
	NeutronStar                         // neutron star
	BlackHole                           // black hole
	NoRemnant                           // nothing left (pair-instability supernova)
	numStages
)

var stageWords = [numStages]string{
	"main_sequence", "subgiant", "red_giant_branch", "core_helium_burning",
	"early_agb", "thermally_pulsing_agb", "helium_main_sequence", "helium_giant",
	"helium_white_dwarf", "carbon_oxygen_white_dwarf", "oxygen_neon_white_dwarf",
	"neutron_star", "black_hole", "no_remnant",
}

var stageLabels = [numStages]string{
	"main sequence", "subgiant (Hertzsprung gap)", "red giant branch",
	"core helium burning (red clump, horizontal branch or blue loop)",
	"early asymptotic giant branch", "thermally pulsing asymptotic giant branch",
	"naked helium main-sequence star", "naked helium giant", "helium white dwarf",
	"carbon–oxygen white dwarf", "oxygen–neon white dwarf", "neutron star",
	"black hole", "no remnant",
}

// String returns the stage's snake_case word, e.g. "red_giant_branch"; an
// out-of-range value prints as "stage(N)".
func (s Stage) String() string {
	if s < numStages {
		return stageWords[s]
	}
	return fmt.Sprintf("stage(%d)", uint8(s))
}

// Label returns a human-readable phrase for the stage, e.g. "red giant branch".
func (s Stage) Label() string {
	if s < numStages {
		return stageLabels[s]
	}
	return s.String()
}

// IsRemnant reports whether the stage is a stellar remnant (white dwarf,
// neutron star, black hole or no remnant).
func (s Stage) IsRemnant() bool { return s >= HeliumWhiteDwarf && s < numStages }

// IsWhiteDwarf reports whether the stage is a white dwarf of any composition.
func (s Stage) IsWhiteDwarf() bool {
	return s == HeliumWhiteDwarf || s == CarbonOxygenWhiteDwarf || s == OxygenNeonWhiteDwarf
}

// ParseStage returns the stage named by word (its String form, case-insensitive,
// surrounding space ignored). An unknown word gives an error listing the words.
func ParseStage(word string) (Stage, error) {
	w := strings.ToLower(strings.TrimSpace(word))
	for i, s := range stageWords {
		if s == w {
			return Stage(i), nil
		}
	}
	return 0, fmt.Errorf("evolve: unknown stage %q (allowed: %s)", word, strings.Join(stageWords[:], ", "))
}

// AllStages returns every stage in evolutionary order (a new slice each call).
func AllStages() []Stage {
	out := make([]Stage, numStages)
	for i := range out {
		out[i] = Stage(i)
	}
	return out
}

// MarshalText implements encoding.TextMarshaler with the stage word, so JSON
// and CSV writers print words, never codes.
func (s Stage) MarshalText() ([]byte, error) {
	if s >= numStages {
		return nil, fmt.Errorf("evolve: invalid stage %d", uint8(s))
	}
	return []byte(stageWords[s]), nil
}

// UnmarshalText implements encoding.TextUnmarshaler via ParseStage.
func (s *Stage) UnmarshalText(b []byte) error {
	v, err := ParseStage(string(b))
	if err != nil {
		return err
	}
	*s = v
	return nil
}
