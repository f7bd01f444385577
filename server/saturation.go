package server

import (
	"net/http"
	"slices"
	"strings"

	"github.com/gin-gonic/gin"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// saturationSymbols are the properties /saturation answers by default:
// the saturation pressure and temperature, the saturated liquid (f) and
// vapour (g), and their differences (fg).
var saturationSymbols = []string{"p", "t", "vf", "vg", "rhof", "rhog", "uf", "ug", "hf", "hg", "sf", "sg",
	"vfg", "ufg", "hfg", "sfg"}

// saturationExtra are the further properties get= may ask of /saturation.
var saturationExtra = []string{"muf", "mug", "kf", "kg", "nuf", "nug", "prf", "prg", "sigma"}

// getSaturation answers the saturation line at a pressure (p=) or a
// temperature (t=): the saturation temperature or pressure, the
// saturated-liquid and -vapour properties and the differences hfg, sfg,
// vfg, ufg, as one flat JSON object (format=csv: two lines).
//
// GET /saturation
func (s *Server) getSaturation(c *gin.Context) {
	req, err := s.readRequest(c.Request.URL.RawQuery, takesInputs|takesGet|takesFormat)
	if err != nil {
		s.fail(c, err)
		return
	}
	in, syms, err := readSaturation(req)
	if err != nil {
		s.fail(c, err)
		return
	}
	var st fn.State
	if in.Q == fn.Pressure {
		st, err = fn.FromPX(in.Value, 0)
	} else {
		st, err = fn.FromTX(in.Value, 0)
	}
	if err != nil {
		s.fail(c, err)
		return
	}
	ans := point.Render(&st, syms, req.opt)
	ans.Phase = "saturation line"
	if req.format == "csv" {
		writeBody(c, http.StatusOK, csvType, appendAnswerCSV(nil, &ans, syms, req.opt.Set))
		return
	}
	buf := getBuf()
	defer putBuf(buf)
	*buf = ans.AppendJSON(*buf, point.Inputs([2]fn.Input{in, in}, req.opt)[:1], Caution)
	*buf = append(*buf, '\n')
	writeBody(c, http.StatusOK, jsonType, *buf)
}

// readSaturation reads the one input of /saturation, p or t, and the
// properties asked for.
func readSaturation(req request) (fn.Input, []string, error) {
	if len(req.given) != 1 {
		return fn.Input{}, nil, &point.Error{Kind: point.ErrInputCount,
			Msg: "give one input, p or t, e.g. /saturation?p=10bar or /saturation?t=180C"}
	}
	g := req.given[0]
	q, _ := point.InputQuantity(g.Name)
	if q != fn.Pressure && q != fn.Temperature {
		return fn.Input{}, nil, &point.Error{Param: clean(g.Name, 40), Kind: point.ErrUnknownInput,
			Msg: "the saturation line is found from p or t alone; for a state fixed by " + clean(g.Name, 40) + " and another input use /state"}
	}
	v, err := units.Parse(g.Text, point.DimOf(q), units.Options{Name: g.Name, Set: req.opt.Set, Patm: req.opt.Patm})
	if err != nil {
		return fn.Input{}, nil, err
	}
	syms := saturationSymbols
	switch {
	case req.all:
		syms = slices.Concat(saturationSymbols, saturationExtra)
	case req.syms != nil:
		syms = nil
		for _, sym := range req.syms {
			if !slices.Contains(saturationSymbols, sym) && !slices.Contains(saturationExtra, sym) {
				return fn.Input{}, nil, &point.Error{Param: sym, Kind: point.ErrUnknownProperty,
					Msg: sym + " is not a property of the saturation line; ask for " + strings.Join(saturationSymbols, ", ") + ", " + strings.Join(saturationExtra, ", ") + " (or use /state for a single state)"}
			}
			syms = append(syms, sym)
		}
	}
	return fn.Input{Q: q, Value: v}, syms, nil
}
