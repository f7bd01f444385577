package server

import (
	"errors"
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
	syms := saturationSymbols
	switch {
	case req.all:
		syms = slices.Concat(saturationSymbols, saturationExtra)
	case req.syms != nil:
		if syms, err = saturationProperties(req.syms); err != nil {
			s.fail(c, err)
			return
		}
	}
	in, st, err := solveSaturation(req)
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

// getSaturationProperty answers one property of the saturation line at p=
// or t= as a bare number in text/plain, for a spreadsheet cell, like GET
// /state/{property}: /saturation/t?p=10bar is the saturation temperature,
// /saturation/hfg?t=180C the enthalpy of vaporisation.
//
// GET /saturation/{property}
func (s *Server) getSaturationProperty(c *gin.Context) {
	req, err := s.readRequest(c.Request.URL.RawQuery, takesInputs)
	if err != nil {
		s.failText(c, err)
		return
	}
	prop := c.Param("property")
	syms, err := point.Symbols([]string{prop})
	if err == nil && len(syms) == 1 {
		syms, err = saturationProperties(syms)
	}
	if err == nil && len(syms) != 1 {
		err = &point.Error{Param: clean(prop, 40), Kind: point.ErrUnknownProperty,
			Msg: "/saturation/{property} answers one property, e.g. /saturation/t?p=10bar; use /saturation?get=hf,hg for several"}
	}
	if err != nil {
		s.failText(c, err)
		return
	}
	_, st, err := solveSaturation(req)
	if err != nil {
		s.failText(c, err)
		return
	}
	ans := point.Render(&st, syms, req.opt)
	f, err := ans.Value(syms[0])
	if err != nil {
		s.failText(c, err)
		return
	}
	if len(ans.Warnings) > 0 {
		c.Header("Steamcell-Warning", headerText(strings.Join(ans.Warnings, "; ")))
	}
	buf := getBuf()
	defer putBuf(buf)
	*buf = appendNumber(*buf, f.Value)
	writeBody(c, http.StatusOK, textType, *buf)
}

// solveSaturation reads the one input of /saturation, p or t, and returns
// it with the saturated-liquid state there. Beyond the critical point the
// error names the input given and the end of the line, not the quality
// that the state is built with.
func solveSaturation(req request) (fn.Input, fn.State, error) {
	if len(req.given) != 1 {
		return fn.Input{}, fn.State{}, &point.Error{Kind: point.ErrInputCount,
			Msg: "give one input, p or t, e.g. /saturation?p=10bar or /saturation?t=180C"}
	}
	g := req.given[0]
	q, _ := point.InputQuantity(g.Name)
	if q != fn.Pressure && q != fn.Temperature {
		return fn.Input{}, fn.State{}, &point.Error{Param: clean(g.Name, 40), Kind: point.ErrUnknownInput,
			Msg: "the saturation line is found from p or t alone; for a state fixed by " + clean(g.Name, 40) + " and another input use /state"}
	}
	v, err := units.Parse(g.Text, point.DimOf(q), units.Options{Name: g.Name, Set: req.opt.Set, Patm: req.opt.Patm})
	if err != nil {
		return fn.Input{}, fn.State{}, err
	}
	in := fn.Input{Q: q, Value: v}
	if q == fn.Pressure {
		_, err = fn.SaturationAtP(v)
	} else {
		_, err = fn.SaturationAtT(v)
	}
	if err != nil {
		return in, fn.State{}, err
	}
	var st fn.State
	if q == fn.Pressure {
		st, err = fn.FromPX(v, 0)
	} else {
		st, err = fn.FromTX(v, 0)
	}
	if errors.Is(err, fn.ErrAboveCritical) {
		// The line reaches the critical point, where no quality is
		// defined: only the point itself gets here.
		err = &point.Error{Param: clean(g.Name, 40), Kind: fn.ErrAboveCritical,
			Msg: clean(g.Name, 40) + "=" + clean(g.Text, 40) + " is the critical point, where the saturation line ends and liquid and vapour are one; give a value below it"}
	}
	return in, st, err
}

// saturationProperties checks the properties asked of the saturation
// line; phase and region, which every answer carries, are dropped.
func saturationProperties(list []string) ([]string, error) {
	syms := []string{}
	for _, sym := range list {
		if w := strings.ToLower(sym); w == "phase" || w == "region" {
			continue
		}
		if !slices.Contains(saturationSymbols, sym) && !slices.Contains(saturationExtra, sym) {
			return nil, &point.Error{Param: clean(sym, 40), Kind: point.ErrUnknownProperty,
				Msg: clean(sym, 40) + " is not a property of the saturation line; ask for " + strings.Join(saturationSymbols, ", ") + ", " + strings.Join(saturationExtra, ", ") + " (or use /state for a single state)"}
		}
		syms = append(syms, sym)
	}
	return syms, nil
}
