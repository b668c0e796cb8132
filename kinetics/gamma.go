package kinetics

import (
	"fmt"
	"math"
)

// GammaLaw is how the interfacial energy depends on temperature.
type GammaLaw int

const (
	// GammaConstant is γ(T) = γ, the same at every temperature.
	GammaConstant GammaLaw = iota
	// GammaLinear is γ(T) = γ(T_ref) + (dγ/dT)·(T − T_ref): the form the
	// glass-nucleation literature fits to measured rates, where γ comes out
	// rising with temperature (Fokin V.M., Zanotto E.D., Yuritsyn N.S.,
	// Schmelzer J.W.P., J. Non-Cryst. Solids 352 (2006) 2681, from memory).
	GammaLinear
	// GammaNegentropic is γ(T) = γ(T_ref)·T/T_ref: the interfacial energy
	// of Spaepen's negentropic model, an entropy deficit of the interface
	// layer and so proportional to T (Spaepen F., Acta Metall. 23 (1975)
	// 729, from memory).
	GammaNegentropic
)

var gammaLawNames = [...]string{"constant", "linear", "negentropic"}

func (g GammaLaw) String() string { return gammaLawNames[g] }

// ParseGammaLaw returns the interfacial-energy law with the given name.
func ParseGammaLaw(s string) (GammaLaw, bool) {
	for i, n := range gammaLawNames {
		if n == s {
			return GammaLaw(i), true
		}
	}
	return 0, false
}

// GammaLawNames lists the accepted names of the interfacial-energy laws.
func GammaLawNames() []string { return gammaLawNames[:] }

// GammaAt is γ(T) in J/m² of a material (its law checked by NewModel):
//
//	constant     γ
//	linear       γ + s·(T − T_ref)
//	negentropic  γ·T/T_ref
//
// with γ = Material.Gamma, s = Material.GammaSlope, T_ref = Material.GammaTRef.
// It may be ≤ 0 for a linear law far from T_ref; see GammaError.
func (m *Material) GammaAt(T float64) float64 {
	switch m.GammaLaw {
	case GammaLinear:
		return m.Gamma + m.GammaSlope*(T-m.GammaTRef)
	case GammaNegentropic:
		return m.Gamma * T / m.GammaTRef
	}
	return m.Gamma
}

// GammaAt is the interfacial energy γ(T) of the model, J/m².
func (md *Model) GammaAt(T float64) float64 { return md.m.GammaAt(T) }

// GammaError is an interfacial-energy law that is not positive somewhere
// in the temperatures asked for: a linear γ(T) that crosses zero at Zero.
type GammaError struct {
	Lo, Hi float64 // K, the temperatures asked for
	Zero   float64 // K, where γ(T) = 0
	Law    string  // the law, written out
}

func (e *GammaError) Error() string {
	asked := fmt.Sprintf("inside the temperatures asked for (%.4g to %.4g K)", e.Lo, e.Hi)
	if e.Lo == e.Hi {
		asked = fmt.Sprintf("at the temperature asked for (%.4g K)", e.Lo)
	}
	return fmt.Sprintf("the interfacial energy %s is zero at %.4g K and not positive on that side of it, %s", e.Law, e.Zero, asked)
}

// CheckGamma returns a *GammaError when γ(T) ≤ 0 anywhere in [lo, hi] K
// (only a linear law can be: it is monotonic, so its ends decide), nil
// otherwise.
func (md *Model) CheckGamma(lo, hi float64) error {
	m := &md.m
	if m.GammaLaw != GammaLinear || (m.GammaAt(lo) > 0 && m.GammaAt(hi) > 0) {
		return nil
	}
	return &GammaError{Lo: math.Min(lo, hi), Hi: math.Max(lo, hi), Zero: m.GammaTRef - m.Gamma/m.GammaSlope, Law: m.GammaText()}
}

// GammaText writes the interfacial-energy law with its numbers:
// "0.1235 J/m2", "0.1235 J/m2 + 1.829e-04 J/m2/K·(T − 727 K)" or
// "0.02457 J/m2·T/236 K".
func (m *Material) GammaText() string {
	switch m.GammaLaw {
	case GammaLinear:
		return fmt.Sprintf("%.5g J/m2 %+.4g J/m2/K·(T − %.5g K)", m.Gamma, m.GammaSlope, m.GammaTRef)
	case GammaNegentropic:
		return fmt.Sprintf("%.5g J/m2·T/%.5g K", m.Gamma, m.GammaTRef)
	}
	return fmt.Sprintf("%.5g J/m2", m.Gamma)
}

// checkGammaLaw is the check NewModel makes of the interfacial-energy law.
func checkGammaLaw(m Material) error {
	switch m.GammaLaw {
	case GammaConstant:
		return nil
	case GammaLinear, GammaNegentropic:
		if err := positive("GammaTRef", m.GammaTRef); err != nil {
			return fmt.Errorf("the %s interfacial-energy law needs the temperature its gamma is given at: %w", m.GammaLaw, err)
		}
		if math.IsNaN(m.GammaSlope) || math.IsInf(m.GammaSlope, 0) {
			return fmt.Errorf("GammaSlope must be finite, got %g", m.GammaSlope)
		}
		return nil
	}
	return fmt.Errorf("unknown interfacial-energy law %d", m.GammaLaw)
}
