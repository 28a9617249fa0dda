package summary

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"sort"
	"strconv"
)

// All is the word used for "every component" or "every stage" in keys,
// CSV and JSON output. It cannot be used as a component or stage name.
const All = "all"

// Key names one histogram of a StarCounts or HessSet: a band, a population
// component and an evolutionary stage word. Component or Stage All means the
// sum over every component or stage.
type Key struct {
	Band, Component, Stage string
}

type countKey struct {
	band        int
	comp, stage string
}

// StarCounts accumulates star counts per magnitude bin for every (band,
// component, stage), as realised counts and expected counts (see Hist1D).
// The zero value is not usable; call NewStarCounts. Not safe for concurrent
// use: one per worker, then Merge (exact, order-independent).
type StarCounts struct {
	bands []string
	bins  Binning
	m     map[countKey]*Hist1D
}

// NewStarCounts returns empty counts for the bands (survey order, distinct,
// not empty) on the magnitude binning b.
func NewStarCounts(bands []string, b Binning) (*StarCounts, error) {
	if len(bands) == 0 {
		return nil, fmt.Errorf("summary: star counts need at least one band")
	}
	seen := map[string]bool{}
	for _, n := range bands {
		if n == "" || seen[n] {
			return nil, fmt.Errorf("summary: band name %q empty or repeated", n)
		}
		seen[n] = true
	}
	if _, err := NewBinning(b.Lo, b.Hi, b.N); err != nil {
		return nil, err
	}
	return &StarCounts{bands: append([]string(nil), bands...), bins: b, m: map[countKey]*Hist1D{}}, nil
}

// Bands returns the band names (a copy). Binning returns the magnitude binning.
func (s *StarCounts) Bands() []string { return append([]string(nil), s.bands...) }

// Binning returns the magnitude binning.
func (s *StarCounts) Binning() Binning { return s.bins }

func checkLabel(what, v string) {
	if v == "" || v == All {
		panic(fmt.Sprintf("summary: %s %q not allowed (empty or the reserved word %q)", what, v, All))
	}
}

func (s *StarCounts) hist(band int, comp, stage string) *Hist1D {
	if band < 0 || band >= len(s.bands) {
		panic(fmt.Sprintf("summary: band index %d outside [0, %d)", band, len(s.bands)))
	}
	k := countKey{band, comp, stage}
	h := s.m[k]
	if h == nil {
		checkLabel("component", comp)
		checkLabel("stage", stage)
		h = NewHist1D(s.bins)
		s.m[k] = h
	}
	return h
}

// Add counts one realised star of magnitude magnitude mag (mag) in band index
// band (position in Bands()). It allocates only the first time a (band,
// component, stage) is seen. It panics on a band index out of range or an
// empty or "all" component or stage (caller bugs).
func (s *StarCounts) Add(band int, component, stage string, mag float64) {
	s.hist(band, component, stage).Add(mag)
}

// AddExpected adds an expected number weight (≥ 0) of stars at magnitude mag.
func (s *StarCounts) AddExpected(band int, component, stage string, mag, weight float64) {
	s.hist(band, component, stage).AddExpected(mag, weight)
}

// Merge adds o, which must have the same bands and binning.
func (s *StarCounts) Merge(o *StarCounts) error {
	if !s.bins.same(o.bins) || len(s.bands) != len(o.bands) {
		return fmt.Errorf("summary: merge of star counts with different bands or binning")
	}
	for i := range s.bands {
		if s.bands[i] != o.bands[i] {
			return fmt.Errorf("summary: merge of star counts with different bands (%v vs %v)", s.bands, o.bands)
		}
	}
	for _, k := range sortedCountKeys(o.m) {
		if err := s.hist(k.band, k.comp, k.stage).Merge(o.m[k]); err != nil {
			return err
		}
	}
	return nil
}

func sortedCountKeys(m map[countKey]*Hist1D) []countKey {
	ks := make([]countKey, 0, len(m))
	for k := range m {
		ks = append(ks, k)
	}
	sort.Slice(ks, func(i, j int) bool {
		a, b := ks[i], ks[j]
		if a.band != b.band {
			return a.band < b.band
		}
		if a.comp != b.comp {
			return a.comp < b.comp
		}
		return a.stage < b.stage
	})
	return ks
}

// Components returns the component names seen, sorted; Stages the stage words.
func (s *StarCounts) Components() []string {
	return s.labels(func(k countKey) string { return k.comp })
}

// Stages returns the stage words seen, sorted.
func (s *StarCounts) Stages() []string { return s.labels(func(k countKey) string { return k.stage }) }

func (s *StarCounts) labels(f func(countKey) string) []string {
	set := map[string]bool{}
	for k := range s.m {
		set[f(k)] = true
	}
	out := make([]string, 0, len(set))
	for v := range set {
		out = append(out, v)
	}
	sort.Strings(out)
	return out
}

// Get returns a new histogram for key k: Component and/or Stage All sum over
// every component and/or stage (exactly). An unknown band gives an error; a
// combination with no data gives an empty histogram.
func (s *StarCounts) Get(k Key) (*Hist1D, error) {
	band := -1
	for i, b := range s.bands {
		if b == k.Band {
			band = i
		}
	}
	if band < 0 {
		return nil, fmt.Errorf("summary: band %q not in the star counts (bands: %v)", k.Band, s.bands)
	}
	out := NewHist1D(s.bins)
	for _, ck := range sortedCountKeys(s.m) {
		if ck.band == band && (k.Component == All || k.Component == ck.comp) && (k.Stage == All || k.Stage == ck.stage) {
			_ = out.Merge(s.m[ck])
		}
	}
	return out, nil
}

// Keys returns, in the fixed output order, every key that has data: for each
// band in survey order, (all, all), then (all, stage) per stage, then for each
// component (component, all) and (component, stage) per stage, names sorted.
func (s *StarCounts) Keys() []Key {
	comps, stages := s.Components(), s.Stages()
	var out []Key
	for bi, b := range s.bands {
		has := func(c, st string) bool {
			for k := range s.m {
				if k.band == bi && (c == All || k.comp == c) && (st == All || k.stage == st) {
					return true
				}
			}
			return false
		}
		for _, c := range append([]string{All}, comps...) {
			for _, st := range append([]string{All}, stages...) {
				if has(c, st) {
					out = append(out, Key{b, c, st})
				}
			}
		}
	}
	return out
}

// CSV columns written by StarCounts.WriteCSV, in order.
var starCountsCSVHeader = []string{"band", "component", "stage", "mag_lo", "mag_hi",
	"count", "count_err", "expected", "expected_err",
	"cum_count", "cum_count_err", "cum_expected", "cum_expected_err"}

func fmtF(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// WriteCSV writes one row per (key, magnitude bin) for every key of Keys(), in
// that order, with the columns band, component, stage, mag_lo, mag_hi (bin
// edges, mag), count, count_err (sqrt N), expected, expected_err (sqrt Σw²),
// and the cumulative N(< mag_hi) versions cum_* (underflow included). The
// output is the same bytes for the same contents.
func (s *StarCounts) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(starCountsCSVHeader); err != nil {
		return err
	}
	for _, k := range s.Keys() {
		h, _ := s.Get(k)
		cc, cce, ce, cee := h.Cumulative()
		for i := 0; i < s.bins.N; i++ {
			rec := []string{k.Band, k.Component, k.Stage, fmtF(s.bins.Edge(i)), fmtF(s.bins.Edge(i + 1)),
				strconv.FormatInt(h.Count(i), 10), fmtF(h.CountErr(i)), fmtF(h.Expected(i)), fmtF(h.ExpectedErr(i)),
				fmtF(cc[i]), fmtF(cce[i]), fmtF(ce[i]), fmtF(cee[i])}
			if err := cw.Write(rec); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// BinningJSON is the JSON form of a Binning.
type BinningJSON struct {
	Lo float64 `json:"lo"`
	Hi float64 `json:"hi"`
	N  int     `json:"n"`
}

// HistJSON is the JSON form of one star-count histogram.
type HistJSON struct {
	Band           string    `json:"band"`
	Component      string    `json:"component"`
	Stage          string    `json:"stage"`
	Count          []int64   `json:"count"`
	CountErr       []float64 `json:"count_err"`
	Expected       []float64 `json:"expected"`
	ExpectedErr    []float64 `json:"expected_err"`
	CumCount       []float64 `json:"cum_count"`
	CumCountErr    []float64 `json:"cum_count_err"`
	CumExpected    []float64 `json:"cum_expected"`
	CumExpectedErr []float64 `json:"cum_expected_err"`
	Underflow      int64     `json:"underflow"`
	Overflow       int64     `json:"overflow"`
	NaN            int64     `json:"nan"`
	ExpUnderflow   float64   `json:"expected_underflow"`
	ExpOverflow    float64   `json:"expected_overflow"`
	ExpNaN         float64   `json:"expected_nan"`
}

// StarCountsJSON is the document written by StarCounts.WriteJSON.
type StarCountsJSON struct {
	Kind       string      `json:"kind"` // "star_counts"
	MagBinning BinningJSON `json:"mag_binning"`
	Bands      []string    `json:"bands"`
	Histograms []HistJSON  `json:"histograms"`
}

// JSON returns the document WriteJSON writes.
func (s *StarCounts) JSON() StarCountsJSON {
	doc := StarCountsJSON{Kind: "star_counts", MagBinning: BinningJSON{s.bins.Lo, s.bins.Hi, s.bins.N}, Bands: s.Bands()}
	for _, k := range s.Keys() {
		h, _ := s.Get(k)
		hj := HistJSON{Band: k.Band, Component: k.Component, Stage: k.Stage,
			Underflow: h.Underflow(), Overflow: h.Overflow(), NaN: h.NaN(),
			ExpUnderflow: h.ExpectedUnderflow(), ExpOverflow: h.ExpectedOverflow(), ExpNaN: h.ExpectedNaN()}
		for i := 0; i < s.bins.N; i++ {
			hj.Count = append(hj.Count, h.Count(i))
			hj.CountErr = append(hj.CountErr, h.CountErr(i))
			hj.Expected = append(hj.Expected, h.Expected(i))
			hj.ExpectedErr = append(hj.ExpectedErr, h.ExpectedErr(i))
		}
		hj.CumCount, hj.CumCountErr, hj.CumExpected, hj.CumExpectedErr = h.Cumulative()
		doc.Histograms = append(doc.Histograms, hj)
	}
	return doc
}

// WriteJSON writes the counts as an indented JSON document (StarCountsJSON),
// keys in the order of Keys(); the same contents give the same bytes.
func (s *StarCounts) WriteJSON(w io.Writer) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(s.JSON())
}
