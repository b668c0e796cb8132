package units

import (
	"math"
	"strings"
	"testing"
)

// Conversion factors are exact by definition (SI 2019 for eV and N_A; the
// thermochemical calorie 4.184 J; 1 erg/cm2 = 1 mJ/m2), so the tolerance is
// a few ulps of round-off.
const tol = 1e-12

func close(got, want float64) bool {
	if want == 0 {
		return math.Abs(got) < tol
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

func TestParse(t *testing.T) {
	tests := []struct {
		in   string
		kind Kind
		want float64
	}{
		// Temperatures: bare is kelvin; C and F with their offsets.
		{"300", Temperature, 300},
		{"300 K", Temperature, 300},
		{"300K", Temperature, 300},
		{"0 C", Temperature, 273.15},
		{"833.85C", Temperature, 1107},
		{"-40 C", Temperature, 233.15},
		{"25 °C", Temperature, 298.15},
		{"25 degC", Temperature, 298.15},
		{"32 F", Temperature, 273.15},
		{"-40 F", Temperature, 233.15}, // −40 °F = −40 °C
		{"212 °F", Temperature, 373.15},
		{"1064 C", Temperature, 1337.15}, // gold, Callister Table 10.1
		// Temperature differences: no offset.
		{"10 C", TemperatureDifference, 10},
		{"9 F", TemperatureDifference, 5},
		{"247.8 K", TemperatureDifference, 247.8},
		// Molar energies.
		{"13260 J/mol", MolarEnergy, 13260},
		{"13.26 kJ/mol", MolarEnergy, 13260},
		{"1 eV", MolarEnergy, 1.602176634e-19 * 6.02214076e23}, // 96485.33 J/mol
		{"0.45 eV", MolarEnergy, 0.45 * 1.602176634e-19 * 6.02214076e23},
		{"1 kcal/mol", MolarEnergy, 4184},
		{"1 cal/mol", MolarEnergy, 4.184},
		{"1.2e3 J/mol", MolarEnergy, 1200},
		{"13.26 KJ/mol", MolarEnergy, 13260}, // case does not matter but for m and M
		{"13.26 kj/mol", MolarEnergy, 13260}, // data-file headers are lower case
		{"5 ml", Volume, 5e-6},               // lower-case m is milli
		{"2 MJ/m3", EnergyDensity, 2e6},      // upper-case M is mega
		// Energy per volume.
		{"1.16e9 J/m3", EnergyDensity, 1.16e9},
		{"1.16 GJ/m3", EnergyDensity, 1.16e9},
		{"1160 J/cm3", EnergyDensity, 1.16e9},
		{"1.16e9 J/m³", EnergyDensity, 1.16e9},
		// Compositions: a plain fraction or per cent of atoms or moles.
		{"0.0018", MoleFraction, 0.0018},
		{"0.18 at%", MoleFraction, 0.0018},
		{"25 mol%", MoleFraction, 0.25},
		{"600 ppm", MoleFraction, 6e-4},
		// Interfacial energies: 1 erg/cm2 = 1e-7 J / 1e-4 m2 = 1e-3 J/m2.
		{"0.132 J/m2", InterfacialEnergy, 0.132},
		{"132 mJ/m2", InterfacialEnergy, 0.132},
		{"132 erg/cm2", InterfacialEnergy, 0.132},
		{"132 mJ/m²", InterfacialEnergy, 0.132},
		{"132 mJ m^-2", InterfacialEnergy, math.NaN()}, // not an accepted spelling: see TestParseErrors
		// Slopes of interfacial energy with temperature.
		{"1.829e-4 J/m2/K", InterfacialEnergySlope, 1.829e-4},
		{"0.1829 mJ/m2/K", InterfacialEnergySlope, 1.829e-4},
		{"-0.3887 erg/cm2/K", InterfacialEnergySlope, -3.887e-4},
		// Molar volumes.
		{"6.59 cm3/mol", MolarVolume, 6.59e-6},
		{"6.59e-6 m3/mol", MolarVolume, 6.59e-6},
		{"0.01802 L/mol", MolarVolume, 1.802e-5},
		{"6.59 cm³/mol", MolarVolume, 6.59e-6},
		// Diffusivities.
		{"1e-9 m2/s", Diffusivity, 1e-9},
		{"1e-5 cm2/s", Diffusivity, 1e-9},
		{"1e-3 mm2/s", Diffusivity, 1e-9},
		{"1000 um2/s", Diffusivity, 1e-9},
		{"1000 µm2/s", Diffusivity, 1e-9},
		// Others.
		{"1e12 Pa*s", Viscosity, 1e12},
		{"1e12 Pa·s", Viscosity, 1e12},
		{"1 cP", Viscosity, 1e-3},
		{"10 P", Viscosity, 1},
		{"90", Angle, 90},
		{"90 deg", Angle, 90},
		{"3.14159265358979 rad", Angle, 180 * 3.14159265358979 / math.Pi},
		{"1e20", NumberDensity, 1e20},
		{"1e14 cm-3", NumberDensity, 1e20},
		{"1 /cm3/s", RateDensity, 1e6},
		{"1 K/min", CoolingRate, 1.0 / 60},
		{"75 ul", Volume, 75e-9},
		{"2 min", Time, 120},
		{"1 d", Time, 86400},
		{"0.413 nm", Length, 0.413e-9},
		{"4.13 Å", Length, 0.413e-9},
		{"-4.6173", Dimensionless, -4.6173},
		{"17.44", Dimensionless, 17.44},
	}
	for _, tt := range tests {
		if math.IsNaN(tt.want) {
			continue
		}
		got, err := Parse(tt.in, tt.kind)
		if err != nil {
			t.Errorf("Parse(%q, %s): %v", tt.in, tt.kind.Name, err)
			continue
		}
		if !close(got, tt.want) {
			t.Errorf("Parse(%q, %s) = %.15g, want %.15g", tt.in, tt.kind.Name, got, tt.want)
		}
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct {
		in     string
		kind   Kind
		inText string // the message must contain this
	}{
		{"nan", Temperature, "not a number"},
		{"NaN K", Temperature, "not a number"},
		{"inf", Temperature, "not a number"},
		{"+Inf K", Temperature, "not a number"},
		{"-inf", MolarEnergy, "not a number"},
		{"Infinity", Dimensionless, "not a number"},
		{"1e400 K", Temperature, "not a number"}, // overflows ParseFloat
		{"1e308 kJ/mol", MolarEnergy, "out of range"},
		{"", Temperature, "not a number"},
		{"K", Temperature, "not a number"},
		{"abc", InterfacialEnergy, "not a number"},
		{"1.2.3 K", Temperature, "not a number"},
		{"--5 K", Temperature, "not a number"},
		{"13.26", MolarEnergy, "needs a unit"},
		{"6.59", MolarVolume, "needs a unit"},
		{"0.132", InterfacialEnergy, "needs a unit"},
		{"1e-9", Diffusivity, "needs a unit"},
		{"6 kg", MolarVolume, "not a unit of molar volume"},
		{"132 mJ m^-2", InterfacialEnergy, "not a unit"},
		{"300 kelvins", Temperature, "not a unit of temperature"},
		{"13 kJ", MolarEnergy, "not a unit of molar energy"},
		{"1 m2/s", MolarVolume, "not a unit"},
		{"3 K", Dimensionless, "a plain number"},
		// m is milli and M mega: one never stands for the other.
		{"13.26 KJ/MOL", MolarEnergy, "not a unit of molar energy"},
		{"140MJ/m2", InterfacialEnergy, "not a unit of interfacial energy"},
		{"1.16e12mJ/m3", EnergyDensity, "not a unit of energy per volume"},
		{"1e10MPa.s", Viscosity, "not a unit of viscosity"},
		{"1Mm", Length, "not a unit of length"},
		{"1ML", Volume, "not a unit of volume"},
	}
	for _, tt := range tests {
		got, err := Parse(tt.in, tt.kind)
		if err == nil {
			t.Errorf("Parse(%q, %s) = %g, want an error", tt.in, tt.kind.Name, got)
			continue
		}
		if !strings.Contains(err.Error(), tt.inText) {
			t.Errorf("Parse(%q, %s): error %q does not say %q", tt.in, tt.kind.Name, err, tt.inText)
		}
	}
}

// TestParseErrorListsUnits: a wrong unit is answered with the accepted ones.
func TestParseErrorListsUnits(t *testing.T) {
	_, err := Parse("6 kg", MolarVolume)
	if err == nil {
		t.Fatal("no error")
	}
	for _, u := range []string{"cm3/mol", "m3/mol"} {
		if !strings.Contains(err.Error(), u) {
			t.Errorf("error %q does not list %s", err, u)
		}
	}
}

func TestParseAny(t *testing.T) {
	v, i, err := ParseAny("1.16e9 J/m3", MolarEnergy, EnergyDensity)
	if err != nil || i != 1 || !close(v, 1.16e9) {
		t.Errorf("ParseAny(J/m3) = %g, %d, %v; want 1.16e9, 1, nil", v, i, err)
	}
	v, i, err = ParseAny("12.55 kJ/mol", MolarEnergy, EnergyDensity)
	if err != nil || i != 0 || !close(v, 12550) {
		t.Errorf("ParseAny(kJ/mol) = %g, %d, %v; want 12550, 0, nil", v, i, err)
	}
	_, _, err = ParseAny("12 kg", MolarEnergy, EnergyDensity)
	if err == nil || !strings.Contains(err.Error(), "molar energy") || !strings.Contains(err.Error(), "energy per volume") {
		t.Errorf("ParseAny(kg) error %v should name both kinds", err)
	}
	_, _, err = ParseAny("12", MolarEnergy, EnergyDensity)
	if err == nil || !strings.Contains(err.Error(), "needs a unit") {
		t.Errorf("ParseAny(bare) error %v should ask for a unit", err)
	}
	_, _, err = ParseAny("nan J/mol", MolarEnergy, EnergyDensity)
	if err == nil {
		t.Error("ParseAny(nan) gave no error")
	}
}

func TestUnitsSortedAndKnown(t *testing.T) {
	u := MolarVolume.Units()
	for i := 1; i < len(u); i++ {
		if u[i-1] >= u[i] {
			t.Fatalf("Units() not sorted: %v", u)
		}
	}
	if len(Dimensionless.Units()) != 0 {
		t.Errorf("Dimensionless has units %v", Dimensionless.Units())
	}
	// Every listed spelling parses as written.
	for _, k := range []Kind{Temperature, TemperatureDifference, MolarEnergy, EnergyDensity, MolarHeatCapacity,
		InterfacialEnergy, InterfacialEnergySlope, MolarVolume, Diffusivity, Length, Viscosity, Angle, NumberDensity, RateDensity,
		CoolingRate, Volume, Time, MoleFraction} {
		for _, s := range k.Units() {
			if _, err := Parse("1 "+s, k); err != nil {
				t.Errorf("%s: listed unit %q does not parse: %v", k.Name, s, err)
			}
		}
	}
}

var fuzzKinds = []Kind{Temperature, TemperatureDifference, MolarEnergy, EnergyDensity, MolarHeatCapacity,
	InterfacialEnergy, InterfacialEnergySlope, MolarVolume, Diffusivity, Length, Viscosity, Angle, NumberDensity, RateDensity,
	Dimensionless, CoolingRate, Volume, Time}

// FuzzParse: no input makes the parser panic, and every accepted value is finite.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"300 K", "833.85C", "-40 F", "13.26 kJ/mol", "0.45 eV", "132 erg/cm2",
		"6.59 cm3/mol", "1e-5 cm2/s", "1e12 Pa*s", "nan", "inf", "-Inf K", "1e308 kJ/mol", "1e-400 K",
		"", " ", "e", "1e", "1e+", ".", "-", "+.e5", "1..2", "0x1p-2 K", "1_000 K", "٣ K", "1 µm2/s",
		"5 °C", "1\x00K", "\xff\xfe"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for _, k := range fuzzKinds {
			v, err := Parse(s, k)
			if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
				t.Fatalf("Parse(%q, %s) = %v without error", s, k.Name, v)
			}
		}
		v, _, err := ParseAny(s, MolarEnergy, EnergyDensity)
		if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
			t.Fatalf("ParseAny(%q) = %v without error", s, v)
		}
	})
}

// A column's parser reads what Parse reads of the number followed by the
// column's unit, to the bit.
func TestInIsParse(t *testing.T) {
	fields := []string{"1.5", " 300 ", "-40", "1e-3", "2.5E+2", ".5", "5.", "0", "-0", "1e308", "abc", "1.5kg", "", "nan", "inf", "1e999", "5 K"}
	cases := []struct {
		k Kind
		u string
	}{{Temperature, "c"}, {Temperature, "k"}, {Temperature, "f"}, {Temperature, ""}, {Time, "min"}, {Diffusivity, "m2/s"}, {Diffusivity, "cm2/s"}, {MolarEnergy, "kj/mol"}, {Dimensionless, ""}}
	for _, c := range cases {
		in, err := c.k.In(c.u)
		if err != nil {
			t.Fatalf("%s in %q: %v", c.k.Name, c.u, err)
		}
		for _, f := range fields {
			want, werr := Parse(f+c.u, c.k)
			if strings.TrimSpace(f) != f || strings.Contains(f, " ") {
				want, werr = Parse(strings.TrimSpace(f)+c.u, c.k)
			}
			got, gerr := in(f)
			if (werr == nil) != (gerr == nil) || math.Float64bits(got) != math.Float64bits(want) {
				t.Errorf("%s in %q, %q: %v, %v; Parse gives %v, %v", c.k.Name, c.u, f, got, gerr, want, werr)
			}
		}
	}
	for _, u := range []string{"kg", "1k", "e3s"} {
		if _, err := Time.In(u); err == nil {
			t.Errorf("unit %q of a time: no error", u)
		}
	}
}
