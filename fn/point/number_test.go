package point

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// AppendNumber must write what strconv.AppendFloat(b, v, 'g', -1, 64)
// writes (Go's formatter, which the answers used before and which reads
// back exactly: ParseFloat of its text is v), for every float64. The
// cases below cover each branch of Dragonbox and of the 'g' layout.
func TestAppendNumberAsStrconv(t *testing.T) {
	check := func(v float64) {
		t.Helper()
		got, want := string(AppendNumber([]byte("x"), v)), "x"+strconv.FormatFloat(v, 'g', -1, 64)
		if got != want {
			t.Fatalf("%v (bits %#016x): %s, want %s", v, math.Float64bits(v), got, want)
		}
	}
	for _, v := range []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.NaN(),
		1, -1, 0.1, 0.2, 0.3, 1e-5, 1e-4, 9.999999999999999e-05, 1e5, 1e6, 999999, 999999.9999999999,
		123456, 1234567, 2797.6, 1.5e-05, 100, 1e21, 1e22, 1e23, 5e-324, math.SmallestNonzeroFloat64,
		math.MaxFloat64, 2.2250738585072014e-308, 2.225073858507201e-308, 1 << 53, 1<<53 + 2} {
		check(v)
		check(-v)
	}
	// Every binary exponent with the smallest significand (Dragonbox's
	// Algorithm 5.6, the shorter interval) and with a few others.
	for e := uint64(0); e < 2047; e++ {
		for _, m := range []uint64{0, 1, 2, 3, 1<<52 - 1, 1 << 51, 0x5555555555555} {
			check(math.Float64frombits(e<<52 | m))
		}
	}
	// Powers of ten and their neighbours, where the layout changes and
	// where the digits end in zeros.
	for k := -325; k <= 308; k++ {
		v, _ := strconv.ParseFloat("1e"+strconv.Itoa(k), 64)
		check(v)
		check(math.Nextafter(v, 0))
		check(math.Nextafter(v, math.Inf(1)))
		check(3 * v)
	}
	r := rand.New(rand.NewPCG(17, 2026))
	for range 1_500_000 {
		check(math.Float64frombits(r.Uint64()))                               // any bits
		check(r.Float64() * math.Pow(10, float64(r.IntN(40)-20)))             // any digits, near 1
		check(float64(r.IntN(10_000_000)) / math.Pow(10, float64(r.IntN(9)))) // few digits, as typed
	}
}

// Each number an answer writes reads back to its value (ParseFloat).
func TestAppendNumberReadsBack(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 1997))
	for range 200_000 {
		v := math.Float64frombits(r.Uint64())
		if math.IsNaN(v) {
			continue
		}
		back, err := strconv.ParseFloat(string(AppendNumber(nil, v)), 64)
		if err != nil || back != v {
			t.Fatalf("%v reads back as %v (%v)", v, back, err)
		}
	}
}

var numberSink []byte

// BenchmarkAppendNumber compares AppendNumber with strconv on values of
// the size answers hold (0 to 3000, all digits).
func BenchmarkAppendNumber(b *testing.B) {
	r := rand.New(rand.NewPCG(1, 1))
	vs := make([]float64, 1024)
	for i := range vs {
		vs[i] = r.Float64() * 3000
	}
	buf := make([]byte, 0, 64)
	b.Run("steamcell", func(b *testing.B) {
		for i := 0; b.Loop(); i++ {
			numberSink = AppendNumber(buf[:0], vs[i&1023])
		}
	})
	b.Run("strconv", func(b *testing.B) {
		for i := 0; b.Loop(); i++ {
			numberSink = strconv.AppendFloat(buf[:0], vs[i&1023], 'g', -1, 64)
		}
	})
}

// TestAppendNumberWholeNumbers holds the whole numbers, which AppendNumber
// writes by a shorter way, to strconv: every one up to 10^6 in size and a
// few beyond, where 'g' takes an exponent.
func TestAppendNumberWholeNumbers(t *testing.T) {
	var got, want []byte
	check := func(v float64) {
		got, want = AppendNumber(got[:0], v), strconv.AppendFloat(want[:0], v, 'g', -1, 64)
		if string(got) != string(want) {
			t.Fatalf("AppendNumber(%v) = %s, want %s", v, got, want)
		}
	}
	for i := -1_000_001; i <= 1_000_001; i++ {
		check(float64(i))
	}
	for _, v := range []float64{1e7, 123456789, 1 << 53, -(1 << 53), 1<<53 + 2, 1e21, 1e22, -1e300} {
		check(v)
	}
}

// TestPut8 checks the divisions put8 makes by multiplying, over the whole
// range it uses them on, and its digits against fmt's over every 997th
// value below 10^8 and the edges.
func TestPut8(t *testing.T) {
	for y := uint64(0); y < 10000; y++ {
		if y*10486>>20 != y/100 {
			t.Fatalf("⌊%d·10486/2^20⌋ = %d, want %d", y, y*10486>>20, y/100)
		}
	}
	for y := uint64(0); y < 100; y++ {
		if y*103>>10 != y/10 {
			t.Fatalf("⌊%d·103/2^10⌋ = %d, want %d", y, y*103>>10, y/10)
		}
	}
	check := func(x uint32) {
		var d [8]byte
		put8(&d, x)
		if got, want := string(d[:]), fmt.Sprintf("%08d", x); got != want {
			t.Fatalf("put8(%d) = %q, want %q", x, got, want)
		}
	}
	for x := uint32(0); x < 1e8; x += 997 {
		check(x)
	}
	for _, x := range []uint32{0, 1, 9, 10, 99, 100, 9999, 10000, 10001, 99999999} {
		check(x)
	}
}

// TestDecimalLen checks the digit count at every power of ten and its
// neighbours.
func TestDecimalLen(t *testing.T) {
	for n := 1; n < 20; n++ {
		p := pow10u64[n]
		if decimalLen(p-1) != n || decimalLen(p) != n+1 {
			t.Errorf("decimalLen(10^%d-1) = %d, decimalLen(10^%d) = %d; want %d, %d", n, decimalLen(p-1), n, decimalLen(p), n, n+1)
		}
	}
	if decimalLen(0) != 1 || decimalLen(math.MaxUint64) != 20 {
		t.Errorf("decimalLen(0) = %d, decimalLen(max) = %d; want 1, 20", decimalLen(0), decimalLen(math.MaxUint64))
	}
}
