package server

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"slices"
	"strconv"
	"strings"
	"sync"
	"time"
	"unicode/utf8"
	"unsafe"

	"github.com/gin-gonic/gin"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Limits of the batch stream. Between two flushes the server holds at most
// chunkRows rows (chunkRowsTwo with two workers) or about chunkBytes of
// input, whichever comes first, with their answers, plus one row of at
// most maxRowBytes being read: that, not the number of rows, bounds the
// memory of a batch (a row of the chunk with its input is a few hundred
// bytes, an answer about 1.5 KB, of which each worker holds blockRows; all
// kept from batch to batch: batchMemory). One worker takes small chunks,
// whose rows are still in the caches when they are solved and written.
// Two workers take large ones, so that a half is worth handing over: on
// the 2-CPU development machine a half of 128 rows (about 65 µs of work)
// gained nothing or lost on the second CPU, as waking an idle CPU takes
// tens of microseconds there, while halves of 1024 rows gained 1.5 to 1.6
// times (BenchmarkHandOver). Each worker solves and writes its half in
// blocks of blockRows, so that the answers it writes are still in the
// caches.
const (
	chunkRows    = 256
	chunkRowsTwo = 2048
	blockRows    = 128
	chunkBytes   = 1 << 20
	maxRowBytes  = 1 << 20
)

// postBatch answers many points: a CSV body (a header naming two inputs,
// units in brackets, other columns passed through) or a JSON array of
// objects ({"p":"6 barg","t":"330C","tag":"FW-1"}). The answer has one row
// per input row, in order, each with its status: "ok" or the reason. It is
// CSV for a CSV body and JSON for a JSON body unless format= says
// otherwise. The body is received first, then rows are read, solved (on up
// to two workers) and written in order, flushed every chunk.
//
// POST /batch
func (s *Server) postBatch(c *gin.Context) {
	req, err := s.readRequest(c.Request.URL.RawQuery, takesGet|takesFormat)
	if err != nil {
		s.fail(c, err)
		return
	}
	kind, err := bodyKind(c.ContentType())
	if err != nil {
		s.fail(c, err)
		return
	}
	sp, err := spoolBody(c.Writer, c.Request, s.cfg.MaxBodyBytes, s.cfg.ReadTimeout, s.cfg.WriteTimeout, true)
	if err != nil {
		s.fail(c, err)
		return
	}
	defer sp.Close()
	lim := &rowLimit{r: sp.reader(), max: maxRowBytes}
	m := batchMemories.Get().(*batchMemory)
	defer m.put()
	br := m.br
	br.Reset(lim)
	if kind == "" {
		kind = sniffKind(br)
	}
	out := &batchOut{opt: req.opt, syms: req.syms, format: req.format}
	if out.syms == nil {
		out.syms = point.DefaultSymbols()
	}
	var src rowSource
	if kind == "json" {
		src, err = newJSONSource(br, lim, req.opt.Set)
	} else {
		var cs *csvSource
		cs, err = newCSVSource(br, lim, req.opt.Set)
		if err == nil {
			src, out.header, out.delim = cs, cs.header, cs.r.Comma
			c.Header("Steamcell-Columns", cs.notes())
		}
	}
	if err != nil {
		s.fail(c, err)
		return
	}
	if out.format == "" {
		out.format = kind
	}
	out.prepare()
	s.streamBatch(c, src, out, m)
}

// batchMemory is what a batch reads, solves and writes through, kept for
// the next batch (a sync.Pool): a server that answers batch after batch
// grows its rows' buffers once, and its collector has little to do.
type batchMemory struct {
	rows    []batchRow
	halves  [2][]byte // the answers of a chunk, as solveChunk writes them
	answers [2][blockRows]rowAnswer
	br      *bufio.Reader
	bw      *bufio.Writer
}

var batchMemories = sync.Pool{New: func() any {
	return &batchMemory{
		rows: make([]batchRow, chunkRowsTwo),
		br:   bufio.NewReaderSize(nil, 64<<10),
		bw:   bufio.NewWriterSize(nil, 64<<10),
	}
}}

// put returns m to the pool, holding nothing of the request and none of
// the few buffers that an unusual row made large.
func (m *batchMemory) put() {
	m.br.Reset(nil)
	m.bw.Reset(nil)
	for i := range m.rows {
		r := &m.rows[i]
		r.gen = 0 // the next batch numbers its columns anew
		if cap(r.raw) > 64<<10 || cap(r.line) > 64<<10 {
			// The cells and inputs view these buffers: they go too.
			r.raw, r.line, r.cells, r.given = nil, nil, nil, nil
		}
	}
	for i := range m.halves {
		if cap(m.halves[i]) > 4*chunkBytes {
			m.halves[i] = nil
		}
	}
	batchMemories.Put(m)
}

// bodyKind says from the Content-Type whether a body is CSV or JSON; ""
// means the type does not say (form, octet-stream, plain text, none) and
// the body is sniffed.
func bodyKind(contentType string) (string, error) {
	switch strings.ToLower(contentType) {
	case "text/csv", "application/csv", "text/tab-separated-values":
		return "csv", nil
	case "application/json":
		return "json", nil
	case "", "text/plain", "application/octet-stream", "application/x-www-form-urlencoded":
		return "", nil
	}
	return "", errorf(ErrMediaType, "Content-Type", "a batch body is CSV (text/csv) or a JSON array (application/json), not %s", clean(contentType, 60))
}

// sniffKind reads a body as JSON when its first character (after a byte
// order mark and spaces) opens an array or object, else as CSV.
func sniffKind(br *bufio.Reader) string {
	head, _ := br.Peek(512)
	head = bytes.TrimPrefix(head, []byte("\ufeff"))
	head = bytes.TrimLeft(head, " \t\r\n")
	if len(head) > 0 && (head[0] == '[' || head[0] == '{') {
		return "json"
	}
	return "csv"
}

// errRowTooLong stops a batch whose row would not fit the memory bound.
var errRowTooLong = errorf(ErrBadBody, "", "a row is longer than %d bytes; is every row on its own line?", maxRowBytes)

// rowLimit stops reading when one row has taken more than max bytes of
// the body since the last reset (the count includes read-ahead, so the
// limit is approximate to one buffer).
type rowLimit struct {
	r      io.Reader
	n, max int64
}

func (l *rowLimit) Read(p []byte) (int, error) {
	if l.n >= l.max {
		return 0, errRowTooLong
	}
	if int64(len(p)) > l.max-l.n {
		p = p[:l.max-l.n]
	}
	n, err := l.r.Read(p)
	l.n += int64(n)
	return n, err
}

func (l *rowLimit) reset() { l.n = 0 }

// batchRow is one row of a batch, as read, and whether it was answered.
type batchRow struct {
	n     int           // 1-based row number
	given []point.Given // the two inputs, or what the row holds; read only when err is nil
	cells []string      // CSV: the cells as read
	raw   []byte        // JSON: the element as sent, compacted
	err   error         // why the row cannot be solved as read
	ok    bool          // answered with "ok"

	// Kept from row to row, so that a row costs no allocation.
	line []byte // CSV: the line the cells view
	gen  int    // the source's columns that given was set up for (inputsOf)
}

// rowAnswer is the answer of one row, held only while its block is solved
// and written (blockRows of them per worker), so that a chunk of many rows
// holds their inputs but not their states.
type rowAnswer struct {
	in  [2]fn.Input // the inputs as solved
	err error       // why the row has no answer, as solved

	// Kept from row to row, so that a row costs no allocation.
	ans    point.Answer  // the answer
	inputs []point.Input // its inputs as understood
}

// inputsOf makes r.given the inputs of cols, their texts still to be set,
// and returns it. gen names cols within the batch (a JSON body's rows may
// change their keys): a row read with the same columns as the one before
// in its place keeps what it had, so that a row costs the texts only.
func (r *batchRow) inputsOf(cols []point.Column, gen int) []point.Given {
	if r.gen != gen || len(r.given) != len(cols) {
		r.given = r.given[:0]
		for i := range cols {
			r.given = append(r.given, cols[i].Given(""))
		}
		r.gen = gen
	}
	return r.given
}

func (r *batchRow) size() int {
	n := len(r.raw)
	for _, c := range r.cells {
		n += len(c)
	}
	return n
}

// rowSource reads rows of a batch body. next fills r; it returns io.EOF
// after the last row, and any other error when the body cannot be read on
// (the answer then ends with that reason). A problem of one row only is
// put in r.err.
type rowSource interface {
	next(r *batchRow) error
}

// csvSource reads a CSV body.
type csvSource struct {
	r       *csv.Reader
	br      *bufio.Reader // what r reads from, for the lines read without it
	lines   int           // lines read without r, which r does not count
	lim     *rowLimit
	header  []string
	inputs  []point.Column
	pending []string // the first data row, read while looking for a row of units
}

func newCSVSource(br *bufio.Reader, lim *rowLimit, set units.Set) (*csvSource, error) {
	r := csv.NewReader(br)
	r.Comma = sniffDelimiter(br)
	r.FieldsPerRecord = -1
	r.ReuseRecord = true
	rec, err := r.Read()
	if err == io.EOF {
		return nil, errorf(ErrBadBody, "", "the body is empty; send a header line naming two inputs (e.g. p [barg],t [°C]) and one line per point")
	}
	if err != nil {
		return nil, errorf(ErrBadBody, "", "the header line is not CSV: %v", err)
	}
	cs := &csvSource{r: r, br: br, lim: lim, header: append([]string(nil), rec...)}
	cs.header[0] = strings.TrimPrefix(cs.header[0], "\ufeff")
	for i, h := range cs.header {
		if !utf8.ValidString(h) {
			return nil, errorf(ErrBadBody, "", "header cell %d is not UTF-8 text; save the file as CSV UTF-8", i+1)
		}
	}
	// The line under the header may be a row of units ("barg,°C"); if it
	// is not, it is the first row of data.
	below := []string{}
	cs.lim.reset()
	if rec, err := r.Read(); err == nil {
		cs.pending = append([]string(nil), rec...)
		below = cs.pending
	}
	t, err := point.ReadTable(cs.header, below, nil, set)
	if err != nil {
		var pe *point.Error
		errors.As(err, &pe)
		return nil, errorf(ErrBadBody, clean(pe.Param, 40), "%s", clean(err.Error(), 600))
	}
	if t.UnitRow {
		cs.pending = nil
	}
	cs.inputs = t.Columns
	var names []string
	for i, in := range cs.inputs {
		for _, o := range cs.inputs[:i] {
			if o.Q == in.Q {
				return nil, &point.Error{Param: clean(in.Header, 40), Kind: point.ErrRepeatedInput, Msg: fmt.Sprintf(
					"columns %s and %s both hold %s; a batch takes one point per row: keep one, send each pair in its own batch, or send the file to POST /workbook",
					clean(o.Header, 40), clean(in.Header, 40), in.Q)}
			}
		}
		names = append(names, clean(in.Header, 40))
	}
	if len(cs.inputs) != 2 {
		msg := "the header names no input"
		if len(names) > 0 {
			msg = "the header names " + strconv.Itoa(len(names)) + " inputs (" + strings.Join(names, ", ") + ")"
		}
		return nil, &point.Error{Kind: point.ErrInputCount,
			Msg: msg + "; name exactly two, e.g. p [barg],t [°C]; other columns (tags, notes) are passed through. For two points per row send each pair in its own batch, or the file to POST /workbook"}
	}
	return cs, nil
}

// notes says how the input columns are read, for the Steamcell-Columns
// header of the answer (as ASCII: "deg C").
func (cs *csvSource) notes() string {
	var n []string
	for _, in := range cs.inputs {
		n = append(n, in.Note())
	}
	return headerText(strings.Join(n, "; "))
}

// sniffDelimiter picks the delimiter of the header line: a comma, or a
// semicolon or tab when the line has more of those (spreadsheets set to a
// decimal comma save CSV with semicolons).
func sniffDelimiter(br *bufio.Reader) rune {
	head, _ := br.Peek(4096)
	if i := bytes.IndexByte(head, '\n'); i >= 0 {
		head = head[:i]
	}
	comma, semi, tab := bytes.Count(head, []byte{','}), bytes.Count(head, []byte{';'}), bytes.Count(head, []byte{'\t'})
	switch {
	case semi > comma && semi >= tab:
		return ';'
	case tab > comma && tab > semi:
		return '\t'
	}
	return ','
}

func (cs *csvSource) next(row *batchRow) error {
	cs.lim.reset()
	row.cells, row.raw, row.err = row.cells[:0], row.raw[:0], nil
	if cs.pending != nil {
		row.cells = append(row.cells, cs.pending...)
		cs.pending = nil
	} else if !cs.plainLine(row) {
		rec, err := cs.r.Read()
		var pe *csv.ParseError
		switch {
		case err == io.EOF:
			return io.EOF
		case errors.As(err, &pe):
			row.err = errorf(ErrBadBody, "", "line %d is not CSV: %v", pe.Line+cs.lines, pe.Err)
			return nil
		case err != nil:
			return err
		}
		row.cells = append(row.cells, rec...)
	}
	if len(row.cells) > len(cs.header) {
		row.err = errorf(ErrBadBody, "", "the row has %d cells, the header %d", len(row.cells), len(cs.header))
		return nil
	}
	given := row.inputsOf(cs.inputs, 1)
	for i := range cs.inputs {
		text := ""
		if c := cs.inputs[i].Index; c < len(row.cells) {
			text = row.cells[c]
		}
		given[i].Text = text
	}
	return nil
}

// plainLine reads the next record into row when it is a line without
// quotes that the buffer holds whole: the common line, which it splits at
// the delimiter as encoding/csv would, but into the row's own memory with
// no allocation (csv.Reader makes a string per record). Empty lines are
// skipped as encoding/csv skips them. It reports false, having read
// nothing of the record, for everything else (quotes, a line longer than
// the buffer, the last line without a line break), which cs.r reads.
func (cs *csvSource) plainLine(row *batchRow) bool {
	delim := byte(cs.r.Comma)
	for {
		if cs.br.Buffered() == 0 {
			if _, err := cs.br.Peek(1); err != nil {
				return false
			}
		}
		buf, _ := cs.br.Peek(cs.br.Buffered())
		end := bytes.IndexByte(buf, '\n')
		if end < 0 {
			return false
		}
		line := buf[:end]
		if bytes.IndexByte(line, '"') >= 0 {
			return false
		}
		line = bytes.TrimSuffix(line, []byte{'\r'})
		if len(line) == 0 {
			_, _ = cs.br.Discard(end + 1)
			cs.lines++
			continue
		}
		row.line = append(row.line[:0], line...)
		_, _ = cs.br.Discard(end + 1)
		cs.lines++
		rest := row.line
		for {
			i := bytes.IndexByte(rest, delim)
			if i < 0 {
				row.cells = append(row.cells, bytesView(rest))
				return true
			}
			row.cells = append(row.cells, bytesView(rest[:i]))
			rest = rest[i+1:]
		}
	}
}

// bytesView is b as a string without a copy. The cells of a row view the
// row's own buffers, which are written again only when the row is read
// anew, after its answer has been written; nothing keeps a cell longer
// (the units cache copies what it keeps, error messages copy the text).
func bytesView(b []byte) string { return unsafe.String(unsafe.SliceData(b), len(b)) }

// jsonSource reads a JSON array of objects: on the bytes of the read
// buffer while the body is well formed (jsonframe.go), and through
// encoding/json's decoder from the first thing the framer does not take.
type jsonSource struct {
	br  *bufio.Reader
	dec *json.Decoder // nil until the decoder takes over
	lim *rowLimit
	set units.Set
	n   int // elements read

	// The keys of the last row and how they read (point.ReadTable): rows
	// of one batch mostly share their keys.
	keys  []string
	table point.Table
	gen   int // counts the tables, for batchRow.inputsOf
	err   error

	// Kept from row to row, so that a row costs no allocation.
	elem    json.RawMessage
	buf     bytes.Buffer
	rowKeys []string // the keys of a row that has others than the last, viewing it
	fields  []field  // where each member of the row lies in it
}

func newJSONSource(br *bufio.Reader, lim *rowLimit, set units.Set) (*jsonSource, error) {
	if b, _ := br.Peek(3); bytes.Equal(b, []byte("\ufeff")) {
		_, _ = br.Discard(3)
	}
	// The array's opening bracket, after any whitespace, as the
	// decoder's first Token would read it.
	for {
		c, err := br.ReadByte()
		if err == io.EOF {
			return nil, errorf(ErrBadBody, "", `the body is empty; send a JSON array of objects, e.g. [{"p":"6 barg","t":"330C"}]`)
		}
		if err != nil || c != '[' && !jsonSpace(c) {
			return nil, errorf(ErrBadBody, "", `the body must be a JSON array of objects, e.g. [{"p":"6 barg","t":"330C"}]`)
		}
		if c == '[' {
			return &jsonSource{br: br, lim: lim, set: set}, nil
		}
	}
}

func (js *jsonSource) next(row *batchRow) error {
	js.lim.reset()
	row.cells, row.raw, row.err = row.cells[:0], row.raw[:0], nil
	if js.dec == nil {
		if done, err := js.frame(row); done {
			return err
		}
		js.decodeRest()
	}
	if !js.dec.More() {
		if _, err := js.dec.Token(); err != nil {
			return jsonStop(err, row.n)
		}
		if _, err := js.dec.Token(); err != io.EOF {
			return errorf(ErrBadBody, "", "there is more after the closing ] of the array; send one array")
		}
		return io.EOF
	}
	if err := js.dec.Decode(&js.elem); err != nil {
		return jsonStop(err, row.n)
	}
	js.buf.Reset()
	if err := json.Compact(&js.buf, js.elem); err != nil {
		return jsonStop(err, row.n)
	}
	row.raw = append(row.raw, js.buf.Bytes()...)
	js.n++
	row.err = js.readRow(row.raw, row, false)
	return nil
}

// frame reads the next element on the buffer's bytes, or the end of the
// array. It reports false, having read nothing, for what it leaves to the
// decoder.
func (js *jsonSource) frame(row *batchRow) (bool, error) {
	b, _ := js.br.Peek(js.br.Buffered())
	if len(b) < 4<<10 {
		b, _ = js.br.Peek(js.br.Size()) // as much as the buffer holds
	}
	i := skipSpace(b, 0)
	if i < len(b) && b[i] == ']' {
		return js.frameEnd(b, i+1)
	}
	if js.n > 0 {
		if i >= len(b) || b[i] != ',' {
			return false, nil
		}
		i = skipSpace(b, i+1)
	}
	js.fields = js.fields[:0]
	end, spaced, ok := frameValue(b, i, 0, &js.fields)
	if !ok {
		return false, nil
	}
	if spaced {
		row.raw = appendCompact(row.raw, b[i:end])
	} else {
		row.raw = append(row.raw, b[i:end]...)
		for k := range js.fields { // as they lie in row.raw
			f := &js.fields[k]
			f.key[0], f.key[1], f.val[0], f.val[1] = f.key[0]-i, f.key[1]-i, f.val[0]-i, f.val[1]-i
		}
	}
	_, _ = js.br.Discard(end)
	js.n++
	row.err = js.readRow(row.raw, row, !spaced)
	return true, nil
}

// frameEnd takes the end of the array, at b[i] just after its ], when
// only whitespace follows to the end of the body.
func (js *jsonSource) frameEnd(b []byte, i int) (bool, error) {
	if skipSpace(b, i) < len(b) {
		return false, nil
	}
	if _, err := js.br.Peek(len(b) + 1); err != io.EOF {
		return false, nil
	}
	_, _ = js.br.Discard(len(b))
	return true, io.EOF
}

// decodeRest hands the rest of the body to encoding/json's decoder, in the
// state it would be in at this point of the array: after the [ and each
// element read (one element, 0, stands for them all).
func (js *jsonSource) decodeRest() {
	prefix := "["
	if js.n > 0 {
		prefix = "[0 " // the space ends the number, whatever follows
	}
	js.dec = json.NewDecoder(io.MultiReader(strings.NewReader(prefix), js.br))
	_, _ = js.dec.Token()
	if js.n > 0 {
		_ = js.dec.Decode(&js.elem)
	}
}

// jsonStop explains why a JSON body cannot be read on.
func jsonStop(err error, n int) error {
	var se *Error
	if errors.As(err, &se) {
		return err
	}
	if err == io.EOF || errors.Is(err, io.ErrUnexpectedEOF) {
		return errorf(ErrBadBody, "", "the body ends inside the array, after row %d; close it with ]", n-1)
	}
	return errorf(ErrBadBody, "", "row %d is not valid JSON: %v", n, err)
}

// readRow reads the inputs of one element, compact and valid JSON as the
// decoder gives it, keeping the order of its keys. Keys are read as a CSV
// header is (point.ReadTable: "p", "T", "Drum pressure [barg]"); keys that
// name no input are passed through. The texts of the inputs view raw.
// framed says that js.fields holds the places of raw's members already,
// as the framer found them.
func (js *jsonSource) readRow(raw []byte, row *batchRow, framed bool) error {
	if len(raw) == 0 || raw[0] != '{' {
		return errorf(ErrBadBody, "", `the row is not a JSON object; give one like {"p":"6 barg","t":"330C"}`)
	}
	if !framed {
		js.fields = js.fields[:0]
		for i := 1; raw[i] != '}'; {
			if raw[i] == ',' {
				i++
			}
			n, escaped := jsonStringLen(raw[i:])
			f := field{key: [2]int{i, i + n}}
			if escaped {
				f.keyText = strEscaped // as far as comparing keys goes
			}
			v := i + n + 1 // after the colon
			end := v + jsonValueLen(raw[v:])
			f.val, f.valText = [2]int{v, end}, strEscaped // a string value is decoded
			js.fields = append(js.fields, f)
			i = end
		}
	}
	// The keys are compared as they lie in raw with those of the row
	// before; only a row with others is read again (keysOf).
	same := js.keys != nil && len(js.fields) == len(js.keys)
	for k := 0; same && k < len(js.fields); k++ {
		f := &js.fields[k]
		same = f.keyText&strEscaped == 0 && bytesView(raw[f.key[0]+1:f.key[1]-1]) == js.keys[k]
	}
	if !same {
		js.keysOf(raw)
	}
	if js.err != nil {
		return js.err
	}
	cols := js.table.Columns
	given := row.inputsOf(cols, js.gen)
	for i := range cols {
		f := &js.fields[cols[i].Index]
		v := raw[f.val[0]:f.val[1]]
		var text string
		switch v[0] {
		case '"':
			// Text without escapes reads as it lies, when it is UTF-8.
			if in := v[1 : len(v)-1]; f.valText == 0 || f.valText == strNonASCII && utf8.Valid(in) {
				text = bytesView(in)
			} else {
				text, _ = jsonText(v)
			}
		case 'n':
		case '-', '0', '1', '2', '3', '4', '5', '6', '7', '8', '9':
			text = bytesView(v)
		default:
			h := clean(cols[i].Header, 40)
			return errorf(ErrBadBody, h, "the value of %s must be a string or a number, e.g. \"6 barg\" or 600", h)
		}
		given[i].Text = text
	}
	return nil
}

// keysOf reads the keys of raw, a row whose keys are not those of the row
// before (or are escaped), and reads them as a header when they differ.
func (js *jsonSource) keysOf(raw []byte) {
	js.rowKeys = js.rowKeys[:0]
	for _, f := range js.fields {
		key, _ := jsonText(raw[f.key[0]:f.key[1]])
		js.rowKeys = append(js.rowKeys, key)
	}
	if js.keys != nil && slices.Equal(js.rowKeys, js.keys) {
		return
	}
	js.keys = make([]string, len(js.rowKeys))
	for i, k := range js.rowKeys {
		js.keys[i] = strings.Clone(k)
	}
	js.gen++
	js.table, js.err = point.ReadTable(js.keys, nil, nil, js.set)
	var pe *point.Error
	if errors.As(js.err, &pe) {
		js.err = errorf(ErrBadBody, clean(pe.Param, 40), "%s", clean(js.err.Error(), 600))
	}
}

// jsonText reads the JSON string at the start of b (valid JSON): its text,
// viewing b unless it has escapes, and its length in b.
func jsonText(b []byte) (string, int) {
	n, escaped := jsonStringLen(b)
	if !escaped {
		return bytesView(b[1 : n-1]), n
	}
	var s string
	_ = json.Unmarshal(b[:n], &s)
	return s, n
}

// jsonStringLen is the length of the JSON string at the start of b (valid
// JSON), quotes included, and whether it must be decoded: it has escapes,
// or text that is not UTF-8, which decoding turns into U+FFFD.
func jsonStringLen(b []byte) (int, bool) {
	escaped, ascii := false, true
	i := 1
	for ; b[i] != '"'; i++ {
		switch {
		case b[i] == '\\':
			escaped = true
			i++
		case b[i] >= utf8.RuneSelf:
			ascii = false
		}
	}
	return i + 1, escaped || !ascii && !utf8.Valid(b[1:i])
}

// jsonValueLen is the length of the JSON value at the start of b (compact
// and valid JSON): up to the comma or brace that ends it.
func jsonValueLen(b []byte) int {
	depth := 0
	for i := 0; i < len(b); i++ {
		switch b[i] {
		case '"':
			n, _ := jsonStringLen(b[i:])
			i += n - 1
		case '{', '[':
			depth++
		case '}', ']':
			if depth == 0 {
				return i
			}
			depth--
		case ',':
			if depth == 0 {
				return i
			}
		}
	}
	return len(b)
}

// batchOut writes the answer of a batch.
type batchOut struct {
	format string // "csv" or "json"
	opt    point.Options
	syms   []string
	header []string // the CSV body's header; nil for a JSON body
	delim  rune     // CSV delimiter of the answer
	keys   [][]byte // JSON keys of the header's columns, for "given"
	plan   *point.Plan
}

func (o *batchOut) prepare() {
	if o.delim == 0 {
		o.delim = ','
	}
	o.plan = point.NewPlan(o.syms, o.opt)
	seen := map[string]int{}
	for _, h := range o.header {
		k := h
		if seen[h]++; seen[h] > 1 {
			k = h + " (" + strconv.Itoa(seen[h]) + ")"
		}
		o.keys = append(o.keys, appendJSONString(nil, k))
	}
}

// begin writes what comes before the first row.
func (o *batchOut) begin(w io.Writer) error {
	var b []byte
	if o.format == "csv" {
		cells := o.header
		if cells == nil {
			cells = []string{"given"}
		}
		cells = append(append([]string(nil), cells...), "status")
		cells = answerHeader(cells, o.syms, o.opt.Set)
		b = appendCSVRow(b, cells, o.delim)
	} else {
		b = append(b, `{"formulation":"`+point.Formulation+`","unit_set":`...)
		b = appendJSONString(b, o.opt.Set.Name())
		b = append(b, `,"caution":`...)
		b = appendJSONString(b, Caution)
		b = append(b, `,"rows":[`...)
	}
	_, err := w.Write(b)
	return err
}

// end writes what comes after the last row; stop is why the batch stopped
// early, or nil.
func (o *batchOut) end(w io.Writer, total, failed int, stop *problem) error {
	var b []byte
	if o.format == "csv" {
		if stop != nil {
			cells := make([]string, max(len(o.header), 1))
			cells = append(cells, "stopped: "+stop.Msg)
			b = appendCSVRow(b, emptyAnswerCells(cells, o.syms), o.delim)
		}
	} else {
		if total > 0 {
			b = append(b, '\n')
		}
		b = append(b, `],"rows_total":`...)
		b = strconv.AppendInt(b, int64(total), 10)
		b = append(b, `,"rows_ok":`...)
		b = strconv.AppendInt(b, int64(total-failed), 10)
		b = append(b, `,"rows_failed":`...)
		b = strconv.AppendInt(b, int64(failed), 10)
		b = append(b, `,"complete":`...)
		b = strconv.AppendBool(b, stop == nil)
		if stop != nil {
			b = append(b, `,"stopped":{"code":`...)
			b = appendJSONString(b, stop.Code)
			b = append(b, `,"message":`...)
			b = appendJSONString(b, stop.Msg)
			b = append(b, '}')
		}
		b = append(b, "}\n"...)
	}
	_, err := w.Write(b)
	return err
}

// solveRow solves row r into a, or keeps why it cannot be.
func (s *Server) solveRow(o *batchOut, r *batchRow, a *rowAnswer) {
	a.err = r.err
	if a.err == nil {
		a.in, a.err = o.plan.Row(r.given, &a.ans)
	}
	r.ok = a.err == nil
}

// writeRow appends the answer a of a solved row r to b.
func (s *Server) writeRow(b []byte, o *batchOut, r *batchRow, a *rowAnswer) []byte {
	in, err := a.in, a.err
	var p problem
	if err != nil {
		p = classify(err)
		if p.Code == internalCode {
			s.log.Error("internal error in batch row", slog.Int("row", r.n), slog.String("error", err.Error()))
		}
	}
	if o.format == "csv" {
		if o.header != nil {
			for i := range o.header {
				if i > 0 {
					b = utf8.AppendRune(b, o.delim)
				}
				if i < len(r.cells) {
					b = point.AppendCSVCell(b, r.cells[i], o.delim)
				}
			}
		} else {
			b = point.AppendCSVCell(b, r.raw, o.delim)
		}
		b = utf8.AppendRune(b, o.delim)
		if err != nil {
			b = point.AppendCSVCell(b, p.Msg, o.delim)
			for range len(o.syms) + 3 {
				b = utf8.AppendRune(b, o.delim)
			}
		} else {
			b = append(b, "ok"...)
			b = utf8.AppendRune(b, o.delim)
			b = a.ans.AppendCSV(b, o.delim)
		}
		return append(b, '\n')
	}
	if r.n > 1 {
		b = append(b, ",\n"...)
	} else {
		b = append(b, '\n')
	}
	b = append(b, `{"row":`...)
	b = strconv.AppendInt(b, int64(r.n), 10)
	b = append(b, `,"status":`...)
	if err != nil {
		b = appendJSONString(b, p.Msg)
		b = append(b, `,"error":{"code":`...)
		b = appendJSONString(b, p.Code)
		b = append(b, `,"message":`...)
		b = appendJSONString(b, p.Msg)
		if p.Param != "" {
			b = append(b, `,"param":`...)
			b = appendJSONString(b, p.Param)
		}
		b = append(b, '}')
	} else {
		b = append(b, `"ok"`...)
	}
	b = append(b, `,"given":`...)
	b = o.appendGiven(b, r)
	if err != nil {
		return append(b, '}')
	}
	b = append(b, ',')
	a.inputs = o.plan.AppendInputs(a.inputs[:0], in)
	return a.ans.AppendJSONFields(b, a.inputs, "")
}

// appendGiven writes the row as sent: the JSON element, or the CSV cells
// as an object keyed by the header.
func (o *batchOut) appendGiven(b []byte, r *batchRow) []byte {
	if o.header == nil {
		if len(r.raw) == 0 {
			return append(b, "null"...)
		}
		return append(b, r.raw...)
	}
	b = append(b, '{')
	for i, c := range r.cells {
		if i >= len(o.keys) {
			break
		}
		if i > 0 {
			b = append(b, ',')
		}
		b = append(b, o.keys[i]...)
		b = append(b, ':')
		b = appendJSONString(b, c)
	}
	return append(b, '}')
}

// streamBatch reads, solves and writes the rows chunk by chunk.
func (s *Server) streamBatch(c *gin.Context, src rowSource, o *batchOut, m *batchMemory) {
	h := c.Writer.Header()
	if o.format == "csv" {
		h.Set("Content-Type", "text/csv; charset=utf-8")
	} else {
		h.Set("Content-Type", "application/json; charset=utf-8")
	}
	h.Set("Cache-Control", "no-store")
	h.Set("X-Content-Type-Options", "nosniff")
	c.Status(http.StatusOK)
	rc := http.NewResponseController(c.Writer)
	bw := m.bw
	bw.Reset(c.Writer)
	if err := o.begin(bw); err != nil {
		return
	}
	rows := m.rows
	perChunk := chunkRows
	if s.cfg.Workers >= 2 {
		perChunk = chunkRowsTwo
	}
	total, failed := 0, 0
	var stop *problem
	for done := false; !done; {
		if s.stopped() {
			stop = &problem{Code: "shutting_down", Msg: "the server is shutting down; rows after row " + strconv.Itoa(total) + " were not answered: send them again"}
			break
		}
		n, bytesIn := 0, 0
		for n < perChunk && bytesIn < chunkBytes {
			r := &rows[n]
			r.n = total + n + 1
			if r.n > s.cfg.MaxRows {
				stop = &problem{Code: "too_many_rows", Msg: "more than " + strconv.Itoa(s.cfg.MaxRows) + " rows, this server's limit per batch; send the rest in another request"}
				if err := src.next(r); err == io.EOF {
					stop = nil
				}
				done = true
				break
			}
			err := src.next(r)
			if err == io.EOF {
				done = true
				break
			}
			if err != nil {
				p := classify(err)
				stop = &p
				done = true
				break
			}
			bytesIn += r.size()
			n++
		}
		out := s.solveChunk(o, rows[:n], &m.halves, &m.answers)
		for _, b := range out {
			if _, err := bw.Write(b); err != nil {
				return
			}
		}
		f := countFailed(rows[:n])
		total, failed = total+n, failed+f
		s.metrics.rows.WithLabelValues("ok").Add(float64(n - f))
		s.metrics.rows.WithLabelValues("failed").Add(float64(f))
		if err := bw.Flush(); err != nil {
			return
		}
		_ = rc.Flush()
		_ = rc.SetWriteDeadline(time.Now().Add(s.cfg.WriteTimeout))
		if c.Request.Context().Err() != nil {
			return
		}
	}
	if err := o.end(bw, total, failed, stop); err == nil {
		_ = bw.Flush()
	}
	if stop != nil {
		c.Set(ctxErrorCode, stop.Code)
	}
}

func countFailed(rows []batchRow) int {
	n := 0
	for i := range rows {
		if !rows[i].ok {
			n++
		}
	}
	return n
}

// solveChunk answers rows, on two workers when the server has them, into
// the buffers of halves, which it returns in the order of the rows; each
// worker holds the answers of its block in its own row of answers.
func (s *Server) solveChunk(o *batchOut, rows []batchRow, halves *[2][]byte, answers *[2][blockRows]rowAnswer) [][]byte {
	// Each block of a half is solved whole, then written: the engine's
	// loop runs with its code and coefficients in the caches, as it does
	// alone, and the answers are written while they are still there.
	part := func(rows []batchRow, b []byte, as *[blockRows]rowAnswer) []byte {
		for len(rows) > 0 {
			block := rows[:min(len(rows), blockRows)]
			rows = rows[len(block):]
			for i := range block {
				s.solveRow(o, &block[i], &as[i])
			}
			for i := range block {
				b = s.writeRow(b, o, &block[i], &as[i])
			}
		}
		return b
	}
	if s.cfg.Workers < 2 || len(rows) < 16 {
		halves[0] = part(rows, halves[0][:0], &answers[0])
		return halves[:1]
	}
	half := len(rows) / 2
	var wg sync.WaitGroup
	wg.Go(func() { halves[1] = part(rows[half:], halves[1][:0], &answers[1]) })
	halves[0] = part(rows[:half], halves[0][:0], &answers[0])
	wg.Wait()
	return halves[:]
}

// appendCSVRow writes cells as one CSV line, quoted as point.AppendCSVCell
// quotes.
func appendCSVRow(b []byte, cells []string, delim rune) []byte {
	for i, c := range cells {
		if i > 0 {
			b = utf8.AppendRune(b, delim)
		}
		b = point.AppendCSVCell(b, c, delim)
	}
	return append(b, '\n')
}
