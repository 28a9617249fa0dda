package synth

import (
	"math"
	"math/rand/v2"
)

// binaryModel decides whether a primary has an unresolved companion and draws its mass.
type binaryModel struct {
	fraction float64        // used when byMass is empty
	byMass   []MassFraction // increasing AboveMassMsun
	qMin     float64
	qMax     float64
	gamma    float64 // dN/dq ∝ q^gamma
	flat     bool
}

func newBinaryModel(b *Binaries) *binaryModel {
	if b == nil {
		return nil
	}
	m := &binaryModel{byMass: b.FractionByMass, qMin: b.MassRatio.Min, qMax: b.MassRatio.Max,
		gamma: b.MassRatio.Gamma, flat: b.MassRatio.Kind == "flat"}
	if b.Fraction != nil {
		m.fraction = *b.Fraction
	}
	if m.flat {
		m.gamma = 0
	}
	return m
}

// fractionAt returns the binary fraction for a primary of mass m1 (Msun).
func (b *binaryModel) fractionAt(m1 float64) float64 {
	if len(b.byMass) == 0 {
		return b.fraction
	}
	f := 0.0
	for _, r := range b.byMass {
		if m1 >= r.AboveMassMsun {
			f = r.Fraction
		}
	}
	return f
}

// draw consumes exactly two uniform draws and returns the companion mass in Msun, or 0
// for a single star. The mass ratio follows dN/dq ∝ q^γ on [qMin, qMax], inverted in
// closed form: q = (qMin^{γ+1} + u (qMax^{γ+1} − qMin^{γ+1}))^{1/(γ+1)}, or log-uniform
// for γ = −1.
func (b *binaryModel) draw(m1 float64, r *rand.Rand) float64 {
	u1, u2 := r.Float64(), r.Float64()
	if u1 >= b.fractionAt(m1) {
		return 0
	}
	var q float64
	g1 := b.gamma + 1
	if math.Abs(g1) < 1e-12 {
		q = b.qMin * math.Pow(b.qMax/b.qMin, u2)
	} else {
		lo, hi := math.Pow(b.qMin, g1), math.Pow(b.qMax, g1)
		q = math.Pow(lo+u2*(hi-lo), 1/g1)
	}
	return q * m1
}
