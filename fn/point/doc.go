// Package point is the one place where a point, as a user gives it (two
// named inputs as text with units, a unit set, an atmospheric pressure), is
// read into the engine's inputs, and where a solved state is written back
// as named properties in the user's units. The state command, the server
// and the workbook all go through it, so that a name, a unit or a property
// means the same everywhere.
//
// Property symbols (the keys of JSON answers, the names in get= lists and
// workbook columns):
//
//	p        pressure                          t       temperature
//	v        specific volume                   rho     density
//	u        specific internal energy          h       specific enthalpy
//	s        specific entropy                  g       specific Gibbs energy
//	f        specific Helmholtz energy         cp      isobaric heat capacity
//	cv       isochoric heat capacity           w       speed of sound
//	kappa    isentropic exponent               alphav  isobaric expansion coefficient
//	kappat   isothermal compressibility        x       quality (on the saturation line)
//	vf, vg, rhof, rhog, uf, ug, hf, hg, sf, sg   saturated liquid (f) and vapour (g)
//	hfg, sfg, vfg, ufg                        vapour minus liquid (latent values)
//	mu       dynamic viscosity                 k       thermal conductivity
//	nu       kinematic viscosity               alpha   thermal diffusivity
//	pr       Prandtl number                    sigma   surface tension
//	muf, mug, kf, kg, nuf, nug, prf, prg     transport of saturated liquid and vapour
//	tsat     saturation temperature at p (below pc)
//	psat     saturation pressure at T (below Tc)
//
// The f and g suffixes are the steam-table notation of the trade for the
// saturated liquid and vapour.
package point
