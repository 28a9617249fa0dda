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
	return b.ratioQuantile(b.qMin, b.qMax, u2) * m1
}

// ratioProb returns the probability that the mass ratio lies in [a, b] (clipped to
// [q_min, q_max]) under dN/dq ∝ q^γ: (b^{γ+1} − a^{γ+1}) / (q_max^{γ+1} − q_min^{γ+1}),
// or ln(b/a) / ln(q_max/q_min) for γ = −1.
func (b *binaryModel) ratioProb(lo, hi float64) float64 {
	lo, hi = math.Max(lo, b.qMin), math.Min(hi, b.qMax)
	if hi <= lo {
		return 0
	}
	g1 := b.gamma + 1
	if math.Abs(g1) < 1e-12 {
		return math.Log(hi/lo) / math.Log(b.qMax/b.qMin)
	}
	return (math.Pow(hi, g1) - math.Pow(lo, g1)) / (math.Pow(b.qMax, g1) - math.Pow(b.qMin, g1))
}

// ratioQuantile inverts the ratio law restricted to [lo, hi] ∩ [q_min, q_max] at the
// uniform u: q = (lo^{γ+1} + u (hi^{γ+1} − lo^{γ+1}))^{1/(γ+1)}, or log-uniform for γ = −1.
func (b *binaryModel) ratioQuantile(lo, hi, u float64) float64 {
	lo, hi = math.Max(lo, b.qMin), math.Min(hi, b.qMax)
	g1 := b.gamma + 1
	if math.Abs(g1) < 1e-12 {
		return lo * math.Pow(hi/lo, u)
	}
	pl, ph := math.Pow(lo, g1), math.Pow(hi, g1)
	return math.Pow(pl+u*(ph-pl), 1/g1)
}
