package synth

import (
	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/galaxy"
)

// fieldDust is the dust model of the field: none; an exponential dust layer in height
// (no radial gradient), evaluated in closed form along each star's own direction
// (dust.DiscParams.VerticalAV); or a user table of A_V versus distance per direction,
// taken from the tabulated sight line nearest to the star.
//
// The layer defaults to the Li et al. (2018) scale height of 103 pc with the Sun 23 pc
// above the dust mid-plane, and A_V = 1.0 mag per kpc at the Sun (package dust defaults).
type fieldDust struct {
	model  string
	params dust.DiscParams
	table  *dust.AVTable
}

func (s *Scenario) newFieldDust(m *galaxy.Model) (*fieldDust, error) {
	d := s.Field.Dust
	fd := &fieldDust{model: d.Model}
	switch d.Model {
	case "disc":
		sun := m.Params().Sun
		fd.params = dust.DefaultDiscParams(sun.R0Pc, dust.DefaultSunAboveDustPlanePc)
		if d.AVPerKpc > 0 {
			fd.params.AVPerKpc = d.AVPerKpc
		}
		if d.ScaleHeightPc > 0 {
			fd.params.ScaleHeightPc = d.ScaleHeightPc
		}
		if err := fd.params.Validate(); err != nil {
			return nil, s.errf("field.dust", "%v", err)
		}
	case "table":
		t, err := dust.LoadAVTable(s.resolvePath(d.Table))
		if err != nil {
			return nil, s.errf("field.dust.table", "%v", err)
		}
		fd.table = t
	}
	return fd, nil
}

// av returns A_V in mag to distance dPc along Galactic direction (l, b) in degrees.
func (f *fieldDust) av(lDeg, bDeg, dPc float64) float64 {
	switch f.model {
	case "disc":
		return f.params.VerticalAV(bDeg, dPc)
	case "table":
		sl, _ := f.table.Nearest(lDeg, bDeg)
		return sl.AV(dPc)
	}
	return 0
}
