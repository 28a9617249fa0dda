package synth

import (
	"context"
	"fmt"
	"runtime"
	"sync"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/synth/galaxy"

	"github.com/starmock/starmock/imf"
)

// Plan is a validated scenario resolved into everything the pipeline needs: samplers per
// component, the number of stars of each, and the list of chunks in the order they are
// written. A Plan is read-only once built and is shared by all workers.
type Plan struct {
	Scenario   *Scenario
	Seed       uint64
	ChunkSize  int
	Components []*ComponentPlan
	// Chunks lists every chunk of the run in output order: the chunks of component 0,
	// then of component 1, and so on.
	Chunks []ChunkRef
	// Stars is the total number of primaries (systems) in the run.
	Stars int64
	// Survey is the resolved survey (bands, photometry, extinction, noise).
	Survey *SurveyPlan
	field  *fieldShared

	modelMu sync.Mutex
	models  map[int]*evolve.Model // evolution models by rounded [Fe/H] (see quantiseFeH)

	boundMu sync.Mutex
	bounds  map[int]*keyNodes // brightness nodes of the detectability bound by rounded [Fe/H]

	samplerMu sync.Mutex
	samplers  map[[3]int]*samplerEntry // (component, shell, age slice)
}

// samplerEntry is a position sampler built once, outside the plan's lock.
type samplerEntry struct {
	once sync.Once
	s    *galaxy.ShellSampler
	err  error
}

// sampler returns the position sampler of a Galactic component's shell, building it
// once per plan; different shells are built concurrently (galaxy.ShellSampler is safe
// for concurrent use, and it and its draws depend only on the shell and the random
// stream passed in, so which worker builds it does not matter).
func (p *Plan) sampler(comp, shell, slice int) (*galaxy.ShellSampler, error) {
	key := [3]int{comp, shell, slice}
	p.samplerMu.Lock()
	if p.samplers == nil {
		p.samplers = map[[3]int]*samplerEntry{}
	}
	e, ok := p.samplers[key]
	if !ok {
		e = &samplerEntry{}
		p.samplers[key] = e
	}
	p.samplerMu.Unlock()
	e.once.Do(func() {
		f := p.Components[comp].field
		e.s, e.err = f.slices[slice].model.NewShellSampler(f.area, f.shells[shell], f.name)
	})
	return e.s, e.err
}

// model returns the evolution model of the rounded metallicity key (fehRounded dex),
// building it once for the whole plan. Models are immutable, so workers share them;
// which worker builds a model first does not change it.
func (p *Plan) model(key int, fehRounded float64) (*evolve.Model, error) {
	p.modelMu.Lock()
	defer p.modelMu.Unlock()
	if m, ok := p.models[key]; ok {
		return m, nil
	}
	m, err := evolve.NewModel(evolve.ZFromFeH(fehRounded))
	if err != nil {
		return nil, err
	}
	if p.models == nil {
		p.models = map[int]*evolve.Model{}
	}
	p.models[key] = m
	return m, nil
}

// ComponentPlan is one component resolved.
type ComponentPlan struct {
	Index int
	Name  string
	Kind  string
	IMF   imf.IMF
	Ages  AgeSampler
	FeH   FeHSampler
	// Stars is the number of primaries; for a total-mass component it is found by the
	// pre-pass (see countForMass); for a Galactic component by the shell plan.
	Stars int64
	// RealisedMassMsun is the summed initial mass of the primaries, when known before the
	// run (total-mass components); 0 otherwise.
	RealisedMassMsun float64
	// FirstID is the star_id of the component's first star.
	FirstID  int64
	binaries *binaryModel
	place    *placement
	ext      *extinctionPlan
	field    *fieldPlan
	nChunks  int
}

// ChunkRef names one chunk: component, index within the component, first star index
// within the component and number of stars.
type ChunkRef struct {
	Component int
	Index     int
	First     int64
	N         int
}

// NewPlan resolves a validated scenario. It builds every sampler and model (errors name
// the scenario field), counts the stars of total-mass components by replaying their mass
// streams, and lays out the chunks.
func NewPlan(ctx context.Context, s *Scenario) (*Plan, error) {
	p := &Plan{Scenario: s, Seed: *s.Seed, ChunkSize: s.Output.ChunkSize}
	sv, err := s.surveyPlan()
	if err != nil {
		return nil, err
	}
	p.Survey = sv
	var id int64
	for i := range s.Components {
		c := &s.Components[i]
		path := fmt.Sprintf("components[%d]", i)
		cp := &ComponentPlan{Index: i, Name: c.Name, Kind: c.Kind, FirstID: id}
		spec := imf.Spec{Kind: c.MassFunction.Kind, LoMsun: c.MassFunction.MinMassMsun, HiMsun: c.MassFunction.MaxMassMsun,
			Breaks: c.MassFunction.BreaksMsun, Slopes: c.MassFunction.Slopes, TablePath: s.resolvePath(c.MassFunction.Table)}
		if cp.IMF, err = imf.New(spec); err != nil {
			return nil, s.errf(path+".mass_function", "%v", err)
		}
		if lo, hi := cp.IMF.Bounds(); lo < minEvolveMass || hi > maxEvolveMass {
			return nil, s.errf(path+".mass_function", "mass range %g–%g Msun reaches outside the evolution model's %g–%g Msun; set min_mass_msun/max_mass_msun inside it", lo, hi, minEvolveMass, maxEvolveMass)
		}
		if cp.Ages, err = s.ageSampler(path+".age", c.Age); err != nil {
			return nil, err
		}
		if cp.FeH, err = s.fehSampler(path+".metallicity", c.Metallicity); err != nil {
			return nil, err
		}
		cp.binaries = newBinaryModel(c.Binaries)
		ext, extPath := c.Extinction, path+".extinction"
		if ext == nil {
			ext, extPath = s.Extinction, "extinction"
		}
		if c.Kind == "population" {
			cp.place = newPlacement(c.Geometry)
			if cp.ext, err = sv.extinction(s, extPath, ext); err != nil {
				return nil, err
			}
			switch {
			case c.Stars > 0:
				cp.Stars = c.Stars
			default:
				cp.Stars, cp.RealisedMassMsun = countForMass(ctx, p.Seed, i, p.ChunkSize, cp.IMF, c.TotalMassMsun)
				if err := ctx.Err(); err != nil {
					return nil, err
				}
			}
		} else {
			if cp.field, err = s.newFieldPlan(ctx, p, cp, c); err != nil {
				return nil, err
			}
			cp.ext = cp.field.ext
		}
		cp.nChunks = int((cp.Stars + int64(p.ChunkSize) - 1) / int64(p.ChunkSize))
		for k := 0; k < cp.nChunks; k++ {
			first := int64(k) * int64(p.ChunkSize)
			n := int64(p.ChunkSize)
			if first+n > cp.Stars {
				n = cp.Stars - first
			}
			p.Chunks = append(p.Chunks, ChunkRef{Component: i, Index: k, First: first, N: int(n)})
		}
		id += cp.Stars
		p.Stars += cp.Stars
		p.Components = append(p.Components, cp)
	}
	return p, nil
}

// countForMass finds how many primaries a total-mass component has. It replays the mass
// streams chunk by chunk (the same draws the workers make later) and applies the "stop
// nearest" rule of imf.SampleTotalMass: the star whose mass makes the running sum reach
// the target is kept if that leaves the total closer to the target, and dropped
// otherwise (imf.StopNearest). It returns the count and the realised total initial mass.
func countForMass(ctx context.Context, seed uint64, comp, chunkSize int, f imf.IMF, targetMsun float64) (int64, float64) {
	var n int64
	sum := 0.0
	for k := 0; ; k++ {
		if k%64 == 0 && ctx.Err() != nil {
			return n, sum
		}
		r := newStream(seed, comp, k, streamMass)
		for j := 0; j < chunkSize; j++ {
			m := f.Rand(r)
			keep, stop := imf.StopNearest(sum, m, targetMsun)
			if keep {
				n++
				sum += m
			}
			if stop {
				return n, sum
			}
		}
	}
}

// Shard returns the chunks of shard i of n (0-based): a contiguous run of the plan's
// chunk list, so that the part files of shards 0…n−1, read in order, hold exactly the
// rows of the unsharded run.
func (p *Plan) Shard(i, n int) ([]ChunkRef, error) {
	if n < 1 || i < 0 || i >= n {
		return nil, fmt.Errorf("shard %d/%d is invalid; want i/N with 0 <= i < N", i, n)
	}
	k := len(p.Chunks)
	return p.Chunks[i*k/n : (i+1)*k/n], nil
}

// Workers returns the scenario's worker count, or the number of CPUs when it is 0.
func (p *Plan) Workers() int {
	if w := p.Scenario.Output.Workers; w > 0 {
		return w
	}
	return runtime.NumCPU()
}
