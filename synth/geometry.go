package synth

import (
	"math"
	"math/rand/v2"
)

// placement places the stars of a population component.
type placement struct {
	plummer  bool
	dPc      float64
	aPc      float64 // Plummer scale radius
	mMaxFrac float64 // Plummer mass fraction inside the truncation radius
	// unit vectors at the centre: c towards the centre, e towards east, n towards north
	c, e, n [3]float64
}

func newPlacement(g *Geometry) *placement {
	p := &placement{dPc: g.DistancePc}
	ra, dec := g.RADeg*math.Pi/180, g.DecDeg*math.Pi/180
	p.c = [3]float64{math.Cos(dec) * math.Cos(ra), math.Cos(dec) * math.Sin(ra), math.Sin(dec)}
	p.e = [3]float64{-math.Sin(ra), math.Cos(ra), 0}
	p.n = [3]float64{-math.Sin(dec) * math.Cos(ra), -math.Sin(dec) * math.Sin(ra), math.Cos(dec)}
	if g.Kind == "plummer" {
		p.plummer = true
		p.aPc = g.ScaleRadiusPc
		x := g.MaxRadiusPc / g.ScaleRadiusPc
		p.mMaxFrac = x * x * x / math.Pow(1+x*x, 1.5)
	}
	return p
}

// place draws a position (three uniform draws for a Plummer sphere, none for a fixed
// distance). It returns the offsets from the centre in pc (east, north, and along the
// line of sight away from the observer), the ICRS direction in degrees and the distance
// in pc. The Plummer (1911, MNRAS 71, 460) enclosed-mass fraction
//
//	M(<r)/M = r³ / (r² + a²)^{3/2}
//
// is inverted in closed form, r = a / sqrt(u^{−2/3} − 1), with u uniform on
// [0, M(<r_max)/M] for the truncated sphere, and the direction is isotropic.
func (p *placement) place(r *rand.Rand) (east, north, depth, raDeg, decDeg, distPc float64) {
	if p.plummer {
		u := r.Float64() * p.mMaxFrac
		rad := 0.0
		if u > 0 {
			rad = p.aPc / math.Sqrt(math.Pow(u, -2.0/3.0)-1)
		}
		cosT := 2*r.Float64() - 1
		phi := 2 * math.Pi * r.Float64()
		sinT := math.Sqrt(1 - cosT*cosT)
		east, north, depth = rad*sinT*math.Cos(phi), rad*sinT*math.Sin(phi), rad*cosT
	}
	var v [3]float64
	for i := range v {
		v[i] = (p.dPc+depth)*p.c[i] + east*p.e[i] + north*p.n[i]
	}
	distPc = math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2])
	raDeg = math.Atan2(v[1], v[0]) * 180 / math.Pi
	if raDeg < 0 {
		raDeg += 360
	}
	decDeg = math.Asin(v[2]/distPc) * 180 / math.Pi
	return
}
