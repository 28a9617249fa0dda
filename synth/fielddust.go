package synth

import (
	"math"

	"github.com/starmock/starmock/synth/dust"
	"github.com/starmock/starmock/synth/galaxy"
)

// fieldDust is the dust model of the field: none, the exponential dust disc of package
// dust, or a user table of A_V versus distance per direction. The disc is evaluated along
// the centre of the HEALPix pixel (nside 64, 0.92°, ring scheme) that holds the star, so
// A_V varies across a large field while each worker keeps a small cache of sight lines.
type fieldDust struct {
	model  string
	params dust.DiscParams
	table  *dust.AVTable
	hp     *galaxy.HEALPix
}

// dustNside is the HEALPix resolution of the disc's sight lines.
const dustNside = 64

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
		hp, err := galaxy.NewHEALPix(dustNside, galaxy.Ring)
		if err != nil {
			return nil, err
		}
		fd.hp = hp
	case "table":
		t, err := dust.LoadAVTable(s.resolvePath(d.Table))
		if err != nil {
			return nil, s.errf("field.dust.table", "%v", err)
		}
		fd.table = t
	}
	return fd, nil
}

// dustCache is a worker's cache of disc sight lines by pixel.
type dustCache map[int64]*dust.ExpDisc

// av returns A_V in mag to distance dPc along Galactic direction (l, b) in degrees.
func (f *fieldDust) av(lDeg, bDeg, dPc float64, cache dustCache) (float64, error) {
	switch f.model {
	case "disc":
		theta := (90 - bDeg) * math.Pi / 180
		phi := lDeg * math.Pi / 180
		pix := f.hp.Ang2Pix(theta, phi)
		e, ok := cache[pix]
		if !ok {
			t, p := f.hp.Pix2Ang(pix)
			var err error
			if e, err = dust.NewExpDisc(f.params, p*180/math.Pi, 90-t*180/math.Pi); err != nil {
				return 0, err
			}
			cache[pix] = e
		}
		return e.AV(dPc), nil
	case "table":
		sl, _ := f.table.Nearest(lDeg, bDeg)
		return sl.AV(dPc), nil
	}
	return 0, nil
}
