package shard

import (
	"encoding/base64"
	"encoding/binary"
	"encoding/json"
	"fmt"
	"math"
)

// Floats are numbers written to JSON as a base64 string of little-endian
// float64s, so that they read back bit for bit.
type Floats []float64

// MarshalJSON writes the numbers as one base64 string.
func (f Floats) MarshalJSON() ([]byte, error) {
	b := make([]byte, 8*len(f))
	for i, x := range f {
		binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
	}
	return json.Marshal(base64.StdEncoding.EncodeToString(b))
}

// UnmarshalJSON reads numbers written by MarshalJSON.
func (f *Floats) UnmarshalJSON(data []byte) error {
	var s string
	if err := json.Unmarshal(data, &s); err != nil {
		return err
	}
	b, err := base64.StdEncoding.DecodeString(s)
	if err != nil {
		return err
	}
	if len(b)%8 != 0 {
		return fmt.Errorf("%d bytes of numbers: not a whole number of float64s", len(b))
	}
	out := make(Floats, len(b)/8)
	for i := range out {
		out[i] = math.Float64frombits(binary.LittleEndian.Uint64(b[8*i:]))
	}
	*f = out
	return nil
}
