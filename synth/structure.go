package synth

import (
	"errors"
	"strings"

	"github.com/starmock/starmock/synth/galaxy"
)

// Structure overrides the structural parameters of the Galactic model (package galaxy):
// the local stellar density and how it is shared between the components, the Sun's
// position, and the shape of each component's density law. Every key is optional: an
// absent key keeps the published default of galaxy.DefaultParams (each default and its
// source is listed in ScenarioReference). The age-dependent thin-disc scale height of
// package galaxy is not offered: the pipeline places every thin-disc star with the one
// scale height.
type Structure struct {
	// LocalDensityMsunPc3 is the present-day stellar mass density (stars and remnants, all
	// components) at the Sun, Msun pc⁻³. Default 0.040 (Gaia 100 pc census).
	LocalDensityMsunPc3 *float64 `yaml:"local_density_msun_pc3,omitempty" json:"local_density_msun_pc3,omitempty"`
	// ThickToThinLocal is ρ_thick/ρ_thin in the mid-plane at the Sun's radius (Jurić et
	// al. 2008, f). Default 0.12.
	ThickToThinLocal *float64 `yaml:"thick_to_thin_local,omitempty" json:"thick_to_thin_local,omitempty"`
	// HaloToThinLocal is ρ_halo/ρ_thin in the mid-plane at the Sun's radius (Jurić et al.
	// 2008, f_h). Default 0.005.
	HaloToThinLocal *float64 `yaml:"halo_to_thin_local,omitempty" json:"halo_to_thin_local,omitempty"`
	// Sun is the Sun's position in the Galaxy.
	Sun *StructureSun `yaml:"sun,omitempty" json:"sun,omitempty"`
	// ThinDisc and ThickDisc are the double-exponential disc shapes.
	ThinDisc  *StructureThinDisc `yaml:"thin_disc,omitempty" json:"thin_disc,omitempty"`
	ThickDisc *StructureDisc     `yaml:"thick_disc,omitempty" json:"thick_disc,omitempty"`
	// Halo is the flattened power-law halo.
	Halo *StructureHalo `yaml:"halo,omitempty" json:"halo,omitempty"`
	// Bulge is the triaxial bulge/bar.
	Bulge *StructureBulge `yaml:"bulge,omitempty" json:"bulge,omitempty"`
}

// StructureSun is the Sun's position (galaxy.Sun).
type StructureSun struct {
	// R0Pc is the Sun–Galactic-centre distance, pc. Default 8200 (Bland-Hawthorn &
	// Gerhard 2016).
	R0Pc *float64 `yaml:"r0_pc,omitempty" json:"r0_pc,omitempty"`
	// ZPc is the Sun's height above the Galactic mid-plane, pc. Default 25
	// (Bland-Hawthorn & Gerhard 2016).
	ZPc *float64 `yaml:"z_pc,omitempty" json:"z_pc,omitempty"`
}

// StructureDisc is the shape of a double-exponential disc (galaxy.ThinDisc,
// galaxy.ThickDisc; Jurić et al. 2008 eq. 22).
type StructureDisc struct {
	ScaleLengthPc *float64 `yaml:"scale_length_pc,omitempty" json:"scale_length_pc,omitempty"`
	ScaleHeightPc *float64 `yaml:"scale_height_pc,omitempty" json:"scale_height_pc,omitempty"`
}

// StructureThinDisc is the thin disc's shape, with an optional age-dependent scale height.
type StructureThinDisc struct {
	ScaleLengthPc *float64 `yaml:"scale_length_pc,omitempty" json:"scale_length_pc,omitempty"`
	ScaleHeightPc *float64 `yaml:"scale_height_pc,omitempty" json:"scale_height_pc,omitempty"`
	// Heating, when present, makes the scale height grow with age (see heating.go).
	Heating *StructureHeating `yaml:"heating,omitempty" json:"heating,omitempty"`
}

// StructureHeating is the age-dependent thin-disc scale height H(τ) = H ((τ + τ1)/(τ_ref +
// τ1))^β of galaxy.ThinDisc.ScaleHeightAtAgePc, applied in age slices (heating.go).
type StructureHeating struct {
	// Index is β (default 0.5, Wielen 1977 diffusion; allowed (0, 2]).
	Index *float64 `yaml:"index,omitempty" json:"index,omitempty"`
	// Offset is τ1 (default 0.1 Gyr; allowed (0, 14 Gyr]).
	Offset *Duration `yaml:"offset,omitempty" json:"offset,omitempty"`
	// ReferenceAge is τ_ref, the age whose scale height is scale_height_pc (default 5 Gyr;
	// allowed [0, 14 Gyr]).
	ReferenceAge *Duration `yaml:"reference_age,omitempty" json:"reference_age,omitempty"`
	// Slices is the number of age slices (default 8; allowed 2–32).
	Slices *int `yaml:"slices,omitempty" json:"slices,omitempty"`
}

// StructureHalo is the shape of the halo (galaxy.Halo; Jurić et al. 2008 eq. 24 with a
// core, and the optional Sesar, Jurić & Ivezić 2011 outer break).
type StructureHalo struct {
	AxisRatio     *float64 `yaml:"axis_ratio,omitempty" json:"axis_ratio,omitempty"`
	PowerLawIndex *float64 `yaml:"power_law_index,omitempty" json:"power_law_index,omitempty"`
	CoreRadiusPc  *float64 `yaml:"core_radius_pc,omitempty" json:"core_radius_pc,omitempty"`
	BreakRadiusPc *float64 `yaml:"break_radius_pc,omitempty" json:"break_radius_pc,omitempty"`
	OuterIndex    *float64 `yaml:"outer_index,omitempty" json:"outer_index,omitempty"`
}

// StructureBulge is the bulge/bar (galaxy.Bulge; Dwek et al. 1995 model G2).
type StructureBulge struct {
	MassMsun    *float64 `yaml:"mass_msun,omitempty" json:"mass_msun,omitempty"`
	X0Pc        *float64 `yaml:"x0_pc,omitempty" json:"x0_pc,omitempty"`
	Y0Pc        *float64 `yaml:"y0_pc,omitempty" json:"y0_pc,omitempty"`
	Z0Pc        *float64 `yaml:"z0_pc,omitempty" json:"z0_pc,omitempty"`
	BarAngleDeg *float64 `yaml:"bar_angle_deg,omitempty" json:"bar_angle_deg,omitempty"`
}

// GalaxyParams returns the structural parameters of the field's Galactic model:
// galaxy.DefaultParams with every key written under field.structure put in its place.
// It does not validate them (Parse does).
func (f *Field) GalaxyParams() galaxy.Params {
	p := galaxy.DefaultParams()
	st := f.Structure
	if st == nil {
		return p
	}
	set := func(dst *float64, v *float64) {
		if v != nil {
			*dst = *v
		}
	}
	set(&p.LocalMassDensityMsunPc3, st.LocalDensityMsunPc3)
	set(&p.ThickToThinLocal, st.ThickToThinLocal)
	set(&p.HaloToThinLocal, st.HaloToThinLocal)
	if v := st.Sun; v != nil {
		set(&p.Sun.R0Pc, v.R0Pc)
		set(&p.Sun.ZSunPc, v.ZPc)
	}
	if v := st.ThinDisc; v != nil {
		set(&p.ThinDisc.ScaleLengthPc, v.ScaleLengthPc)
		set(&p.ThinDisc.ScaleHeightPc, v.ScaleHeightPc)
		if h := v.Heating; h != nil {
			p.ThinDisc.HeatingIndex, p.ThinDisc.HeatingTimescaleYr, p.ThinDisc.HeatingRefAgeYr = heatingDefaultIndex, heatingDefaultOffset, heatingDefaultRefAge
			set(&p.ThinDisc.HeatingIndex, h.Index)
			if h.Offset != nil {
				p.ThinDisc.HeatingTimescaleYr = float64(*h.Offset)
			}
			if h.ReferenceAge != nil {
				p.ThinDisc.HeatingRefAgeYr = float64(*h.ReferenceAge)
			}
		}
	}
	if v := st.ThickDisc; v != nil {
		set(&p.ThickDisc.ScaleLengthPc, v.ScaleLengthPc)
		set(&p.ThickDisc.ScaleHeightPc, v.ScaleHeightPc)
	}
	if v := st.Halo; v != nil {
		set(&p.Halo.AxisRatioQ, v.AxisRatio)
		set(&p.Halo.PowerLawIndexN, v.PowerLawIndex)
		set(&p.Halo.CoreRadiusPc, v.CoreRadiusPc)
		set(&p.Halo.BreakRadiusPc, v.BreakRadiusPc)
		set(&p.Halo.OuterIndexN, v.OuterIndex)
	}
	if v := st.Bulge; v != nil {
		set(&p.Bulge.MassMsun, v.MassMsun)
		set(&p.Bulge.X0Pc, v.X0Pc)
		set(&p.Bulge.Y0Pc, v.Y0Pc)
		set(&p.Bulge.Z0Pc, v.Z0Pc)
		set(&p.Bulge.BarAngleDeg, v.BarAngleDeg)
	}
	return p
}

// structureKeys maps the parameter names of the galaxy package's range errors
// (galaxy.RangeError.Field) to the keys under field.structure.
var structureKeys = map[string]string{
	"local_mass_density_msun_pc3":    "local_density_msun_pc3",
	"thick_to_thin_local":            "thick_to_thin_local",
	"halo_to_thin_local":             "halo_to_thin_local",
	"sun.r0_pc":                      "sun.r0_pc",
	"sun.z_sun_pc":                   "sun.z_pc",
	"thin_disc scale_length_pc":      "thin_disc.scale_length_pc",
	"thin_disc scale_height_pc":      "thin_disc.scale_height_pc",
	"thin_disc heating_index":        "thin_disc.heating.index",
	"thin_disc heating_timescale_yr": "thin_disc.heating.offset",
	"thin_disc heating_ref_age_yr":   "thin_disc.heating.reference_age",
	"thick_disc scale_length_pc":     "thick_disc.scale_length_pc",
	"thick_disc scale_height_pc":     "thick_disc.scale_height_pc",
	"halo axis_ratio_q":              "halo.axis_ratio",
	"halo power_law_index_n":         "halo.power_law_index",
	"halo core_radius_pc":            "halo.core_radius_pc",
	"halo break_radius_pc":           "halo.break_radius_pc",
	"halo outer_index_n":             "halo.outer_index",
	"bulge mass_msun":                "bulge.mass_msun",
	"bulge x0_pc":                    "bulge.x0_pc",
	"bulge y0_pc":                    "bulge.y0_pc",
	"bulge z0_pc":                    "bulge.z0_pc",
	"bulge bar_angle_deg":            "bulge.bar_angle_deg",
}

// galaxyNames rewrites the galaxy package's parameter names in free text to the
// scenario's keys.
var galaxyNames = strings.NewReplacer("local_mass_density_msun_pc3", "local_density_msun_pc3",
	"|z_sun| < r0", "|z_pc| < r0_pc")

// validateStructure checks field.structure by building the Galactic model from it: the
// galaxy package's own range checks decide, and a range error is reported at the key it
// concerns with the package's allowed range.
func (s *Scenario) validateStructure() error {
	st := s.Field.Structure
	if st == nil {
		return nil
	}
	h := st.Halo
	if h != nil && h.BreakRadiusPc != nil && *h.BreakRadiusPc > 0 && h.OuterIndex == nil {
		return s.errf("field.structure.halo.outer_index", "missing: a halo break (break_radius_pc = %g pc) needs the index beyond it, allowed [0, 10] (Sesar, Jurić & Ivezić 2011 find 3.8)", *h.BreakRadiusPc)
	}
	if td := st.ThinDisc; td != nil && td.Heating != nil {
		h := td.Heating
		if h.Index != nil && !(*h.Index > 0) {
			return s.errf("field.structure.thin_disc.heating.index", "%g is out of range; allowed: (0, 2] (leave out the heating block for one scale height)", *h.Index)
		}
		if h.Slices != nil && (*h.Slices < 2 || *h.Slices > heatingMaxSlices) {
			return s.errf("field.structure.thin_disc.heating.slices", "%d is out of range; allowed: 2 to %d", *h.Slices, heatingMaxSlices)
		}
	}
	p := s.Field.GalaxyParams()
	if _, err := galaxy.NewModel(p); err != nil {
		return s.structureErr(err)
	}
	// The galaxy package checks the outer index only when a break is set; check a value
	// written without a break too, with a probe break at the package's largest radius
	// (everything else already passed, so any error is the index's).
	if h != nil && h.OuterIndex != nil && p.Halo.BreakRadiusPc == 0 {
		p.Halo.BreakRadiusPc = 1e6
		if _, err := galaxy.NewModel(p); err != nil {
			return s.structureErr(err)
		}
	}
	return nil
}

// structureErr turns an error of galaxy.NewModel into a scenario error at the key it
// names, or at field.structure when it concerns several keys.
func (s *Scenario) structureErr(err error) error {
	var re *galaxy.RangeError
	if errors.As(err, &re) {
		if key, ok := structureKeys[re.Field]; ok {
			unit := ""
			if re.Unit != "" && re.Unit != "-" {
				unit = " " + re.Unit
			}
			allowed := galaxyNames.Replace(re.Allowed)
			if i := strings.Index(allowed, " and "); i >= 0 {
				allowed = allowed[:i] + unit + allowed[i:]
			} else {
				allowed += unit
			}
			return s.errf("field.structure."+key, "%g%s is out of range; allowed: %s", re.Value, unit, allowed)
		}
	}
	msg := strings.TrimSuffix(err.Error(), ": "+galaxy.ErrOutOfRange.Error())
	msg = galaxyNames.Replace(strings.TrimPrefix(msg, "galaxy: "))
	return s.errf("field.structure", "%s", msg)
}
