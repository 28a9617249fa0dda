package galaxy

import "fmt"

// AreaSpec is a declarative description of a sky area, as a scenario file gives it.
//
// Kind selects the shape and the fields used:
//
//	"cone":     LDeg, BDeg (Galactic centre of the cap), RadiusDeg in (0, 180]
//	"rect":     System ("galactic" or "icrs"), LonMinDeg, LonMaxDeg, LatMinDeg, LatMaxDeg
//	"healpix":  System, Nside (power of two), Scheme ("ring" or "nested"), Pixels
//	"all_sky":  no fields (WholeSky)
type AreaSpec struct {
	Kind                 string
	LDeg, BDeg           float64
	RadiusDeg            float64
	System               string
	LonMinDeg, LonMaxDeg float64
	LatMinDeg, LatMaxDeg float64
	Nside                int64
	Scheme               string
	Pixels               []int64
}

// NewArea builds the area a spec describes; errors name the bad field and its allowed
// values or range.
func NewArea(spec AreaSpec) (Area, error) {
	sys := func() (CoordSystem, error) {
		if spec.System == "" {
			return Galactic, nil
		}
		return ParseCoordSystem(spec.System)
	}
	switch spec.Kind {
	case "cone":
		return NewCone(spec.LDeg, spec.BDeg, spec.RadiusDeg)
	case "rect":
		s, err := sys()
		if err != nil {
			return nil, err
		}
		return NewRect(s, spec.LonMinDeg, spec.LonMaxDeg, spec.LatMinDeg, spec.LatMaxDeg)
	case "healpix":
		s, err := sys()
		if err != nil {
			return nil, err
		}
		sc, err := ParseScheme(spec.Scheme)
		if err != nil {
			return nil, err
		}
		return NewPixelList(s, spec.Nside, sc, spec.Pixels)
	case "all_sky":
		return WholeSky(), nil
	}
	return nil, fmt.Errorf("galaxy: area kind %q is not one of cone, rect, healpix, all_sky", spec.Kind)
}
