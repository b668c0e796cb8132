package cnt

import "math"

// ShapeFactor is the ratio of the barrier of a spherical cap on a flat
// substrate, wetting it with contact angle θ (degrees), to the homogeneous one:
//
//	f(θ) = (2 + cos θ)(1 − cos θ)²/4
//
// f(180°) = 1 (homogeneous), f(90°) = 1/2, f(0°) = 0.
// Volmer M., Kinetik der Phasenbildung (1939); Christian (2002) §10.4.
// Special cases: θ outside [0, 180] or NaN gives NaN.
func ShapeFactor(thetaDeg float64) float64 {
	if !(thetaDeg >= 0 && thetaDeg <= 180) {
		return math.NaN()
	}
	// (1 − cos θ)² = 4·sin⁴(θ/2): the half-angle form keeps full precision
	// at small angles, where 1 − cos θ cancels.
	s := math.Sin(thetaDeg * math.Pi / 360)
	return (2 + math.Cos(thetaDeg*math.Pi/180)) * s * s * s * s
}

// CapArea is the share of the surface of a sphere that a spherical cap of
// the same radius r, wetting a flat substrate with contact angle θ
// (degrees), exposes to the parent phase:
//
//	a(θ) = 2πr²(1 − cos θ)/(4πr²) = (1 − cos θ)/2 = sin²(θ/2)
//
// a(180°) = 1 (homogeneous), a(90°) = 1/2 (hemisphere), a(0°) = 0.
// Special cases: θ outside [0, 180] or NaN gives NaN.
func CapArea(thetaDeg float64) float64 {
	if !(thetaDeg >= 0 && thetaDeg <= 180) {
		return math.NaN()
	}
	s := math.Sin(thetaDeg * math.Pi / 360) // the half-angle form keeps small angles exact
	return s * s
}

// Nucleus is the critical embryo at one temperature.
type Nucleus struct {
	Radius    float64 // r*, m
	Size      float64 // n*, molecules in the critical nucleus
	Barrier   float64 // ΔG*, J
	Zeldovich float64 // Z, dimensionless
}

// Critical returns the critical nucleus of a spherical (cap) embryo with
// driving force dmu per molecule (J), interfacial energy gamma (J/m²),
// molecular volume v (m³) and shape factor f, at temperature T (K):
//
//	r*  = 2γv/Δμ
//	ΔG* = f·16πγ³v²/(3Δμ²)
//	n*  = f·32πγ³v²/(3Δμ³)
//	Z   = sqrt(ΔG*/(3π·k_B·T·n*²))
//
// Christian (2002) eqs. 10.8–10.10; Kelton and Greer (2010) eqs. 2.9, 2.29.
//
// Special cases: dmu ≤ 0 (no driving force) gives r* = n* = ΔG* = +Inf and
// Z = 0; f = 0 (complete wetting) gives ΔG* = n* = 0 and Z = +Inf.
func Critical(dmu, gamma, v, f, T float64) Nucleus {
	if !(dmu > 0) {
		return Nucleus{Radius: math.Inf(1), Size: math.Inf(1), Barrier: math.Inf(1)}
	}
	if f == 0 {
		return Nucleus{Radius: 2 * gamma * v / dmu, Zeldovich: math.Inf(1)}
	}
	g3v2 := gamma * gamma * gamma * v * v
	barrier := f * 16 * math.Pi * g3v2 / (3 * dmu * dmu)
	size := f * 32 * math.Pi * g3v2 / (3 * dmu * dmu * dmu)
	return Nucleus{
		Radius:    2 * gamma * v / dmu,
		Size:      size,
		Barrier:   barrier,
		Zeldovich: math.Sqrt(barrier / (3 * math.Pi * Boltzmann * T * size * size)),
	}
}
