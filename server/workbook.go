package server

import (
	"context"
	"encoding/json"
	"io"
	"mime"
	"net/http"
	"path"
	"strconv"
	"strings"
	"time"
	"unicode/utf8"

	"github.com/gin-gonic/gin"

	"steamcell/fn/point"
)

// WorkbookOptions are the choices a /workbook request makes.
type WorkbookOptions struct {
	Point   point.Options // unit set and atmospheric pressure
	Symbols []string      // properties to add, from get=, as given (the filler checks them); nil: its default
	// U, Process, Check and CheckTol are u=, process=, check= (a list)
	// and check_tol= as given; the filler checks them.
	U, Process, CheckTol string
	Check                []string
}

// WorkbookFiller fills a workbook of test points with property, phase and
// validity columns. in holds the file as uploaded; name is
// its file name (for its type: .xlsx, .xlsm, or .csv read as a sheet);
// the filled copy is written to out, an .xlsm for an .xlsm and an .xlsx
// otherwise. summary is any
// JSON-encodable report of what was done. Errors caused by the file or the
// options should be wrapped with InputProblem (400); any other error is
// answered as an internal error (500) and logged.
//
// The server does not import the workbook package; the command wires one
// in (Config.Workbook).
type WorkbookFiller interface {
	Fill(ctx context.Context, in io.Reader, name string, opts WorkbookOptions, out io.Writer) (summary any, err error)
}

// Media types of the filled workbook: an .xlsx, or a macro-enabled .xlsm,
// which stays one.
const (
	xlsxType = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
	xlsmType = "application/vnd.ms-excel.sheet.macroEnabled.12"
)

// filledName is the file name and media type of the filled copy of an
// upload named name.
func filledName(name string) (string, string) {
	ext := path.Ext(name)
	if strings.EqualFold(ext, ".xlsm") {
		return strings.TrimSuffix(name, ext) + "_filled.xlsm", xlsmType
	}
	return strings.TrimSuffix(name, ext) + "_filled.xlsx", xlsxType
}

// maxSummaryHeader is the longest summary sent in the Steamcell-Summary
// header; a longer one is left out.
const maxSummaryHeader = 4 << 10

// postWorkbook fills an uploaded workbook and answers the filled copy, with
// the filler's summary as JSON in the Steamcell-Summary header. Without a
// filler it answers 501.
//
// POST /workbook
func (s *Server) postWorkbook(c *gin.Context) {
	if s.cfg.Workbook == nil {
		s.fail(c, errorf(ErrNotImplemented, "", "this server was started without the workbook filler; fill workbooks with the steamcell command, or send the rows to POST /batch"))
		return
	}
	req, err := s.readRequest(c.Request.URL.RawQuery, takesGetList|takesName|takesResults)
	if err != nil {
		s.fail(c, err)
		return
	}
	in, err := spoolBody(c.Writer, c.Request, s.cfg.MaxWorkbookBytes, s.cfg.ReadTimeout, s.cfg.WriteTimeout, false)
	if err != nil {
		s.fail(c, err)
		return
	}
	defer in.Close()
	if in.size == 0 {
		s.fail(c, errorf(ErrBadBody, "", "the body is empty; send the workbook file as the body (curl --data-binary @points.xlsx)"))
		return
	}
	out := &spool{}
	defer out.Close()
	name := req.name
	if name == "" {
		name = "workbook.xlsx"
	}
	select {
	case s.fills <- struct{}{}:
		defer func() { <-s.fills }()
	case <-c.Request.Context().Done():
		c.Status(http.StatusServiceUnavailable) // the client gave up waiting
		return
	}
	summary, err := s.cfg.Workbook.Fill(c.Request.Context(), in.reader(), name,
		workbookOptions(req), out)
	if err == nil {
		err = out.rewind()
	}
	// Filling may take a while; the answer gets a full write timeout.
	_ = http.NewResponseController(c.Writer).SetWriteDeadline(time.Now().Add(s.cfg.WriteTimeout))
	if err != nil {
		s.fail(c, err)
		return
	}
	filename, mediaType := filledName(name)
	disp := mime.FormatMediaType("attachment", map[string]string{"filename": filename})
	if disp == "" {
		disp = "attachment"
	}
	headers := map[string]string{"Content-Disposition": disp, "Cache-Control": "no-store"}
	if sum, err := json.Marshal(summary); err == nil && summary != nil {
		if h := asciiJSON(sum); len(h) <= maxSummaryHeader {
			headers["Steamcell-Summary"] = h
		}
	}
	c.DataFromReader(http.StatusOK, out.size, mediaType, out.reader(), headers)
}

// asciiJSON escapes every non-ASCII character of a compact JSON text as
// \uXXXX, so that it fits an HTTP header.
func asciiJSON(b []byte) string {
	var sb strings.Builder
	for len(b) > 0 {
		r, n := utf8.DecodeRune(b)
		b = b[n:]
		switch {
		case r < 0x80:
			sb.WriteRune(r)
		case r > 0xffff:
			r -= 0x10000
			sb.WriteString(`\u` + strconv.FormatInt(int64(0xd800+(r>>10)), 16) + `\u` + strconv.FormatInt(int64(0xdc00+(r&0x3ff)), 16))
		default:
			h := strconv.FormatInt(int64(r), 16)
			sb.WriteString(`\u` + strings.Repeat("0", 4-len(h)) + h)
		}
	}
	return sb.String()
}

// workbookOptions are the choices of a /workbook request.
func workbookOptions(req request) WorkbookOptions {
	o := WorkbookOptions{Point: req.opt, Symbols: req.syms, U: req.results["u"], Process: req.results["process"], CheckTol: req.results["check_tol"]}
	if c := req.results["check"]; c != "" {
		o.Check = strings.Split(c, ",")
	}
	return o
}
