package data

import "hash/maphash"

// A nameIndex finds a series of a long file by its name. It is a hash
// table with open addressing (linear probing) whose slots hold the index
// of a series in Extents plus one (zero for an empty slot): the names are
// those of the extents, not copies, so that the index takes 8
// to 16 bytes a series where a map from names to indices takes about 40.
// The table is at most half full.
type nameIndex struct {
	seed  maphash.Seed
	slots []uint32
	n     int
}

// find returns the index of the series called name in list, or -1.
func (x *nameIndex) find(name []byte, list *Extents) int {
	if x.n == 0 {
		return -1
	}
	mask := uint64(len(x.slots) - 1)
	for h := maphash.Bytes(x.seed, name) & mask; ; h = (h + 1) & mask {
		s := x.slots[h]
		if s == 0 {
			return -1
		}
		if list.named(int(s-1), name) {
			return int(s - 1)
		}
	}
}

// add adds series i of list, whose name find does not know yet.
func (x *nameIndex) add(i int, list *Extents) {
	if 2*(x.n+1) > len(x.slots) {
		x.grow(list)
	}
	x.put(i, list)
	x.n++
}

// put puts series i of list in the first empty slot from its hash on.
func (x *nameIndex) put(i int, list *Extents) {
	mask := uint64(len(x.slots) - 1)
	h := list.hash(x.seed, i) & mask
	for x.slots[h] != 0 {
		h = (h + 1) & mask
	}
	x.slots[h] = uint32(i + 1)
}

// grow doubles the table (starting at 1024 slots) and puts the series
// back.
func (x *nameIndex) grow(list *Extents) {
	if x.slots == nil {
		x.seed = maphash.MakeSeed()
	}
	old := x.slots
	x.slots = make([]uint32, max(1024, 2*len(old)))
	for _, s := range old {
		if s != 0 {
			x.put(int(s-1), list)
		}
	}
}
