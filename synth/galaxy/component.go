package galaxy

import "fmt"

// Component is one structural component of the Galactic model.
//
// DensityMsunPc3 returns the present-day stellar mass density (living stars plus stellar
// remnants, in Msun per pc³; the quantity the local census of LocalMassDensityMsunPc3
// measures) at Galactocentric Cartesian (xPc, yPc, zPc) in pc (frame on Sun). It is
// defined everywhere, is ≥ 0, and does not allocate.
//
// InitialMassPerPresentMass returns the factor that converts present-day mass to the
// initial (zero-age) stellar mass that must be sampled from an initial mass function to
// reproduce it: mass lost by stellar winds and supernovae makes it ≥ 1 for an old
// population. The package cannot compute it (it depends on the IMF, the star-formation
// history and stellar evolution); it is 1 until the caller sets it with
// Model.SetInitialMassPerPresentMass. InitialDensityMsunPc3 = DensityMsunPc3 × this factor.
//
// Name returns the component's word: "thin_disc", "thick_disc", "halo" or "bulge".
type Component interface {
	Name() string
	DensityMsunPc3(xPc, yPc, zPc float64) float64
	InitialMassPerPresentMass() float64
}

// Component names.
const (
	ThinDiscName  = "thin_disc"
	ThickDiscName = "thick_disc"
	HaloName      = "halo"
	BulgeName     = "bulge"
)

// ComponentNames lists the model's components in their fixed order.
func ComponentNames() []string {
	return []string{ThinDiscName, ThickDiscName, HaloName, BulgeName}
}

// massFactor holds the initial/present mass conversion of a component.
type massFactor struct{ initialPerPresent float64 }

// InitialMassPerPresentMass returns the initial-to-present mass factor (see Component);
// 1 until set with Model.SetInitialMassPerPresentMass.
func (m *massFactor) InitialMassPerPresentMass() float64 {
	if m.initialPerPresent == 0 {
		return 1
	}
	return m.initialPerPresent
}

func unknownComponent(name string) error {
	return fmt.Errorf("galaxy: component %q is not one of thin_disc, thick_disc, halo, bulge: %w", name, ErrUnknownComponent)
}
