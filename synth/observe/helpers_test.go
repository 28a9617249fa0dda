package observe

import "math/rand/v2"

func newPCG() rand.Source               { return rand.NewPCG(12, 34) }
func randFrom(s rand.Source) *rand.Rand { return rand.New(s) }
