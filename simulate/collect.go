package simulate

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/output/plot"
	"github.com/starmock/starmock/output/summary"
	"github.com/starmock/starmock/synth"
)

// Collector accumulates, from the batches of a run, everything a forecast reports and
// draws: realised and expected counts of detected stars per band, magnitude bin,
// component and stage; Hess diagrams of the detected stars per component and of every
// true star; and a fixed-size random sample of detected stars for the colour–magnitude
// diagram. Memory is fixed by the binning and the sample size, not by the star count.
//
// Stars are labelled by the stage of the member that dominates the light of the system
// (column dominant_stage), so an unresolved white dwarf with a brighter main-sequence
// companion counts as main sequence. Realised counts are binned by observed magnitude; expected counts by true magnitude,
// each star weighted by its detection probability in that band (package observe), so
// their sum is the expected number of detections given the simulated population.
type Collector struct {
	plan       *synth.Plan
	bands      []string
	cIdx, mIdx int // colour = bands[cIdx] − bands[mIdx], magnitude = bands[mIdx]
	Counts     *summary.StarCounts
	Detected   *summary.HessSet
	Truth      *summary.Hist2D
	sample     *summary.Reservoir
	r          *rand.Rand
}

// magBins is the binning of star counts: 0.25 mag from −5 to 40.
var magBins, _ = summary.NewBinning(-5, 40, 180)

// NewCollector prepares a collector for the plan's bands. The CMD uses the first band
// minus the second as colour and the second as magnitude (a single-band survey uses the
// band against itself: colour zero). sampleSize is the number of detected stars kept
// for the CMD.
func NewCollector(p *synth.Plan, sampleSize int) (*Collector, error) {
	c := &Collector{plan: p}
	for _, b := range p.Survey.Bands {
		c.bands = append(c.bands, b.Name)
	}
	if len(c.bands) > 1 {
		c.mIdx = 1
	}
	var err error
	if c.Counts, err = summary.NewStarCounts(c.bands, magBins); err != nil {
		return nil, err
	}
	// Magnitude axis: from 1 mag above saturation (at most 16 mag above the 5σ depth, so a
	// survey without a real saturation limit still gets a readable axis) to 1.5 mag below
	// the depth.
	lo, hi := 40.0, -5.0
	for _, s := range p.Survey.Specs {
		lo = math.Min(lo, math.Max(s.SaturationMag-1, s.Limit5SigmaMag-16))
		hi = math.Max(hi, s.Limit5SigmaMag+1.5)
	}
	mb, err := summary.NewBinning(math.Floor(lo), math.Ceil(hi), int(math.Ceil(hi)-math.Floor(lo))*8)
	if err != nil {
		return nil, err
	}
	cb, _ := summary.NewBinning(-1, 4, 100)
	if c.Detected, err = summary.NewHessSet(c.ColourLabel(), c.MagLabel(), cb, mb); err != nil {
		return nil, err
	}
	c.Truth = summary.NewHist2D(cb, mb)
	if c.sample, err = summary.NewReservoir(sampleSize); err != nil {
		return nil, err
	}
	c.r = rand.New(rand.NewPCG(p.Seed, 0x5eed_c0de))
	return c, nil
}

// ColourLabel and MagLabel are the CMD axis labels.
func (c *Collector) ColourLabel() string {
	return fmt.Sprintf("%s − %s [mag]", c.bands[c.cIdx], c.bands[c.mIdx])
}

// MagLabel is the CMD magnitude axis label.
func (c *Collector) MagLabel() string { return fmt.Sprintf("%s [mag]", c.bands[c.mIdx]) }

// Add takes one batch with the plan's full columns.
func (c *Collector) Add(b *output.Batch, cols []output.Column) error {
	comp := b.Cols[1].([]string)
	stage := b.Cols[synth.DominantStageColumn].([]string)
	det := b.Cols[len(cols)-1].([]bool)
	sp := c.plan.Survey
	app := func(k int) []float32 { return b.Cols[synth.BandColumn(k, 1)].([]float32) }
	obs := func(k int) []float32 { return b.Cols[synth.BandColumn(k, 2)].([]float32) }
	detk := func(k int) []bool { return b.Cols[synth.BandColumn(k, 6)].([]bool) }
	appValid := func(k int) []bool { return b.Valid[synth.BandColumn(k, 1)] }
	obsValid := func(k int) []bool { return b.Valid[synth.BandColumn(k, 2)] }
	for j := 0; j < b.N; j++ {
		for k := range c.bands {
			if !appValid(k)[j] {
				continue
			}
			m := float64(app(k)[j])
			if pdet := sp.Specs[k].DetectionProbability(m); pdet > 0 {
				c.Counts.AddExpected(k, comp[j], stage[j], m, pdet)
			}
			if detk(k)[j] && obsValid(k)[j] {
				c.Counts.Add(k, comp[j], stage[j], float64(obs(k)[j]))
			}
		}
		if appValid(c.cIdx)[j] && appValid(c.mIdx)[j] {
			tm := float64(app(c.mIdx)[j])
			c.Truth.Add(float64(app(c.cIdx)[j])-tm, tm)
		}
		if det[j] && obsValid(c.cIdx)[j] && obsValid(c.mIdx)[j] {
			om := float64(obs(c.mIdx)[j])
			col := float64(obs(c.cIdx)[j]) - om
			c.Detected.Add(comp[j], col, om)
			c.sample.Offer(summary.Point{Colour: col, Mag: om, Stage: stage[j], Component: comp[j], Detected: true}, c.r)
		}
	}
	return nil
}

// WriteCMD draws the colour–magnitude diagram: every true star as a grey density, the
// sampled detected stars at their observed photometry coloured by stage.
func (c *Collector) WriteCMD(path, title string) error {
	return writeFileAtomic(path, func(f *os.File) error {
		return plot.CMD(f, plot.PointsFromSample(c.sample.Points()), plot.CMDOptions{Title: title,
			ColourLabel: c.ColourLabel(), MagLabel: c.MagLabel(), TruthHess: c.Truth})
	})
}

// WriteHess draws the Hess diagram of detected stars, one panel per component.
func (c *Collector) WriteHess(path, title string) error {
	return writeFileAtomic(path, func(f *os.File) error {
		return plot.HessPanels(f, c.Detected, plot.HessOptions{Title: title, ColourLabel: c.ColourLabel(), MagLabel: c.MagLabel()})
	})
}

// WriteCounts draws the cumulative counts N(<m) of detected stars per band.
func (c *Collector) WriteCounts(path, title string) error {
	curves, err := plot.CurvesFromCounts(c.Counts, true, false)
	if err != nil {
		return err
	}
	return writeFileAtomic(path, func(f *os.File) error {
		return plot.StarCounts(f, curves, plot.CountsOptions{Title: title, MagLabel: "observed magnitude [mag]", NLabel: "detected stars N(<m)"})
	})
}

// writeFileAtomic writes through a temporary file in the same folder and renames it.
func writeFileAtomic(path string, write func(*os.File) error) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return err
	}
	if err := write(f); err != nil {
		f.Close()
		os.Remove(f.Name())
		return err
	}
	if err := f.Close(); err != nil {
		os.Remove(f.Name())
		return err
	}
	return os.Rename(f.Name(), path)
}
