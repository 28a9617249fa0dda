package plot

import (
	"image/color"
	"sort"
	"strings"
)

// stageColours maps the evolutionary-stage words of the catalogue to plot
// colours. The order of this list is the drawing and legend order. The colours
// are our own choice: a blue-to-red sequence for the hydrogen- and
// helium-burning phases, blues and greys for remnants.
var stageColours = []struct {
	word string
	c    color.RGBA
}{
	{"main_sequence", color.RGBA{R: 31, G: 119, B: 180, A: 255}},
	{"subgiant", color.RGBA{R: 23, G: 190, B: 207, A: 255}},
	{"red_giant_branch", color.RGBA{R: 214, G: 39, B: 40, A: 255}},
	{"core_helium_burning", color.RGBA{R: 255, G: 127, B: 14, A: 255}},
	{"early_agb", color.RGBA{R: 148, G: 103, B: 189, A: 255}},
	{"thermally_pulsing_agb", color.RGBA{R: 227, G: 119, B: 194, A: 255}},
	{"helium_main_sequence", color.RGBA{R: 44, G: 160, B: 44, A: 255}},
	{"helium_giant", color.RGBA{R: 188, G: 189, B: 34, A: 255}},
	{"helium_white_dwarf", color.RGBA{R: 158, G: 218, B: 229, A: 255}},
	{"carbon_oxygen_white_dwarf", color.RGBA{R: 57, G: 59, B: 121, A: 255}},
	{"oxygen_neon_white_dwarf", color.RGBA{R: 107, G: 110, B: 207, A: 255}},
	{"neutron_star", color.RGBA{R: 140, G: 86, B: 75, A: 255}},
	{"black_hole", color.RGBA{A: 255}},
	{"no_remnant", color.RGBA{R: 199, G: 199, B: 199, A: 255}},
}

// extraColours are used, in order, for stage words not in the table above
// (sorted alphabetically), so an unknown word still gets a stable colour.
var extraColours = []color.RGBA{
	{R: 127, G: 127, B: 127, A: 255},
	{R: 255, G: 187, B: 120, A: 255},
	{R: 152, G: 223, B: 138, A: 255},
	{R: 197, G: 176, B: 213, A: 255},
}

// StageColour returns the colour used for a stage word, and whether the word
// is one of the known stage words (unknown words get a fallback colour chosen
// by StageOrder).
func StageColour(stage string) (color.Color, bool) {
	for _, s := range stageColours {
		if s.word == stage {
			return s.c, true
		}
	}
	return extraColours[0], false
}

// StageOrder returns the distinct stage words of stages in drawing order:
// known words in the fixed table order, then unknown words sorted, with the
// colour of each.
func StageOrder(stages []string) (words []string, colours []color.Color) {
	set := map[string]bool{}
	for _, s := range stages {
		set[s] = true
	}
	for _, s := range stageColours {
		if set[s.word] {
			words = append(words, s.word)
			colours = append(colours, s.c)
			delete(set, s.word)
		}
	}
	var rest []string
	for s := range set {
		rest = append(rest, s)
	}
	sort.Strings(rest)
	for i, s := range rest {
		words = append(words, s)
		colours = append(colours, extraColours[i%len(extraColours)])
	}
	return words, colours
}

// stagePhrase turns a stage word into legend text: "red_giant_branch" →
// "red giant branch".
func stagePhrase(word string) string {
	if word == "" {
		return "(no stage)"
	}
	return strings.ReplaceAll(word, "_", " ")
}
