package server

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net/http"
	"net/url"
	"strings"

	"github.com/gin-gonic/gin"

	"steamcell/fn/diagram"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Limits of a diagram request: its points fill a longer query than a
// state's, and a posted list may hold up to diagram.MaxPoints points.
const (
	maxDiagramQuery = 16 << 10
	maxDiagramBody  = 1 << 20
)

// diagramTypes are the media types of the formats of /diagram.
var diagramTypes = map[string]string{
	diagram.SVG: "image/svg+xml",
	diagram.PNG: "image/png",
	"json":      "application/json; charset=utf-8",
}

// getDiagram draws a diagram of water (kinds ts, hs, ph, tv, pt) as SVG
// or PNG, or gives its lines as JSON, with the user's points: pt=
// parameters (p=10bar,t=400C,label=1 and from=1 for a process line), or
// for POST a JSON array of objects ({"p":"10bar","t":"400C","label":"1"}).
// isobars=, isotherms= and x= choose the background lines, regions=1
// adds the region boundaries, xmin= xmax= ymin= ymax= zoom.
//
// GET /diagram/{kind}.{svg|png|json}
// POST /diagram/{kind}.{svg|png|json}
func (s *Server) getDiagram(c *gin.Context) {
	d, format, err := s.readDiagram(c)
	if err != nil {
		s.fail(c, err)
		return
	}
	buf := getBuf()
	defer putBuf(buf)
	w := &byteWriter{b: *buf}
	if format == "json" {
		var b []byte
		b, err = d.MarshalJSONWith(Caution)
		w.b = append(w.b, b...)
	} else {
		err = d.Render(w, format)
	}
	*buf = w.b
	if err != nil {
		s.fail(c, err)
		return
	}
	c.Header("Cache-Control", "no-store")
	writeBody(c, http.StatusOK, []string{diagramTypes[format]}, w.b)
}

type byteWriter struct{ b []byte }

func (w *byteWriter) Write(p []byte) (int, error) { w.b = append(w.b, p...); return len(p), nil }

// readDiagram reads the kind, the format, the options and the points of
// a diagram request, and builds the diagram.
func (s *Server) readDiagram(c *gin.Context) (*diagram.Diagram, string, error) {
	file := c.Param("file")
	name, format, _ := strings.Cut(file, ".")
	if _, ok := diagramTypes[format]; !ok {
		return nil, "", errorf(ErrNoRoute, "", "no route /diagram/%s; ask for /diagram/{kind}.svg, .png or .json with kind one of %s", clean(file, 40), strings.Join(diagram.KindNames(), ", "))
	}
	k, err := diagram.KindByName(name)
	if err != nil {
		return nil, "", errorf(ErrNoRoute, "kind", "%s", err.Error())
	}
	raw := c.Request.URL.RawQuery
	if len(raw) > maxDiagramQuery {
		return nil, "", errorf(ErrQueryTooLong, "", "the query string is %d bytes (limit %d); post the points as a JSON list instead", len(raw), maxDiagramQuery)
	}
	var specs []diagram.Spec
	own := map[string]string{}
	var rest []string
	for part := range strings.SplitSeq(raw, "&") {
		if part == "" {
			continue
		}
		k, v, _ := strings.Cut(part, "=")
		key, err1 := url.QueryUnescape(k)
		val, err2 := url.QueryUnescape(v)
		if err1 != nil || err2 != nil {
			return nil, "", errorf(ErrBadQuery, clean(k, 40), "%s is not valid URL encoding", clean(part, 60))
		}
		switch key = strings.ToLower(strings.TrimSpace(key)); key {
		case "pt":
			sp, err := diagram.ParseSpec(val)
			if err != nil {
				return nil, "", err
			}
			specs = append(specs, sp)
			if len(specs) > diagram.MaxPoints {
				return nil, "", &diagram.Error{Param: "pt", Kind: diagram.ErrTooMany, Msg: fmt.Sprintf("more than %d points; one diagram shows at most %d", diagram.MaxPoints, diagram.MaxPoints)}
			}
		case "isobars", "isotherms", "x", "regions", "xmin", "xmax", "ymin", "ymax":
			if _, dup := own[key]; dup {
				return nil, "", errorf(ErrRepeatedParameter, key, "%s is given more than once; give each parameter once", key)
			}
			own[key] = val
		default:
			rest = append(rest, part)
		}
	}
	req, err := s.readRequest(strings.Join(rest, "&"), 0)
	if err != nil {
		return nil, "", err
	}
	if c.Request.Method == http.MethodPost {
		posted, err := readPostedPoints(c)
		if err != nil {
			return nil, "", err
		}
		specs = append(specs, posted...)
	}
	opt := diagram.Options{Point: req.opt}
	if v, ok := own["isobars"]; ok {
		if opt.Isobars, err = diagram.ReadValues(v, "isobars", units.Pressure, req.opt); err != nil {
			return nil, "", err
		}
	}
	if v, ok := own["isotherms"]; ok {
		if opt.Isotherms, err = diagram.ReadValues(v, "isotherms", units.Temperature, req.opt); err != nil {
			return nil, "", err
		}
	}
	if v, ok := own["x"]; ok {
		if opt.Qualities, err = diagram.ReadQualities(v); err != nil {
			return nil, "", err
		}
	}
	switch strings.ToLower(own["regions"]) {
	case "", "0", "false", "no":
	case "1", "true", "yes":
		opt.Regions = true
	default:
		return nil, "", errorf(ErrBadQuery, "regions", "regions=%s: write regions=1 to draw the region boundaries", clean(own["regions"], 20))
	}
	if opt.XRange, err = diagram.ReadRange(own["xmin"], own["xmax"], k.X, "x", req.opt); err != nil {
		return nil, "", err
	}
	if opt.YRange, err = diagram.ReadRange(own["ymin"], own["ymax"], k.Y, "y", req.opt); err != nil {
		return nil, "", err
	}
	d, err := diagram.Build(k, specs, opt)
	return d, format, err
}

// readPostedPoints reads a JSON array of points: objects of two inputs
// (strings with units, or numbers in the unit set) with label and from.
func readPostedPoints(c *gin.Context) ([]diagram.Spec, error) {
	body, err := io.ReadAll(http.MaxBytesReader(c.Writer, c.Request.Body, maxDiagramBody))
	var mbe *http.MaxBytesError
	if errors.As(err, &mbe) {
		return nil, errorf(ErrBodyTooLarge, "", "the body is over %d bytes; one diagram shows at most %d points", maxDiagramBody, diagram.MaxPoints)
	}
	if err != nil {
		return nil, errorf(ErrBadBody, "", "the body could not be read")
	}
	if len(strings.TrimSpace(string(body))) == 0 {
		return nil, nil
	}
	var rows []map[string]any
	if err := json.Unmarshal(body, &rows); err != nil {
		return nil, errorf(ErrBadBody, "", "the body is not a JSON array of points like [{\"p\":\"10bar\",\"t\":\"400C\",\"label\":\"1\"}]: %s", clean(err.Error(), 120))
	}
	specs := make([]diagram.Spec, 0, len(rows))
	for i, row := range rows {
		var sp diagram.Spec
		for key, v := range row {
			text, ok := v.(string)
			if n, isNum := v.(float64); isNum {
				text, ok = appendNumberString(n), true
			}
			if !ok {
				return nil, errorf(ErrBadBody, key, "point %d: %s must be a string or a number", i+1, clean(key, 40))
			}
			switch strings.ToLower(key) {
			case "label":
				sp.Label = text
			case "from":
				sp.From = text
			default:
				sp.Given = append(sp.Given, point.Given{Name: key, Text: text})
			}
		}
		specs = append(specs, sp)
	}
	return specs, nil
}

func appendNumberString(v float64) string { return string(appendNumber(nil, v)) }
