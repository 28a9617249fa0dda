package summary

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
)

// HessSet accumulates Hess diagrams (2-D histograms of colour × magnitude),
// one per population component, on a shared binning. Get(All) sums the
// components exactly. Not safe for concurrent use: one per worker, then Merge.
type HessSet struct {
	colourLabel, magLabel string
	x, y                  Binning
	m                     map[string]*Hist2D
}

// NewHessSet returns an empty set. colourLabel (e.g. "g-r") and magLabel
// (e.g. "r") name the axes in the output; colour and mag are the binnings of
// colour (mag) and magnitude (mag).
func NewHessSet(colourLabel, magLabel string, colour, mag Binning) (*HessSet, error) {
	if colourLabel == "" || magLabel == "" {
		return nil, fmt.Errorf("summary: hess diagram axis label empty (colour %q, magnitude %q)", colourLabel, magLabel)
	}
	for _, b := range []Binning{colour, mag} {
		if _, err := NewBinning(b.Lo, b.Hi, b.N); err != nil {
			return nil, err
		}
	}
	return &HessSet{colourLabel: colourLabel, magLabel: magLabel, x: colour, y: mag, m: map[string]*Hist2D{}}, nil
}

// Labels returns the colour and magnitude labels.
func (s *HessSet) Labels() (colour, mag string) { return s.colourLabel, s.magLabel }

// Binnings returns the colour and magnitude binnings.
func (s *HessSet) Binnings() (colour, mag Binning) { return s.x, s.y }

func (s *HessSet) hist(comp string) *Hist2D {
	h := s.m[comp]
	if h == nil {
		checkLabel("component", comp)
		h = NewHist2D(s.x, s.y)
		s.m[comp] = h
	}
	return h
}

// Add counts one realised star of the component at (colour, mag). It
// allocates only for a new component; panics on an empty or "all" component.
func (s *HessSet) Add(component string, colour, mag float64) { s.hist(component).Add(colour, mag) }

// AddExpected adds an expected number weight ≥ 0 at (colour, mag).
func (s *HessSet) AddExpected(component string, colour, mag, weight float64) {
	s.hist(component).AddExpected(colour, mag, weight)
}

// Merge adds o, which must have the same labels and binnings.
func (s *HessSet) Merge(o *HessSet) error {
	if s.colourLabel != o.colourLabel || s.magLabel != o.magLabel || !s.x.same(o.x) || !s.y.same(o.y) {
		return fmt.Errorf("summary: merge of hess diagrams with different axes")
	}
	for _, c := range o.Components() {
		if err := s.hist(c).Merge(o.m[c]); err != nil {
			return err
		}
	}
	return nil
}

// Components returns the component names seen, sorted.
func (s *HessSet) Components() []string {
	out := make([]string, 0, len(s.m))
	for c := range s.m {
		out = append(out, c)
	}
	sort.Strings(out)
	return out
}

// Get returns a new copy of the diagram of a component, or of their sum for
// All; an unknown component gives an empty diagram.
func (s *HessSet) Get(component string) *Hist2D {
	out := NewHist2D(s.x, s.y)
	for _, c := range s.Components() {
		if component == All || component == c {
			_ = out.Merge(s.m[c])
		}
	}
	return out
}

// WriteCSV writes one row per non-empty cell (realised or expected count >
// 0), for All and then each component in sorted order, cells in magnitude-
// then colour-bin order, with the columns component, colour_lo, colour_hi,
// mag_lo, mag_hi, count, count_err (sqrt N), expected, expected_err (sqrt Σw²).
// A first comment-free header row names the columns; the colour and magnitude
// labels go into the column names as colour_lo[g-r] etc.
func (s *HessSet) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	cl, ml := "["+s.colourLabel+"]", "["+s.magLabel+"]"
	if err := cw.Write([]string{"component", "colour_lo" + cl, "colour_hi" + cl, "mag_lo" + ml, "mag_hi" + ml,
		"count", "count_err", "expected", "expected_err"}); err != nil {
		return err
	}
	for _, c := range append([]string{All}, s.Components()...) {
		h := s.Get(c)
		for iy := 0; iy < s.y.N; iy++ {
			for ix := 0; ix < s.x.N; ix++ {
				n, e := h.Count(ix, iy), h.Expected(ix, iy)
				if n == 0 && e == 0 {
					continue
				}
				rec := []string{c, fmtF(s.x.Edge(ix)), fmtF(s.x.Edge(ix + 1)), fmtF(s.y.Edge(iy)), fmtF(s.y.Edge(iy + 1)),
					strconv.FormatInt(n, 10), fmtF(sqrtF(float64(n))), fmtF(e), fmtF(h.ExpectedErr(ix, iy))}
				if err := cw.Write(rec); err != nil {
					return err
				}
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// HessJSON is the JSON form of one Hess diagram: Count and Expected are
// row-major, Count[iy][ix] with iy the magnitude bin.
type HessJSON struct {
	Component string      `json:"component"`
	Count     [][]int64   `json:"count"`
	Expected  [][]float64 `json:"expected"`
	Outside   int64       `json:"outside"`
	NaN       int64       `json:"nan"`
	ExpOut    float64     `json:"expected_outside"`
	ExpNaN    float64     `json:"expected_nan"`
}

// HessSetJSON is the document written by HessSet.WriteJSON.
type HessSetJSON struct {
	Kind          string      `json:"kind"` // "hess"
	ColourLabel   string      `json:"colour_label"`
	MagLabel      string      `json:"mag_label"`
	ColourBinning BinningJSON `json:"colour_binning"`
	MagBinning    BinningJSON `json:"mag_binning"`
	Diagrams      []HessJSON  `json:"diagrams"`
}

// WriteJSON writes the set (HessSetJSON): All first, then components sorted.
func (s *HessSet) WriteJSON(w io.Writer) error {
	doc := HessSetJSON{Kind: "hess", ColourLabel: s.colourLabel, MagLabel: s.magLabel,
		ColourBinning: BinningJSON{s.x.Lo, s.x.Hi, s.x.N}, MagBinning: BinningJSON{s.y.Lo, s.y.Hi, s.y.N}}
	for _, c := range append([]string{All}, s.Components()...) {
		h := s.Get(c)
		d := HessJSON{Component: c, Outside: h.Outside(), NaN: h.NaN(), ExpOut: h.ExpectedOutside(), ExpNaN: h.ExpectedNaN()}
		for iy := 0; iy < s.y.N; iy++ {
			rc, re := make([]int64, s.x.N), make([]float64, s.x.N)
			for ix := 0; ix < s.x.N; ix++ {
				rc[ix], re[ix] = h.Count(ix, iy), h.Expected(ix, iy)
			}
			d.Count, d.Expected = append(d.Count, rc), append(d.Expected, re)
		}
		doc.Diagrams = append(doc.Diagrams, d)
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

func sqrtF(v float64) float64 { return math.Sqrt(v) }
