package synth

import (
	"fmt"

	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/observe"
	"github.com/starmock/starmock/synth/phot"
)

// SurveyPlan is the resolved survey: the photometer for its bands, the per-band
// observation models and the detection rule.
type SurveyPlan struct {
	Name      string
	Bands     []phot.Band
	Photo     *phot.Photometer
	Specs     []observe.BandSpec
	Detection *observe.DetectionRule
	// tables caches the fast extinction tables per (law, R_V).
	tables map[string]*dust.BandTable
}

func (s *Scenario) surveyPlan() (*SurveyPlan, error) {
	sv := s.Survey
	names := make([]string, len(sv.Bands))
	for i, b := range sv.Bands {
		names[i] = b.Band
	}
	sp := &SurveyPlan{Name: sv.Name, tables: map[string]*dust.BandTable{}}
	grid, err := phot.DefaultGrid()
	if err != nil {
		return nil, fmt.Errorf("built-in bolometric-correction grid: %w", err)
	}
	var extra []phot.Band
	for i, n := range names {
		var b phot.Band
		if path := sv.Bands[i].Passband; path != "" {
			pb, err := phot.LoadPassband(s.resolvePath(path))
			if err != nil {
				return nil, s.errf(fmt.Sprintf("survey.bands[%d].passband", i), "%v", err)
			}
			b = phot.Band{Name: n, System: phot.SystemAB, PivotAA: pb.PivotAA(), Source: "user passband " + path, Curve: pb}
		} else if b, err = phot.LookupBand(n); err != nil {
			return nil, s.errf(fmt.Sprintf("survey.bands[%d].band", i), "%v (or give a passband file)", err)
		}
		if grid.BandIndex(n) < 0 {
			extra = append(extra, b)
		}
		sp.Bands = append(sp.Bands, b)
	}
	if len(extra) > 0 {
		// Bands without empirical corrections (user filters, Rubin) get blackbody colour
		// terms tied to the nearest built-in band (phot.ExtendGrid); their stars are flagged
		// "blackbody" in phot_quality, approximate for cool stars.
		if grid, err = phot.ExtendGrid(grid, extra); err != nil {
			return nil, s.errf("survey.bands", "%v", err)
		}
	}
	if sp.Photo, err = phot.NewPhotometer(grid, names); err != nil {
		return nil, s.errf("survey.bands", "%v", err)
	}
	for i := range sv.Bands {
		b := &sv.Bands[i]
		p := fmt.Sprintf("survey.bands[%d]", i)
		spec := observe.BandSpec{Band: b.Band, Limit5SigmaMag: b.Limit5SigmaMag, FloorMag: *b.FloorMag,
			SaturationMag: b.SaturationMag}
		spec.Noise.Kind = observe.NoiseKind(b.Noise)
		switch b.Noise {
		case "ivezic2019":
			spec.Noise.Gamma = 0.039 // Ivezić et al. 2019 Table 2 (g–z bands 0.039; u 0.038, y 0.039)
			if b.Gamma != nil {
				spec.Noise.Gamma = *b.Gamma
			}
		case "table":
			t, err := observe.LoadErrorTable(s.resolvePath(b.Table))
			if err != nil {
				return nil, s.errf(p+".table", "%v", err)
			}
			spec.Noise.Table = t
		}
		switch b.Completeness {
		case "logistic":
			spec.Completeness = observe.LogisticCompleteness(1, *b.Completeness50Mag, b.CompletenessWidthMag)
		case "table":
			t, err := observe.LoadCompletenessTable(s.resolvePath(b.CompletenessTable))
			if err != nil {
				return nil, s.errf(p+".completeness_table", "%v", err)
			}
			spec.Completeness = observe.TableCompleteness(t)
		}
		if err := spec.Validate(); err != nil {
			return nil, s.errf(p, "%v", err)
		}
		sp.Specs = append(sp.Specs, spec)
	}
	d := sv.Detection
	if sp.Detection, err = observe.NewDetectionRule(observe.RuleKind(d.Rule), d.Bands, d.Count, names); err != nil {
		return nil, s.errf("survey.detection", "%v", err)
	}
	return sp, nil
}

// extinctionPlan is a component's dust: a law with its fast band table, and the
// distribution of A_V over its stars.
type extinctionPlan struct {
	table    *dust.BandTable
	avMag    float64
	spread   float64
	field    *fieldDust // Galactic components: A_V along each sight line
	ebvPerAV float64
}

// bandTable returns (building once) the fast A_X/A_V table for a law.
func (sp *SurveyPlan) bandTable(law dust.Law) (*dust.BandTable, error) {
	key := fmt.Sprintf("%s/%g", law.Name(), law.RV())
	if t, ok := sp.tables[key]; ok {
		return t, nil
	}
	pbs := make([]dust.Passband, len(sp.Bands))
	pivots := make([]float64, len(sp.Bands))
	for i, b := range sp.Bands {
		pivots[i] = b.PivotAA
		if b.Curve != nil {
			pbs[i] = dust.Passband{WavelengthAA: b.Curve.WavelengthAA, Throughput: b.Curve.Throughput, Photon: b.Curve.Photon}
		}
	}
	t, err := dust.NewBandTable(law, pbs, pivots)
	if err != nil {
		return nil, err
	}
	sp.tables[key] = t
	return t, nil
}

func (sp *SurveyPlan) extinction(s *Scenario, field string, e *Extinction) (*extinctionPlan, error) {
	if e == nil {
		e = &Extinction{Law: "ccm89", RV: 3.1}
	}
	law, err := dust.NewLaw(e.Law, e.RV)
	if err != nil {
		return nil, s.errf(field+".law", "%v", err)
	}
	t, err := sp.bandTable(law)
	if err != nil {
		return nil, s.errf(field, "%v", err)
	}
	return &extinctionPlan{table: t, avMag: e.AVMag, spread: e.AVSpreadMag, ebvPerAV: 1 / e.RV}, nil
}

// drawAV returns a star's A_V in mag: the component mean (or, for a Galactic component,
// the sight-line A_V to the star) plus a Gaussian spread, truncated at zero by redrawing
// (a negative extinction is unphysical). One normal draw per attempt; none when there is
// no spread.
func (e *extinctionPlan) drawAV(base float64, r interface{ NormFloat64() float64 }) float64 {
	if e.spread == 0 {
		return base
	}
	for {
		if v := base + e.spread*r.NormFloat64(); v >= 0 {
			return v
		}
	}
}
