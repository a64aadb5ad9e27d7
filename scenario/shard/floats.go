package shard

import (
	"bytes"
	"encoding/base64"
	"encoding/binary"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
)

// Floats are numbers written to JSON as a base64 string of little-endian
// float64s, so that they read back bit for bit.
type Floats []float64

// orNil returns the numbers, or nil when there are none: what an absent
// capacity or band is to the packages that read them.
func (f Floats) orNil() []float64 {
	if len(f) == 0 {
		return nil
	}
	return f
}

// MarshalJSON writes the numbers as one base64 string.
func (f Floats) MarshalJSON() ([]byte, error) {
	b := make([]byte, 8*len(f))
	for i, x := range f {
		binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(x))
	}
	return json.Marshal(base64.StdEncoding.EncodeToString(b))
}

// UnmarshalJSON reads numbers written by MarshalJSON, decoding the
// base64 straight from the JSON string (its alphabet needs no escapes).
func (f *Floats) UnmarshalJSON(data []byte) error {
	if len(data) < 2 || data[0] != '"' || data[len(data)-1] != '"' || bytes.IndexByte(data[1:len(data)-1], '\\') >= 0 {
		var s string
		if err := json.Unmarshal(data, &s); err != nil {
			return err
		}
		data = []byte(strconv.Quote(s))
	}
	src := data[1 : len(data)-1]
	b := make([]byte, base64.StdEncoding.DecodedLen(len(src)))
	n, err := base64.StdEncoding.Decode(b, src)
	if err != nil {
		return err
	}
	b = b[:n]
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
