package shard

import (
	"encoding/json"
	"math"
	"testing"
)

// TestFloatsRoundTrip checks that numbers go through sums.json bit for
// bit, NaN, infinities and negative zero included, and that the string
// reads back the same when a writer escapes its characters (JSON allows
// \/ and \u escapes in any string).
func TestFloatsRoundTrip(t *testing.T) {
	in := Floats{1.5, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.NaN(), math.SmallestNonzeroFloat64, 1e308, 0.1 + 0.2}
	b, err := json.Marshal(in)
	if err != nil {
		t.Fatal(err)
	}
	var out Floats
	if err := json.Unmarshal(b, &out); err != nil {
		t.Fatal(err)
	}
	same := func(got Floats) {
		t.Helper()
		if len(got) != len(in) {
			t.Fatalf("%d numbers, want %d", len(got), len(in))
		}
		for i := range in {
			if math.Float64bits(got[i]) != math.Float64bits(in[i]) {
				t.Errorf("number %d: bits %x, want %x", i, math.Float64bits(got[i]), math.Float64bits(in[i]))
			}
		}
	}
	same(out)
	// The same string with every "/" written \/ and every "+" \u002b.
	var esc []byte
	for _, c := range b {
		switch c {
		case '/':
			esc = append(esc, '\\', '/')
		case '+':
			esc = append(esc, []byte(`\u002b`)...)
		default:
			esc = append(esc, c)
		}
	}
	var back Floats
	if err := json.Unmarshal(esc, &back); err != nil {
		t.Fatal(err)
	}
	same(back)
	for _, bad := range []string{`"AAAA"`, `"not base64!"`, `12`} {
		var f Floats
		if err := json.Unmarshal([]byte(bad), &f); err == nil {
			t.Errorf("%s read as %v, want an error", bad, f)
		}
	}
}

// FuzzFloats reads arbitrary JSON values as numbers of sums.json: never a
// panic, and whatever reads writes back to the same numbers.
func FuzzFloats(f *testing.F) {
	for _, seed := range []string{`""`, `"AAAAAAAA8D8="`, `"AAAAAAAA8D8=AAAA"`, `null`, `"\u0041AAAAAAA8D8="`, `"\/"`, `12`, `"`, `"AAAAAAAAAAA"`} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		var x Floats
		if err := x.UnmarshalJSON(data); err != nil {
			return
		}
		b, err := json.Marshal(x)
		if err != nil {
			t.Fatal(err)
		}
		var y Floats
		if err := json.Unmarshal(b, &y); err != nil {
			t.Fatal(err)
		}
		if len(x) != len(y) {
			t.Fatalf("%d numbers read back as %d", len(x), len(y))
		}
		for i := range x {
			if math.Float64bits(x[i]) != math.Float64bits(y[i]) {
				t.Fatalf("number %d changed", i)
			}
		}
	})
}
