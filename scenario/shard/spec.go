package shard

import (
	"fmt"
	"hash/fnv"
	"strconv"
	"strings"
)

// A Spec names one shard: K of N, 0 <= K < N.
type Spec struct{ K, N int }

// Parse reads "K/N" (0 <= K < N, N at least 1). It returns an error
// saying what is wrong and what is wanted.
func Parse(s string) (Spec, error) {
	k, n, ok := strings.Cut(s, "/")
	if !ok {
		return Spec{}, fmt.Errorf("%q: want K/N, the shard K (counted from 0) of N, such as 0/8", s)
	}
	kk, err1 := strconv.Atoi(strings.TrimSpace(k))
	nn, err2 := strconv.Atoi(strings.TrimSpace(n))
	switch {
	case err1 != nil || err2 != nil:
		return Spec{}, fmt.Errorf("%q: K and N must be whole numbers, such as 0/8", s)
	case nn < 1:
		return Spec{}, fmt.Errorf("%q: N must be at least 1", s)
	case kk < 0 || kk >= nn:
		return Spec{}, fmt.Errorf("%q: K must be from 0 to %d (shards count from 0, as a Kubernetes completion index does)", s, nn-1)
	}
	return Spec{kk, nn}, nil
}

// String returns "K/N".
func (s Spec) String() string { return fmt.Sprintf("%d/%d", s.K, s.N) }

// Hash returns the 64-bit FNV-1a hash of name's bytes.
func Hash(name string) uint64 {
	h := fnv.New64a()
	h.Write([]byte(name))
	return h.Sum64()
}

// Of returns the shard of N the series called name belongs to: Hash(name)
// mod N.
func Of(name string, n int) int { return int(Hash(name) % uint64(n)) }

// Owns reports whether the series called name belongs to shard s.
func (s Spec) Owns(name string) bool { return Of(name, s.N) == s.K }
