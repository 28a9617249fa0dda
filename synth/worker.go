package synth

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"sync"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/internal/consts"
	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth/galaxy"
	"github.com/starmock/starmock/synth/phot"
)

// Evolution model range used by the plan (package evolve's documented limits).
const (
	minEvolveMass = evolve.MinMassMsun
	maxEvolveMass = evolve.MaxMassMsun
)

// Columns returns the full catalogue schema of the plan, in output order.
func (p *Plan) Columns() []output.Column {
	names := make([]string, len(p.Survey.Bands))
	for i, b := range p.Survey.Bands {
		names[i] = b.Name
	}
	return catalogueColumns(names)
}

// worker owns everything one goroutine needs to turn chunks into batches: a cache of
// evolution models per rounded [Fe/H], and per-band scratch slices. Nothing in it is
// shared, so workers never lock.
type worker struct {
	plan     *Plan
	models   map[int]*evolve.Model
	samplers map[[3]int]*galaxy.ShellSampler // (component, shell, age slice)
	nb       int
	absP     []float64
	absC     []float64
	ratP     []float64
	ratC     []float64
	det      []bool
}

func newWorker(p *Plan) *worker {
	nb := len(p.Survey.Bands)
	return &worker{plan: p, models: map[int]*evolve.Model{}, nb: nb,
		samplers: map[[3]int]*galaxy.ShellSampler{},
		absP:     make([]float64, nb), absC: make([]float64, nb), ratP: make([]float64, nb),
		ratC: make([]float64, nb), det: make([]bool, nb)}
}

func (w *worker) model(key int, feh float64) (*evolve.Model, error) {
	if m, ok := w.models[key]; ok {
		return m, nil
	}
	m, err := w.plan.model(key, feh)
	if err != nil {
		return nil, err
	}
	w.models[key] = m
	return m, nil
}

// Column positions of the fixed part of the schema (see catalogueColumns).
const (
	cStarID = iota
	cComponent
	cStage
	cMassInit
	cMass
	cAge
	cFeH
	cLum
	cTeff
	cRadius
	cLogg
	cCore
	cSpType
	cLumClass
	cPhotQ
	cRA
	cDec
	cL
	cB
	cEast
	cNorth
	cDepth
	cDist
	cDM
	cAV
	cEBV
	cBinary
	cCompMassInit
	cCompMass
	cCompStage
	cCompLum
	cCompTeff
	cDomStage
	nFixedCols
	perBandCols = 8
)

// fill computes the stars of one chunk into b (allocated by NewBatch for the plan's
// columns with capacity ≥ the chunk size). The draws of chunk (component c, index k) come
// from the streams (seed, c, k, mass) and (seed, c, k, stars) only, in a fixed order per
// star: mass; then age, [Fe/H], binary (two uniforms), position, A_V spread, and two per
// band for the observation. In Galactic fields with the detectability bound the mass
// stream instead carries the proposal of liveBound.draw (cell, [Fe/H], masses, thinning,
// age; the companion of a class-1 system from the star stream); a proposal thinned away,
// or a system found too faint after its evolution (luminosity test), gets no row, and the
// remaining draws of the streams go to the next star.
func (w *worker) fill(ch ChunkRef, b *output.Batch) error {
	p := w.plan
	cp := p.Components[ch.Component]
	rm := newStream(p.Seed, ch.Component, ch.Index, streamMass)
	rs := newStream(p.Seed, ch.Component, ch.Index, streamStars)
	sp := p.Survey
	ids := b.Cols[cStarID].([]int64)
	comp := b.Cols[cComponent].([]string)
	stage := b.Cols[cStage].([]string)
	f32 := func(i int) []float32 { return b.Cols[i].([]float32) }
	f64 := func(i int) []float64 { return b.Cols[i].([]float64) }
	vld := func(i int) []bool { return b.Valid[i] }
	massInit, mass, age, feh, lum, teff, rad, logg, core := f32(cMassInit), f32(cMass), f32(cAge), f32(cFeH), f32(cLum), f32(cTeff), f32(cRadius), f32(cLogg), f32(cCore)
	spt, lcl, photq := b.Cols[cSpType].([]string), b.Cols[cLumClass].([]string), b.Cols[cPhotQ].([]string)
	ra, dec, gl, gb := f64(cRA), f64(cDec), f64(cL), f64(cB)
	east, north, depth, dist, dm, av, ebv := f32(cEast), f32(cNorth), f32(cDepth), f32(cDist), f32(cDM), f32(cAV), f32(cEBV)
	isBin := b.Cols[cBinary].([]bool)
	cmi, cm, cst, clum, cteff := f32(cCompMassInit), f32(cCompMass), b.Cols[cCompStage].([]string), f32(cCompLum), f32(cCompTeff)
	detAll := b.Cols[nFixedCols+perBandCols*w.nb].([]bool)
	dom := b.Cols[cDomStage].([]string)

	j := 0 // output row; stars that cannot be detected (Galactic fields) get none
	for si := 0; si < ch.N; si++ {
		starIdx := ch.First + int64(si)

		// Mass, age, metallicity, companion.
		var m1, m2, a, rawFeH float64
		var fp fieldPos
		if cp.field != nil {
			fp = cp.field.locate(starIdx)
			var keep bool
			var err error
			if m1, m2, a, rawFeH, keep, err = cp.field.draw(fp, rm, rs); err != nil {
				return fmt.Errorf("component %s: %w", cp.Name, err)
			}
			if !keep {
				continue
			}
		} else {
			m1 = cp.IMF.Rand(rm)
			a = cp.Ages.Age(rs)
			rawFeH = cp.FeH.FeH(rs)
			if cp.binaries != nil {
				m2 = cp.binaries.draw(m1, rs)
			}
		}
		key, fq := quantiseFeH(rawFeH)
		model, err := w.model(key, fq)
		if err != nil {
			return fmt.Errorf("component %s: %w", cp.Name, err)
		}

		// Evolution of both members.
		s1, err := model.Evolve(m1, a)
		if err != nil {
			return fmt.Errorf("component %s, star %d: %w", cp.Name, cp.FirstID+starIdx, err)
		}
		var s2 evolve.Star
		evolved2 := m2 >= minEvolveMass
		if evolved2 {
			if s2, err = model.Evolve(m2, a); err != nil {
				return fmt.Errorf("component %s, star %d companion: %w", cp.Name, cp.FirstID+starIdx, err)
			}
		}
		light1, light2 := hasLight(s1), evolved2 && hasLight(s2)
		if cp.field != nil && cp.field.skipFaint(fp, s1, s2, light1, light2) {
			continue
		}
		ids[j] = cp.FirstID + starIdx
		comp[j] = cp.Name

		// Position.
		var d, avBase float64
		if cp.place != nil {
			e, n, z, r, dd, dpc := cp.place.place(rs)
			east[j], north[j], depth[j] = float32(e), float32(n), float32(z)
			vld(cEast)[j], vld(cNorth)[j], vld(cDepth)[j] = true, true, true
			ra[j], dec[j] = r, dd
			gl[j], gb[j] = galaxy.ICRSToGalactic(r, dd)
			d = dpc
			avBase = cp.ext.avMag
		} else {
			l, bb, dpc, err := w.fieldPosition(ch.Component, fp.shell, fp.slice, rs)
			if err != nil {
				return fmt.Errorf("component %s: %w", cp.Name, err)
			}
			gl[j], gb[j] = l, bb
			ra[j], dec[j] = galaxy.GalacticToICRS(l, bb)
			vld(cEast)[j], vld(cNorth)[j], vld(cDepth)[j] = false, false, false
			east[j], north[j], depth[j] = 0, 0, 0 // null: keep the bytes under nulls deterministic
			d = dpc
			avBase = cp.ext.field.av(l, bb, d)
		}
		mu := consts.DistanceModulus(d)
		avj := cp.ext.drawAV(avBase, rs)
		dist[j], dm[j], av[j], ebv[j] = float32(d), float32(mu), float32(avj), float32(avj*cp.ext.ebvPerAV)

		// The primary.
		stage[j] = s1.Stage.String()
		massInit[j], mass[j], age[j], feh[j] = float32(m1), float32(s1.MassMsun), float32(a), float32(fq)
		lum[j], teff[j], rad[j], logg[j], core[j] = float32(s1.LuminosityLsun), float32(s1.TeffK), float32(s1.RadiusRsun), float32(s1.LoggCgs), float32(s1.CoreMassMsun)
		for _, c := range []int{cLum, cTeff, cRadius, cLogg} {
			vld(c)[j] = light1
		}
		q := w.photometry(s1, fq, avj, cp.ext, w.absP, w.ratP)
		photq[j] = q
		if light1 {
			spt[j] = phot.SpectralType(s1.TeffK)
			lcl[j] = phot.LuminosityClass(s1.LoggCgs, s1.LuminosityLsun, s1.TeffK)
			if s1.Stage.IsWhiteDwarf() {
				lcl[j] = "D"
			}
		} else {
			spt[j], lcl[j] = "", ""
		}
		vld(cSpType)[j] = spt[j] != ""
		vld(cLumClass)[j] = lcl[j] != ""

		// Companion.
		isBin[j] = m2 > 0
		cv := m2 > 0
		for _, c := range []int{cCompMassInit, cCompMass, cCompLum, cCompTeff} {
			vld(c)[j] = false
		}
		vld(cCompMassInit)[j] = cv
		cmi[j], cm[j], clum[j], cteff[j] = 0, 0, 0, 0 // values under nulls are written by some formats
		cst[j] = ""
		dom[j] = stage[j]
		if cv {
			cmi[j] = float32(m2)
			if evolved2 {
				cm[j], cst[j], clum[j], cteff[j] = float32(s2.MassMsun), s2.Stage.String(), float32(s2.LuminosityLsun), float32(s2.TeffK)
				vld(cCompMass)[j] = true
				vld(cCompLum)[j], vld(cCompTeff)[j] = light2, light2
				if light2 {
					w.photometry(s2, fq, avj, cp.ext, w.absC, w.ratC)
				}
				if light2 && (!light1 || s2.LuminosityLsun > s1.LuminosityLsun) {
					dom[j] = cst[j]
				}
			}
		}
		vld(cCompStage)[j] = cst[j] != ""

		// Bands: combine the light, then observe.
		for k := 0; k < w.nb; k++ {
			base := nFixedCols + perBandCols*k
			absCol, appCol := f32(base), f32(base+1)
			app := math.Inf(1) // no light
			if light1 && !math.IsNaN(w.absP[k]) {
				app = w.absP[k] + mu + avj*w.ratP[k]
			}
			if light2 && !math.IsNaN(w.absC[k]) {
				app = combineMags(app, w.absC[k]+mu+avj*w.ratC[k])
			}
			absCol[j] = float32(w.absP[k])
			vld(base)[j] = light1 && !math.IsNaN(w.absP[k])
			appCol[j] = float32(app)
			vld(base + 1)[j] = !math.IsInf(app, 1)
			meas := sp.Specs[k].Observe(app, rs)
			f32(base + 2)[j] = float32(meas.Mag)
			vld(base + 2)[j] = !math.IsNaN(meas.Mag)
			f32(base + 3)[j] = float32(meas.MagErr)
			vld(base + 3)[j] = !math.IsNaN(meas.MagErr)
			f32(base + 4)[j] = float32(meas.Flux)
			vld(base + 4)[j] = true
			f32(base + 5)[j] = float32(meas.FluxErr)
			vld(base + 5)[j] = true
			b.Cols[base+6].([]bool)[j] = meas.Detected
			b.Cols[base+7].([]bool)[j] = meas.Saturated
			w.det[k] = meas.Detected
		}
		detAll[j] = sp.Detection.Passes(w.det)
		j++
	}
	b.N = j
	return nil
}

// fieldPosition draws a field star's direction and distance inside its shell, with
// density-weighted rejection sampling (package galaxy); the sampler of each shell is
// built once per plan and cached in the worker.
func (w *worker) fieldPosition(comp, shell, slice int, r *rand.Rand) (l, b, d float64, err error) {
	key := [3]int{comp, shell, slice}
	s, ok := w.samplers[key]
	if !ok {
		if s, err = w.plan.sampler(comp, shell, slice); err != nil {
			return 0, 0, 0, err
		}
		w.samplers[key] = s
	}
	return s.Sample(r)
}

// hasLight reports whether a star radiates in the optical: everything but neutron stars,
// black holes and massless remnants.
func hasLight(s evolve.Star) bool {
	return s.LuminosityLsun > 0 && s.TeffK > 0 && s.Stage != evolve.NeutronStar && s.Stage != evolve.BlackHole && s.Stage != evolve.NoRemnant
}

// photometry fills abs (absolute magnitudes) and rat (A_X/A_V) for one star and returns
// the quality word of its bolometric corrections.
func (w *worker) photometry(s evolve.Star, feh, avMag float64, e *extinctionPlan, abs, rat []float64) string {
	if !hasLight(s) {
		for k := range abs {
			abs[k], rat[k] = math.NaN(), 0
		}
		return "no_light"
	}
	q := w.plan.Survey.Photo.AbsMags(s.TeffK, s.LoggCgs, feh, s.LuminosityLsun, abs)
	e.table.Ratios(s.TeffK, avMag, rat)
	return q.String()
}

// combineMags adds the fluxes of two magnitudes: −2.5 log10(10^(−0.4 a) + 10^(−0.4 b)).
func combineMags(a, b float64) float64 {
	switch {
	case math.IsInf(a, 1):
		return b
	case math.IsInf(b, 1):
		return a
	}
	lo := math.Min(a, b)
	return lo - 2.5*math.Log10(1+math.Pow(10, -0.4*math.Abs(a-b)))
}

// Result is one finished chunk, handed to the sink in chunk order.
type Result struct {
	Chunk ChunkRef
	Batch *output.Batch
}

// Run simulates the given chunks of the plan with the given number of workers and hands
// each finished batch to sink in chunk order, one at a time, from a single goroutine.
// Memory is bounded: at most BatchesInFlight(workers) batches of ChunkSize rows exist at
// once. The batch passed to sink is reused after sink returns. Results never depend on
// workers.
//
// Up to 2×workers chunks may run ahead of the one the writer waits for, so that workers
// keep busy when chunk costs vary (near and far shells of a Galactic field differ by
// orders of magnitude). At most 2×workers+1 chunks are outstanding (dispatched and not yet
// handed to sink), each holding at most one batch, so a worker never waits for a batch
// that only a later chunk could free.
func (p *Plan) Run(ctx context.Context, chunks []ChunkRef, workers int, sink func(Result) error) error {
	if workers < 1 {
		workers = 1
	}
	cols := p.Columns()
	ahead := 2 * workers
	nBuf := BatchesInFlight(workers)
	free := make(chan *output.Batch, nBuf)
	for i := 0; i < nBuf; i++ {
		free <- output.NewBatch(cols, p.ChunkSize)
	}
	type job struct {
		ch  ChunkRef
		out chan result
	}
	jobs := make(chan job)
	order := make(chan chan result, ahead)
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()

	go func() { // dispatcher: keeps chunk order in the order channel
		defer close(order)
		defer close(jobs)
		for _, ch := range chunks {
			out := make(chan result, 1)
			select {
			case order <- out:
			case <-ctx.Done():
				return
			}
			select {
			case jobs <- job{ch, out}:
			case <-ctx.Done():
				out <- result{err: ctx.Err()} // the writer waits on every queued chunk
				return
			}
		}
	}()
	var wg sync.WaitGroup
	for i := 0; i < workers; i++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := newWorker(p)
			for j := range jobs {
				var b *output.Batch
				select {
				case b = <-free:
				case <-ctx.Done():
					j.out <- result{err: ctx.Err()}
					continue
				}
				err := w.fill(j.ch, b)
				j.out <- result{Result{j.ch, b}, err}
			}
		}()
	}
	var firstErr error
	for out := range order {
		r := <-out
		if firstErr == nil {
			if r.err != nil {
				firstErr = r.err
			} else if err := ctx.Err(); err != nil {
				firstErr = err
			} else if err := sink(r.Result); err != nil {
				firstErr = err
			}
			if firstErr != nil {
				cancel()
			}
		}
		if r.Batch != nil {
			free <- r.Batch
		}
	}
	wg.Wait()
	return firstErr
}

// BatchesInFlight is the number of chunk batches Run keeps for a worker count: the
// look-ahead of 2×workers chunks plus the one being written plus one spare.
func BatchesInFlight(workers int) int { return 2*max(workers, 1) + 2 }

type result struct {
	Result
	err error
}
