package galaxy

import "math"

// Orientation of the Galactic frame, in the values astropy 5.2.1 uses
// (astropy.coordinates.Galactic: _ngp_J2000, _lon0_J2000). They realise the IAU 1958
// definition (Blaauw et al. 1960, MNRAS 121, 123), made in FK4 B1950 (NGP at α = 192.25°,
// δ = 27.4°, l of the NCP = 123°), in FK5 J2000; the ICRS is then linked to FK5 J2000 by
// the frame-bias rotation of USNO Circular 179 (Kaplan 2005, eq. 3.4 angles).
const (
	// NGPRAJ2000Deg is the right ascension of the north Galactic pole in FK5 J2000, degrees.
	NGPRAJ2000Deg = 192.8594812065348
	// NGPDecJ2000Deg is the declination of the north Galactic pole in FK5 J2000, degrees.
	NGPDecJ2000Deg = 27.12825118085622
	// LonNCPJ2000Deg is the Galactic longitude of the FK5 J2000 north celestial pole, degrees.
	LonNCPJ2000Deg = 122.9319185680026

	// frame bias ICRS -> FK5 J2000 (USNO Circular 179, Kaplan 2005, sec. 3.5), arcsec
	biasEta0Arcsec = -19.9e-3
	biasXi0Arcsec  = 9.1e-3
	biasDA0Arcsec  = -22.9e-3
)

// mat3 is a 3×3 rotation matrix, row-major.
type mat3 [3][3]float64

func (a mat3) mul(b mat3) mat3 {
	var c mat3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			c[i][j] = a[i][0]*b[0][j] + a[i][1]*b[1][j] + a[i][2]*b[2][j]
		}
	}
	return c
}

func (a mat3) transpose() mat3 {
	var c mat3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			c[i][j] = a[j][i]
		}
	}
	return c
}

// rotAxis returns the passive (frame) rotation by angleRad about coordinate axis
// 0 (x), 1 (y) or 2 (z): a vector's components in the rotated frame are R·v.
func rotAxis(angleRad float64, axis int) mat3 {
	s, c := math.Sincos(angleRad)
	var r mat3
	a1, a2 := (axis+1)%3, (axis+2)%3
	r[axis][axis] = 1
	r[a1][a1] = c
	r[a2][a2] = c
	r[a1][a2] = s
	r[a2][a1] = -s
	return r
}

const (
	degToRad    = math.Pi / 180
	radToDeg    = 180 / math.Pi
	arcsecToRad = degToRad / 3600
)

// icrsToGal is the matrix taking ICRS unit vectors to Galactic unit vectors:
//
//	G = R_z(180° − l_NCP) · R_y(90° − δ_NGP) · R_z(α_NGP) · B
//	B = R_x(−η0) · R_y(ξ0) · R_z(dα0)   (frame bias, USNO Circular 179)
var icrsToGal = func() mat3 {
	b := rotAxis(-biasEta0Arcsec*arcsecToRad, 0).
		mul(rotAxis(biasXi0Arcsec*arcsecToRad, 1)).
		mul(rotAxis(biasDA0Arcsec*arcsecToRad, 2))
	g := rotAxis((180-LonNCPJ2000Deg)*degToRad, 2).
		mul(rotAxis((90-NGPDecJ2000Deg)*degToRad, 1)).
		mul(rotAxis(NGPRAJ2000Deg*degToRad, 2))
	return g.mul(b)
}()

var galToICRS = icrsToGal.transpose()

// unitVector returns the Cartesian unit vector of longitude lonDeg and latitude latDeg.
func unitVector(lonDeg, latDeg float64) (x, y, z float64) {
	sl, cl := math.Sincos(lonDeg * degToRad)
	sb, cb := math.Sincos(latDeg * degToRad)
	return cb * cl, cb * sl, sb
}

// sphericalDeg returns longitude in [0, 360) and latitude in [−90, 90], degrees, of a
// (not necessarily unit) Cartesian vector.
func sphericalDeg(x, y, z float64) (lonDeg, latDeg float64) {
	lonDeg = math.Atan2(y, x) * radToDeg
	if lonDeg < 0 {
		lonDeg += 360
	}
	if lonDeg >= 360 {
		lonDeg -= 360
	}
	latDeg = math.Atan2(z, math.Hypot(x, y)) * radToDeg
	return lonDeg, latDeg
}

func apply(m *mat3, x, y, z float64) (float64, float64, float64) {
	return m[0][0]*x + m[0][1]*y + m[0][2]*z,
		m[1][0]*x + m[1][1]*y + m[1][2]*z,
		m[2][0]*x + m[2][1]*y + m[2][2]*z
}

// ICRSToGalactic converts ICRS right ascension and declination (degrees) to Galactic
// longitude lDeg in [0, 360) and latitude bDeg in [−90, 90] (degrees) with the fixed
// rotation icrsToGal (IAU 1958 Galactic frame realised in FK5 J2000, plus the ICRS–FK5
// frame bias; the chain astropy uses). Any finite input angles are accepted (they are
// used through their sines and cosines). No allocation.
func ICRSToGalactic(raDeg, decDeg float64) (lDeg, bDeg float64) {
	x, y, z := unitVector(raDeg, decDeg)
	return sphericalDeg(apply(&icrsToGal, x, y, z))
}

// GalacticToICRS converts Galactic longitude and latitude (degrees) to ICRS right
// ascension raDeg in [0, 360) and declination decDeg in [−90, 90] (degrees); the inverse
// (transpose) rotation of ICRSToGalactic. No allocation.
func GalacticToICRS(lDeg, bDeg float64) (raDeg, decDeg float64) {
	x, y, z := unitVector(lDeg, bDeg)
	return sphericalDeg(apply(&galToICRS, x, y, z))
}

// GalacticToICRSSlice converts the Galactic positions (lDeg[i], bDeg[i]) into
// (raDeg[i], decDeg[i]) in place of the caller's output slices, for batches of stars.
// It panics if the four slices do not have the same length (a programming bug).
func GalacticToICRSSlice(lDeg, bDeg, raDeg, decDeg []float64) {
	if len(bDeg) != len(lDeg) || len(raDeg) != len(lDeg) || len(decDeg) != len(lDeg) {
		panic("galaxy: GalacticToICRSSlice slice lengths differ")
	}
	for i := range lDeg {
		raDeg[i], decDeg[i] = GalacticToICRS(lDeg[i], bDeg[i])
	}
}

// ICRSToGalacticSlice is the batch form of ICRSToGalactic; it panics if the four slices
// do not have the same length (a programming bug).
func ICRSToGalacticSlice(raDeg, decDeg, lDeg, bDeg []float64) {
	if len(decDeg) != len(raDeg) || len(lDeg) != len(raDeg) || len(bDeg) != len(raDeg) {
		panic("galaxy: ICRSToGalacticSlice slice lengths differ")
	}
	for i := range raDeg {
		lDeg[i], bDeg[i] = ICRSToGalactic(raDeg[i], decDeg[i])
	}
}

// Sun is the position of the Sun in the Galaxy.
//
// The Galactocentric frame used throughout the package is right-handed with the
// Galactic centre at the origin and +X pointing from the Sun toward the Galactic centre
// (the Sun lies at X < 0, Y = 0, Z = ZSunPc); +Y points toward
// l = 90° (the direction of Galactic rotation at the Sun); +Z points toward the north
// Galactic pole of the mid-plane. The Galactic centre is taken at (l, b) = (0, 0).
type Sun struct {
	// R0Pc is the Sun–Galactic-centre distance (3-d), pc.
	// Default 8200 pc: Bland-Hawthorn & Gerhard 2016, R0 = 8.2 ± 0.1 kpc (from memory,
	// population_values.tsv row bhg16_R0). Allowed (0, 20000] pc.
	R0Pc float64
	// ZSunPc is the Sun's height above the Galactic mid-plane, pc.
	// Default 25 pc: Bland-Hawthorn & Gerhard 2016, z_sun = 25 ± 5 pc (from memory, row
	// bhg16_z_sun; Jurić et al. 2008 also adopt 25 pc). Allowed [−200, 200] pc.
	ZSunPc float64
}

// DefaultSun returns the Bland-Hawthorn & Gerhard 2016 solar position
// (R0 = 8200 pc, z_sun = 25 pc; values from memory, see Sun).
func DefaultSun() Sun { return Sun{R0Pc: 8200, ZSunPc: 25} }

// Validate reports an error if R0Pc is outside (0, 20000] pc or ZSunPc outside
// [−200, 200] pc (or ZSunPc is not smaller in size than R0Pc).
func (s Sun) Validate() error {
	if !(s.R0Pc > 0 && s.R0Pc <= 20000) {
		return rangeErr("sun.r0_pc", s.R0Pc, "pc", "(0, 20000]")
	}
	if !(s.ZSunPc >= -200 && s.ZSunPc <= 200) || math.Abs(s.ZSunPc) >= s.R0Pc {
		return rangeErr("sun.z_sun_pc", s.ZSunPc, "pc", "[-200, 200] and |z_sun| < r0")
	}
	return nil
}

// CylindricalRPc returns the Sun's Galactocentric cylindrical radius sqrt(R0² − z_sun²), pc.
func (s Sun) CylindricalRPc() float64 {
	return math.Sqrt(s.R0Pc*s.R0Pc - s.ZSunPc*s.ZSunPc)
}

// Frame is the precomputed heliocentric → Galactocentric transformation of a Sun.
// The transformation is exact (no small-angle approximation):
//
//	x_h = d cos b cos l, y_h = d cos b sin l, z_h = d sin b      (heliocentric, x_h toward l = b = 0)
//	X = (x_h − R0) cos θ + z_h sin θ
//	Y = y_h
//	Z = −(x_h − R0) sin θ + z_h cos θ,    sin θ = z_sun / R0
//
// i.e. a translation by R0 toward the Galactic centre followed by the tilt θ about Y that
// lifts the Sun to height z_sun (the construction of astropy's Galactocentric frame with
// roll = 0 and the Galactic centre at l = b = 0; checked against it in the tests).
type Frame struct {
	sun        Sun
	sinT, cosT float64
	sunX, sunZ float64
	rSunCylPc  float64
}

// NewFrame validates s and returns its Galactocentric frame.
func NewFrame(s Sun) (*Frame, error) {
	if err := s.Validate(); err != nil {
		return nil, err
	}
	st := s.ZSunPc / s.R0Pc
	ct := math.Sqrt(1 - st*st)
	return &Frame{sun: s, sinT: st, cosT: ct, sunX: -s.R0Pc * ct, sunZ: s.R0Pc * st, rSunCylPc: s.CylindricalRPc()}, nil
}

// Sun returns the solar position the frame was built from.
func (f *Frame) Sun() Sun { return f.sun }

// ToGalactocentric converts a heliocentric position (Galactic lDeg, bDeg in degrees and
// distance distancePc ≥ 0 in pc) to Galactocentric Cartesian (xPc, yPc, zPc) in pc
// (formula on Frame). No allocation; distancePc < 0 is the caller's bug and gives a
// point on the opposite side (not checked in this hot path).
func (f *Frame) ToGalactocentric(lDeg, bDeg, distancePc float64) (xPc, yPc, zPc float64) {
	ux, uy, uz := unitVector(lDeg, bDeg)
	return f.dirToGalactocentric(ux, uy, uz, distancePc)
}

// dirToGalactocentric is ToGalactocentric for a heliocentric unit vector (ux, uy, uz).
func (f *Frame) dirToGalactocentric(ux, uy, uz, distancePc float64) (xPc, yPc, zPc float64) {
	xh := distancePc*ux - f.sun.R0Pc
	zh := distancePc * uz
	return xh*f.cosT + zh*f.sinT, distancePc * uy, -xh*f.sinT + zh*f.cosT
}

// FromGalactocentric is the inverse of ToGalactocentric: Galactic (lDeg in [0, 360),
// bDeg) in degrees and heliocentric distance in pc of a Galactocentric point (pc).
// At the Sun itself (distance 0) the direction is undefined and (0, 0, 0) is returned.
func (f *Frame) FromGalactocentric(xPc, yPc, zPc float64) (lDeg, bDeg, distancePc float64) {
	xh := xPc*f.cosT - zPc*f.sinT + f.sun.R0Pc
	zh := xPc*f.sinT + zPc*f.cosT
	distancePc = math.Sqrt(xh*xh + yPc*yPc + zh*zh)
	if distancePc == 0 {
		return 0, 0, 0
	}
	lDeg, bDeg = sphericalDeg(xh, yPc, zh)
	return lDeg, bDeg, distancePc
}

// ToCylindrical returns the Galactocentric cylindrical radius R and height z (pc) of a
// heliocentric position (Galactic degrees, distance in pc), the coordinates of the density
// laws.
func (f *Frame) ToCylindrical(lDeg, bDeg, distancePc float64) (rPc, zPc float64) {
	x, y, z := f.ToGalactocentric(lDeg, bDeg, distancePc)
	return math.Hypot(x, y), z
}

// SunGalactocentric returns the Sun's Galactocentric Cartesian position (pc):
// (−R0 cos θ, 0, z_sun).
func (f *Frame) SunGalactocentric() (xPc, yPc, zPc float64) { return f.sunX, 0, f.sunZ }
