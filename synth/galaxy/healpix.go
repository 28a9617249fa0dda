package galaxy

import (
	"fmt"
	"math"
	"math/bits"
	"math/rand/v2"
)

// HEALPix: the Hierarchical Equal Area isoLatitude Pixelization of the sphere,
// implemented from Górski et al. 2005 (ApJ 622, 759), sections 4 and 5 (ring
// geometry, eqs. 4–9; nested numbering by bit interleaving of the face coordinates).
// Angles follow the HEALPix convention: colatitude θ in [0, π] from the north pole
// and longitude φ in [0, 2π).

// Scheme is a HEALPix pixel numbering scheme: "ring" or "nested".
type Scheme uint8

const (
	// Ring numbers pixels along iso-latitude rings from north to south (Górski et al. 2005, sec. 4).
	Ring Scheme = iota + 1
	// Nested numbers pixels hierarchically inside the 12 base faces (Górski et al. 2005, sec. 4).
	Nested
)

// String returns "ring" or "nested".
func (s Scheme) String() string {
	switch s {
	case Ring:
		return "ring"
	case Nested:
		return "nested"
	}
	return fmt.Sprintf("scheme(%d)", uint8(s))
}

// ParseScheme accepts "ring" or "nested" (also "nest").
func ParseScheme(word string) (Scheme, error) {
	switch word {
	case "ring":
		return Ring, nil
	case "nested", "nest":
		return Nested, nil
	}
	return 0, fmt.Errorf("galaxy: healpix scheme %q is not one of ring, nested", word)
}

// MaxNside is the largest HEALPix resolution accepted, 2^29 (pixel numbers then fit in
// an int64, as in the HEALPix standard's 64-bit implementations).
const MaxNside = 1 << 29

// HEALPix is a validated HEALPix resolution. The zero value is not usable; build one with
// NewHEALPix.
type HEALPix struct {
	nside  int64
	npix   int64
	ncap   int64 // pixels in the north polar cap, 2 nside (nside − 1)
	order  uint  // log2 nside
	scheme Scheme
}

// NewHEALPix validates nside (a power of two in [1, 2^29]) and the scheme and returns the
// pixelization.
func NewHEALPix(nside int64, scheme Scheme) (*HEALPix, error) {
	if nside < 1 || nside > MaxNside || nside&(nside-1) != 0 {
		return nil, fmt.Errorf("galaxy: healpix nside = %d is not a power of two in [1, %d]: %w", nside, MaxNside, ErrOutOfRange)
	}
	if scheme != Ring && scheme != Nested {
		return nil, fmt.Errorf("galaxy: healpix scheme %d is not ring or nested", scheme)
	}
	h := &HEALPix{nside: nside, npix: 12 * nside * nside, ncap: 2 * nside * (nside - 1),
		order: uint(bits.TrailingZeros64(uint64(nside))), scheme: scheme}
	return h, nil
}

// Nside returns the resolution parameter.
func (h *HEALPix) Nside() int64 { return h.nside }

// Scheme returns the numbering scheme.
func (h *HEALPix) Scheme() Scheme { return h.scheme }

// NPix returns the number of pixels, 12 nside².
func (h *HEALPix) NPix() int64 { return h.npix }

// PixelAreaSr returns the solid angle of every pixel, 4π / (12 nside²) sr
// (equal areas: Górski et al. 2005, sec. 3).
func (h *HEALPix) PixelAreaSr() float64 { return 4 * math.Pi / float64(h.npix) }

// Ang2Pix returns the pixel containing the direction of colatitude thetaRad ∈ [0, π] and
// longitude phiRad (any finite value, taken modulo 2π). thetaRad outside [0, π] is the
// caller's bug and panics.
func (h *HEALPix) Ang2Pix(thetaRad, phiRad float64) int64 {
	if !(thetaRad >= 0 && thetaRad <= math.Pi) {
		panic(fmt.Sprintf("galaxy: HEALPix.Ang2Pix colatitude %g rad outside [0, pi]", thetaRad))
	}
	z := math.Cos(thetaRad)
	s := math.Sin(thetaRad)
	if h.scheme == Ring {
		return h.ringFromZPhi(z, s, phiRad)
	}
	return h.nestFromZPhi(z, s, phiRad)
}

// tt returns φ/(π/2) reduced to [0, 4).
func phiToTT(phiRad float64) float64 {
	tt := math.Mod(phiRad, 2*math.Pi)
	if tt < 0 {
		tt += 2 * math.Pi
	}
	tt *= 2 / math.Pi
	if tt >= 4 {
		tt = 0
	}
	return tt
}

// ringFromZPhi is the ring-scheme ang2pix (Górski et al. 2005, eqs. 4–9 inverted);
// sinTheta keeps precision near the poles: sqrt(3(1−|z|)) = sinθ sqrt(3/(1+|z|)).
func (h *HEALPix) ringFromZPhi(z, sinTheta, phiRad float64) int64 {
	ns := h.nside
	za := math.Abs(z)
	tt := phiToTT(phiRad)
	if za <= 2.0/3 { // equatorial belt
		temp1 := float64(ns) * (0.5 + tt)
		temp2 := float64(ns) * z * 0.75
		jp := int64(temp1 - temp2) // ascending edge line index
		jm := int64(temp1 + temp2) // descending edge line index
		ir := ns + 1 + jp - jm     // ring number counted from z = 2/3, in [1, 2 ns + 1]
		kshift := 1 - (ir & 1)
		ip := (jp + jm - ns + kshift + 1) / 2
		ip = ip % (4 * ns)
		return h.ncap + (ir-1)*4*ns + ip
	}
	tp := tt - math.Floor(tt)
	tmp := float64(ns) * sinTheta * math.Sqrt(3/(1+za))
	jp := int64(tp * tmp)
	jm := int64((1 - tp) * tmp)
	ir := jp + jm + 1 // ring number counted from the closest pole
	ip := int64(tt * float64(ir))
	ip = ip % (4 * ir)
	if z > 0 {
		return 2*ir*(ir-1) + ip
	}
	return h.npix - 2*ir*(ir+1) + ip
}

// base-face layout (Górski et al. 2005, Fig. 4): ring index of the southern corner in units
// of nside (jrll) and longitude index of the face centre in units of π/4 (jpll).
var (
	jrll = [12]int64{2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4}
	jpll = [12]int64{1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7}
)

// nestFromZPhi is the nested-scheme ang2pix: face number and face coordinates (ix, iy),
// then bit interleaving (Górski et al. 2005, sec. 4).
func (h *HEALPix) nestFromZPhi(z, sinTheta, phiRad float64) int64 {
	ns := h.nside
	za := math.Abs(z)
	tt := phiToTT(phiRad)
	var face, ix, iy int64
	if za <= 2.0/3 {
		temp1 := float64(ns) * (0.5 + tt)
		temp2 := float64(ns) * z * 0.75
		jp := int64(temp1 - temp2)
		jm := int64(temp1 + temp2)
		ifp := jp >> h.order
		ifm := jm >> h.order
		switch {
		case ifp == ifm:
			face = ifp | 4
		case ifp < ifm:
			face = ifp
		default:
			face = ifm + 8
		}
		ix = jm & (ns - 1)
		iy = ns - (jp & (ns - 1)) - 1
	} else {
		ntt := int64(tt)
		if ntt >= 4 {
			ntt = 3
		}
		tp := tt - float64(ntt)
		tmp := float64(ns) * sinTheta * math.Sqrt(3/(1+za))
		jp := int64(tp * tmp)
		jm := int64((1 - tp) * tmp)
		if jp > ns-1 {
			jp = ns - 1
		}
		if jm > ns-1 {
			jm = ns - 1
		}
		if z >= 0 {
			face = ntt
			ix = ns - jm - 1
			iy = ns - jp - 1
		} else {
			face = ntt + 8
			ix = jp
			iy = jm
		}
	}
	return face<<(2*h.order) + interleave(ix, iy)
}

// interleave puts the bits of x in the even and those of y in the odd positions.
func interleave(x, y int64) int64 {
	return int64(spread(uint64(x)) | spread(uint64(y))<<1)
}

func spread(v uint64) uint64 {
	v &= 0xffffffff
	v = (v | v<<16) & 0x0000ffff0000ffff
	v = (v | v<<8) & 0x00ff00ff00ff00ff
	v = (v | v<<4) & 0x0f0f0f0f0f0f0f0f
	v = (v | v<<2) & 0x3333333333333333
	v = (v | v<<1) & 0x5555555555555555
	return v
}

func compact(v uint64) uint64 {
	v &= 0x5555555555555555
	v = (v | v>>1) & 0x3333333333333333
	v = (v | v>>2) & 0x0f0f0f0f0f0f0f0f
	v = (v | v>>4) & 0x00ff00ff00ff00ff
	v = (v | v>>8) & 0x0000ffff0000ffff
	v = (v | v>>16) & 0x00000000ffffffff
	return v
}

// checkPix panics if pix is not a pixel number of h (a programming bug).
func (h *HEALPix) checkPix(pix int64) {
	if pix < 0 || pix >= h.npix {
		panic(fmt.Sprintf("galaxy: HEALPix pixel %d outside [0, %d) for nside %d", pix, h.npix, h.nside))
	}
}

// Pix2Ang returns the colatitude thetaRad ∈ [0, π] and longitude phiRad ∈ [0, 2π) of the
// centre of pixel pix. A pixel number outside [0, NPix) is the caller's bug and panics.
func (h *HEALPix) Pix2Ang(pix int64) (thetaRad, phiRad float64) {
	h.checkPix(pix)
	ring, iphi := h.ringIndex(pix)
	z, phi := h.ringCentre(ring, iphi)
	// polar caps: 1 − |z| = i²/(3 nside²) exactly, so θ = 2 asin(i / (nside √6)) keeps full
	// precision next to the poles where acos(z) would not
	ns := h.nside
	switch {
	case ring < ns:
		return 2 * math.Asin(float64(ring)/(float64(ns)*math.Sqrt(6))), phi
	case ring > 3*ns:
		return math.Pi - 2*math.Asin(float64(4*ns-ring)/(float64(ns)*math.Sqrt(6))), phi
	}
	return math.Acos(z), phi
}

// ringIndex returns the ring number (1 … 4 nside − 1, north to south) and the 1-based index
// of the pixel inside its ring.
func (h *HEALPix) ringIndex(pix int64) (ring, iphi int64) {
	if h.scheme == Nested {
		pix = h.nestToRing(pix)
	}
	ns := h.nside
	switch {
	case pix < h.ncap:
		ring = (1 + isqrt(1+2*pix)) >> 1
		iphi = pix + 1 - 2*ring*(ring-1)
	case pix < h.npix-h.ncap:
		ip := pix - h.ncap
		ring = ip/(4*ns) + ns
		iphi = ip%(4*ns) + 1
	default:
		ip := h.npix - pix
		r := (1 + isqrt(2*ip-1)) >> 1
		iphi = 4*r + 1 - (ip - 2*r*(r-1))
		ring = 4*ns - r
	}
	return ring, iphi
}

// ringZ returns cos θ of ring number ring (0 and 4 nside give the poles), Górski et al.
// 2005 eqs. 4 (polar caps: z = 1 − i²/(3 nside²)) and 8 (belt: z = 4/3 − 2i/(3 nside)).
func (h *HEALPix) ringZ(ring int64) float64 {
	ns := h.nside
	switch {
	case ring <= 0:
		return 1
	case ring >= 4*ns:
		return -1
	case ring < ns:
		return 1 - float64(ring*ring)/(3*float64(ns)*float64(ns))
	case ring <= 3*ns:
		return float64(2*ns-ring) * 2 / (3 * float64(ns))
	default:
		r := 4*ns - ring
		return -1 + float64(r*r)/(3*float64(ns)*float64(ns))
	}
}

// ringCentre returns cos θ and φ of the iphi-th (1-based) pixel centre of a ring
// (Górski et al. 2005, eqs. 5 and 9).
func (h *HEALPix) ringCentre(ring, iphi int64) (z, phi float64) {
	ns := h.nside
	z = h.ringZ(ring)
	switch {
	case ring < ns:
		phi = (float64(iphi) - 0.5) * math.Pi / (2 * float64(ring))
	case ring <= 3*ns:
		fodd := 0.5
		if (ring+ns)&1 == 1 {
			fodd = 1
		}
		phi = (float64(iphi) - fodd) * math.Pi / (2 * float64(ns))
	default:
		r := 4*ns - ring
		phi = (float64(iphi) - 0.5) * math.Pi / (2 * float64(r))
	}
	return z, phi
}

// nestToRing converts a nested pixel number to the ring number of the same pixel.
func (h *HEALPix) nestToRing(pix int64) int64 {
	ns := h.nside
	npface := ns * ns
	face := pix / npface
	ipf := uint64(pix % npface)
	ix := int64(compact(ipf))
	iy := int64(compact(ipf >> 1))
	jr := jrll[face]*ns - ix - iy - 1
	var nr, kshift, n int64
	switch {
	case jr < ns:
		nr = jr
		n = 2 * nr * (nr - 1)
		kshift = 0
	case jr > 3*ns:
		nr = 4*ns - jr
		n = h.npix - 2*(nr+1)*nr
		kshift = 0
	default:
		nr = ns
		n = h.ncap + (jr-ns)*4*ns
		kshift = (jr - ns) & 1
	}
	jp := (jpll[face]*nr + ix - iy + 1 + kshift) / 2
	if jp > 4*nr {
		jp -= 4 * nr
	}
	if jp < 1 {
		jp += 4 * nr
	}
	return n + jp - 1
}

// NestToRing converts a nested pixel number of this resolution into the ring number of
// the same pixel. Panics on a pixel number outside [0, NPix).
func (h *HEALPix) NestToRing(pix int64) int64 {
	h.checkPix(pix)
	return h.nestToRing(pix)
}

// RingToNest converts a ring pixel number into the nested number of the same pixel (via
// the pixel centre, which lies strictly inside the pixel). Panics outside [0, NPix).
func (h *HEALPix) RingToNest(pix int64) int64 {
	h.checkPix(pix)
	hr := *h
	hr.scheme = Ring
	ring, iphi := hr.ringIndex(pix)
	z, phi := hr.ringCentre(ring, iphi)
	return h.nestFromZPhi(z, math.Sqrt((1-z)*(1+z)), phi)
}

func isqrt(v int64) int64 {
	r := int64(math.Sqrt(float64(v) + 0.5))
	for r*r > v {
		r--
	}
	for (r+1)*(r+1) <= v {
		r++
	}
	return r
}

// pixelBox returns a region [zLo, zHi] × [φc − dphi, φc + dphi] that contains the pixel:
// a pixel of ring i has its north and south corners on the latitudes of rings i − 1 and
// i + 1 and its east and west corners on ring i, π/(4 n_i) from its centre in φ, where
// n_i = min(i, nside, 4 nside − i) (the corners of the HEALPix grid lie on the
// iso-latitude rings of the centres; Górski et al. 2005, sec. 4); along each edge z and φ
// vary monotonically, so the corners bound the pixel. A relative margin of 1e-7 is added
// in φ. The containment is verified by TestHEALPixPixelBox with random directions.
func (h *HEALPix) pixelBox(pix int64) (zLo, zHi, phiC, dphi float64) {
	ring, iphi := h.ringIndex(pix)
	_, phiC = h.ringCentre(ring, iphi)
	zHi = h.ringZ(ring - 1)
	zLo = h.ringZ(ring + 1)
	ns := h.nside
	r := ring
	if ring > 2*ns {
		r = 4*ns - ring
	}
	if r > ns {
		r = ns
	}
	dphi = math.Pi / (4 * float64(r)) * (1 + 1e-7)
	return zLo, zHi, phiC, dphi
}

// SampleInPixel draws a direction uniformly distributed (on the sphere) inside pixel pix,
// by rejection from the box returned by pixelBox: z = cos θ and φ uniform in the box
// (uniform in z and φ is uniform on the sphere), kept when Ang2Pix gives pix back. It uses
// two r.Float64 draws per trial; the acceptance rate is about 1/2 (a diamond in its
// bounding box). Panics on a pixel number outside [0, NPix) or if 10⁶ trials fail (a bug).
func (h *HEALPix) SampleInPixel(pix int64, r *rand.Rand) (thetaRad, phiRad float64) {
	h.checkPix(pix)
	zLo, zHi, phiC, dphi := h.pixelBox(pix)
	for trial := 0; trial < 1000000; trial++ {
		z := zLo + (zHi-zLo)*r.Float64()
		phi := phiC + dphi*(2*r.Float64()-1)
		phi = math.Mod(phi, 2*math.Pi)
		if phi < 0 {
			phi += 2 * math.Pi
		}
		s := math.Sqrt((1 - z) * (1 + z))
		var p int64
		if h.scheme == Ring {
			p = h.ringFromZPhi(z, s, phi)
		} else {
			p = h.nestFromZPhi(z, s, phi)
		}
		if p == pix {
			return math.Acos(z), phi
		}
	}
	panic("galaxy: HEALPix.SampleInPixel rejection failed")
}
