package server

import (
	"errors"
	"fmt"
	"net/url"
	"path"
	"slices"
	"strings"
	"unicode/utf8"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Limits of a query string. A state needs two inputs and a few options,
// well under these; longer queries are refused before anything is parsed.
const (
	maxQueryBytes = 2048 // whole query string
	maxValueBytes = 200  // one value, "6 barg" or a get= list
	maxParams     = 16   // parameters in one query
)

// param is one query parameter in the order given.
type param struct {
	name  string // as given, unescaped
	key   string // lower case, for matching
	value string // unescaped
}

// parseQuery splits a raw query string into parameters, keeping their
// order (url.Values does not) and refusing what no client means to send:
// bad escapes, invalid UTF-8, repeated names, over-long values.
func parseQuery(raw string) ([]param, error) {
	if len(raw) > maxQueryBytes {
		return nil, errorf(ErrQueryTooLong, "", "the query string is %d bytes; a state needs far fewer (limit %d)", len(raw), maxQueryBytes)
	}
	out := make([]param, 0, 6)
	for part := range strings.SplitSeq(raw, "&") {
		if part == "" {
			continue
		}
		k, v, _ := strings.Cut(part, "=")
		name, err1 := url.QueryUnescape(k)
		value, err2 := url.QueryUnescape(v)
		if err1 != nil || err2 != nil {
			return nil, errorf(ErrBadQuery, clean(k, 40), "%s is not valid URL encoding; escape %% as %%25 and spaces as %%20 or +", clean(part, 60))
		}
		if !utf8.ValidString(name) || !utf8.ValidString(value) {
			return nil, errorf(ErrBadQuery, clean(name, 40), "parameter %s is not valid UTF-8 text", clean(name, 40))
		}
		if len(value) > maxValueBytes {
			return nil, errorf(ErrBadQuery, clean(name, 40), "the value of %s is %d bytes long; give a number with its unit (limit %d bytes)", clean(name, 40), len(value), maxValueBytes)
		}
		key := strings.ToLower(strings.TrimSpace(name))
		for _, p := range out {
			if p.key == key {
				return nil, errorf(ErrRepeatedParameter, clean(name, 40), "%s is given more than once; give each parameter once", clean(name, 40))
			}
		}
		if len(out) == maxParams {
			return nil, errorf(ErrBadQuery, "", "more than %d query parameters; a state needs two inputs and a few options", maxParams)
		}
		out = append(out, param{name: name, key: key, value: value})
	}
	return out, nil
}

// takes says which kinds of parameter a route reads besides the options
// every route reads (units, patm, unit_…, key).
type takes uint8

const (
	takesInputs  takes = 1 << iota // p, t, h, s, v, rho, u, x
	takesGet                       // get=
	takesFormat                    // format=json|csv
	takesName                      // name= (file name of an upload)
	takesGetList                   // get=, checked but passed on as given (the workbook filler expands it)
	takesResults                   // u=, process=, check=, check_tol= of a workbook, passed on to the filler
)

// request is what a query asks for.
type request struct {
	given  []point.Given // the inputs in the order given
	opt    point.Options
	syms   []string // from get=, checked; nil when get= is absent
	all    bool     // get= includes "all"
	name   string   // from name=: a file name without directories
	format string   // "json", "csv", or "" when format= is absent
	// results are u=, process=, check= and check_tol= of a workbook, as
	// given: the filler reads them.
	results map[string]string
}

// readRequest reads the query of a route that takes the parameters t.
// Options are applied in a fixed order whatever the order in the URL: the
// unit set, then patm (a bare number in the set's pressure unit), then
// the unit_… overrides.
func (s *Server) readRequest(raw string, t takes) (request, error) {
	req := request{given: make([]point.Given, 0, 2)}
	params, err := parseQuery(raw)
	if err != nil {
		return req, err
	}
	set := s.cfg.Units
	var patmText, getText string
	var overrides []param
	for _, p := range params {
		switch {
		case p.key == "key":
			// The token, checked by the auth middleware.
		case p.key == "units":
			if set, err = units.SetByName(p.value); err != nil {
				return req, err
			}
		case p.key == "patm":
			patmText = p.value
		case p.key == "get" && t&(takesGet|takesGetList) != 0:
			getText = p.value
			if getText == "" {
				return req, errorf(ErrBadQuery, "get", "get= is empty; list properties, e.g. get=h,s")
			}
		case p.key == "format" && t&takesFormat != 0:
			switch f := strings.ToLower(p.value); f {
			case "json", "csv":
				req.format = f
			default:
				return req, errorf(ErrBadQuery, "format", "format=%s is not a format; use format=json or format=csv", clean(p.value, 20))
			}
		case p.key == "name" && t&takesName != 0:
			req.name = path.Base(strings.ReplaceAll(p.value, "\\", "/"))
			if req.name == "." || req.name == "/" {
				req.name = ""
			}
		case strings.HasPrefix(p.key, "unit_"):
			overrides = append(overrides, p)
		case t&takesResults != 0 && (p.key == "u" || p.key == "process" || p.key == "check" || p.key == "check_tol"):
			if req.results == nil {
				req.results = map[string]string{}
			}
			if _, dup := req.results[p.key]; dup {
				return req, errorf(ErrRepeatedParameter, p.name, "%s is given twice; give it once", clean(p.name, 40))
			}
			req.results[p.key] = p.value
		default:
			if _, ok := point.InputQuantity(p.key); ok && t&takesInputs != 0 {
				req.given = append(req.given, point.Given{Name: p.name, Text: p.value})
				continue
			}
			return req, s.unknownParam(p, t)
		}
	}
	if patmText != "" {
		patm, err := units.Parse(patmText, units.Pressure, units.Options{Name: "patm", Set: set})
		if err != nil {
			return req, err
		}
		if patm < units.MinPatm || patm > units.MaxPatm {
			return req, &units.InputError{Name: "patm", Text: patmText, Dim: units.Pressure, Err: units.ErrBadPatm,
				Detail: fmt.Sprintf("atmospheric pressure must lie between %g and %g kPa, the range of sites on Earth; give it with its unit, e.g. patm=95kPa", units.MinPatm*1000, units.MaxPatm*1000)}
		}
		req.opt.Patm = patm
	}
	if set, err = applyOverrides(set, overrides); err != nil {
		return req, err
	}
	req.opt.Set = set
	if getText != "" && t&takesGetList != 0 {
		// Passed on as given, for the filler to expand; a name that is no
		// property is refused here as the property error, not as a bad
		// workbook.
		for g := range strings.SplitSeq(getText, ",") {
			if g = strings.TrimSpace(g); g == "" {
				continue
			}
			if w := strings.ToLower(g); w != "phase" && w != "region" {
				if _, err := point.Symbols([]string{g}); err != nil {
					return req, err
				}
			}
			req.syms = append(req.syms, g)
		}
	} else if getText != "" {
		// phase and region are in every answer; asking for them is fine.
		list := slices.DeleteFunc(strings.Split(getText, ","), func(g string) bool {
			g = strings.ToLower(strings.TrimSpace(g))
			return g == "phase" || g == "region"
		})
		req.syms = []string{}
		if len(list) > 0 {
			if req.syms, err = point.Symbols(list); err != nil {
				return req, err
			}
		}
		req.all = slices.ContainsFunc(list, func(g string) bool { return strings.EqualFold(strings.TrimSpace(g), "all") })
	}
	// Figures in messages and warnings in the units the inputs were typed in.
	req.opt = req.opt.Typed(req.given)
	return req, nil
}

// applyOverrides applies unit_SYM=UNIT parameters: SYM is any input or
// property symbol and UNIT becomes the unit of its quantity, for output and
// for bare numbers (unit_h=Btu/lb applies to u, g and f too, which share
// the quantity). Two overrides of one quantity must agree.
func applyOverrides(set units.Set, overrides []param) (units.Set, error) {
	byDim := map[units.Dim]param{}
	for _, p := range overrides {
		sym := strings.TrimPrefix(p.key, "unit_")
		var d units.Dim
		if q, ok := point.InputQuantity(sym); ok {
			d = point.DimOf(q)
		} else if prop, ok := point.Lookup(sym); ok {
			d = prop.Dim
		} else {
			return set, errorf(ErrUnknownParameter, p.name, "%s names no property; write unit_ and a property symbol, e.g. unit_p=barg or unit_h=Btu/lb", clean(p.name, 40))
		}
		if prev, ok := byDim[d]; ok && !strings.EqualFold(strings.TrimSpace(prev.value), strings.TrimSpace(p.value)) {
			return set, errorf(ErrRepeatedParameter, p.name, "%s and %s set the unit of %s twice; give one", clean(prev.name, 40), clean(p.name, 40), d)
		}
		byDim[d] = p
		var err error
		if set, err = set.Override(d, p.value); err != nil {
			var ue *units.InputError
			if errors.As(err, &ue) {
				e := *ue
				e.Name = p.name
				return set, &e
			}
			return set, err
		}
	}
	return set, nil
}

// unknownParam explains a parameter the route does not take.
func (s *Server) unknownParam(p param, t takes) error {
	name := clean(p.name, 40)
	if _, ok := point.InputQuantity(p.key); ok {
		return errorf(ErrUnknownParameter, name, "%s is an input, which this route does not take here", name)
	}
	var known []string
	if t&takesInputs != 0 {
		known = append(known, strings.Join(point.InputNames(), ", "))
	}
	if t&(takesGet|takesGetList) != 0 {
		known = append(known, "get")
	}
	if t&takesFormat != 0 {
		known = append(known, "format")
	}
	if t&takesName != 0 {
		known = append(known, "name")
	}
	if t&takesResults != 0 {
		known = append(known, "u", "process", "check", "check_tol")
	}
	known = append(known, "units", "patm", "unit_SYMBOL", "key")
	return errorf(ErrUnknownParameter, name, "%s is not a parameter of this route; parameters are %s", name, strings.Join(known, ", "))
}
