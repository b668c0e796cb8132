package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"undercool/cnt"
	"undercool/kinetics/internal/bracket"
)

// TestCriticalHeatingReference: the critical heating rate of the reference
// glass, heated from a nucleus-free start at 600 K to T_e, for X = 1e-6,
// against the independent nested adaptive Gauss–Kronrod reference
// (refLinearLnXext, relative tolerance 1e-11; no code shared with
// pathint.go) of
//
//	X_ext = (4π/3)·q⁻⁴·∫ J(T′)·[∫_{T′}^{T_end} u dT]³ dT′
//
// Tolerances chosen beforehand: 1e-5 on the critical rate (the aim the
// task sets), 1e-6 on the extended volume (the integrator's 1e-8 per piece
// with room for the pieces' sum).
func TestCriticalHeatingReference(t *testing.T) {
	const X = 1e-6
	md := refGlass(t)
	for _, end := range []float64{1000, 1300} {
		h, err := md.LinearHeating(600, end, NoNuclei)
		if err != nil {
			t.Fatal(err)
		}
		ref := refLinearLnXext(md, 600, end, 1e-11)
		qRef := math.Exp((ref - lnXextOf(X)) / 4)
		q := h.CriticalRate(X)
		dX, dq := math.Expm1(h.LnXextEnd(1)-ref), q/qRef-1
		if !(math.Abs(dX) <= 1e-6) || !(math.Abs(dq) <= 1e-5) {
			t.Errorf("to %g K: critical heating rate %.10g K/s (%+.2g), extended volume %+.2g against the reference", end, q, dq, dX)
		}
		t.Logf("to %g K: critical heating rate %.10g K/s, reference %.10g K/s: %+.2g; extended volume %+.2g", end, q, qRef, dq, dX)
	}
}

// TestHeatingScalingExact: heating at rate q, read off the unit-rate path
// as q⁻⁴ (Heating), against the path integral of the same heating at q
// computed on its own (AlongPath of a straight path at q). The change of
// variable t = (T − T_from)/q makes the scaling exact; the integrator
// normalizes time by the path's duration, so the two runs make the same
// decisions and differ by rounding only. Tolerance chosen beforehand:
// 1e-10 relative (rounding over a few hundred pieces; an integration
// decision taken differently would show at 1e-9 or more).
func TestHeatingScalingExact(t *testing.T) {
	md := refGlass(t)
	h, err := md.LinearHeating(600, 1300, NoNuclei)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	defer func() { t.Logf("largest difference in ln Xext or ln N: %.2g", worst) }()
	for _, q := range []float64{1e-3, 0.37, 1, 25, 4e4} {
		res, _, err := md.AlongPath(Path{Time: []float64{0, 700 / q}, Temp: []float64{600, 1300}}, 0.5)
		if err != nil {
			t.Fatal(err)
		}
		got := h.LnXextEnd(q)
		worst = math.Max(worst, math.Max(math.Abs(got-res.LnXext), math.Abs(h.At(1300, q).LnNuclei-res.LnNuclei)))
		if d := got - res.LnXext; !(math.Abs(d) <= 1e-10) {
			t.Errorf("q = %g K/s: ln Xext %.15g scaled, %.15g integrated at q (%+.2g)", q, got, res.LnXext, d)
		}
		ln := h.At(1300, q).LnNuclei
		if d := ln - res.LnNuclei; !(math.Abs(d) <= 1e-10) {
			t.Errorf("q = %g K/s: ln N %.15g scaled, %.15g integrated at q (%+.2g)", q, ln, res.LnNuclei, d)
		}
	}
}

// TestNucleiFromCooling: the nuclei quenched in by cooling at rate q from
// T_e (Cooling.Nuclei, read off the unit-rate path) against the same
// cooling integrated on its own as a path at q (AlongPath): the number per
// volume and the extended volume (4π/3)·M₃ they fill. The two are the
// same integrator on paths that differ by the time scale only, so the
// tolerance, chosen beforehand, is 1e-8 (the integrator's tolerance per
// piece); the scaling in q is exact by construction and is checked at
// three rates over six decades.
func TestNucleiFromCooling(t *testing.T) {
	md := refGlass(t)
	c, err := md.LinearCooling(600)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	defer func() { t.Logf("largest difference in ln N or ln Xext: %.2g", worst) }()
	for _, q := range []float64{0.01, 3, 1e4} {
		for _, T := range []float64{1000, 800, 600} {
			n := c.Nuclei(q, T)
			res, _, err := md.AlongPath(LinearPath(c.Te, T, q, 1), 0.5)
			if err != nil {
				t.Fatal(err)
			}
			worst = math.Max(worst, math.Max(math.Abs(n.LnM[0]-res.LnNuclei), math.Abs(n.LnXext()-res.LnXext)))
			if d := n.LnM[0] - res.LnNuclei; !(math.Abs(d) <= 1e-8) {
				t.Errorf("q = %g K/s to %g K: ln N %.12g, path %.12g (%+.2g)", q, T, n.LnM[0], res.LnNuclei, d)
			}
			if d := n.LnXext() - res.LnXext; !(math.Abs(d) <= 1e-8) {
				t.Errorf("q = %g K/s to %g K: ln (4π/3)M3 %.12g, path ln Xext %.12g (%+.2g)", q, T, n.LnXext(), res.LnXext, d)
			}
			if !(n.MeanRadius() > 0) || !(n.VolumeRadius() >= n.MeanRadius()) {
				t.Errorf("q = %g K/s to %g K: mean radius %g, volume radius %g", q, T, n.MeanRadius(), n.VolumeRadius())
			}
		}
	}
}

// TestHeatingWithPriorNuclei: heating a glass that holds the nuclei of a
// cooling at q_c, read as the polynomial in 1/q of Heating (every moment
// M₀…M₃ of the quenched-in radii takes part), against one path integral of
// the whole history, cooling from T_e at q_c then heating at q_h. Tolerance
// chosen beforehand: 1e-7 relative in the extended volume (the integrator's
// 1e-8 per piece, 4ε on a running sum, on two runs).
func TestHeatingWithPriorNuclei(t *testing.T) {
	md := refGlass(t)
	c, err := md.LinearCooling(600)
	if err != nil {
		t.Fatal(err)
	}
	for _, qc := range []float64{0.5, 20} {
		prior := c.Nuclei(qc, 700)
		h, err := md.LinearHeating(700, 1250, prior)
		if err != nil {
			t.Fatal(err)
		}
		for _, qh := range []float64{0.2, 5, 300} {
			cool := LinearPath(c.Te, 700, qc, 1)
			tc := cool.Time[len(cool.Time)-1]
			p := Path{Time: append(cool.Time, tc+550/qh), Temp: append(cool.Temp, 1250)}
			res, _, err := md.AlongPath(p, 0.5)
			if err != nil {
				t.Fatal(err)
			}
			pt := h.At(1250, qh)
			if d := pt.LnXext - res.LnXext; !(math.Abs(d) <= 1e-7) {
				t.Errorf("cooled at %g, heated at %g K/s: ln Xext %.12g, whole path %.12g (%+.2g)", qc, qh, pt.LnXext, res.LnXext, d)
			}
			if d := pt.LnNuclei - res.LnNuclei; !(math.Abs(d) <= 1e-7) {
				t.Errorf("cooled at %g, heated at %g K/s: ln N %.12g, whole path %.12g (%+.2g)", qc, qh, pt.LnNuclei, res.LnNuclei, d)
			}
			t.Logf("cooled at %g, heated at %g K/s: ln Xext %+.2g, ln N %+.2g", qc, qh, pt.LnXext-res.LnXext, pt.LnNuclei-res.LnNuclei)
		}
		// The critical heating rate of the nucleated glass solves the
		// polynomial: X at the rate is the target.
		const X = 1e-3
		qh := h.CriticalRate(X)
		if got := h.At(1250, qh).Fraction; !(math.Abs(got/X-1) <= 1e-9) {
			t.Errorf("cooled at %g K/s: X at the critical heating rate %g K/s is %.12g, want %g", qc, qh, got, X)
		}
		if free, _ := md.LinearHeating(700, 1250, NoNuclei); !(qh > free.CriticalRate(X)) {
			t.Errorf("cooled at %g K/s: quenched-in nuclei give a critical heating rate %g K/s, no higher than %g K/s without them", qc, qh, free.CriticalRate(X))
		}
	}
}

// firstOrderLnRate is ln dα/dT of a first-order law dα/dt = A·exp(−E/RT)·(1−α)
// heated at β from T0 (α = 0 there):
//
//	ln dα/dT = ln(A/β) − E/RT − (A/β)·∫_{T0}^T exp(−E/RT′) dT′
//
// the temperature integral by 100-point Gauss–Legendre, converged to
// rounding for the ranges of the test (the integrand changes by at most
// e^40 over it, an entire function).
func firstOrderLnRate(E, A, beta, T0 float64) func(T float64) float64 {
	f := func(T float64) float64 { return math.Exp(-E / (cnt.Gas * T)) }
	return func(T float64) float64 {
		I := quad.Fixed(f, T0, T, 100, quad.Legendre{}, 0)
		return math.Log(A/beta) - E/(cnt.Gas*T) - A/beta*I
	}
}

// TestPeakKissingerFirstOrder: the peak search of the DSC peak (peakOf),
// applied to the exact dα/dT of a first-order law, gives the temperature
// of Kissinger's relation βE/(RTp²) = A·exp(−E/RTp), exact for that law
// (Kissinger H.E., Anal. Chem. 29 (1957) 1702). The model has no
// first-order law of its own; this is the hook the heating peaks use.
// Tolerance chosen beforehand: 1e-6 relative in Tp (the task's), for E of
// 80, 150 and 300 kJ/mol and rates over two decades.
func TestPeakKissingerFirstOrder(t *testing.T) {
	worst := 0.0
	defer func() { t.Logf("largest relative miss of Tp: %.2g", worst) }()
	for _, c := range []struct{ E, A float64 }{{80e3, 1e7}, {150e3, 1e13}, {300e3, 1e25}} {
		for _, beta := range []float64{2.0 / 60, 10.0 / 60, 40.0 / 60, 200.0 / 60} {
			kiss := func(T float64) float64 { return math.Log(beta*c.E/(cnt.Gas*T*T)) - math.Log(c.A) + c.E/(cnt.Gas*T) }
			Tp, err := bracket.Root(kiss, 200, 2000, 1e-12)
			if err != nil {
				t.Fatal(err)
			}
			got, interior := peakOf(firstOrderLnRate(c.E, c.A, beta, 0.6*Tp), 0.7*Tp, 1.3*Tp)
			worst = math.Max(worst, math.Abs(got/Tp-1))
			if !interior || !(math.Abs(got/Tp-1) <= 1e-6) {
				t.Errorf("E = %g, A = %g, β = %.4g K/s: peak %.9g K (interior %v), Kissinger %.9g K", c.E, c.A, beta, got, interior, Tp)
			}
		}
	}
}

// TestHeatingPeakAndReach: on the reference glass the DSC peak lies inside
// the path, after its onset (X = 1 %), and moves up with the heating rate
// (as every measured scan does); the onset is where X is 1 % to the root's
// 1e-6 K, and Reach agrees with At there.
func TestHeatingPeakAndReach(t *testing.T) {
	md := refGlass(t)
	h, err := md.LinearHeating(600, 1300, NoNuclei)
	if err != nil {
		t.Fatal(err)
	}
	prev := 0.0
	for _, q := range []float64{2.0 / 60, 10.0 / 60, 40.0 / 60} {
		p := h.Peak(q)
		if !p.Interior || !p.Onset.Reached || !(p.Onset.Temp < p.T) || !(p.T > prev) {
			t.Fatalf("β = %g K/s: peak %+v", q, p)
		}
		if X := h.At(p.Onset.Temp, q).Fraction; !(math.Abs(X/OnsetFraction-1) <= 1e-5) {
			t.Errorf("β = %g K/s: X = %.8g at the onset %.6f K", q, X, p.Onset.Temp)
		}
		prev = p.T
	}
}
