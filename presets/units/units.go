// Package units reads quantities written with their unit, such as "833.85C",
// "6.59 cm3/mol" or "132 mJ/m2", into SI values. The same parser serves the
// command line and the material cards, so a value means the same thing
// wherever it is written.
package units

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// unit is one way of writing a quantity: SI = (x + offset)·factor.
type unit struct {
	factor, offset float64
}

// Kind is a physical quantity with the units it may be written in.
type Kind struct {
	Name  string            // what it is, for messages ("molar volume")
	SI    string            // the SI unit, for messages and output
	Bare  bool              // a number without a unit is taken in SI
	units map[string]unit   // accepted spellings, in their proper case
	fold  map[string]string // lower-case spelling → proper spelling
}

// CelsiusOffset is the kelvin value of 0 °C (exact by definition of the scale).
const CelsiusOffset = 273.15 // K

// Celsius is a temperature T in kelvin written in degrees Celsius.
func Celsius(T float64) float64 { return T - CelsiusOffset }

const (
	eV      = 1.602176634e-19 // J, exact (SI 2019)
	avog    = 6.02214076e23   // 1/mol, exact (SI 2019)
	calorie = 4.184           // J, thermochemical calorie
)

func k(name, si string, bare bool, u map[string]unit) Kind {
	fold := make(map[string]string, len(u))
	for spelling := range u {
		low := strings.ToLower(spelling)
		if _, dup := fold[low]; dup {
			panic("units: two spellings of " + name + " fold to " + low)
		}
		fold[low] = spelling
	}
	return Kind{Name: name, SI: si, Bare: bare, units: u, fold: fold}
}

// lookup finds the unit written as u (already normalised): in any case,
// except that every m or M must stand as in the proper spelling, so that
// milli and mega are never confused.
func (k Kind) lookup(u string) (unit, bool) {
	proper, ok := k.fold[strings.ToLower(u)]
	if !ok {
		return unit{}, false
	}
	for i := 0; i < len(u); i++ {
		if (u[i] == 'm' || u[i] == 'M') && u[i] != proper[i] {
			return unit{}, false
		}
	}
	return k.units[proper], true
}

// The kinds of quantity undercool reads. Each unit is written in its
// proper case; input may be in any case (data-file headers are lower case)
// except that m and M must be as written here: lower-case m is milli (or
// metre, minute, mole), upper-case M is mega, and the two never stand for
// each other.
var (
	Temperature = k("temperature", "K", true, map[string]unit{
		"K": {1, 0}, "C": {1, CelsiusOffset}, "°C": {1, CelsiusOffset}, "degC": {1, CelsiusOffset},
		"F": {5.0 / 9, 459.67}, "°F": {5.0 / 9, 459.67}, "degF": {5.0 / 9, 459.67},
	})
	TemperatureDifference = k("temperature difference", "K", true, map[string]unit{
		"K": {1, 0}, "C": {1, 0}, "°C": {1, 0}, "degC": {1, 0}, "F": {5.0 / 9, 0}, "°F": {5.0 / 9, 0}, "degF": {5.0 / 9, 0},
	})
	MolarEnergy = k("molar energy", "J/mol", false, map[string]unit{
		"J/mol": {1, 0}, "kJ/mol": {1e3, 0}, "eV": {eV * avog, 0},
		"cal/mol": {calorie, 0}, "kcal/mol": {calorie * 1e3, 0},
	})
	EnergyDensity = k("energy per volume", "J/m3", false, map[string]unit{
		"J/m3": {1, 0}, "kJ/m3": {1e3, 0}, "MJ/m3": {1e6, 0}, "GJ/m3": {1e9, 0}, "J/cm3": {1e6, 0},
	})
	MolarHeatCapacity = k("molar heat capacity", "J/(mol K)", false, map[string]unit{
		"J/mol/K": {1, 0}, "J/(mol*K)": {1, 0}, "J/(molK)": {1, 0}, "J/molK": {1, 0}, "J/K/mol": {1, 0},
	})
	InterfacialEnergy = k("interfacial energy", "J/m2", false, map[string]unit{
		"J/m2": {1, 0}, "mJ/m2": {1e-3, 0}, "erg/cm2": {1e-3, 0},
	})
	// InterfacialEnergySlope is dγ/dT of a temperature-dependent interfacial energy.
	InterfacialEnergySlope = k("interfacial energy per kelvin", "J/(m2 K)", false, map[string]unit{
		"J/m2/K": {1, 0}, "J/(m2*K)": {1, 0}, "mJ/m2/K": {1e-3, 0}, "mJ/(m2*K)": {1e-3, 0}, "erg/cm2/K": {1e-3, 0},
	})
	MolarVolume = k("molar volume", "m3/mol", false, map[string]unit{
		"m3/mol": {1, 0}, "cm3/mol": {1e-6, 0}, "L/mol": {1e-3, 0},
	})
	Diffusivity = k("diffusivity", "m2/s", false, map[string]unit{
		"m2/s": {1, 0}, "cm2/s": {1e-4, 0}, "mm2/s": {1e-6, 0}, "um2/s": {1e-12, 0},
	})
	Length = k("length", "m", false, map[string]unit{
		"m": {1, 0}, "cm": {1e-2, 0}, "mm": {1e-3, 0}, "um": {1e-6, 0}, "nm": {1e-9, 0}, "A": {1e-10, 0}, "Å": {1e-10, 0}, "pm": {1e-12, 0},
	})
	Viscosity = k("viscosity", "Pa s", false, map[string]unit{
		"Pa*s": {1, 0}, "Pas": {1, 0}, "mPa*s": {1e-3, 0}, "mPas": {1e-3, 0}, "P": {0.1, 0}, "poise": {0.1, 0}, "cP": {1e-3, 0},
	})
	Angle = k("angle", "deg", true, map[string]unit{
		"deg": {1, 0}, "°": {1, 0}, "rad": {180 / math.Pi, 0},
	})
	NumberDensity = k("number density", "m^-3", true, map[string]unit{
		"m-3": {1, 0}, "/m3": {1, 0}, "1/m3": {1, 0}, "cm-3": {1e6, 0}, "/cm3": {1e6, 0}, "1/cm3": {1e6, 0},
	})
	RateDensity = k("rate per volume", "m^-3 s^-1", true, map[string]unit{
		"m-3s-1": {1, 0}, "/m3/s": {1, 0}, "1/(m3*s)": {1, 0}, "cm-3s-1": {1e6, 0}, "/cm3/s": {1e6, 0}, "1/(cm3*s)": {1e6, 0},
	})
	Dimensionless = k("number", "", true, map[string]unit{})
	// MoleFraction is a composition: a plain fraction, or in atomic or
	// mole per cent (0.18 at% is 0.0018) or parts per million.
	MoleFraction = k("mole fraction", "", true, map[string]unit{"at%": {0.01, 0}, "mol%": {0.01, 0}, "ppm": {1e-6, 0}})
	// Fraction is a plain number, or a percentage: "45%", a header fraction_percent.
	Fraction = k("fraction", "", true, map[string]unit{
		"%": {0.01, 0}, "percent": {0.01, 0}, "pct": {0.01, 0},
	})
	CoolingRate = k("cooling rate", "K/s", false, temperatureRates)
	HeatingRate = k("heating rate", "K/s", false, temperatureRates)
	Volume      = k("volume", "m3", false, map[string]unit{
		"m3": {1, 0}, "L": {1e-3, 0}, "mL": {1e-6, 0}, "cm3": {1e-6, 0}, "uL": {1e-9, 0}, "mm3": {1e-9, 0}, "nL": {1e-12, 0}, "pL": {1e-15, 0}, "um3": {1e-18, 0},
	})
	Time = k("time", "s", true, map[string]unit{
		"s": {1, 0}, "ms": {1e-3, 0}, "us": {1e-6, 0}, "min": {60, 0}, "h": {3600, 0}, "d": {86400, 0}, "day": {86400, 0}, "days": {86400, 0},
		"y": {365.25 * 86400, 0}, "yr": {365.25 * 86400, 0}, "year": {365.25 * 86400, 0}, "years": {365.25 * 86400, 0},
	})
	// Solutions: molar mass and density of the crystal, the solute's
	// concentration in one of three families (the supersaturation is a
	// ratio, so a concentration and a solubility must share a family), and
	// a crystal growth rate.
	MolarMass = k("molar mass", "kg/mol", false, map[string]unit{
		"kg/mol": {1, 0}, "g/mol": {1e-3, 0},
	})
	Density = k("density", "kg/m3", false, map[string]unit{
		"kg/m3": {1, 0}, "g/cm3": {1e3, 0}, "g/mL": {1e3, 0}, "g/L": {1, 0},
	})
	AmountConcentration = k("molar concentration", "mol/m3", false, map[string]unit{
		"mol/m3": {1, 0}, "mol/L": {1e3, 0}, "mol/dm3": {1e3, 0}, "mmol/L": {1, 0}, "mmol/mL": {1e3, 0},
	})
	MassConcentration = k("mass concentration", "kg/m3", false, map[string]unit{
		"kg/m3": {1, 0}, "g/L": {1, 0}, "mg/mL": {1, 0}, "g/mL": {1e3, 0}, "mg/L": {1e-3, 0}, "g/dm3": {1, 0},
	})
	MassRatio = k("mass ratio", "kg/kg", false, map[string]unit{
		"kg/kg": {1, 0}, "g/kg": {1e-3, 0}, "g/g": {1, 0}, "mg/g": {1e-3, 0}, "g/100g": {1e-2, 0}, "wt%": {1e-2, 0},
	})
	Velocity = k("velocity", "m/s", false, map[string]unit{
		"m/s": {1, 0}, "mm/s": {1e-3, 0}, "um/s": {1e-6, 0}, "nm/s": {1e-9, 0},
		"um/min": {1e-6 / 60, 0}, "um/h": {1e-6 / 3600, 0}, "mm/h": {1e-3 / 3600, 0}, "mm/min": {1e-3 / 60, 0},
	})
)

// temperatureRates are the units of a cooling or a heating rate.
var temperatureRates = map[string]unit{
	"K/s": {1, 0}, "C/s": {1, 0}, "°C/s": {1, 0}, "K/min": {1.0 / 60, 0}, "C/min": {1.0 / 60, 0}, "°C/min": {1.0 / 60, 0},
	"K/h": {1.0 / 3600, 0}, "C/h": {1.0 / 3600, 0}, "°C/h": {1.0 / 3600, 0},
}

// Units lists the accepted spellings of a kind, sorted, for messages.
func (k Kind) Units() []string {
	out := make([]string, 0, len(k.units))
	for u := range k.units {
		out = append(out, u)
	}
	sort.Strings(out)
	return out
}

// allowed is the list of units for a message: the SI unit and a few others.
func (k Kind) allowed() string {
	if len(k.units) == 0 {
		return "a plain number"
	}
	return strings.Join(k.Units(), ", ")
}

// normalise folds the ways people write a unit into one spelling (case is
// kept: lookup decides what case may mean).
func normalise(u string) string {
	return unitSpelling.Replace(u)
}

// unitSpelling is built once: a data file of 10,000 rows parses 20,000 values.
var unitSpelling = strings.NewReplacer(" ", "", "·", "*", ".", "*", "^", "", "²", "2", "³", "3", "⁻", "-", "¹", "1", "µ", "u", "μ", "u", "−", "-")

// splitNumber returns the longest prefix of s that parses as a float and the rest.
func splitNumber(s string) (string, string) {
	end := 0
	for i, c := range s {
		switch {
		case c >= '0' && c <= '9', c == '.', c == '+', c == '-':
		case (c == 'e' || c == 'E') && i > 0 && i+1 < len(s) && strings.ContainsRune("0123456789+-", rune(s[i+1])):
		default:
			return s[:end], s[end:]
		}
		end = i + 1
	}
	return s[:end], s[end:]
}

// Parse reads a number with its unit and returns the SI value. A bare
// number is taken in the SI unit where the kind allows it (temperatures in
// kelvin, angles in degrees); otherwise a unit is required. NaN and ±Inf are
// rejected.
func Parse(s string, k Kind) (float64, error) {
	s = strings.TrimSpace(s)
	num, rest := splitNumber(s)
	x, err := number(num, s)
	if err != nil {
		return 0, err
	}
	u := normalise(rest)
	if u == "" {
		if !k.Bare {
			return 0, fmt.Errorf("%s needs a unit of %s (%s)", Quote(s), k.Name, k.allowed())
		}
		return x, nil
	}
	conv, ok := k.lookup(u)
	if !ok {
		return 0, fmt.Errorf("unit %s in %s is not a unit of %s (use %s)", Quote(strings.TrimSpace(rest)), Quote(s), k.Name, k.allowed())
	}
	return conv.si(x, s)
}

// number is the value of num, the number at the start of s.
func number(num, s string) (float64, error) {
	if num == "" {
		return 0, fmt.Errorf("%s is not a number", Quote(s))
	}
	x, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return 0, fmt.Errorf("%s is not a number", Quote(s))
	}
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return 0, fmt.Errorf("%s is not a finite number", Quote(s))
	}
	return x, nil
}

// si is x, written as s in this unit, in SI.
func (conv unit) si(x float64, s string) (float64, error) {
	v := (x + conv.offset) * conv.factor
	if math.IsInf(v, 0) {
		return 0, fmt.Errorf("%s is out of range", Quote(s))
	}
	return v, nil
}

// In returns the parser of numbers written without their unit u, such as
// the values of a data file's column whose header names the unit: it
// reads s as Parse reads s followed by u, with u looked up once (an empty
// u: as Parse reads s). An unknown unit is an error.
func (k Kind) In(u string) (func(s string) (float64, error), error) {
	n := normalise(u)
	if n == "" {
		return func(s string) (float64, error) { return Parse(s, k) }, nil
	}
	conv, ok := k.lookup(n)
	if !ok {
		return nil, fmt.Errorf("unit %s is not a unit of %s (use %s)", Quote(strings.TrimSpace(u)), k.Name, k.allowed())
	}
	return func(s string) (float64, error) {
		s = strings.TrimSpace(s)
		num, rest := splitNumber(s)
		if rest != "" {
			return 0, fmt.Errorf("%s is not a number", Quote(s))
		}
		x, err := number(num, s)
		if err != nil {
			return 0, err
		}
		return conv.si(x, s)
	}, nil
}

// ParseAny reads a quantity that may be of one of several kinds (an
// enthalpy per mole or per volume) and returns the value and its kind's index.
func ParseAny(s string, kinds ...Kind) (float64, int, error) {
	var first error
	if len(kinds) == 1 {
		v, err := Parse(s, kinds[0])
		return v, 0, err
	}
	for i, k := range kinds {
		v, err := Parse(s, k)
		if err == nil {
			return v, i, nil
		}
		if first == nil {
			first = err
		}
	}
	names := make([]string, len(kinds))
	for i, k := range kinds {
		names[i] = k.Name + " (" + k.allowed() + ")"
	}
	num, rest := splitNumber(strings.TrimSpace(s))
	if x, err := strconv.ParseFloat(num, 64); err != nil || math.IsInf(x, 0) {
		return 0, 0, first // not a number at all
	}
	if strings.TrimSpace(rest) == "" {
		return 0, 0, fmt.Errorf("%s needs a unit of %s", Quote(s), strings.Join(names, " or "))
	}
	return 0, 0, fmt.Errorf("%s is not a %s", Quote(s), strings.Join(names, " or "))
}
