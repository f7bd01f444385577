package server

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"testing"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// The row sources read on bytes must read every body as the readers they
// replace did: encoding/csv for CSV, encoding/json's decoder for JSON. The
// references below are the row readers as they were, kept here only to
// compare with.

// rowDump is what a source made of one row, or why the body stopped.
func rowDump(r *batchRow, err error) string {
	if err != nil {
		return "stop: " + err.Error()
	}
	if r.err != nil {
		// A row with an error is not solved: its given is not read.
		return fmt.Sprintf("cells %q raw %s err %q", r.cells, r.raw, r.err.Error())
	}
	return fmt.Sprintf("cells %q given %+v raw %s err %q", r.cells, r.given, r.raw, "")
}

func readAll(t *testing.T, src rowSource) []string {
	t.Helper()
	var out []string
	var row batchRow
	for row.n = 1; ; row.n++ {
		err := src.next(&row)
		if err == io.EOF {
			return out
		}
		out = append(out, rowDump(&row, err))
		if err != nil {
			return out
		}
	}
}

// refCSVRows reads a CSV body as csvSource.next did, with encoding/csv
// alone.
func refCSVRows(t *testing.T, body string) []string {
	br := bufio.NewReaderSize(strings.NewReader(body), 64<<10)
	lim := &rowLimit{r: strings.NewReader(""), max: maxRowBytes}
	cs, err := newCSVSource(br, lim, siSet)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for n := 1; ; n++ {
		row := &batchRow{n: n}
		rec, err := cs.pending, error(nil)
		if rec != nil {
			cs.pending = nil
		} else {
			rec, err = cs.r.Read()
		}
		var pe *csv.ParseError
		switch {
		case err == io.EOF:
			return out
		case errors.As(err, &pe):
			row.err = errorf(ErrBadBody, "", "line %d is not CSV: %v", pe.Line, pe.Err)
			out = append(out, rowDump(row, nil))
			continue
		case err != nil:
			return append(out, rowDump(row, err))
		}
		row.cells = append(row.cells, rec...)
		if len(rec) > len(cs.header) {
			row.err = errorf(ErrBadBody, "", "the row has %d cells, the header %d", len(rec), len(cs.header))
		} else {
			for _, in := range cs.inputs {
				text := ""
				if in.Index < len(rec) {
					text = rec[in.Index]
				}
				row.given = append(row.given, in.Given(text))
			}
		}
		out = append(out, rowDump(row, nil))
	}
}

func TestCSVRowsAsEncodingCSV(t *testing.T) {
	long := strings.Repeat("x", 70<<10) // longer than the read buffer
	for _, body := range []string{
		"tag,p [barg],t [°C]\nA,6,330\nB,7,340\n",
		"tag,p [barg],t [°C]\r\nA,6,330\r\n\r\nB,7,340\r\n\nC,8,350",
		"tag,p [barg],t [°C]\nA,6,330\r\r\nB,7\r,340\n",
		"tag;p [bar];t [°C]\nA;6;330\n\"B;x\";7;340\nC;\"8\";350\n",
		"tag\tp [bar]\tt [°C]\nA\t6\t330\n\n\n",
		"tag,p [barg],t [°C]\n\"multi\nline\",6,330\nA,6,330\n",
		"tag,p [barg],t [°C]\nA,6,3\"30\nB,6,330\nC,\"6\"x,330\nD,6,330\n",
		"tag,p [barg],t [°C]\nA,6,330\n\"open,6,330\nB,6,330\n",
		"tag,p [barg],t [°C]\nA,6\nB,6,330,extra\n,,\n,\n",
		"tag,p [barg],t [°C]\n\xff\xfe,6,330\n é ,6 , 330 \n",
		"tag,p [barg],t [°C]\n" + long + ",6,330\nA,6,330\n",
		"tag,p [barg],t [°C]\n" + strings.Repeat("A,6,330\n", 20000) + "\"q\",6,330\n" + strings.Repeat("B,7,340\r\n", 20000),
	} {
		br := bufio.NewReaderSize(strings.NewReader(body), 64<<10)
		lim := &rowLimit{r: strings.NewReader(""), max: maxRowBytes}
		cs, err := newCSVSource(br, lim, siSet)
		if err != nil {
			t.Fatal(err)
		}
		got, want := readAll(t, cs), refCSVRows(t, body)
		if len(got) != len(want) {
			t.Fatalf("%.60q: %d rows, want %d", body, len(got), len(want))
		}
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("%.60q row %d:\n got %.300s\nwant %.300s", body, i+1, got[i], want[i])
			}
		}
	}
}

// refJSONRows reads a JSON body as jsonSource.next and readJSONRow did.
func refJSONRows(t *testing.T, body string) []string {
	body = strings.TrimPrefix(body, "\ufeff")
	dec := json.NewDecoder(strings.NewReader(body))
	tok, err := dec.Token()
	if err == io.EOF {
		return []string{"start: " + errorf(ErrBadBody, "", `the body is empty; send a JSON array of objects, e.g. [{"p":"6 barg","t":"330C"}]`).Error()}
	}
	if d, ok := tok.(json.Delim); err != nil || !ok || d != '[' {
		return []string{"start: " + errorf(ErrBadBody, "", `the body must be a JSON array of objects, e.g. [{"p":"6 barg","t":"330C"}]`).Error()}
	}
	var out []string
	for n := 1; ; n++ {
		row := &batchRow{n: n}
		if !dec.More() {
			if _, err := dec.Token(); err != nil {
				return append(out, rowDump(row, jsonStop(err, n)))
			}
			if _, err := dec.Token(); err != io.EOF {
				return append(out, rowDump(row, errorf(ErrBadBody, "", "there is more after the closing ] of the array; send one array")))
			}
			return out
		}
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return append(out, rowDump(row, jsonStop(err, n)))
		}
		var b bytes.Buffer
		if err := json.Compact(&b, raw); err != nil {
			return append(out, rowDump(row, jsonStop(err, n)))
		}
		row.raw = append(row.raw, b.Bytes()...)
		row.err = refJSONRow(row.raw, row)
		out = append(out, rowDump(row, nil))
	}
}

// refJSONRow reads one element with encoding/json, its keys as one table
// (point.ReadTable), as jsonSource.readRow must.
func refJSONRow(raw []byte, row *batchRow) error {
	d := json.NewDecoder(bytes.NewReader(raw))
	d.UseNumber()
	if tok, _ := d.Token(); tok != json.Delim('{') {
		return errorf(ErrBadBody, "", `the row is not a JSON object; give one like {"p":"6 barg","t":"330C"}`)
	}
	var keys []string
	var vals []json.RawMessage
	for d.More() {
		kt, err := d.Token()
		if err != nil {
			return errorf(ErrBadBody, "", "the row is not valid JSON: %v", err)
		}
		var v json.RawMessage
		if err := d.Decode(&v); err != nil {
			return errorf(ErrBadBody, "", "the row is not valid JSON: %v", err)
		}
		key, _ := kt.(string)
		keys, vals = append(keys, key), append(vals, v)
	}
	table, err := point.ReadTable(keys, nil, nil, siSet)
	if err != nil {
		var pe *point.Error
		errors.As(err, &pe)
		return errorf(ErrBadBody, clean(pe.Param, 40), "%s", clean(err.Error(), 600))
	}
	for _, c := range table.Columns {
		var text string
		var v any
		dv := json.NewDecoder(bytes.NewReader(vals[c.Index]))
		dv.UseNumber()
		_ = dv.Decode(&v)
		switch v := v.(type) {
		case string:
			text = v
		case json.Number:
			text = v.String()
		case nil:
		default:
			return errorf(ErrBadBody, clean(c.Header, 40), "the value of %s must be a string or a number, e.g. \"6 barg\" or 600", clean(c.Header, 40))
		}
		row.given = append(row.given, c.Given(text))
	}
	return nil
}

// jsonRowBodies are JSON bodies, well formed and not, that the row
// source must read as encoding/json reads them.
func jsonRowBodies() []string {
	var many strings.Builder
	many.WriteString("[")
	for i := range 3000 {
		fmt.Fprintf(&many, `{"id":%d, "p":"%d barg" ,"t":%d.5e0,"tag":"K\u00e9-%d"},`, i, i%90+1, 200+i%200, i)
	}
	many.WriteString(`{"p":"6 barg","t":"330C"}]`)
	return []string{
		`[{"tag":"FW-1","p":"6 barg","t":"330C"}]`,
		`[ {"p" : 600 , "t" : "330 °C" , "note" : "a \"q\" <b>&amp;</b> \u2028 line"} ]`,
		`[{"Drum pressure [barg]":"6","T (°C)":330,"extra":[1,"]",{"a":null,"b":"}"}]}]`,
		`[{"p":null,"t":"20C"},{"p":true,"t":"20C"},{"p":{"v":1},"t":"1"},{"p":[6],"t":"1"}]`,
		`[{"p\u0020":"6 barg","t":"100C"},{"\u0070":"6 barg","t":"100\u00b0C"}]`,
		"[{\"p\":\"6 \xff barg\",\"t\":\"330C\",\"\xfe\":1}]",
		`[{"p":-1.5E+2,"t":0},{"p":"6","p":"7","t":"1"},{"":1,"p":"6","t":"1"}]`,
		`[[1,2],"text",3,null,{}]`,
		`[{"p [barg]":6,"x (%)":"50"},{"pressure":"6 bar","quality":0.5},{"h [kJ/kg]":"2800","s":6.5}]`,
		`[{"p":"6 barg","t":"330C"} {"p":"6 barg"}]`,
		`[{"p":"6 barg","t":"330C"},]`,
		`[{"p":"6 barg","t":"330C"},{"p":1,}]`,
		`[{"p":"6 barg","t":"330C"}`,
		`[{"p":"6 barg","t":"330C"}] [1]`,
		`[{"p":"6 barg","t":"330C"}]  ` + "\n\t\r ",
		`[{"p [furlong]":"6","t":"330C"}]`,
		`[{"p":01,"t":"1"},{"p":1.,"t":"1"},{"p":-,"t":"1"},{"p":1e,"t":"1"},{"p":"\x","t":"1"}]`,
		`[{"p":"6","t":"1","d":` + strings.Repeat("[", 40) + strings.Repeat("]", 40) + `}, {"p":"7","t":"1"}]`,
		"[{\"p\":\"a\tb\",\"t\":\"1\"}]",
		`[]`,
		` [ ] `,
		``,
		`  `,
		`{"p":1}`,
		`x[]`,
		"\ufeff[{\"p\":\"6 barg\",\"t\":\"330C\"}]",
		many.String(),
	}
}

// checkJSONRows reads body with the row source through a read buffer of
// size bytes and compares what it made of each row with the reference.
func checkJSONRows(t *testing.T, body string, size int) {
	t.Helper()
	br := bufio.NewReaderSize(strings.NewReader(body), size)
	lim := &rowLimit{r: strings.NewReader(""), max: maxRowBytes}
	var got []string
	if js, err := newJSONSource(br, lim, siSet); err != nil {
		got = []string{"start: " + err.Error()}
	} else {
		got = readAll(t, js)
	}
	want := refJSONRows(t, body)
	if len(got) != len(want) {
		t.Fatalf("%.60q (buffer %d): %d rows, want %d\n%q\n%q", body, size, len(got), len(want), got, want)
	}
	for i := range got {
		if got[i] != want[i] {
			t.Fatalf("%.60q (buffer %d) row %d:\n got %.400s\nwant %.400s", body, size, i+1, got[i], want[i])
		}
	}
}

// TestJSONRowsAsEncodingJSON reads each body through buffers small enough
// that rows straddle them (the framer hands those to the decoder) and
// through the server's own.
func TestJSONRowsAsEncodingJSON(t *testing.T) {
	for _, body := range jsonRowBodies() {
		for _, size := range []int{16, 100, 64 << 10} {
			checkJSONRows(t, body, size)
		}
	}
}

// FuzzJSONRows holds the row source to encoding/json on any body: go test
// runs the bodies above; go test -fuzz FuzzJSONRows looks for others.
func FuzzJSONRows(f *testing.F) {
	for _, body := range jsonRowBodies() {
		if len(body) < 4<<10 { // the long body makes mutation slow
			f.Add(body, uint16(0))
		}
	}
	f.Fuzz(func(t *testing.T, body string, size uint16) {
		n := 64 << 10 // 0: the server's buffer
		if size > 0 {
			n = max(16, int(size))
		}
		checkJSONRows(t, body, n)
	})
}

// siSet is the default unit set, in which the row tests read bare numbers.
var siSet, _ = units.SetByName("si")
