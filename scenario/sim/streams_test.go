package sim

import (
	"hash/fnv"
	"math/rand/v2"
	"strings"
	"sync/atomic"
	"testing"
)

// fnvRef is the reference for streamID: the standard library's FNV-1a
// (hash/fnv New64a) over the documented bytes.
func fnvRef(s string) uint64 {
	h := fnv.New64a()
	h.Write([]byte(s))
	return h.Sum64()
}

func TestStreamID(t *testing.T) {
	for _, tc := range []struct {
		kind, key string
		block     int
		// bytes: the documented input, kind NUL key NUL decimal block;
		// the expected value is hash/fnv's New64a over it (Go 1.26).
		bytes string
	}{
		{"shock", "demand", 0, "shock\x00demand\x000"},
		{"shock", "demand", 1, "shock\x00demand\x001"},
		{"shock", "demand", 12, "shock\x00demand\x0012"},
		{"shock", "", 3, "shock\x00\x003"},
		{"event", "contract", 0, "event\x00contract\x000"},
		{"event", "contract", 977, "event\x00contract\x00977"},
		{"event", "fête-été", 1 << 40, "event\x00fête-été\x001099511627776"},
	} {
		if got, want := streamID(tc.kind, tc.key, tc.block), fnvRef(tc.bytes); got != want {
			t.Errorf("streamID(%q, %q, %d) = %#x, want %#x", tc.kind, tc.key, tc.block, got, want)
		}
	}
	// The FNV reference test vectors (Fowler, Noll & Vo; from memory,
	// confirmed by hash/fnv): FNV-1a 64 of "" is the offset basis
	// 0xcbf29ce484222325 and of "a" 0xaf63dc4c8601ec8c.
	if got := fnvRef(""); got != 0xcbf29ce484222325 {
		t.Errorf(`FNV-1a("") = %#x`, got)
	}
	if fnvOffset64 != 0xcbf29ce484222325 || fnvPrime64 != 0x100000001b3 {
		t.Error("FNV-1a 64 parameters")
	}
	if got := fnvRef("a"); got != 0xaf63dc4c8601ec8c {
		t.Errorf(`FNV-1a("a") = %#x`, got)
	}
	// The zero bytes keep the parts apart.
	if streamID("event", "a", 11) == streamID("event", "a1", 1) {
		t.Error(`("a", 11) and ("a1", 1) share a stream`)
	}
	if streamID("shock", "x", 0) == streamID("event", "x", 0) {
		t.Error("a series and an event of the same name share a stream")
	}
}

// blockRand.at restarts the stream and gives the numbers of a new
// PCG(seed, streamID), whatever was drawn before.
func TestBlockRand(t *testing.T) {
	b := newBlockRand(42)
	for _, blk := range []int{3, 0, 3} {
		got := b.at(shockStream, "demand", blk)
		want := rand.New(rand.NewPCG(42, fnvRef("shock\x00demand\x00"+string(rune('0'+blk)))))
		for i := range 50 {
			if g, w := got.Uint64(), want.Uint64(); g != w {
				t.Fatalf("block %d draw %d: %#x, want %#x", blk, i, g, w)
			}
		}
	}
}

func TestInParallel(t *testing.T) {
	for _, workers := range []int{0, 1, 2, 7, 100} {
		out := make([]int, 50)
		var starts atomic.Int64
		inParallel(workers, len(out), func() func(int) {
			starts.Add(1)
			return func(j int) { out[j] += j * j }
		})
		for j, v := range out {
			if v != j*j {
				t.Fatalf("%d workers: job %d ran to %d, want %d (once)", workers, j, v, j*j)
			}
		}
		if n := int(starts.Load()); n != workerCount(workers, len(out)) {
			t.Errorf("%d workers: %d goroutines started, want %d", workers, n, workerCount(workers, len(out)))
		}
	}
	// No jobs: nothing runs.
	inParallel(3, 0, func() func(int) { return func(int) { t.Error("a job ran") } })
}

// A panicking job comes back as a panic on the calling goroutine.
func TestInParallelPanic(t *testing.T) {
	for _, workers := range []int{1, 3} {
		func() {
			defer func() {
				r := recover()
				if s, _ := r.(string); !strings.Contains(s, "job 5 broke") {
					t.Errorf("%d workers: recovered %v, want the job's panic", workers, r)
				}
			}()
			inParallel(workers, 20, func() func(int) {
				return func(j int) {
					if j == 5 {
						panic("job 5 broke")
					}
				}
			})
		}()
	}
}
