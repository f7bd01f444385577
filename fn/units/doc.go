// Package units reads values that people type with their units and writes
// values back in the units they choose. A value becomes a base unit when it
// is read (Parse) and leaves the base unit only when it is written
// (Unit.FromBase); everything in between works in base units:
//
//	pressure                MPa, absolute
//	temperature             K
//	specific energy         kJ/kg          (enthalpy, internal energy, ...)
//	specific entropy        kJ/(kg·K)      (also heat capacity)
//	specific volume         m³/kg
//	density                 kg/m³
//	speed                   m/s
//	dynamic viscosity       Pa·s
//	thermal conductivity    W/(m·K)
//	surface tension         N/m
//	quality                 fraction 0..1
//	kinematic viscosity     m²/s
//	thermal diffusivity     m²/s
//	inverse temperature     1/K            (isobaric expansion coefficient)
//	inverse pressure        1/MPa          (isothermal compressibility)
//	dimensionless           1              (Prandtl number, isentropic exponent)
//
// A wrong unit gives a plausible wrong number, so the rules below refuse
// text that could be read two ways instead of guessing.
//
// # Numbers
//
// A value is a number, optionally followed by a unit, with or without
// spaces between them ("600kPa", "600 kPa"). The number is an optional sign
// ('+', '-' or the Unicode minus '−'), digits with at most one '.', and an
// optional exponent ("1.2e3", "1.2E+3", "5e−4"). The point '.' is always the
// decimal point. Refused, with ErrAmbiguousNumber, because they mean
// different numbers in different countries:
//
//   - any comma: "1,013.25", "1.013,25", "1013,25"; remove thousands
//     separators and write decimals with '.';
//   - digit groups: "1.013.250", "1'013", "1_000";
//   - a space inside the number: "1 013.25", "- 5".
//
// NaN, infinities and numbers beyond float64 ("1e999") are refused with
// ErrNotFinite, and so is a value that overflows when converted.
//
// # Units
//
// Units are matched ignoring case, spaces, product signs (· ⋅ * .),
// hyphens, brackets, '^' and degree signs, so "kJ/(kg·K)", "kJ/kg-K",
// "kJ/(kg K)", "kJ/kgK" and "KJ/KG.K" are one unit. ³ and 3, ² and 2, µ, μ and
// u, "°C", "ºC", "℃", "deg C", "degC" and "C" are alike; "lbm" reads as "lb",
// "hr" as "h", "sec" as "s". Each quantity accepts the units ForQuantity
// lists, under these spellings (and their variants by the rules above):
//
//	pressure              MPa, Pa (N/m²), kPa, bar, mbar, psia (psi, lbf/in²), atm,
//	                      kgf/cm² (kg/cm²), mmHg, inHg, torr, ata (technical atmosphere),
//	                      mmH2Oa, inH2Oa (mmWCa, inWCa); gauge: MPag, kPag, barg, mbarg,
//	                      psig, kgf/cm²g, mmH2Og, inH2Og (mmWCg, inWCg); vacuum:
//	                      inHg vac, mmHg vac, kPa vac
//	temperature           K (kelvin), °C (C, celsius), °F (F, fahrenheit), °R (R, rankine)
//	specific energy       kJ/kg (J/g), J/kg, MJ/kg (kJ/g), Btu/lb, kcal/kg (cal/g)
//	specific entropy      kJ/(kg·K), J/(kg·K), Btu/(lb·°R), Btu/(lb·°F), kcal/(kg·K);
//	                      also per °C, per g, and kJ/kg/K forms
//	specific volume       m³/kg, L/kg (dm³/kg), cm³/g (mL/g), ft³/lb
//	density               kg/m³ (g/L), g/cm³ (g/mL, kg/L), lb/ft³
//	speed                 m/s, ft/s
//	dynamic viscosity     Pa·s (kg/(m·s)), mPa·s, µPa·s, cP, lb/(ft·h), lb/(ft·s)
//	thermal conductivity  W/(m·K), mW/(m·K), Btu/(h·ft·°F)
//	surface tension       N/m, mN/m, dyn/cm
//	quality               none or "-" (fraction), % (percent)
//	kinematic viscosity   m²/s, mm²/s, cSt, cm²/s, ft²/s, ft²/h
//	thermal diffusivity   m²/s, mm²/s, cm²/s, ft²/s, ft²/h
//	inverse temperature   1/K (K⁻¹), 1/°C, 1/°F, 1/°R
//	inverse pressure      1/MPa (MPa⁻¹), 1/kPa, 1/Pa, 1/bar, 1/psi
//	dimensionless         none or "-"
//
// Ignoring case is safe because no two units of one quantity differ only by
// case. Where a spelling in exact SI case names another prefix it is
// refused rather than read either way: "mPa" (millipascal) and "Mbar" for a
// pressure, "mJ/kg" for a specific energy, "MPa·s" for a viscosity, "MW/(m·K)", "MN/m", "Mm²/s". So "MPa",
// "Mpa", "mpa" and "MPA" are megapascal, and "mPa" is an error; "mPa·s" is
// a viscosity. "K" and "k" are both kelvin for a temperature.
//
// A per-degree unit means per degree of difference, where a kelvin equals a
// degree Celsius and a degree Fahrenheit equals a degree Rankine:
// Btu/(lb·°F) = Btu/(lb·°R) = 4.1868 kJ/(kg·K) exactly; 1/°F = 1.8/K.
//
// # Pressure: absolute and gauge
//
// A pressure unit without a mark is absolute: "bar", "psi" (printed
// "psia"), "kPa". A gauge reading must say so: "barg", "bar(g)", "bar g",
// "bar gauge", "kPag", "kPa(g)", "MPag", "mbarg", "psig", "kgf/cm²g",
// "kg/cm2g". The absolute mark is accepted too: "bara", "bar(a)", "bar abs",
// "psia", "psi(a)", "kPa(a)". Gauge readings are relative to
// Options.Patm (MPa), by default the standard atmosphere 0.101325 MPa; set
// it per site or per request, for example about 0.0899 MPa at 1000 m. An
// absolute pressure at or below zero, typed or reached from a gauge reading,
// is ErrPressureNotPositive. Mercury columns (mmHg, inHg) are the
// conventional ones (13.5951 g/cm³, standard gravity) and absolute; torr
// is 1/760 of the standard atmosphere and ata the technical atmosphere
// (1 kgf/cm²), both absolute. Water columns (conventional: 1 g/cm³,
// standard gravity) must carry their mark, mmH2Og or mmH2Oa, inH2Og or
// inH2Oa: unmarked, "mmH2O" is read both ways in the trade and is refused,
// and so are "at" and a bare "vac".
//
// A vacuum reading counts down from the atmosphere: "28 inHg vac",
// "710 mmHg vac" and "80 kPa vac" are Options.Patm minus the reading. It
// is a gauge unit in every other respect; a negative reading is refused
// (ErrAmbiguousNumber: write a gauge unit), and one beyond the atmosphere
// is ErrPressureNotPositive.
//
// # Temperature
//
// K, °C, °F and °R (also "R", "degR"). A temperature at or below 0 K is
// ErrNegativeAbsolute.
//
// # Quality
//
// Quality is a fraction from 0 to 1 ("0.85") or a percentage with its sign
// ("85 %", "85%"). A bare number outside 0..1, such as "85", is refused with
// ErrQualityRange and a hint to write "85 %": it is never taken to be a
// percentage. Percentages outside 0 % to 100 % are refused too.
//
// # Unit given apart from the value
//
// A unit may come from a column header or a query parameter
// (Options.Unit). It applies to numbers typed without a unit; a unit in the
// text takes precedence, but both must be units of the quantity, and a gauge
// unit never meets an absolute one (ErrUnitConflict: "6 bar" under a
// "barg" header may mean either). Without either, a bare number is in the
// unit of Options.Set.
//
// # Unit sets
//
// A Set picks one unit per quantity for output and for bare numbers:
//
//	si      kPa, °C, kJ/kg, kJ/(kg·K), m³/kg, kg/m³, m/s, µPa·s, W/(m·K), mN/m, mm²/s (the default)
//	si-mpa  as si, with MPa
//	bar     as si, with bar
//	us      psia, °F, Btu/lb, Btu/(lb·°R), ft³/lb, lb/ft³, ft/s, lb/(ft·h), Btu/(h·ft·°F), mN/m, ft²/h
//	base    the base units above
//
// Set.Override changes the unit of one quantity (unit_p=barg).
//
// # Errors
//
// Every error is an *InputError that names the input, quotes the text and
// says what was wrong and what is accepted, for example
//
//	p "300C": °C is a unit of temperature; p needs a unit of pressure: MPa, MPag, Pa, kPa, ...
//
// Its Unwrap gives the kind: ErrEmpty, ErrSyntax, ErrAmbiguousNumber,
// ErrNotFinite, ErrUnknownUnit, ErrWrongDimension, ErrNegativeAbsolute,
// ErrPressureNotPositive,
// ErrQualityRange, ErrUnitConflict, ErrBadPatm or ErrUnknownSet.
//
// # Sources
//
// Conversion factors are built from exact definitions (1 lb = 0.45359237 kg,
// 1 ft = 0.3048 m, 1 in = 0.0254 m, Btu (International Table) =
// 1055.05585262 J, calorie (International Table) = 4.1868 J, 1 kgf =
// 9.80665 N, standard atmosphere = 101 325 Pa, conventional mmHg =
// 133.322387415 Pa, conventional mmH2O = 9.80665 Pa, torr = 101 325/760 Pa, T/K = t/°C + 273.15 = (t/°F + 459.67)/1.8 = (T/°R)/1.8)
// and checked in the tests against NIST Special Publication 811 (2008),
// Appendix B.
package units
