package diagram

import (
	"math"
	"slices"

	"steamcell/fn"
	"steamcell/fn/if97"
)

// Sample is one state on a line, in base units: MPa, K, m³/kg, kJ/kg,
// kJ/(kg·K). X is the quality where the state is on the saturation line
// (HasX), so that tests can tell the two ends of an isobar's plateau from
// its single-phase states.
type Sample struct {
	P, T, V, H, S float64
	X             float64
	HasX          bool
}

func sampleOf(st *fn.State) Sample {
	return Sample{P: st.P, T: st.T, V: st.V, H: st.H, S: st.S, X: st.X, HasX: st.HasX}
}

func sampleOfProps(pr *if97.Props, x float64) Sample {
	return Sample{P: pr.P, T: pr.T, V: pr.V, H: pr.H, S: pr.S, X: x, HasX: true}
}

// Family is what a line shows.
type Family string

// The families of line.
const (
	Liquid   Family = "saturated liquid" // the dome's left branch, up to the critical point
	Vapour   Family = "saturated vapour" // the dome's right branch, from the critical point
	Isobar   Family = "isobar"
	Isotherm Family = "isotherm"
	Quality  Family = "quality"
	Boundary Family = "region boundary"
	Process  Family = "process" // a user's segment from one point to the next
)

// Line is one line of a diagram: samples in order along it. Value is the
// constant of an isobar (MPa), isotherm (K) or line of quality (fraction);
// Label names it for a reader ("regions 2 and 3" for a boundary).
type Line struct {
	Family  Family
	Value   float64
	Label   string
	Samples []Sample
}

// Critical is the critical point, R7-97(2012) Eqs. 2 to 4 (Tc = 647.096 K,
// pc = 22.064 MPa); its state is the meeting of the saturation lines.
func Critical() Sample {
	sat, _ := fn.SaturationAtT(if97.Tc)
	return sampleOfProps(&sat.Liquid, 0)
}

// domeSteps is the number of temperatures along each branch of the dome;
// they crowd towards the critical point, where the branches turn.
const domeSteps = 160

// domeTemperatures returns temperatures from 273.15 K to Tc, closer
// together towards Tc (quadratically), ending at Tc.
func domeTemperatures() []float64 {
	ts := make([]float64, domeSteps+1)
	for i := range ts {
		u := float64(i) / domeSteps
		ts[i] = fn.TMin + (if97.Tc-fn.TMin)*(1-(1-u)*(1-u))
	}
	ts[domeSteps] = if97.Tc
	return ts
}

// Dome returns the saturation dome: the saturated-liquid line from
// 273.15 K up to the critical point and the saturated-vapour line from
// the critical point down to 273.15 K, both from fn.SaturationAtT
// (R7-97(2012) Eq. 30 with regions 1, 2 and 3).
func Dome() (liquid, vapour Line) {
	liquid = Line{Family: Liquid, Label: "saturated liquid"}
	vapour = Line{Family: Vapour, Label: "saturated vapour"}
	ts := domeTemperatures()
	for _, T := range ts {
		sat, err := fn.SaturationAtT(T)
		if err != nil {
			continue
		}
		liquid.Samples = append(liquid.Samples, sampleOfProps(&sat.Liquid, 0))
	}
	for i := len(ts) - 1; i >= 0; i-- {
		sat, err := fn.SaturationAtT(ts[i])
		if err != nil {
			continue
		}
		vapour.Samples = append(vapour.Samples, sampleOfProps(&sat.Vapour, 1))
	}
	return liquid, vapour
}

// isobarSteps is the number of temperature steps of an isobar over
// 273.15 K to 1073.15 K (2 K apart), refined near saturation and the
// critical point where the slope changes fast.
const isobarSteps = 400

// IsobarLine returns the isobar at p (MPa) from 273.15 K to 1073.15 K:
// single-phase states from fn.FromPT, and below the critical pressure the
// plateau from saturated liquid to saturated vapour at Ts(p).
func IsobarLine(p float64) Line {
	l := Line{Family: Isobar, Value: p}
	var ts float64
	sat := p < if97.Pc && p >= fn.PMinSat
	if sat {
		ts = if97.SatTemperature(p)
	}
	temps := make([]float64, 0, isobarSteps+40)
	for i := 0; i <= isobarSteps; i++ {
		temps = append(temps, tLow+(tHigh-tLow)*float64(i)/isobarSteps)
	}
	// Refine within 20 K of Tc, where the near-critical isobars bend.
	for i := 1; i < 40; i++ {
		temps = append(temps, if97.Tc-20+float64(i))
	}
	slices.Sort(temps)
	l.Samples = sweep(temps, sat, ts, func() ([]Sample, bool) {
		s, err := fn.SaturationAtP(p)
		return []Sample{sampleOfProps(&s.Liquid, 0), sampleOfProps(&s.Vapour, 1)}, err == nil
	}, func(T float64) (fn.State, error) { return fn.FromPT(p, T) })
	return l
}

// sweep samples state(x) at each of xs (ascending). With sat set, the
// saturated phases of plateau() go in where xs first reaches xsat, and a
// sample at xsat itself, which lies on the line, is left out.
func sweep(xs []float64, sat bool, xsat float64, plateau func() ([]Sample, bool), state func(float64) (fn.State, error)) []Sample {
	var out []Sample
	for _, x := range xs {
		if sat && x >= xsat {
			sat = false
			if ps, ok := plateau(); ok {
				out = append(out, ps...)
			}
			if x == xsat {
				continue
			}
		}
		if st, err := state(x); err == nil {
			out = append(out, sampleOf(&st))
		}
	}
	return out
}

// isothermSteps is the number of pressures of an isotherm, evenly spaced
// in log p from 0.6 kPa to 100 MPa.
const isothermSteps = 300

// IsothermLine returns the isotherm at T (K) from 0.6 kPa to 100 MPa (50
// MPa above 1073.15 K, the top of region 5): single-phase states from
// fn.FromPT, and below the critical temperature the plateau from saturated
// vapour to saturated liquid at ps(T).
func IsothermLine(T float64) Line {
	l := Line{Family: Isotherm, Value: T}
	top := pHigh
	if T > fn.TMax {
		top = fn.PMaxHigh
	}
	var psat float64
	sat := T <= if97.Tc && T >= fn.TMin
	if sat {
		psat = if97.SatPressure(T)
	}
	ps := make([]float64, isothermSteps+1)
	for i := range ps {
		ps[i] = pLow * math.Pow(top/pLow, float64(i)/isothermSteps)
	}
	l.Samples = sweep(ps, sat, psat, func() ([]Sample, bool) {
		s, err := fn.SaturationAtT(T)
		return []Sample{sampleOfProps(&s.Vapour, 1), sampleOfProps(&s.Liquid, 0)}, err == nil
	}, func(p float64) (fn.State, error) { return fn.FromPT(p, T) })
	return l
}

// QualityLine returns the line of quality x (0 < x < 1) from 273.15 K to
// the critical point, from fn.FromTX.
func QualityLine(x float64) Line {
	l := Line{Family: Quality, Value: x}
	for _, T := range domeTemperatures() {
		if T == if97.Tc {
			l.Samples = append(l.Samples, Critical())
			continue
		}
		st, err := fn.FromTX(T, x)
		if err != nil {
			continue
		}
		l.Samples = append(l.Samples, sampleOf(&st))
	}
	return l
}

// boundarySteps is the number of samples along each region boundary.
const boundarySteps = 80

// Boundaries returns the boundaries between the IF97 regions besides the
// saturation line (region 4, the dome): regions 1 and 3 along 623.15 K
// from ps(623.15 K) to 100 MPa (R7-97(2012) section 4), regions 2 and 3
// along the B23 line from 623.15 K to 863.15 K (Eq. 5), and regions 2 and
// 5 along 1073.15 K up to 50 MPa.
func Boundaries() []Line {
	b13 := Line{Family: Boundary, Value: fn.T13, Label: "regions 1 and 3"}
	b23 := Line{Family: Boundary, Label: "regions 2 and 3"}
	b25 := Line{Family: Boundary, Value: fn.TMax, Label: "regions 2 and 5"}
	p13 := if97.SatPressure(fn.T13)
	tB23Top := if97.B23Temperature(pHigh)
	for i := 0; i <= boundarySteps; i++ {
		u := float64(i) / boundarySteps
		if st, err := fn.FromPT(p13+(pHigh-p13)*u, fn.T13); err == nil {
			b13.Samples = append(b13.Samples, sampleOf(&st))
		}
		T := fn.T13 + (tB23Top-fn.T13)*u
		if st, err := fn.FromPT(if97.B23Pressure(T), T); err == nil {
			b23.Samples = append(b23.Samples, sampleOf(&st))
		}
		if st, err := fn.FromPT(pLow*math.Pow(fn.PMaxHigh/pLow, u), fn.TMax); err == nil {
			b25.Samples = append(b25.Samples, sampleOf(&st))
		}
	}
	return []Line{b13, b23, b25}
}
