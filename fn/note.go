package fn

import (
	"strconv"
	"strings"
)

// Figure is a number in a message: its quantity and value in base units.
type Figure struct {
	Q    Quantity
	V    float64
	Diff bool // Diff: a difference (K of ΔT), converted without offset
}

// Note is a sentence whose numbers stay numbers until the caller renders them.
type Note struct {
	Text    string   // Text holds {0}, {1}, … where the figures go
	Figures []Figure // the numbers, in base units
}

// note builds a Note from its text and figures.
func note(text string, figs ...Figure) Note { return Note{Text: text, Figures: figs} }

// fig is the Figure of quantity q with value v in base units.
func fig(q Quantity, v float64) Figure { return Figure{Q: q, V: v} }

// BaseText writes f in base units with the base unit: "623.15 K",
// "0.5 K" for a difference, a bare number for a quality.
func (f Figure) BaseText() string {
	s := strconv.FormatFloat(f.V, 'g', 8, 64)
	if u := f.Q.BaseUnit(); u != "" && u != "fraction" {
		s += " " + u
	}
	return s
}

// String renders n with its figures in base units, with the base unit.
func (n Note) String() string { return n.Render(Figure.BaseText) }

// Render writes n with each {i} replaced by format(Figures[i]). A
// placeholder without a figure is left as it stands.
func (n Note) Render(format func(Figure) string) string {
	if len(n.Figures) == 0 {
		return n.Text
	}
	var b strings.Builder
	t := n.Text
	for {
		i := strings.IndexByte(t, '{')
		if i < 0 {
			break
		}
		j := strings.IndexByte(t[i:], '}')
		if j < 0 {
			break
		}
		k, err := strconv.Atoi(t[i+1 : i+j])
		if err != nil || k < 0 || k >= len(n.Figures) {
			b.WriteString(t[:i+j+1])
			t = t[i+j+1:]
			continue
		}
		b.WriteString(t[:i])
		b.WriteString(format(n.Figures[k]))
		t = t[i+j+1:]
	}
	b.WriteString(t)
	return b.String()
}
