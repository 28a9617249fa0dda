package galaxy

import "fmt"

// LocalMassDensityMsunPc3 is the default present-day stellar mass density at the Sun:
// 0.040 (+0.012/−0.006) Msun pc⁻³ of stars and stellar remnants within 100 pc from the
// Gaia catalogue of nearby stars with a Kroupa IMF correction (arXiv:2507.06052, 2025;
// population_values.tsv row local_stellar_mass_density_100pc_kroupa). It is a present-day
// mass (living stars + white dwarfs + other remnants), not the initial mass formed; see
// Component.InitialMassPerPresentMass for the conversion hook.
const LocalMassDensityMsunPc3 = 0.040

// Params are the structural parameters of the Galactic model. DefaultParams gives the
// published values; any field may be changed before NewModel.
type Params struct {
	Sun Sun
	// LocalMassDensityMsunPc3 is the total present-day stellar mass density of all
	// components at the Sun's position, Msun pc⁻³, allowed (0, 10]. Default 0.040
	// (LocalMassDensityMsunPc3). The curvature of the density over the 100 pc census
	// volume (a few per cent) is neglected: the model takes the value at the Sun's point.
	LocalMassDensityMsunPc3 float64
	// ThickToThinLocal is f = ρ_thick(R⊙, 0)/ρ_thin(R⊙, 0), allowed [0, 10].
	// Default 0.12: Jurić et al. 2008 (abstract).
	ThickToThinLocal float64
	// HaloToThinLocal is f_h = ρ_halo(R⊙, 0)/ρ_thin(R⊙, 0), allowed [0, 1].
	// Default 0.005: Jurić et al. 2008 (abstract; 0.0051 in their Table 10, from memory).
	HaloToThinLocal float64

	ThinDisc  ThinDisc  // shape parameters (NormMsunPc3 and RRefPc are set by NewModel)
	ThickDisc ThickDisc // shape parameters (NormMsunPc3 and RRefPc are set by NewModel)
	Halo      Halo      // shape parameters (NormMsunPc3 and RRefPc are set by NewModel)
	Bulge     Bulge     // shape and total mass
}

// DefaultParams returns the published defaults, each named on its field: Sun from
// Bland-Hawthorn & Gerhard 2016; disc and halo shapes and local ratios from Jurić et al.
// 2008; bulge from Dwek et al. 1995 (G2) and Bland-Hawthorn & Gerhard 2016; local density
// from the Gaia 100 pc census. The age-dependent thin-disc scale height is off.
func DefaultParams() Params {
	return Params{
		Sun:                     DefaultSun(),
		LocalMassDensityMsunPc3: LocalMassDensityMsunPc3, // Gaia 100 pc census (arXiv:2507.06052)
		ThickToThinLocal:        0.12,                    // Jurić et al. 2008, f
		HaloToThinLocal:         0.005,                   // Jurić et al. 2008, f_h
		ThinDisc: ThinDisc{
			ScaleLengthPc: 2600, // Jurić et al. 2008, L1
			ScaleHeightPc: 300,  // Jurić et al. 2008, H1
		},
		ThickDisc: ThickDisc{
			ScaleLengthPc: 3600, // Jurić et al. 2008, L2
			ScaleHeightPc: 900,  // Jurić et al. 2008, H2
		},
		Halo: Halo{
			AxisRatioQ:     0.64, // Jurić et al. 2008, q_H
			PowerLawIndexN: 2.8,  // Jurić et al. 2008, n_H
			CoreRadiusPc:   500,  // our softening, see Halo
		},
		Bulge: Bulge{
			MassMsun:    1.5e10, // Bland-Hawthorn & Gerhard 2016 (from memory)
			X0Pc:        1580,   // Dwek et al. 1995 G2 (from memory)
			Y0Pc:        620,    // Dwek et al. 1995 G2 (from memory)
			Z0Pc:        430,    // Dwek et al. 1995 G2 (from memory)
			BarAngleDeg: 27,     // Bland-Hawthorn & Gerhard 2016 (from memory)
		},
	}
}

// Model is a normalised Galactic model: four components in one Galactocentric frame.
//
// The fields may be read freely, and the Model may be shared by goroutines that only read
// it. Changing a component's shape after NewModel breaks the local normalisation: build a
// new Model from changed Params instead (tests do change shapes on purpose). The only
// supported mutation is SetInitialMassPerPresentMass, which must not race with readers.
type Model struct {
	Frame     *Frame
	ThinDisc  *ThinDisc
	ThickDisc *ThickDisc
	Halo      *Halo
	Bulge     *Bulge
	params    Params
}

// NewModel validates p and normalises the components. The thin-disc mid-plane density at
// the Sun's cylindrical radius R⊙ follows from the local density (Jurić et al. 2008,
// eqs. 22–24 evaluated at the Sun, z⊙ = Sun.ZSunPc):
//
//	ρ_local = ρ0,thin [e^(−z⊙/H1) + f e^(−z⊙/H2) + f_h S_halo(R⊙, z⊙)] + ρ_bulge(Sun)
//
// where S_halo is the halo shape normalised to 1 at (R⊙, 0); then ρ0,thick = f ρ0,thin and
// ρ0,halo = f_h ρ0,thin. The bulge is normalised by its own total mass.
func NewModel(p Params) (*Model, error) {
	fr, err := NewFrame(p.Sun)
	if err != nil {
		return nil, err
	}
	if !(p.LocalMassDensityMsunPc3 > 0 && p.LocalMassDensityMsunPc3 <= 10) {
		return nil, rangeErr("local_mass_density_msun_pc3", p.LocalMassDensityMsunPc3, "Msun/pc^3", "(0, 10]")
	}
	if !(p.ThickToThinLocal >= 0 && p.ThickToThinLocal <= 10) {
		return nil, rangeErr("thick_to_thin_local", p.ThickToThinLocal, "-", "[0, 10]")
	}
	if !(p.HaloToThinLocal >= 0 && p.HaloToThinLocal <= 1) {
		return nil, rangeErr("halo_to_thin_local", p.HaloToThinLocal, "-", "[0, 1]")
	}
	thin, thick, halo, bulge := p.ThinDisc, p.ThickDisc, p.Halo, p.Bulge
	if err := thin.validate(); err != nil {
		return nil, err
	}
	if err := thick.validate(); err != nil {
		return nil, err
	}
	if err := halo.validate(); err != nil {
		return nil, err
	}
	if err := bulge.Init(); err != nil {
		return nil, err
	}
	rSun := fr.rSunCylPc
	thin.RRefPc, thick.RRefPc, halo.RRefPc = rSun, rSun, rSun
	thin.NormMsunPc3, thick.NormMsunPc3, halo.NormMsunPc3 = 1, 1, 1
	sx, sy, sz := fr.SunGalactocentric()
	shape := thin.DensityMsunPc3(sx, sy, sz) + p.ThickToThinLocal*thick.DensityMsunPc3(sx, sy, sz) +
		p.HaloToThinLocal*halo.DensityMsunPc3(sx, sy, sz)
	rest := p.LocalMassDensityMsunPc3 - bulge.DensityMsunPc3(sx, sy, sz)
	if rest <= 0 {
		return nil, fmt.Errorf("galaxy: bulge density at the Sun %g Msun/pc^3 exceeds local_mass_density_msun_pc3 = %g Msun/pc^3: %w",
			bulge.DensityMsunPc3(sx, sy, sz), p.LocalMassDensityMsunPc3, ErrOutOfRange)
	}
	rho0 := rest / shape
	thin.NormMsunPc3 = rho0
	thick.NormMsunPc3 = p.ThickToThinLocal * rho0 // Jurić et al. 2008 eq. 23: ρ_thick = f ρ_thin at (R⊙, 0)
	halo.NormMsunPc3 = p.HaloToThinLocal * rho0   // Jurić et al. 2008 eq. 24: ρ_halo = f_h ρ_thin at (R⊙, 0)
	return &Model{Frame: fr, ThinDisc: &thin, ThickDisc: &thick, Halo: &halo, Bulge: &bulge, params: p}, nil
}

// DefaultModel returns NewModel(DefaultParams()); the defaults are valid, so it cannot fail.
func DefaultModel() *Model {
	m, err := NewModel(DefaultParams())
	if err != nil {
		panic("galaxy: default parameters invalid: " + err.Error())
	}
	return m
}

// Params returns the parameters the model was built from.
func (m *Model) Params() Params { return m.params }

// Components returns the four components in the order of ComponentNames.
func (m *Model) Components() []Component {
	return []Component{m.ThinDisc, m.ThickDisc, m.Halo, m.Bulge}
}

// Component returns the component of that name, or an error matching
// ErrUnknownComponent that lists the valid names.
func (m *Model) Component(name string) (Component, error) {
	switch name {
	case ThinDiscName:
		return m.ThinDisc, nil
	case ThickDiscName:
		return m.ThickDisc, nil
	case HaloName:
		return m.Halo, nil
	case BulgeName:
		return m.Bulge, nil
	}
	return nil, unknownComponent(name)
}

// SetInitialMassPerPresentMass sets the initial-to-present mass factor of a component (see
// Component), which the caller computes from its IMF, star-formation history and
// evolution; factor must be in [1, 100] (mass is only lost as stars age).
func (m *Model) SetInitialMassPerPresentMass(name string, factor float64) error {
	c, err := m.Component(name)
	if err != nil {
		return err
	}
	if !(factor >= 1 && factor <= 100) {
		return rangeErr(name+" initial_mass_per_present_mass", factor, "-", "[1, 100]")
	}
	switch v := c.(type) {
	case *ThinDisc:
		v.initialPerPresent = factor
	case *ThickDisc:
		v.initialPerPresent = factor
	case *Halo:
		v.initialPerPresent = factor
	case *Bulge:
		v.initialPerPresent = factor
	}
	return nil
}

// DensityMsunPc3 returns the total present-day stellar mass density of all components
// at Galactocentric (x, y, z) in pc.
func (m *Model) DensityMsunPc3(xPc, yPc, zPc float64) float64 {
	return m.ThinDisc.DensityMsunPc3(xPc, yPc, zPc) + m.ThickDisc.DensityMsunPc3(xPc, yPc, zPc) +
		m.Halo.DensityMsunPc3(xPc, yPc, zPc) + m.Bulge.DensityMsunPc3(xPc, yPc, zPc)
}

// DensityAtSunMsunPc3 returns the total density at the Sun (equals the local density
// parameter by construction).
func (m *Model) DensityAtSunMsunPc3() float64 {
	return m.DensityMsunPc3(m.Frame.SunGalactocentric())
}

// ComponentDensityAt returns the density of c at heliocentric Galactic (lDeg, bDeg,
// distancePc) in this model's frame.
func (m *Model) ComponentDensityAt(c Component, lDeg, bDeg, distancePc float64) float64 {
	x, y, z := m.Frame.ToGalactocentric(lDeg, bDeg, distancePc)
	return c.DensityMsunPc3(x, y, z)
}

// InitialDensityMsunPc3 returns the initial-mass density of c at Galactocentric (x, y, z):
// DensityMsunPc3 × InitialMassPerPresentMass.
func InitialDensityMsunPc3(c Component, xPc, yPc, zPc float64) float64 {
	return c.DensityMsunPc3(xPc, yPc, zPc) * c.InitialMassPerPresentMass()
}
