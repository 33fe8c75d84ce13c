package main

import (
	"bytes"
	"math/rand/v2"
	"strings"
	"testing"
)

// TestText7RoundTrip encodes and decodes every length up to 64 of random bytes, and inputs made
// of the illegal codes only, and checks the text never holds NUL, CR or '<'.
func TestText7RoundTrip(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 7))
	var inputs [][]byte
	for n := 0; n <= 64; n++ {
		b := make([]byte, n)
		for i := range b {
			b[i] = byte(r.UintN(256))
		}
		inputs = append(inputs, b)
	}
	// Bytes whose 7-bit groups are all illegal codes, including the last group.
	inputs = append(inputs, []byte{0, 0, 0, 0, 0, 0, 0}, bytes.Repeat([]byte{0x78, 0x3c, 0x1e}, 20), []byte{0x79})
	for _, in := range inputs {
		s := encodeText7(in)
		if strings.ContainsAny(s, "\x00\r<") {
			t.Fatalf("encodeText7(%x) = %q holds an illegal character", in, s)
		}
		got, ok := decodeText7(s, len(in))
		if !ok || !bytes.Equal(got, in) {
			t.Fatalf("decodeText7(encodeText7(%x)) = %x, %v", in, got, ok)
		}
		// The size is 8/7 of the input plus at most one group, counted in bytes of UTF-8 (an
		// escaped pair of groups takes two bytes for two groups).
		if max := (len(in)*8+6)/7 + 1; len(s) > max {
			t.Errorf("%d bytes encode to %d, above %d", len(in), len(s), max)
		}
	}
	if _, ok := decodeText7("ab<", 2); ok {
		t.Error("text with '<' decoded")
	}
}
