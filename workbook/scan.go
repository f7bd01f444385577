package workbook

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"strconv"
	"unicode/utf8"
)

// The parts the writer changes are read and written with a byte-level
// scanner, not with encoding/xml: the scanner hands out every token as the
// exact bytes of the input, so a part is copied as it was except where a
// token is changed on purpose. encoding/xml's encoder cannot re-emit
// prefixed names (x14ac:dyDescent, mc:Ignorable) as they were written, and
// decoding and encoding every token of a million-row sheet costs several
// times the scan (see the README, "How the writer works").

// tokKind is the kind of an XML token.
type tokKind uint8

const (
	tokText  tokKind = iota // character data, CDATA included
	tokStart                // <name ...>
	tokEnd                  // </name>
	tokEmpty                // <name .../>
	tokOther                // <?...?>, <!--...-->, <!DOCTYPE ...>
)

// token is one token of an XML document. raw holds its exact bytes and
// is valid until the next call of next.
type token struct {
	kind tokKind
	raw  []byte
}

// name returns the local name of a start, end or empty-element tag: the
// part after any prefix.
func (t token) name() []byte {
	full := t.qname()
	if i := bytes.IndexByte(full, ':'); i >= 0 {
		return full[i+1:]
	}
	return full
}

// qname returns the name of a tag as written, prefix included.
func (t token) qname() []byte {
	b := t.raw[1:]
	if t.kind == tokEnd {
		b = b[1:]
	}
	end := 0
	for end < len(b) && !isSpace(b[end]) && b[end] != '>' && b[end] != '/' {
		end++
	}
	return b[:end]
}

// prefix returns the prefix of a tag's name with its colon ("x:"), or "".
func (t token) prefix() string {
	full := t.qname()
	if i := bytes.IndexByte(full, ':'); i >= 0 {
		return string(full[:i+1])
	}
	return ""
}

func (t token) is(local string) bool { return string(t.name()) == local }

func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' }

// maxToken is the longest token the scanner accepts: far above any cell
// (a cell holds at most 32,767 characters), so that a damaged part cannot
// make it hold an unbounded amount of memory.
const maxToken = 4 << 20

// errXMLToken is returned for a part the scanner cannot tokenise.
var errXMLToken = errors.New("malformed XML")

// scanner reads an XML document token by token.
type scanner struct {
	r   *bufio.Reader
	buf []byte
}

func newScanner(r io.Reader) *scanner {
	return &scanner{r: bufio.NewReaderSize(r, 64<<10)}
}

// next returns the next token, or io.EOF at the end.
func (s *scanner) next() (token, error) {
	s.buf = s.buf[:0]
	c, err := s.r.ReadByte()
	if err != nil {
		return token{}, err
	}
	if c != '<' {
		s.buf = append(s.buf, c)
		for {
			chunk, err := s.r.ReadSlice('<')
			if err == nil {
				s.buf = append(s.buf, chunk[:len(chunk)-1]...)
				_ = s.r.UnreadByte()
				return token{kind: tokText, raw: s.buf}, nil
			}
			s.buf = append(s.buf, chunk...)
			if err == io.EOF {
				return token{kind: tokText, raw: s.buf}, nil
			}
			if err != bufio.ErrBufferFull {
				return token{}, err
			}
			if len(s.buf) > maxToken {
				return token{}, fmt.Errorf("%w: text longer than %d bytes", errXMLToken, maxToken)
			}
		}
	}
	s.buf = append(s.buf, c)
	peek, _ := s.r.Peek(8)
	switch {
	case bytes.HasPrefix(peek, []byte("!--")):
		return s.until(tokOther, "-->")
	case bytes.HasPrefix(peek, []byte("![CDATA[")):
		return s.until(tokText, "]]>")
	case len(peek) > 0 && (peek[0] == '?' || peek[0] == '!'):
		return s.until(tokOther, ">")
	}
	// A tag: up to the '>' that is outside quoted attribute values.
	var quote byte
	for {
		chunk, err := s.r.ReadSlice('>')
		for _, b := range chunk {
			switch {
			case quote != 0 && b == quote:
				quote = 0
			case quote == 0 && (b == '"' || b == '\''):
				quote = b
			}
		}
		s.buf = append(s.buf, chunk...)
		if err == nil && quote == 0 {
			break
		}
		if err != nil && err != bufio.ErrBufferFull {
			if err == io.EOF {
				err = fmt.Errorf("%w: the part ends inside a tag", errXMLToken)
			}
			return token{}, err
		}
		if len(s.buf) > maxToken {
			return token{}, fmt.Errorf("%w: tag longer than %d bytes", errXMLToken, maxToken)
		}
	}
	kind := tokStart
	switch {
	case len(s.buf) > 1 && s.buf[1] == '/':
		kind = tokEnd
	case len(s.buf) > 2 && s.buf[len(s.buf)-2] == '/':
		kind = tokEmpty
	}
	return token{kind: kind, raw: s.buf}, nil
}

// until reads up to and including end.
func (s *scanner) until(kind tokKind, end string) (token, error) {
	for !bytes.HasSuffix(s.buf, []byte(end)) || len(s.buf) < 1+len(end) {
		chunk, err := s.r.ReadSlice(end[len(end)-1])
		s.buf = append(s.buf, chunk...)
		if err == io.EOF {
			return token{}, fmt.Errorf("%w: the part ends inside %q", errXMLToken, end)
		}
		if err != nil && err != bufio.ErrBufferFull {
			return token{}, err
		}
		if len(s.buf) > maxToken {
			return token{}, fmt.Errorf("%w: token longer than %d bytes", errXMLToken, maxToken)
		}
	}
	return token{kind: kind, raw: s.buf}, nil
}

// attr returns the value of the attribute name (as written, prefix
// included) of a start or empty tag, unescaped, and whether it is there.
func attr(tag []byte, name string) (string, bool) {
	start, end, ok := attrSpan(tag, name)
	if !ok {
		return "", false
	}
	return unescape(tag[start:end]), true
}

// attrSpan finds the value of attribute name in tag: tag[start:end] is the
// value between its quotes.
func attrSpan(tag []byte, name string) (start, end int, ok bool) {
	i := 1
	for i < len(tag) && !isSpace(tag[i]) && tag[i] != '>' && tag[i] != '/' {
		i++
	}
	for i < len(tag) {
		for i < len(tag) && (isSpace(tag[i]) || tag[i] == '/') {
			i++
		}
		if i >= len(tag) || tag[i] == '>' {
			return 0, 0, false
		}
		ns := i
		for i < len(tag) && tag[i] != '=' && !isSpace(tag[i]) && tag[i] != '>' {
			i++
		}
		an := tag[ns:i]
		for i < len(tag) && (isSpace(tag[i]) || tag[i] == '=') {
			i++
		}
		if i >= len(tag) {
			return 0, 0, false
		}
		q := tag[i]
		if q != '"' && q != '\'' {
			return 0, 0, false
		}
		vs := i + 1
		ve := bytes.IndexByte(tag[vs:], q)
		if ve < 0 {
			return 0, 0, false
		}
		if string(an) == name {
			return vs, vs + ve, true
		}
		i = vs + ve + 1
	}
	return 0, 0, false
}

// setAttr returns tag with attribute name set to value (escaped here):
// replaced in place where it is, added before the tag's end otherwise.
func setAttr(tag []byte, name, value string) []byte {
	out := make([]byte, 0, len(tag)+len(name)+len(value)+4)
	if start, end, ok := attrSpan(tag, name); ok {
		out = append(out, tag[:start]...)
		out = appendEscaped(out, value, true)
		return append(out, tag[end:]...)
	}
	cut := len(tag) - 1
	if tag[cut-1] == '/' {
		cut--
	}
	out = append(out, tag[:cut]...)
	out = append(out, ' ')
	out = append(out, name...)
	out = append(out, '=', '"')
	out = appendEscaped(out, value, true)
	out = append(out, '"')
	return append(out, tag[cut:]...)
}

// openOf turns an empty-element tag <x .../> into a start tag <x ...>.
func openOf(tag []byte) []byte {
	out := append([]byte(nil), tag[:len(tag)-2]...)
	for len(out) > 0 && isSpace(out[len(out)-1]) {
		out = out[:len(out)-1]
	}
	return append(out, '>')
}

// unescape decodes the five predefined entities and character references.
// A malformed reference is kept as written.
func unescape(b []byte) string {
	if bytes.IndexByte(b, '&') < 0 {
		return string(b)
	}
	out := make([]byte, 0, len(b))
	for len(b) > 0 {
		i := bytes.IndexByte(b, '&')
		if i < 0 {
			out = append(out, b...)
			break
		}
		out = append(out, b[:i]...)
		b = b[i:]
		semi := bytes.IndexByte(b, ';')
		if semi < 0 {
			out = append(out, b...)
			break
		}
		ent := string(b[1:semi])
		var r rune = -1
		switch ent {
		case "amp":
			r = '&'
		case "lt":
			r = '<'
		case "gt":
			r = '>'
		case "quot":
			r = '"'
		case "apos":
			r = '\''
		default:
			if len(ent) > 1 && ent[0] == '#' {
				var n uint64
				var err error
				if ent[1] == 'x' || ent[1] == 'X' {
					n, err = strconv.ParseUint(ent[2:], 16, 32)
				} else {
					n, err = strconv.ParseUint(ent[1:], 10, 32)
				}
				if err == nil && utf8.ValidRune(rune(n)) {
					r = rune(n)
				}
			}
		}
		if r < 0 {
			out = append(out, b[:semi+1]...)
		} else {
			out = utf8.AppendRune(out, r)
		}
		b = b[semi+1:]
	}
	return string(out)
}

// appendEscaped appends s escaped for XML text, or for an attribute value
// when inAttr. Characters XML 1.0 cannot hold are dropped.
func appendEscaped(b []byte, s string, inAttr bool) []byte {
	for _, r := range s {
		switch {
		case r == '&':
			b = append(b, "&amp;"...)
		case r == '<':
			b = append(b, "&lt;"...)
		case r == '>':
			b = append(b, "&gt;"...)
		case r == '"' && inAttr:
			b = append(b, "&quot;"...)
		case (r == '\n' || r == '\t' || r == '\r') && inAttr:
			b = append(b, "&#"+strconv.Itoa(int(r))+";"...)
		case r == '\t' || r == '\n' || r == '\r' || r >= 0x20 && r != 0xFFFE && r != 0xFFFF:
			b = utf8.AppendRune(b, r)
		}
	}
	return b
}

func escapeText(s string) string { return string(appendEscaped(nil, s, false)) }
func escapeAttr(s string) string { return string(appendEscaped(nil, s, true)) }
