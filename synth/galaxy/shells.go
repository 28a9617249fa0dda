package galaxy

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Spacing is how MakeShells divides a distance range.
type Spacing uint8

const (
	// LinearSpacing makes shells of equal width in distance.
	LinearSpacing Spacing = iota + 1
	// LogSpacing makes shells of equal width in log distance (equal distance-modulus steps),
	// the natural choice for magnitude-limited samples.
	LogSpacing
)

// String returns "linear" or "log".
func (s Spacing) String() string {
	if s == LogSpacing {
		return "log"
	}
	return "linear"
}

// ParseSpacing accepts "linear" or "log".
func ParseSpacing(word string) (Spacing, error) {
	switch word {
	case "linear":
		return LinearSpacing, nil
	case "log":
		return LogSpacing, nil
	}
	return 0, fmt.Errorf("galaxy: shell spacing %q is not one of linear, log", word)
}

// Shell is the range of heliocentric distance InnerPc ≤ d < OuterPc (pc).
type Shell struct {
	InnerPc, OuterPc float64
}

// VolumePerSrPc3 returns the shell's volume per steradian, (d2³ − d1³)/3, pc³ sr⁻¹.
func (s Shell) VolumePerSrPc3() float64 {
	return (s.OuterPc*s.OuterPc*s.OuterPc - s.InnerPc*s.InnerPc*s.InnerPc) / 3
}

// MaxDistancePc is the largest distance accepted for shells, 1 Mpc.
const MaxDistancePc = 1e6

// MakeShells divides [dMinPc, dMaxPc] into n shells (n in [1, 100000]). Linear spacing
// needs 0 ≤ dMin < dMax ≤ 1e6 pc; log spacing needs 0 < dMin < dMax ≤ 1e6 pc and puts the
// edges at dMin (dMax/dMin)^(i/n). The outermost edge is exactly dMaxPc.
func MakeShells(dMinPc, dMaxPc float64, n int, spacing Spacing) ([]Shell, error) {
	if n < 1 || n > 100000 {
		return nil, fmt.Errorf("galaxy: shell count %d is outside the allowed range [1, 100000]: %w", n, ErrOutOfRange)
	}
	if !(dMaxPc > 0 && dMaxPc <= MaxDistancePc) {
		return nil, rangeErr("shells d_max_pc", dMaxPc, "pc", "(0, 1e6]")
	}
	if !(dMinPc >= 0 && dMinPc < dMaxPc) {
		return nil, rangeErr("shells d_min_pc", dMinPc, "pc", fmt.Sprintf("[0, d_max_pc = %g)", dMaxPc))
	}
	out := make([]Shell, n)
	switch spacing {
	case LinearSpacing:
		w := (dMaxPc - dMinPc) / float64(n)
		for i := range out {
			out[i] = Shell{dMinPc + float64(i)*w, dMinPc + float64(i+1)*w}
		}
	case LogSpacing:
		if dMinPc == 0 {
			return nil, rangeErr("shells d_min_pc", dMinPc, "pc", fmt.Sprintf("(0, d_max_pc = %g) for log spacing", dMaxPc))
		}
		lr := math.Log(dMaxPc / dMinPc)
		for i := range out {
			out[i] = Shell{dMinPc * math.Exp(lr*float64(i)/float64(n)), dMinPc * math.Exp(lr*float64(i+1)/float64(n))}
		}
	default:
		return nil, fmt.Errorf("galaxy: shell spacing %d is not linear or log", spacing)
	}
	out[n-1].OuterPc = dMaxPc
	return out, nil
}

// IntegrationOptions set the quadrature of ShellMasses. Zero fields take the defaults.
type IntegrationOptions struct {
	// AngularOrder is passed to Area.QuadratureDirections. Default 8.
	AngularOrder int
	// RadialNodes is the number of Gauss–Legendre nodes per radial sub-interval. Default 8.
	RadialNodes int
	// StepPc and RelStep bound the sub-interval length to max(StepPc, RelStep·d) at
	// distance d. Defaults 200 pc (below the 300 pc thin-disc scale height) and 0.05.
	StepPc, RelStep float64
}

func (o IntegrationOptions) withDefaults() IntegrationOptions {
	if o.AngularOrder == 0 {
		o.AngularOrder = 8
	}
	if o.RadialNodes == 0 {
		o.RadialNodes = 8
	}
	if o.StepPc == 0 {
		o.StepPc = 200
	}
	if o.RelStep == 0 {
		o.RelStep = 0.05
	}
	return o
}

func (o IntegrationOptions) validate() error {
	if o.AngularOrder < 1 || o.AngularOrder > 256 {
		return fmt.Errorf("galaxy: angular_order %d is outside the allowed range [1, 256]: %w", o.AngularOrder, ErrOutOfRange)
	}
	if o.RadialNodes < 1 || o.RadialNodes > 64 {
		return fmt.Errorf("galaxy: radial_nodes %d is outside the allowed range [1, 64]: %w", o.RadialNodes, ErrOutOfRange)
	}
	if !(o.StepPc >= 1 && o.StepPc <= 1e5) {
		return rangeErr("step_pc", o.StepPc, "pc", "[1, 1e5]")
	}
	if !(o.RelStep > 0 && o.RelStep <= 1) {
		return rangeErr("rel_step", o.RelStep, "-", "(0, 1]")
	}
	return nil
}

// sightDir is a quadrature direction with its heliocentric unit vector.
type sightDir struct {
	ux, uy, uz, w float64
}

// ShellMass is the expected stellar mass of one component in one shell of an area.
type ShellMass struct {
	Shell     Shell
	Component string
	// PresentMassMsun = ∫_Ω ∫_shell ρ(l, b, d) d² dd dΩ, present-day mass (stars + remnants).
	PresentMassMsun float64
	// InitialMassMsun = PresentMassMsun × the component's InitialMassPerPresentMass.
	InitialMassMsun float64
}

// ShellMasses returns the expected mass per shell and component over an area:
//
//	M = ∫_Ω dΩ ∫_{d1}^{d2} ρ(R, z) d² dd
//
// by the area's quadrature directions (angular part) and, along each direction, composite
// Gauss–Legendre over sub-intervals no longer than max(StepPc, RelStep·d), split where the
// sight line crosses the Galactic mid-plane (the |z| kink of the disc laws), so each piece
// is smooth. For a Galactic Rect (WholeSky included) the latitude bands of its graded rule
// are also cut, per shell, where sight lines meet the mid-plane at the shell edges. Components are taken from m by name (ComponentNames if names is empty); an
// unknown name gives an error matching ErrUnknownComponent. The result is ordered by shell,
// then component. Shells must satisfy 0 ≤ InnerPc < OuterPc ≤ 1e6 pc.
func (m *Model) ShellMasses(area Area, shells []Shell, names []string, opt IntegrationOptions) ([]ShellMass, error) {
	opt = opt.withDefaults()
	if err := opt.validate(); err != nil {
		return nil, err
	}
	if len(names) == 0 {
		names = ComponentNames()
	}
	comps := make([]Component, len(names))
	for i, n := range names {
		c, err := m.Component(n)
		if err != nil {
			return nil, err
		}
		comps[i] = c
	}
	for i, s := range shells {
		if !(s.InnerPc >= 0 && s.InnerPc < s.OuterPc && s.OuterPc <= MaxDistancePc) {
			return nil, fmt.Errorf("galaxy: shell %d [%g, %g) pc is not 0 <= inner < outer <= 1e6 pc: %w", i, s.InnerPc, s.OuterPc, ErrOutOfRange)
		}
	}
	rect, graded := area.(*Rect)
	graded = graded && rect.System == Galactic
	var dirs []sightDir
	if !graded {
		dirs = m.sightDirs(area, opt.AngularOrder)
	}
	xg := make([]float64, opt.RadialNodes)
	wg := make([]float64, opt.RadialNodes)
	legendreUnit(xg, wg)
	out := make([]ShellMass, 0, len(shells)*len(comps))
	acc := make([]float64, len(comps))
	for _, s := range shells {
		clear(acc)
		if graded {
			dirs = m.sightDirsDir(rect.quadrature(opt.AngularOrder, m.kinkSinB(s)))
		}
		for _, d := range dirs {
			m.radialIntegrals(d, s, comps, opt, xg, wg, acc)
		}
		for k, c := range comps {
			out = append(out, ShellMass{Shell: s, Component: names[k], PresentMassMsun: acc[k],
				InitialMassMsun: acc[k] * c.InitialMassPerPresentMass()})
		}
	}
	return out, nil
}

// legendreUnit fills Gauss–Legendre nodes and weights on [0, 1].
func legendreUnit(x, w []float64) {
	xx, ww := legendre(len(x), 0, 1)
	copy(x, xx)
	copy(w, ww)
}

func (m *Model) sightDirs(area Area, order int) []sightDir {
	return m.sightDirsDir(area.QuadratureDirections(order))
}

// kinkSinB returns the sines of the latitudes at which sight lines reach the mid-plane
// exactly at the shell's edges, sin b ≈ −z⊙/d (tilt of the frame neglected, 0.17° for the
// defaults): there the shell integral of the |z| kink changes form, so graded Galactic
// rectangles cut their latitude bands there too.
func (m *Model) kinkSinB(s Shell) []float64 {
	var out []float64
	zs := m.Frame.sun.ZSunPc
	for _, d := range []float64{s.InnerPc, s.OuterPc} {
		if d > math.Abs(zs) {
			out = append(out, -zs/d)
		}
	}
	return out
}

func (m *Model) sightDirsDir(qd []Direction) []sightDir {
	dirs := make([]sightDir, len(qd))
	for i, d := range qd {
		x, y, z := unitVector(d.LDeg, d.BDeg)
		dirs[i] = sightDir{x, y, z, d.WeightSr}
	}
	return dirs
}

// planeCrossingPc returns the distance at which the sight line of unit vector u reaches
// Galactocentric Z = 0, or −1 if it never does (Z along the line is linear in d).
func (f *Frame) planeCrossingPc(ux, uy, uz float64) float64 {
	_, _, z0 := f.dirToGalactocentric(ux, uy, uz, 0)
	_, _, z1 := f.dirToGalactocentric(ux, uy, uz, 1)
	dz := z1 - z0
	if dz == 0 {
		return -1
	}
	d := -z0 / dz
	if d <= 0 {
		return -1
	}
	return d
}

// radialIntegrals adds w_Ω ∫ ρ_k d² dd over the shell to acc[k] for one direction.
func (m *Model) radialIntegrals(d sightDir, s Shell, comps []Component, opt IntegrationOptions, xg, wg, acc []float64) {
	dc := m.Frame.planeCrossingPc(d.ux, d.uy, d.uz)
	lo := s.InnerPc
	for lo < s.OuterPc {
		hi := lo + math.Max(opt.StepPc, opt.RelStep*lo)
		if hi > s.OuterPc {
			hi = s.OuterPc
		}
		if dc > lo && dc < hi {
			hi = dc
		}
		h := hi - lo
		for i, x := range xg {
			dist := lo + h*x
			wgt := d.w * wg[i] * h * dist * dist
			gx, gy, gz := m.Frame.dirToGalactocentric(d.ux, d.uy, d.uz, dist)
			for k, c := range comps {
				acc[k] += wgt * c.DensityMsunPc3(gx, gy, gz)
			}
		}
		lo = hi
	}
}

// PoissonCount draws a Poisson-distributed count of mean mean ≥ 0 (error otherwise, or
// for mean > 1e15). For mean < 10 it inverts the cumulative distribution by sequential
// search (one r.Float64 draw); for mean ≥ 10 it uses the transformed-rejection method
// PTRS of Hörmann 1993 (Insurance: Math. Econ. 12, 39, "The transformed rejection method
// for generating Poisson random variables"; two r.Float64 draws per trial, acceptance
// above 0.9). No allocation.
func PoissonCount(mean float64, r *rand.Rand) (int64, error) {
	if !(mean >= 0 && mean <= 1e15) {
		return 0, rangeErr("poisson mean", mean, "-", "[0, 1e15]")
	}
	if mean == 0 {
		return 0, nil
	}
	if mean < 10 {
		u := r.Float64()
		p := math.Exp(-mean)
		cdf := p
		var k int64
		for u > cdf && k < 1000 {
			k++
			p *= mean / float64(k)
			cdf += p
		}
		return k, nil
	}
	// PTRS, Hörmann 1993, Table 1 / algorithm PTRS
	slam := math.Sqrt(mean)
	loglam := math.Log(mean)
	b := 0.931 + 2.53*slam
	a := -0.059 + 0.02483*b
	invAlpha := 1.1239 + 1.1328/(b-3.4)
	vr := 0.9277 - 3.6224/(b-2)
	for {
		u := r.Float64() - 0.5
		v := r.Float64()
		us := 0.5 - math.Abs(u)
		k := math.Floor((2*a/us+b)*u + mean + 0.43)
		if us >= 0.07 && v <= vr {
			return int64(k), nil
		}
		if k < 0 || (us < 0.013 && v > us) {
			continue
		}
		lg, _ := math.Lgamma(k + 1)
		if math.Log(v)+math.Log(invAlpha)-math.Log(a/(us*us)+b) <= -mean+k*loglam-lg {
			return int64(k), nil
		}
	}
}

// SampleDistanceUniformVolume draws a distance in the shell with density ∝ d² (uniform in
// volume along a cone): d = (d1³ + u (d2³ − d1³))^(1/3), one r.Float64 draw.
func SampleDistanceUniformVolume(s Shell, r *rand.Rand) float64 {
	a := s.InnerPc * s.InnerPc * s.InnerPc
	b := s.OuterPc * s.OuterPc * s.OuterPc
	return math.Cbrt(a + (b-a)*r.Float64())
}

// SampleUniformInShell draws a position uniform in the volume of the shell inside the area:
// a uniform direction (Area.SampleDirection) and a distance ∝ d². Returns Galactic lDeg,
// bDeg (degrees) and distancePc.
func SampleUniformInShell(area Area, s Shell, r *rand.Rand) (lDeg, bDeg, distancePc float64) {
	lDeg, bDeg = area.SampleDirection(r)
	return lDeg, bDeg, SampleDistanceUniformVolume(s, r)
}

// SamplePositionInShell is the one-shot form of ShellSampler for the named component: it
// builds the envelope (cost of ~10³ density evaluations) and draws one position. Use a
// ShellSampler to draw many.
func (m *Model) SamplePositionInShell(area Area, s Shell, name string, r *rand.Rand) (lDeg, bDeg, distancePc float64, err error) {
	ss, err := m.NewShellSampler(area, s, name)
	if err != nil {
		return 0, 0, 0, err
	}
	return ss.Sample(r)
}

// Node is one point of the volume quadrature of a shell: a heliocentric position, its
// Galactocentric coordinates and the volume it stands for.
type Node struct {
	LDeg, BDeg, DistancePc float64 // heliocentric Galactic position
	XPc, YPc, ZPc          float64 // Galactocentric Cartesian position
	VolumePc3              float64 // quadrature weight: w_Ω × w_d × d², pc³
}

// ShellNodes returns the quadrature nodes ShellMasses uses for one shell of an area (same
// options and rules), so a caller can integrate any function of position over the shell
// volume, for example density × the fraction of stars a survey detects through the
// extinction at that distance:
//
//	∫_Ω ∫_shell f(x) d² dd dΩ ≈ Σ_nodes VolumePc3 · f(node)
//
// Σ VolumePc3 · ρ(node) equals ShellMasses for the same inputs. The volume weights sum to
// Ω (d2³ − d1³)/3 to quadrature accuracy. The slice is allocated (dst is reused when it has
// the capacity); its length is (directions) × (radial sub-intervals) × RadialNodes, which
// for the whole sky and a shell spanning tens of kpc reaches millions of nodes — use thin
// shells or small areas, or ShellMasses, there.
func (m *Model) ShellNodes(area Area, s Shell, opt IntegrationOptions, dst []Node) ([]Node, error) {
	opt = opt.withDefaults()
	if err := opt.validate(); err != nil {
		return nil, err
	}
	if !(s.InnerPc >= 0 && s.InnerPc < s.OuterPc && s.OuterPc <= MaxDistancePc) {
		return nil, fmt.Errorf("galaxy: shell [%g, %g) pc is not 0 <= inner < outer <= 1e6 pc: %w", s.InnerPc, s.OuterPc, ErrOutOfRange)
	}
	var qd []Direction
	if rect, ok := area.(*Rect); ok && rect.System == Galactic {
		qd = rect.quadrature(opt.AngularOrder, m.kinkSinB(s))
	} else {
		qd = area.QuadratureDirections(opt.AngularOrder)
	}
	xg := make([]float64, opt.RadialNodes)
	wg := make([]float64, opt.RadialNodes)
	legendreUnit(xg, wg)
	out := dst[:0]
	for _, q := range qd {
		ux, uy, uz := unitVector(q.LDeg, q.BDeg)
		dc := m.Frame.planeCrossingPc(ux, uy, uz)
		lo := s.InnerPc
		for lo < s.OuterPc {
			hi := lo + math.Max(opt.StepPc, opt.RelStep*lo)
			if hi > s.OuterPc {
				hi = s.OuterPc
			}
			if dc > lo && dc < hi {
				hi = dc
			}
			h := hi - lo
			for i, x := range xg {
				dist := lo + h*x
				gx, gy, gz := m.Frame.dirToGalactocentric(ux, uy, uz, dist)
				out = append(out, Node{LDeg: q.LDeg, BDeg: q.BDeg, DistancePc: dist, XPc: gx, YPc: gy, ZPc: gz,
					VolumePc3: q.WeightSr * wg[i] * h * dist * dist})
			}
			lo = hi
		}
	}
	return out, nil
}
