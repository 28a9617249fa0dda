package synth

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/internal/consts"
	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/galaxy"
)

// galacticDefaults fills the population of a Galactic component that the scenario left
// unspecified. The values are broad descriptions of each component, meant as a starting
// point and overridable key by key:
//
//   - mass function: the Galactic-field broken power law of Kroupa, Tout & Gilmore (1993,
//     MNRAS 262, 545; from memory): dN/dm ∝ m^−1.3 on 0.1–0.5 Msun, m^−2.2 on 0.5–1 Msun and
//     m^−2.7 above, to 100 Msun. Above 1 Msun it is steeper than the Kroupa (2001) 2.3 of
//     young clusters (population_values.tsv row kroupa_alpha3: 2.3 ± 0.7); with 2.3 the
//     model had 1.4–1.5 times the Hipparcos counts of stars brighter than V = 4–8, most of
//     the excess in stars above 3 Msun and their descendants;
//   - thin disc: constant star formation over the last 10 Gyr (common practice);
//     [Fe/H] Gaussian −0.1 ± 0.2 dex (solar-neighbourhood dwarfs; from memory, of the order
//     found by Nordström et al. 2004);
//   - thick disc: burst at 11 Gyr ± 1 Gyr; [Fe/H] −0.6 ± 0.3 (Ivezić et al. 2008, from memory);
//   - halo: burst at 12 Gyr ± 0.8 Gyr; [Fe/H] −1.5 ± 0.4 (Ivezić et al. 2008 median −1.46,
//     from memory; the model's floor of −2.3 truncates the metal-poor tail);
//   - bulge: burst at 10 Gyr ± 1.5 Gyr; [Fe/H] −0.1 ± 0.25 (from memory, of the order of
//     Zoccali et al. 2008);
//   - binaries: the multiplicity fractions per primary mass of Duchêne & Kraus (2013, ARA&A
//     51, 269; population_values.tsv rows dk13_*: 22 % below 0.1 Msun, 26 % for 0.1–0.5,
//     44 % for 0.7–1.3, ≥ 50 % for 1.5–5, ≥ 60 % for 8–16, ≥ 80 % above 16 Msun; the 0.5–0.7
//     gap keeps 26 %), mass ratios dN/dq ∝ q^0.3 on 0.1–1 (their solar-type γ).
func galacticDefaults(c *Component) {
	if c.MassFunction.Kind == "" {
		c.MassFunction = MassFunction{Kind: "broken_power_law", MinMassMsun: 0.1, MaxMassMsun: 100,
			BreaksMsun: []float64{0.5, 1}, Slopes: []float64{1.3, 2.2, 2.7}}
	}
	type pop struct {
		age   AgeSpec
		feh   Metallicity
		empty bool
	}
	def := map[string]pop{
		"thin_disc":  {age: AgeSpec{Kind: "constant", MinAgeYr: 0, MaxAgeYr: 10e9}, feh: Metallicity{Kind: "gaussian", FeH: -0.1, SigmaDex: 0.2}},
		"thick_disc": {age: AgeSpec{Kind: "burst", AgeYr: 11e9, SpreadYr: 1e9}, feh: Metallicity{Kind: "gaussian", FeH: -0.6, SigmaDex: 0.3}},
		"halo":       {age: AgeSpec{Kind: "burst", AgeYr: 12e9, SpreadYr: 0.8e9}, feh: Metallicity{Kind: "gaussian", FeH: -1.5, SigmaDex: 0.4}},
		"bulge":      {age: AgeSpec{Kind: "burst", AgeYr: 10e9, SpreadYr: 1.5e9}, feh: Metallicity{Kind: "gaussian", FeH: -0.1, SigmaDex: 0.25}},
	}[c.Kind]
	if c.Age.Kind == "" {
		c.Age = def.age
	}
	if c.Metallicity.Kind == "" && c.Metallicity.FeH == 0 {
		c.Metallicity = def.feh
	}
	if c.Binaries == nil {
		c.Binaries = &Binaries{
			FractionByMass: []MassFraction{{0, 0.22}, {0.1, 0.26}, {0.7, 0.44}, {1.5, 0.50}, {8, 0.60}, {16, 0.80}},
			MassRatio:      MassRatio{Kind: "power_law", Min: 0.1, Max: 1, Gamma: 0.3},
		}
	}
}

// fieldPos locates a field star: the shell it was drawn in, its age slice (see
// fieldSlice), and whether it was drawn in the companion class of the detectability
// bound (see liveBound).
type fieldPos struct {
	shell     int
	slice     int
	companion bool
}

// fieldPlan is a Galactic component resolved along the field's sight lines: the
// expected and drawn number of systems per distance shell, with the detectability bound
// when the scenario skips undetectable systems.
type fieldPlan struct {
	name   string
	model  *galaxy.Model
	area   galaxy.Area
	shells []galaxy.Shell
	// Per shell, summed over slices: expected systems before and after the
	// detectability bound, the lowest initial mass that may be detected, and the drawn
	// count.
	expectedAll []float64
	expected    []float64
	massBound   []float64
	counts      []int64
	// slices are the age slices of the component (one, the whole component, unless the
	// thin disc's scale height depends on age). Stars are laid out shell by shell, and
	// within a shell slice by slice, class 1 before class 2: cum[s*K+k] counts the
	// systems before (shell s, slice k).
	slices  []*fieldSlice
	cum     []int64
	muInner []float64 // distance modulus of each shell's inner edge
	imfLo   float64
	lum     *lumBound
	ext     *extinctionPlan
	dust    *fieldDust
	// meanSystemMsun turns initial mass into systems (primary plus mean companion).
	meanSystemMsun float64
}

// fieldSlice is an age slice of a Galactic component: the component itself with its
// whole age distribution, or — for a thin disc whose scale height grows with age — the
// stars of ages [ageLo, ageHi) placed with their own scale height.
type fieldSlice struct {
	cp           *ComponentPlan // the component, or a copy with the slice's ages
	model        *galaxy.Model  // the density law of the slice
	ageLo, ageHi float64
	heightPc     float64 // thin-disc scale height of the slice, pc (0 without heating)
	// factor multiplies the slice model's shell masses (see heatedFactors); 1 otherwise.
	factor            float64
	initialPerPresent float64
	live              *liveBound
	expectedAll       []float64 // per shell
	counts1, counts2  []int64   // per shell: class 1 and class 2 (all in class 1 without the bound)
}

// ShellInfo is one distance shell of a Galactic component, for forecasts.
type ShellInfo struct {
	InnerPc, OuterPc float64
	// ExpectedSystems is the expected number of systems in the shell; ExpectedSimulated
	// the number drawn on average with the detectability bound (systems with a member
	// that may be detected, plus the companion-class draws later found to belong to the
	// primary class; equal to ExpectedSystems without the bound); Drawn the Poisson
	// number drawn; MassBoundMsun the lowest initial mass of a system member that may be
	// detected in the shell (no primary below it was drawn).
	ExpectedSystems, ExpectedSimulated float64
	Drawn                              int64
	MassBoundMsun                      float64
}

// Shells describes the shells of a Galactic component (nil for other components).
func (cp *ComponentPlan) Shells() []ShellInfo {
	f := cp.field
	if f == nil {
		return nil
	}
	out := make([]ShellInfo, len(f.shells))
	for i, s := range f.shells {
		out[i] = ShellInfo{s.InnerPc, s.OuterPc, f.expectedAll[i], f.expected[i], f.counts[i], f.massBound[i]}
	}
	return out
}

// MayDetect reports whether the detectability bound keeps a system (initial masses m1
// and m2, 0 for none, in Msun; age in yr; raw [Fe/H] in dex) at distance dPc: false means
// the bound would never draw it. Without the bound, or outside the field's shells, it is
// true.
func (cp *ComponentPlan) MayDetect(dPc, m1, m2, ageYr, fehDex float64) bool {
	f := cp.field
	if f == nil || f.slices[0].live == nil {
		return true
	}
	s := sort.Search(len(f.shells), func(i int) bool { return f.shells[i].OuterPc > dPc })
	if s == len(f.shells) {
		return true
	}
	lb := f.slices[f.sliceOf(ageYr)].live
	b := sort.SearchFloat64s(lb.edges, fehDex) - 1
	b = max(0, min(b, len(lb.edges)-2))
	_, fq := quantiseFeH(fehDex)
	if int(lb.level(b, m1, fq, ageYr)) > s {
		return true
	}
	return m2 >= minEvolveMass && int(lb.level(b, m2, fq, ageYr)) > s
}

// sliceOf returns the index of the age slice holding age ageYr.
func (f *fieldPlan) sliceOf(ageYr float64) int {
	for k, sl := range f.slices {
		if ageYr < sl.ageHi {
			return k
		}
	}
	return len(f.slices) - 1
}

// locate returns the position of the component's star with index starIdx.
func (f *fieldPlan) locate(starIdx int64) fieldPos {
	nk := len(f.slices)
	i := sort.Search(len(f.cum)-1, func(i int) bool { return f.cum[i+1] > starIdx })
	s, k := i/nk, i%nk
	return fieldPos{shell: s, slice: k, companion: starIdx-f.cum[i] >= f.slices[k].counts1[s]}
}

// skipFaint reports whether an evolved system (primary s1, companion s2 with their light
// flags) can never be detected in its shell: see lumBound.
func (f *fieldPlan) skipFaint(fp fieldPos, s1, s2 evolve.Star, light1, light2 bool) bool {
	if f.lum == nil {
		return false
	}
	l := 0.0
	if light1 {
		l += s1.LuminosityLsun
	}
	if light2 {
		l += s2.LuminosityLsun
	}
	return f.lum.skip(l, f.muInner[fp.shell])
}

// draw draws a field system: with the detectability bound from the live cells of its
// shell (see liveBound.draw; keep is false for a thinned companion-class draw), else
// like any system (mass from rm; age, [Fe/H] and companion from rs).
func (f *fieldPlan) draw(fp fieldPos, rm, rs *rand.Rand) (m1, m2, ageYr, feh float64, keep bool, err error) {
	sl := f.slices[fp.slice]
	cp := sl.cp
	if sl.live != nil {
		return sl.live.draw(cp, fp.shell, fp.companion, rm, rs)
	}
	m1 = cp.IMF.Rand(rm)
	ageYr = cp.Ages.Age(rs)
	feh = cp.FeH.FeH(rs)
	if cp.binaries != nil {
		m2 = cp.binaries.draw(m1, rs)
	}
	return m1, m2, ageYr, feh, true, nil
}

func (s *Scenario) buildArea() (galaxy.Area, error) {
	a := s.Field.Area
	var (
		area galaxy.Area
		err  error
	)
	switch a.Kind {
	case "cone":
		area, err = galaxy.NewCone(a.LDeg, a.BDeg, a.RadiusDeg)
	case "galactic_box":
		area, err = galaxy.NewRect(galaxy.Galactic, a.LMinDeg, a.LMaxDeg, a.BMinDeg, a.BMaxDeg)
	case "equatorial_box":
		area, err = galaxy.NewRect(galaxy.Equatorial, a.RAMinDeg, a.RAMaxDeg, a.DecMinDeg, a.DecMaxDeg)
	case "healpix":
		scheme := galaxy.Ring
		if a.Nested {
			scheme = galaxy.Nested
		}
		area, err = galaxy.NewPixelList(galaxy.Galactic, int64(a.Nside), scheme, a.Pixels)
	}
	if err != nil {
		return nil, s.errf("field.area", "%v", err)
	}
	return area, nil
}

// fieldShared is what all Galactic components of a plan share.
type fieldShared struct {
	model  *galaxy.Model
	area   galaxy.Area
	shells []galaxy.Shell
	dust   *fieldDust
}

func (s *Scenario) fieldShared(p *Plan) (*fieldShared, error) {
	if p.field != nil {
		return p.field, nil
	}
	area, err := s.buildArea()
	if err != nil {
		return nil, err
	}
	f := s.Field
	shells, err := galaxy.MakeShells(f.MinDistancePc, f.MaxDistancePc, f.Shells, galaxy.LogSpacing)
	if err != nil {
		return nil, s.errf("field", "%v", err)
	}
	model, err := galaxy.NewModel(f.GalaxyParams()) // defaults with field.structure written over them
	if err != nil {
		return nil, s.structureErr(err)
	}
	fd, err := s.newFieldDust(model)
	if err != nil {
		return nil, err
	}
	p.field = &fieldShared{model: model, area: area, shells: shells, dust: fd}
	return p.field, nil
}

// newFieldPlan resolves a Galactic component: the initial-to-present mass factor and mean
// system mass (from the component's IMF, history and binaries), the expected mass per
// shell from the density law, the detectability bound per shell, and Poisson counts
// drawn from the component's plan stream.
func (s *Scenario) newFieldPlan(ctx context.Context, p *Plan, cp *ComponentPlan, c *Component) (*fieldPlan, error) {
	path := fmt.Sprintf("components[%d]", cp.Index)
	sh, err := s.fieldShared(p)
	if err != nil {
		return nil, err
	}
	f := &fieldPlan{name: c.Kind, model: sh.model, area: sh.area, shells: sh.shells, dust: sh.dust}
	f.imfLo, _ = cp.IMF.Bounds()
	law, err := dust.NewLaw(s.Field.Dust.Law, s.Field.Dust.RV)
	if err != nil {
		return nil, s.errf("field.dust.law", "%v", err)
	}
	table, err := p.Survey.bandTable(law)
	if err != nil {
		return nil, s.errf("field.dust", "%v", err)
	}
	spread := 0.0
	if c.Extinction != nil {
		spread = c.Extinction.AVSpreadMag
	}
	f.ext = &extinctionPlan{table: table, spread: spread, ebvPerAV: 1 / law.RV(), field: sh.dust}

	f.meanSystemMsun = cp.IMF.Mean() + meanCompanionMass(cp)
	n := len(f.shells)
	f.muInner = make([]float64, n)
	for i := range f.shells {
		f.muInner[i] = math.Inf(-1)
		if f.shells[i].InnerPc > 0 {
			f.muInner[i] = consts.DistanceModulus(f.shells[i].InnerPc)
		}
	}
	if f.slices, err = s.fieldSlices(p, cp, c, sh.model); err != nil {
		return nil, err
	}
	r := newStream(p.Seed, cp.Index, 1, streamPlan)
	for _, sl := range f.slices {
		if sl.initialPerPresent, err = initialPerPresent(p, sl.cp, r); err != nil {
			return nil, s.errf(path, "%v", err)
		}
	}
	if len(f.slices) > 1 {
		heatedFactors(f.slices, sh.model)
	}
	if *s.Field.SkipUndetectable {
		f.lum = newLumBound(p.Survey)
	}
	for _, sl := range f.slices {
		if err := sl.model.SetInitialMassPerPresentMass(c.Kind, sl.initialPerPresent); err != nil {
			return nil, s.errf(path+".kind", "%v", err)
		}
		masses, err := sl.model.ShellMasses(f.area, f.shells, []string{c.Kind}, galaxy.IntegrationOptions{})
		if err != nil {
			return nil, s.errf("field", "%v", err)
		}
		sl.expectedAll = make([]float64, n)
		for i, sm := range masses {
			sl.expectedAll[i] = sm.InitialMassMsun * c.DensityScale * sl.factor / f.meanSystemMsun
		}
		if *s.Field.SkipUndetectable {
			if sl.live, err = newLiveBound(p, sl.cp, f.muInner); err != nil {
				return nil, s.errf(path, "%v", err)
			}
		}
		sl.counts1, sl.counts2 = make([]int64, n), make([]int64, n)
		if err := ctx.Err(); err != nil {
			return nil, err
		}
	}
	f.expectedAll = make([]float64, n)
	f.expected = make([]float64, n)
	f.massBound = make([]float64, n)
	f.counts = make([]int64, n)
	nk := len(f.slices)
	f.cum = make([]int64, n*nk+1)
	pr := newStream(p.Seed, cp.Index, 0, streamPlan)
	for i := 0; i < n; i++ {
		f.massBound[i] = math.Inf(1)
		for k, sl := range f.slices {
			e1, e2 := sl.expectedAll[i], 0.0
			mb := f.imfLo
			if sl.live != nil {
				e1 = sl.expectedAll[i] * sl.live.prim.weight(i)
				e2 = sl.expectedAll[i] * sl.live.comp.weight(i)
				mb = math.Max(f.imfLo, sl.live.massLow[i])
			}
			k1, err := galaxy.PoissonCount(e1, pr)
			if err != nil {
				return nil, s.errf("field", "%v", err)
			}
			k2 := int64(0)
			if sl.live != nil {
				if k2, err = galaxy.PoissonCount(e2, pr); err != nil {
					return nil, s.errf("field", "%v", err)
				}
			}
			sl.counts1[i], sl.counts2[i] = k1, k2
			f.expectedAll[i] += sl.expectedAll[i]
			f.expected[i] += e1 + e2
			f.counts[i] += k1 + k2
			f.massBound[i] = math.Min(f.massBound[i], mb)
			f.cum[i*nk+k+1] = f.cum[i*nk+k] + k1 + k2
		}
		if err := ctx.Err(); err != nil {
			return nil, err
		}
	}
	cp.Stars = f.cum[n*nk]
	return f, nil
}

// meanCompanionMass returns E[m2] per primary in Msun: the binary fraction times the mean
// mass ratio times the primary mass, integrated over the IMF:
//
//	E[m2] = E[q] Σ_r f_r ⟨m⟩ MassFraction(m_r, m_{r+1})
//
// with E[q] = (γ+1)/(γ+2) (q_max^{γ+2} − q_min^{γ+2}) / (q_max^{γ+1} − q_min^{γ+1}).
func meanCompanionMass(cp *ComponentPlan) float64 {
	b := cp.binaries
	if b == nil {
		return 0
	}
	g := b.gamma
	var eq float64
	switch {
	case math.Abs(g+1) < 1e-12:
		eq = (b.qMax - b.qMin) / math.Log(b.qMax/b.qMin)
	case math.Abs(g+2) < 1e-12:
		eq = math.Log(b.qMax/b.qMin) / (1/b.qMin - 1/b.qMax)
	default:
		eq = (g + 1) / (g + 2) * (math.Pow(b.qMax, g+2) - math.Pow(b.qMin, g+2)) / (math.Pow(b.qMax, g+1) - math.Pow(b.qMin, g+1))
	}
	lo, hi := cp.IMF.Bounds()
	mean := cp.IMF.Mean()
	if len(b.byMass) == 0 {
		return b.fraction * eq * mean
	}
	sum := 0.0
	for i, row := range b.byMass {
		a := math.Max(lo, row.AboveMassMsun)
		z := hi
		if i+1 < len(b.byMass) {
			z = math.Min(hi, b.byMass[i+1].AboveMassMsun)
		}
		if z > a {
			sum += row.Fraction * mean * cp.IMF.MassFraction(a, z)
		}
	}
	return eq * sum
}

// Area returns the field's sky area, or nil when the plan has no Galactic component.
func (p *Plan) Area() galaxy.Area {
	if p.field == nil {
		return nil
	}
	return p.field.area
}
