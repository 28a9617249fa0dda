package dust

// O'Donnell (1994), ApJ 422, 158: CCM's law with new optical/NIR coefficients
// for 1.1 ≤ x ≤ 3.3 μm⁻¹ (O'Donnell eq. 2, 3 decimals as printed); the IR and
// UV pieces are CCM's (eqs. 2, 4, 5 of Cardelli, Clayton & Mathis 1989).
var (
	od94OpticalA = []float64{1, 0.104, -0.609, 0.701, 1.137, -1.718, -0.827, 1.647, -0.505}
	od94OpticalB = []float64{0, 1.952, 2.908, -3.989, -7.985, 11.102, 5.491, -10.805, 3.347}
)

func newOD94(rv float64) *ccmLaw {
	return &ccmLaw{name: NameOD94, rv: rv, invRV: 1 / rv, optA: od94OpticalA, optB: od94OpticalB,
		minAA: 1e4 / ccmMaxX, maxAA: 1e4 / ccmMinX,
		citation: "O'Donnell 1994, ApJ 422, 158"}
}
