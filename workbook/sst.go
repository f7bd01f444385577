package workbook

import (
	"bytes"
	"errors"
	"io"
	"strconv"
	"strings"
)

// sharedStrings is the table of shared strings, as one text and the
// offsets of its strings, so that a million strings cost two machine
// words each rather than a string header and an allocation.
type sharedStrings struct {
	text []byte
	ends []int32
}

func (t *sharedStrings) get(i int) (string, bool) {
	if i < 0 || i >= len(t.ends) {
		return "", false
	}
	start := int32(0)
	if i > 0 {
		start = t.ends[i-1]
	}
	return string(t.text[start:t.ends[i]]), true
}

// loadSharedStrings reads the shared-string part: the text of each <si>,
// its runs joined, phonetic runs left out. The part is streamed; what is
// kept counts against the memory budget.
func (p *pkg) loadSharedStrings() (*sharedStrings, error) {
	t := &sharedStrings{}
	if p.sstPart == "" || p.file(p.sstPart) == nil {
		return t, nil
	}
	f := p.file(p.sstPart)
	if p.loaded+int64(f.UncompressedSize64) > p.budget {
		return nil, &Error{Kind: ErrTooLarge, Msg: "the shared strings of " + p.base + " unpack to " + byteSize(f.UncompressedSize64) +
			", more than this fill may hold in memory (" + byteSize(uint64(p.budget)) + "); split the workbook"}
	}
	p.loaded += int64(f.UncompressedSize64)
	rc, err := p.open(p.sstPart)
	if err != nil {
		return nil, err
	}
	defer rc.Close()
	sc := newScanner(rc)
	inT, inPh := false, false
	for {
		tok, err := sc.next()
		if err == io.EOF {
			return t, nil
		}
		if err != nil {
			return nil, wrapPartErr(p, p.sstPart, err)
		}
		switch tok.kind {
		case tokStart:
			switch string(tok.name()) {
			case "t":
				inT = !inPh
			case "rPh":
				inPh = true
			}
		case tokEmpty:
			if tok.is("si") {
				t.ends = append(t.ends, int32(len(t.text)))
			}
		case tokEnd:
			switch string(tok.name()) {
			case "t":
				inT = false
			case "rPh":
				inPh = false
			case "si":
				t.ends = append(t.ends, int32(len(t.text)))
			}
		case tokText:
			if inT {
				if bytes.HasPrefix(tok.raw, []byte("<![CDATA[")) {
					t.text = append(t.text, tok.raw[9:len(tok.raw)-3]...)
				} else {
					t.text = append(t.text, unescape(tok.raw)...)
				}
			}
		}
	}
}

// wrapPartErr makes a scanner error of a part into the damaged-workbook
// error, unless it is one already.
func wrapPartErr(p *pkg, part string, err error) error {
	var we *Error
	if errors.As(err, &we) {
		return err
	}
	return damaged(p.base, &partErr{part: part, err: err})
}

type partErr struct {
	part string
	err  error
}

func (e *partErr) Error() string { return e.part + ": " + e.err.Error() }
func (e *partErr) Unwrap() error { return e.err }

// value is the text of a cell as the fill reads it: shared strings looked
// up, inline text as written, numbers as stored.
func (t *sharedStrings) value(c *cellData) string {
	switch c.typ {
	case "s":
		i, err := strconv.Atoi(strings.TrimSpace(c.v))
		if err != nil {
			return c.v
		}
		s, _ := t.get(i)
		return s
	case "inlineStr":
		if c.is != "" || c.v == "" {
			return c.is
		}
	}
	return c.v
}
