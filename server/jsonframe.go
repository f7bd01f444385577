package server

// The JSON rows of a batch are framed here on the bytes of the read buffer:
// each element of the array is found, checked and compacted in one pass,
// with no decoder and no allocation. What this framer does not take (an
// element it cannot check in full, longer than the buffer or nested deeper
// than maxFrameDepth, anything malformed, anything after the closing ]) it
// leaves unread, and the body goes on through encoding/json's decoder,
// which then says what is wrong in its own words. So the framer only has
// to be right where it answers: it must take nothing that encoding/json
// refuses (RFC 8259's grammar), and give each element as Decode and
// Compact would. TestJSONRowsAsEncodingJSON and FuzzJSONRows hold it to
// that.

// maxFrameDepth is the nesting the framer checks itself; deeper elements
// (rare in rows of a table) go to the decoder.
const maxFrameDepth = 32

// jsonSpace reports whether c is JSON whitespace (RFC 8259 section 2).
func jsonSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' }

// skipSpace returns the index of the first byte of b at or after i that
// is not whitespace (len(b) when there is none).
func skipSpace(b []byte, i int) int {
	for i < len(b) && jsonSpace(b[i]) {
		i++
	}
	return i
}

// field is where one member of an object lies: its key, quotes included,
// and its value, and what the framer saw of their strings.
type field struct {
	key, val [2]int
	keyText  strText // of the key
	valText  strText // of the value, when it is a string
}

// strText says what a string holds beyond plain ASCII text: whether it
// must be decoded to be read (escapes; bytes of 0x80 and above, which may
// not be UTF-8 and which decoding then turns into U+FFFD).
type strText uint8

const (
	strEscaped  strText = 1 << iota // a backslash escape
	strNonASCII                     // a byte of 0x80 or above
)

// frameValue checks the JSON value that starts at b[i] and returns the
// index just after it, and whether whitespace lies inside it (outside its
// strings). ok is false when the value is malformed or does not end
// within b (a number must be followed by a byte that ends it). When the
// value is an object and fields is not nil, the places of its members in
// b are appended to *fields (not those of objects within it), so that the
// row is read without a second pass.
func frameValue(b []byte, i, depth int, fields *[]field) (end int, spaced, ok bool) {
	if i >= len(b) {
		return i, false, false
	}
	switch c := b[i]; {
	case c == '"':
		end, _, ok = frameString(b, i)
		return end, false, ok
	case c == '{' || c == '[':
		if depth >= maxFrameDepth {
			return i, false, false
		}
		closer := byte('}')
		if c == '[' {
			closer = ']'
		}
		j := skipSpace(b, i+1)
		spaced = j > i+1
		if j < len(b) && b[j] == closer {
			return j + 1, spaced, true
		}
		for {
			var f field
			if c == '{' {
				if j >= len(b) || b[j] != '"' {
					return j, spaced, false
				}
				f.key[0] = j
				if j, f.keyText, ok = frameString(b, j); !ok {
					return j, spaced, false
				}
				f.key[1] = j
				k := skipSpace(b, j)
				if k >= len(b) || b[k] != ':' {
					return k, spaced, false
				}
				spaced = spaced || k > j
				j = skipSpace(b, k+1)
				spaced = spaced || j > k+1
			}
			var e int
			var sp bool
			if j < len(b) && b[j] == '"' {
				e, f.valText, ok = frameString(b, j)
			} else {
				e, sp, ok = frameValue(b, j, depth+1, nil)
			}
			if !ok {
				return e, spaced, false
			}
			if c == '{' && fields != nil {
				f.val = [2]int{j, e}
				*fields = append(*fields, f)
			}
			k := skipSpace(b, e)
			spaced = spaced || sp || k > e
			if k >= len(b) {
				return k, spaced, false
			}
			switch b[k] {
			case closer:
				return k + 1, spaced, true
			case ',':
				j = skipSpace(b, k+1)
				spaced = spaced || j > k+1
			default:
				return k, spaced, false
			}
		}
	case c == '-' || '0' <= c && c <= '9':
		end, ok = frameNumber(b, i)
		return end, false, ok
	case c == 't':
		return frameWord(b, i, "true")
	case c == 'f':
		return frameWord(b, i, "false")
	case c == 'n':
		return frameWord(b, i, "null")
	}
	return i, false, false
}

func frameWord(b []byte, i int, w string) (int, bool, bool) {
	if len(b)-i < len(w) || string(b[i:i+len(w)]) != w {
		return i, false, false
	}
	return i + len(w), false, true
}

// frameString checks the string that starts at the quote b[i]: no control
// character, only the escapes of RFC 8259 section 7. It also says whether
// the string has escapes or bytes above ASCII.
func frameString(b []byte, i int) (int, strText, bool) {
	var t strText
	for j := i + 1; j < len(b); j++ {
		switch c := b[j]; {
		case c == '"':
			return j + 1, t, true
		case c < 0x20:
			return j, t, false
		case c >= 0x80:
			t |= strNonASCII
		case c == '\\':
			t |= strEscaped
			j++
			if j >= len(b) {
				return j, t, false
			}
			switch b[j] {
			case '"', '\\', '/', 'b', 'f', 'n', 'r', 't':
			case 'u':
				if len(b)-j <= 4 {
					return j, t, false
				}
				for _, h := range b[j+1 : j+5] {
					if !('0' <= h && h <= '9' || 'a' <= h|0x20 && h|0x20 <= 'f') {
						return j, t, false
					}
				}
				j += 4
			default:
				return j, t, false
			}
		}
	}
	return len(b), t, false
}

// frameNumber checks the number that starts at b[i] (RFC 8259 section 6):
// -?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?, followed by a byte of b.
func frameNumber(b []byte, i int) (int, bool) {
	digits := func(j int) int {
		for j < len(b) && '0' <= b[j] && b[j] <= '9' {
			j++
		}
		return j
	}
	j := i
	if b[j] == '-' {
		j++
	}
	switch {
	case j < len(b) && b[j] == '0':
		j++
	case j < len(b) && '1' <= b[j] && b[j] <= '9':
		j = digits(j)
	default:
		return j, false
	}
	if j < len(b) && b[j] == '.' {
		k := digits(j + 1)
		if k == j+1 {
			return k, false
		}
		j = k
	}
	if j < len(b) && (b[j] == 'e' || b[j] == 'E') {
		j++
		if j < len(b) && (b[j] == '+' || b[j] == '-') {
			j++
		}
		k := digits(j)
		if k == j {
			return k, false
		}
		j = k
	}
	return j, j < len(b)
}

// appendCompact appends the checked value v without the whitespace
// outside its strings, as json.Compact writes it.
func appendCompact(dst, v []byte) []byte {
	for i := 0; i < len(v); i++ {
		switch c := v[i]; {
		case c == '"':
			end, _, _ := frameString(v, i)
			dst = append(dst, v[i:end]...)
			i = end - 1
		case jsonSpace(c):
		default:
			dst = append(dst, c)
		}
	}
	return dst
}
