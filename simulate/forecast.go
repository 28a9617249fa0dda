package simulate

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/output/summary"
	"github.com/starmock/starmock/synth"
)

// ForecastOptions choose where a forecast goes.
type ForecastOptions struct {
	// Dir receives the tables and pictures (created if missing).
	Dir string
	// Workers overrides the scenario's worker count when > 0.
	Workers int
	// Catalogue also writes the scenario's catalogue (in its formats) into Dir.
	Catalogue bool
	// Progress, when not nil, is called after each chunk.
	Progress func(done, total int64)
}

// Count is a realised number of detected stars with its Poisson error, and the expected
// number (sum of detection probabilities over the simulated stars) with its error.
type Count struct {
	Realised    int64   `json:"realised"`
	RealisedErr float64 `json:"realised_err"`
	Expected    float64 `json:"expected"`
	ExpectedErr float64 `json:"expected_err"`
}

// BandForecast is the forecast of one band.
type BandForecast struct {
	Band        string           `json:"band"`
	Total       Count            `json:"total"`
	ByComponent map[string]Count `json:"by_component"`
	ByStage     map[string]Count `json:"by_stage"`
	// Cumulative holds N(<m) of detected stars at the upper edge of each magnitude bin.
	CumulativeMag      []float64 `json:"cumulative_mag"`
	CumulativeRealised []float64 `json:"cumulative_realised"`
	CumulativeExpected []float64 `json:"cumulative_expected"`
}

// ShellForecast is one distance shell of a Galactic component.
type ShellForecast struct {
	Component string `json:"component"`
	synth.ShellInfo
}

// Forecast is what `starmock forecast` reports.
type Forecast struct {
	Synthetic    string          `json:"synthetic"`
	Seed         uint64          `json:"seed"`
	SolidAngleSr float64         `json:"solid_angle_sr,omitempty"`
	Stars        int64           `json:"stars_simulated"`
	Detected     int64           `json:"detected_by_rule"`
	Bands        []BandForecast  `json:"bands"`
	Shells       []ShellForecast `json:"shells,omitempty"`
	Files        []string        `json:"files"`
}

// RunForecast simulates the scenario and reports, per band, the realised and expected
// numbers of detected stars in total, per component, per stage and per magnitude bin
// (0.25 mag), with Poisson uncertainties, the cumulative counts N(<m), and the expected
// and drawn numbers of systems per distance shell of each Galactic component. It writes
// forecast.json, counts.csv (per bin, band, component and stage), cumulative.csv,
// shells.csv, and the pictures cmd.png, hess.png and counts.png into o.Dir.
func RunForecast(ctx context.Context, s *synth.Scenario, o ForecastOptions) (*Forecast, error) {
	if err := os.MkdirAll(o.Dir, 0o755); err != nil {
		return nil, fmt.Errorf("forecast folder %s: %w", o.Dir, err)
	}
	var col *Collector
	var plan *synth.Plan
	opts := Options{Workers: o.Workers, NoCatalogue: !o.Catalogue, OutPath: filepath.Join(o.Dir, "catalogue"), Progress: o.Progress,
		OnPlan: func(p *synth.Plan) (err error) {
			plan = p
			col, err = NewCollector(p, 40000)
			return err
		},
		OnBatch: func(b *output.Batch, cols []output.Column) error { return col.Add(b, cols) },
	}
	rep, err := Run(ctx, s, opts)
	if err != nil {
		return nil, err
	}
	fc := &Forecast{Synthetic: output.SyntheticStatement, Seed: plan.Seed, Stars: rep.Stars, Detected: rep.Detected}
	if plan.Area() != nil {
		fc.SolidAngleSr = plan.Area().SolidAngleSr()
	}
	for k, band := range col.bands {
		bf := BandForecast{Band: band, ByComponent: map[string]Count{}, ByStage: map[string]Count{}}
		all, err := col.Counts.Get(summary.Key{Band: band, Component: summary.All, Stage: summary.All})
		if err != nil {
			return nil, err
		}
		bf.Total = countOf(all)
		for _, c := range col.Counts.Components() {
			h, err := col.Counts.Get(summary.Key{Band: band, Component: c, Stage: summary.All})
			if err == nil {
				bf.ByComponent[c] = countOf(h)
			}
		}
		for _, st := range col.Counts.Stages() {
			h, err := col.Counts.Get(summary.Key{Band: band, Component: summary.All, Stage: st})
			if err == nil {
				bf.ByStage[st] = countOf(h)
			}
		}
		cc, _, ce, _ := all.Cumulative()
		bins := all.Binning()
		for i := 0; i < bins.N; i++ {
			bf.CumulativeMag = append(bf.CumulativeMag, bins.Edge(i+1))
		}
		bf.CumulativeRealised, bf.CumulativeExpected = cc, ce
		_ = k
		fc.Bands = append(fc.Bands, bf)
	}
	for _, cp := range plan.Components {
		for _, sh := range cp.Shells() {
			fc.Shells = append(fc.Shells, ShellForecast{Component: cp.Name, ShellInfo: sh})
		}
	}
	files := map[string]func(*os.File) error{
		"forecast.json": func(f *os.File) error {
			enc := json.NewEncoder(f)
			enc.SetIndent("", "  ")
			return enc.Encode(fc)
		},
		"counts.csv":     func(f *os.File) error { return col.Counts.WriteCSV(f) },
		"counts.json":    func(f *os.File) error { return col.Counts.WriteJSON(f) },
		"hess.csv":       func(f *os.File) error { return col.Detected.WriteCSV(f) },
		"cumulative.csv": func(f *os.File) error { return writeCumulative(f, fc) },
		"shells.csv":     func(f *os.File) error { return writeShells(f, fc) },
	}
	names := make([]string, 0, len(files))
	for n := range files {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		p := filepath.Join(o.Dir, n)
		if err := writeFileAtomic(p, files[n]); err != nil {
			return nil, err
		}
		fc.Files = append(fc.Files, p)
	}
	title := fmt.Sprintf("%s (synthetic forecast)", s.Survey.Name)
	pics := []struct {
		name string
		draw func(string, string) error
	}{{"cmd.png", col.WriteCMD}, {"hess.png", col.WriteHess}, {"counts.png", col.WriteCounts}}
	for _, pic := range pics {
		p := filepath.Join(o.Dir, pic.name)
		if err := pic.draw(p, title); err != nil {
			return nil, fmt.Errorf("%s: %w", pic.name, err)
		}
		fc.Files = append(fc.Files, p)
	}
	for _, f := range rep.Files {
		fc.Files = append(fc.Files, f.Path)
	}
	return fc, nil
}

func countOf(h *summary.Hist1D) Count {
	n := h.Total()
	var w2 float64
	bins := h.Binning()
	for i := 0; i < bins.N; i++ {
		e := h.ExpectedErr(i)
		w2 += e * e
	}
	return Count{Realised: n, RealisedErr: math.Sqrt(float64(n)), Expected: h.ExpectedTotal(), ExpectedErr: math.Sqrt(w2)}
}

func writeCumulative(f *os.File, fc *Forecast) error {
	if _, err := fmt.Fprintln(f, "band,mag_upper,n_realised,n_realised_err,n_expected"); err != nil {
		return err
	}
	for _, b := range fc.Bands {
		for i, m := range b.CumulativeMag {
			r := b.CumulativeRealised[i]
			if _, err := fmt.Fprintf(f, "%s,%g,%g,%.4g,%.6g\n", b.Band, m, r, math.Sqrt(r), b.CumulativeExpected[i]); err != nil {
				return err
			}
		}
	}
	return nil
}

func writeShells(f *os.File, fc *Forecast) error {
	if _, err := fmt.Fprintln(f, "component,inner_pc,outer_pc,expected_systems,expected_simulated,drawn,mass_bound_msun"); err != nil {
		return err
	}
	for _, s := range fc.Shells {
		if _, err := fmt.Fprintf(f, "%s,%g,%g,%.6g,%.6g,%d,%.4g\n", s.Component, s.InnerPc, s.OuterPc, s.ExpectedSystems, s.ExpectedSimulated, s.Drawn, s.MassBoundMsun); err != nil {
			return err
		}
	}
	return nil
}
