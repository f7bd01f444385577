package units

// Dim is the kind of quantity a value has. Kinds that share SI dimensions
// stay apart when their meaning differs: kinematic viscosity and thermal
// diffusivity are both m²/s, quality and the Prandtl number are both pure
// numbers. The zero Dim is no quantity and is accepted by nothing.
type Dim uint8

// Quantities of the engine, each with its base unit (the unit values have
// inside steamcell).
const (
	Pressure            Dim = iota + 1 // absolute pressure, MPa
	Temperature                        // thermodynamic temperature, K
	SpecificEnergy                     // specific enthalpy, internal energy, Gibbs and Helmholtz energy, kJ/kg
	SpecificEntropy                    // specific entropy and specific heat capacity, kJ/(kg·K)
	SpecificVolume                     // m³/kg
	Density                            // kg/m³
	Speed                              // speed of sound, m/s
	DynamicViscosity                   // Pa·s
	ThermalConductivity                // W/(m·K)
	SurfaceTension                     // N/m
	Quality                            // vapour mass fraction, 0..1
	KinematicViscosity                 // m²/s
	ThermalDiffusivity                 // m²/s
	InverseTemperature                 // isobaric expansion coefficient, 1/K
	InversePressure                    // isothermal compressibility, 1/MPa
	Dimensionless                      // Prandtl number, isentropic exponent

	numDims = int(Dimensionless) + 1
)

var dimNames = [numDims]string{
	Pressure:            "pressure",
	Temperature:         "temperature",
	SpecificEnergy:      "specific energy",
	SpecificEntropy:     "specific entropy or heat capacity",
	SpecificVolume:      "specific volume",
	Density:             "density",
	Speed:               "speed",
	DynamicViscosity:    "dynamic viscosity",
	ThermalConductivity: "thermal conductivity",
	SurfaceTension:      "surface tension",
	Quality:             "quality",
	KinematicViscosity:  "kinematic viscosity",
	ThermalDiffusivity:  "thermal diffusivity",
	InverseTemperature:  "inverse temperature",
	InversePressure:     "inverse pressure",
	Dimensionless:       "dimensionless number",
}

// String returns the name of the quantity in words, e.g. "specific volume".
func (d Dim) String() string {
	if !d.valid() {
		return "no quantity"
	}
	return dimNames[d]
}

func (d Dim) valid() bool { return d >= Pressure && d <= Dimensionless }

// Dims returns every quantity, in the order of the constants.
func Dims() []Dim {
	ds := make([]Dim, 0, numDims-1)
	for d := Pressure; d <= Dimensionless; d++ {
		ds = append(ds, d)
	}
	return ds
}

// Base returns the base unit of the quantity: the unit values are held in
// between reading and writing (MPa, K, kJ/kg, ...). It returns the zero
// Unit for an invalid Dim.
func (d Dim) Base() Unit {
	if !d.valid() {
		return Unit{}
	}
	return registry[d].units[0]
}
