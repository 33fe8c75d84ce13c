package main

import (
	"strings"
	"unicode/utf8"
)

// The module is embedded as text with a 7-bit encoding of our own ("text7"), which costs 8/7 of
// the bytes where base64 costs 4/3: about 270 kB less on copoly's module.
//
// The bytes are read as a bit stream, most significant bit first, in groups of 7 bits (the last
// group padded with zero bits). A group becomes the ASCII character of that code, except the three
// codes that cannot stand in an HTML script data block: NUL (0x00; the parser replaces it), CR
// (0x0D; the parser turns CR LF into LF) and '<' (0x3C; it could start "</script"). A group with
// one of those codes, at index k in text7Illegal, is written together with the group h after it
// as the character U+0080 + (k<<7 | h), two bytes in UTF-8; as the last group it is written as
// U+0200 + k. Every character is below U+0800, so JavaScript reads the text with charCodeAt.
// The decoder stops after the number of bytes recorded beside the text.
var text7Illegal = [3]byte{0x00, 0x0D, 0x3C}

// encodeText7 encodes data as text7.
func encodeText7(data []byte) string {
	var groups []byte
	var acc uint32
	var bits uint
	for _, b := range data {
		acc = acc<<8 | uint32(b)
		bits += 8
		for bits >= 7 {
			bits -= 7
			groups = append(groups, byte(acc>>bits)&0x7f)
		}
	}
	if bits > 0 {
		groups = append(groups, byte(acc<<(7-bits))&0x7f)
	}
	var sb strings.Builder
	sb.Grow(len(groups) + len(groups)/32)
	for i := 0; i < len(groups); i++ {
		g := groups[i]
		k := illegalIndex(g)
		switch {
		case k < 0:
			sb.WriteByte(g)
		case i+1 < len(groups):
			i++
			sb.WriteRune(rune(0x80 + (k<<7 | int(groups[i]))))
		default:
			sb.WriteRune(rune(0x200 + k))
		}
	}
	return sb.String()
}

func illegalIndex(g byte) int {
	for k, c := range text7Illegal {
		if g == c {
			return k
		}
	}
	return -1
}

// decodeText7 decodes text7 back to n bytes; ok is false for text that is not text7.
func decodeText7(s string, n int) (out []byte, ok bool) {
	out = make([]byte, 0, n)
	var acc uint32
	var bits uint
	push := func(g uint32) {
		acc = acc<<7 | g
		bits += 7
		if bits >= 8 {
			bits -= 8
			out = append(out, byte(acc>>bits))
		}
	}
	for _, r := range s {
		switch {
		case r == utf8.RuneError:
			return nil, false
		case r < 0x80:
			if illegalIndex(byte(r)) >= 0 {
				return nil, false
			}
			push(uint32(r))
		case r < 0x200:
			v := uint32(r - 0x80)
			if v>>7 >= uint32(len(text7Illegal)) {
				return nil, false
			}
			push(uint32(text7Illegal[v>>7]))
			push(v & 0x7f)
		case r < 0x200+rune(len(text7Illegal)):
			push(uint32(text7Illegal[r-0x200]))
		default:
			return nil, false
		}
	}
	if len(out) < n {
		return nil, false
	}
	return out[:n], true
}
