package point

import (
	"math"
	"strings"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/transport"
	"steamcell/fn/units"
)

// Property is one entry of the catalogue: an output property with its
// symbol, its name in words, its quantity (for units), its kind, where it
// applies, a one-line description, and how to read it from a state.
type Property struct {
	Symbol  string
	Name    string
	Dim     units.Dim // 0 for text and for pure numbers with no unit at all (region)
	Diff    bool      // a difference of Dim (superheat): converted without offset or gauge
	Kind    Kind
	Applies Applies
	Doc     string // one line, for the README, doc.go and get= lists
	Default bool   // in an answer that names no properties
	Always  bool   // in every answer, apart from the fields (phase, region)
	get     func(*view) (float64, bool)
}

// Kind is what a property's value is.
type Kind uint8

// Kinds of value.
const (
	Number Kind = iota + 1
	Text
)

func (k Kind) String() string {
	if k == Text {
		return "text"
	}
	return "number"
}

// Applies says for which states a property has a value.
type Applies uint8

// States a property applies to; a property may apply to several.
const (
	// SinglePhase: a state of one phase (compressed liquid, superheated
	// vapour, supercritical fluid; saturated liquid or vapour alone).
	SinglePhase Applies = 1 << iota
	// SaturatedPhases: the saturated liquid and vapour of a state on the
	// saturation line (given x, or a mixture found from other inputs); the
	// properties that apply to them but not to a mixture as a whole are
	// those of /saturation.
	SaturatedPhases
	// Mixture: a saturated mixture as a whole.
	Mixture
)

func (a Applies) String() string {
	var parts []string
	for _, x := range []struct {
		bit  Applies
		name string
	}{{SinglePhase, "single phase"}, {SaturatedPhases, "saturated phases"}, {Mixture, "mixture"}} {
		if a&x.bit != 0 {
			parts = append(parts, x.name)
		}
	}
	return strings.Join(parts, ", ")
}

// Unit returns the unit of the property in set: the label and the unit a
// value converts with. A difference (Diff) of temperature is in K where
// the set's temperature is K or °C and in °F where it is °F or °R, a
// degree of difference (R7-97 works in K; 1 K = 1.8 °F of difference,
// NIST SP 811 (2008) B.8).
func (p Property) Unit(set units.Set) string {
	if p.Dim == 0 {
		return ""
	}
	if p.Diff {
		_, label := diffScale(set.Unit(p.Dim))
		return label
	}
	return set.Unit(p.Dim).Name
}

// fromBase converts a value of the property from base units to u, the
// set's unit of its quantity.
func (p *Property) fromBase(v float64, u *units.Unit, patm float64) float64 {
	if p.Diff {
		f, _ := diffScale(*u)
		return v * f
	}
	return u.FromBase(v, patm)
}

// diffScale returns the factor and the label of a temperature difference
// in the scale of temperature unit u: 1 and K for K and °C, 1.8 and °F for
// °F and °R (exact: 1 K = 1.8 °R, NIST SP 811 (2008) B.8), as people write
// them ("5 K of superheat", "9 °F"). Only temperature differences are in
// the catalogue.
func diffScale(u units.Unit) (float64, string) {
	// The slope of u, read off two of its values; the offset cancels but
	// for its rounding, which the snap to the two scales removes.
	if f := u.FromBase(1, 0) - u.FromBase(0, 0); math.Abs(f-1.8) < 1e-9 {
		return 1.8, "°F"
	}
	return 1, "K"
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

// superheat returns T − Tsat(p) of a single-phase state below pc.
func (w *view) superheat() (float64, bool) {
	w.sat()
	return w.st.T - w.tsat, w.tsatOK && w.st.Defined() && w.st.P < if97.Pc
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
// It is the one list: answers, get= and --add, the README symbol table,
// doc.go, the OpenAPI enum of /state/{property} and the list of /saturation
// are made from it or checked against it (catalogue_test.go and the
// server's tests).
var catalogue = []Property{
	{Symbol: "phase", Name: "phase", Kind: Text, Applies: all, Always: true,
		Doc: "the phase in words: compressed liquid, saturated mixture, superheated vapour, …"},
	{Symbol: "region", Name: "IF97 region", Kind: Number, Applies: all, Always: true,
		Doc: "the region of IAPWS-IF97 whose equation gives the state: 1, 2, 3, 5, or 4 on the saturation line"},
	{Symbol: "p", Name: "pressure", Dim: units.Pressure, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.P }),
		Doc: "absolute pressure"},
	{Symbol: "t", Name: "temperature", Dim: units.Temperature, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.T }),
		Doc: "temperature"},
	{Symbol: "v", Name: "specific volume", Dim: units.SpecificVolume, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.V }),
		Doc: "specific volume"},
	{Symbol: "rho", Name: "density", Dim: units.Density, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.Rho }),
		Doc: "density, 1/v"},
	{Symbol: "u", Name: "specific internal energy", Dim: units.SpecificEnergy, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.U }),
		Doc: "specific internal energy"},
	{Symbol: "h", Name: "specific enthalpy", Dim: units.SpecificEnergy, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.H }),
		Doc: "specific enthalpy"},
	{Symbol: "s", Name: "specific entropy", Dim: units.SpecificEntropy, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.S }),
		Doc: "specific entropy"},
	{Symbol: "g", Name: "specific Gibbs energy", Dim: units.SpecificEnergy, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.G }),
		Doc: "specific Gibbs energy, h − Ts"},
	{Symbol: "f", Name: "specific Helmholtz energy", Dim: units.SpecificEnergy, Applies: all, Default: true, get: always(func(s *fn.State) float64 { return s.F }),
		Doc: "specific Helmholtz energy, u − Ts"},
	{Symbol: "cp", Name: "isobaric heat capacity", Dim: units.SpecificEntropy, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.Cp }),
		Doc: "specific isobaric heat capacity"},
	{Symbol: "cv", Name: "isochoric heat capacity", Dim: units.SpecificEntropy, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.Cv }),
		Doc: "specific isochoric heat capacity"},
	{Symbol: "w", Name: "speed of sound", Dim: units.Speed, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.W }),
		Doc: "speed of sound"},
	{Symbol: "kappa", Name: "isentropic exponent", Dim: units.Dimensionless, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.Kappa }),
		Doc: "isentropic exponent, −(v/p)(∂p/∂v) at constant s"},
	{Symbol: "alphav", Name: "isobaric expansion coefficient", Dim: units.InverseTemperature, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.AlphaV }),
		Doc: "isobaric cubic expansion coefficient, (1/v)(∂v/∂T) at constant p"},
	{Symbol: "kappat", Name: "isothermal compressibility", Dim: units.InversePressure, Applies: SinglePhase, Default: true, get: single(func(p *if97.Props) float64 { return p.KappaT }),
		Doc: "isothermal compressibility, −(1/v)(∂v/∂p) at constant T"},
	{Symbol: "x", Name: "quality", Dim: units.Quality, Applies: Mixture, Default: true, get: func(w *view) (float64, bool) { return w.st.X, w.st.HasX },
		Doc: "quality, the vapour mass fraction (on the saturation line)"},
	{Symbol: "tsat", Name: "saturation temperature", Dim: units.Temperature, Applies: SinglePhase | Mixture, get: func(w *view) (float64, bool) { w.sat(); return w.tsat, w.tsatOK },
		Doc: "saturation temperature at the state's pressure (up to pc)"},
	{Symbol: "psat", Name: "saturation pressure", Dim: units.Pressure, Applies: SinglePhase | Mixture, get: func(w *view) (float64, bool) { w.sat(); return w.psat, w.psatOK },
		Doc: "saturation pressure at the state's temperature (up to Tc)"},
	{Symbol: "superheat", Name: "degree of superheat", Dim: units.Temperature, Diff: true, Applies: SinglePhase, get: (*view).superheat,
		Doc: "T − Tsat(p), a temperature difference, below pc (negative for a compressed liquid)"},
	{Symbol: "subcooling", Name: "degree of subcooling", Dim: units.Temperature, Diff: true, Applies: SinglePhase,
		get: func(w *view) (float64, bool) { d, ok := w.superheat(); return -d, ok },
		Doc: "Tsat(p) − T, a temperature difference, below pc (negative for a superheated vapour)"},
	{Symbol: "vf", Name: "saturated-liquid specific volume", Dim: units.SpecificVolume, Applies: SaturatedPhases, Default: true, get: liq(func(p *if97.Props) float64 { return p.V }),
		Doc: "specific volume of the saturated liquid"},
	{Symbol: "vg", Name: "saturated-vapour specific volume", Dim: units.SpecificVolume, Applies: SaturatedPhases, Default: true, get: vap(func(p *if97.Props) float64 { return p.V }),
		Doc: "specific volume of the saturated vapour"},
	{Symbol: "rhof", Name: "saturated-liquid density", Dim: units.Density, Applies: SaturatedPhases, Default: true, get: liq(func(p *if97.Props) float64 { return p.Rho }),
		Doc: "density of the saturated liquid"},
	{Symbol: "rhog", Name: "saturated-vapour density", Dim: units.Density, Applies: SaturatedPhases, Default: true, get: vap(func(p *if97.Props) float64 { return p.Rho }),
		Doc: "density of the saturated vapour"},
	{Symbol: "uf", Name: "saturated-liquid internal energy", Dim: units.SpecificEnergy, Applies: SaturatedPhases, Default: true, get: liq(func(p *if97.Props) float64 { return p.U }),
		Doc: "specific internal energy of the saturated liquid"},
	{Symbol: "ug", Name: "saturated-vapour internal energy", Dim: units.SpecificEnergy, Applies: SaturatedPhases, Default: true, get: vap(func(p *if97.Props) float64 { return p.U }),
		Doc: "specific internal energy of the saturated vapour"},
	{Symbol: "hf", Name: "saturated-liquid enthalpy", Dim: units.SpecificEnergy, Applies: SaturatedPhases, Default: true, get: liq(func(p *if97.Props) float64 { return p.H }),
		Doc: "specific enthalpy of the saturated liquid"},
	{Symbol: "hg", Name: "saturated-vapour enthalpy", Dim: units.SpecificEnergy, Applies: SaturatedPhases, Default: true, get: vap(func(p *if97.Props) float64 { return p.H }),
		Doc: "specific enthalpy of the saturated vapour"},
	{Symbol: "sf", Name: "saturated-liquid entropy", Dim: units.SpecificEntropy, Applies: SaturatedPhases, Default: true, get: liq(func(p *if97.Props) float64 { return p.S }),
		Doc: "specific entropy of the saturated liquid"},
	{Symbol: "sg", Name: "saturated-vapour entropy", Dim: units.SpecificEntropy, Applies: SaturatedPhases, Default: true, get: vap(func(p *if97.Props) float64 { return p.S }),
		Doc: "specific entropy of the saturated vapour"},
	{Symbol: "vfg", Name: "specific volume of evaporation", Dim: units.SpecificVolume, Applies: SaturatedPhases, get: latent(func(p *if97.Props) float64 { return p.V }),
		Doc: "vg − vf"},
	{Symbol: "ufg", Name: "internal energy of evaporation", Dim: units.SpecificEnergy, Applies: SaturatedPhases, get: latent(func(p *if97.Props) float64 { return p.U }),
		Doc: "ug − uf"},
	{Symbol: "hfg", Name: "enthalpy of evaporation", Dim: units.SpecificEnergy, Applies: SaturatedPhases, get: latent(func(p *if97.Props) float64 { return p.H }),
		Doc: "hg − hf, the latent heat"},
	{Symbol: "sfg", Name: "entropy of evaporation", Dim: units.SpecificEntropy, Applies: SaturatedPhases, get: latent(func(p *if97.Props) float64 { return p.S }),
		Doc: "sg − sf"},
	{Symbol: "mu", Name: "dynamic viscosity", Dim: units.DynamicViscosity, Applies: SinglePhase, get: tr(func(r *transport.Result) float64 { return r.Viscosity }),
		Doc: "dynamic viscosity (IAPWS R12-08)"},
	{Symbol: "k", Name: "thermal conductivity", Dim: units.ThermalConductivity, Applies: SinglePhase, get: tr(func(r *transport.Result) float64 { return r.Conductivity }),
		Doc: "thermal conductivity (IAPWS R15-11)"},
	{Symbol: "nu", Name: "kinematic viscosity", Dim: units.KinematicViscosity, Applies: SinglePhase, get: tr(func(r *transport.Result) float64 { return r.KinematicViscosity }),
		Doc: "kinematic viscosity, mu/rho"},
	{Symbol: "alpha", Name: "thermal diffusivity", Dim: units.ThermalDiffusivity, Applies: SinglePhase, get: tr(func(r *transport.Result) float64 { return r.ThermalDiffusivity }),
		Doc: "thermal diffusivity, k/(rho cp)"},
	{Symbol: "pr", Name: "Prandtl number", Dim: units.Dimensionless, Applies: SinglePhase, get: tr(func(r *transport.Result) float64 { return r.Prandtl }),
		Doc: "Prandtl number, mu cp/k"},
	{Symbol: "muf", Name: "saturated-liquid dynamic viscosity", Dim: units.DynamicViscosity, Applies: SaturatedPhases, get: trL(func(r *transport.Result) float64 { return r.Viscosity }),
		Doc: "dynamic viscosity of the saturated liquid"},
	{Symbol: "mug", Name: "saturated-vapour dynamic viscosity", Dim: units.DynamicViscosity, Applies: SaturatedPhases, get: trV(func(r *transport.Result) float64 { return r.Viscosity }),
		Doc: "dynamic viscosity of the saturated vapour"},
	{Symbol: "kf", Name: "saturated-liquid thermal conductivity", Dim: units.ThermalConductivity, Applies: SaturatedPhases, get: trL(func(r *transport.Result) float64 { return r.Conductivity }),
		Doc: "thermal conductivity of the saturated liquid"},
	{Symbol: "kg", Name: "saturated-vapour thermal conductivity", Dim: units.ThermalConductivity, Applies: SaturatedPhases, get: trV(func(r *transport.Result) float64 { return r.Conductivity }),
		Doc: "thermal conductivity of the saturated vapour"},
	{Symbol: "nuf", Name: "saturated-liquid kinematic viscosity", Dim: units.KinematicViscosity, Applies: SaturatedPhases, get: trL(func(r *transport.Result) float64 { return r.KinematicViscosity }),
		Doc: "kinematic viscosity of the saturated liquid"},
	{Symbol: "nug", Name: "saturated-vapour kinematic viscosity", Dim: units.KinematicViscosity, Applies: SaturatedPhases, get: trV(func(r *transport.Result) float64 { return r.KinematicViscosity }),
		Doc: "kinematic viscosity of the saturated vapour"},
	{Symbol: "prf", Name: "saturated-liquid Prandtl number", Dim: units.Dimensionless, Applies: SaturatedPhases, get: trL(func(r *transport.Result) float64 { return r.Prandtl }),
		Doc: "Prandtl number of the saturated liquid"},
	{Symbol: "prg", Name: "saturated-vapour Prandtl number", Dim: units.Dimensionless, Applies: SaturatedPhases, get: trV(func(r *transport.Result) float64 { return r.Prandtl }),
		Doc: "Prandtl number of the saturated vapour"},
	{Symbol: "sigma", Name: "surface tension", Dim: units.SurfaceTension, Applies: SinglePhase | SaturatedPhases, get: func(w *view) (float64, bool) { return w.surface() },
		Doc: "surface tension of water against its vapour at T (IAPWS R1-76), up to Tc"},
}

// all: a property every state has.
const all = SinglePhase | SaturatedPhases | Mixture

// defaultSymbols are the properties an answer gives when none are asked
// for: the thermodynamic ones (transport costs as much again; ask for it).
var defaultSymbols = func() []string {
	var out []string
	for _, p := range catalogue {
		if p.Default {
			out = append(out, p.Symbol)
		}
	}
	return out
}()

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
