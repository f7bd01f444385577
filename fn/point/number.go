package point

// The numbers of every answer are written here. A batch writes three to
// five per row, and Go's strconv.AppendFloat in its general form ('g',
// shortest) cost about a tenth of a row's time each; this writes the same
// bytes at about half that cost, so that a row costs not much more than
// its state (issue 17). TestAppendNumberAsStrconv holds it to strconv
// over every binary exponent, the subnormals, the boundaries of the 'g'
// layout and millions of random values.
//
// The shortest digits are found by Dragonbox: J. Jeon, "Dragonbox: A New
// Floating-Point Binary-to-Decimal Conversion Algorithm" (2020),
// Algorithms 5.2, 5.4 and 5.6. The code follows the implementation in Go's
// internal/strconv (ftoadbox.go and math.go, Go 1.26), with its 128-bit
// products taken from math/bits, its table of powers of ten computed at
// start-up with math/big, and its digits written eight at a time (put8)
// straight into the 'g' layout. That implementation is
//
//	Copyright 2025 The Go Authors. All rights reserved.
//	Use of this source code is governed by a BSD-style license: see
//	https://go.dev/LICENSE (redistributions of source code retain the
//	copyright notice, the list of conditions and the disclaimer).

import (
	"encoding/binary"
	"math"
	"math/big"
	"math/bits"
	"strconv"
)

// u128 is a 128-bit unsigned integer.
type u128 struct{ hi, lo uint64 }

// pow10Tab holds 10^e for e in [pow10Min, pow10Max] as a 128-bit
// mantissa with its top bit set, truncated: 10^e = m/2^128 · 2^(1+⌊e·log2 10⌋).
const pow10Min, pow10Max = -348, 347

var pow10Tab = powersOfTen()

func powersOfTen() (t [pow10Max - pow10Min + 1]u128) {
	ten := big.NewInt(10)
	for e := pow10Min; e <= pow10Max; e++ {
		var m *big.Int
		if e >= 0 {
			d := new(big.Int).Exp(ten, big.NewInt(int64(e)), nil)
			n := d.BitLen()
			if n <= 128 {
				m = d.Lsh(d, uint(128-n))
			} else {
				m = d.Rsh(d, uint(n-128))
			}
		} else {
			d := new(big.Int).Exp(ten, big.NewInt(int64(-e)), nil)
			s := 127 + d.BitLen()
			m = new(big.Int).Lsh(big.NewInt(1), uint(s))
			m.Quo(m, d)
			for m.BitLen() > 128 {
				s--
				m = new(big.Int).Lsh(big.NewInt(1), uint(s))
				m.Quo(m, d)
			}
			for m.BitLen() < 128 {
				s++
				m = new(big.Int).Lsh(big.NewInt(1), uint(s))
				m.Quo(m, d)
			}
		}
		lo := new(big.Int).And(m, new(big.Int).SetUint64(math.MaxUint64)).Uint64()
		hi := new(big.Int).Rsh(m, 64).Uint64()
		t[e-pow10Min] = u128{hi, lo}
	}
	return
}

// ⌊x·log10 2⌋, ⌊x·log2 10⌋ and ⌊x·log10 2 − log10(4/3)⌋ in integer
// arithmetic, exact over the exponents of float64 (Jeon 2020, section 6.3).
func mulLog10_2(x int) int                  { return (x * 78913) >> 18 }
func mulLog2_10(x int) int                  { return (x * 108853) >> 15 }
func mulLog10_2MinusLog10_4Over3(e int) int { return (e*631305 - 261663) >> 21 }

// pow64 is φ̃k with β for binary exponent e (Jeon 2020, section 5.2):
// rounded up where 10^k is not exact in 128 bits.
func pow64(k, e int) (u128, int) {
	φ := pow10Tab[k-pow10Min]
	if k < 0 || k > 55 {
		φ.lo++
	}
	return φ, e + 1 + mulLog2_10(k) - 1
}

// mulUpper128 is the upper 128 bits of the 192-bit product x·y.
func mulUpper128(x uint64, y u128) u128 {
	hi, lo := bits.Mul64(x, y.hi)
	t, _ := bits.Mul64(x, y.lo)
	lo2, c := bits.Add64(lo, t, 0)
	return u128{hi + c, lo2}
}

// mulLower128 is the lower 128 bits of the 192-bit product x·y.
func mulLower128(x uint64, y u128) u128 {
	high := x * y.hi
	hh, hl := bits.Mul64(x, y.lo)
	return u128{high + hh, hl}
}

// parity64 is the parity of the integer part of mant2·φ, and whether its
// fraction is zero (Jeon 2020, section 5.2.1).
func parity64(mant2 uint64, phi u128, beta int) (bool, bool) {
	r := mulLower128(mant2, phi)
	return (r.hi>>(64-beta))&1 != 0, (r.hi<<beta)|(r.lo>>(64-beta)) == 0
}

// trimZeros removes the trailing decimal zeros of x, with their count,
// by exact division (H. S. Warren, Hacker's Delight, 2nd ed., 10-16).
func trimZeros(x uint64) (uint64, int) {
	const (
		div1e8m  = 0xc767074b22e90e21
		div1e8le = math.MaxUint64 / 100000000
		div1e4m  = 0xd288ce703afb7e91
		div1e4le = math.MaxUint64 / 10000
		div1e2m  = 0x8f5c28f5c28f5c29
		div1e2le = math.MaxUint64 / 100
		div1e1m  = 0xcccccccccccccccd
		div1e1le = math.MaxUint64 / 10
	)
	// Most shortest digits end in no zero at all: one test for them.
	if bits.RotateLeft64(x*div1e1m, -1) > div1e1le {
		return x, 0
	}
	p := 0
	for _, s := range [...]struct {
		m, le uint64
		r     int
	}{{div1e8m, div1e8le, 8}, {div1e4m, div1e4le, 4}, {div1e2m, div1e2le, 2}, {div1e1m, div1e1le, 1}} {
		if q := bits.RotateLeft64(x*s.m, -s.r); q <= s.le {
			x = q
			p += s.r
		}
	}
	return x, p
}

// shortest returns the shortest decimal s·10^e that reads back to the
// float64 mant·2^exp (denorm for a subnormal).
func shortest(mant uint64, exp int, denorm bool) (uint64, int) {
	if mant == 1<<52 && !denorm {
		k0 := -mulLog10_2MinusLog10_4Over3(exp)
		φ, β := pow64(k0, exp)
		xi := (φ.hi - (φ.hi >> 54)) >> (64 - 52 - 1 - β)
		zi := (φ.hi + (φ.hi >> 53)) >> (64 - 52 - 1 - β)
		if exp != 2 && exp != 3 {
			xi++
		}
		q := zi / 10
		if xi <= q*10 {
			q, zeros := trimZeros(q)
			return q, -k0 + 1 + zeros
		}
		yru := (φ.hi>>(64-52-2-β) + 1) / 2
		if exp == -77 && yru%2 != 0 {
			yru--
		} else if yru < xi {
			yru++
		}
		return yru, -k0
	}
	const κ, p10κ, p10κ1 = 2, 100, 1000
	k0 := -mulLog10_2(exp)
	φ, β := pow64(κ+k0, exp)
	r128 := mulUpper128((mant*2+1)<<β, φ)
	zi, exact := r128.hi, r128.lo == 0
	s, r := zi/p10κ1, uint32(zi%p10κ1)
	δi := uint32(φ.hi >> (64 - 1 - β))
	if r < δi {
		if r != 0 || !exact || mant%2 == 0 {
			s, zeros := trimZeros(s)
			return s, -k0 + 1 + zeros
		}
		s--
		r = p10κ * 10
	} else if r == δi {
		parity, exact := parity64(mant*2-1, φ, β)
		if parity || (exact && mant%2 == 0) {
			s, zeros := trimZeros(s)
			return s, -k0 + 1 + zeros
		}
	}
	D := r + p10κ/2 - δi/2
	t, ρ := D/p10κ, D%p10κ
	yru := 10*s + uint64(t)
	if ρ == 0 {
		parity, exact := parity64(mant*2, φ, β)
		if parity != ((D-p10κ/2)%2 != 0) || exact && yru%2 != 0 {
			yru--
		}
	}
	return yru, -k0
}

// smalls holds the two digits of 0 to 99.
const smalls = "00010203040506070809" +
	"10111213141516171819" +
	"20212223242526272829" +
	"30313233343536373839" +
	"40414243444546474849" +
	"50515253545556575859" +
	"60616263646566676869" +
	"70717273747576777879" +
	"80818283848586878889" +
	"90919293949596979899"

// put8 writes x, below 10^8, as eight digits with leading zeros, all
// eight at once in the lanes of one 64-bit word: x splits into two halves
// of four digits (lanes of 32 bits), each into two pairs (16 bits), each
// pair into two digits (8 bits). The divisions are multiplications:
// ⌊y·10486/2^20⌋ = ⌊y/100⌋ for y < 10^4 and ⌊y·103/2^10⌋ = ⌊y/10⌋ for
// y < 100 (TestPut8 checks both over their whole range).
func put8(d *[8]byte, x uint32) {
	v := uint64(x/10000) | uint64(x%10000)<<32 // the first four digits in the low lane
	q := v * 10486 >> 20 & 0x0000007f_0000007f
	v = q | (v-q*100)<<16
	q = v * 103 >> 10 & 0x000f_000f_000f_000f
	v = q | (v-q*10)<<8
	binary.LittleEndian.PutUint64(d[:], v|0x30303030_30303030)
}

// decimalLen is the number of decimal digits of x, at least 1: from the
// number of its bits, log10(2) ≈ 1233/4096, then one compare.
func decimalLen(x uint64) int {
	t := bits.Len64(x|1) * 1233 >> 12
	if t > 0 && x < pow10u64[t] {
		return t
	}
	return t + 1
}

// pow10u64 holds 10^0 to 10^19.
var pow10u64 = [20]uint64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9,
	1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19}

// AppendNumber writes v in the shortest form that reads back to the same
// float64 ("2797.6", "1.5e-05"), which spreadsheets and JSON read as a
// number: the one form every answer gives its numbers in. It writes what
// strconv.AppendFloat(b, v, 'g', -1, 64) writes, byte for byte, at about
// half its cost (BenchmarkAppendNumber): the shortest digits by Dragonbox,
// laid out as 'g' lays them out.
func AppendNumber(b []byte, v float64) []byte {
	u := math.Float64bits(v)
	e := int(u>>52) & 0x7ff
	m := u & (1<<52 - 1)
	if e == 0x7ff || e == 0 && m == 0 {
		return strconv.AppendFloat(b, v, 'g', -1, 64)
	}
	// A whole number below 10^6 in size (a typed temperature, a row
	// count) is its own shortest form: every integer below 2^53 is a
	// float64, so no shorter string of digits reads back as it; and 'g'
	// writes it without an exponent.
	if i := int64(v); float64(i) == v && -1e6 < i && i < 1e6 {
		if i < 0 {
			b = append(b, '-')
			i = -i
		}
		var d [8]byte
		put8(&d, uint32(i))
		return append(b, d[len(d)-decimalLen(uint64(i)):]...)
	}
	denorm := e == 0
	if denorm {
		e = 1
	} else {
		m |= 1 << 52
	}
	s, x := shortest(m, e-1023-52, denorm)
	// The digits go to fixed places at the end of d, eight at a time.
	var d [24]byte
	if s < 1e8 {
		put8((*[8]byte)(d[16:]), uint32(s))
	} else {
		hi := s / 1e8
		put8((*[8]byte)(d[16:]), uint32(s-hi*1e8))
		if hi < 1e8 {
			put8((*[8]byte)(d[8:]), uint32(hi))
		} else { // s < 10^17: one digit more
			top := hi / 1e8
			put8((*[8]byte)(d[8:]), uint32(hi-top*1e8))
			d[7] = byte('0' + top)
		}
	}
	digs := d[len(d)-decimalLen(s):]
	nd := len(digs)
	dp := nd + x
	if u>>63 != 0 {
		b = append(b, '-')
	}
	if xe := dp - 1; xe < -4 || xe >= 6 {
		b = append(b, digs[0])
		if nd > 1 {
			b = append(b, '.')
			b = append(b, digs[1:]...)
		}
		b = append(b, 'e')
		if xe < 0 {
			b = append(b, '-')
			xe = -xe
		} else {
			b = append(b, '+')
		}
		if xe < 10 {
			return append(b, '0', byte('0'+xe))
		}
		if xe < 100 {
			return append(b, smalls[2*xe], smalls[2*xe+1])
		}
		return append(b, byte('0'+xe/100), smalls[2*(xe%100)], smalls[2*(xe%100)+1])
	}
	switch {
	case dp <= 0:
		b = append(b, '0', '.')
		for range -dp {
			b = append(b, '0')
		}
		return append(b, digs...)
	case dp >= nd:
		b = append(b, digs...)
		for range dp - nd {
			b = append(b, '0')
		}
		return b
	}
	b = append(b, digs[:dp]...)
	b = append(b, '.')
	return append(b, digs[dp:]...)
}
