// Package point is the one place where a point, as a user gives it (two
// named inputs as text with units, a unit set, an atmospheric pressure), is
// read into the engine's inputs, and where a solved state is written back
// as named properties in the user's units. The state command, the server
// and the workbook all go through it, so that a name, a unit or a property
// means the same everywhere.
//
// Property symbols (the keys of JSON answers, the names in get= lists and
// workbook columns), from the catalogue in props.go; kind and where each
// applies (single phase, saturated phases, mixture) follow the meaning:
//
//	phase      the phase in words: compressed liquid, saturated mixture, superheated vapour, … (text; single phase, saturated phases, mixture)
//	region     the region of IAPWS-IF97 whose equation gives the state: 1, 2, 3, 5, or 4 on the saturation line (number; single phase, saturated phases, mixture)
//	p          absolute pressure (number; single phase, saturated phases, mixture)
//	t          temperature (number; single phase, saturated phases, mixture)
//	v          specific volume (number; single phase, saturated phases, mixture)
//	rho        density, 1/v (number; single phase, saturated phases, mixture)
//	u          specific internal energy (number; single phase, saturated phases, mixture)
//	h          specific enthalpy (number; single phase, saturated phases, mixture)
//	s          specific entropy (number; single phase, saturated phases, mixture)
//	g          specific Gibbs energy, h − Ts (number; single phase, saturated phases, mixture)
//	f          specific Helmholtz energy, u − Ts (number; single phase, saturated phases, mixture)
//	cp         specific isobaric heat capacity (number; single phase)
//	cv         specific isochoric heat capacity (number; single phase)
//	w          speed of sound (number; single phase)
//	kappa      isentropic exponent, −(v/p)(∂p/∂v) at constant s (number; single phase)
//	alphav     isobaric cubic expansion coefficient, (1/v)(∂v/∂T) at constant p (number; single phase)
//	kappat     isothermal compressibility, −(1/v)(∂v/∂p) at constant T (number; single phase)
//	x          quality, the vapour mass fraction (on the saturation line) (number; mixture)
//	tsat       saturation temperature at the state's pressure (up to pc) (number; single phase, mixture)
//	psat       saturation pressure at the state's temperature (up to Tc) (number; single phase, mixture)
//	superheat  T − Tsat(p), a temperature difference, below pc (negative for a compressed liquid) (number; single phase)
//	subcooling Tsat(p) − T, a temperature difference, below pc (negative for a superheated vapour) (number; single phase)
//	vf         specific volume of the saturated liquid (number; saturated phases)
//	vg         specific volume of the saturated vapour (number; saturated phases)
//	rhof       density of the saturated liquid (number; saturated phases)
//	rhog       density of the saturated vapour (number; saturated phases)
//	uf         specific internal energy of the saturated liquid (number; saturated phases)
//	ug         specific internal energy of the saturated vapour (number; saturated phases)
//	hf         specific enthalpy of the saturated liquid (number; saturated phases)
//	hg         specific enthalpy of the saturated vapour (number; saturated phases)
//	sf         specific entropy of the saturated liquid (number; saturated phases)
//	sg         specific entropy of the saturated vapour (number; saturated phases)
//	vfg        vg − vf (number; saturated phases)
//	ufg        ug − uf (number; saturated phases)
//	hfg        hg − hf, the latent heat (number; saturated phases)
//	sfg        sg − sf (number; saturated phases)
//	mu         dynamic viscosity (IAPWS R12-08) (number; single phase)
//	k          thermal conductivity (IAPWS R15-11) (number; single phase)
//	nu         kinematic viscosity, mu/rho (number; single phase)
//	alpha      thermal diffusivity, k/(rho cp) (number; single phase)
//	pr         Prandtl number, mu cp/k (number; single phase)
//	muf        dynamic viscosity of the saturated liquid (number; saturated phases)
//	mug        dynamic viscosity of the saturated vapour (number; saturated phases)
//	kf         thermal conductivity of the saturated liquid (number; saturated phases)
//	kg         thermal conductivity of the saturated vapour (number; saturated phases)
//	nuf        kinematic viscosity of the saturated liquid (number; saturated phases)
//	nug        kinematic viscosity of the saturated vapour (number; saturated phases)
//	prf        Prandtl number of the saturated liquid (number; saturated phases)
//	prg        Prandtl number of the saturated vapour (number; saturated phases)
//	sigma      surface tension of water against its vapour at T (IAPWS R1-76), up to Tc (number; single phase, saturated phases)
//
// The f and g suffixes are the steam-table notation of the trade for the
// saturated liquid and vapour.
package point
