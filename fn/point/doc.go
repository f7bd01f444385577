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
//
// # Headers
//
// A table of points (a CSV body of /batch, the keys of its JSON objects, a
// sheet that fill or POST /workbook fills) names its input columns in a
// header row, perhaps with a row of units under it and a column map;
// ReadTable reads them all, by these rules:
//
//   - A header names a quantity by a word (pressure, temperature, enthalpy,
//     entropy, volume, density, quality, dryness, "internal energy") or by
//     its symbol as the first or last word ("P1 [psig]", "Steam T [°C]").
//     Words that make it another measurement (drop, rise, difference,
//     superheat, time, tag, …) make it no input: "Pressure drop [kPa]",
//     "Volume flow [m³/h]".
//   - A unit in brackets or parentheses counts wherever it stands:
//     "Pressure [barg] PT-101", "T [K] inlet", "Drum pressure [bar] avg".
//     Without brackets a unit may stand as a word: "P barg", "Pressure,
//     barg", "Steam T °C".
//   - Brackets that hold a tag ("[PT-101]", "(TI2301)") are passed over.
//   - Words outside the unit that qualify or contradict it are refused, with
//     the header as it should be written: "P [kPa] gauge" (write "P
//     [kPag]"), "P [barg] abs" (write "P [bar]"), "T [°C] abs" (write
//     "T [K]"), "P bar g" (write "P [barg]"), a vacuum reading. Words that
//     repeat what the unit says are fine: "P [bar] abs", "T [K] abs".
//   - Brackets that hold no unit of the header's quantity stop the table
//     unless the row of units or the map gives one: "Pressure (drum)",
//     "P [barx]", and a unit of another quantity, "P [°C]", always. So do
//     two units ("Pressure [barg] [kPa]") and two quantities ("Pressure or
//     temperature"). The message lists the headers seen.
//   - The row under the header is a row of units when every cell under an
//     input column is blank or a unit of its quantity ("barg", "[°C]"); it
//     fills in the units the headers leave out, and must agree with those
//     they give.
//   - A column map (ParseMap) says which columns are inputs; its unit comes
//     first, then the header's (when the header names the same quantity),
//     then the row of units.
//   - A header that names a quantity and no unit anywhere is read in the
//     unit set, and Column.Note says so: `p "Pressure": read as kPa, unit
//     set si`.
package point
