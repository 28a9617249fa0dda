package galaxy

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/integrate/quad"
)

// Direction is one node of an angular quadrature rule: a Galactic direction and the
// solid angle it stands for. The weights of a rule sum to the area's solid angle.
type Direction struct {
	LDeg, BDeg float64 // Galactic longitude and latitude, degrees
	WeightSr   float64 // quadrature weight, sr
}

// Area is a region of the sky.
//
// SolidAngleSr is the exact solid angle in sr. Contains reports whether a Galactic
// direction (degrees; lDeg any finite value, bDeg in [−90, 90]) is inside (boundaries
// count as inside); a bDeg outside [−90, 90] or NaN is not a direction and gives false. SampleDirection draws a direction uniformly distributed on the sphere
// within the area, returning Galactic lDeg in [0, 360) and bDeg. QuadratureDirections
// returns a deterministic rule of nodes inside the area for ∫ f dΩ; order ≥ 1 sets its
// resolution (the meaning per area type is on each constructor) and panics if < 1.
// String describes the area in words.
type Area interface {
	SolidAngleSr() float64
	Contains(lDeg, bDeg float64) bool
	SampleDirection(r *rand.Rand) (lDeg, bDeg float64)
	QuadratureDirections(order int) []Direction
	String() string
}

// legendre returns n Gauss–Legendre nodes and weights on [lo, hi] (gonum quad.Legendre).
func legendre(n int, lo, hi float64) (x, w []float64) {
	x = make([]float64, n)
	w = make([]float64, n)
	quad.Legendre{}.FixedLocations(x, w, lo, hi)
	return x, w
}

func checkOrder(order int) {
	if order < 1 {
		panic(fmt.Sprintf("galaxy: quadrature order %d < 1", order))
	}
}

// Cone is a spherical cap: all directions within RadiusDeg of the centre (LDeg, BDeg).
// A radius of 180° is the whole sky.
type Cone struct {
	LDeg, BDeg, RadiusDeg float64

	cx, cy, cz   float64 // centre unit vector
	ex, ey       float64 // east unit vector (no z component)
	nx, ny, nz   float64 // north unit vector
	chord2Max    float64 // 4 sin²(r/2): squared chord of the radius
	oneMinusCosR float64
}

// NewCone returns the cap of angular radius radiusDeg ∈ (0, 180] around the Galactic
// direction (lDeg, bDeg); bDeg must be in [−90, 90] and lDeg finite.
func NewCone(lDeg, bDeg, radiusDeg float64) (*Cone, error) {
	if !(radiusDeg > 0 && radiusDeg <= 180) {
		return nil, rangeErr("cone radius_deg", radiusDeg, "deg", "(0, 180]")
	}
	if !(bDeg >= -90 && bDeg <= 90) {
		return nil, rangeErr("cone b_deg", bDeg, "deg", "[-90, 90]")
	}
	if math.IsNaN(lDeg) || math.IsInf(lDeg, 0) {
		return nil, rangeErr("cone l_deg", lDeg, "deg", "finite")
	}
	c := &Cone{LDeg: math.Mod(math.Mod(lDeg, 360)+360, 360), BDeg: bDeg, RadiusDeg: radiusDeg}
	c.cx, c.cy, c.cz = unitVector(c.LDeg, bDeg)
	sl, cl := math.Sincos(c.LDeg * degToRad)
	sb, cb := math.Sincos(bDeg * degToRad)
	c.ex, c.ey = -sl, cl
	c.nx, c.ny, c.nz = -sb*cl, -sb*sl, cb
	s := math.Sin(radiusDeg * degToRad / 2)
	c.chord2Max = 4 * s * s
	c.oneMinusCosR = 2 * s * s // 1 − cos r = 2 sin²(r/2)
	return c, nil
}

// WholeSky returns the whole sphere (4π sr) as the Galactic rectangle l ∈ [−180, 180],
// b ∈ [−90, 90], whose graded quadrature resolves the disc and bulge (a cone of radius 180°
// is the same area with a plain, ungraded rule).
func WholeSky() *Rect {
	r, _ := NewRect(Galactic, -180, 180, -90, 90)
	return r
}

// SolidAngleSr returns 2π (1 − cos r).
func (c *Cone) SolidAngleSr() float64 { return 2 * math.Pi * c.oneMinusCosR }

// Contains reports whether (lDeg, bDeg) lies within the radius (squared-chord test,
// precise for small radii).
func (c *Cone) Contains(lDeg, bDeg float64) bool {
	if !(bDeg >= -90 && bDeg <= 90) {
		return false
	}
	x, y, z := unitVector(lDeg, bDeg)
	dx, dy, dz := x-c.cx, y-c.cy, z-c.cz
	return dx*dx+dy*dy+dz*dz <= c.chord2Max*(1+1e-15)
}

// fromPolar maps offsets from the centre (angular distance with cosine cosRho, position
// angle phi from north through east) to a Galactic direction.
func (c *Cone) fromPolar(cosRho, phiRad float64) (lDeg, bDeg float64) {
	sinRho := math.Sqrt(math.Max(0, (1-cosRho)*(1+cosRho)))
	sp, cp := math.Sincos(phiRad)
	x := cosRho*c.cx + sinRho*(cp*c.nx+sp*c.ex)
	y := cosRho*c.cy + sinRho*(cp*c.ny+sp*c.ey)
	z := cosRho*c.cz + sinRho*cp*c.nz
	return sphericalDeg(x, y, z)
}

// SampleDirection draws a uniform direction in the cap: cos ρ uniform on [cos r, 1] and
// position angle uniform on [0, 2π) (uniform on the sphere; Archimedes' hat-box theorem).
// Two r.Float64 draws.
func (c *Cone) SampleDirection(r *rand.Rand) (lDeg, bDeg float64) {
	cosRho := 1 - c.oneMinusCosR*r.Float64()
	return c.fromPolar(cosRho, 2*math.Pi*r.Float64())
}

// QuadratureDirections returns order Gauss–Legendre nodes in cos ρ on [cos r, 1] times
// 2·order equally spaced position angles (the trapezoid rule, spectrally accurate for a
// periodic integrand): 2·order² directions. The rule is not graded toward the Galactic
// plane: for large cones that cross the plane use a higher order, a Rect or a PixelList.
func (c *Cone) QuadratureDirections(order int) []Direction {
	checkOrder(order)
	x, w := legendre(order, 1-c.oneMinusCosR, 1)
	nphi := 2 * order
	dphi := 2 * math.Pi / float64(nphi)
	out := make([]Direction, 0, order*nphi)
	for i := range x {
		for j := 0; j < nphi; j++ {
			l, b := c.fromPolar(x[i], (float64(j)+0.5)*dphi)
			out = append(out, Direction{LDeg: l, BDeg: b, WeightSr: w[i] * dphi})
		}
	}
	return out
}

// String describes the cone.
func (c *Cone) String() string {
	return fmt.Sprintf("cone of radius %g deg around (l, b) = (%g, %g) deg", c.RadiusDeg, c.LDeg, c.BDeg)
}

// CoordSystem names the sky coordinates of a rectangle or a HEALPix map.
type CoordSystem uint8

const (
	// Galactic coordinates (l, b).
	Galactic CoordSystem = iota + 1
	// Equatorial ICRS coordinates (RA, Dec).
	Equatorial
)

// String returns "galactic" or "icrs".
func (s CoordSystem) String() string {
	if s == Equatorial {
		return "icrs"
	}
	return "galactic"
}

// ParseCoordSystem accepts "galactic" or "icrs" (also "equatorial").
func ParseCoordSystem(word string) (CoordSystem, error) {
	switch word {
	case "galactic":
		return Galactic, nil
	case "icrs", "equatorial":
		return Equatorial, nil
	}
	return 0, fmt.Errorf("galaxy: coordinate system %q is not one of galactic, icrs", word)
}

// toGal converts longitude/latitude in system s to Galactic; fromGal the inverse.
func toGal(s CoordSystem, lon, lat float64) (float64, float64) {
	if s == Equatorial {
		return ICRSToGalactic(lon, lat)
	}
	return lon, lat
}

func fromGal(s CoordSystem, lDeg, bDeg float64) (float64, float64) {
	if s == Equatorial {
		return GalacticToICRS(lDeg, bDeg)
	}
	return lDeg, bDeg
}

// Rect is a longitude–latitude rectangle in Galactic (l, b) or equatorial (RA, Dec)
// coordinates: longitudes from LonMinDeg eastward to LonMaxDeg (the range may cross 0°),
// latitudes from LatMinDeg to LatMaxDeg.
type Rect struct {
	System               CoordSystem
	LonMinDeg, LonMaxDeg float64
	LatMinDeg, LatMaxDeg float64
	widthDeg             float64
}

// NewRect returns the rectangle lonMinDeg ≤ lon ≤ lonMaxDeg, latMinDeg ≤ lat ≤ latMaxDeg in
// the given system. Longitudes must be in [−360, 720] with 0 < lonMax − lonMin ≤ 360 (so
// l from 350 to 370 is the 20° strip across l = 0); latitudes in [−90, 90] with
// latMin < latMax.
func NewRect(system CoordSystem, lonMinDeg, lonMaxDeg, latMinDeg, latMaxDeg float64) (*Rect, error) {
	if system != Galactic && system != Equatorial {
		return nil, fmt.Errorf("galaxy: rectangle coordinate system %d is not galactic or icrs", system)
	}
	for _, v := range []struct {
		name string
		v    float64
	}{{"lon_min_deg", lonMinDeg}, {"lon_max_deg", lonMaxDeg}} {
		if !(v.v >= -360 && v.v <= 720) {
			return nil, rangeErr("rectangle "+v.name, v.v, "deg", "[-360, 720]")
		}
	}
	w := lonMaxDeg - lonMinDeg
	if !(w > 0 && w <= 360) {
		return nil, rangeErr("rectangle lon_max_deg - lon_min_deg", w, "deg", "(0, 360]")
	}
	if !(latMinDeg >= -90 && latMinDeg <= 90) {
		return nil, rangeErr("rectangle lat_min_deg", latMinDeg, "deg", "[-90, 90]")
	}
	if !(latMaxDeg > latMinDeg && latMaxDeg <= 90) {
		return nil, rangeErr("rectangle lat_max_deg", latMaxDeg, "deg", fmt.Sprintf("(lat_min_deg = %g, 90]", latMinDeg))
	}
	return &Rect{System: system, LonMinDeg: lonMinDeg, LonMaxDeg: lonMaxDeg, LatMinDeg: latMinDeg, LatMaxDeg: latMaxDeg, widthDeg: w}, nil
}

// SolidAngleSr returns Δλ (sin β_max − sin β_min), Δλ in radians.
func (q *Rect) SolidAngleSr() float64 {
	return q.widthDeg * degToRad * (math.Sin(q.LatMaxDeg*degToRad) - math.Sin(q.LatMinDeg*degToRad))
}

// Contains converts (lDeg, bDeg) to the rectangle's system and tests both ranges.
func (q *Rect) Contains(lDeg, bDeg float64) bool {
	if !(bDeg >= -90 && bDeg <= 90) {
		return false
	}
	lon, lat := fromGal(q.System, lDeg, bDeg)
	if lat < q.LatMinDeg || lat > q.LatMaxDeg {
		return false
	}
	d := math.Mod(lon-q.LonMinDeg, 360)
	if d < 0 {
		d += 360
	}
	return d <= q.widthDeg || q.widthDeg == 360
}

// SampleDirection draws longitude uniform in the range and sin(latitude) uniform (uniform
// on the sphere), then converts to Galactic. Two r.Float64 draws.
func (q *Rect) SampleDirection(r *rand.Rand) (lDeg, bDeg float64) {
	lon := q.LonMinDeg + q.widthDeg*r.Float64()
	s0, s1 := math.Sin(q.LatMinDeg*degToRad), math.Sin(q.LatMaxDeg*degToRad)
	lat := math.Asin(s0+(s1-s0)*r.Float64()) * radToDeg
	lon = math.Mod(lon+720, 360)
	return toGal(q.System, lon, lat)
}

// Breakpoints of the graded quadrature of Galactic rectangles: sin b values near the
// plane and longitudes (degrees from l = 0) near the Galactic centre, where the disc and
// bulge densities vary fastest with direction (scale heights of a few hundred pc seen from
// kpc distances). Our numerical choice, checked by TestShellMassesAgainstQuad.
var (
	gradedSinB = []float64{-0.3, -0.1, -0.03, -0.01, -0.003, -0.001, 0, 0.001, 0.003, 0.01, 0.03, 0.1, 0.3}
	gradedLDeg = []float64{-180, -90, -45, -20, -10, -5, -2, 0, 2, 5, 10, 20, 45, 90, 180}
)

// bands returns [lo, hi] cut at the breakpoints bp + k·period (k any integer when
// period > 0) that lie strictly inside.
func bands(lo, hi float64, bp []float64, period float64) []float64 {
	cuts := []float64{lo}
	var inner []float64
	if period == 0 {
		for _, b := range bp {
			if b > lo && b < hi {
				inner = append(inner, b)
			}
		}
	} else {
		for k := math.Floor(lo/period) - 1; k <= math.Ceil(hi/period)+1; k++ {
			for _, b := range bp {
				v := b + k*period
				if v > lo && v < hi {
					inner = append(inner, v)
				}
			}
		}
	}
	slices.Sort(inner)
	inner = slices.Compact(inner)
	cuts = append(cuts, inner...)
	return append(cuts, hi)
}

// QuadratureDirections returns a product Gauss–Legendre rule: in sin(latitude) and in
// longitude, each with order nodes per band. For Galactic rectangles the bands are cut at
// the graded breakpoints near the plane (sin b = 0, ±0.001, ±0.003, ±0.01, ±0.03, ±0.1,
// ±0.3) and near the Galactic centre (l = 0, ±2, ±5, ±10, ±20, ±45, ±90, 180 deg) that fall
// inside, so sight lines through the thin disc and the bulge are resolved; an equatorial
// rectangle uses one band per coordinate. Up to 14 × 14 × order² directions.
func (q *Rect) QuadratureDirections(order int) []Direction {
	return q.quadrature(order, nil)
}

// quadrature is QuadratureDirections with extra sin(latitude) breakpoints (Galactic only).
func (q *Rect) quadrature(order int, extraSinB []float64) []Direction {
	checkOrder(order)
	s0, s1 := math.Sin(q.LatMinDeg*degToRad), math.Sin(q.LatMaxDeg*degToRad)
	bs := []float64{s0, s1}
	bl := []float64{q.LonMinDeg, q.LonMaxDeg}
	if q.System == Galactic {
		bs = bands(s0, s1, append(slices.Clone(gradedSinB), extraSinB...), 0)
		bl = bands(q.LonMinDeg, q.LonMaxDeg, gradedLDeg, 360)
	}
	var xs, ws, xl, wl []float64
	for i := 0; i+1 < len(bs); i++ {
		x, w := legendre(order, bs[i], bs[i+1])
		xs, ws = append(xs, x...), append(ws, w...)
	}
	for i := 0; i+1 < len(bl); i++ {
		x, w := legendre(order, bl[i], bl[i+1])
		for j := range w {
			w[j] *= degToRad
		}
		xl, wl = append(xl, x...), append(wl, w...)
	}
	out := make([]Direction, 0, len(xs)*len(xl))
	for i := range xs {
		lat := math.Asin(xs[i]) * radToDeg
		for j := range xl {
			l, b := toGal(q.System, math.Mod(math.Mod(xl[j], 360)+360, 360), lat)
			out = append(out, Direction{LDeg: l, BDeg: b, WeightSr: ws[i] * wl[j]})
		}
	}
	return out
}

// String describes the rectangle.
func (q *Rect) String() string {
	n1, n2 := "l", "b"
	if q.System == Equatorial {
		n1, n2 = "ra", "dec"
	}
	return fmt.Sprintf("rectangle %s in [%g, %g] deg, %s in [%g, %g] deg", n1, q.LonMinDeg, q.LonMaxDeg, n2, q.LatMinDeg, q.LatMaxDeg)
}

// PixelList is a set of HEALPix pixels (in Galactic or equatorial coordinates; HEALPix
// colatitude θ = 90° − latitude, φ = longitude).
type PixelList struct {
	System CoordSystem
	HP     *HEALPix
	Pixels []int64 // sorted, without duplicates

	centres [][3]float64 // Galactic unit vectors of the pixel centres (set by NewPixelList)
	radii   []float64    // bounding radii of the pixels, rad
}

// NewPixelList validates nside (power of two), scheme and the pixel numbers (each in
// [0, 12 nside²), at least one) and returns the area. Duplicates are removed.
func NewPixelList(system CoordSystem, nside int64, scheme Scheme, pixels []int64) (*PixelList, error) {
	if system != Galactic && system != Equatorial {
		return nil, fmt.Errorf("galaxy: healpix coordinate system %d is not galactic or icrs", system)
	}
	h, err := NewHEALPix(nside, scheme)
	if err != nil {
		return nil, err
	}
	if len(pixels) == 0 {
		return nil, fmt.Errorf("galaxy: healpix pixel list is empty (need at least one pixel in [0, %d))", h.NPix())
	}
	ps := slices.Clone(pixels)
	slices.Sort(ps)
	ps = slices.Compact(ps)
	for i, p := range ps {
		if p < 0 || p >= h.NPix() {
			return nil, fmt.Errorf("galaxy: healpix pixel %d (entry %d) is outside [0, %d) for nside %d: %w", p, i, h.NPix(), nside, ErrOutOfRange)
		}
	}
	a := &PixelList{System: system, HP: h, Pixels: ps, centres: make([][3]float64, len(ps)), radii: make([]float64, len(ps))}
	for i, p := range ps {
		th, ph := h.Pix2Ang(p)
		l, b := toGal(system, ph*radToDeg, 90-th*radToDeg)
		x, y, z := unitVector(l, b)
		a.centres[i] = [3]float64{x, y, z}
		a.radii[i] = h.pixelRadiusRad(p)
	}
	return a, nil
}

// SolidAngleSr returns the number of pixels times the pixel area.
func (a *PixelList) SolidAngleSr() float64 { return float64(len(a.Pixels)) * a.HP.PixelAreaSr() }

// latLonToThetaPhi converts latitude/longitude (degrees, lat in [−90, 90]) to HEALPix
// colatitude and longitude (rad); the colatitude is kept inside [0, π] against the
// last-bit rounding of the degree-to-radian product at the poles.
func latLonToThetaPhi(lon, lat float64) (float64, float64) {
	th := (90 - lat) * degToRad
	th = math.Min(math.Max(th, 0), math.Pi)
	return th, lon * degToRad
}

// Contains reports whether the pixel holding the direction is in the list.
func (a *PixelList) Contains(lDeg, bDeg float64) bool {
	if !(bDeg >= -90 && bDeg <= 90) {
		return false
	}
	lon, lat := fromGal(a.System, lDeg, bDeg)
	p := a.HP.Ang2Pix(latLonToThetaPhi(lon, lat))
	_, ok := slices.BinarySearch(a.Pixels, p)
	return ok
}

// SampleDirection picks a pixel uniformly (all pixels have equal area) with one
// r.IntN draw, then a uniform direction inside it (HEALPix.SampleInPixel).
func (a *PixelList) SampleDirection(r *rand.Rand) (lDeg, bDeg float64) {
	p := a.Pixels[r.IntN(len(a.Pixels))]
	th, ph := a.HP.SampleInPixel(p, r)
	return toGal(a.System, ph*radToDeg, 90-th*radToDeg)
}

// QuadratureDirections subdivides every pixel into its 4^k nested children at nside·2^k,
// with 2^k ≥ order (k limited so nside·2^k ≤ 2^29), and returns the child centres with equal
// weights (an equal-area midpoint rule; error O(pixel size²) for smooth integrands).
// order = 1 uses the pixel centres.
func (a *PixelList) QuadratureDirections(order int) []Direction {
	checkOrder(order)
	k := 0
	for (1<<k) < order && (a.HP.Nside()<<(k+1)) <= MaxNside {
		k++
	}
	fine, _ := NewHEALPix(a.HP.Nside()<<k, Nested)
	nest := a.HP
	if nest.Scheme() != Nested {
		nest, _ = NewHEALPix(a.HP.Nside(), Nested)
	}
	nchild := int64(1) << (2 * k)
	w := fine.PixelAreaSr()
	out := make([]Direction, 0, int64(len(a.Pixels))*nchild)
	for _, p := range a.Pixels {
		np := p
		if a.HP.Scheme() == Ring {
			np = nest.RingToNest(p)
		}
		for c := np * nchild; c < (np+1)*nchild; c++ {
			th, ph := fine.Pix2Ang(c)
			l, b := toGal(a.System, ph*radToDeg, 90-th*radToDeg)
			out = append(out, Direction{LDeg: l, BDeg: b, WeightSr: w})
		}
	}
	return out
}

// String describes the pixel list.
func (a *PixelList) String() string {
	return fmt.Sprintf("%d healpix pixels (nside %d, %v, %v coordinates)", len(a.Pixels), a.HP.Nside(), a.HP.Scheme(), a.System)
}

// boundaryArea is implemented by areas that can list points on their boundary (used for
// the rejection envelope of ShellSampler, whose density maximum may lie on the edge).
type boundaryArea interface {
	boundaryDirections(n int) []Direction
}

// boundaryDirections returns n points on the cone's edge circle and its centre.
func (c *Cone) boundaryDirections(n int) []Direction {
	out := []Direction{{LDeg: c.LDeg, BDeg: c.BDeg}}
	cosR := 1 - c.oneMinusCosR
	for j := 0; j < n; j++ {
		l, b := c.fromPolar(cosR, 2*math.Pi*float64(j)/float64(n))
		out = append(out, Direction{LDeg: l, BDeg: b})
	}
	return out
}

// boundaryDirections returns n points along each of the rectangle's four edges.
func (q *Rect) boundaryDirections(n int) []Direction {
	var out []Direction
	add := func(lon, lat float64) {
		l, b := toGal(q.System, math.Mod(math.Mod(lon, 360)+360, 360), lat)
		out = append(out, Direction{LDeg: l, BDeg: b})
	}
	for j := 0; j <= n; j++ {
		f := float64(j) / float64(n)
		lon := q.LonMinDeg + f*q.widthDeg
		lat := q.LatMinDeg + f*(q.LatMaxDeg-q.LatMinDeg)
		add(lon, q.LatMinDeg)
		add(lon, q.LatMaxDeg)
		add(q.LonMinDeg, lat)
		add(q.LonMaxDeg, lat)
	}
	return out
}
