package kinetics

import (
	"math"
	"testing"

	"undercool/cnt"
)

// refGlass is the reference glass of the accuracy checks (a model glass,
// not a real material): T_e 1300 K, ΔH 55 kJ/mol, V_m 6.3e-5 m³/mol,
// γ 0.11 J/m², VFT A = −3, B = 4500 K, T0 = 500 K with Stokes–Einstein,
// λ = v^(1/3), attachment prefactor, homogeneous, linear driving force.
func refGlass(t testing.TB) *Model {
	md, err := NewModel(Material{Name: "reference glass", Driving: cnt.Linear{Te: 1300, DH: 55000},
		Vm: 6.3e-5, Gamma: 0.11, Mobility: VFT{A: -3, B: 4500, T0: 500}})
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// TestCriticalRateReference: the critical cooling rate of the reference
// glass cooled to 600 K for X = 1e-6, against this package's independent
// reference (nested adaptive Gauss–Kronrod in temperature, relative
// tolerance 1e-11, reference_test.go), whose value agrees with the
// 1.461259 K/s of another independent adaptive quadrature (to its seven
// digits, 5e-7). Tolerances, the integrator's aims: 1e-6 on the extended
// volume, 1e-5 on the critical rate. Measured: below 1e-13 on both.
func TestCriticalRateReference(t *testing.T) {
	const X = 1e-6
	md := refGlass(t)
	c, err := md.LinearCooling(600)
	if err != nil {
		t.Fatal(err)
	}
	ref := refCoolingLnXext(md, 600, 1e-11)
	qRef := math.Exp((ref - lnXextOf(X)) / 4)
	if math.Abs(qRef-1.461259) > 5e-7 {
		t.Errorf("reference critical rate %.9f K/s, the independent value is 1.461259 K/s", qRef)
	}
	q := c.CriticalRate(X)
	dX, dq := math.Expm1(c.LnXextUnit()-ref), q/qRef-1
	if !(math.Abs(dX) <= 1e-6) || !(math.Abs(dq) <= 1e-5) {
		t.Errorf("critical rate %.10f K/s (%+.2g), extended volume %+.2g against the reference", q, dq, dX)
	}
	t.Logf("critical rate %.10f K/s, reference %.10f K/s: %+.2g; extended volume %+.2g", q, qRef, dq, dX)
}
