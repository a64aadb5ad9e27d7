package sim

import (
	"math/rand/v2"
	"strconv"
)

// StreamBlock is the number of paths that share one random stream: paths
// 0..StreamBlock−1 form block 0, the next StreamBlock paths block 1, and so
// on (the last block may be shorter). It is part of the definition of the
// streams, so it is a constant: changing it changes every simulated
// number. It never depends on the number of workers.
const StreamBlock = 1024

// The kinds of random stream, the first part of a stream's name.
const (
	shockStream = "shock" // the forecast-error shocks of a series
	eventStream = "event" // the occurrences and sizes of an event
	// periodStream: the historical periods a portfolio's shocks come
	// from (key "").
	periodStream = "period"
)

// FNV-1a 64-bit parameters (Fowler, Noll & Vo; the offset basis and prime
// of hash/fnv's New64a).
const (
	fnvOffset64 = 14695981039346656037
	fnvPrime64  = 1099511628211
)

// streamID returns the number of the random stream of one block of paths:
// the 64-bit FNV-1a hash of the bytes
//
//	kind + "\x00" + key + "\x00" + decimal(block)
//
// where kind is "shock" (key: the series name), "event" (key: the event
// id) or "period" (key "": the historical periods of a portfolio's shocks) and decimal(block) is the block index in base 10 without leading
// zeros ("0", "1", ..., "12"). The zero bytes keep the parts apart, so
// ("a", "b1") and ("ab", "1") differ. The block's generator is then
// math/rand/v2's PCG seeded with (seed, streamID).
func streamID(kind, key string, block int) uint64 {
	h := uint64(fnvOffset64)
	add := func(s string) {
		for i := 0; i < len(s); i++ {
			h ^= uint64(s[i])
			h *= fnvPrime64
		}
	}
	add(kind)
	add("\x00")
	add(key)
	add("\x00")
	var digits [20]byte
	for _, c := range strconv.AppendInt(digits[:0], int64(block), 10) {
		h ^= uint64(c)
		h *= fnvPrime64
	}
	return h
}

// A blockRand gives the generators of the blocks one after another,
// reseeding one PCG so that moving to a new block allocates nothing.
type blockRand struct {
	seed uint64
	src  *rand.PCG
	r    *rand.Rand
}

func newBlockRand(seed uint64) *blockRand {
	src := rand.NewPCG(0, 0)
	return &blockRand{seed: seed, src: src, r: rand.New(src)}
}

// at returns the generator of the stream (kind, key, block), at its start:
// the same numbers as rand.New(rand.NewPCG(seed, streamID(kind, key,
// block))). It is valid until the next call.
func (b *blockRand) at(kind, key string, block int) *rand.Rand {
	b.src.Seed(b.seed, streamID(kind, key, block))
	return b.r
}
