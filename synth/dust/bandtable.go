package dust

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"github.com/starmock/starmock/internal/consts"
)

// Grid of BandTable: blackbody temperatures TableMinTeffK–TableMaxTeffK
// (uniform in log10 Teff, TableTeffNodes nodes) and A_V 0–TableMaxAVMag
// (uniform, step TableAVStepMag). The spacing was chosen from the measured
// bilinear interpolation error (TestBandTableInterpolationError): with these
// values the largest error over the 16 standard bands (Bessell UBVRI, 2MASS
// JHKs, SDSS ugriz, Gaia G/BP/RP) is 4.2e-4 in A_X/A_V, reached in SDSS u for
// the coolest stars (its red leak near 7700 Å makes the coefficient vary fast
// with Teff); all other bands stay below 2.7e-4 and most below 1e-5. The range
// 1000–300000 K covers old cool white dwarfs and hot young ones, which the
// pipeline meets in every old population (the exact path costs ~1 ms a star).
const (
	TableMinTeffK  = 1000.0
	TableMaxTeffK  = 300000.0
	TableMaxAVMag  = 20.0
	TableTeffNodes = 293
	TableAVStepMag = 0.25
)

// BandTable is the fast path for per-star band coefficients: A_X/A_V of each
// band for a blackbody of temperature Teff behind A_V of one law, tabulated
// on a (log10 Teff, A_V) grid and interpolated bilinearly. It is immutable
// after construction and safe for concurrent use.
type BandTable struct {
	law    Law
	nb     int
	plans  []*bandPlan // nil entry: band given by its pivot wavelength only
	fixed  []float64   // A(λ_pivot)/A_V for pivot-only bands
	logT0  float64
	dlogT  float64
	nT, nA int
	tab    []float64 // [iT][iA][band]
}

// NewBandTable builds the table for law and the bands pbs. A band whose
// Passband has no points (nil WavelengthAA) is represented by its pivot
// wavelength pivotsAA[i] (Å) through PivotRatio, a constant in Teff and A_V;
// pivotsAA may be nil when every band has a curve, otherwise it must have
// len(pbs) entries (entries for bands with a curve are ignored).
//
// Errors: a malformed passband (ErrPassband), a curve with throughput outside
// the law's range or a pivot outside it (ErrWavelengthRange), a pivot-only
// band without a pivot. Panics if pivotsAA is neither nil nor len(pbs) long
// (a programming error). Building takes about 0.2–0.4 s for the 16 standard
// bands on a 2-core machine (spread over GOMAXPROCS goroutines) and 130 kB
// per band.
func NewBandTable(law Law, pbs []Passband, pivotsAA []float64) (*BandTable, error) {
	if pivotsAA != nil && len(pivotsAA) != len(pbs) {
		panic(fmt.Sprintf("dust: NewBandTable: %d pivots for %d passbands", len(pivotsAA), len(pbs)))
	}
	nb := len(pbs)
	t := &BandTable{law: law, nb: nb, plans: make([]*bandPlan, nb), fixed: make([]float64, nb),
		nT: TableTeffNodes, nA: int(math.Round(TableMaxAVMag/TableAVStepMag)) + 1,
		logT0: math.Log10(TableMinTeffK)}
	t.dlogT = (math.Log10(TableMaxTeffK) - t.logT0) / float64(t.nT-1)
	for i, pb := range pbs {
		if len(pb.WavelengthAA) == 0 && len(pb.Throughput) == 0 {
			if pivotsAA == nil || !(pivotsAA[i] > 0) {
				return nil, fmt.Errorf("dust: band %d has neither a passband curve nor a positive pivot wavelength", i)
			}
			r, err := PivotRatio(law, pivotsAA[i])
			if err != nil {
				return nil, fmt.Errorf("dust: band %d pivot: %w", i, err)
			}
			t.fixed[i] = r
			continue
		}
		p, err := newBandPlan(law, pb)
		if err != nil {
			return nil, fmt.Errorf("band %d: %w", i, err)
		}
		t.plans[i] = p
	}
	t.tab = make([]float64, t.nT*t.nA*nb)
	// bands are independent: fill them on up to GOMAXPROCS goroutines (each
	// writes only its own band's entries, so the result does not depend on it)
	var wg sync.WaitGroup
	next := make(chan int, nb)
	for b := 0; b < nb; b++ {
		next <- b
	}
	close(next)
	for w := 0; w < min(runtime.GOMAXPROCS(0), nb); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for b := range next {
				t.fill(b, make([]float64, t.nT*t.nA))
			}
		}()
	}
	wg.Wait()
	return t, nil
}

// fill tabulates band b over the whole grid into buf ([iT][iA]) and then
// copies it into the interleaved table (so concurrent fills do not write to
// shared cache lines in the hot loop). Along A_V the extinction factor is
// advanced by multiplication, 10^(−0.4 a (A+ΔA)) = 10^(−0.4 a A)·10^(−0.4 a ΔA).
func (t *BandTable) fill(b int, buf []float64) {
	defer func() {
		for k, v := range buf {
			t.tab[k*t.nb+b] = v
		}
	}()
	p := t.plans[b]
	if p == nil {
		for k := range buf {
			buf[k] = t.fixed[b]
		}
		return
	}
	n := len(p.lamAA)
	wf := make([]float64, n)
	ext := make([]float64, n)
	step := make([]float64, n)
	for k := range step {
		step[k] = math.Exp(-ln10Over25 * TableAVStepMag * p.a[k])
	}
	for iT := 0; iT < t.nT; iT++ {
		teff := math.Pow(10, t.logT0+float64(iT)*t.dlogT)
		var den, mean float64
		for k := range wf {
			wf[k] = p.wt[k] * consts.PlanckLambda(p.lamAA[k]*1e-10, teff)
			den += wf[k]
			mean += wf[k] * p.a[k]
			ext[k] = 1
		}
		base := iT * t.nA
		buf[base] = mean / den // A_V → 0 limit
		for iA := 1; iA < t.nA; iA++ {
			s := 0.0
			for k := range wf {
				ext[k] *= step[k]
				s += wf[k] * (ext[k] - 1)
			}
			av := float64(iA) * TableAVStepMag
			buf[base+iA] = -math.Log1p(s/den) / ln10Over25 / av
		}
	}
}

// NumBands returns the number of bands (the length Ratios needs in dst).
func (t *BandTable) NumBands() int { return t.nb }

// Law returns the extinction law the table was built for.
func (t *BandTable) Law() Law { return t.law }

// InTable reports whether (teffK, avMag) lies inside the tabulated grid
// TableMinTeffK ≤ Teff ≤ TableMaxTeffK, 0 ≤ A_V ≤ TableMaxAVMag, where
// Ratios interpolates; outside it Ratios computes exact values (slowly).
func (t *BandTable) InTable(teffK, avMag float64) bool {
	return teffK >= TableMinTeffK && teffK <= TableMaxTeffK && avMag >= 0 && avMag <= TableMaxAVMag
}

// Ratios writes A_X/A_V for every band into dst[:NumBands()] for a blackbody of
// temperature teffK (K) behind avMag (mag) of extinction, by bilinear
// interpolation in (log10 Teff, A_V) of the table. No allocation.
//
// Outside the grid (see InTable) nothing is clamped or extrapolated: it
// computes the exact synthetic-photometry value for the blackbody (RatiosExact),
// also allocation-free but about 1 ms per star for the 16 standard bands
// (10567 quadrature nodes), so callers with many such stars should count them
// with InTable. Pivot-only bands
// are constant. A result is NaN only where the blackbody flux underflows over a
// whole band (Teff below roughly 70 K for optical bands).
//
// Panics (caller bugs) if len(dst) < NumBands(), teffK is not finite and
// positive, or avMag is negative, NaN or infinite.
func (t *BandTable) Ratios(teffK, avMag float64, dst []float64) {
	t.check(teffK, avMag, dst)
	if !t.InTable(teffK, avMag) {
		t.exact(teffK, avMag, dst)
		return
	}
	u := (math.Log10(teffK) - t.logT0) / t.dlogT
	i := int(u)
	if i > t.nT-2 {
		i = t.nT - 2
	}
	fu := u - float64(i)
	v := avMag / TableAVStepMag
	j := int(v)
	if j > t.nA-2 {
		j = t.nA - 2
	}
	fv := v - float64(j)
	nb := t.nb
	r00 := t.tab[(i*t.nA+j)*nb : (i*t.nA+j)*nb+nb]
	r01 := t.tab[(i*t.nA+j+1)*nb : (i*t.nA+j+1)*nb+nb]
	r10 := t.tab[((i+1)*t.nA+j)*nb : ((i+1)*t.nA+j)*nb+nb]
	r11 := t.tab[((i+1)*t.nA+j+1)*nb : ((i+1)*t.nA+j+1)*nb+nb]
	w00, w01, w10, w11 := (1-fu)*(1-fv), (1-fu)*fv, fu*(1-fv), fu*fv
	dst = dst[:nb]
	for b := range dst {
		dst[b] = w00*r00[b] + w01*r01[b] + w10*r10[b] + w11*r11[b]
	}
}

// RatiosExact writes the exact A_X/A_V (BandRatio of a blackbody of
// temperature teffK) for every band into dst, without the table; the
// reference the table is tested against. No allocation; same panics as Ratios.
func (t *BandTable) RatiosExact(teffK, avMag float64, dst []float64) {
	t.check(teffK, avMag, dst)
	t.exact(teffK, avMag, dst)
}

func (t *BandTable) check(teffK, avMag float64, dst []float64) {
	if len(dst) < t.nb {
		panic(fmt.Sprintf("dust: BandTable.Ratios: dst has %d entries, need %d", len(dst), t.nb))
	}
	if !(teffK > 0) || math.IsInf(teffK, 1) {
		panic(fmt.Sprintf("dust: BandTable.Ratios: teffK %g K must be finite and > 0", teffK))
	}
	if !(avMag >= 0) || math.IsInf(avMag, 1) {
		panic(fmt.Sprintf("dust: BandTable.Ratios: avMag %g mag must be finite and >= 0", avMag))
	}
}

func (t *BandTable) exact(teffK, avMag float64, dst []float64) {
	for b, p := range t.plans {
		if p == nil {
			dst[b] = t.fixed[b]
			continue
		}
		dst[b] = p.ratio(func(k int) float64 { return consts.PlanckLambda(p.lamAA[k]*1e-10, teffK) }, avMag)
	}
}
