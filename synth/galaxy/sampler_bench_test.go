package galaxy

import (
	"math"
	"testing"
)

// samplerBenchCases are the three areas of BenchmarkNewShellSampler: (a) a 10 deg² cone at
// (l, b) = (45°, 60°), (b) the single nside-4 nested HEALPix pixel (Galactic) containing
// (l, b) = (30°, 2°), near the plane, and (c) the whole sky as a Galactic rectangle.
func samplerBenchCases() []struct {
	name string
	area Area
} {
	r := math.Acos(1-10/(2*math.Pi)*degToRad*degToRad) * radToDeg // cone radius of 10 deg², deg
	cone, _ := NewCone(45, 60, r)
	hp, _ := NewHEALPix(4, Nested)
	pix, _ := NewPixelList(Galactic, 4, Nested, []int64{hp.Ang2Pix((90-2)*degToRad, 30*degToRad)})
	return []struct {
		name string
		area Area
	}{{"cone10deg2_b60", cone}, {"pixel_nside4_plane", pix}, {"whole_sky", WholeSky()}}
}

// BenchmarkNewShellSampler builds the samplers of the four components for four shells of
// the default Galactic field plan (64 log-spaced shells from 10 pc to 50 kpc; shells 8,
// 24, 40 and 56, about 29, 240, 2000 and 16500 pc) in each area of samplerBenchCases: one
// iteration is 16 samplers.
func BenchmarkNewShellSampler(b *testing.B) {
	m := DefaultModel()
	shells, _ := MakeShells(10, 50000, 64, LogSpacing)
	for _, tc := range samplerBenchCases() {
		b.Run(tc.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				for _, k := range []int{8, 24, 40, 56} {
					for _, name := range ComponentNames() {
						if _, err := m.NewShellSampler(tc.area, shells[k], name); err != nil {
							b.Fatal(err)
						}
					}
				}
			}
		})
	}
}

// TestCellEnvelopeEarlySplit: the early stop of cellEnvelope (canSplit) must give the
// split decision of the complete evaluation (varRatio > samplerSplitVar), since the
// construction keeps the cells of the complete rule. Exhaustive over the level-2 cells of
// the whole sky for three shells × four components (deterministic, no false alarms).
func TestCellEnvelopeEarlySplit(t *testing.T) {
	t.Parallel()
	m := DefaultModel()
	for _, s := range []Shell{{0, 300}, {1800, 2100}, {14000, 16000}} {
		for _, name := range ComponentNames() {
			ss, err := m.NewShellSampler(WholeSky(), s, name)
			if err != nil {
				t.Fatal(err)
			}
			for pix := int64(0); pix < 192; pix++ {
				cl := samplerCell{2, pix}
				env, v, split := ss.cellEnvelope(cl, false)
				_, _, early := ss.cellEnvelope(cl, true)
				if split || early != (v > samplerSplitVar) {
					t.Fatalf("%v %s cell %d: complete ratio %g, early split %v", s, name, pix, v, early)
				}
				for j, e := range env {
					if !(e > 0) {
						t.Fatalf("%v %s cell %d bin %d: envelope %g", s, name, pix, j, e)
					}
				}
			}
		}
	}
}
