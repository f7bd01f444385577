package point

import (
	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/transport"
	"steamcell/fn/units"
)

// Property is one output property: its symbol, its name in words, its
// quantity (for units) and how to read it from a state.
type Property struct {
	Symbol string
	Name   string
	Dim    units.Dim
	get    func(*view) (float64, bool)
}

// view is a solved state with its transport properties, computed on first
// use (they cost about as much again as the state).
type view struct {
	st *fn.State

	trDone         bool
	tr, trL, trV   transport.Result
	trOK, trLOK    bool
	trVOK          bool
	trWarn         []string
	sigma          float64
	sigmaOK        bool
	sigmaDone      bool
	sigmaWarn      string
	satDone        bool
	tsat, psat     float64
	tsatOK, psatOK bool
}

func (w *view) transport() {
	if w.trDone {
		return
	}
	w.trDone = true
	add := func(r transport.Result) {
		for _, x := range r.Warnings {
			w.trWarn = append(w.trWarn, x.String())
		}
	}
	if w.st.HasX {
		var err error
		w.trL, err = transport.ForState(w.st.Liquid)
		w.trLOK = err == nil
		add(w.trL)
		w.trV, err = transport.ForState(w.st.Vapour)
		w.trVOK = err == nil
		add(w.trV)
		if w.st.X == 0 {
			w.tr, w.trOK = w.trL, w.trLOK
		} else if w.st.X == 1 {
			w.tr, w.trOK = w.trV, w.trVOK
		}
		return
	}
	var err error
	w.tr, err = transport.ForState(w.st.Props)
	w.trOK = err == nil
	add(w.tr)
}

func (w *view) surface() (float64, bool) {
	if !w.sigmaDone {
		w.sigmaDone = true
		s, err := transport.SurfaceTension(w.st.T)
		w.sigma, w.sigmaOK = s, err == nil
		if ww := transport.CheckSurfaceTensionRange(w.st.T); ww != nil && err == nil {
			w.sigmaWarn = ww.String()
		}
	}
	return w.sigma, w.sigmaOK
}

func (w *view) sat() {
	if w.satDone {
		return
	}
	w.satDone = true
	if w.st.P <= if97.Pc && w.st.P >= fn.PMinSat {
		w.tsat, w.tsatOK = if97.SatTemperature(w.st.P), true
	}
	if w.st.T <= if97.Tc && w.st.T >= fn.TMin {
		w.psat, w.psatOK = if97.SatPressure(w.st.T), true
	}
}

func always(f func(*fn.State) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { return f(w.st), true }
}

// single: defined except for a saturated mixture.
func single(f func(*if97.Props) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { return f(&w.st.Props), w.st.Defined() }
}

func liq(f func(*if97.Props) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { return f(&w.st.Liquid), w.st.HasX }
}

func vap(f func(*if97.Props) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { return f(&w.st.Vapour), w.st.HasX }
}

func latent(f func(*if97.Props) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { return f(&w.st.Vapour) - f(&w.st.Liquid), w.st.HasX }
}

func tr(f func(*transport.Result) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) {
		w.transport()
		return f(&w.tr), w.trOK && w.st.Defined()
	}
}

func trL(f func(*transport.Result) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { w.transport(); return f(&w.trL), w.st.HasX && w.trLOK }
}

func trV(f func(*transport.Result) float64) func(*view) (float64, bool) {
	return func(w *view) (float64, bool) { w.transport(); return f(&w.trV), w.st.HasX && w.trVOK }
}

// catalogue lists every output property in the order answers give them.
var catalogue = []Property{
	{"p", "pressure", units.Pressure, always(func(s *fn.State) float64 { return s.P })},
	{"t", "temperature", units.Temperature, always(func(s *fn.State) float64 { return s.T })},
	{"v", "specific volume", units.SpecificVolume, always(func(s *fn.State) float64 { return s.V })},
	{"rho", "density", units.Density, always(func(s *fn.State) float64 { return s.Rho })},
	{"u", "specific internal energy", units.SpecificEnergy, always(func(s *fn.State) float64 { return s.U })},
	{"h", "specific enthalpy", units.SpecificEnergy, always(func(s *fn.State) float64 { return s.H })},
	{"s", "specific entropy", units.SpecificEntropy, always(func(s *fn.State) float64 { return s.S })},
	{"g", "specific Gibbs energy", units.SpecificEnergy, always(func(s *fn.State) float64 { return s.G })},
	{"f", "specific Helmholtz energy", units.SpecificEnergy, always(func(s *fn.State) float64 { return s.F })},
	{"cp", "isobaric heat capacity", units.SpecificEntropy, single(func(p *if97.Props) float64 { return p.Cp })},
	{"cv", "isochoric heat capacity", units.SpecificEntropy, single(func(p *if97.Props) float64 { return p.Cv })},
	{"w", "speed of sound", units.Speed, single(func(p *if97.Props) float64 { return p.W })},
	{"kappa", "isentropic exponent", units.Dimensionless, single(func(p *if97.Props) float64 { return p.Kappa })},
	{"alphav", "isobaric expansion coefficient", units.InverseTemperature, single(func(p *if97.Props) float64 { return p.AlphaV })},
	{"kappat", "isothermal compressibility", units.InversePressure, single(func(p *if97.Props) float64 { return p.KappaT })},
	{"x", "quality", units.Quality, func(w *view) (float64, bool) { return w.st.X, w.st.HasX }},
	{"tsat", "saturation temperature", units.Temperature, func(w *view) (float64, bool) { w.sat(); return w.tsat, w.tsatOK }},
	{"psat", "saturation pressure", units.Pressure, func(w *view) (float64, bool) { w.sat(); return w.psat, w.psatOK }},
	{"vf", "saturated-liquid specific volume", units.SpecificVolume, liq(func(p *if97.Props) float64 { return p.V })},
	{"vg", "saturated-vapour specific volume", units.SpecificVolume, vap(func(p *if97.Props) float64 { return p.V })},
	{"rhof", "saturated-liquid density", units.Density, liq(func(p *if97.Props) float64 { return p.Rho })},
	{"rhog", "saturated-vapour density", units.Density, vap(func(p *if97.Props) float64 { return p.Rho })},
	{"uf", "saturated-liquid internal energy", units.SpecificEnergy, liq(func(p *if97.Props) float64 { return p.U })},
	{"ug", "saturated-vapour internal energy", units.SpecificEnergy, vap(func(p *if97.Props) float64 { return p.U })},
	{"hf", "saturated-liquid enthalpy", units.SpecificEnergy, liq(func(p *if97.Props) float64 { return p.H })},
	{"hg", "saturated-vapour enthalpy", units.SpecificEnergy, vap(func(p *if97.Props) float64 { return p.H })},
	{"sf", "saturated-liquid entropy", units.SpecificEntropy, liq(func(p *if97.Props) float64 { return p.S })},
	{"sg", "saturated-vapour entropy", units.SpecificEntropy, vap(func(p *if97.Props) float64 { return p.S })},
	{"vfg", "specific volume of evaporation", units.SpecificVolume, latent(func(p *if97.Props) float64 { return p.V })},
	{"ufg", "internal energy of evaporation", units.SpecificEnergy, latent(func(p *if97.Props) float64 { return p.U })},
	{"hfg", "enthalpy of evaporation", units.SpecificEnergy, latent(func(p *if97.Props) float64 { return p.H })},
	{"sfg", "entropy of evaporation", units.SpecificEntropy, latent(func(p *if97.Props) float64 { return p.S })},
	{"mu", "dynamic viscosity", units.DynamicViscosity, tr(func(r *transport.Result) float64 { return r.Viscosity })},
	{"k", "thermal conductivity", units.ThermalConductivity, tr(func(r *transport.Result) float64 { return r.Conductivity })},
	{"nu", "kinematic viscosity", units.KinematicViscosity, tr(func(r *transport.Result) float64 { return r.KinematicViscosity })},
	{"alpha", "thermal diffusivity", units.ThermalDiffusivity, tr(func(r *transport.Result) float64 { return r.ThermalDiffusivity })},
	{"pr", "Prandtl number", units.Dimensionless, tr(func(r *transport.Result) float64 { return r.Prandtl })},
	{"muf", "saturated-liquid dynamic viscosity", units.DynamicViscosity, trL(func(r *transport.Result) float64 { return r.Viscosity })},
	{"mug", "saturated-vapour dynamic viscosity", units.DynamicViscosity, trV(func(r *transport.Result) float64 { return r.Viscosity })},
	{"kf", "saturated-liquid thermal conductivity", units.ThermalConductivity, trL(func(r *transport.Result) float64 { return r.Conductivity })},
	{"kg", "saturated-vapour thermal conductivity", units.ThermalConductivity, trV(func(r *transport.Result) float64 { return r.Conductivity })},
	{"nuf", "saturated-liquid kinematic viscosity", units.KinematicViscosity, trL(func(r *transport.Result) float64 { return r.KinematicViscosity })},
	{"nug", "saturated-vapour kinematic viscosity", units.KinematicViscosity, trV(func(r *transport.Result) float64 { return r.KinematicViscosity })},
	{"prf", "saturated-liquid Prandtl number", units.Dimensionless, trL(func(r *transport.Result) float64 { return r.Prandtl })},
	{"prg", "saturated-vapour Prandtl number", units.Dimensionless, trV(func(r *transport.Result) float64 { return r.Prandtl })},
	{"sigma", "surface tension", units.SurfaceTension, func(w *view) (float64, bool) { return w.surface() }},
}

// thermo is the number of leading catalogue entries that are thermodynamic
// (no transport): the default answer.
var defaultSymbols = []string{"p", "t", "v", "rho", "u", "h", "s", "g", "f", "cp", "cv", "w",
	"kappa", "alphav", "kappat", "x", "vf", "vg", "rhof", "rhog", "uf", "ug", "hf", "hg", "sf", "sg"}

// Properties returns the catalogue of output properties.
func Properties() []Property { return append([]Property(nil), catalogue...) }

// Lookup returns the property of a symbol (case-insensitive).
func Lookup(sym string) (Property, bool) {
	for _, p := range catalogue {
		if equalFold(p.Symbol, sym) {
			return p, true
		}
	}
	return Property{}, false
}

// DefaultSymbols returns the properties an answer gives when none are asked
// for: the thermodynamic ones (transport costs as much again; ask for it).
func DefaultSymbols() []string { return append([]string(nil), defaultSymbols...) }
