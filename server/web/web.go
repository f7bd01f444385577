// Package web is the page steamcell serves at /: a calculator, a diagram
// view, a steam-table maker and a drop zone that fills a workbook. It is
// embedded in the binary (embed.FS) and needs nothing from outside: no
// CDN, no build step. The page is plain HTML that a small script adds to;
// the table maker works without the script.
package web

import (
	"bytes"
	"embed"
	"html/template"
	"io/fs"
	"net/http"
	"time"

	"steamcell/fn/diagram"
	"steamcell/fn/point"
	"steamcell/fn/table"
	"steamcell/fn/units"
)

//go:embed page.html assets
var files embed.FS

// Choice is one option of a select element.
type Choice struct{ Value, Label string }

// pageData is what the template shows; every list comes from the
// catalogue that defines it.
type pageData struct {
	Inputs   []Choice
	UnitSets []string
	Kinds    []Choice
	Formats  []string
	Caution  string
	Version  string
}

// inputWords names the inputs of the calculator in words.
var inputWords = map[string]string{
	"p": "pressure p", "t": "temperature t", "h": "specific enthalpy h", "s": "specific entropy s",
	"v": "specific volume v", "rho": "density ρ", "u": "specific internal energy u", "x": "quality x",
}

// Handler returns the page and its assets: GET / and GET /web/….
// caution is shown under the calculator's answers.
func Handler(caution, version string) (page, assets http.Handler, err error) {
	tpl, err := template.ParseFS(files, "page.html")
	if err != nil {
		return nil, nil, err
	}
	data := pageData{UnitSets: units.SetNames(), Formats: table.Formats, Caution: caution, Version: version}
	for _, in := range point.InputNames() {
		data.Inputs = append(data.Inputs, Choice{in, inputWords[in]})
	}
	for _, k := range diagram.Kinds() {
		data.Kinds = append(data.Kinds, Choice{k.Name, k.Title})
	}
	var b bytes.Buffer
	if err := tpl.Execute(&b, data); err != nil {
		return nil, nil, err
	}
	body := b.Bytes()
	started := time.Now()
	page = http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		// The page loads nothing from elsewhere; say so to the browser.
		w.Header().Set("Content-Security-Policy", "default-src 'self'; connect-src 'self' blob:; img-src 'self' blob: data:; style-src 'self'; script-src 'self'")
		http.ServeContent(w, r, "index.html", started, bytes.NewReader(body))
	})
	sub, err := fs.Sub(files, "assets")
	if err != nil {
		return nil, nil, err
	}
	assets = http.StripPrefix("/web/", http.FileServer(http.FS(sub)))
	return page, assets, nil
}
