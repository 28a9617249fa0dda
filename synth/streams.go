package synth

import (
	"crypto/sha256"
	"encoding/binary"
	"math/rand/v2"
)

// Stream purposes. Each chunk of each component owns one stream per purpose, so that the
// initial masses can be drawn on their own (for the total-mass pre-pass) and everything
// else afterwards, and no stream's draws depend on another's.
const (
	streamMass  = 0 // initial masses of primaries
	streamStars = 1 // everything else about a star, in a fixed order per star
	streamPlan  = 2 // per-component planning (shell counts); chunk index ignored
)

// newStream returns the ChaCha8 generator of (run seed, component, chunk, purpose). The
// 32-byte ChaCha8 key is the SHA-256 of the four values in little-endian order, so streams
// are independent for any inputs and never depend on the number of workers.
func newStream(seed uint64, component, chunk int, purpose int) *rand.Rand {
	var buf [32]byte
	binary.LittleEndian.PutUint64(buf[0:], seed)
	binary.LittleEndian.PutUint64(buf[8:], uint64(component))
	binary.LittleEndian.PutUint64(buf[16:], uint64(chunk))
	binary.LittleEndian.PutUint64(buf[24:], uint64(purpose))
	key := sha256.Sum256(buf[:])
	return rand.New(rand.NewChaCha8(key))
}
